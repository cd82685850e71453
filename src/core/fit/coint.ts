/**
 * Non-stationary series: the augmented Dickey–Fuller unit-root test, the
 * Engle–Granger two-step cointegration test, Johansen's trace and
 * maximum-eigenvalue tests, and the error-correction loadings that say which
 * series tracks which.
 *
 * - ADF (Said & Dickey 1984): Δx_t = [c, (c + d·t)] + ρ x_{t−1} + Σᵢ γᵢ Δx_{t−i} + e_t,
 *   τ = t statistic of ρ. Lag order by the smallest AIC over 0…maxlag on the
 *   common sample of the longest lag, default maxlag ⌈12 (T/100)^¼⌉ (Schwert
 *   1989), as statsmodels' adfuller does; the final regression uses the sample
 *   the chosen lag allows.
 * - Engle & Granger (1987) two-step: regress the first series on the others
 *   (with a constant, or constant and trend), ADF without deterministic terms
 *   on the residuals; critical values for N series from MacKinnon (2010) at
 *   T − 1, p-values from MacKinnon (1994) (see cointTables.ts).
 * - Johansen (1988, 1991): reduced-rank regression of the VECM
 *   Δy_t = Π y_{t−1} + Σᵢ Γᵢ Δy_{t−i} + e_t, the squared canonical correlations
 *   λ of the levels and the differences after the lagged differences are
 *   partialled out (Lütkepohl 2005, §7.2, p. 294–295); trace = −T Σ_{i>r} ln(1 − λᵢ),
 *   maximum eigenvalue = −T ln(1 − λ_{r+1}). Deterministic terms as
 *   statsmodels' coint_johansen (det_order −1, 0, 1).
 * - Error correction (Engle & Granger 1987, §4): each series' difference
 *   regressed on a constant, the lagged equilibrium error and lagged
 *   differences; a series whose loading pulls it back toward the equilibrium
 *   (and is distinguishable from zero) tracks the others.
 */
import { nestedResidualSums, ols } from '../stats/ols';
import { normalCdf } from '../stats/normal';
import { symmetricEigen } from '../pictures/symmetric';
import { fromRows, type Mat } from '../numeric/dense';
import { chiSquareSurvival } from './compare';
import { johansenCritical, tauCritical, tauPValueArgument, type Deterministic } from './cointTables';
import { significant } from '../../present/index';

export type AdfRegression = Deterministic | 'n';

export interface AdfOptions {
  /** Deterministic terms in the test regression: constant ('c', default) or constant and linear trend ('ct'). */
  regression?: AdfRegression;
  /** Largest lag of Δx considered; default ⌈12 (T/100)^¼⌉, capped at T/2 − terms − 1. */
  maxLag?: number;
  /** 'aic' (default): the lag with the smallest AIC; null: use maxLag. */
  autoLag?: 'aic' | null;
}

export interface AdfResult {
  statistic: number;
  /** MacKinnon (1994) approximate p-value (NaN without deterministic terms). */
  pValue: number;
  /** Critical values at 1 %, 5 %, 10 % (MacKinnon 2010) for the observations used. */
  critical: { '1%': number; '5%': number; '10%': number } | null;
  usedLag: number;
  maxLag: number;
  /** Observations in the final regression. */
  nobs: number;
  /** AIC of the chosen lag (null without autolag). */
  aic: number | null;
  regression: AdfRegression;
  /** ρ, the coefficient of the lagged level (0 under a unit root). */
  rho: number;
}

function finiteSeries(x: ArrayLike<number>, name: string): Float64Array {
  const out = Float64Array.from(x);
  for (let i = 0; i < out.length; i++) if (!Number.isFinite(out[i])) throw new Error(`${name}: value ${i + 1} is not a finite number; the tests need complete series`);
  return out;
}

function terms(regression: AdfRegression): number {
  return regression === 'n' ? 0 : regression.length;
}

