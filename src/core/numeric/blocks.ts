/**
 * Solving one block of equations for its variables, others held fixed:
 * an explicit formula is evaluated; a simultaneous block is solved by damped
 * Newton with a backtracking line search (Dennis & Schnabel, Numerical
 * Methods for Unconstrained Optimization and Nonlinear Equations, Alg. 6.3.5,
 * with the sufficient-decrease constant 1e-4), switching to a
 * Levenberg–Marquardt step when the block's Jacobian is singular.
 */
import type { EquationId, VariableId } from '../model/types';
import { luFactor, luSolve, rankQR, transpose, zeros, type Mat } from './dense';
import { residual, residualGradient, type NumericEquation, type NumericSystem } from './system';

export interface BlockSpec {
  variables: VariableId[];
  equations: EquationId[];
}

export interface BlockOutcome {
  status: 'solved' | 'no-convergence' | 'singular' | 'not-finite' | 'missing-equation';
  iterations: number;
  /** max |residual| at the end. */
  residual: number;
  /** Jacobian rank at the end, and the equations found dependent on the others. */
  rank?: number;
  dependent?: EquationId[];
}

export interface PreparedBlock {
  spec: BlockSpec;
  slots: Int32Array;
  eqs: NumericEquation[];
  /** A single formula whose variable it does not read: evaluate directly. */
  explicit: boolean;
  missing: EquationId[];
}

export function prepareBlock(system: NumericSystem, spec: BlockSpec): PreparedBlock {
  const slots = Int32Array.from(spec.variables.map((v) => system.slot.get(v) ?? -1));
  const eqs: NumericEquation[] = [];
  const missing: EquationId[] = [];
  for (const id of spec.equations) {
    const e = system.byId.get(id);
    if (e) eqs.push(e);
    else missing.push(id);
  }
  const explicit =
    eqs.length === 1 && slots.length === 1 && eqs[0].kind === 'formula' && eqs[0].variable === spec.variables[0] && !eqs[0].partials.some((p) => p.slot === slots[0]);
  return { spec, slots, eqs, explicit, missing };
}

function maxAbs(x: Float64Array): number {
  let m = 0;
  for (let i = 0; i < x.length; i++) m = Math.max(m, Math.abs(x[i]));
  return m;
}

function residuals(system: NumericSystem, b: PreparedBlock, v: Float64Array, out: Float64Array): void {
  for (let i = 0; i < b.eqs.length; i++) out[i] = residual(system, b.eqs[i], v);
}

/** The block's Jacobian: rows = equations, columns = the block's variables. */
export function blockJacobian(system: NumericSystem, b: PreparedBlock, v: Float64Array): Mat {
  const m = b.eqs.length, k = b.slots.length;
  const J = zeros(m, k);
  const col = new Map<number, number>();
  b.slots.forEach((s, j) => col.set(s, j));
  for (let i = 0; i < m; i++) {
    for (const [s, d] of residualGradient(system, b.eqs[i], v)) {
      const j = col.get(s);
      if (j !== undefined) J.data[i * k + j] += d;
    }
  }
  return J;
}

export interface SolveOptions {
  maxIterations?: number;
  /** Converged when max |residual| ≤ tol · max(1, max |x|). */
  tol?: number;
}

/**
 * Solve the block in place in `v` (other slots are read, not changed).
 * Never leaves a non-finite value behind: on failure the best finite point seen stays.
 */
