import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { perfectAdaptation } from '../../../src/core/interventions/adaptation';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import greenhouseExample from '../../../src/examples/greenhouse.json';
import { runPython } from '../../helpers/python';
import { close } from '../../helpers/tolerance';
import { greenhouseIntegral, warehouseIntegral, warehouseProportional } from './scenarios';

const SCRIPT = fileURLToPath(new URL('./step_response.py', import.meta.url));
type Step = Record<string, { before: number; end: number; maxDeviation: number }>;

function stepResponse(model: Model, input: string, to: number, settle: number, after: number): Step {
  const inputs = Object.fromEntries(model.variables.filter((v) => v.kind === 'input').map((v) => [v.id, v.value ?? 0]));
  const states = Object.fromEntries(model.variables.filter((v) => v.kind === 'state').map((v) => [v.id, [v.initial ?? 0, v.rate!]]));
  const derived = model.variables.filter((v) => v.kind === 'derived').map((v) => [v.id, v.formula!]);
  return runPython<Step>(SCRIPT, { inputs, states, derived, step: { input, to }, settle, after });
}

const pairs = (m: Model) => perfectAdaptation(m).adapted.map((a) => `${a.variable}<-${a.input}`);

describe('perfect adaptation from the two orderings (Blom & Mooij, J. Causal Inference 11, 2023 / arXiv 2101.11885; sufficient condition, its form from memory)', () => {
  it('an integrating heater: air temperature (and what reads it) adapt to the outside temperature, not to the setpoint', () => {
    // Integral feedback: at equilibrium 0 = setpoint − airTemp, so airTemp depends on the setpoint alone
    // (the internal model principle of integral control, common practice).
    expect(pairs(greenhouseIntegral)).toEqual(['airTemp<-outsideTemp', 'comfort<-outsideTemp']);
  });

  it('an integral stock correction: the stock adapts to demand, and orders adapt to the target', () => {
    // Hand-derived: at balance 0 = orders − demand and 0 = target − stock, so the stock depends on the target
    // only and orders on demand only; a target change moves orders for a while.
    expect(pairs(warehouseIntegral)).toEqual(['orders<-target', 'stock<-demand']);
  });

  it('a proportional correction only: the stock does not adapt to demand (common practice: proportional control leaves an offset)', () => {
    // Orders still return to demand at balance (0 = orders − demand), whatever the target.
    expect(pairs(warehouseProportional)).toEqual(['orders<-target']);
  });

  it('the greenhouse example: transpiration and humidity adapt to the climate inputs, since at balance transpiration equals irrigation', () => {
    const r = parseModel(greenhouseExample);
    if (!r.ok) throw new Error('example does not load');
    const adapted = pairs(r.model);
    // Hand-derived: settled soil water balances irrigation − transpiration = 0, so transpiration is fixed by irrigation.
    for (const u of ['outsideTemp', 'setpoint', 'sunlight']) {
      expect(adapted).toContain(`transpiration<-${u}`);
      expect(adapted).toContain(`humidity<-${u}`);
    }
    expect(adapted).not.toContain('airTemp<-outsideTemp');
  });
});

describe('numeric confirmation against SciPy solve_ivp (Radau): a step in the input, the variable returns', () => {
  it('greenhouse: a 5 °C rise outside moves the air temperature for a while, and it returns to the setpoint', () => {
    const r = stepResponse(greenhouseIntegral, 'outsideTemp', 10, 3000, 3000);
    expect(r.airTemp.maxDeviation).toBeGreaterThan(0.5);
    expect(close(r.airTemp.end, r.airTemp.before, { absTol: 1e-4, relTol: 0 })).toBe(true);
    expect(close(r.airTemp.before, 20, { absTol: 1e-6, relTol: 0 })).toBe(true);
    // Not adapted: the heater's level moves for good.
    expect(Math.abs(r.heat.end - r.heat.before)).toBeGreaterThan(1);
  });

  it('warehouse: demand up by 20 per day dents the stock, which comes back; without the integral it stays low', () => {
    const a = stepResponse(warehouseIntegral, 'demand', 120, 2000, 2000);
    expect(a.stock.maxDeviation).toBeGreaterThan(10);
    expect(close(a.stock.end, a.stock.before, { absTol: 1e-4, relTol: 0 })).toBe(true);
    const b = stepResponse(warehouseProportional, 'demand', 120, 2000, 2000);
    expect(Math.abs(b.stock.end - b.stock.before)).toBeGreaterThan(10);
  });

  it('warehouse: a higher target lifts orders for a while, then orders return to demand', () => {
    const r = stepResponse(warehouseIntegral, 'target', 650, 2000, 2000);
    expect(r.orders.maxDeviation).toBeGreaterThan(10);
    expect(close(r.orders.end, r.orders.before, { absTol: 1e-4, relTol: 0 })).toBe(true);
    expect(close(r.stock.end, 650, { absTol: 1e-3, relTol: 0 })).toBe(true);
  });
});
