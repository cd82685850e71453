/**
 * Continuous-time model fitted by maximum likelihood of the exact discrete
 * model over each person's own intervals.
 *
 * Within person p, the states η follow dη = A η dt + G dW; over an interval
 * Δ, η(t+Δ) = Φ(Δ) η(t) + w, Φ = e^{AΔ}, w ~ N(0, Q(Δ)). Each measured
 * variable j reads one state: y_j = η_s(j) + μ_j + τ_pj + ε_j with the levels
 * μ, person differences in level τ_p ~ N(0, Ψ) (random intercepts: the
 * between-person part, kept apart from the within-person dynamics so trait
 * differences do not pass as slow dynamics) and measurement error
 * ε ~ N(0, diag(r)). States no column measures are latent (their diffusion is
 * fixed to 1 to set their scale). The likelihood comes from a Kalman filter
 * over every occasion, skipping missing cells (Harvey 1989, Forecasting,
 * Structural Time Series Models and the Kalman Filter, §3.4; the continuous
 * form as in Oud & Jansen 2000, Psychometrika 65(2), 199–215).
 *
 * Q(Δ) = Σ − Φ Σ Φ′ with the stationary covariance Σ (A Σ + Σ A′ + G G′ = 0)
 * when A is stable: it stays positive semidefinite across long gaps, where
 * the block exponential of Van Loan's method loses it. Otherwise Van Loan at
 * a short step, doubled (`vanLoan`).
 *
 * Parameter vector (the order `parameterNames` lists):
 *   drift entries that are free, row by row (A_ij: effect of state j on the rate of state i);
 *   diffusion: Cholesky factor L of G G′ of the measured states, lower triangle row by row (log of diagonal entries);
 *   levels μ_j; measurement error log SD_j (with `measurementError`);
 *   random intercepts: Cholesky factor of Ψ, lower triangle (log diagonal);
 *   free initial state: mean m0 (one per state), Cholesky factor of its covariance (log diagonal).
 */
import type { VariableId } from '../model/types';
import type { Panel } from '../data/panel';
import { expm, vanLoan } from '../numeric/expm';
import { eigen, eigenvalues, fromRows, type Mat } from '../numeric/dense';
import { lyapunov } from '../numeric/lyapunov';
import { hessian, minimize } from './optimize';

export interface CtOptions {
  /** Process states (default: the panel's variables). States not in the panel are latent. */
  states?: VariableId[];
  /** Which drift entries are free: free[i][j] for the effect of state j on state i (default: all). */
  free?: boolean[][];
  /** 'free': initial mean and covariance estimated (default); 'stationary': the stationary distribution of a stable drift. */
  initial?: 'free' | 'stationary';
  /** 'random': person differences in level with covariance Ψ (default); 'common': one level for everyone. */
  intercepts?: 'random' | 'common';
  /** Estimate measurement-error variances (default false). */
  measurementError?: boolean;
  /** 'full' (default) or 'diagonal' diffusion. */
  diffusion?: 'full' | 'diagonal';
  /** Starting parameter vector in the documented order (default: from the data). */
  start?: number[];
  maxIterations?: number;
  /** Skip standard errors (faster, e.g. for starting values). */
  noStandardErrors?: boolean;
  /** Hears each optimiser iteration (its number and −2LL), e.g. for a progress bar. */
  onIteration?: (iteration: number, minus2LL: number) => void;
}

export interface CtSpec {
  states: VariableId[];
  /** Panel column of each measured state, −1 for latent states. */
  column: number[];
  /** Measured variables, in panel order used by the fit. */
  measured: VariableId[];
  /** State index each measured variable reads. */
  reads: number[];
  free: boolean[][];
  initial: 'free' | 'stationary';
  intercepts: 'random' | 'common';
  measurementError: boolean;
  diffusion: 'full' | 'diagonal';
}

export interface CtEstimate {
  name: string;
  estimate: number;
  se: number;
  low: number;
  high: number;
}

