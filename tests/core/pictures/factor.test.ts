import { describe, expect, it } from 'vitest';
import { fromRows } from '../../../src/core/numeric/dense';
import { chiSquareSurvival, factorAnalysis, levelCovariances, oneFactorPrecision, singularValues, symmetricEigen } from '../../../src/core/pictures/index';
import { spawnSync } from 'node:child_process';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';
import { chainModel, SYMPTOMS } from './fixtures';

// statsmodels and scikit-learn are installed for Debian's interpreter only.
const DEBIAN_PYTHON = '/usr/bin/python3';

interface RefFit { loadings: number[][]; uniqueness: number[]; common: number[][]; discrepancy: number; df: number; eigenvalues: number[]; chi2?: number; rmsea?: number | null; pValue?: number | null }

function reference(cases: { cov: number[][]; k: number; n: number }[]): RefFit[] {
  return runDebian<RefFit[]>('tests/reference/pictures_factor.py', { cases });
}

function runDebian<T>(script: string, input: unknown): T {
  const r = spawnSync(DEBIAN_PYTHON, [script], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(`${DEBIAN_PYTHON} ${script} failed (${r.status}): ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}

// An invented covariance with a clear common factor (demo numbers, not data).
const FIVE = [
  [1.0, 0.42, 0.35, 0.3, 0.25],
  [0.42, 1.2, 0.4, 0.33, 0.28],
  [0.35, 0.4, 0.9, 0.31, 0.22],
  [0.3, 0.33, 0.31, 1.1, 0.36],
  [0.25, 0.28, 0.22, 0.36, 0.8],
];

/** ΛΛ′ + Ψ with two factors, scaled by invented standard deviations, plus a small perturbation (not exactly two-factor). */
function twoFactorCov(): number[][] {
  const L = [[0.7, 0.2], [0.65, 0.1], [0.6, 0.3], [0.2, 0.7], [0.15, 0.6], [0.3, 0.55]];
  const sd = [1, 2, 0.5, 1.5, 1.2, 0.8];
  const p = L.length;
  return Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => {
    const r = i === j ? 1 : L[i][0] * L[j][0] + L[i][1] * L[j][1] + 0.02 * Math.sin(i + 2 * j) * Math.sin(j + 2 * i);
    return r * sd[i] * sd[j];
  }));
}

describe('maximum-likelihood factor analysis against statsmodels (Factor, method="ml")', () => {
  it('loadings, uniquenesses, χ², RMSEA and eigenvalues agree to 1e-4', () => {
    // Chain and driver moderate: with correlations near .98 statsmodels's BFGS stops away from a stationary point.
    const lv = levelCovariances(chainModel(0.3, 0.5), { interval: 3, samples: 70, persons: 150, observed: SYMPTOMS });
    if (!lv.ok) throw new Error(lv.reason);
    const cases = [
      { cov: FIVE, k: 1, n: 250 },
      { cov: twoFactorCov(), k: 1, n: 300 },
      { cov: twoFactorCov(), k: 2, n: 300 },
      { cov: lv.cross, k: 1, n: 150 },
      { cov: lv.within, k: 1, n: 150 * 69 },
    ];
    const ref = reference(cases);
    cases.forEach((c, ci) => {
      const fit = factorAnalysis(fromRows(c.cov), c.k, { n: c.n });
      const r = ref[ci];
      expect(fit.heywood, `case ${ci} must be an interior solution`).toEqual([]);
      expect(fit.converged).toBe(true);
      if (c.k === 1) expectClose(fit.loadings, r.loadings, { relTol: 0, absTol: 1e-4 }, `case ${ci} loadings`);
      // Beyond one factor the loadings are defined up to a rotation: compare ΛΛ′ (statsmodels rotates by Bai & Li's IC3).
      const common = fit.loadings.map((a) => fit.loadings.map((b) => a.reduce((s, x, k) => s + x * b[k], 0)));
      expectClose(common, r.common, { relTol: 0, absTol: 1e-4 }, `case ${ci} ΛΛ′`);
      expectClose(fit.uniqueness, r.uniqueness, { relTol: 0, absTol: 1e-4 }, `case ${ci} uniqueness`);
      expect(fit.df).toBe(r.df);
      expectClose(fit.chi2!, r.chi2!, { relTol: 1e-4, absTol: 1e-4 }, `case ${ci} χ²`);
      expectClose(fit.rmsea!, r.rmsea!, { relTol: 0, absTol: 1e-4 }, `case ${ci} RMSEA`);
      expectClose(fit.pValue!, r.pValue!, { relTol: 1e-4, absTol: 1e-6 }, `case ${ci} p`);
      expectClose(fit.eigenvalues, r.eigenvalues, { relTol: 1e-10, absTol: 1e-12 }, `case ${ci} eigenvalues`);
    });
  });

  it('refuses a model without degrees of freedom and a variable without spread, naming it', () => {
    expect(() => factorAnalysis(fromRows([[1, 0.5], [0.5, 1]]), 1)).toThrow(/not identified/);
    expect(() => factorAnalysis(fromRows([[1, 0, 0], [0, 0, 0], [0, 0, 1]]), 1, { names: ['a', 'b', 'c'] })).toThrow(/^b has no spread/);
  });
});

describe('published identities and the linear algebra under them', () => {
  it('one-factor precision by Sherman–Morrison equals the inverse of λλ′ + Θ (van Bork et al. 2021, Multivariate Behavioral Research 56: 175–198)', () => {
    const lambda = [0.8, 0.7, 0.6, 0.5, 0.75];
    const theta = [0.36, 0.51, 0.64, 0.75, 0.44];
    const { precision, partial } = oneFactorPrecision(lambda, theta);
    const ref = runPython<{ precision: number[][] }>('tests/reference/pictures_identities.py', { lambda, theta, chi2: [], symmetric: [], general: [] });
    expectClose(precision, ref.precision, { relTol: 1e-12, absTol: 1e-14 }, 'precision');
    // A one-factor model implies a fully connected network: every partial correlation is non-zero.
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) if (i !== j) expect(Math.abs(partial[i][j])).toBeGreaterThan(0.01);
  });

  it('χ² tail probabilities, symmetric eigenvalues and singular values agree with SciPy and NumPy', () => {
    const chi2: [number, number][] = [[0.5, 1], [3.2, 2], [9.23, 5], [40, 20], [150, 100], [1e-3, 9], [400, 35]];
    const sym = [[[4, 1, 0.5], [1, 3, 0.2], [0.5, 0.2, 1]], [[1, 0.99, 0.98, 0.97], [0.99, 1, 0.99, 0.98], [0.98, 0.99, 1, 0.99], [0.97, 0.98, 0.99, 1]]];
    const gen = [[[0.9, 0.1, 0], [0.3, 0.5, 0.2], [0, 0.4, 0.1]], [[1, 2], [2, 4.000001]]];
    const ref = runPython<{ chi2sf: number[]; eigh: number[][]; svd: number[][] }>('tests/reference/pictures_identities.py', { lambda: [1], theta: [1], chi2, symmetric: sym, general: gen });
    chi2.forEach(([x, df], i) => expectClose(chiSquareSurvival(x, df), ref.chi2sf[i], { relTol: 1e-9, absTol: 1e-15 }, `χ² sf(${x}, ${df})`));
    sym.forEach((m, i) => expectClose(Array.from(symmetricEigen(fromRows(m)).values), ref.eigh[i], { relTol: 1e-12, absTol: 1e-13 }, `eigh ${i}`));
    gen.forEach((m, i) => expectClose(singularValues(fromRows(m)), ref.svd[i], { relTol: 1e-9, absTol: 1e-15 }, `svd ${i}`));
  });
});
