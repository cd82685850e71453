import { describe, expect, it } from 'vitest';
import { ctMinus2LL, ctSpec, ctStart, ctStartFrom, fitCt, type CtFit } from '../../../src/core/fit/ct';
import { simulateCt, type CtTruth } from '../../../src/core/fit/simulate';
import { seededRandom } from '../../../src/core/stats/random';
import type { Panel } from '../../../src/core/data/panel';
import { runPython } from '../../helpers/python';

function irregularTimes(persons: number, occasions: number, seed: number): number[][] {
  const g = seededRandom(seed);
  const r = (): number => g.uniform();
  return Array.from({ length: persons }, () => { let t = 0; return Array.from({ length: occasions }, () => (t += 0.3 + r() * 1.7)); });
}

function scipyInput(panel: Panel, fit: CtFit, start: number[], optimize: boolean) {
  const s = fit.spec;
  return {
    persons: panel.persons.map((p) => ({
      time: Array.from(p.time),
      values: Array.from(p.time, (_, k) => s.reads.map((st) => { const v = p.values[k * panel.variables.length + s.column[st]]; return Number.isFinite(v) ? v : null; })),
    })),
    n: s.states.length, reads: s.reads, free: s.free, initial: s.initial, intercepts: s.intercepts, error: s.measurementError, diffusion: s.diffusion, start, optimize,
  };
}

