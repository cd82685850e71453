/**
 * The study seen by the timescale views: the sampling interval, the study
 * length (a duration or a number of samples), which simultaneous blocks are
 * folded, and how the views are shown. Interval and study are in the model's
 * time unit. The design reaches the analysis store through `setStudyDesign`.
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { StudyDesign } from '../core/ordering/types';

export type StudyLength = { by: 'samples'; samples: number } | { by: 'window'; window: number };
export type TimescaleView = 'ordering' | 'unrolled';

export interface StudyState {
  /** Sampling interval Δ (model time unit); null until the model's range is known. */
  interval: number | null;
  length: StudyLength;
  /** Block key → folded. */
  folded: Record<string, boolean>;
  view: TimescaleView;
  /** Show the mechanism as drawn beside the view at the interval. */
  sideBySide: boolean;
  setInterval(interval: number): void;
  setLength(length: StudyLength): void;
  toggleFold(key: string): void;
  setFolded(key: string, folded: boolean): void;
  setView(view: TimescaleView): void;
  setSideBySide(on: boolean): void;
}

export function createStudyStore() {
  return createStore<StudyState>()((set) => ({
    interval: null,
    length: { by: 'samples', samples: 50 },
    folded: {},
    view: 'ordering',
    sideBySide: false,
    setInterval: (interval) => set((s) => (s.interval === interval || !(interval > 0) ? s : { interval })),
    setLength: (length) => set({ length }),
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
export function designOf(s: Pick<StudyState, 'interval' | 'length'>): StudyDesign {
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
