import { describe, expect, it } from 'vitest';
import { eulerMaruyama, type SdeSystem } from '../../../src/core/numeric/stochastic';
import { seededRandom } from '../../../src/core/stats/random';
import { runPython } from '../../helpers/python';

// A linear case, dX = A X dt + G dW, whose exact moments at t are known: mean e^{At}x0 and
// covariance Q(t) from Van Loan's block exponential (SciPy, tests/reference/sde_moments.py).
const A = [[-1, 0.5], [0.2, -0.6]], g = [1, 0.7], x0 = [3, -2], t = 2;
const exact = runPython<{ mean: number[]; cov: number[][] }>('tests/reference/sde_moments.py', { drift: A, diffusion: g, x0, t });
const linear: SdeSystem = {
  n: 2,
  diffusion: g,
  drift(y, d) {
    d[0] = A[0][0] * y[0] + A[0][1] * y[1];
    d[1] = A[1][0] * y[0] + A[1][1] * y[1];
    return true;
  },
};

/** Mean and covariance at t over `paths` paths of step h (seeded). */
function moments(h: number, paths: number, seed: number) {
  const rng = seededRandom(seed);
  const normal = () => rng.normal();
  let m0 = 0, m1 = 0, s00 = 0, s01 = 0, s11 = 0;
  for (let p = 0; p < paths; p++) {
    const y = eulerMaruyama(linear, x0, [0, t], { step: h, normal });
    const a = y[2], b = y[3];
    m0 += a; m1 += b; s00 += a * a; s01 += a * b; s11 += b * b;
  }
  m0 /= paths; m1 /= paths;
  const k = paths - 1;
  return { mean: [m0, m1], cov: [[(s00 - paths * m0 * m0) / k, (s01 - paths * m0 * m1) / k], [(s01 - paths * m0 * m1) / k, (s11 - paths * m1 * m1) / k]] };
}

/** The largest error in the mean or covariance against the exact moments. */
function weakError(h: number, paths: number, seed: number): number {
  const m = moments(h, paths, seed);
  return Math.max(...m.mean.map((x, i) => Math.abs(x - exact.mean[i])), ...m.cov.flatMap((r, i) => r.map((x, j) => Math.abs(x - exact.cov[i][j]))));
}

describe('Euler–Maruyama', () => {
  it('has weak order one on a linear case: the error in mean and covariance against the exact moments (SciPy) shrinks in proportion to the step', () => {
    const paths = 40_000;
    const steps = [0.4, 0.2, 0.1, 0.05];
    const errors = steps.map((h, k) => weakError(h, paths, 100 + k));
    // Monte Carlo error of these moments is about √(Q/paths) ≈ 0.004; the smallest step's error stays above it.
    // Slope of log error against log step by least squares: 1 for weak order one (common result).
    const lx = steps.map(Math.log), ly = errors.map(Math.log);
    const mx = lx.reduce((a, b) => a + b) / lx.length, my = ly.reduce((a, b) => a + b) / ly.length;
    const slope = lx.reduce((a, x, i) => a + (x - mx) * (ly[i] - my), 0) / lx.reduce((a, x) => a + (x - mx) ** 2, 0);
    expect(slope, `errors ${errors.map((e) => e.toFixed(4)).join(', ')}`).toBeGreaterThan(0.8);
    expect(slope).toBeLessThan(1.25);
    expect(errors[3]).toBeLessThan(0.05);
  });

  it('is reproducible for a seed, and hits every output time exactly', () => {
    const run = (seed: number) => {
      const rng = seededRandom(seed);
      return eulerMaruyama(linear, x0, [0, 0.3, 1, 1.05], { step: 0.1, normal: () => rng.normal() });
    };
    expect(Array.from(run(7))).toEqual(Array.from(run(7)));
    expect(Array.from(run(7))).not.toEqual(Array.from(run(8)));
    // Without noise the path is the deterministic Euler recursion (1 + a h)^k on a scalar decay: 0.3 = 3 steps of 0.1.
    const decay: SdeSystem = { n: 1, diffusion: [0], drift: (y, d) => ((d[0] = -2 * y[0]), true) };
    const y = eulerMaruyama(decay, [1], [0, 0.3], { step: 0.1, normal: () => 0 });
    expect(Math.abs(y[1] - 0.8 ** 3)).toBeLessThan(1e-14);
  });

  it('says when a state blows up or the drift cannot be evaluated', () => {
    const grow: SdeSystem = { n: 1, diffusion: [0], drift: (y, d) => ((d[0] = y[0] * y[0]), true) };
    expect(() => eulerMaruyama(grow, [1], [0, 10], { step: 0.1, normal: () => 0 })).toThrow(/left the finite numbers/);
    const bad: SdeSystem = { n: 1, diffusion: [1], drift: () => false };
    expect(() => eulerMaruyama(bad, [1], [0, 1], { step: 0.1, normal: () => 0 })).toThrow(/cannot be evaluated/);
  });
});
