import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { commutationAt } from '../../../src/core/interventions/index';
import type { Model } from '../../../src/core/model/types';
import { runPython } from '../../helpers/python';
import { close } from '../../helpers/tolerance';
import { greenhouseIntegral } from './scenarios';

const SCRIPT = fileURLToPath(new URL('./held_equilibrium.py', import.meta.url));
type Held = { running: Record<string, number>; moving: Record<string, number>; predicted: Record<string, number> | null };

/** Run the held model in SciPy, and solve the equilibrium model held the way settle-then-hold says. */
function check(model: Model, hold: Record<string, number>, interval: number, T: number): { agree: boolean; drift: boolean; ref: Held } {
  const c = commutationAt(model, { interval, hold });
  const dropped = c.differences.length === 0 ? [] : replacedBySettleThenHold(c);
  const inputs = Object.fromEntries(model.variables.filter((v) => v.kind === 'input').map((v) => [v.id, v.value ?? 0]));
  const states = Object.fromEntries(model.variables.filter((v) => v.kind === 'state').map((v) => [v.id, [v.initial ?? 0, v.rate!]]));
  const derived = model.variables.filter((v) => v.kind === 'derived').map((v) => [v.id, v.formula!]);
  const own = (v: string) => (model.variables.find((x) => x.id === v)!.kind === 'state' ? `rate(${v})` : `formula(${v})`);
  const ref = runPython<Held>(SCRIPT, { inputs, states, derived, hold, dropped: dropped.length ? dropped : Object.keys(hold).map(own), T });
  return { agree: c.agree, drift: c.drift !== null, ref };
}

/** The equations the equilibrium model's hold replaced: the ones in hold-then-settle's structure missing from settle-then-hold's. */
function replacedBySettleThenHold(c: ReturnType<typeof commutationAt>): string[] {
  return c.differences.filter((d) => d.kind === 'equation' && d.only === 'holdThenSettle' && !d.equation!.startsWith('hold(')).map((d) => d.equation!);
}

/** The chain-regulated stock of Dash 2005 (§2, rebuilt from memory) with linear formulas of our own: x′ = u − q, p = 2x, q = k·p. */
const chain: Model = {
  format: 'loopfold-model', version: 1, name: 'Chain-regulated stock', timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input', value: 3 },
    { id: 'k', kind: 'input', value: 0.5 },
    { id: 'x', kind: 'state', timescale: 1, initial: 1, rate: 'u - q' },
    { id: 'p', kind: 'derived', formula: '2 * x' },
    { id: 'q', kind: 'derived', formula: 'k * p' },
  ],
  links: [],
};

/** A self-regulating stock (Dash 2005, §4, from memory), formulas of our own: x′ = u − 0.5x, y = 3x + 1. */
const selfReg: Model = {
  format: 'loopfold-model', version: 1, name: 'Self-regulating stock', timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input', value: 2 },
    { id: 'x', kind: 'state', timescale: 2, initial: 0, rate: 'u - 0.5 * x' },
    { id: 'y', kind: 'derived', formula: '3 * x + 1' },
  ],
  links: [],
};

const tol = { absTol: 1e-6, relTol: 1e-6 };

describe('the commutation verdict against the held system run in SciPy (solve_ivp Radau, optimize.root)', () => {
  it('where the orders agree, the equilibrium model held predicts what the running system held reaches', () => {
    for (const [model, hold] of [[selfReg, { y: 10 }], [selfReg, { x: 1 }], [chain, { u: 5 }], [chain, { k: 2 }]] as const) {
      const r = check(model, hold, 100, 400);
      expect(r.agree, JSON.stringify(hold)).toBe(true);
      expect(r.ref.predicted, JSON.stringify(hold)).not.toBeNull();
      for (const v of Object.keys(r.ref.predicted!)) expect(close(r.ref.running[v], r.ref.predicted![v], tol), `${JSON.stringify(hold)} ${v}`).toBe(true);
    }
  });

  it('holding the chain-regulated stock: the equilibrium model predicts q = u, the running system gives q = 2k·x', () => {
    const r = check(chain, { x: 4 }, 100, 400);
    expect(r.agree).toBe(false);
    // Hand-derived from the formulas: running, q = k·2·4 = 4; predicted by the balance u − q = 0, q = u = 3.
    expect(close(r.ref.running.q, 4, tol)).toBe(true);
    expect(close(r.ref.predicted!.q, 3, tol)).toBe(true);
  });

  it('holding q on the loop: the verdict says drift, and the simulated stock keeps moving', () => {
    const r = check(chain, { q: 1 }, 100, 400);
    expect(r.agree).toBe(false);
    expect(r.drift).toBe(true);
    // x′ = u − q = 2 for ever: over [T, 2T] = 400 h the stock moves by 800 (hand-derived).
    expect(close(r.ref.moving.x, 800, { absTol: 1e-3, relTol: 1e-6 })).toBe(true);
  });

  it('the integrating heater held: the equilibrium model keeps the air at the setpoint, the running system does not', () => {
    const r = check(greenhouseIntegral, { heat: 50 }, 1000, 2000);
    expect(r.agree).toBe(false);
    expect(close(r.ref.predicted!.airTemp, 20, tol)).toBe(true);
    // Running: 0 = (5 − T)/10 + 0.05·50 ⇒ T = 30 (hand-derived from the rate).
    expect(close(r.ref.running.airTemp, 30, tol)).toBe(true);
  });
});