export interface CtFit {
  method: 'ct';
  states: VariableId[];
  measured: VariableId[];
  latent: VariableId[];
  drift: number[][];
  /** G G′. */
  diffusion: number[][];
  /** Levels μ of the measured variables. */
  intercepts: number[];
  /** Between-person covariance Ψ of the levels (random intercepts), else null. */
  between: number[][] | null;
  measurementError: number[] | null;
  initial: { kind: 'free' | 'stationary'; mean: number[] | null; cov: number[][] | null };
  se: { drift: number[][]; intercepts: number[] };
  /** Every free parameter (drift entries, levels on their own scale; others on the optimiser's scale) with SE and 95 % interval. */
  estimates: CtEstimate[];
  minus2LL: number;
  parameters: number;
  aic: number;
  /** −2LL + k ln(number of persons) (persons are the independent units). */
  bic: number;
  n: { persons: number; occasions: number; observed: number };
  /** Timescales from the fitted drift: 1/|Re λ| per eigenvalue. */
  timescales: { re: number; im: number; timescale: number }[];
  converged: boolean;
  iterations: number;
  warnings: string[];
  spec: CtSpec;
  theta: number[];
}

const Z95 = 1.959963984540054;

/** Names of the parameters in the documented order. */
export function parameterNames(spec: CtSpec): string[] {
  const names: string[] = [];
  const n = spec.states.length, m = spec.measured.length;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (spec.free[i][j]) names.push(`drift ${spec.states[j]}→${spec.states[i]}`);
  for (let i = 0; i < n; i++) {
    if (spec.column[i] < 0) continue;
    for (let j = 0; j <= i; j++) {
      if (spec.column[j] < 0) continue;
      if (j < i && spec.diffusion === 'diagonal') continue;
      names.push(j === i ? `diffusion log L ${spec.states[i]}` : `diffusion L ${spec.states[i]},${spec.states[j]}`);
    }
  }
  for (let j = 0; j < m; j++) names.push(`level ${spec.measured[j]}`);
  if (spec.measurementError) for (let j = 0; j < m; j++) names.push(`error log SD ${spec.measured[j]}`);
  if (spec.intercepts === 'random') for (let i = 0; i < m; i++) for (let j = 0; j <= i; j++) names.push(i === j ? `between log L ${spec.measured[i]}` : `between L ${spec.measured[i]},${spec.measured[j]}`);
  if (spec.initial === 'free') {
    for (let i = 0; i < n; i++) names.push(`initial mean ${spec.states[i]}`);
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) names.push(i === j ? `initial log L ${spec.states[i]}` : `initial L ${spec.states[i]},${spec.states[j]}`);
  }
  return names;
}

export interface CtParameters {
  A: Float64Array; // n×n
  GG: Float64Array; // n×n
  mu: Float64Array; // m
  r: Float64Array; // m, error variances
  psi: Float64Array | null; // m×m
  m0: Float64Array | null;
  P0: Float64Array | null;
}

