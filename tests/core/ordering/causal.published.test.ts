/**
 * Published worked examples of causal ordering, rebuilt as abstract equation
 * systems with neutral names (f1…, x1…). Each check names its source; where
 * the example was reconstructed from memory rather than re-read, it says so.
 */
import { describe, expect, it } from 'vitest';
import { causalOrder } from '../../../src/core/ordering/causal';
import { equilibrate, exogenize, hold } from '../../../src/core/ordering/operators';
import { orderStructure } from '../../../src/core/ordering/order';
import type { EquationStructure, EquationSystem } from '../../../src/core/ordering/structure';

const eq = (id: string, ...variables: string[]) => ({ id, variables });
const summary = (s: EquationSystem) => causalOrder(s).blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}`);

describe('Gonçalves & Porto (2016), "A note on the complexity of the causal ordering problem", Artificial Intelligence 238, §1', () => {
  it('f1(x1), f2(x1, x2): the only causal dependency is x2 on x1', () => {
    // Source: the introduction's opening example (arXiv 1508.05804, §1): "the only one is (x1, x2)".
    const o = causalOrder({ equations: [eq('f1', 'x1'), eq('f2', 'x1', 'x2')] });
    expect(o.edges.map((e) => [e.from, e.to])).toEqual([['x1', 'x2']]);
    expect(o.blocks.map((b) => b.level)).toEqual([0, 1]);
  });
});

describe('Simon (1953), "Causal ordering and identifiability", §3: a self-contained structure with complete subsets of orders 0, 1, 2', () => {
  // Reconstructed from memory (the seven-equation example as it is also shown in Iwasaki & Simon 1986,
  // "Causality in device behavior", Artificial Intelligence 29, §2): three one-variable equations, a pair
  // of equations coupling x4 and x5, and two equations each adding one variable.
  const system: EquationSystem = {
    equations: [
      eq('f1', 'x1'),
      eq('f2', 'x2'),
      eq('f3', 'x3'),
      eq('f4', 'x1', 'x2', 'x3', 'x4', 'x5'),
      eq('f5', 'x1', 'x3', 'x4', 'x5'),
      eq('f6', 'x4', 'x6'),
      eq('f7', 'x5', 'x7'),
    ],
  };

  it('order 0: {f1}, {f2}, {f3}; order 1: {f4, f5} for x4, x5 together; order 2: {f6}, {f7}', () => {
    expect(summary(system)).toEqual(['0:x1/f1', '0:x2/f2', '0:x3/f3', '1:x4,x5/f4,f5', '2:x6/f6', '2:x7/f7']);
  });

  it('x1, x2, x3 act directly on x4 and x5; x4 and x5 are coupled; x4 acts on x6 and x5 on x7', () => {
    const o = causalOrder(system);
    const pairs = o.edges.map((e) => `${e.from}→${e.to}${e.simultaneous ? '~' : ''}`);
    expect(pairs).toEqual(['x1→x4', 'x2→x4', 'x3→x4', 'x1→x5', 'x2→x5', 'x3→x5', 'x4→x5~', 'x4→x6', 'x5→x7']);
  });

  it('removing f3 leaves a structure that is not self-contained: x3 and the coupled block are under-determined', () => {
    // Simon 1953 §3: a structure with fewer equations than variables is not self-contained.
    const o = causalOrder({ equations: system.equations.filter((e) => e.id !== 'f3') });
    const under = o.blocks.filter((b) => b.determination === 'under');
    expect(under.flatMap((b) => b.variables).sort()).toEqual(['x3', 'x4', 'x5', 'x6', 'x7']);
  });
});

/**
 * Iwasaki & Simon (1994), "Causality and model abstraction", Artificial
 * Intelligence 67: a store with an inflow and a pressure-driven outflow,
 * rebuilt abstractly (reconstructed from memory; its equilibrium form, with
 * the same reversed ordering, is re-read in Mooij's Example 6 below and was
 * used by Blom, van Diepen & Mooij 2021, JMLR 22):
 *   g1: x1 (inflow, set from outside)      g2: x2 (outlet setting)
 *   g3: x3 with x4 (pressure from level)   g4: x5 with x2, x3 (outflow)
 *   rate(x4): x4' with x1, x5 (the level integrates inflow minus outflow)
 */
const mixed = (): EquationStructure => ({
  equations: [eq('g1', 'x1'), eq('g2', 'x2'), eq('g3', 'x3', 'x4'), eq('g4', 'x2', 'x3', 'x5'), eq('rate(x4)', "x4'", 'x1', 'x5')],
  exogenous: ['x4'],
  variables: ['x1', 'x2', 'x3', 'x4', 'x5'],
  derivatives: { x4: 'rate(x4)' },
});

describe('Iwasaki & Simon (1994) — dynamic causal ordering of a mixed structure and its equilibration', () => {
  it('at an instant the level x4 is given: x4 → x3 → x5, and x1, x5 act on x4 only by integration', () => {
    const o = orderStructure(mixed());
    expect(o.blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}`)).toEqual(['0:x1/g1', '0:x2/g2', '0:x4/', '1:x3/g3', '2:x5/g4']);
    expect(o.edges.filter((e) => e.kind === 'integrating').map((e) => `${e.from}→${e.to}`)).toEqual(['x1→x4', 'x5→x4']);
    expect(o.integrations).toEqual([{ state: 'x4', equation: 'rate(x4)', sources: ['x1', 'x5'] }]);
  });

  it('equilibrating x4 reverses the order: the balance fixes the outflow x5 from the inflow, then x3, then the level x4', () => {
    // The published point of this example: at equilibrium the outflow is determined by the inflow,
    // and the level is determined last, the reverse of the dynamic ordering.
    const { structure, change } = equilibrate(mixed(), 'x4');
    expect(change.changed).toEqual(['rate(x4)']);
    const o = orderStructure(structure);
    expect(o.blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}`)).toEqual([
      '0:x1/g1',
      '0:x2/g2',
      '1:x5/rate(x4)',
      '2:x3/g4',
      '3:x4/g3',
    ]);
    expect(o.integrations).toEqual([]);
  });

  it('exogenizing x4 (a slow level held constant) drops its rate equation and keeps the instantaneous order', () => {
    const { structure, change } = exogenize(mixed(), 'x4');
    expect(change.removed).toEqual(['rate(x4)']);
    const o = orderStructure(structure);
    expect(o.blocks.map((b) => `${b.level}:${b.variables.join(',')}`)).toEqual(['0:x1', '0:x2', '0:x4', '1:x3', '2:x5']);
    expect(o.edges.every((e) => e.kind === 'instantaneous')).toBe(true);
  });

  it('a perfect intervention on x3 in the equilibrium model cuts x3 from the level (Blom et al. 2021, perfect interventions; Pearl 2000 §3.2)', () => {
    const eqm = equilibrate(mixed(), 'x4').structure;
    const { structure, change } = hold(eqm, 'x3', 1);
    // x3 was determined by g4 in the equilibrium ordering: that equation is the one replaced.
    expect(change.removed).toEqual(['g4']);
    expect(change.added).toEqual(['hold(x3)']);
    const o = orderStructure(structure);
    expect(o.blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}`)).toEqual([
      '0:x1/g1',
      '0:x2/g2',
      '0:x3/hold(x3)',
      '1:x4/g3',
      '1:x5/rate(x4)',
    ]);
  });
});

