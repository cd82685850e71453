/**
 * The interventions the modeller has set on the canvas: variable → value.
 * They reach the analysis through the study design's `hold`. Other writers
 * of the design (the interval control) set it without `hold`, so
 * `startHoldSync` puts the holds back whenever the design loses them, and
 * releases holds of variables the document no longer has.
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { VariableId } from '../../core/model/types';
import { analysisStore, setStudyDesign } from '../../state/analysis';
import { documentStore, selectModel } from '../../state/document';

export interface HoldState {
  holds: Record<VariableId, number>;
  setHold(variable: VariableId, value: number): void;
  release(variable: VariableId): void;
  releaseAll(): void;
}

export function createHoldStore() {
  return createStore<HoldState>()((set) => ({
    holds: {},
    setHold: (variable, value) => set((s) => ({ holds: { ...s.holds, [variable]: value } })),
    release: (variable) => set((s) => {
      const { [variable]: _gone, ...rest } = s.holds;
      return { holds: rest };
    }),
    releaseAll: () => set({ holds: {} }),
  }));
}

export const holdStore = createHoldStore();

/** Re-renders when the holds change. */
export function useHolds(): Record<VariableId, number> {
  return useStore(holdStore, (s) => s.holds);
}

function sameHolds(a: Record<string, number> | undefined, b: Record<string, number>): boolean {
  const ka = Object.keys(a ?? {});
  const kb = Object.keys(b);
  return ka.length === kb.length && kb.every((k) => a![k] === b[k]);
}

/** Keep the analysis design's `hold` equal to the hold store. Returns a function that stops it. */
export function startHoldSync(store = holdStore): () => void {
  const apply = () => {
    const { holds } = store.getState();
    const { design } = analysisStore.getState();
    if (sameHolds(design.hold, holds)) return;
    const next = { ...design };
    if (Object.keys(holds).length > 0) next.hold = { ...holds };
    else delete next.hold;
    setStudyDesign(next);
  };
  // A hold of a variable the document no longer has (renamed, deleted, another file opened) is released.
  const prune = () => {
    const ids = new Set(selectModel(documentStore.getState()).variables.map((v) => v.id));
    for (const v of Object.keys(store.getState().holds)) if (!ids.has(v)) store.getState().release(v);
  };
  const a = store.subscribe(apply);
  const b = analysisStore.subscribe((s, prev) => {
    if (s.design !== prev.design) apply();
  });
  const c = documentStore.subscribe((s, prev) => {
    if (selectModel(s) !== selectModel(prev)) prune();
  });
  prune();
  apply();
  return () => {
    a();
    b();
    c();
  };
}
