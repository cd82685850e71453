/**
 * The Loopfold model document (file format "loopfold-model", version 2).
 * Files of version 1 are migrated on open (`src/core/model/migrate.ts`);
 * a model read from a file is always version 2.
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

/** A timescale known only to lie between two durations, low ≤ high (read by `readTimescale` in timescale.ts). */
export interface TimescaleRange {
  low: number | string;
  high: number | string;
}

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
  /**
   * States: characteristic response time, a number in timeUnit or a duration such as "90 min";
   * or a range `{ low, high }` when it is only roughly known (point analyses use √(low·high)).
   */
  timescale?: number | string | TimescaleRange;
  /** States: whether the rate involves the state itself (a sketch assumes it does). */
  selfRegulating?: boolean;
  /** States: expression for the time derivative. */
  rate?: string;
  /** Derived variables: expression for the value. */
  formula?: string;
  unit?: string;
  note?: string;
  position?: Position;
  /** States (file version 2): process noise intensity, the variance added per unit time (default 1). */
  noise?: number;
  /** Measured variables (file version 2): share of true-score variance in a measurement, 0 < r ≤ 1 (default 1: no measurement error). */
  reliability?: number;
  /** Inputs (file version 2): standard deviation of the input's value across persons (person differences; default 0). */
  personSD?: number;
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
  /** File version 2: standard deviation of the strength across persons (default 0). */
  personSD?: number;
  /** File version 2: the range the strength may lie in when it is only roughly known (sizes, low ≤ high; the design advisor draws from it). */
  strengthRange?: { low: number; high: number };
}

export interface ModelSettings {
  /** Timescale separation factor k (settle when k·τ ≤ Δ, freeze when τ ≥ k·W). Default 5. */
  separation?: number;
  /** Version 1 only (migrated to `study.length`): default study length, in samples. Default 50. */
  samples?: number;
  /** Version 1 only (migrated to each state's `noise`): noise intensity per state (default 1). */
  noise?: Record<VariableId, number>;
}

/** The version of the model file this program writes. */
export const MODEL_VERSION = 2;

export interface Model {
  format: 'loopfold-model';
  /** 2 for every model read from a file (version-1 files are migrated); 1 only for models built in code the version-1 way. */
  version: 1 | 2;
  name: string;
  description?: string;
  /** Shown with clinical and other sensitive examples. */
  caution?: string;
  timeUnit: TimeUnit;
  variables: Variable[];
  relations?: Relation[];
  links: Link[];
  settings?: ModelSettings;
  /** Version 2: the study the modeller plans (absent: the app's default design). */
  study?: Study;
}

export const DEFAULT_SEPARATION = 5;
export const DEFAULT_SAMPLES = 50;

/**
 * The study a modeller plans (model file version 2, `study`).
 * Durations are a number in the model's time unit or text with a unit ("3h", "14 days").
 */
export type Duration = number | string;

/** When prompts are given. */
export type Schedule =
  /** One prompt every `interval`, day and night. */
  | { kind: 'fixed' }
  /** `promptsPerDay` prompts between `from` and `to` ("09:00", "21:00"); the night is one long gap. */
  | { kind: 'daily-window'; promptsPerDay: number; from: string; to: string; timing: 'fixed' | 'stratified-random' }
  /** One prompt a day (the interval is one day). */
  | { kind: 'daily' }
  /** One prompt a week (the interval is one week). */
  | { kind: 'weekly' };

export interface Study {
  /** The nominal interval between prompts. */
  interval: Duration;
  /** How long the study runs: text is a duration ("14 days"); a number is a count of samples (prompts planned). */
  length: string | number;
  schedule: Schedule;
  /** Number of persons (default 1). */
  persons?: number;
  /** Share of planned prompts that go unanswered, 0 ≤ p < 1 (default 0). */
  missedPrompts?: number;
  /** Interventions: variables held at a value during the study. */
  holds?: Record<VariableId, number>;
  /** Seed for everything random about the study (prompt times, missed prompts, simulated data). */
  seed?: number;
}
