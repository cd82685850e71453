import type { TimeUnit, VariableId } from '../model/types';

/**
 * Intensive longitudinal data in memory: persons, each with occasions in time order.
 * The one shape that importing, simulating a study and every fit share.
 */
export interface Panel {
  /** The measured variables, in column order (model variable ids once mapped). */
  variables: VariableId[];
  /** Unit of every `time` value. */
  timeUnit: TimeUnit;
  persons: PersonSeries[];
  /** ISO date-time of time 0, when times were read from dates (times are then measured from it). */
  origin?: string;
}

export interface PersonSeries {
  id: string;
  /** Occasion times in `Panel.timeUnit`, strictly increasing. */
  time: Float64Array;
  /** Day number of each occasion (0 = the person's first day), when known. */
  day?: Int32Array;
  /** Prompt number within its day (0 = first prompt), when known. */
  prompt?: Int32Array;
  /** Row-major values: `values[k * variables.length + j]` is variable j at occasion k; NaN marks a missing cell. */
  values: Float64Array;
}

/** Value of variable `j` at occasion `k` of a person (NaN when missing). */
export function cell(panel: Panel, person: PersonSeries, k: number, j: number): number {
  return person.values[k * panel.variables.length + j];
}
