/**
 * How the timescale views are shown: which simultaneous blocks are folded,
 * the view mode, the mechanism beside the view. The study itself (interval,
 * length, holds) belongs to the session (`src/state/session.ts`).
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { StudyDesign } from '../core/ordering/types';
import type { StudyLength } from './session';

export type { StudyLength };
export type TimescaleView = 'ordering' | 'unrolled';

export interface StudyState {
  /** Block key → folded. */
  folded: Record<string, boolean>;
  view: TimescaleView;
  /** Show the mechanism as drawn beside the view at the interval. */
  sideBySide: boolean;
  toggleFold(key: string): void;
  setFolded(key: string, folded: boolean): void;
  setView(view: TimescaleView): void;
  setSideBySide(on: boolean): void;
}

export function createStudyStore() {
  return createStore<StudyState>()((set) => ({
    folded: {},
    view: 'ordering',
    sideBySide: false,
    toggleFold: (key) => set((s) => ({ folded: { ...s.folded, [key]: !s.folded[key] } })),
    setFolded: (key, folded) => set((s) => ({ folded: { ...s.folded, [key]: folded } })),
    setView: (view) => set({ view }),
    setSideBySide: (sideBySide) => set({ sideBySide }),
  }));
}

export const studyStore = createStudyStore();

export function useStudy<T>(selector: (s: StudyState) => T): T {
  return useStore(studyStore, selector);
}

/** The design for the core: interval plus window or samples. */
export function designOf(s: { interval: number | null; length: StudyLength }): StudyDesign {
  const d: StudyDesign = {};
  if (s.interval !== null) d.interval = s.interval;
  if (s.length.by === 'window') d.window = s.length.window;
  else d.samples = s.length.samples;
  return d;
}

/** Keys of the folded blocks. */
export function foldedKeys(folded: Record<string, boolean>): string[] {
  return Object.keys(folded).filter((k) => folded[k]);
}
