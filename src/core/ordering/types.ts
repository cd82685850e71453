/**
 * The contract of the ordering core: what `orderingAt` returns, in the shape
 * `loopfold order --json` prints. Implementations live beside this file;
 * the UI, the layout, the exporter and the command line read only these types.
 */
import type { EquationId, VariableId } from '../model/types';

/** How a variable is treated at a given sampling interval. */
export type Role =
  | 'input' // exogenous by the modeller's choice
  | 'state' // dynamic: given at each instant, moved across time by its rate
  | 'derived' // determined within the instant by the equations
  | 'settled' // a fast state, equilibrated: its rate equation became a balance equation
  | 'frozen' // a slow state, exogenized: constant over the study
  | 'held'; // fixed by an intervention (do-operator)

export type EdgeKind = 'instantaneous' | 'integrating';

export interface OrderingEdge {
  from: VariableId;
  to: VariableId;
  /** instantaneous: acts within one instant; integrating: acts across time (through the state's derivative). */
  kind: EdgeKind;
  /** Both ends belong to one simultaneous block (the coupling has no single direction). */
  simultaneous?: boolean;
  /** The equation that carries the effect. */
  equation: EquationId;
}

export type Determination = 'well' | 'over' | 'under';

export interface OrderingBlock {
  /** Variables determined together, sorted by id. */
  variables: VariableId[];
  /** The equations that determine them, sorted by id (empty for exogenous variables). */
  equations: EquationId[];
  /** Simon's order: 0 for a block with no parent block, else 1 + the highest parent's level. */
  level: number;
  /** 'over'/'under' for the parts of a system that is not self-contained. */
  determination: Determination;
}

export interface Diagnostic {
  level: 'error' | 'warning';
  /** A stable machine-readable tag, e.g. "under-determined". Never shown alone. */
  code: string;
  message: string;
  variables: VariableId[];
  equations: EquationId[];
}

/** A state carried across time: its rate equation and the variables it reads. */
export interface Integration {
  state: VariableId;
  equation: EquationId;
  sources: VariableId[];
}

export interface Ordering {
  roles: Record<VariableId, Role>;
  blocks: OrderingBlock[];
  edges: OrderingEdge[];
  integrations: Integration[];
  diagnostics: Diagnostic[];
}

export interface StudyDesign {
  /** Sampling interval Δ in the model's time unit. Omitted: the mechanism itself (every state dynamic). */
  interval?: number;
  /** Study length W in the model's time unit. Omitted: `samples × interval`. */
  window?: number;
  /** Study length in samples (used when window is omitted). Default: the model's study length, else 50. */
  samples?: number;
  /** Interventions: variable → value. */
  hold?: Record<VariableId, number>;
  /** Settle every state that can settle (the equilibrium model), whatever the interval. */
  settleAll?: boolean;
}

/**
 * Equation ids. A derived variable's formula is `formula(v)`, a state's rate
 * equation is `rate(x)` (the same id once it is settled into a balance
 * equation), a relation keeps its own id, an intervention adds `hold(x)`.
 * Relation ids cannot contain parentheses, so the spaces never clash.
 */
export const equationId = {
  formula: (v: VariableId): EquationId => `formula(${v})`,
  rate: (x: VariableId): EquationId => `rate(${x})`,
  hold: (x: VariableId): EquationId => `hold(${x})`,
};

/** A place on the interval axis where some state changes role. */
export interface Breakpoint {
  /** The interval Δ (model time unit) at which the change happens; the new role holds from here on (inclusive). */
  interval: number;
  /**
   * The new role holds only for intervals strictly above `interval`; at `interval` itself the old role still
   * holds (a frozen state thaws once Δ > τ/(k·N)). Omitted: inclusive, as above.
   */
  exclusive?: boolean;
  changes: { variable: VariableId; from: Role; to: Role; reason: string }[];
}

/** A range of intervals with one ordering: [from, to), `to` = Infinity for the last. */
export interface Band {
  from: number;
  to: number;
  /** `from` itself is not in the band (it follows an exclusive breakpoint). */
  excludesFrom?: boolean;
  /** `to` itself is in the band (an exclusive breakpoint, or the end of a fixed study window). */
  includesTo?: boolean;
  roles: Record<VariableId, Role>;
}
