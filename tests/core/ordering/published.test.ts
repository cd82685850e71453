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
 * rebuilt abstractly (reconstructed from memory; the same structure is the
 * running example of Blom, van Diepen & Mooij 2021, JMLR 22, in its
 * equilibrium form):
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
