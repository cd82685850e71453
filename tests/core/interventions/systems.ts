/**
 * Abstract equation systems for the intervention tests, with neutral names.
 * `mech` builds a mechanism structure the way buildStructure does: inputs
 * and states are given, a state's rate equation involves its derivative x'.
 */
import type { EquationStructure } from '../../../src/core/ordering/structure';

export interface AbstractSystem {
  inputs: string[];
  /** state → variables its rate reads (include the state itself when it is self-regulating). */
  states: Record<string, string[]>;
  /** derived → variables its formula reads. */
  derived: Record<string, string[]>;
  /** relation id → variables. */
  relations?: Record<string, string[]>;
}

export function mech(sys: AbstractSystem): EquationStructure {
  const equations = [
    ...Object.entries(sys.states).map(([x, vs]) => ({ id: `rate(${x})`, variables: [...new Set([`${x}'`, ...vs])].sort() })),
    ...Object.entries(sys.derived).map(([y, vs]) => ({ id: `formula(${y})`, variables: [...new Set([y, ...vs])].sort() })),
    ...Object.entries(sys.relations ?? {}).map(([r, vs]) => ({ id: r, variables: [...vs].sort() })),
  ].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const variables = [...new Set([...sys.inputs, ...Object.keys(sys.states), ...Object.keys(sys.derived)])].sort();
  return {
    equations,
    exogenous: [...sys.inputs, ...Object.keys(sys.states)].sort(),
    variables,
    derivatives: Object.fromEntries(Object.keys(sys.states).sort().map((x) => [x, `rate(${x})`])),
  };
}

export function rolesOf(sys: AbstractSystem, settle: string[], freeze: string[] = []): Record<string, 'input' | 'state' | 'derived' | 'settled' | 'frozen'> {
  const r: Record<string, 'input' | 'state' | 'derived' | 'settled' | 'frozen'> = {};
  for (const u of sys.inputs) r[u] = 'input';
  for (const x of Object.keys(sys.states)) r[x] = settle.includes(x) ? 'settled' : freeze.includes(x) ? 'frozen' : 'state';
  for (const y of Object.keys(sys.derived)) r[y] = 'derived';
  return r;
}

/**
 * A stock regulated only through a chain (Dash 2005, the paper's running
 * example of a stock whose outflow grows with it, §2; rebuilt from memory
 * with neutral names): x' = u − q, p = f(x), q = g(p, k). The rate of x does
 * not read x itself: x settles through the loop x → p → q → x'.
 */
export const chainRegulated: AbstractSystem = {
  inputs: ['k', 'u'],
  states: { x: ['u', 'q'] },
  derived: { p: ['x'], q: ['k', 'p'] },
};

/** A self-regulating stock (Dash 2005, §4, the case where the variable's rate reads the variable itself; from memory): x' = u − x, y = f(x). */
export const selfRegulated: AbstractSystem = {
  inputs: ['u'],
  states: { x: ['u', 'x'] },
  derived: { y: ['x'] },
};

/** A settled stock determined together with a derived variable: x' = f(x, y), y = g(x, u); at equilibrium {x, y} is one simultaneous block. */
export const simultaneous: AbstractSystem = {
  inputs: ['u'],
  states: { x: ['x', 'y'] },
  derived: { y: ['u', 'x'] },
};
