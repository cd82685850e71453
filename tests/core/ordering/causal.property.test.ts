import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { causalOrder } from '../../../src/core/ordering/causal';
import { equilibrateAll, equilibrate, exogenize, exogenizeAll, hold } from '../../../src/core/ordering/operators';
import { orderStructure } from '../../../src/core/ordering/order';
import { cloneStructure, derivativeOf, type EquationStructure, type EquationSystem } from '../../../src/core/ordering/structure';
import { anySystem, kuhnMatcher, permute, SEED, selfContainedSystem, shuffled, simonOrder } from './generators';

/** Checks causalOrder's edges against the definition computed here from its blocks. */
function expectEdgesByDefinition(system: EquationSystem): ReturnType<typeof causalOrder> {
  const o = causalOrder(system);
  const blockOf = new Map<string, number>();
  o.blocks.forEach((b, i) => b.variables.forEach((v) => blockOf.set(v, i)));
  const expected = new Map<string, { eq: string; sim: boolean }>();
  const eqBlock = new Map<string, number>();
  o.blocks.forEach((b, i) => b.equations.forEach((e) => eqBlock.set(e, i)));
  for (const e of [...system.equations].sort((a, b) => (a.id < b.id ? -1 : 1))) {
    const B = eqBlock.get(e.id)!;
    const vs = [...new Set(e.variables)];
    for (const v of vs) {
      if (blockOf.get(v) !== B) continue;
      for (const u of vs) {
        if (u === v) continue;
        const sim = blockOf.get(u) === B;
        if (sim && !(u < v)) continue;
        const key = `${u}>${v}`;
        if (!expected.has(key)) expected.set(key, { eq: e.id, sim });
      }
    }
  }
  const got = new Map(o.edges.map((x) => [`${x.from}>${x.to}`, { eq: x.equation, sim: x.simultaneous === true }]));
  expect(got).toEqual(expected);
  expect(got.size).toBe(o.edges.length);
  for (const x of o.edges) expect(x.from).not.toBe(x.to);
  for (let i = 1; i < o.edges.length; i++) {
    const a = o.edges[i - 1];
    const b = o.edges[i];
    expect(a.to < b.to || (a.to === b.to && a.from < b.from)).toBe(true);
  }
  return o;
}

const byFirst = <T extends { variables: string[]; equations: string[] }>(a: T, b: T) =>
  (a.variables[0] ?? a.equations[0]).localeCompare(b.variables[0] ?? b.equations[0]);