/** Columns [level, Δx lags 1..lag] (+ deterministic) on the sample that starts after `start` lags. */
function adfDesign(x: Float64Array, dx: Float64Array, lag: number, start: number, regression: AdfRegression): { y: Float64Array; cols: Float64Array[] } {
  const nobs = dx.length - start;
  const y = dx.subarray(start);
  const cols: Float64Array[] = [];
  if (regression !== 'n') cols.push(new Float64Array(nobs).fill(1));
  if (regression === 'ct') cols.push(Float64Array.from({ length: nobs }, (_, k) => k + 1));
  cols.push(x.slice(start, start + nobs));
  for (let i = 1; i <= lag; i++) cols.push(dx.slice(start - i, start - i + nobs));
  return { y, cols };
}

/**
 * Augmented Dickey–Fuller test of a unit root in x.
 * Example: `adf(series, { regression: 'c' }).statistic` — compare with `critical['5%']`.
 */
export function adf(series: ArrayLike<number>, options: AdfOptions = {}, name = 'series'): AdfResult {
  const regression = options.regression ?? 'c';
  const autoLag = options.autoLag === undefined ? 'aic' : options.autoLag;
  const x = finiteSeries(series, name);
  const n = x.length;
  const nt = terms(regression);
  let maxLag: number;
  if (options.maxLag === undefined) {
    maxLag = Math.min(Math.floor(n / 2) - nt - 1, Math.ceil(12 * (n / 100) ** 0.25));
    if (maxLag < 0) throw new Error(`${name}: ${n} values are too few for the test (at least ${2 * (nt + 1)} are needed)`);
  } else {
    maxLag = options.maxLag;
    if (!Number.isInteger(maxLag) || maxLag < 0) throw new Error(`${name}: the largest lag must be a whole number ≥ 0, not ${maxLag}`);
    if (maxLag > Math.floor(n / 2) - nt - 1) throw new Error(`${name}: the largest lag ${maxLag} is too long for ${n} values (at most ${Math.floor(n / 2) - nt - 1})`);
  }
  const dx = new Float64Array(n - 1);
  for (let i = 1; i < n; i++) dx[i - 1] = x[i] - x[i - 1];
  let usedLag = maxLag;
  let bestAic: number | null = null;
  if (autoLag === 'aic') {
    // Every lag order on the longest lag's sample; the columns are nested, so one QR gives every SSR.
    const d = adfDesign(x, dx, maxLag, maxLag, regression);
    const ssr = nestedResidualSums(d.y, d.cols);
    const m = d.y.length;
    for (let lag = 0; lag <= maxLag; lag++) {
      const k = nt + 1 + lag;
      const aic = m * (Math.log(2 * Math.PI) + Math.log(ssr[k - 1] / m) + 1) + 2 * k;
      if (bestAic === null || aic < bestAic) {
        bestAic = aic;
        usedLag = lag;
      }
    }
  }
  const d = adfDesign(x, dx, usedLag, usedLag, regression);
  const fit = ols(d.y, d.cols);
  const statistic = fit.t[nt];
  const nobs = d.y.length;
  const c = regression === 'n' ? null : tauCritical(1, regression, nobs);
  return {
    statistic,
    pValue: regression === 'n' ? NaN : tauPValue(statistic, 1, regression),
    critical: c ? { '1%': c[0], '5%': c[1], '10%': c[2] } : null,
    usedLag,
    maxLag,
    nobs,
    aic: bestAic,
    regression,
    rho: fit.beta[nt],
  };
}

/** MacKinnon (1994) approximate p-value of τ for N series. */
export function tauPValue(tau: number, n: number, deterministic: Deterministic): number {
  const z = tauPValueArgument(tau, n, deterministic);
  return z === Infinity ? 1 : z === -Infinity ? 0 : normalCdf(z);
}

export interface EngleGrangerOptions {
  trend?: Deterministic;
  maxLag?: number;
  autoLag?: 'aic' | null;
}

export interface EngleGrangerResult {
  statistic: number;
  pValue: number;
  critical: { '1%': number; '5%': number; '10%': number };
  /** Series in the test (the first is regressed on the rest). */
  series: number;
  usedLag: number;
  nobs: number;
  /** Cointegrating regression: coefficients of the other series, then constant (and trend). */
  coefficients: number[];
  /** The equilibrium error: the first series minus its fitted value. */
  residuals: Float64Array;
  warnings: string[];
}

/**
 * Engle–Granger test of no cointegration between y0 and the series in `others`.
 * Example: `engleGranger(a, [b]).statistic < engleGranger(a, [b]).critical['5%']` rejects no cointegration at 5 %.
 */
