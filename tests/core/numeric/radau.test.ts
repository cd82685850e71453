import { describe, expect, it } from 'vitest';
import type { Mat } from '../../../src/core/numeric/dense';
import { integrateRadau, type OdeProblem } from '../../../src/core/numeric/radau';
import { runPython } from '../../helpers/python';
import { close } from '../../helpers/tolerance';

interface OdeRef { values: number[][]; nfev: number; success: boolean }
const REF = 'tests/reference/numeric_ode.py';

// Robertson (1966) chemical kinetics, from the stiff test set of Hairer & Wanner, Solving ODEs II, Sec. IV.1 (1.4).
const robertson: OdeProblem = {
  n: 3,
  rhs(_t, y, d) {
    d[0] = -0.04 * y[0] + 1e4 * y[1] * y[2];
    d[1] = 0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] * y[1];
    d[2] = 3e7 * y[1] * y[1];
  },
  jacobian(_t, y, J: Mat) {
    J.data.set([-0.04, 1e4 * y[2], 1e4 * y[1], 0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1], 0, 6e7 * y[1], 0]);
  },
};

const vanDerPol = (mu: number): OdeProblem => ({
  n: 2,
  rhs(_t, y, d) {
    d[0] = y[1];
    d[1] = mu * (1 - y[0] * y[0]) * y[1] - y[0];
  },
  jacobian(_t, y, J: Mat) {
    J.data.set([0, 1, -2 * mu * y[0] * y[1] - 1, mu * (1 - y[0] * y[0])]);
  },
});

describe('Radau IIA integrator on stiff test problems', () => {
  it('Robertson at t = 40 matches the published values and SciPy Radau at rtol 1e-10', () => {
    const times = [0.4, 4, 40];
    const ref = runPython<OdeRef>(REF, { problem: 'robertson', times, rtol: 1e-10, atol: 1e-14 });
    expect(ref.success).toBe(true);
    // Hairer & Wanner II, Sec. IV.10 (from memory): y(40) ≈ (0.7158, 9.185e-6, 0.2842). The SciPy reference must agree with them.
    const published = [0.7158, 9.185e-6, 0.2842];
    for (let i = 0; i < 3; i++) expect(close(ref.values[2][i], published[i], { relTol: 2e-4 }), `SciPy vs published y${i + 1}(40)`).toBe(true);
    const r = integrateRadau(robertson, 0, Float64Array.of(1, 0, 0), times, { rtol: 1e-10, atol: 1e-14 });
    expect(r.status).toBe('done');
    for (let k = 0; k < times.length; k++)
      for (let i = 0; i < 3; i++)
        expect(close(r.values[k][i], ref.values[k][i], { relTol: 1e-7, absTol: 1e-16 }), `y${i + 1}(${times[k]}): ${r.values[k][i]} vs SciPy ${ref.values[k][i]}`).toBe(true);
    // Mass balance y1 + y2 + y3 = 1 is conserved by the equations (common practice).
    expect(Math.abs(r.values[2][0] + r.values[2][1] + r.values[2][2] - 1)).toBeLessThan(1e-10);
  });

  it('Robertson to t = 1e5 at rtol 1e-6 stays within tolerance of a tight SciPy solution', () => {
    const times = [1, 100, 1e4, 1e5];
    const ref = runPython<OdeRef>(REF, { problem: 'robertson', times, rtol: 1e-11, atol: 1e-16 });
    const r = integrateRadau(robertson, 0, Float64Array.of(1, 0, 0), times, { rtol: 1e-6, atol: 1e-10 });
    expect(r.status).toBe('done');
    for (let k = 0; k < times.length; k++)
      for (let i = 0; i < 3; i++)
        expect(close(r.values[k][i], ref.values[k][i], { relTol: 1e-4, absTol: 1e-9 }), `y${i + 1}(${times[k]})`).toBe(true);
  });

  it('Van der Pol with μ = 1000 matches SciPy Radau at tight tolerance', () => {
    // Van der Pol's equation y'' − μ(1 − y²) y' + y = 0 as a first-order system, y(0) = (2, 0), μ = 1000: a
    // standard stiff test (Hairer & Wanner II, Sec. IV.1, in unscaled time; relaxation period ≈ (3 − 2 ln 2) μ).
    const times = [1, 10, 100, 500, 800, 1500, 2000, 2500, 3000];
    const ref = runPython<OdeRef>(REF, { problem: 'vanderpol', mu: 1000, times, rtol: 1e-10, atol: 1e-10 });
    expect(ref.success).toBe(true);
    const r = integrateRadau(vanDerPol(1000), 0, Float64Array.of(2, 0), times, { rtol: 1e-10, atol: 1e-10 });
    expect(r.status).toBe('done');
    for (let k = 0; k < times.length; k++)
      expect(close(r.values[k][0], ref.values[k][0], { relTol: 1e-5, absTol: 1e-6 }), `y1(${times[k]}): ${r.values[k][0]} vs SciPy ${ref.values[k][0]}`).toBe(true);
  });

  it('without a Jacobian (finite differences) it still solves a linear stiff system exactly enough (closed form e^{-t}, e^{-1000t})', () => {
    const p: OdeProblem = { n: 2, rhs(_t, y, d) { d[0] = -y[0]; d[1] = -1000 * (y[1] - Math.cos(0)) ; } };
    const r = integrateRadau(p, 0, Float64Array.of(1, 0), [1, 2], { rtol: 1e-9, atol: 1e-12 });
    expect(close(r.values[1][0], Math.exp(-2), { relTol: 1e-7 })).toBe(true);
    expect(close(r.values[1][1], 1 - Math.exp(-2000), { relTol: 1e-7 })).toBe(true);
  });

  it('stops between steps when asked and reports progress', () => {
    let calls = 0;
    const seen: number[] = [];
    const r = integrateRadau(vanDerPol(1000), 0, Float64Array.of(2, 0), [3000], {
      onProgress: (t) => seen.push(t),
      shouldStop: () => ++calls > 5,
    });
    expect(r.status).toBe('cancelled');
    expect(seen.length).toBe(5);
    expect(seen.every((t, i) => i === 0 || t > seen[i - 1])).toBe(true);
  });
});