/**
 * Mooij, "Causal Reasoning with Bipartite Graphical Causal Models" (preprint,
 * University of Amsterdam), Examples 2, 6 and 20 and Table 1: a simplified
 * equilibrium of the Iwasaki & Simon (1994) store, rebuilt with neutral names:
 *   exogenous w1 (inflow), w2 (outlet area), w3 (a constant of the medium)
 *   f1: 0 = w1 − x1                 (x1: outflow; outflow equals inflow)
 *   f2: 0 = w2·√x2 − x1             (x2: pressure)
 *   f3: 0 = w3·x3 − x2              (x3: level)
 * A hard intervention do(fj: xv = ξ) replaces equation fj by 0 = xv − ξ.
 */
describe('Mooij, bipartite graphical causal models: the equilibrium example and its hard interventions', () => {
  const exogenous = ['w1', 'w2', 'w3'];
  const f = { f1: ['w1', 'x1'], f2: ['w2', 'x2', 'x1'], f3: ['w3', 'x3', 'x2'] } as const;
  const system = (replace?: { eq: keyof typeof f; target: string }): EquationSystem => ({
    equations: (Object.keys(f) as (keyof typeof f)[]).map((id) => eq(id, ...(replace?.eq === id ? [replace.target] : f[id]))),
    exogenous,
  });
  const order = (s: EquationSystem) =>
    causalOrder(s)
      .blocks.filter((b) => b.equations.length > 0)
      .map((b) => `${b.equations.join(',')}→${b.variables.join(',')}`);

  it('Example 6: f1 determines x1, f2 then x2, f3 last x3 (singleton clusters)', () => {
    expect(order(system())).toEqual(['f1→x1', 'f2→x2', 'f3→x3']);
    expect(causalOrder(system()).blocks.filter((b) => b.equations.length > 0).map((b) => b.level)).toEqual([1, 2, 3]);
  });

  it('Example 20 (i): do(f1: x3 = ξ) reverses the ordering — x3, then x2 by f3, then x1 by f2', () => {
    expect(order(system({ eq: 'f1', target: 'x3' }))).toEqual(['f1→x3', 'f3→x2', 'f2→x1']);
  });

  it('Example 20 (ii): do(f2: x3 = ξ) — f1 still fixes x1, the replaced f2 fixes x3, f3 now gives x2', () => {
    const o = causalOrder(system({ eq: 'f2', target: 'x3' }));
    const by = Object.fromEntries(o.blocks.filter((b) => b.equations.length > 0).map((b) => [b.equations[0], b.variables.join(',')]));
    expect(by).toEqual({ f1: 'x1', f2: 'x3', f3: 'x2' });
  });

  it('Example 20 (iii): do(f3: x3 = ξ) keeps the ordering; it is the one hold() chooses, since f3 is paired with x3', () => {
    expect(order(system({ eq: 'f3', target: 'x3' }))).toEqual(['f3→x3', 'f1→x1', 'f2→x2']);
    const s: EquationStructure = { ...system(), exogenous, variables: ['w1', 'w2', 'w3', 'x1', 'x2', 'x3'], derivatives: {} };
    expect(hold(s, 'x3', 1).change.removed).toEqual(['f3']);
  });

  it('Table 1 through hold(): the equation it replaces, and the other feasible replacements it reports', () => {
    const s: EquationStructure = { ...system(), exogenous, variables: ['w1', 'w2', 'w3', 'x1', 'x2', 'x3'], derivatives: {} };
    const summary = (x: string) => {
      const c = hold(s, x, 1).change;
      return { removed: c.removed, alternatives: c.alternatives ?? [] };
    };
    // Row x1: only f1 (f2, f3 ∅); row x2: f1 and f2 (f3 ∅); row x3: f1, f2 and f3.
    expect(summary('x1')).toEqual({ removed: ['f1'], alternatives: [] });
    expect(summary('x2')).toEqual({ removed: ['f2'], alternatives: ['f1'] });
    expect(summary('x3')).toEqual({ removed: ['f3'], alternatives: ['f1', 'f2'] });
  });

  it('Table 1: which do(fj: xv = ξ) leave a uniquely solvable (self-contained) system', () => {
    const feasible: Record<string, boolean> = {};
    for (const target of ['x1', 'x2', 'x3'])
      for (const e of ['f1', 'f2', 'f3'] as const)
        feasible[`do(${e}: ${target})`] = causalOrder(system({ eq: e, target })).blocks.every((b) => b.determination === 'well');
    expect(feasible).toEqual({
      'do(f1: x1)': true,
      'do(f2: x1)': false,
      'do(f3: x1)': false,
      'do(f1: x2)': true,
      'do(f2: x2)': true,
      'do(f3: x2)': false,
      'do(f1: x3)': true,
      'do(f2: x3)': true,
      'do(f3: x3)': true,
    });
  });
});
