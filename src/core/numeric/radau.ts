/**
 * A stiff integrator: the 3-stage Radau IIA method of order 5 with an
 * embedded third-order error estimate, simplified Newton iterations on the
 * transformed (one real + one complex) linear systems, predictive step-size
 * control and the collocation polynomial as dense output.
 *
 * Source: Hairer & Wanner, Solving Ordinary Differential Equations II
 * (2nd ed., Springer 1996), Sec. IV.5 (Radau IIA, the transformation to
 * real/complex systems), IV.8 (Newton termination, error estimate (8.19)–(8.20),
 * the predictive controller of Gustafsson (8.25)). The constants below are
 * the method's (c, the eigen-decomposition T Λ T⁻¹ of the inverse Butcher
 * matrix, the error weights and the collocation interpolation) as tabulated there.
 */
import { luFactorInPlace, luSolveInto, zeros, type Mat } from './dense';

const S6 = Math.sqrt(6);
const C = [(4 - S6) / 10, (4 + S6) / 10, 1];
const E = [(-13 - 7 * S6) / 3, (-13 + 7 * S6) / 3, -1 / 3];
const MU_REAL = 3 + 3 ** (2 / 3) - 3 ** (1 / 3);
const MU_COMPLEX_RE = 3 + 0.5 * (3 ** (1 / 3) - 3 ** (2 / 3));
const MU_COMPLEX_IM = -0.5 * (3 ** (5 / 6) + 3 ** (7 / 6));
const T = [
  [0.09443876248897524, -0.14125529502095421, 0.03002919410514742],
  [0.25021312296533332, 0.20412935229379994, -0.38294211275726192],
  [1, 1, 0],
];
const TI = [
  [4.17871859155190428, 0.32768282076106237, 0.52337644549944951],
  [-4.17871859155190428, -0.32768282076106237, 0.47662355450055044],
  [0.50287263494578682, -2.57192694985560522, 0.59603920482822492],
];
// y(t_old + x h) = y_old + Σ_k (Σ_i Z_i P_ik) x^{k+1}: the collocation polynomial through the stages.
const P = [
  [13 / 3 + (7 * S6) / 3, -23 / 3 - (22 * S6) / 3, 10 / 3 + 5 * S6],
  [13 / 3 - (7 * S6) / 3, -23 / 3 + (22 * S6) / 3, 10 / 3 - 5 * S6],
  [1 / 3, -8 / 3, 10 / 3],
];
const NEWTON_MAXITER = 6;
const NEWTON_KAPPA = 0.01;
const MIN_FACTOR = 0.2;
const MAX_FACTOR = 10;

export interface OdeProblem {
  n: number;
  /** dy/dt at (t, y), written into dy. */
  rhs(t: number, y: Float64Array, dy: Float64Array): void;
  /** ∂f/∂y into J (row-major n×n). Without it, forward differences are used. */
  jacobian?(t: number, y: Float64Array, J: Mat): void;
}

export interface IntegrateOptions {
  rtol?: number;
  atol?: number | Float64Array;
  maxStep?: number;
  firstStep?: number;
  /** Safety cap on accepted + rejected steps. Default 1e6. */
  maxSteps?: number;
  /** Called after every accepted step with the time reached. */
  onProgress?(t: number): void;
  /** Checked between steps; when it returns true the integration stops with status "cancelled". */
  shouldStop?(): boolean;
}

export interface IntegrateResult {
  status: 'done' | 'cancelled' | 'failed';
  message?: string;
  /** The requested output times that were reached. */
  times: number[];
  /** The solution at each of those times. */
  values: Float64Array[];
  stats: { nfev: number; njev: number; nlu: number; steps: number; rejected: number };
}

function rmsNorm(x: Float64Array, scale: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) {
    const r = x[i] / scale[i];
    s += r * r;
  }
  return Math.sqrt(s / Math.max(1, x.length));
}

interface RealLU { lu: Float64Array; perm: Int32Array; ok: boolean }
interface ComplexLU { re: Float64Array; im: Float64Array; perm: Int32Array; ok: boolean }

/** The real iteration matrix, factored in place by the dense kernel (dense.ts). */
function luReal(a: Float64Array, n: number): RealLU {
  const perm = new Int32Array(n);
  return { lu: a, perm, ok: !luFactorInPlace(a, n, perm).singular };
}

function solveReal(f: RealLU, b: Float64Array, n: number, x: Float64Array): void {
  luSolveInto(f.lu, f.perm, n, b, x);
}

