/**
 * Maximum-likelihood factor analysis of a covariance matrix, hand-written.
 *
 * The fit works on the correlation matrix R (ML factor analysis is scale
 * invariant, so loadings come out standardised). For uniquenesses Ψ the best
 * loadings are Λ = Ψ^½ Ω (Θ − I)^½ from the k largest eigenvalues Θ and
 * vectors Ω of Ψ^−½ R Ψ^−½, which leaves a function of Ψ alone,
 *   F(Ψ) = Σ_{j>k} (θ_j − log θ_j − 1),
 * equal to the ML discrepancy log|Σ̂| − log|R| + tr(R Σ̂⁻¹) − p at that Λ
 * (Jöreskog 1967, Psychometrika 32: 443–482; Lawley & Maxwell, "Factor
 * Analysis as a Statistical Method", 2nd ed. 1971, ch. 4). F is minimised over
 * log(ψ − ψ_min) by BFGS with the gradient ∂F/∂ψ_i = (ΛΛ′ + Ψ − R)_ii / ψ_i²
 * (the same concentrated criterion and gradient as Jöreskog's), ψ_min = 0.005
 * (a customary lower bound; a uniqueness at the bound is a Heywood case).
 *
 * Fit statistics at N observations: χ² = (N − 1)·F_ML (Jöreskog 1969,
 * Psychometrika 34: 183–202), df = ((p − k)² − (p + k))/2, RMSEA =
 * √(max(χ² − df, 0) / (df·(N − 1))) (Steiger 1990, Multivariate Behavioral
 * Research 25: 173–180; Browne & Cudeck 1993, "Alternative ways of assessing
 * model fit"), the χ² p-value from the regularised upper incomplete gamma.
 */
import { luFactor, luSolve, zeros, type Mat } from '../numeric/dense';
import { symmetricEigen } from './symmetric';

export const UNIQUENESS_FLOOR = 1e-6;

export interface FactorFit {
  /** Number of variables p and factors k. */
  variables: number;
  factors: number;
  /** The correlation matrix analysed (rows). */
  correlation: number[][];
  /** Standardised loadings, p × k (rows = variables); each column's sum is positive. For k > 1 the canonical solution (Λ′Ψ⁻¹Λ diagonal), unrotated. */
  loadings: number[][];
  /** Uniquenesses ψ_i = 1 − communality, in the correlation metric. */
  uniqueness: number[];
  /** The ML discrepancy F_ML at the solution. */
  discrepancy: number;
  /** Degrees of freedom ((p − k)² − (p + k))/2. */
  df: number;
  /** Number of observations the fit statistics use (null: none given). */
  n: number | null;
  chi2: number | null;
  pValue: number | null;
  /** null when df = 0 (the model reproduces any covariance) or no N is given. */
  rmsea: number | null;
  /** Eigenvalues of the correlation matrix, largest first. */
  eigenvalues: number[];
  /** Variables whose uniqueness sits at the lower bound (Heywood cases). */
  heywood: number[];
  converged: boolean;
  iterations: number;
  warnings: string[];
}

export interface FactorOptions {
  /** Observations behind the covariance, for χ², its p-value and RMSEA. */
  n?: number;
  /** Names for messages (default x1, x2, …). */
  names?: string[];
}

function correlationOf(cov: Mat, names: string[]): number[][] {
  const p = cov.rows;
  const sd: number[] = [];
  for (let i = 0; i < p; i++) {
    const v = cov.data[i * p + i];
    if (!(v > 0) || !Number.isFinite(v)) throw new Error(`${names[i]} has no spread (variance ${v}): leave it out of the factor analysis`);
    sd.push(Math.sqrt(v));
  }
  return Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => (i === j ? 1 : (0.5 * (cov.data[i * p + j] + cov.data[j * p + i])) / (sd[i] * sd[j]))));
}

interface Evaluated {
  f: number;
  grad: Float64Array;
  loadings: number[][];
}