/** Parameter vector → matrices. */
export function unpack(spec: CtSpec, theta: ArrayLike<number>): CtParameters {
  const n = spec.states.length, m = spec.measured.length;
  let k = 0;
  const A = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (spec.free[i][j]) A[i * n + j] = theta[k++];
  const L = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    if (spec.column[i] < 0) { L[i * n + i] = 1; continue; }
    for (let j = 0; j <= i; j++) {
      if (spec.column[j] < 0) continue;
      if (j < i && spec.diffusion === 'diagonal') continue;
      L[i * n + j] = j === i ? Math.exp(theta[k++]) : theta[k++];
    }
  }
  const GG = lowerTimesTranspose(L, n);
  const mu = new Float64Array(m);
  for (let j = 0; j < m; j++) mu[j] = theta[k++];
  const r = new Float64Array(m);
  if (spec.measurementError) for (let j = 0; j < m; j++) r[j] = Math.exp(2 * theta[k++]);
  let psi: Float64Array | null = null;
  if (spec.intercepts === 'random') {
    const Lp = new Float64Array(m * m);
    for (let i = 0; i < m; i++) for (let j = 0; j <= i; j++) Lp[i * m + j] = i === j ? Math.exp(theta[k++]) : theta[k++];
    psi = lowerTimesTranspose(Lp, m);
  }
  let m0: Float64Array | null = null, P0: Float64Array | null = null;
  if (spec.initial === 'free') {
    m0 = new Float64Array(n);
    for (let i = 0; i < n; i++) m0[i] = theta[k++];
    const Lq = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) Lq[i * n + j] = i === j ? Math.exp(theta[k++]) : theta[k++];
    P0 = lowerTimesTranspose(Lq, n);
  }
  return { A, GG, mu, r, psi, m0, P0 };
}

function lowerTimesTranspose(L: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = 0; k <= j; k++) s += L[i * n + k] * L[j * n + k];
      out[i * n + j] = s; out[j * n + i] = s;
    }
  return out;
}

const mat = (data: Float64Array, n: number): Mat => ({ rows: n, cols: n, data });