describe('fitCt', () => {
  it('−2LL agrees with an independent SciPy implementation at the start and at the optimum, where the BFGS of SciPy finds nothing lower (2 measured states + 1 latent, missing cells, random intercepts)', () => {
    // Reference: tests/reference/fit_ct.py (scipy.linalg.expm, Van Loan's block exponential, scipy.optimize BFGS).
    const truth: CtTruth = { states: ['mood', 'stress', 'load'], measured: ['mood', 'stress'], drift: [[-0.9, -0.4, 0], [0, -0.6, 0.5], [0, 0, -0.3]], diffusion: [[1, 0, 0], [0, 0.7, 0], [0, 0, 1]], levels: [3, 2], between: [[0.4, 0.1], [0.1, 0.3]] };
    const panel = simulateCt(truth, irregularTimes(6, 15, 11), { seed: 12, missing: 0.15 });
    const free = [[true, true, false], [false, true, true], [false, false, true]];
    const opts = { states: truth.states, free, initial: 'stationary' as const, intercepts: 'random' as const, diffusion: 'diagonal' as const };
    const fit = fitCt(panel, { ...opts, noStandardErrors: true });
    const start = ctStart(panel, fit.spec);
    // The independent likelihood at the start, and SciPy's BFGS run from our optimum finds nothing lower (to 1e-6 relative).
    const atStart = runPython<{ start: number }>('tests/reference/fit_ct.py', scipyInput(panel, fit, start, false));
    expect(Math.abs(ctMinus2LL(panel, fit.spec, start) - atStart.start) / Math.abs(atStart.start)).toBeLessThan(1e-9);
    const ref = runPython<{ start: number; min: number }>('tests/reference/fit_ct.py', scipyInput(panel, fit, fit.theta, true));
    expect(Math.abs(fit.minus2LL - ref.start) / Math.abs(ref.start)).toBeLessThan(1e-9);
    expect(Math.abs(fit.minus2LL - ref.min) / Math.abs(ref.min)).toBeLessThan(1e-6);
    expect(fit.latent).toEqual(['load']);
  }, 600_000);

  it('−2LL agrees with SciPy with a free initial state, measurement error and a common level', () => {
    const truth: CtTruth = { states: ['a', 'b'], drift: [[-0.7, 0.3], [-0.2, -0.5]], diffusion: [[0.8, 0.2], [0.2, 0.6]], levels: [1, -1], error: [0.2, 0.1] };
    const panel = simulateCt(truth, irregularTimes(5, 16, 21), { seed: 22, missing: 0.1 });
    const opts = { initial: 'free' as const, intercepts: 'common' as const, measurementError: true };
    const fit = fitCt(panel, { ...opts, noStandardErrors: true });
    const start = ctStart(panel, fit.spec);
    // The independent likelihood at the start, and SciPy's BFGS run from our optimum finds nothing lower (to 1e-6 relative).
    const atStart = runPython<{ start: number }>('tests/reference/fit_ct.py', scipyInput(panel, fit, start, false));
    expect(Math.abs(ctMinus2LL(panel, fit.spec, start) - atStart.start) / Math.abs(atStart.start)).toBeLessThan(1e-9);
    const ref = runPython<{ start: number; min: number }>('tests/reference/fit_ct.py', scipyInput(panel, fit, fit.theta, true));
    expect(Math.abs(fit.minus2LL - ref.start) / Math.abs(ref.start)).toBeLessThan(1e-9);
    expect(Math.abs(fit.minus2LL - ref.min) / Math.abs(ref.min)).toBeLessThan(1e-6);
  }, 600_000);

  it('a restricted fit started from the estimates of the open fit (ctStartFrom) reaches the minimum that the BFGS of SciPy confirms', () => {
    // Reference: tests/reference/fit_ct.py as above.
    const truth: CtTruth = { states: ['a', 'b'], drift: [[-0.7, 0.3], [0, -0.5]], diffusion: [[0.8, 0], [0, 0.6]], levels: [1, -1], between: [[0.3, 0], [0, 0.2]] };
    const panel = simulateCt(truth, irregularTimes(8, 20, 31), { seed: 32, missing: 0.05 });
    const base = { initial: 'stationary' as const, intercepts: 'random' as const, noStandardErrors: true };
    const open = fitCt(panel, base);
    const free = [[true, true], [false, true]];
    const spec = ctSpec(panel, { ...base, free });
    const start = ctStartFrom(panel, spec, open);
    // The shared parameters carry over by name: the drift entries kept free, the levels.
    expect(start[0]).toBe(open.theta[0]);
    expect(start[3]).toBe(open.theta[4]);
    const fit = fitCt(panel, { ...base, free, start });
    const ref = runPython<{ start: number; min: number }>('tests/reference/fit_ct.py', scipyInput(panel, fit, fit.theta, true));
    expect(Math.abs(fit.minus2LL - ref.start) / Math.abs(ref.start)).toBeLessThan(1e-9);
    expect(Math.abs(fit.minus2LL - ref.min) / Math.abs(ref.min)).toBeLessThan(1e-6);
    expect(fit.minus2LL).toBeGreaterThanOrEqual(open.minus2LL - 1e-6);
  }, 600_000);

  it('stays finite across very long gaps (‖A‖Δ ≈ 400): Q from Σ − ΦΣΦ′ is positive semidefinite', () => {
    const truth: CtTruth = { states: ['a', 'b'], drift: [[-2, 0.5], [0.3, -1]], diffusion: [[1, 0], [0, 1]] };
    const times = [[0, 0.5, 1, 200, 200.5, 201], [0, 0.7, 150, 150.2, 400, 400.3]];
    const panel = simulateCt(truth, times, { seed: 3 });
    const fit = fitCt(panel, { initial: 'stationary', intercepts: 'common', noStandardErrors: true });
    expect(Number.isFinite(fit.minus2LL)).toBe(true);
  }, 600_000);

  it('recovers a known 5-state drift (4 measured, 1 latent; irregular intervals, missing cells, random intercepts): every free entry within 3 SE of the truth', () => {
    // A chain with a latent middle: a → (latent) h → b, b ⇄ c, c → d; each state self-regulates.
    const truth: CtTruth = {
      states: ['a', 'h', 'b', 'c', 'd'], measured: ['a', 'b', 'c', 'd'],
      drift: [[-0.7, 0, 0, 0, 0], [0.5, -1.0, 0, 0, 0], [0, 0.6, -0.8, 0.3, 0], [0, 0, -0.4, -0.6, 0], [0, 0, 0, 0.35, -0.5]],
      diffusion: [[1, 0, 0, 0, 0], [0, 1, 0, 0, 0], [0, 0, 0.8, 0, 0], [0, 0, 0, 0.7, 0], [0, 0, 0, 0, 0.6]],
      levels: [1, 2, 3, 4], between: [[0.3, 0, 0, 0], [0, 0.3, 0, 0], [0, 0, 0.3, 0], [0, 0, 0, 0.3]],
    };
    const panel = simulateCt(truth, irregularTimes(80, 50, 77), { seed: 78, missing: 0.1 });
    const free = truth.drift.map((row) => row.map((x) => x !== 0));
    const fit = fitCt(panel, { states: truth.states, free, initial: 'stationary', intercepts: 'random', diffusion: 'diagonal' });
    expect(fit.latent).toEqual(['h']);
    // A latent state's sign is not identified (h and −h fit equally: the entries of its row and column flip,
    // the likelihood does not move); align it by a → h with the truth's before comparing (D A D, D = diag(±1)):
    // h → b must then come out positive as in the truth.
    const d = truth.states.map((_, k) => (k === 1 && fit.drift[1][0] < 0 ? -1 : 1));
    const est = fit.drift.map((row, i) => row.map((x, j) => d[i] * d[j] * x));
    for (let i = 0; i < 5; i++)
      for (let j = 0; j < 5; j++) {
        if (!free[i][j]) { expect(fit.drift[i][j]).toBe(0); continue; }
        const se = fit.se.drift[i][j];
        expect(Number.isFinite(se) && se > 0, `SE of ${truth.states[j]} → ${truth.states[i]}`).toBe(true);
        // 3 SE: a two-sided 99.7 % band (normal quantile, common practice), one seed, 10 entries.
        expect(Math.abs(est[i][j] - truth.drift[i][j]), `${truth.states[j]} → ${truth.states[i]}: ${est[i][j]} ± ${se}, truth ${truth.drift[i][j]}`).toBeLessThanOrEqual(3 * se);
      }
  }, 1_200_000);

  it('recovers known drifts with 95 % intervals covering the truth in 93–97 % of 200 replications (pooled over the drift entries)', () => {
    // Coverage of Wald intervals from the observed information: common practice; asymptotic target 95 %.
    const truth: CtTruth = { states: ['x', 'y'], drift: [[-0.8, 0.3], [0, -0.5]], diffusion: [[1, 0], [0, 1]], levels: [0, 0] };
    let covered = 0, total = 0;
    const bias = [[0, 0], [0, 0]];
    for (let rep = 0; rep < 200; rep++) {
      const panel = simulateCt(truth, irregularTimes(10, 40, 1000 + rep), { seed: 5000 + rep, missing: 0.1 });
      const fit = fitCt(panel, { initial: 'stationary', intercepts: 'common', diffusion: 'diagonal' });
      for (let i = 0; i < 2; i++)
        for (let j = 0; j < 2; j++) {
          const e = fit.drift[i][j], se = fit.se.drift[i][j];
          total++;
          if (Math.abs(e - truth.drift[i][j]) <= 1.959964 * se) covered++;
          bias[i][j] += (e - truth.drift[i][j]) / 200;
        }
    }
    const rate = covered / total;
    expect(rate).toBeGreaterThanOrEqual(0.93);
    expect(rate).toBeLessThanOrEqual(0.97);
    for (const row of bias) for (const b of row) expect(Math.abs(b)).toBeLessThan(0.05);
  }, 1_800_000);
});