function evaluate(r: number[][], psi: Float64Array, k: number): Evaluated {
  const p = r.length;
  const sc = Array.from(psi, (x) => 1 / Math.sqrt(x));
  const s = zeros(p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) s.data[i * p + j] = sc[i] * r[i][j] * sc[j];
  const e = symmetricEigen(s);
  let f = 0;
  for (let j = k; j < p; j++) {
    const th = e.values[j];
    f += th > 0 ? th - Math.log(th) - 1 : Infinity;
  }
  const loadings = Array.from({ length: p }, () => new Array<number>(k).fill(0));
  for (let c = 0; c < k; c++) {
    const w = Math.sqrt(Math.max(e.values[c] - 1, 0));
    let sum = 0;
    for (let i = 0; i < p; i++) sum += e.vectors.data[i * p + c];
    const sign = sum < 0 ? -1 : 1;
    for (let i = 0; i < p; i++) loadings[i][c] = sign * Math.sqrt(psi[i]) * e.vectors.data[i * p + c] * w;
  }
  const grad = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let ll = 0;
    for (let c = 0; c < k; c++) ll += loadings[i][c] * loadings[i][c];
    grad[i] = (ll + psi[i] - 1) / (psi[i] * psi[i]);
  }
  return { f, grad, loadings };
}

/** log|M| of a positive definite matrix by LU, or -Infinity when it is singular. */
function logDet(m: Mat): number {
  const lu = luFactor(m);
  if (lu.singular) return -Infinity;
  let s = 0;
  for (let i = 0; i < m.rows; i++) {
    const d = lu.lu[i * m.rows + i];
    if (!(Math.abs(d) > 0)) return -Infinity;
    s += Math.log(Math.abs(d));
  }
  return s;
}

/**
 * Maximum-likelihood factor analysis with k factors of a covariance matrix.
 * Example: `factorAnalysis(fromRows(S), 1, { n: 200 }).rmsea`.
 */