/**
 * The complex iteration matrix: the same partial pivoting in complex
 * arithmetic on split real and imaginary parts (dense.ts has no complex
 * kernel, and a complex type would allocate in the inner loop).
 */
function luComplex(re: Float64Array, im: Float64Array, n: number): ComplexLU {
  const perm = new Int32Array(n);
  let ok = true;
  for (let i = 0; i < n; i++) perm[i] = i;
  for (let k = 0; k < n; k++) {
    let p = k, best = Math.hypot(re[k * n + k], im[k * n + k]);
    for (let i = k + 1; i < n; i++) { const v = Math.hypot(re[i * n + k], im[i * n + k]); if (v > best) { best = v; p = i; } }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        let t = re[k * n + j]; re[k * n + j] = re[p * n + j]; re[p * n + j] = t;
        t = im[k * n + j]; im[k * n + j] = im[p * n + j]; im[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const dr = re[k * n + k], di = im[k * n + k];
    const dd = dr * dr + di * di;
    if (dd === 0 || !Number.isFinite(dd)) { ok = false; continue; }
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k], ai = im[i * n + k];
      const fr = (ar * dr + ai * di) / dd, fi = (ai * dr - ar * di) / dd;
      re[i * n + k] = fr; im[i * n + k] = fi;
      if (fr === 0 && fi === 0) continue;
      for (let j = k + 1; j < n; j++) {
        const br = re[k * n + j], bi = im[k * n + j];
        re[i * n + j] -= fr * br - fi * bi;
        im[i * n + j] -= fr * bi + fi * br;
      }
    }
  }
  return { re, im, perm, ok };
}

function solveComplex(f: ComplexLU, br: Float64Array, bi: Float64Array, n: number, xr: Float64Array, xi: Float64Array): void {
  const { re, im, perm } = f;
  for (let i = 0; i < n; i++) { xr[i] = br[perm[i]]; xi[i] = bi[perm[i]]; }
  for (let i = 0; i < n; i++) {
    let sr = xr[i], si = xi[i];
    for (let j = 0; j < i; j++) {
      const lr = re[i * n + j], li = im[i * n + j];
      sr -= lr * xr[j] - li * xi[j];
      si -= lr * xi[j] + li * xr[j];
    }
    xr[i] = sr; xi[i] = si;
  }
  for (let i = n - 1; i >= 0; i--) {
    let sr = xr[i], si = xi[i];
    for (let j = i + 1; j < n; j++) {
      const ur = re[i * n + j], ui = im[i * n + j];
      sr -= ur * xr[j] - ui * xi[j];
      si -= ur * xi[j] + ui * xr[j];
    }
    const dr = re[i * n + i], di = im[i * n + i];
    const dd = dr * dr + di * di;
    xr[i] = (sr * dr + si * di) / dd;
    xi[i] = (si * dr - sr * di) / dd;
  }
}

/**
 * Integrate y' = f(t, y) from t0 to the last of `outputTimes` (increasing,
 * each ≥ t0) and return y at every output time, interpolated with the
 * collocation polynomial of the step that covers it.
 * Example: `integrateRadau({ n: 1, rhs: (t, y, d) => { d[0] = -y[0]; } }, 0, Float64Array.of(1), [1, 2])`.
 */
