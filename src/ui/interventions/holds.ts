/**
 * The interventions the modeller has set: the study's holds (variable →
 * value), owned by the session (`src/state/session.ts`) with the rest of the
 * study, so undo, files, share links and reloads carry them.
 */
import type { VariableId } from '../../core/model/types';
import { releaseAllHolds, releaseHold, setHold, useSessionStudy } from '../../state/session';

const NONE: Record<VariableId, number> = {};

/** Re-renders when the holds change. */
export function useHolds(): Record<VariableId, number> {
  return useSessionStudy()?.holds ?? NONE;
}

export { releaseAllHolds, releaseHold, setHold };