export function factorAnalysis(cov: Mat, k: number, options: FactorOptions = {}): FactorFit {
  const p = cov.rows;
  const names = options.names ?? Array.from({ length: p }, (_, i) => `x${i + 1}`);
  if (cov.cols !== p) throw new Error(`the covariance must be square, not ${cov.rows}×${cov.cols}`);
  if (!Number.isInteger(k) || k < 1) throw new Error(`the number of factors must be a whole number of at least 1, not ${k}`);
  const df = ((p - k) ** 2 - (p + k)) / 2;
  if (df < 0) throw new Error(`${k} factor${k > 1 ? 's' : ''} for ${p} variables leave${k > 1 ? '' : 's'} ${df} degrees of freedom: the model is not identified (one factor needs at least 3 variables, two need 5)`);
  const r = correlationOf(cov, names);
  const eigenvalues = Array.from(symmetricEigen({ rows: p, cols: p, data: Float64Array.from(r.flat()) }).values);
  const warnings: string[] = [];

  // Start: ψ_i = (1 − k/(2p)) / (R⁻¹)_ii (Jöreskog 1967), 0.5 when R is singular.
  const rm = { rows: p, cols: p, data: Float64Array.from(r.flat()) };
  const lu = luFactor(rm);
  const psi0 = new Float64Array(p).fill(0.5);
  if (!lu.singular) {
    for (let i = 0; i < p; i++) {
      const e = new Float64Array(p);
      e[i] = 1;
      // (R⁻¹)_ii by one solve per column.
      const col = luSolve(lu, e);
      const v = (1 - k / (2 * p)) / col[i];
      psi0[i] = Number.isFinite(v) ? Math.min(1, Math.max(UNIQUENESS_FLOOR * 2, v)) : 0.5;
    }
  }
  const toPsi = (x: Float64Array) => Float64Array.from(x, (xi) => UNIQUENESS_FLOOR + Math.exp(xi));
  let x = Float64Array.from(psi0, (v) => Math.log(v - UNIQUENESS_FLOOR));
  let cur = evaluate(r, toPsi(x), k);
  const gx = (ev: Evaluated, xx: Float64Array) => Float64Array.from(ev.grad, (g, i) => g * Math.exp(xx[i]));
  let g = gx(cur, x);
  // BFGS on the inverse Hessian with a backtracking (Armijo) line search (Nocedal & Wright 2006, Alg. 6.1).
  let h = new Float64Array(p * p);
  for (let i = 0; i < p; i++) h[i * p + i] = 1;
  let converged = false;
  let iterations = 0;
  for (; iterations < 1000; iterations++) {
    const gnorm = Math.max(...Array.from(g, Math.abs));
    if (gnorm < 1e-11) { converged = true; break; }
    const d = new Float64Array(p);
    for (let i = 0; i < p; i++) { let s = 0; for (let j = 0; j < p; j++) s -= h[i * p + j] * g[j]; d[i] = s; }
    let slope = 0;
    for (let i = 0; i < p; i++) slope += d[i] * g[i];
    if (!(slope < 0)) {
      // Not a descent direction: restart from steepest descent.
      h = new Float64Array(p * p);
      for (let i = 0; i < p; i++) { h[i * p + i] = 1; d[i] = -g[i]; }
      slope = -g.reduce((a, b) => a + b * b, 0);
    }
    let step = 1;
    const maxStep = Math.max(...Array.from(d, Math.abs));
    if (maxStep > 5) step = 5 / maxStep;
    let next: Evaluated | null = null;
    let xn = x;
    for (let t = 0; t < 60; t++) {
      xn = Float64Array.from(x, (xi, i) => xi + step * d[i]);
      const ev = evaluate(r, toPsi(xn), k);
      if (Number.isFinite(ev.f) && ev.f <= cur.f + 1e-4 * step * slope) { next = ev; break; }
      step /= 2;
    }
    if (!next) { converged = gnorm < 1e-7; break; }
    const gn = gx(next, xn);
    const sv = Float64Array.from(xn, (v, i) => v - x[i]);
    const yv = Float64Array.from(gn, (v, i) => v - g[i]);
    let sy = 0;
    for (let i = 0; i < p; i++) sy += sv[i] * yv[i];
    if (sy > 1e-300) {
      const hy = new Float64Array(p);
      for (let i = 0; i < p; i++) { let s = 0; for (let j = 0; j < p; j++) s += h[i * p + j] * yv[j]; hy[i] = s; }
      let yhy = 0;
      for (let i = 0; i < p; i++) yhy += yv[i] * hy[i];
      const rho = 1 / sy;
      for (let i = 0; i < p; i++)
        for (let j = 0; j < p; j++)
          h[i * p + j] += -rho * (hy[i] * sv[j] + sv[i] * hy[j]) + (rho * rho * yhy + rho) * sv[i] * sv[j];
    }
    const fOld = cur.f;
    x = xn;
    cur = next;
    g = gn;
    if (Math.abs(fOld - cur.f) <= 1e-16 * Math.max(1, Math.abs(cur.f)) && Math.max(...Array.from(g, Math.abs)) < 1e-8) { converged = true; break; }
  }
  const psi = toPsi(x);
  const heywood: number[] = [];
  for (let i = 0; i < p; i++) if (psi[i] < UNIQUENESS_FLOOR * 1.0001 + 1e-9) heywood.push(i);
  if (heywood.length > 0)
    warnings.push(`${heywood.map((i) => names[i]).join(', ')} ${heywood.length > 1 ? 'have' : 'has'} a uniqueness at the lower bound ${UNIQUENESS_FLOOR} (a Heywood case): the factor${k > 1 ? 's' : ''} reproduce${k > 1 ? '' : 's'} ${heywood.length > 1 ? 'these variables' : 'this variable'} almost without error, or the covariance is nearly singular`);
  if (!converged) warnings.push(`the fit did not converge in ${iterations} steps: treat its numbers with care`);

  // F_ML directly: log|Σ̂| − log|R| + tr(R Σ̂⁻¹) − p.
  const fitted = zeros(p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      let s = i === j ? psi[i] : 0;
      for (let c = 0; c < k; c++) s += cur.loadings[i][c] * cur.loadings[j][c];
      fitted.data[i * p + j] = s;
    }
  const logR = logDet(rm);
  let discrepancy: number;
  if (logR === -Infinity) {
    discrepancy = cur.f;
    warnings.push('the correlation matrix is singular: the discrepancy is the concentrated criterion, and χ² is not defined');
  } else {
    const flu = luFactor(fitted);
    let tr = 0;
    for (let j = 0; j < p; j++) {
      const e = new Float64Array(p);
      for (let i = 0; i < p; i++) e[i] = r[i][j];
      const col = luSolve(flu, e);
      tr += col[j];
    }
    discrepancy = Math.max(0, logDet(fitted) - logR + tr - p);
  }
  const n = options.n !== undefined && options.n > 1 ? options.n : null;
  let chi2: number | null = null, pValue: number | null = null, rmsea: number | null = null;
  if (n !== null && logR !== -Infinity) {
    chi2 = (n - 1) * discrepancy;
    if (df > 0) {
      pValue = chiSquareSurvival(chi2, df);
      rmsea = Math.sqrt(Math.max(chi2 - df, 0) / (df * (n - 1)));
    } else warnings.push(`with ${k} factor${k > 1 ? 's' : ''} for ${p} variables the model has 0 degrees of freedom: it reproduces any covariance, so its fit says nothing`);
  }
  return { variables: p, factors: k, correlation: r, loadings: cur.loadings, uniqueness: Array.from(psi), discrepancy, df, n, chi2, pValue, rmsea, eigenvalues, heywood, converged, iterations, warnings };
}