export function engleGranger(y0: ArrayLike<number>, others: readonly ArrayLike<number>[], options: EngleGrangerOptions = {}, names: string[] = []): EngleGrangerResult {
  const trend = options.trend ?? 'c';
  const name = (i: number): string => names[i] ?? `series ${i + 1}`;
  const y = finiteSeries(y0, name(0));
  const n = y.length;
  if (others.length < 1) throw new Error('the Engle–Granger test needs at least two series');
  const cols = others.map((o, i) => {
    const s = finiteSeries(o, name(i + 1));
    if (s.length !== n) throw new Error(`${name(i + 1)} has ${s.length} values and ${name(0)} ${n}; the series must be equally long`);
    return s;
  });
  cols.push(new Float64Array(n).fill(1));
  if (trend === 'ct') cols.push(Float64Array.from({ length: n }, (_, k) => k + 1));
  const co = ols(y, cols);
  const k = others.length + 1;
  const warnings: string[] = [];
  let statistic = -Infinity;
  let usedLag = 0;
  if (co.rSquared < 1 - 100 * Math.sqrt(Number.EPSILON)) {
    const r = adf(co.residuals, { regression: 'n', maxLag: options.maxLag, autoLag: options.autoLag }, `the equilibrium error of ${name(0)}`);
    statistic = r.statistic;
    usedLag = r.usedLag;
  } else warnings.push(`${name(0)} is (almost) an exact linear function of the other series; the test is not informative`);
  const c = tauCritical(k, trend, n - 1);
  return {
    statistic,
    pValue: tauPValue(statistic, k, trend),
    critical: { '1%': c[0], '5%': c[1], '10%': c[2] },
    series: k,
    usedLag,
    nobs: n,
    coefficients: Array.from(co.beta),
    residuals: co.residuals,
    warnings,
  };
}

export interface JohansenResult {
  /** Squared canonical correlations, largest first. */
  eigenvalues: number[];
  /** Columns: cointegrating vectors β normalised so βᵀ S_kk β = I. */
  vectors: number[][];
  /** Trace statistics for r = 0 … n−1. */
  trace: number[];
  /** Maximum-eigenvalue statistics for r = 0 … n−1. */
  maxEig: number[];
  /** [90 %, 95 %, 99 %] critical values per r (MacKinnon, Haug & Michelis 1999). */
  traceCritical: [number, number, number][];
  maxEigCritical: [number, number, number][];
  /** Cointegration rank chosen by each test at 5 %: the first r not rejected. */
  rank: { trace: number; maxEig: number };
  detOrder: -1 | 0 | 1;
  lagDiff: number;
  /** Observations in the reduced-rank regression. */
  nobs: number;
}

/** Residuals of OLS regressions of each column of Y on the columns of Z (no constant). */
function partialOut(y: Float64Array[], z: Float64Array[]): Float64Array[] {
  if (z.length === 0) return y.map((c) => Float64Array.from(c));
  return y.map((c) => ols(c, z).residuals);
}

function demean(c: Float64Array): Float64Array {
  let m = 0;
  for (const v of c) m += v / c.length;
  return c.map((v) => v - m);
}

/** statsmodels' detrend: OLS residuals on a polynomial in linspace(−1, 1) of the given order (−1: unchanged). */
function detrend(c: Float64Array, order: number): Float64Array {
  if (order < 0) return Float64Array.from(c);
  if (order === 0) return demean(c);
  const n = c.length;
  const s = Float64Array.from({ length: n }, (_, k) => (n === 1 ? -1 : -1 + (2 * k) / (n - 1)));
  const cols = [];
  for (let p = order; p >= 0; p--) cols.push(s.map((v) => v ** p));
  return ols(c, cols).residuals;
}

function cov(a: Float64Array[], b: Float64Array[]): number[][] {
  const t = a[0].length;
  return a.map((x) => b.map((y) => { let s = 0; for (let i = 0; i < t; i++) s += x[i] * y[i]; return s / t; }));
}

