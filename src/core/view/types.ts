/**
 * The derived view: what the canvas and the SVG exporter draw for one
 * document at one sampling interval. Built by pure functions from the model
 * and an Ordering; the layout adds positions, the renderer adds pixels.
 */
import type { LinkSign, TimeUnit, VariableId, VariableKind } from '../model/types';
import type { EdgeKind, EquationId, Role } from './contract';

export type ViewMode = 'mechanism' | 'ordering' | 'unrolled';

/** A node id of the view (not a variable id): `v`, `v@-1`, `block:<key>`, `block:<key>@1`. */
export type ViewNodeId = string;

/** The three sampling instants of the unrolled view. */
export type Slice = -1 | 0 | 1;
export const SLICES: readonly Slice[] = [-1, 0, 1];

export interface ViewNode {
  id: ViewNodeId;
  /** The variable drawn; absent for a folded block. */
  variable?: VariableId;
  label: string;
  kind: VariableKind;
  role: Role;
  /** Key of the simultaneous block the variable belongs to (unfolded), or the folded block itself. */
  block?: string;
  /** A folded block: the number of variables it stands for. */
  count?: number;
  slice?: Slice;
  width: number;
  height: number;
}

export interface ViewGroup {
  /** `block:<key>` (with `@slice` in the unrolled view). */
  id: string;
  key: string;
  members: ViewNodeId[];
  variables: VariableId[];
  equations: EquationId[];
  level: number;
  slice?: Slice;
}

export interface ViewEdge {
  id: string;
  from: ViewNodeId;
  to: ViewNodeId;
  kind: EdgeKind;
  simultaneous: boolean;
  sign?: LinkSign;
  weight?: number;
  /** The variables at both ends, as in the ordering (a folded block keeps the original pair in `pairs`). */
  pairs: { from: VariableId; to: VariableId }[];
  /** The unrolled view: the state carried over from one instant to the next. */
  carry?: boolean;
}

export interface ViewModel {
  mode: ViewMode;
  title: string;
  timeUnit: TimeUnit;
  interval?: number;
  window?: number;
  samples?: number;
  nodes: ViewNode[];
  groups: ViewGroup[];
  edges: ViewEdge[];
  /** Blocks folded into one node, by key. */
  folded: string[];
  /** Roles and edge kinds present, for the legend. */
  rolesShown: Role[];
  kindsShown: EdgeKind[];
  caution?: string;
}
