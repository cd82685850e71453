import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModelText } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { rehearsalOf, simulateStudy } from '../../../src/core/rehearse/setup';
import { STEPS_PER_TIMESCALE, simulatorText } from '../../../src/core/rehearse/nonlinear';
import { eigenvalues } from '../../../src/core/numeric/dense';

function load(path: string): Model {
  const r = parseModelText(readFileSync(path, 'utf8'));
  if (!r.ok) throw new Error(`${path} does not load`);
  return r.model;
}

describe('synthetic studies of a nonlinear mechanism', () => {
  // The warehouse example: shipments fall off as demand·(1 − e^(−inventory/50)), a nonlinear rate.
  const warehouse = load('src/examples/warehouse.json');

  it('a nonlinear model is integrated by Euler–Maruyama on a step of 1/20 of its fastest timescale; a sketch keeps the exact discrete model', () => {
    const r = rehearsalOf(warehouse, { persons: 4 });
    expect(r.integrator).not.toBeNull();
    const ev = eigenvalues(r.process.base.drift);
    const fastest = 1 / Math.max(...Array.from(ev.re, (x, i) => Math.hypot(x, ev.im[i])));
    expect(Math.abs(r.integrator!.step - fastest / STEPS_PER_TIMESCALE)).toBeLessThan(1e-12 * fastest);
    expect(simulatorText(r.integrator, (x) => `${x} d`)).toMatch(/Euler–Maruyama/);
    // An invented two-state greenhouse sketch: linear, so the exact discrete model of each gap.
    const sketch = rehearsalOf(load('tests/fixtures/rehearse/greenhouse-air.json'));
    expect(sketch.integrator).toBeNull();
    expect(simulatorText(sketch.integrator, String)).toMatch(/exact discrete model/);
  });

  it('simulates the warehouse study: finite, reproducible for a seed, near the equilibrium with about the linearized spread', () => {
    const r = rehearsalOf(warehouse, { persons: 12, seed: 4 });
    const panel = simulateStudy(r);
    expect(panel.persons).toHaveLength(12);
    const again = simulateStudy(r);
    expect(Array.from(again.persons[5].values)).toEqual(Array.from(panel.persons[5].values));
    expect(Array.from(simulateStudy(rehearsalOf(warehouse, { persons: 12, seed: 5 })).persons[5].values)).not.toEqual(Array.from(panel.persons[5].values));
    const n = r.process.states.length;
    for (let i = 0; i < n; i++) {
      let s = 0, s2 = 0, m = 0;
      for (const p of panel.persons)
        for (let k = 0; k < p.time.length; k++) {
          const x = p.values[k * n + i];
          expect(Number.isFinite(x)).toBe(true);
          s += x; s2 += x * x; m++;
        }
      const mean = s / m, variance = s2 / m - mean * mean;
      const sd = Math.sqrt(r.stationary.data[i * n + i] + r.errorVariance[i]);
      // With process noise of 1 per day against stocks of hundreds the mechanism is nearly linear here:
      // the spread matches the linearized stationary one within the error of 12 persons × 26 weeks
      // of a process with timescales of days (a check of consistency, not an outside reference).
      expect(Math.abs(mean - r.process.base.mean[i])).toBeLessThan(1.5 * sd);
      expect(Math.sqrt(variance) / sd).toBeGreaterThan(0.6);
      expect(Math.sqrt(variance) / sd).toBeLessThan(1.5);
    }
  });
});