function cholesky(m: number[][]): number[][] {
  const n = m.length;
  const l = m.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = m[i][j];
      for (let k = 0; k < j; k++) s -= l[i][k] * l[j][k];
      if (i === j) {
        if (!(s > 0)) throw new Error('the levels are (almost) linearly dependent; drop a series that is a combination of the others');
        l[i][i] = Math.sqrt(s);
      } else l[i][j] = s / l[j][j];
    }
  return l;
}

function solveLower(l: number[][], b: number[]): number[] {
  const x = b.slice();
  for (let i = 0; i < l.length; i++) {
    for (let k = 0; k < i; k++) x[i] -= l[i][k] * x[k];
    x[i] /= l[i][i];
  }
  return x;
}

function solveUpperT(l: number[][], b: number[]): number[] {
  // Solves Lᵀ x = b.
  const n = l.length;
  const x = b.slice();
  for (let i = n - 1; i >= 0; i--) {
    for (let k = i + 1; k < n; k++) x[i] -= l[k][i] * x[k];
    x[i] /= l[i][i];
  }
  return x;
}

function inverseSym(m: number[][]): number[][] {
  const l = cholesky(m);
  const n = m.length;
  const cols = Array.from({ length: n }, (_, j) => solveUpperT(l, solveLower(l, Array.from({ length: n }, (_, i) => (i === j ? 1 : 0)))));
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => cols[j][i]));
}

/**
 * Johansen's trace and maximum-eigenvalue tests on the columns of `data`
 * (rows are occasions), with `lagDiff` lagged differences and the
 * deterministic terms of detOrder (−1 none, 0 constant, 1 constant and trend).
 */
export function johansen(data: readonly ArrayLike<number>[], detOrder: -1 | 0 | 1 = 0, lagDiff = 1, names: string[] = []): JohansenResult {
  const neqs = data.length;
  if (neqs < 2) throw new Error('the Johansen test needs at least two series');
  if (neqs > 12) throw new Error('the Johansen test has critical values for at most 12 series');
  const cols = data.map((c, i) => finiteSeries(c, names[i] ?? `series ${i + 1}`));
  const nobs = cols[0].length;
  cols.forEach((c, i) => { if (c.length !== nobs) throw new Error(`${names[i] ?? `series ${i + 1}`} has ${c.length} values, the first series ${nobs}; the series must be equally long`); });
  if (!Number.isInteger(lagDiff) || lagDiff < 0) throw new Error(`the number of lagged differences must be a whole number ≥ 0, not ${lagDiff}`);
  const t = nobs - 1 - lagDiff;
  if (t <= neqs * (lagDiff + 1) + 1) throw new Error(`${nobs} occasions are too few for ${neqs} series with ${lagDiff} lagged differences`);
  const f = detOrder > -1 ? 0 : detOrder;
  const levels = cols.map((c) => detrend(c, detOrder));
  const dxFull = levels.map((c) => c.slice(1).map((v, i) => v - c[i]));
  // Lagged differences: lag j of Δy at rows lagDiff … of the differenced series.
  const z: Float64Array[] = [];
  for (let j = 1; j <= lagDiff; j++) for (const d of dxFull) z.push(detrend(d.slice(lagDiff - j, lagDiff - j + t), f));
  const dx = dxFull.map((d) => detrend(d.slice(lagDiff), f));
  const r0 = partialOut(dx, z);
  const lx = levels.map((c) => detrend(c.slice(lagDiff, lagDiff + t), f));
  const rk = partialOut(lx, z);
  const skk = cov(rk, rk);
  const sk0 = cov(rk, r0);
  const s00 = cov(r0, r0);
  const s00inv = inverseSym(s00);
  const sig = sk0.map((row) => s00inv[0].map((_, j) => row.reduce((s, v, m) => s + v * s00inv[m][j], 0)));
  const sig2 = sig.map((row) => sk0.map((r2) => row.reduce((s, v, m) => s + v * r2[m], 0)));
  // Symmetric form: L⁻¹ Σ L⁻ᵀ with S_kk = L Lᵀ has the same eigenvalues; β = L⁻ᵀ u.
  const l = cholesky(skk);
  const a = sig2.map((_, j) => solveLower(l, sig2.map((row) => row[j])));
  const aT = a[0].map((_, i) => a.map((row) => row[i]));
  const b = aT.map((row) => solveLower(l, row));
  const sym: Mat = fromRows(b.map((row, i) => row.map((v, j) => (v + b[j][i]) / 2)));
  const e = symmetricEigen(sym);
  const eigenvalues = Array.from(e.values);
  const vecCols = eigenvalues.map((_, j) => solveUpperT(l, Array.from({ length: neqs }, (_, i) => e.vectors.data[i * neqs + j])));
  // statsmodels' normalisation: the whole matrix signed so that its first entry is positive.
  const sign = vecCols[0][0] < 0 ? -1 : 1;
  const vectors = Array.from({ length: neqs }, (_, i) => vecCols.map((c) => sign * c[i]));
  const trace: number[] = [];
  const maxEig: number[] = [];
  const traceCritical: [number, number, number][] = [];
  const maxEigCritical: [number, number, number][] = [];
  for (let i = 0; i < neqs; i++) {
    let s = 0;
    for (let j = i; j < neqs; j++) s += Math.log(1 - eigenvalues[j]);
    trace.push(-t * s);
    maxEig.push(-t * Math.log(1 - eigenvalues[i]));
    const c = johansenCritical(neqs - i, detOrder);
    traceCritical.push(c.trace);
    maxEigCritical.push(c.maxEig);
  }
  const firstNotRejected = (stat: number[], crit: [number, number, number][]): number => {
    for (let r = 0; r < neqs; r++) if (!(stat[r] > crit[r][1])) return r;
    return neqs;
  };
  return { eigenvalues, vectors, trace, maxEig, traceCritical, maxEigCritical, rank: { trace: firstNotRejected(trace, traceCritical), maxEig: firstNotRejected(maxEig, maxEigCritical) }, detOrder, lagDiff, nobs: t };
}

