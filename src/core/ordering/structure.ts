/**
 * Equation structures: which variables each equation involves, and which
 * variables are given from outside. This is all causal ordering needs; the
 * formulas themselves never enter here.
 */
import type { EquationId, VariableId } from '../model/types';

export interface StructureEquation {
  id: EquationId;
  /** The variables the equation involves (order and repeats do not matter). */
  variables: VariableId[];
}

/**
 * An abstract equation system: equations over variables, some of which are
 * exogenous (given from outside, never solved for).
 * Example: `{ equations: [{ id: 'f1', variables: ['x1'] }, { id: 'f2', variables: ['x1', 'x2'] }], exogenous: [] }`.
 */
export interface EquationSystem {
  equations: StructureEquation[];
  /** Variables given from outside; they become singleton blocks of level 0 with no equations. */
  exogenous?: VariableId[];
  /** Further unknowns that may appear in no equation (each then is under-determined). */
  variables?: VariableId[];
}

/**
 * An equation structure of a model at one design: an equation system plus
 * the derivatives of the dynamic states. The derivative of a state x is the
 * internal unknown `x'`, determined by the rate equation `rate(x)`; it never
 * appears in the published ordering (the rate equation becomes an
 * Integration instead).
 */
export interface EquationStructure extends EquationSystem {
  exogenous: VariableId[];
  /** Every model variable (not the derivatives), sorted. */
  variables: VariableId[];
  /** Dynamic states: state id → its rate equation id. Its derivative is `derivativeOf(state)`. */
  derivatives: Record<VariableId, EquationId>;
}

/** The internal name of the derivative of state x. Model ids cannot contain a quote, so it never clashes. */
export function derivativeOf(x: VariableId): VariableId {
  return `${x}'`;
}

/** The state of a derivative name `x'`, or null for an ordinary variable. */
export function stateOfDerivative(v: VariableId): VariableId | null {
  return v.endsWith("'") ? v.slice(0, -1) : null;
}

/** How a modeller reads an internal variable name: `x'` is shown as `d(x)/dt`. */
export function displayName(v: VariableId): string {
  const s = stateOfDerivative(v);
  return s === null ? v : `d(${s})/dt`;
}

/** Plain code-unit order (not locale order), the one order every output is sorted by. */
export function compareIds(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Whether a list is sorted with no repeats (then a copy needs no sorting). */
function strictlyIncreasing(xs: readonly string[]): boolean {
  for (let i = 1; i < xs.length; i++) if (!(xs[i - 1] < xs[i])) return false;
  return true;
}
const sortedUnique = (xs: readonly string[]): string[] => (strictlyIncreasing(xs) ? xs.slice() : [...new Set(xs)].sort(compareIds));

/**
 * A deep copy with every list sorted and de-duplicated: operators work on
 * copies, never on their input. The operators' own results are sorted
 * already, so a list found in order is copied as it is.
 */
export function cloneStructure(s: EquationStructure): EquationStructure {
  const equations = s.equations.map((e) => ({ id: e.id, variables: sortedUnique(e.variables) }));
  if (!strictlyIncreasing(equations.map((e) => e.id))) equations.sort((a, b) => compareIds(a.id, b.id));
  const keys = Object.keys(s.derivatives);
  return {
    equations,
    exogenous: sortedUnique(s.exogenous),
    variables: sortedUnique(s.variables),
    derivatives: strictlyIncreasing(keys) ? { ...s.derivatives } : Object.fromEntries(Object.entries(s.derivatives).sort((a, b) => compareIds(a[0], b[0]))),
  };
}