export function solveBlock(system: NumericSystem, b: PreparedBlock, v: Float64Array, options: SolveOptions = {}): BlockOutcome {
  if (b.missing.length > 0) return { status: 'missing-equation', iterations: 0, residual: Infinity };
  if (b.explicit) {
    const x = b.eqs[0].value(v);
    if (!Number.isFinite(x)) return { status: 'not-finite', iterations: 1, residual: Infinity };
    v[b.slots[0]] = x;
    return { status: 'solved', iterations: 1, residual: 0 };
  }
  const m = b.eqs.length, k = b.slots.length;
  const maxIt = options.maxIterations ?? 100;
  const tol = options.tol ?? 1e-12;
  const F = new Float64Array(m), Ft = new Float64Array(m);
  const x0 = Float64Array.from(b.slots, (s) => v[s]);
  residuals(system, b, v, F);
  let fnorm = Math.hypot(...F);
  let best = { x: x0.slice(), f: Number.isFinite(fnorm) ? fnorm : Infinity };
  let singular = false;
  let stagnated = false;
  let it = 0;
  const converged = () => stagnated || maxAbs(F) <= tol * Math.max(1, maxAbs(Float64Array.from(b.slots, (s) => v[s])));
  for (; it < maxIt && !converged(); it++) {
    if (!Number.isFinite(fnorm)) break;
    const J = blockJacobian(system, b, v);
    let dx: Float64Array | null = null;
    if (m === k) {
      const lu = luFactor(J);
      if (!lu.singular && lu.pivotRatio > 1e-14) {
        dx = luSolve(lu, F);
        for (let i = 0; i < k; i++) dx[i] = -dx[i];
      }
    }
    if (!dx || !dx.every(Number.isFinite)) {
      // Levenberg–Marquardt: (JᵀJ + μ I) dx = −Jᵀ F.
      singular = true;
      const JT = transpose(J);
      const A = zeros(k);
      let trace = 0;
      for (let i = 0; i < k; i++)
        for (let j = 0; j < k; j++) {
          let s = 0;
          for (let r = 0; r < m; r++) s += JT.data[i * m + r] * JT.data[j * m + r];
          A.data[i * k + j] = s;
          if (i === j) trace += s;
        }
      const mu = Math.max(1e-10 * (trace / Math.max(1, k)), 1e-300) + fnorm * 1e-3;
      const g = new Float64Array(k);
      for (let i = 0; i < k; i++) {
        A.data[i * k + i] += mu;
        let s = 0;
        for (let r = 0; r < m; r++) s += JT.data[i * m + r] * F[r];
        g[i] = -s;
      }
      dx = luSolve(luFactor(A), g);
    }
    const xOld = Float64Array.from(b.slots, (s) => v[s]);
    let lambda = 1;
    let accepted = false;
    while (lambda > 1e-12) {
      for (let j = 0; j < k; j++) v[b.slots[j]] = xOld[j] + lambda * dx[j];
      residuals(system, b, v, Ft);
      const fn = Math.hypot(...Ft);
      if (Number.isFinite(fn) && fn <= (1 - 1e-4 * lambda) * fnorm) { accepted = true; F.set(Ft); fnorm = fn; break; }
      lambda *= 0.5;
    }
    if (!accepted) {
      for (let j = 0; j < k; j++) v[b.slots[j]] = xOld[j];
      residuals(system, b, v, F);
      // No decrease is possible any more: stagnation at rounding level counts as converged.
      if (maxAbs(F) <= 1e-8 * Math.max(1, maxAbs(xOld))) stagnated = true;
      break;
    }
    if (fnorm < best.f) best = { x: Float64Array.from(b.slots, (s) => v[s]), f: fnorm };
  }
  const ok = converged();
  if (!ok) {
    for (let j = 0; j < k; j++) v[b.slots[j]] = best.x[j];
    residuals(system, b, v, F);
  }
  const res = maxAbs(F);
  if (!ok) return { status: Number.isFinite(res) ? (singular ? 'singular' : 'no-convergence') : 'not-finite', iterations: it, residual: res };
  return { status: 'solved', iterations: it, residual: res };
}

/**
 * Rank of the block's Jacobian at `v` and the equations that depend on the
 * others (pivoted QR on the transposed Jacobian: columns are equations).
 */
export function blockRank(system: NumericSystem, b: PreparedBlock, v: Float64Array): { rank: number; full: number; dependent: EquationId[] } {
  const J = blockJacobian(system, b, v);
  const full = Math.min(J.rows, J.cols);
  const r = rankQR(transpose(J), 1e-10);
  if (r.rank >= J.rows) return { rank: r.rank, full, dependent: [] };
  // Each equation beyond the rank is a combination of the independent ones:
  // name it together with the equations of that combination (least squares by normal equations).
  const indep = r.pivots.slice(0, r.rank);
  const k = J.cols;
  const group = new Set<number>();
  const N = zeros(indep.length);
  for (let a = 0; a < indep.length; a++)
    for (let c = 0; c < indep.length; c++) {
      let s = 0;
      for (let j = 0; j < k; j++) s += J.data[indep[a] * k + j] * J.data[indep[c] * k + j];
      N.data[a * indep.length + c] = s;
    }
  const lu = indep.length > 0 ? luFactor(N) : null;
  for (const d of r.pivots.slice(r.rank)) {
    group.add(d);
    if (!lu) continue;
    const rhs = Float64Array.from(indep, (a) => {
      let s = 0;
      for (let j = 0; j < k; j++) s += J.data[a * k + j] * J.data[d * k + j];
      return s;
    });
    const y = luSolve(lu, rhs);
    indep.forEach((a, i) => { if (Math.abs(y[i]) > 1e-8) group.add(a); });
  }
  return { rank: r.rank, full, dependent: [...group].map((i) => b.eqs[i].id).sort() };
}
