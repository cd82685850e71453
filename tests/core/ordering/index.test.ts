/**
 * orderingAt on whole models. The first model rebuilds, with neutral names,
 * the mixed structure of Iwasaki & Simon (1994), "Causality and model
 * abstraction", Artificial Intelligence 67 (reconstructed from memory): a
 * level x4 integrating an inflow u1 minus an outflow x5, where x5 follows a
 * pressure-like x3 of the level. Its published lesson: once the level is at
 * equilibrium the ordering reverses (inflow → outflow → pressure → level).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bands, equationMatching, orderingAt } from '../../../src/core/ordering/index';
import { EXAMPLES } from '../../../src/examples/index';
import { parseModel } from '../../../src/core/model/schema';
import { permute, SEED } from './generators';
import type { Model, Variable, Link, Relation } from '../../../src/core/model/types';

function model(variables: Variable[], links: Link[] = [], relations?: Relation[]): Model {
  return { format: 'loopfold-model', version: 1, name: 'test', timeUnit: 'h', variables, links, relations };
}
const blocksOf = (m: Model, design = {}) => orderingAt(m, design).blocks.map((b) => `${b.level}:${b.variables.join(',')}/${b.equations.join(',')}${b.determination === 'well' ? '' : `(${b.determination})`}`);

const level = model([
  { id: 'u1', kind: 'input' },
  { id: 'u2', kind: 'input' },
  { id: 'x4', kind: 'state', timescale: '10 min', rate: 'u1 - x5' },
  { id: 'x3', kind: 'derived', formula: '2 * x4' },
  { id: 'x5', kind: 'derived', formula: 'u2 * x3' },
]);

describe('orderingAt: the mixed structure of Iwasaki & Simon (1994)', () => {
  it('the mechanism: x4 given at each instant → x3 → x5; u1 and x5 integrate into x4', () => {
    const o = orderingAt(level);
    expect(blocksOf(level)).toEqual(['0:u1/', '0:u2/', '0:x4/', '1:x3/formula(x3)', '2:x5/formula(x5)']);
    expect(o.roles).toEqual({ u1: 'input', u2: 'input', x3: 'derived', x4: 'state', x5: 'derived' });
    expect(o.edges).toEqual([
      { from: 'x4', to: 'x3', kind: 'instantaneous', equation: 'formula(x3)' },
      { from: 'u1', to: 'x4', kind: 'integrating', equation: 'rate(x4)' },
      { from: 'x5', to: 'x4', kind: 'integrating', equation: 'rate(x4)' },
      { from: 'u2', to: 'x5', kind: 'instantaneous', equation: 'formula(x5)' },
      { from: 'x3', to: 'x5', kind: 'instantaneous', equation: 'formula(x5)' },
    ]);
    expect(o.integrations).toEqual([{ state: 'x4', equation: 'rate(x4)', sources: ['u1', 'x5'] }]);
    expect(o.diagnostics).toEqual([]);
  });

  it('sampled hourly, x4 settles (5 × 10 min ≤ 1 h) and the ordering reverses — with a warning naming the variables', () => {
    const o = orderingAt(level, { interval: 1 });
    expect(o.roles.x4).toBe('settled');
    expect(blocksOf(level, { interval: 1 })).toEqual(['0:u1/', '0:u2/', '1:x5/rate(x4)', '2:x3/formula(x5)', '3:x4/formula(x3)']);
    expect(o.integrations).toEqual([]);
    expect(o.edges.every((e) => e.kind === 'instantaneous')).toBe(true);
    expect(o.diagnostics).toEqual([
      {
        level: 'warning',
        code: 're-oriented',
        message: 'settling x4 turns its rate into a balance equation that determines x5, not x4; x4 is now determined by formula(x3): the causal direction through x4 reverses at this interval',
        variables: ['x4', 'x5'],
        equations: ['formula(x3)', 'rate(x4)'],
      },
    ]);
  });

  it('a self-regulating state settles without re-orienting: its balance equation determines itself', () => {
    const m = model([{ id: 'u', kind: 'input' }, { id: 's', kind: 'state', timescale: 1, rate: 'u - s' }, { id: 'y', kind: 'derived', formula: 's' }]);
    const o = orderingAt(m, { settleAll: true });
    expect(blocksOf(m, { settleAll: true })).toEqual(['0:u/', '1:s/rate(s)', '2:y/formula(y)']);
    expect(o.diagnostics).toEqual([]);
  });

  it('sampled very finely, x4 is frozen: no integration, x4 a constant of the study', () => {
    const o = orderingAt(level, { interval: 1e-6 });
    expect(o.roles.x4).toBe('frozen');
    expect(o.integrations).toEqual([]);
    expect(blocksOf(level, { interval: 1e-6 })).toEqual(['0:u1/', '0:u2/', '0:x4/', '1:x3/formula(x3)', '2:x5/formula(x5)']);
  });

  it('the output does not depend on the order of variables and links in the file', () => {
    const shuffled: Model = { ...level, variables: [...level.variables].reverse() };
    expect(JSON.stringify(orderingAt(shuffled, { interval: 1 }))).toBe(JSON.stringify(orderingAt(level, { interval: 1 })));
  });
});

describe('orderingAt: systems that are not self-contained (Dulmage–Mendelsohn parts)', () => {
  it('a settled state whose rate reads only inputs: the rate is a constraint on the inputs, and the state is undetermined', () => {
    const m = model([{ id: 'u', kind: 'input' }, { id: 's', kind: 'state', rate: '3 * u' }]);
    const o = orderingAt(m, { settleAll: true });
    expect(blocksOf(m, { settleAll: true })).toEqual(['0:s/(under)', '0:u/', '1:/rate(s)(over)']);
    expect(o.diagnostics.map((d) => [d.code, d.message])).toEqual([
      ['constraint-on-inputs', 'equation rate(s) has no unknown left: it is a constraint on the inputs u; remove it or let it determine a variable that is not an input'],
      ['under-determined', 's appears in no equation, so nothing determines it: give it a formula, or make it an input'],
    ]);
    expect(o.diagnostics.every((d) => d.level === 'error')).toBe(true);
  });

  it('two equations for one variable over-determine it', () => {
    const m = model([{ id: 'u', kind: 'input' }, { id: 'y', kind: 'derived', formula: 'u + 1' }], [], [{ id: 'r1', equation: 'y = 2 * u' }]);
    const o = orderingAt(m);
    expect(o.diagnostics.map((d) => d.message)).toEqual([
      'equations formula(y) and r1 over-determine y: 2 equations for 1 unknown; remove one equation or free a variable that is held or an input',
    ]);
    expect(o.diagnostics[0].variables).toEqual(['y']);
    expect(o.diagnostics[0].equations).toEqual(['formula(y)', 'r1']);
  });

  it('one relation for two variables leaves them undetermined', () => {
    const m = model([{ id: 'a', kind: 'derived' }, { id: 'b', kind: 'derived' }], [], [{ id: 'r1', equation: 'a = b' }]);
    const o = orderingAt(m);
    expect(o.diagnostics.map((d) => d.message)).toEqual([
      'a and b are not determined: the one equation r1 cannot fix 2 unknowns; add an equation or make one of them an input',
    ]);
    expect(blocksOf(m)).toEqual(['0:a,b/r1(under)']);
  });
});

describe('orderingAt: interventions (do-operator)', () => {
  it('holding a derived variable replaces its formula by hold(x): its parents no longer act on it', () => {
    const o = orderingAt(level, { hold: { x3: 0 } });
    expect(o.roles.x3).toBe('held');
    expect(blocksOf(level, { hold: { x3: 0 } })).toEqual(['0:u1/', '0:u2/', '0:x3/hold(x3)', '0:x4/', '1:x5/formula(x5)']);
    expect(o.edges.some((e) => e.to === 'x3')).toBe(false);
  });

  it('holding a state drops its rate: it is no longer integrated', () => {
    const o = orderingAt(level, { hold: { x4: 2 } });
    expect(o.integrations).toEqual([]);
    expect(o.blocks.find((b) => b.variables.includes('x4'))!.equations).toEqual(['hold(x4)']);
  });

  it('holding a state at an interval where it would settle: the intervention replaces its mechanism first, then nothing settles it', () => {
    // Manipulate, then equilibrate (Dash 2005, "Restructuring dynamic causal systems in equilibrium", AISTATS; from
    // memory): fixing x4 removes its rate equation, so the balance equation that re-oriented the ordering is gone.
    const o = orderingAt(level, { interval: 1, hold: { x4: 1 } });
    expect(o.roles.x4).toBe('held');
    expect(blocksOf(level, { interval: 1, hold: { x4: 1 } })).toEqual(['0:u1/', '0:u2/', '0:x4/hold(x4)', '1:x3/formula(x3)', '2:x5/formula(x5)']);
    expect(o.diagnostics).toEqual([]);
  });

  it('holding a variable that relations determine: the warning names the other equations the intervention could replace', () => {
    // The equilibrium example of Mooij (bipartite graphical causal models, Example 2) as relations:
    // holding the level x3 replaces r3 by default; r1 or r2 would also do, with other effects (Table 1).
    const m = model(
      [{ id: 'w1', kind: 'input' }, { id: 'w2', kind: 'input' }, { id: 'w3', kind: 'input' }, { id: 'x1', kind: 'derived' }, { id: 'x2', kind: 'derived' }, { id: 'x3', kind: 'derived' }],
      [],
      [{ id: 'r1', equation: 'w1 = x1' }, { id: 'r2', equation: 'x1 = w2 * sqrt(x2)' }, { id: 'r3', equation: 'x2 = w3 * x3' }],
    );
    expect(blocksOf(m)).toEqual(['0:w1/', '0:w2/', '0:w3/', '1:x1/r1', '2:x2/r2', '3:x3/r3']);
    const o = orderingAt(m, { hold: { x3: 0.5 } });
    expect(o.diagnostics).toEqual([
      {
        level: 'warning',
        code: 'hold-alternatives',
        message: 'holding x3 replaces r3, the equation that determines x3 now; replacing r1 or r2 instead would also fix x3, with different effects on the other variables: which mechanism an intervention overrides decides what it changes',
        variables: ['x3'],
        equations: ['r1', 'r2', 'r3'],
      },
    ]);
    expect(orderingAt(m, { hold: { x1: 1 } }).diagnostics).toEqual([]);
  });

  it('holding a variable determined together with another by relations: the dropped equation is a choice, and the warning names the candidates', () => {
    const m = model(
      [{ id: 'u', kind: 'input' }, { id: 'a', kind: 'derived' }, { id: 'b', kind: 'derived' }],
      [],
      [{ id: 'r1', equation: 'a + b = u' }, { id: 'r2', equation: 'a - b = 1' }],
    );
    expect(blocksOf(m)).toEqual(['0:u/', '1:a,b/r1,r2']);
    const o = orderingAt(m, { hold: { a: 1 } });
    const w = o.diagnostics.find((d) => d.code === 'hold-ambiguous')!;
    expect(w.level).toBe('warning');
    expect(w.equations).toEqual(['r1', 'r2']);
    expect(w.message).toContain('holding a drops one of the equations r1 and r2');
    expect(blocksOf(m, { hold: { a: 1 } })).toEqual(['0:a/hold(a)', '0:u/', '1:b/r2']);
  });
});

describe('equationMatching', () => {
  it('lists each equation with its variables and the one it is paired with; derivatives read d(x)/dt', () => {
    const em = equationMatching(level);
    expect(em.variables).toEqual(['x3', 'd(x4)/dt', 'x5']);
    expect(em.equations).toEqual([
      { id: 'formula(x3)', variables: ['x3', 'x4'], determines: 'x3' },
      { id: 'formula(x5)', variables: ['u2', 'x3', 'x5'], determines: 'x5' },
      { id: 'rate(x4)', variables: ['u1', 'd(x4)/dt', 'x5'], determines: 'd(x4)/dt' },
    ]);
  });

  it('at an interval where x4 settles, the rate equation is paired with x5', () => {
    const em = equationMatching(level, { interval: 1 });
    expect(em.equations.find((e) => e.id === 'rate(x4)')).toEqual({ id: 'rate(x4)', variables: ['u1', 'x5'], determines: 'x5' });
  });
});

describe('orderingAt: byte-identical output for any order of the model file (every gallery example, fast-check, seeded)', () => {
  it('shuffled variables, links and relations give the same JSON at every band of the interval axis', () => {
    for (const ex of EXAMPLES) {
      const parsed = parseModel(ex.model);
      if (!parsed.ok) throw new Error(`${ex.id}: ${parsed.issues.map((i) => `${i.path} ${i.message}`).join('; ')}`);
      const m = parsed.model;
      const intervals = bands(m).map((b) => (b.to === Infinity ? b.from * 2 : (b.from + b.to) / 2));
      const expected = intervals.map((interval) => JSON.stringify(orderingAt(m, { interval })));
      fc.assert(
        fc.property(fc.array(fc.nat(), { minLength: 6, maxLength: 6 }), (keys) => {
          const shuffled: Model = { ...m, variables: permute(m.variables, keys), links: permute(m.links, keys.slice(1)), relations: m.relations ? permute(m.relations, keys.slice(2)) : undefined };
          intervals.forEach((interval, i) => expect(JSON.stringify(orderingAt(shuffled, { interval }))).toBe(expected[i]));
        }),
        { seed: SEED, numRuns: 10 },
      );
    }
  });
});