/** −2 log-likelihood of the panel under the parameters (Infinity where undefined: an unstable drift with a stationary start). */
export function ctMinus2LL(panel: Panel, spec: CtSpec, theta: ArrayLike<number>): number {
  const par = unpack(spec, theta);
  for (const v of theta as number[]) if (!Number.isFinite(v)) return Infinity;
  const n = spec.states.length, m = spec.measured.length;
  const A = mat(par.A, n), GG = mat(par.GG, n);
  const ev = eigenvalues(A);
  let stable = true;
  for (let i = 0; i < n; i++) if (!(ev.re[i] < -1e-10)) stable = false;
  let sigma: Float64Array | null = null;
  if (stable) {
    const ly = lyapunov(A, GG);
    if (ly.ok) sigma = ly.sigma.data;
  }
  if (spec.initial === 'stationary' && !sigma) return Infinity;
  const d = n + (par.psi ? m : 0);
  const cache = new Map<number, { phi: Float64Array; q: Float64Array }>();
  const spectral = spectralExp(par.A, n);
  const transition = (dt: number) => {
    let t = cache.get(dt);
    if (t) return t;
    const phi = spectral ? spectral(dt) : expm({ rows: n, cols: n, data: par.A.map((v) => v * dt) }).data;
    let q: Float64Array;
    if (sigma) {
      // Q = Σ − Φ Σ Φ′
      const ps = matMul(phi, sigma, n);
      q = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) { let s = 0; for (let k = 0; k < n; k++) s += ps[i * n + k] * phi[j * n + k]; const v = sigma[i * n + j] - s; q[i * n + j] = v; q[j * n + i] = v; }
    } else q = vanLoan(A, GG, dt).q.data;
    t = { phi, q };
    if (cache.size < 100000) cache.set(dt, t);
    return t;
  };
  const nv = panel.variables.length;
  const LOG2PI = Math.log(2 * Math.PI);
  let total = 0;
  const a = new Float64Array(d), P = new Float64Array(d * d);
  const an = new Float64Array(d), Pn = new Float64Array(d * d);
  const obs = new Int32Array(m);
  const v = new Float64Array(m), F = new Float64Array(m * m), ZP = new Float64Array(m * d);
  const FiZP = new Float64Array(m * d), col = new Float64Array(m);
  for (const person of panel.persons) {
    a.fill(0); P.fill(0);
    if (spec.initial === 'free') {
      for (let i = 0; i < n; i++) { a[i] = par.m0![i]; for (let j = 0; j < n; j++) P[i * d + j] = par.P0![i * n + j]; }
    } else for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) P[i * d + j] = sigma![i * n + j];
    if (par.psi) for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) P[(n + i) * d + n + j] = par.psi[i * m + j];
    const T = person.time.length;
    for (let k = 0; k < T; k++) {
      if (k > 0) {
        const { phi, q } = transition(person.time[k] - person.time[k - 1]);
        // a_η ← Φ a_η; P ← [[Φ Pηη Φ′ + Q, Φ Pητ], [Pτη Φ′, Pττ]]
        for (let i = 0; i < n; i++) { let s = 0; for (let j = 0; j < n; j++) s += phi[i * n + j] * a[j]; an[i] = s; }
        for (let i = 0; i < n; i++) a[i] = an[i];
        // Pn = Φ P[η rows, all cols]
        for (let i = 0; i < n; i++) for (let c = 0; c < d; c++) { let s = 0; for (let j = 0; j < n; j++) s += phi[i * n + j] * P[j * d + c]; Pn[i * d + c] = s; }
        for (let i = n; i < d; i++) for (let c = 0; c < d; c++) Pn[i * d + c] = P[i * d + c];
        // P = Pn · blockdiag(Φ′, I)
        for (let r = 0; r < d; r++) {
          for (let j = 0; j < n; j++) { let s = 0; for (let c = 0; c < n; c++) s += Pn[r * d + c] * phi[j * n + c]; P[r * d + j] = s; }
          for (let c = n; c < d; c++) P[r * d + c] = Pn[r * d + c];
        }
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) P[i * d + j] += q[i * n + j];
      }
      let p = 0;
      for (let j = 0; j < m; j++) if (Number.isFinite(person.values[k * nv + spec.column[spec.reads[j]]])) obs[p++] = j;
      if (p === 0) continue;
      // v = y − (a_η[s] + a_τ[j] + μ_j); ZP rows; F = Z P Z′ + R
      for (let u = 0; u < p; u++) {
        const j = obs[u], s = spec.reads[j];
        v[u] = person.values[k * nv + spec.column[s]] - a[s] - par.mu[j] - (par.psi ? a[n + j] : 0);
        for (let c = 0; c < d; c++) ZP[u * d + c] = P[s * d + c] + (par.psi ? P[(n + j) * d + c] : 0);
      }
      for (let u = 0; u < p; u++) {
        const j2 = obs[u], s2 = spec.reads[j2];
        for (let w = 0; w < p; w++) F[u * p + w] = ZP[w * d + s2] + (par.psi ? ZP[w * d + n + j2] : 0);
        F[u * p + u] += par.r[j2];
      }
      // Cholesky of F
      const Lf = cholesky(F.subarray(0, p * p), p);
      if (!Lf) return Infinity;
      let logdet = 0;
      for (let u = 0; u < p; u++) logdet += 2 * Math.log(Lf[u * p + u]);
      // Finv v and Finv ZP via the factor
      const fv = cholSolve(Lf, p, v.subarray(0, p));
      let quad = 0;
      for (let u = 0; u < p; u++) quad += v[u] * fv[u];
      total += p * LOG2PI + logdet + quad;
      // a += (ZP)′ F⁻¹ v ; P −= (ZP)′ F⁻¹ ZP
      for (let c = 0; c < d; c++) { let s = 0; for (let u = 0; u < p; u++) s += ZP[u * d + c] * fv[u]; a[c] += s; }
      for (let c = 0; c < d; c++) {
        for (let u = 0; u < p; u++) col[u] = ZP[u * d + c];
        const x = cholSolve(Lf, p, col.subarray(0, p));
        for (let u = 0; u < p; u++) FiZP[u * d + c] = x[u];
      }
      for (let r = 0; r < d; r++)
        for (let c = 0; c <= r; c++) {
          let s = 0;
          for (let u = 0; u < p; u++) s += ZP[u * d + r] * FiZP[u * d + c];
          const val = P[r * d + c] - s;
          P[r * d + c] = val; P[c * d + r] = val;
        }
    }
  }
  return Number.isFinite(total) ? total : Infinity;
}

