/**
 * The Loopfold model document (file format "loopfold-model", version 1).
 *
 * Ids of variables and of equations are both strings; the branded aliases
 * below keep them apart in signatures. Durations are in the model's own
 * `timeUnit` unless a value carries a unit of its own ("90 min").
 */
export type VariableId = string;
export type EquationId = string;

export const TIME_UNITS = ['s', 'min', 'h', 'day', 'week', 'month', 'year'] as const;
export type TimeUnit = (typeof TIME_UNITS)[number];

export type VariableKind = 'input' | 'state' | 'derived';
export type LinkKind = 'instantaneous' | 'integrating';
export type LinkSign = '+' | '-';

export interface Position {
  x: number;
  y: number;
}

export interface Variable {
  id: VariableId;
  label?: string;
  kind: VariableKind;
  /** Inputs: the value they are held at. */
  value?: number;
  /** States: the initial value for simulation. */
  initial?: number;
  /** States: characteristic response time, a number in timeUnit or a duration such as "90 min". */
  timescale?: number | string;
  /** States: whether the rate involves the state itself (a sketch assumes it does). */
  selfRegulating?: boolean;
  /** States: expression for the time derivative. */
  rate?: string;
  /** Derived variables: expression for the value. */
  formula?: string;
  unit?: string;
  note?: string;
  position?: Position;
}

export interface Relation {
  id: EquationId;
  /** An implicit equation `lhs = rhs`, not solved for any variable. */
  equation: string;
  note?: string;
  position?: Position;
}

export interface Link {
  id?: string;
  from: VariableId;
  to: VariableId;
  kind: LinkKind;
  sign?: LinkSign;
  weight?: number;
}

export interface ModelSettings {
  /** Timescale separation factor k (settle when k·τ ≤ Δ, freeze when τ ≥ k·W). Default 5. */
  separation?: number;
  /** Default study length, in samples. Default 50. */
  samples?: number;
  /** Noise intensity per state for the sampled model (default: 1 for every state). */
  noise?: Record<VariableId, number>;
}

export interface Model {
  format: 'loopfold-model';
  version: 1;
  name: string;
  description?: string;
  /** Shown with clinical and other sensitive examples. */
  caution?: string;
  timeUnit: TimeUnit;
  variables: Variable[];
  relations?: Relation[];
  links: Link[];
  settings?: ModelSettings;
}

export const DEFAULT_SEPARATION = 5;
export const DEFAULT_SAMPLES = 50;