/**
 * The precision matrix a one-factor model implies, by Sherman–Morrison:
 * (λλ′ + Θ)⁻¹ = Θ⁻¹ − Θ⁻¹λλ′Θ⁻¹ / (1 + λ′Θ⁻¹λ) — every off-diagonal entry
 * is non-zero where both loadings are: a fully connected network (van Bork,
 * Rhemtulla, Waldorp, Kruis & Marsman 2021, Multivariate Behavioral Research
 * 56: 175–198). Returns the precision and its partial correlations
 * −K_ij/√(K_ii K_jj).
 */
export function oneFactorPrecision(loadings: readonly number[], uniqueness: readonly number[]): { precision: number[][]; partial: number[][] } {
  const p = loadings.length;
  const a = loadings.map((l, i) => l / uniqueness[i]);
  const denom = 1 + loadings.reduce((s, l, i) => s + (l * l) / uniqueness[i], 0);
  const precision = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => (i === j ? 1 / uniqueness[i] : 0) - (a[i] * a[j]) / denom));
  const partial = precision.map((row, i) => row.map((kij, j) => (i === j ? 1 : -kij / Math.sqrt(precision[i][i] * precision[j][j]))));
  return { precision, partial };
}

/** ln Γ(x) by the Lanczos approximation (g = 7, n = 9; Numerical Recipes, 3rd ed., §6.1, common practice). */
function logGamma(x: number): number {
  const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const xx = x - 1;
  let a = c[0];
  const t = xx + 7.5;
  for (let i = 1; i < 9; i++) a += c[i] / (xx + i);
  return 0.5 * Math.log(2 * Math.PI) + (xx + 0.5) * Math.log(t) - t + Math.log(a);
}

/**
 * P(χ²_df > x): the regularised upper incomplete gamma Q(df/2, x/2), by its
 * series below a + 1 and Lentz's continued fraction above (Numerical Recipes,
 * 3rd ed., §6.2).
 */
export function chiSquareSurvival(x: number, df: number): number {
  if (!(x > 0)) return 1;
  const a = df / 2, z = x / 2;
  const lead = a * Math.log(z) - z - logGamma(a);
  if (z < a + 1) {
    let sum = 1 / a, term = 1 / a;
    for (let n = 1; n < 10000; n++) {
      term *= z / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * 1e-16) break;
    }
    return Math.max(0, 1 - sum * Math.exp(lead));
  }
  const tiny = 1e-300;
  let b = z + 1 - a, c = 1 / tiny, d = 1 / b, hh = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    hh *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return Math.min(1, Math.exp(lead) * hh);
}