/**
 * e^{AΔ} = V e^{ΛΔ} V⁻¹ from one eigendecomposition of A, for many Δ at the
 * cost of a few n×n products each; null when A is not safely diagonalisable
 * (the reconstruction V Λ V⁻¹ misses A by more than 1e-10 relative), and then
 * each Δ takes the Padé exponential.
 */
function spectralExp(a: Float64Array, n: number): ((dt: number) => Float64Array) | null {
  let e;
  try { e = eigen({ rows: n, cols: n, data: a }); } catch { return null; }
  // Complex V (re, im) from the real packing.
  const vr = new Float64Array(n * n), vi = new Float64Array(n * n);
  const V = e.vectors.data;
  for (let k = 0; k < n; k++) {
    if (e.im[k] > 0 && k + 1 < n) {
      for (let i = 0; i < n; i++) { vr[i * n + k] = V[i * n + k]; vi[i * n + k] = V[i * n + k + 1]; vr[i * n + k + 1] = V[i * n + k]; vi[i * n + k + 1] = -V[i * n + k + 1]; }
      k++;
    } else for (let i = 0; i < n; i++) vr[i * n + k] = V[i * n + k];
  }
  // Invert V by complex Gauss–Jordan with partial pivoting.
  const ar = vr.slice(), ai = vi.slice();
  const wr = new Float64Array(n * n), wi = new Float64Array(n * n);
  for (let i = 0; i < n; i++) wr[i * n + i] = 1;
  for (let c = 0; c < n; c++) {
    let piv = c, best = 0;
    for (let r = c; r < n; r++) { const m2 = ar[r * n + c] ** 2 + ai[r * n + c] ** 2; if (m2 > best) { best = m2; piv = r; } }
    if (!(best > 1e-300)) return null;
    if (piv !== c) for (let j = 0; j < n; j++) {
      for (const arr of [ar, ai, wr, wi]) { const t = arr[c * n + j]; arr[c * n + j] = arr[piv * n + j]; arr[piv * n + j] = t; }
    }
    const pr = ar[c * n + c], pi = ai[c * n + c], den = pr * pr + pi * pi;
    const ir = pr / den, ii = -pi / den;
    for (let j = 0; j < n; j++) {
      let xr = ar[c * n + j], xi = ai[c * n + j];
      ar[c * n + j] = xr * ir - xi * ii; ai[c * n + j] = xr * ii + xi * ir;
      xr = wr[c * n + j]; xi = wi[c * n + j];
      wr[c * n + j] = xr * ir - xi * ii; wi[c * n + j] = xr * ii + xi * ir;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const fr = ar[r * n + c], fi = ai[r * n + c];
      if (fr === 0 && fi === 0) continue;
      for (let j = 0; j < n; j++) {
        ar[r * n + j] -= fr * ar[c * n + j] - fi * ai[c * n + j]; ai[r * n + j] -= fr * ai[c * n + j] + fi * ar[c * n + j];
        wr[r * n + j] -= fr * wr[c * n + j] - fi * wi[c * n + j]; wi[r * n + j] -= fr * wi[c * n + j] + fi * wr[c * n + j];
      }
    }
  }
  const lr = e.re, li = e.im;
  const build = (fr: (k: number) => number, fi: (k: number) => number) => {
    const out = new Float64Array(n * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let k = 0; k < n; k++) {
          // Re(V_ik f_k W_kj)
          const xr = vr[i * n + k] * fr(k) - vi[i * n + k] * fi(k), xi = vr[i * n + k] * fi(k) + vi[i * n + k] * fr(k);
          s += xr * wr[k * n + j] - xi * wi[k * n + j];
        }
        out[i * n + j] = s;
      }
    return out;
  };
  // Check: V Λ V⁻¹ reproduces A, and V is not close to singular.
  const back = build((k) => lr[k], (k) => li[k]);
  let err = 0, nrm = 0, cond = 0;
  for (let i = 0; i < n * n; i++) { err = Math.max(err, Math.abs(back[i] - a[i])); nrm = Math.max(nrm, Math.abs(a[i])); cond = Math.max(cond, Math.abs(wr[i]) + Math.abs(wi[i])); }
  if (!(err <= 1e-10 * Math.max(nrm, 1e-300)) || cond > 1e6) return null;
  return (dt) => build((k) => Math.exp(lr[k] * dt) * Math.cos(li[k] * dt), (k) => Math.exp(lr[k] * dt) * Math.sin(li[k] * dt));
}