export function integrateRadau(problem: OdeProblem, t0: number, y0: Float64Array, outputTimes: readonly number[], options: IntegrateOptions = {}): IntegrateResult {
  const n = problem.n;
  const rtolIn = options.rtol ?? 1e-6;
  const rtol = Math.max(rtolIn, 100 * Number.EPSILON);
  const atol = new Float64Array(n).fill(typeof options.atol === 'number' || options.atol === undefined ? (options.atol as number | undefined) ?? 1e-9 : 0);
  if (options.atol instanceof Float64Array) atol.set(options.atol);
  const maxStep = options.maxStep ?? Infinity;
  const maxSteps = options.maxSteps ?? 1_000_000;
  const tEnd = outputTimes.length > 0 ? outputTimes[outputTimes.length - 1] : t0;
  const stats = { nfev: 0, njev: 0, nlu: 0, steps: 0, rejected: 0 };
  const times: number[] = [];
  const values: Float64Array[] = [];
  let outIdx = 0;
  while (outIdx < outputTimes.length && outputTimes[outIdx] <= t0) { times.push(outputTimes[outIdx]); values.push(y0.slice()); outIdx++; }
  if (outIdx >= outputTimes.length) return { status: 'done', times, values, stats };

  const fun = (t: number, y: Float64Array, out: Float64Array): void => { stats.nfev++; problem.rhs(t, y, out); };
  const J = zeros(n);
  const jac = (t: number, y: Float64Array, f: Float64Array): void => {
    stats.njev++;
    if (problem.jacobian) { problem.jacobian(t, y, J); return; }
    const yp = y.slice(), fp = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      const h = Math.sqrt(Number.EPSILON) * Math.max(Math.abs(y[j]), 1e-5);
      yp[j] = y[j] + h;
      fun(t, yp, fp);
      yp[j] = y[j];
      for (let i = 0; i < n; i++) J.data[i * n + j] = (fp[i] - f[i]) / h;
    }
  };

  let t = t0;
  let y = y0.slice();
  let f = new Float64Array(n);
  fun(t, y, f);
  if (![...f].every(Number.isFinite)) return { status: 'failed', message: `the rates are not finite at the start (t = ${t0})`, times, values, stats };
  // Newton stops when the predicted remaining error is κ·Tol with κ = 0.01, the low end of the range
  // 0.01–0.1 recommended in Hairer & Wanner IV.8 (the norm here is already scaled by the tolerance).
  const newtonTol = Math.max((10 * Number.EPSILON) / rtol, NEWTON_KAPPA);

  // Initial step (Hairer, Nørsett & Wanner, Solving ODEs I, Sec. II.4), for the embedded order 3.
  let hAbs: number;
  if (options.firstStep) hAbs = options.firstStep;
  else {
    const scale0 = new Float64Array(n);
    for (let i = 0; i < n; i++) scale0[i] = atol[i] + Math.abs(y[i]) * rtol;
    const d0 = rmsNorm(y, scale0), d1 = rmsNorm(f, scale0);
    const h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : (0.01 * d0) / d1;
    const y1 = new Float64Array(n), f1 = new Float64Array(n);
    for (let i = 0; i < n; i++) y1[i] = y[i] + h0 * f[i];
    fun(t + h0, y1, f1);
    for (let i = 0; i < n; i++) y1[i] = f1[i] - f[i];
    const d2 = rmsNorm(y1, scale0) / h0;
    const h1 = d1 <= 1e-15 && d2 <= 1e-15 ? Math.max(1e-6, h0 * 1e-3) : (0.01 / Math.max(d1, d2)) ** (1 / 4);
    hAbs = Math.min(100 * h0, h1, tEnd - t0);
  }
  hAbs = Math.min(hAbs, maxStep);
  let hAbsOld: number | null = null;
  let errorNormOld: number | null = null;
  let carriedEta: number | null = null;

  jac(t, y, f);
  let currentJac = true;
  let luR: RealLU | null = null;
  let luC: ComplexLU | null = null;
  // Dense output of the last accepted step: y_old + Σ_k Q_k x^{k+1}.
  let dense: { tOld: number; h: number; yOld: Float64Array; q: Float64Array[] } | null = null;

  const Z = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const W = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const F = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const ys = new Float64Array(n), scale = new Float64Array(n);
  const fr = new Float64Array(n), fcr = new Float64Array(n), fci = new Float64Array(n);
  const dwr = new Float64Array(n), dwcr = new Float64Array(n), dwci = new Float64Array(n);
  const dW = new Float64Array(3 * n), dWs = new Float64Array(3 * n);
  const err = new Float64Array(n), tmp = new Float64Array(n), fnew = new Float64Array(n);

  const evalDense = (d: NonNullable<typeof dense>, tq: number, out: Float64Array): void => {
    const x = (tq - d.tOld) / d.h;
    for (let i = 0; i < n; i++) out[i] = d.yOld[i] + x * (d.q[0][i] + x * (d.q[1][i] + x * d.q[2][i]));
  };

  const factor = (h: number): boolean => {
    const mr = MU_REAL / h, mcr = MU_COMPLEX_RE / h, mci = MU_COMPLEX_IM / h;
    const a = new Float64Array(n * n), br = new Float64Array(n * n), bi = new Float64Array(n * n);
    for (let i = 0; i < n * n; i++) { a[i] = -J.data[i]; br[i] = -J.data[i]; }
    for (let i = 0; i < n; i++) { a[i * n + i] += mr; br[i * n + i] += mcr; bi[i * n + i] = mci; }
    luR = luReal(a, n);
    luC = luComplex(br, bi, n);
    stats.nlu += 2;
    return luR.ok && luC.ok;
  };

  const predictFactor = (hA: number, hAOld: number | null, en: number, enOld: number | null): number => {
    const multiplier = enOld === null || hAOld === null || en === 0 ? 1 : (hA / hAOld) * (enOld / en) ** 0.25;
    return Math.min(1, multiplier) * (en === 0 ? Infinity : en ** -0.25);
  };

  while (t < tEnd) {
    if (options.shouldStop?.()) return { status: 'cancelled', message: `stopped at t = ${t}`, times, values, stats };
    if (stats.steps + stats.rejected >= maxSteps) return { status: 'failed', message: `more than ${maxSteps} steps before t = ${tEnd} (reached t = ${t})`, times, values, stats };
    const minStep = 10 * Math.abs(nextAfter(t) - t);
    if (hAbs > maxStep) { hAbs = maxStep; hAbsOld = null; errorNormOld = null; }
    else if (hAbs < minStep) { hAbs = minStep; hAbsOld = null; errorNormOld = null; }

    let rejected = false;
    let accepted = false;
    let errorNorm = 0, nIter = 0, rate: number | null = null, tNew = t, h = 0;
    const yNew = new Float64Array(n);
    while (!accepted) {
      if (hAbs < minStep) return { status: 'failed', message: `the step size fell below ${minStep.toExponential(2)} at t = ${t}: the system may be singular or have no solution past this point`, times, values, stats };
      h = hAbs;
      tNew = t + h;
      if (tNew > tEnd) tNew = tEnd;
      h = tNew - t;
      hAbs = h;
      // Starting guess from the previous collocation polynomial (extrapolated).
      for (let s = 0; s < 3; s++) {
        if (dense) { evalDense(dense, t + h * C[s], Z[s]); for (let i = 0; i < n; i++) Z[s][i] -= y[i]; }
        else Z[s].fill(0);
      }
      for (let i = 0; i < n; i++) scale[i] = atol[i] + Math.abs(y[i]) * rtol;
      let converged: boolean;
      for (;;) {
        if (luR === null || luC === null) {
          if (!factor(h)) { converged = false; luR = null; luC = null; break; }
        }
        // Simplified Newton iteration on the transformed stages W = T⁻¹ Z.
        const mr = MU_REAL / h, mcr = MU_COMPLEX_RE / h, mci = MU_COMPLEX_IM / h;
        for (let s = 0; s < 3; s++) for (let i = 0; i < n; i++) W[s][i] = TI[s][0] * Z[0][i] + TI[s][1] * Z[1][i] + TI[s][2] * Z[2][i];
        let dwNormOld: number | null = null;
        rate = null;
        converged = false;
        let k = 0;
        for (; k < NEWTON_MAXITER; k++) {
          let finite = true;
          for (let s = 0; s < 3; s++) {
            for (let i = 0; i < n; i++) ys[i] = y[i] + Z[s][i];
            fun(t + C[s] * h, ys, F[s]);
            for (let i = 0; i < n; i++) if (!Number.isFinite(F[s][i])) finite = false;
          }
          if (!finite) break;
          for (let i = 0; i < n; i++) {
            fr[i] = TI[0][0] * F[0][i] + TI[0][1] * F[1][i] + TI[0][2] * F[2][i] - mr * W[0][i];
            const gr = TI[1][0] * F[0][i] + TI[1][1] * F[1][i] + TI[1][2] * F[2][i];
            const gi = TI[2][0] * F[0][i] + TI[2][1] * F[1][i] + TI[2][2] * F[2][i];
            // (gr + i gi) − (mcr + i mci)(W1 + i W2)
            fcr[i] = gr - (mcr * W[1][i] - mci * W[2][i]);
            fci[i] = gi - (mcr * W[2][i] + mci * W[1][i]);
          }
          solveReal(luR!, fr, n, dwr);
          solveComplex(luC!, fcr, fci, n, dwcr, dwci);
          for (let i = 0; i < n; i++) {
            dW[i] = dwr[i]; dW[n + i] = dwcr[i]; dW[2 * n + i] = dwci[i];
            dWs[i] = dwr[i] / scale[i]; dWs[n + i] = dwcr[i] / scale[i]; dWs[2 * n + i] = dwci[i] / scale[i];
          }
          let ss = 0;
          for (let i = 0; i < 3 * n; i++) ss += dWs[i] * dWs[i];
          const dwNorm = Math.sqrt(ss / n);
          if (dwNormOld !== null) rate = dwNorm / dwNormOld;
          if (rate !== null && (rate >= 1 || (rate ** (NEWTON_MAXITER - k) / (1 - rate)) * dwNorm > newtonTol)) break;
          for (let i = 0; i < n; i++) { W[0][i] += dwr[i]; W[1][i] += dwcr[i]; W[2][i] += dwci[i]; }
          for (let s = 0; s < 3; s++) for (let i = 0; i < n; i++) Z[s][i] = T[s][0] * W[0][i] + T[s][1] * W[1][i] + T[s][2] * W[2][i];
          // Converged when the predicted remaining error η·‖ΔW‖ is below the tolerance; on the first
          // iteration η is carried over from the previous step, η ← max(η, eps)^0.8 (Hairer & Wanner IV.8,
          // after (8.17): the RADAU5 rule that lets one iteration suffice).
          const eta: number | null = rate !== null ? rate / (1 - rate) : carriedEta !== null ? Math.max(carriedEta, Number.EPSILON) ** 0.8 : null;
          if (dwNorm === 0 || (eta !== null && eta * dwNorm < newtonTol)) { converged = true; carriedEta = eta; break; }
          dwNormOld = dwNorm;
        }
        nIter = k + 1;
        if (converged || currentJac) break;
        jac(t, y, f);
        currentJac = true;
        luR = null; luC = null;
      }
      if (!converged) {
        hAbs *= 0.5;
        luR = null; luC = null;
        stats.rejected++;
        continue;
      }
      for (let i = 0; i < n; i++) yNew[i] = y[i] + Z[2][i];
      // Error estimate (Hairer & Wanner IV.8 (8.19)–(8.20)): (γ₀/h − J)⁻¹ (f(y) + Σ e_i Z_i / h).
      for (let i = 0; i < n; i++) tmp[i] = f[i] + (E[0] * Z[0][i] + E[1] * Z[1][i] + E[2] * Z[2][i]) / h;
      solveReal(luR!, tmp, n, err);
      for (let i = 0; i < n; i++) scale[i] = atol[i] + Math.max(Math.abs(y[i]), Math.abs(yNew[i])) * rtol;
      errorNorm = rmsNorm(err, scale);
      const safety = (0.9 * (2 * NEWTON_MAXITER + 1)) / (2 * NEWTON_MAXITER + nIter);
      if (rejected && errorNorm > 1) {
        for (let i = 0; i < n; i++) ys[i] = y[i] + err[i];
        fun(t, ys, fnew);
        for (let i = 0; i < n; i++) tmp[i] = fnew[i] + (E[0] * Z[0][i] + E[1] * Z[1][i] + E[2] * Z[2][i]) / h;
        solveReal(luR!, tmp, n, err);
        errorNorm = rmsNorm(err, scale);
      }
      if (!(errorNorm <= 1)) {
        const fac = Number.isFinite(errorNorm) ? predictFactor(hAbs, hAbsOld, errorNorm, errorNormOld) : MIN_FACTOR;
        hAbs *= Math.max(MIN_FACTOR, safety * fac);
        luR = null; luC = null;
        rejected = true;
        stats.rejected++;
      } else accepted = true;
    }
    stats.steps++;
    const recomputeJac = nIter > 2 && rate !== null && rate > 1e-3;
    const safety = (0.9 * (2 * NEWTON_MAXITER + 1)) / (2 * NEWTON_MAXITER + nIter);
    let fac = Math.min(MAX_FACTOR, safety * predictFactor(hAbs, hAbsOld, errorNorm, errorNormOld));
    if (!recomputeJac && fac < 1.2) fac = 1;
    else { luR = null; luC = null; }
    fun(tNew, yNew, fnew);
    if (recomputeJac) { jac(tNew, yNew, fnew); currentJac = true; }
    else currentJac = false;
    hAbsOld = hAbs;
    errorNormOld = errorNorm;
    const q: Float64Array[] = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
    for (let k = 0; k < 3; k++) for (let i = 0; i < n; i++) q[k][i] = Z[0][i] * P[0][k] + Z[1][i] * P[1][k] + Z[2][i] * P[2][k];
    dense = { tOld: t, h, yOld: y, q };
    // Output at the requested times this step covers.
    while (outIdx < outputTimes.length && outputTimes[outIdx] <= tNew) {
      const out = new Float64Array(n);
      if (outputTimes[outIdx] === tNew) out.set(yNew);
      else evalDense(dense, outputTimes[outIdx], out);
      times.push(outputTimes[outIdx]);
      values.push(out);
      outIdx++;
    }
    hAbs = hAbs * fac;
    t = tNew;
    y = yNew;
    f = fnew.slice();
    options.onProgress?.(t);
  }
  return { status: 'done', times, values, stats };
}

function nextAfter(t: number): number {
  if (t === 0) return Number.MIN_VALUE;
  const buf = new Float64Array([t]);
  const bits = new BigInt64Array(buf.buffer);
  bits[0] += t > 0 ? 1n : -1n;
  return buf[0];
}
