import { describe, expect, it } from 'vitest';
import { commutationAt, InterventionError } from '../../../src/core/interventions/index';
import { bands, orderingAt } from '../../../src/core/ordering/index';
import { parseModel } from '../../../src/core/model/schema';
import { EXAMPLES } from '../../../src/examples/index';
import { bandInterval } from '../../../src/report/html';
import { greenhouseIntegral } from './scenarios';

const load = (raw: unknown) => {
  const r = parseModel(raw);
  if (!r.ok) throw new Error('example does not load');
  return r.model;
};

describe('the do-operator at a sampling interval', () => {
  it('hold then settle is what `order --hold` shows, for every variable of every example in every band', () => {
    // Pearl, Causality (2000), §3.2.1: the intervention replaces the variable's own mechanism; the ordering core's
    // orderingAt(model, { hold }) must give the same blocks and links as the running system held, then settled.
    let checked = 0;
    for (const ex of EXAMPLES) {
      const model = load(ex.model);
      for (const b of bands(model, { samples: model.settings?.samples })) {
        const interval = bandInterval(b);
        // Every variable, including one fixed only by a relation (warehouse deliveries).
        for (const v of model.variables) {
          const design = { interval, samples: model.settings?.samples, hold: { [v.id]: 1 } };
          const c = commutationAt(model, design);
          const o = orderingAt(model, design);
          expect(c.holdThenSettle.blocks, `${ex.id} ${v.id} at ${interval}`).toEqual(o.blocks);
          expect(c.holdThenSettle.edges, `${ex.id} ${v.id} at ${interval}`).toEqual(o.edges);
          expect(c.holdThenSettle.roles).toEqual(o.roles);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(100);
  });

  it('an integrating heater held at an interval where both states settle: the equilibrium model still says the air reaches the setpoint', () => {
    // Integral control (common practice): with the heat held, its balance 0 = setpoint − airTemp is gone from the
    // running system, so the air settles where the outside temperature and the fixed heat put it.
    const c = commutationAt(greenhouseIntegral, { interval: 600, hold: { heat: 0 } });
    expect(c.holdThenSettle.roles.heat).toBe('held');
    expect(c.holdThenSettle.roles.airTemp).toBe('settled');
    expect(c.agree).toBe(false);
    expect(c.drift).toBeNull();
    const by = (o: typeof c.holdThenSettle) => o.blocks.find((b) => b.variables.includes('airTemp'))!.equations;
    expect(by(c.holdThenSettle)).toEqual(['rate(airTemp)']);
    expect(by(c.settleThenHold)).toEqual(['rate(heat)']);
  });

  it('holding the air temperature away from the setpoint: the integrating heater has no equilibrium (common practice: integral wind-up)', () => {
    const c = commutationAt(greenhouseIntegral, { interval: 600, hold: { airTemp: 18 } });
    expect(c.agree).toBe(false);
    expect(c.drift).not.toBeNull();
    expect(c.drift!.states).toEqual(['heat']);
    expect(c.drift!.equations).toContain('rate(heat)');
    expect(c.explanation.join(' ')).toMatch(/heat keeps moving \(drifts\)/);
  });

  it('refuses holds the model cannot take, naming the variable', () => {
    expect(() => commutationAt(greenhouseIntegral, { interval: 60, hold: { nowhere: 1 } })).toThrow(InterventionError);
    expect(() => commutationAt(greenhouseIntegral, { interval: 60, hold: { nowhere: 1 } })).toThrow(/"nowhere"/);
    expect(() => commutationAt(greenhouseIntegral, { interval: 60, hold: { heat: NaN } })).toThrow(/heat/);
    expect(() => commutationAt(greenhouseIntegral, { interval: 60 })).toThrow(/name at least one variable/);
  });
});