function matMul(a: Float64Array, b: Float64Array, n: number): Float64Array {
  const c = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) { const aik = a[i * n + k]; for (let j = 0; j < n; j++) c[i * n + j] += aik * b[k * n + j]; }
  return c;
}

function cholesky(F: Float64Array, p: number): Float64Array | null {
  const L = new Float64Array(p * p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j <= i; j++) {
      let s = F[i * p + j];
      for (let k = 0; k < j; k++) s -= L[i * p + k] * L[j * p + k];
      if (i === j) { if (!(s > 0)) return null; L[i * p + i] = Math.sqrt(s); } else L[i * p + j] = s / L[j * p + j];
    }
  return L;
}

function cholSolve(L: Float64Array, p: number, b: ArrayLike<number>): Float64Array {
  const y = new Float64Array(p);
  for (let i = 0; i < p; i++) { let s = b[i]; for (let k = 0; k < i; k++) s -= L[i * p + k] * y[k]; y[i] = s / L[i * p + i]; }
  for (let i = p - 1; i >= 0; i--) { let s = y[i]; for (let k = i + 1; k < p; k++) s -= L[k * p + i] * y[k]; y[i] = s / L[i * p + i]; }
  return y;
}

/** The fit's structure from the panel and the options (throws with a message naming what is wrong). */
export function ctSpec(panel: Panel, opt: CtOptions = {}): CtSpec {
  const states = opt.states ?? panel.variables;
  const n = states.length;
  if (n === 0) throw new Error('no states to fit');
  const column = states.map((s) => panel.variables.indexOf(s));
  if (column.every((c) => c < 0)) throw new Error(`no state is measured: the data have ${panel.variables.join(', ')}; the states are ${states.join(', ')}`);
  const free = opt.free ?? states.map(() => states.map(() => true));
  if (free.length !== n || free.some((r) => r.length !== n)) throw new Error(`the free pattern of the drift must be ${n}×${n}`);
  const reads: number[] = [], measured: VariableId[] = [];
  column.forEach((c, i) => { if (c >= 0) { reads.push(i); measured.push(states[i]); } });
  return { states, column, measured, reads, free, initial: opt.initial ?? 'free', intercepts: opt.intercepts ?? 'random', measurementError: opt.measurementError ?? false, diffusion: opt.diffusion ?? 'full' };
}

