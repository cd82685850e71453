/** View state of the integer-step mode (the Steps tab): the rate shown, the largest rate, a graph read from a file. */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { GraphFile } from '../core/undersample/index';

export interface StepsState {
  /** The rate shown: measured every u-th step. */
  rate: number;
  /** The largest rate on the control, and of "any u ≤ U". */
  maxRate: number;
  /** A graph read from a file: a causal-step graph, or a measured graph (then the figure shows it as it is). */
  file: { graph: GraphFile; as: 'causal' | 'measured'; fileName: string } | null;
  /** The mechanism canvas shows the sketch's measured graph at `rate` instead of its links. */
  onCanvas: boolean;
  set(patch: Partial<Omit<StepsState, 'set'>>): void;
}

export const stepsStore = createStore<StepsState>()((set) => ({
  rate: 2,
  maxRate: 8,
  file: null,
  onCanvas: false,
  set: (patch) => set(patch),
}));

export function useSteps<T>(selector: (s: StepsState) => T): T {
  return useStore(stepsStore, selector);
}
