import type { Model } from '../core/model/types';
import sleepStress from './sleep-stress.json';

/** An example of the gallery: a scenario of Loopfold's own, with a short description. */
export interface Example {
  id: string;
  title: string;
  summary: string;
  /** Raw model JSON; validate with parseModel before use, like any file. */
  model: unknown;
}

export const EXAMPLES: Example[] = [
  {
    id: 'sleep-stress',
    title: 'Sleep, stress and mood',
    summary: 'An illustrative daily-life loop from minutes (stress) to months (coping). No clinical advice.',
    model: sleepStress,
  },
];

export const DEFAULT_EXAMPLE = 'sleep-stress';
export type { Model };