export interface Loading {
  series: string;
  /** Coefficient of the lagged equilibrium error in this series' difference equation. */
  alpha: number;
  se: number;
  t: number;
  /** Two-sided p-value from the normal approximation (common practice for stationary regressors). */
  pValue: number;
  /** Weight of this series in the equilibrium error (1 for the first, −coefficient for the others). */
  weight: number;
  /** α × weight: negative when the series moves back toward the equilibrium. */
  pull: number;
  /** The series is pulled back toward the equilibrium and the pull is distinguishable from zero at 5 %. */
  corrects: boolean;
}

export interface ErrorCorrection {
  loadings: Loading[];
  /** Series that correct toward the equilibrium (trackers). */
  trackers: string[];
  /** Series that do not (what the trackers follow). */
  leaders: string[];
  lags: number;
  nobs: number;
}

/**
 * Error-correction loadings from the Engle–Granger equilibrium error:
 * Δy_{i,t} = c_i + α_i e_{t−1} + Σ_{j=1..lags} Γ_{i,j} Δy_{t−j} + u_{i,t}.
 */
export function errorCorrection(series: readonly ArrayLike<number>[], eg: EngleGrangerResult, names: string[], lags = 1): ErrorCorrection {
  const k = series.length;
  const xs = series.map((s, i) => finiteSeries(s, names[i]));
  const n = xs[0].length;
  const d = xs.map((x) => x.slice(1).map((v, i) => v - x[i]));
  const rows = n - 1 - lags;
  if (rows <= 2 + k * lags) throw new Error(`${n} occasions are too few for the error-correction regressions with ${lags} lags`);
  const cols: Float64Array[] = [new Float64Array(rows).fill(1), eg.residuals.slice(lags, lags + rows)];
  for (let j = 1; j <= lags; j++) for (const dd of d) cols.push(dd.slice(lags - j, lags - j + rows));
  const loadings = d.map((dd, i) => {
    const fit = ols(dd.slice(lags), cols);
    const weight = i === 0 ? 1 : -eg.coefficients[i - 1];
    const alpha = fit.beta[1];
    const se = fit.se[1];
    const tt = fit.t[1];
    const pValue = 2 * normalCdf(-Math.abs(tt));
    const pull = alpha * weight;
    return { series: names[i], alpha, se, t: tt, pValue, weight, pull, corrects: pull < 0 && pValue < 0.05 };
  });
  return { loadings, trackers: loadings.filter((l) => l.corrects).map((l) => l.series), leaders: loadings.filter((l) => !l.corrects).map((l) => l.series), lags, nobs: rows };
}

