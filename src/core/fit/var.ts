/**
 * First-order vector autoregression at the data's interval, within persons.
 *
 * y_t = Φ y_{t−1} + u_t on person-centred values, pooled by least squares over
 * every usable lag pair of every person (one equation per variable, the same
 * regressors in each, so equation-by-equation OLS is the multivariate LS
 * estimator; Lütkepohl 2005, New Introduction to Multiple Time Series
 * Analysis, §3.2). Person differences in level are removed before fitting so
 * they do not pass as lagged effects.
 *
 * Centring:
 * - 'person-mean' (default): each variable minus the person's mean over all
 *   the person's observed values, then pooled LS without intercept (the
 *   practice in experience-sampling work).
 * - 'fixed-effects': one intercept per person and variable (the within
 *   estimator; identical to OLS with person dummies). For one person it is the
 *   ordinary VAR(1) with a constant, as in Lütkepohl (2005, eq. 3.2.1).
 *
 * Lag pairs: (k−1, k) of one person, both occasions with every variable
 * observed; with `sameDay` only pairs within one day (the first prompt of a
 * day is not regressed on the previous evening); with a skipped-prompt rule
 * only pairs one intended interval apart.
 */
import type { VariableId } from '../model/types';
import type { Panel, PersonSeries } from '../data/panel';

/** Which lag pairs span one intended interval. */
export type SkipRule =
  /** Every pair of consecutive rows counts. */
  | 'none'
  /** Consecutive prompt numbers within one day (needs `prompt`; and `day` when present). */
  | 'prompt'
  /** Pairs at most this far apart (in the panel's time unit). */
  | { maxInterval: number };

export interface VarOptions {
  /** Only pairs of occasions on the same day (needs day numbers). Default false. */
  sameDay?: boolean;
  /** Default 'none'. */
  skipRule?: SkipRule;
  /** Also fit each person alone (N = 1) when the person has at least `minPairs` usable pairs (default 20) and more pairs than parameters. */
  perPerson?: boolean | { minPairs?: number };
  /** Default 'person-mean'. */
  centre?: 'person-mean' | 'fixed-effects';
  /** Fit these variables only (default: all of the panel's). */
  variables?: VariableId[];
}

export interface PersonVar {
  person: string;
  pairs: number;
  phi: number[][];
  intercept: number[];
  se: number[][];
  residualCov: number[][];
}

export interface VarFit {
  method: 'var';
  variables: VariableId[];
  /** phi[i][j]: effect of variable j at the earlier occasion on variable i at the later one. */
  phi: number[][];
  se: {
    /** Conventional LS standard errors, Σ_u ⊗ (X′X)⁻¹ (Lütkepohl 2005, eq. 3.2.21). */
    phi: number[][];
    /** Cluster-robust across persons (sandwich with G/(G−1)·(N−1)/(N−K); common practice, as Stata and statsmodels). Null with one person. */
    phiCluster: number[][] | null;
  };
  /** Residual covariance, residuals′residuals / (pairs − parameters per equation). */
  residualCov: number[][];
  /** Residual covariance as partial correlations of the same-occasion residuals (the contemporaneous network). */
  residualPartial: number[][];
  /** 'fixed-effects' only: each person's intercepts. */
  intercepts?: { person: string; values: number[] }[];
  /** Between-person part: each person's means and their covariance across persons. */
  between: { means: { person: string; values: number[] }[]; cov: number[][] };
  n: { persons: number; occasions: number; pairs: number; parametersPerEquation: number };
  /** Pairs not used, and why. */
  excluded: { reason: string; pairs: number }[];
  perPerson: PersonVar[];
  warnings: string[];
}

interface PairSet {
  person: PersonSeries;
  idx: number[]; // later occasion k of pair (k−1, k)
}

function usablePairs(panel: Panel, p: PersonSeries, cols: number[], opt: VarOptions, excl: Map<string, number>): number[] {
  const nv = panel.variables.length;
  const T = p.time.length;
  const ok = (k: number) => cols.every((j) => Number.isFinite(p.values[k * nv + j]));
  const rule = opt.skipRule ?? 'none';
  const out: number[] = [];
  const bump = (r: string) => excl.set(r, (excl.get(r) ?? 0) + 1);
  for (let k = 1; k < T; k++) {
    if (!ok(k) || !ok(k - 1)) { bump('a missing value at one of the two occasions'); continue; }
    if (opt.sameDay && p.day![k] !== p.day![k - 1]) { bump('across a night (same-day pairs only)'); continue; }
    if (rule === 'prompt') {
      const sameDay = !p.day || p.day[k] === p.day[k - 1];
      if (!sameDay || p.prompt![k] !== p.prompt![k - 1] + 1) { bump('across a skipped prompt'); continue; }
    } else if (rule !== 'none') {
      if (p.time[k] - p.time[k - 1] > rule.maxInterval) { bump(`longer than ${rule.maxInterval} ${panel.timeUnit} apart`); continue; }
    }
    out.push(k);
  }
  return out;
}

