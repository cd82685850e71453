/** Re-exports of the ordering contract the view reads, so view code names one place. */
export type { EquationId } from '../model/types';
export type { EdgeKind, Ordering, OrderingBlock, OrderingEdge, Role, Breakpoint, Band, StudyDesign } from '../ordering/types';
