import { describe, expect, it } from 'vitest';
import { confirmAdaptation, interventionEffect } from '../../../src/core/interventions/effects';
import { perfectAdaptation } from '../../../src/core/interventions/adaptation';
import { close } from '../../helpers/tolerance';
import { greenhouseIntegral, warehouseIntegral, warehouseProportional } from './scenarios';

describe('the numeric effect of a hold (the numerics core: equilibrium and Radau IIA simulation)', () => {
  it('heat held at 50: the air settles at 30 °C instead of the setpoint 20 °C, along 30 − 10·e^(−t/10)', () => {
    const e = interventionEffect(greenhouseIntegral, { heat: 50 }, { until: 100, every: 1 });
    expect(e.ok).toBe(true);
    const air = e.equilibrium!.find((r) => r.variable === 'airTemp')!;
    // Hand-derived from the rates: unheld 0 = 20 − airTemp (integral balance); held 0 = (5 − T)/10 + 0.05·50 ⇒ T = 30.
    expect(close(air.before, 20, { absTol: 1e-8 })).toBe(true);
    expect(close(air.after, 30, { absTol: 1e-8 })).toBe(true);
    const t = e.trajectories!;
    for (const k of [5, 10, 40]) {
      // Closed form of T′ = (5 − T)/10 + 2.5 from T(0) = 20 (hand-derived).
      expect(close(t.with.airTemp[k], 30 - 10 * Math.exp(-t.times[k] / 10), { absTol: 1e-5, relTol: 1e-6 }), `t=${t.times[k]}`).toBe(true);
      expect(close(t.without.airTemp[k], 20, { absTol: 1e-6 })).toBe(true);
    }
    expect(e.drifting).toEqual([]);
  });

  it('air held at 18 °C: the integrating heater winds up for ever at 0.02·(20 − 18) = 0.04 per minute', () => {
    const e = interventionEffect(greenhouseIntegral, { airTemp: 18 }, { until: 500, every: 5 });
    expect(e.drifting.map((d) => d.variable)).toEqual(['heat']);
    expect(close(e.drifting[0].slope, 0.04, { relTol: 1e-6, absTol: 0 })).toBe(true);
    expect(e.equilibrium).toBeNull();
    expect(e.messages.join(' ')).toMatch(/with the hold could not be computed/);
  });
});

describe('perfect adaptation confirmed by simulation: a step in the input, from rest', () => {
  it('confirms every pair the orderings find in the integral-control scenarios, and refuses pairs that do not adapt', () => {
    for (const m of [greenhouseIntegral, warehouseIntegral]) {
      for (const pair of perfectAdaptation(m).adapted) expect(confirmAdaptation(m, pair).confirmed, `${m.name}: ${pair.variable} ← ${pair.input}`).toBe(true);
    }
    // Not adapted: the heat level moves for good after the outside temperature changes; proportional control leaves an offset.
    expect(confirmAdaptation(greenhouseIntegral, { variable: 'heat', input: 'outsideTemp' }).confirmed).toBe(false);
    expect(confirmAdaptation(warehouseProportional, { variable: 'stock', input: 'demand' }).confirmed).toBe(false);
  });
});