/** Starting values from the data: diagonal drift from lag-one autocorrelations at the median interval, diffusion and levels from the within- and between-person spread. */
export function ctStart(panel: Panel, spec: CtSpec): number[] {
  const n = spec.states.length, m = spec.measured.length;
  const nv = panel.variables.length;
  const gaps: number[] = [];
  for (const p of panel.persons) for (let k = 1; k < p.time.length; k++) gaps.push(p.time[k] - p.time[k - 1]);
  gaps.sort((x, y) => x - y);
  const med = gaps.length ? gaps[gaps.length >> 1] : 1;
  const within = new Array<number>(m).fill(0), mean = new Array<number>(m).fill(0), ac = new Array<number>(m).fill(0);
  const pmeans: number[][] = [];
  spec.reads.forEach((s, j) => {
    const c = spec.column[s];
    let sx = 0, cnt = 0, ss = 0, cross = 0, cc = 0;
    const personMeans: number[] = [];
    for (const p of panel.persons) {
      let ps = 0, pc = 0;
      for (let k = 0; k < p.time.length; k++) { const y = p.values[k * nv + c]; if (Number.isFinite(y)) { ps += y; pc++; } }
      const pm = pc ? ps / pc : 0;
      if (pc) personMeans.push(pm);
      sx += ps; cnt += pc;
      for (let k = 0; k < p.time.length; k++) {
        const y = p.values[k * nv + c];
        if (!Number.isFinite(y)) continue;
        ss += (y - pm) ** 2;
        if (k > 0) { const y0 = p.values[(k - 1) * nv + c]; if (Number.isFinite(y0)) { cross += (y - pm) * (y0 - pm); cc++; } }
      }
    }
    mean[j] = cnt ? sx / cnt : 0;
    within[j] = cnt > 1 ? ss / cnt : 1;
    ac[j] = cc && ss ? (cross / cc) / (ss / cnt) : 0.5;
    pmeans.push(personMeans);
  });
  const theta: number[] = [];
  const decay = (i: number) => {
    const j = spec.reads.indexOf(i);
    const r = j >= 0 ? Math.min(0.9, Math.max(0.1, ac[j])) : 0.5;
    return Math.log(r) / med;
  };
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (spec.free[i][j]) theta.push(i === j ? decay(i) : 0);
  for (let i = 0; i < n; i++) {
    if (spec.column[i] < 0) continue;
    for (let j = 0; j <= i; j++) {
      if (spec.column[j] < 0) continue;
      if (j < i && spec.diffusion === 'diagonal') continue;
      const jm = spec.reads.indexOf(i);
      theta.push(j === i ? 0.5 * Math.log(Math.max(1e-8, 2 * Math.abs(decay(i)) * within[jm])) : 0);
    }
  }
  for (let j = 0; j < m; j++) theta.push(mean[j]);
  if (spec.measurementError) for (let j = 0; j < m; j++) theta.push(0.5 * Math.log(Math.max(1e-8, 0.1 * within[j])));
  if (spec.intercepts === 'random')
    for (let i = 0; i < m; i++)
      for (let j = 0; j <= i; j++) {
        if (i !== j) { theta.push(0); continue; }
        const pm = pmeans[i];
        const mu = pm.reduce((s, x) => s + x, 0) / Math.max(1, pm.length);
        const v = pm.reduce((s, x) => s + (x - mu) ** 2, 0) / Math.max(1, pm.length - 1);
        theta.push(0.5 * Math.log(Math.max(1e-4 * within[i], v)));
      }
  if (spec.initial === 'free') {
    for (let i = 0; i < n; i++) theta.push(0);
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) { const jm = spec.reads.indexOf(i); theta.push(i === j ? 0.5 * Math.log(jm >= 0 ? Math.max(1e-8, within[jm]) : 1) : 0); }
  }
  return theta;
}

/**
 * Example: `fitCt(panel, { initial: 'stationary', intercepts: 'random' })`.
 * With `free` from the sketch this is the confirmatory fit; without, the open fit.
 */
