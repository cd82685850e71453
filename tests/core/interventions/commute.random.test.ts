import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { commutation, commutesByCriterion, feedbackSet, loopsThrough } from '../../../src/core/interventions/commute';
import { mech, rolesOf, type AbstractSystem } from './systems';

/** Random mechanisms: inputs, states whose rates read anything, derived variables with acyclic formulas; a random settle/freeze plan. */
const systems = fc
  .record({
    ni: fc.integer({ min: 1, max: 2 }),
    ns: fc.integer({ min: 1, max: 3 }),
    nd: fc.integer({ min: 0, max: 4 }),
    seed: fc.array(fc.boolean(), { minLength: 200, maxLength: 200 }),
  })
  .map(({ ni, ns, nd, seed }) => {
    let k = 0;
    const bit = () => seed[k++ % seed.length];
    const inputs = Array.from({ length: ni }, (_, i) => `u${i}`);
    const stateIds = Array.from({ length: ns }, (_, i) => `x${i}`);
    const derivedIds = Array.from({ length: nd }, (_, i) => `y${i}`);
    const all = [...inputs, ...stateIds, ...derivedIds];
    const states: Record<string, string[]> = {};
    for (const x of stateIds) states[x] = all.filter((v) => v !== x && bit() && bit()).concat(bit() ? [x] : []);
    const derived: Record<string, string[]> = {};
    derivedIds.forEach((y, i) => { derived[y] = [...inputs, ...stateIds, ...derivedIds.slice(0, i)].filter(() => bit()); });
    const settle = stateIds.filter(() => bit());
    const freeze = stateIds.filter((x) => !settle.includes(x) && bit() && bit());
    const sys: AbstractSystem = { inputs, states, derived };
    return { sys, settle, freeze, all };
  });

describe('random systems (fast-check, seeded)', () => {
  it('where the criterion says hold and settle commute, both orders give identical orderings; where it says not, they differ', () => {
    fc.assert(
      fc.property(systems, ({ sys, settle, freeze, all }) => {
        const m = mech(sys);
        const plan = { settle, freeze };
        for (const v of all) {
          const c = commutation({ mechanism: m, plan, hold: { [v]: 1 }, roles: rolesOf(sys, settle, freeze) });
          const crit = commutesByCriterion(m, plan, v);
          if (crit) {
            expect(c.agree, v).toBe(true);
            expect(c.holdThenSettle, v).toEqual(c.settleThenHold);
            expect(c.differences, v).toEqual([]);
          } else {
            expect(c.agree, v).toBe(false);
          }
        }
      }),
      { seed: 20050101, numRuns: 250 },
    );
  });

  it('holding a variable off every settled state\'s feedback loop commutes (Dash 2005, §4, from memory), for well-posed equilibria', () => {
    fc.assert(
      fc.property(systems, ({ sys, settle, freeze, all }) => {
        const m = mech(sys);
        const plan = { settle, freeze };
        const loops = settle.map((x) => new Set(feedbackSet(m, x, settle)));
        for (const v of all) {
          if (settle.includes(v) || loops.some((l) => l.has(v))) continue;
          const c = commutation({ mechanism: m, plan, hold: { [v]: 1 }, roles: rolesOf(sys, settle, freeze) });
          const wellPosed = c.settleThenHold.blocks.every((b) => b.determination === 'well') && c.holdThenSettle.blocks.every((b) => b.determination === 'well');
          if (!wellPosed) continue;
          expect(c.agree, `${v} in ${JSON.stringify(sys)} settle ${settle}`).toBe(true);
        }
      }),
      { seed: 4242, numRuns: 250 },
    );
  });

  it('holding an input, a frozen state or a dynamic state always commutes (common practice: no settling involves them)', () => {
    fc.assert(
      fc.property(systems, ({ sys, settle, freeze }) => {
        const m = mech(sys);
        const given = [...sys.inputs, ...Object.keys(sys.states).filter((x) => !settle.includes(x))];
        for (const v of given) {
          const c = commutation({ mechanism: m, plan: { settle, freeze }, hold: { [v]: 0 }, roles: rolesOf(sys, settle, freeze) });
          expect(c.agree, v).toBe(true);
        }
      }),
      { seed: 7, numRuns: 200 },
    );
  });

  it('the loops through a variable, found from the variable, are the feedback sets that contain it', () => {
    fc.assert(
      fc.property(systems, ({ sys, settle, all }) => {
        const m = mech(sys);
        for (const v of all) expect(loopsThrough(m, v, settle), v).toEqual(settle.filter((s) => s !== v && feedbackSet(m, s, settle).includes(v)).sort());
      }),
      { seed: 99, numRuns: 200 },
    );
  });
});