describe('causal order: properties on random systems (fast-check, seeded)', () => {
  it("blocks and levels equal Simon's minimal complete subsets found by exhaustive search", () => {
    fc.assert(
      fc.property(selfContainedSystem(8), (system) => {
        const ours = causalOrder(system).blocks.map((b) => ({ variables: b.variables, equations: b.equations, level: b.level })).sort(byFirst);
        const simon = simonOrder(system).sort(byFirst);
        expect(ours).toEqual(simon);
        expect(causalOrder(system).blocks.every((b) => b.determination === 'well')).toBe(true);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('the ordering is the same for any maximum matching (augmenting-path matchers in other orders)', () => {
    fc.assert(
      fc.property(anySystem(8), fc.array(fc.nat(), { minLength: 8, maxLength: 8 }), fc.boolean(), (system, keys, rev) => {
        const base = causalOrder(system);
        const other = causalOrder(system, { matcher: kuhnMatcher((n) => permute(Array.from({ length: n }, (_, i) => i), keys), rev) });
        expect(other.matchingSize).toBe(base.matchingSize);
        expect(other.blocks).toEqual(base.blocks);
        expect(other.edges).toEqual(base.edges);
      }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('Dulmage–Mendelsohn parts partition every equation and variable, with the counting each part implies', () => {
    fc.assert(
      fc.property(anySystem(8), (system) => {
        const o = causalOrder(system);
        const exo = new Set(system.exogenous);
        const allVars = new Set([...(system.exogenous ?? []), ...system.equations.flatMap((e) => e.variables), ...(system.variables ?? [])]);
        const seenV = o.blocks.flatMap((b) => b.variables);
        const seenE = o.blocks.flatMap((b) => b.equations);
        expect([...seenV].sort()).toEqual([...allVars].sort());
        expect([...seenE].sort()).toEqual(system.equations.map((e) => e.id).sort());
        const eqVars = new Map(system.equations.map((e) => [e.id, e.variables]));
        const det = new Map<string, string>();
        for (const b of o.blocks) for (const v of b.variables) det.set(v, b.determination);
        for (const b of o.blocks) {
          const unknowns = b.variables.filter((v) => !exo.has(v)).length;
          if (b.determination === 'well') expect(b.equations.length).toBe(exo.has(b.variables[0]) ? 0 : unknowns);
          if (b.determination === 'over') {
            expect(b.equations.length).toBeGreaterThan(unknowns);
            // over-determined equations involve only over-determined unknowns (and exogenous variables)
            for (const e of b.equations) for (const v of eqVars.get(e)!) expect(exo.has(v) || det.get(v) === 'over').toBe(true);
          }
          if (b.determination === 'under') {
            expect(b.equations.length).toBeLessThan(unknowns);
            // an under-determined unknown appears in under-determined equations only
            for (const e of system.equations) if (e.variables.some((v) => b.variables.includes(v))) expect(b.equations).toContain(e.id);
          }
        }
        // levels: 0 without parents, else 1 + the highest parent
        const blockOf = new Map<string, number>();
        o.blocks.forEach((b, i) => b.variables.forEach((v) => blockOf.set(v, i)));
        o.blocks.forEach((b, i) => {
          let lv = 0;
          for (const e of b.equations) for (const v of eqVars.get(e)!) { const p = blockOf.get(v)!; if (p !== i) lv = Math.max(lv, o.blocks[p].level + 1); }
          expect(b.level).toBe(lv);
        });
      }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('shuffling equations, variables and exogenous lists gives byte-identical output', () => {
    fc.assert(
      fc.property(anySystem(8), fc.array(fc.nat(), { minLength: 8, maxLength: 8 }), (system, keys) => {
        expect(JSON.stringify(causalOrder(shuffled(system, keys)))).toBe(JSON.stringify(causalOrder(system)));
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('edges follow the matching-independent definition, with no self-loops, sorted by (to, from)', () => {
    fc.assert(
      fc.property(anySystem(8), (system) => {
        expectEdgesByDefinition(system);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('edges into a hub variable (one unknown in every equation of a large block) follow the same definition', () => {
    const n = 80;
    const equations = [
      ...Array.from({ length: n }, (_, i) => ({ id: `f${String(i).padStart(3, '0')}`, variables: [`x${String(i).padStart(3, '0')}`, `x${String((i + 1) % n).padStart(3, '0')}`, 'z'] })),
      { id: 'fz', variables: ['z', 'x000', 'w1'] },
    ];
    const o = expectEdgesByDefinition({ equations, exogenous: ['w1'] });
    expect(o.edges.filter((e) => e.to === 'z').length).toBe(n + 1); // every x and w1
  });
});

/** A random structure with dynamic states: state xi has rate(xi) over {xi'} ∪ some variables; derived yj have formulas. */
const dynamicStructure = fc
  .record({
    states: fc.integer({ min: 1, max: 4 }),
    derived: fc.integer({ min: 0, max: 3 }),
    picks: fc.array(fc.array(fc.nat({ max: 20 }), { maxLength: 3 }), { minLength: 7, maxLength: 7 }),
  })
  .map(({ states, derived, picks }): EquationStructure => {
    const xs = Array.from({ length: states }, (_, i) => `x${i + 1}`);
    const ys = Array.from({ length: derived }, (_, i) => `y${i + 1}`);
    const pool = [...xs, ...ys, 'u1'];
    const equations = [
      ...xs.map((x, i) => ({ id: `rate(${x})`, variables: [...new Set([derivativeOf(x), ...picks[i].map((k) => pool[k % pool.length])])] })),
      ...ys.map((y, j) => ({ id: `formula(${y})`, variables: [...new Set([y, ...picks[4 + j].map((k) => pool[k % pool.length])])] })),
    ];
    return { equations, exogenous: ['u1', ...xs], variables: [...pool].sort(), derivatives: Object.fromEntries(xs.map((x) => [x, `rate(${x})`])) };
  });

describe('equilibration: properties', () => {
  it('settling several states at once gives the same ordering as one after another, in any order', () => {
    fc.assert(
      fc.property(dynamicStructure, fc.array(fc.nat(), { minLength: 4, maxLength: 4 }), fc.array(fc.boolean(), { minLength: 4, maxLength: 4 }), (s, keys, pick) => {
        const chosen = Object.keys(s.derivatives).filter((_, i) => pick[i]);
        const together = orderStructure(equilibrateAll(s, chosen).structure);
        let seq = s;
        for (const x of permute(chosen, keys)) seq = equilibrate(seq, x).structure;
        const oneByOne = orderStructure(seq);
        expect(JSON.stringify({ ...oneByOne, causal: undefined })).toBe(JSON.stringify({ ...together, causal: undefined }));
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('freezing several states at once gives the same structure as one after another, in any order', () => {
    fc.assert(
      fc.property(dynamicStructure, fc.array(fc.nat(), { minLength: 4, maxLength: 4 }), fc.array(fc.boolean(), { minLength: 4, maxLength: 4 }), (s, keys, pick) => {
        const chosen = Object.keys(s.derivatives).filter((_, i) => pick[i]);
        const before = JSON.stringify(s);
        const together = exogenizeAll(s, chosen).structure;
        expect(JSON.stringify(s)).toBe(before);
        let seq = s;
        for (const x of permute(chosen, keys)) seq = exogenize(seq, x).structure;
        // compared in the normal form the operators produce (ids sorted)
        expect(JSON.stringify(cloneStructure(together))).toBe(JSON.stringify(cloneStructure(seq)));
        expect(JSON.stringify(orderStructure(together).causal.blocks)).toBe(JSON.stringify(orderStructure(seq).causal.blocks));
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('operators are pure: the input structure is left as it was', () => {
    fc.assert(
      fc.property(dynamicStructure, (s) => {
        const before = JSON.stringify(s);
        equilibrateAll(s, Object.keys(s.derivatives));
        expect(JSON.stringify(s)).toBe(before);
      }),
      { seed: SEED, numRuns: 100 },
    );
  });
});

describe('hold: the feasible replacements (fast-check, seeded)', () => {
  it('the replaced equation and its alternatives are exactly the equations whose replacement by x = constant leaves the system self-contained (exhaustive check)', () => {
    fc.assert(
      fc.property(selfContainedSystem(7), fc.nat(), (system, pick) => {
        const exo = system.exogenous ?? [];
        const unknowns = [...new Set(system.equations.flatMap((e) => e.variables))].filter((v) => !exo.includes(v)).sort();
        const x = unknowns[pick % unknowns.length];
        const s: EquationStructure = { equations: system.equations, exogenous: exo, variables: [...new Set([...unknowns, ...exo])].sort(), derivatives: {} };
        const { change } = hold(s, x, 0);
        const feasible = system.equations
          .map((e) => e.id)
          .filter((id) =>
            causalOrder({ equations: system.equations.map((e) => (e.id === id ? { id, variables: [x] } : e)), exogenous: exo }).blocks.every((b) => b.determination === 'well'),
          )
          .sort();
        expect(feasible).toContain(change.removed[0]);
        expect([...change.removed, ...(change.alternatives ?? [])].sort()).toEqual(feasible);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });
});