/** Solve the symmetric positive definite system by Cholesky; returns the inverse. */
function spdInverse(a: Float64Array, n: number): Float64Array {
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      if (i === j) {
        if (!(s > 0)) throw new Error('the lagged values are collinear (X′X is singular): a variable may be constant within persons, or there are too few lag pairs');
        l[i * n + i] = Math.sqrt(s);
      } else l[i * n + j] = s / l[j * n + j];
    }
  // inverse of L, then (L⁻¹)′L⁻¹
  const li = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    li[i * n + i] = 1 / l[i * n + i];
    for (let j = 0; j < i; j++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= l[i * n + k] * li[k * n + j];
      li[i * n + j] = s / l[i * n + i];
    }
  }
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < n; k++) s += li[k * n + i] * li[k * n + j];
      inv[i * n + j] = s;
    }
  return inv;
}

function partialFromCov(cov: number[][]): number[][] {
  const n = cov.length;
  try {
    const p = spdInverse(Float64Array.from(cov.flat()), n);
    return cov.map((_, i) => cov.map((__, j) => (i === j ? 1 : -p[i * n + j] / Math.sqrt(p[i * n + i] * p[j * n + j]))));
  } catch {
    return cov.map((row) => row.map(() => NaN));
  }
}

interface LsResult { phi: number[][]; se: number[][]; seCluster: number[][] | null; cov: number[][]; intercepts: Map<string, number[]> }

/**
 * Pooled LS on centred pairs. x rows: lagged values, y rows: current values,
 * both already centred; `group` the person of each pair.
 */
function pooledLs(x: Float64Array, y: Float64Array, group: Int32Array, m: number, n: number, groups: number, df: number): Omit<LsResult, 'intercepts'> {
  const xtx = new Float64Array(n * n);
  const xty = new Float64Array(n * n); // xty[a*n+i] = Σ x_a y_i
  for (let r = 0; r < m; r++) {
    const o = r * n;
    for (let a = 0; a < n; a++) {
      const xa = x[o + a];
      for (let b = 0; b < n; b++) xtx[a * n + b] += xa * x[o + b];
      for (let i = 0; i < n; i++) xty[a * n + i] += xa * y[o + i];
    }
  }
  const inv = spdInverse(xtx, n);
  const phi: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let a = 0; a < n; a++) s += inv[j * n + a] * xty[a * n + i];
      phi[i][j] = s;
    }
  const resid = new Float64Array(m * n);
  for (let r = 0; r < m; r++)
    for (let i = 0; i < n; i++) {
      let s = y[r * n + i];
      for (let j = 0; j < n; j++) s -= phi[i][j] * x[r * n + j];
      resid[r * n + i] = s;
    }
  const cov: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let r = 0; r < m; r++) for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) cov[i][k] += resid[r * n + i] * resid[r * n + k];
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) cov[i][k] /= df;
  const se = phi.map((row, i) => row.map((_, j) => Math.sqrt(cov[i][i] * inv[j * n + j])));
  let seCluster: number[][] | null = null;
  if (groups > 1) {
    seCluster = [];
    const c = (groups / (groups - 1)) * ((m - 1) / (m - n));
    for (let i = 0; i < n; i++) {
      // meat = Σ_g (X_g′u_g)(X_g′u_g)′ for equation i
      const meat = new Float64Array(n * n);
      const s = new Float64Array(n);
      let g = -1;
      const flush = () => { for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) meat[a * n + b] += s[a] * s[b]; s.fill(0); };
      for (let r = 0; r < m; r++) {
        if (group[r] !== g) { if (g >= 0) flush(); g = group[r]; }
        const u = resid[r * n + i];
        for (let a = 0; a < n; a++) s[a] += x[r * n + a] * u;
      }
      if (g >= 0) flush();
      const row: number[] = [];
      for (let j = 0; j < n; j++) {
        let v = 0;
        for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) v += inv[j * n + a] * meat[a * n + b] * inv[b * n + j];
        row.push(Math.sqrt(c * v));
      }
      seCluster.push(row);
    }
  }
  return { phi, se, seCluster, cov };
}

function meansOf(panel: Panel, p: PersonSeries, cols: number[]): number[] {
  const nv = panel.variables.length;
  return cols.map((j) => {
    let s = 0, c = 0;
    for (let k = 0; k < p.time.length; k++) { const v = p.values[k * nv + j]; if (Number.isFinite(v)) { s += v; c++; } }
    return c > 0 ? s / c : NaN;
  });
}

/**
 * Example: `fitVar(panel, { sameDay: true, skipRule: 'prompt', perPerson: true }).phi`.
 * Throws (with a message naming what is missing) when the options need day or prompt numbers the panel lacks, or there are too few pairs.
 */