export function fitCt(panel: Panel, opt: CtOptions = {}): CtFit {
  const spec = ctSpec(panel, opt);
  const names = parameterNames(spec);
  const theta0 = opt.start ?? ctStart(panel, spec);
  if (theta0.length !== names.length) throw new Error(`the start vector has ${theta0.length} values; this model has ${names.length} parameters (${names.join(', ')})`);
  const f = (th: number[]) => ctMinus2LL(panel, spec, th);
  const res = minimize(f, theta0, { maxIterations: opt.maxIterations ?? 400, onIteration: opt.onIteration });
  const warnings: string[] = [];
  if (!Number.isFinite(res.f)) throw new Error(`the likelihood is not defined at the starting values (${res.message}); try initial 'free' or other starting values`);
  if (!res.converged) warnings.push(`the optimiser stopped before converging (${res.message}, ${res.iterations} iterations)`);
  const k = names.length;
  let se = new Array<number>(k).fill(NaN);
  if (!opt.noStandardErrors) {
    const H = hessian(f, res.x);
    const cov = invertSymmetric(H);
    if (!cov) warnings.push('the Hessian at the optimum is singular: some parameters are not identified by these data (standard errors not shown)');
    else {
      se = cov.map((row, i) => Math.sqrt(2 * row[i]));
      if (se.some((s) => !Number.isFinite(s))) warnings.push('the Hessian at the optimum is not positive definite (a boundary or a saddle): some standard errors are missing');
    }
  }
  const par = unpack(spec, res.x);
  const n = spec.states.length, m = spec.measured.length;
  const rows = (a: Float64Array, r: number) => Array.from({ length: r }, (_, i) => Array.from(a.subarray(i * r, (i + 1) * r)));
  const driftSe = spec.states.map(() => spec.states.map(() => 0));
  let idx = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (spec.free[i][j]) driftSe[i][j] = se[idx++];
  const muStart = names.findIndex((x) => x.startsWith('level '));
  const estimates = names.map((name, i) => ({ name, estimate: res.x[i], se: se[i], low: res.x[i] - Z95 * se[i], high: res.x[i] + Z95 * se[i] }));
  const ev = eigenvalues(fromRows(rows(par.A, n)));
  const timescales = Array.from(ev.re, (re, i) => ({ re, im: ev.im[i], timescale: re !== 0 ? 1 / Math.abs(re) : Infinity }));
  if (timescales.some((t) => t.re >= 0)) warnings.push('the fitted drift is not stable (an eigenvalue with non-negative real part): a state does not return to its level; consider the tests for non-stationary series');
  const occasions = panel.persons.reduce((s, p) => s + p.time.length, 0);
  let observed = 0;
  for (const p of panel.persons) for (let kk = 0; kk < p.time.length; kk++) for (const s of spec.reads) if (Number.isFinite(p.values[kk * panel.variables.length + spec.column[s]])) observed++;
  return {
    method: 'ct',
    states: spec.states,
    measured: spec.measured,
    latent: spec.states.filter((_, i) => spec.column[i] < 0),
    drift: rows(par.A, n),
    diffusion: rows(par.GG, n),
    intercepts: Array.from(par.mu),
    between: par.psi ? rows(par.psi, m) : null,
    measurementError: spec.measurementError ? Array.from(par.r) : null,
    initial: { kind: spec.initial, mean: par.m0 ? Array.from(par.m0) : null, cov: par.P0 ? rows(par.P0, n) : null },
    se: { drift: driftSe, intercepts: se.slice(muStart, muStart + m) },
    estimates,
    minus2LL: res.f,
    parameters: k,
    aic: res.f + 2 * k,
    bic: res.f + k * Math.log(panel.persons.length),
    n: { persons: panel.persons.length, occasions, observed },
    timescales,
    converged: res.converged,
    iterations: res.iterations,
    warnings,
    spec,
    theta: res.x,
  };
}

function invertSymmetric(H: number[][]): number[][] | null {
  const n = H.length;
  const a = H.map((r) => r.slice());
  const inv = H.map((_, i) => H.map((__, j) => (i === j ? 1 : 0)));
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    if (!(Math.abs(a[piv][c]) > 1e-300)) return null;
    [a[c], a[piv]] = [a[piv], a[c]]; [inv[c], inv[piv]] = [inv[piv], inv[c]];
    const d = a[c][c];
    for (let j = 0; j < n; j++) { a[c][j] /= d; inv[c][j] /= d; }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = a[r][c];
      if (f === 0) continue;
      for (let j = 0; j < n; j++) { a[r][j] -= f * a[c][j]; inv[r][j] -= f * inv[c][j]; }
    }
  }
  return inv;
}