/**
 * The ordering a long sampling interval shows for cointegrated series, in words:
 * the tracker's settled balance is determined by what it tracks.
 */
export function trackingSentence(ec: ErrorCorrection, eg: EngleGrangerResult, names: string[]): string {
  const list = listText;
  const balance = balanceText(eg, names, ec.trackers.length === 1 ? names.indexOf(ec.trackers[0]) : 0);
  if (ec.trackers.length === 0) return `No series is pulled back toward the balance ${balance} distinguishably from zero; the data do not say which tracks which.`;
  if (ec.leaders.length === 0) return `Each of ${list(ec.trackers)} is pulled back toward the balance ${balance}; at a long interval they settle together and no one of them determines the others.`;
  const verb = ec.trackers.length === 1 ? 'tracks' : 'track';
  return `${list(ec.trackers)} ${verb} ${list(ec.leaders)}: at an interval long enough for the correction to finish, ${list(ec.trackers)}'s settled balance is determined by ${list(ec.leaders)} (${balance}), while ${list(ec.leaders)} ${ec.leaders.length === 1 ? 'is' : 'are'} not pulled back by ${list(ec.trackers)}. A model-based hypothesis, not a finding.`;
}

/**
 * The cointegrating regression as a balance solved for one series, e.g. "a ≈ 2.01·b + 0.98"
 * (minus sign U+2212). The regression is y₀ = Σ bⱼ yⱼ + c (+ d·t); solved for series i ≠ 0:
 * yᵢ = (y₀ − Σ_{j≠i} bⱼ yⱼ − c − d·t) / bᵢ.
 */
export function balanceText(eg: EngleGrangerResult, names: string[], solveFor = 0): string {
  const k = names.length - 1;
  // Weights of the equilibrium error e = Σ wⱼ yⱼ + w_c (+ w_t t).
  const w = [1, ...eg.coefficients.slice(0, k).map((b) => -b)];
  const wc = -eg.coefficients[k];
  const wt = eg.coefficients.length > k + 1 ? -eg.coefficients[k + 1] : null;
  const f = -1 / w[solveFor];
  const terms: { v: number; text: string }[] = [];
  names.forEach((n, j) => { if (j !== solveFor) terms.push({ v: f * w[j], text: `${fmt(Math.abs(f * w[j]))}·${n}` }); });
  terms.push({ v: f * wc, text: fmt(Math.abs(f * wc)) });
  if (wt !== null) terms.push({ v: f * wt, text: `${fmt(Math.abs(f * wt))}·t` });
  return `${names[solveFor]} ≈ ${terms.map((t, i) => (i === 0 ? (t.v < 0 ? '−' : '') : t.v < 0 ? ' − ' : ' + ') + t.text).join('')}`;
}

function signed(x: number): string {
  return x < 0 ? `−${fmt(-x)}` : fmt(x);
}