export function fitVar(panel: Panel, opt: VarOptions = {}): VarFit {
  const vars = opt.variables ?? panel.variables;
  const cols = vars.map((v) => {
    const j = panel.variables.indexOf(v);
    if (j < 0) throw new Error(`variable "${v}" is not in the data (columns: ${panel.variables.join(', ')})`);
    return j;
  });
  const n = cols.length;
  if (n === 0) throw new Error('no variables to fit');
  const nv = panel.variables.length;
  const centre = opt.centre ?? 'person-mean';
  for (const p of panel.persons) {
    if (opt.sameDay && !p.day) throw new Error(`same-day pairs need day numbers, and person "${p.id}" has none: map a day column or derive days from dated times`);
    if (opt.skipRule === 'prompt' && !p.prompt) throw new Error(`the skipped-prompt rule needs prompt numbers, and person "${p.id}" has none: map a prompt column or use a maximum interval`);
  }
  const excl = new Map<string, number>();
  const sets: PairSet[] = panel.persons.map((p) => ({ person: p, idx: usablePairs(panel, p, cols, opt, excl) }));
  const used = sets.filter((s) => s.idx.length > 0);
  const m = used.reduce((a, s) => a + s.idx.length, 0);
  const warnings: string[] = [];
  const dfPool = centre === 'fixed-effects' ? m - n - used.length : m - n;
  if (dfPool <= 0) throw new Error(`too few usable lag pairs (${m}) for ${n} variables${excl.size ? ` (left out: ${[...excl].map(([r, c]) => `${c} ${r}`).join('; ')})` : ''}`);
  const x = new Float64Array(m * n), y = new Float64Array(m * n);
  const group = new Int32Array(m);
  const intercepts: { person: string; values: number[] }[] = [];
  const personMeans = panel.persons.map((p) => ({ person: p.id, values: meansOf(panel, p, cols) }));
  let r = 0;
  used.forEach((s, g) => {
    const p = s.person;
    let mx = new Array<number>(n).fill(0), my = new Array<number>(n).fill(0);
    if (centre === 'person-mean') {
      mx = meansOf(panel, p, cols);
      my = mx;
    } else {
      for (const k of s.idx) for (let a = 0; a < n; a++) { mx[a] += p.values[(k - 1) * nv + cols[a]]; my[a] += p.values[k * nv + cols[a]]; }
      mx = mx.map((v) => v / s.idx.length); my = my.map((v) => v / s.idx.length);
    }
    for (const k of s.idx) {
      for (let a = 0; a < n; a++) {
        x[r * n + a] = p.values[(k - 1) * nv + cols[a]] - mx[a];
        y[r * n + a] = p.values[k * nv + cols[a]] - my[a];
      }
      group[r] = g;
      r++;
    }
    if (centre === 'fixed-effects') intercepts.push({ person: p.id, values: my });
  });
  const ls = pooledLs(x, y, group, m, n, used.length, dfPool);
  if (centre === 'fixed-effects')
    for (const ic of intercepts) {
      const s = used.find((u) => u.person.id === ic.person)!;
      const p = s.person;
      const mx = new Array<number>(n).fill(0);
      for (const k of s.idx) for (let a = 0; a < n; a++) mx[a] += p.values[(k - 1) * nv + cols[a]] / s.idx.length;
      ic.values = ic.values.map((myi, i) => myi - ls.phi[i].reduce((acc, f, j) => acc + f * mx[j], 0));
    }
  if (used.length === 1 && centre === 'person-mean') warnings.push('one person: person-mean centring uses the mean of all occasions; the fixed-effects form is the ordinary VAR with a constant');
  const perPerson: PersonVar[] = [];
  if (opt.perPerson) {
    const minPairs = typeof opt.perPerson === 'object' ? opt.perPerson.minPairs ?? 20 : 20;
    for (const s of used) {
      if (s.idx.length < minPairs || s.idx.length - n - 1 <= 0) continue;
      const one = fitVar({ ...panel, persons: [s.person] }, { ...opt, perPerson: false, centre: 'fixed-effects', variables: vars });
      perPerson.push({ person: s.person.id, pairs: s.idx.length, phi: one.phi, intercept: one.intercepts![0].values, se: one.se.phi, residualCov: one.residualCov });
    }
  }
  const bm = personMeans.filter((p) => p.values.every(Number.isFinite));
  const between = { means: personMeans, cov: covarianceOf(bm.map((p) => p.values), n) };
  const occasions = panel.persons.reduce((a, p) => a + p.time.length, 0);
  return {
    method: 'var',
    variables: vars,
    phi: ls.phi,
    se: { phi: ls.se, phiCluster: ls.seCluster },
    residualCov: ls.cov,
    residualPartial: partialFromCov(ls.cov),
    ...(centre === 'fixed-effects' ? { intercepts } : {}),
    between,
    n: { persons: used.length, occasions, pairs: m, parametersPerEquation: centre === 'fixed-effects' ? n + 1 : n },
    excluded: [...excl].map(([reason, pairs]) => ({ reason, pairs })),
    perPerson,
    warnings,
  };
}

function covarianceOf(rows: number[][], n: number): number[][] {
  const c = Array.from({ length: n }, () => new Array<number>(n).fill(rows.length > 1 ? 0 : NaN));
  if (rows.length < 2) return c;
  const mean = new Array<number>(n).fill(0);
  for (const r of rows) for (let i = 0; i < n; i++) mean[i] += r[i] / rows.length;
  for (const r of rows) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) c[i][j] += ((r[i] - mean[i]) * (r[j] - mean[j])) / (rows.length - 1);
  return c;
}