function listText(xs: string[]): string {
  return xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`;
}

function fmt(x: number): string {
  return String(significant(x, 4));
}

export interface CointegrationOptions {
  /** Deterministic terms: 'c' (constant, default) or 'ct' (constant and trend); Johansen uses det_order 0 or 1 to match. */
  trend?: Deterministic;
  /** Lagged differences in the Johansen and error-correction regressions (default 1). */
  lags?: number;
}

export interface CointegrationReport {
  names: string[];
  nobs: number;
  adf: (AdfResult & { series: string; unitRoot: boolean })[];
  engleGranger: EngleGrangerResult & { cointegrated: boolean };
  johansen: JohansenResult;
  errorCorrection: ErrorCorrection | null;
  /** The ordering a long interval gives, in words. */
  sentence: string;
  notes: string[];
}

/**
 * Every test on one set of equally spaced series: ADF per series, Engle–Granger
 * (the first series on the others), Johansen, and, when Engle–Granger rejects
 * no cointegration at 5 %, the error-correction loadings and who tracks whom.
 */
export function cointegrationReport(series: readonly ArrayLike<number>[], names: string[], options: CointegrationOptions = {}): CointegrationReport {
  const trend = options.trend ?? 'c';
  const lags = options.lags ?? 1;
  if (series.length < 2) throw new Error('name at least two series to test for cointegration');
  const adfs = series.map((s, i) => {
    const r = adf(s, { regression: trend }, names[i]);
    return { ...r, series: names[i], unitRoot: !(r.statistic < r.critical!['5%']) };
  });
  const eg0 = engleGranger(series[0], series.slice(1), { trend }, names);
  const eg = { ...eg0, cointegrated: eg0.statistic < eg0.critical['5%'] };
  const jo = johansen(series, trend === 'c' ? 0 : 1, lags, names);
  const notes: string[] = [...eg.warnings];
  const stationary = adfs.filter((a) => !a.unitRoot).map((a) => a.series);
  if (stationary.length) notes.push(`the unit-root test rejects a unit root at 5 % for ${stationary.join(', ')}: the cointegration tests presume every series drifts (has a unit root)`);
  let ec: ErrorCorrection | null = null;
  let sentence: string;
  if (eg.cointegrated) {
    ec = errorCorrection(series, eg0, names, Math.max(1, lags));
    sentence = trackingSentence(ec, eg0, names);
  } else {
    sentence = `No cointegration at 5 % (Engle–Granger τ = ${signed(eg.statistic)}, critical ${signed(eg.critical['5%'])}): ${listText(names)} may drift apart, so no series' settled balance is determined by another at a long interval.`;
  }
  if (eg.cointegrated !== jo.rank.trace > 0) notes.push(`Engle–Granger and Johansen's trace test disagree at 5 % (${eg.cointegrated ? 'cointegrated' : 'not cointegrated'} vs rank ${jo.rank.trace})`);
  return { names, nobs: series[0].length, adf: adfs, engleGranger: eg, johansen: jo, errorCorrection: ec, sentence, notes };
}

export interface PooledCointegration {
  persons: number;
  tested: number;
  /** Persons left out, with the reason (e.g. too few occasions). */
  skipped: { id: string; reason: string }[];
  /** Per series: persons whose ADF rejects a unit root at 5 %, and the combined p-value. */
  adf: { series: string; rejected: number; fisherP: number }[];
  engleGranger: { rejected: number; fisherP: number };
  /** Persons by Johansen trace rank at 5 %. */
  johansenRank: number[];
  /** Per series: persons in whom it tracks the others. */
  trackers: { series: string; persons: number }[];
  perPerson: { id: string; report: CointegrationReport }[];
}

/**
 * The tests per person, summarised: counts of rejections and Fisher's
 * combination of the per-person p-values, −2 Σ ln pᵢ ~ χ²(2N) under the null
 * in every person (Maddala & Wu 1999, from memory; it presumes independent persons).
 */
export function pooledCointegration(groups: readonly { id: string; series: readonly ArrayLike<number>[] }[], names: string[], options: CointegrationOptions = {}): PooledCointegration {
  const perPerson: { id: string; report: CointegrationReport }[] = [];
  const skipped: { id: string; reason: string }[] = [];
  for (const g of groups) {
    try {
      perPerson.push({ id: g.id, report: cointegrationReport(g.series, names, options) });
    } catch (e) {
      skipped.push({ id: g.id, reason: (e as Error).message });
    }
  }
  const fisher = (ps: number[]): number => {
    if (ps.length === 0) return NaN;
    const x = -2 * ps.reduce((s, p) => s + Math.log(Math.max(p, 1e-300)), 0);
    return chiSquareSurvival(x, 2 * ps.length);
  };
  const rank = new Array<number>(names.length + 1).fill(0);
  for (const p of perPerson) rank[p.report.johansen.rank.trace]++;
  return {
    persons: groups.length,
    tested: perPerson.length,
    skipped,
    adf: names.map((n, i) => ({ series: n, rejected: perPerson.filter((p) => !p.report.adf[i].unitRoot).length, fisherP: fisher(perPerson.map((p) => p.report.adf[i].pValue)) })),
    engleGranger: { rejected: perPerson.filter((p) => p.report.engleGranger.cointegrated).length, fisherP: fisher(perPerson.map((p) => p.report.engleGranger.pValue)) },
    johansenRank: rank,
    trackers: names.map((n) => ({ series: n, persons: perPerson.filter((p) => p.report.errorCorrection?.trackers.includes(n)).length })),
    perPerson,
  };
}
