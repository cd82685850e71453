/**
 * Dense real matrices over Float64Array (row-major) and the kernels the
 * numerics need: products, LU with partial pivoting, rank by Householder QR
 * with column pivoting, and eigenvalues of non-symmetric matrices.
 */
import { EigenvalueDecomposition, Matrix as MlMatrix } from 'ml-matrix';

export interface Mat {
  rows: number;
  cols: number;
  /** Row-major: entry (i, j) is data[i * cols + j]. */
  data: Float64Array;
}

export function zeros(rows: number, cols = rows): Mat {
  return { rows, cols, data: new Float64Array(rows * cols) };
}

export function identity(n: number): Mat {
  const m = zeros(n);
  for (let i = 0; i < n; i++) m.data[i * n + i] = 1;
  return m;
}

/** Build from an array of rows: `fromRows([[1, 2], [3, 4]])`. */
export function fromRows(rows: readonly (readonly number[])[]): Mat {
  const r = rows.length;
  const c = r === 0 ? 0 : rows[0].length;
  const m = zeros(r, c);
  for (let i = 0; i < r; i++) {
    if (rows[i].length !== c) throw new Error(`row ${i} has ${rows[i].length} entries, expected ${c}`);
    for (let j = 0; j < c; j++) m.data[i * c + j] = rows[i][j];
  }
  return m;
}

export function toRows(m: Mat): number[][] {
  const out: number[][] = [];
  for (let i = 0; i < m.rows; i++) out.push(Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)));
  return out;
}

export function clone(m: Mat): Mat {
  return { rows: m.rows, cols: m.cols, data: m.data.slice() };
}

export function get(m: Mat, i: number, j: number): number {
  return m.data[i * m.cols + j];
}

export function transpose(m: Mat): Mat {
  const t = zeros(m.cols, m.rows);
  for (let i = 0; i < m.rows; i++) for (let j = 0; j < m.cols; j++) t.data[j * m.rows + i] = m.data[i * m.cols + j];
  return t;
}

/** C = A·B (i-k-j loop order, contiguous inner loop). */
export function mul(a: Mat, b: Mat): Mat {
  if (a.cols !== b.rows) throw new Error(`cannot multiply ${a.rows}×${a.cols} by ${b.rows}×${b.cols}`);
  const n = a.rows, m = b.cols, p = a.cols;
  const c = new Float64Array(n * m);
  const ad = a.data, bd = b.data;
  // Four rows of B per pass over a row of C: a quarter of the loads and stores of C.
  const p4 = p - (p % 4);
  for (let i = 0; i < n; i++) {
    const ci = i * m;
    const ai = i * p;
    for (let k = 0; k < p4; k += 4) {
      const a0 = ad[ai + k], a1 = ad[ai + k + 1], a2 = ad[ai + k + 2], a3 = ad[ai + k + 3];
      const b0 = k * m, b1 = b0 + m, b2 = b1 + m, b3 = b2 + m;
      for (let j = 0; j < m; j++) c[ci + j] += a0 * bd[b0 + j] + a1 * bd[b1 + j] + a2 * bd[b2 + j] + a3 * bd[b3 + j];
    }
    for (let k = p4; k < p; k++) {
      const aik = ad[ai + k];
      const bk = k * m;
      for (let j = 0; j < m; j++) c[ci + j] += aik * bd[bk + j];
    }
  }
  return { rows: n, cols: m, data: c };
}

/** A·Bᵀ (through an explicit transpose: the blocked product is faster than dot products). */
export function mulT(a: Mat, b: Mat): Mat {
  if (a.cols !== b.cols) throw new Error(`cannot multiply ${a.rows}×${a.cols} by the transpose of ${b.rows}×${b.cols}`);
  return mul(a, transpose(b));
}

export function mulVec(a: Mat, x: ArrayLike<number>): Float64Array {
  const y = new Float64Array(a.rows);
  for (let i = 0; i < a.rows; i++) {
    let s = 0;
    for (let j = 0; j < a.cols; j++) s += a.data[i * a.cols + j] * x[j];
    y[i] = s;
  }
  return y;
}

/** αA + βB. */
export function axpby(alpha: number, a: Mat, beta: number, b: Mat): Mat {
  const c = zeros(a.rows, a.cols);
  for (let i = 0; i < c.data.length; i++) c.data[i] = alpha * a.data[i] + beta * b.data[i];
  return c;
}

export function scale(a: Mat, s: number): Mat {
  const c = zeros(a.rows, a.cols);
  for (let i = 0; i < c.data.length; i++) c.data[i] = s * a.data[i];
  return c;
}

/** Make a matrix exactly symmetric: (M + Mᵀ)/2. */
export function symmetrize(m: Mat): Mat {
  const n = m.rows;
  const s = clone(m);
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const v = 0.5 * (m.data[i * n + j] + m.data[j * n + i]);
      s.data[i * n + j] = v;
      s.data[j * n + i] = v;
    }
  return s;
}

/** Maximum absolute column sum. */
export function norm1(a: Mat): number {
  let best = 0;
  for (let j = 0; j < a.cols; j++) {
    let s = 0;
    for (let i = 0; i < a.rows; i++) s += Math.abs(a.data[i * a.cols + j]);
    if (s > best) best = s;
  }
  return best;
}

export function normMax(a: Mat): number {
  let best = 0;
  for (let i = 0; i < a.data.length; i++) best = Math.max(best, Math.abs(a.data[i]));
  return best;
}

export interface LU {
  n: number;
  /** L (unit lower, below the diagonal) and U packed in one matrix. */
  lu: Float64Array;
  perm: Int32Array;
  /** True when a pivot was exactly zero (or not finite): the matrix is singular. */
  singular: boolean;
  /** Smallest |pivot| / largest |pivot|: a cheap warning sign of near-singularity. */
  pivotRatio: number;
}

/** LU factorisation with partial pivoting (Golub & Van Loan, Matrix Computations, Alg. 3.4.1). */
export function luFactor(a: Mat): LU {
  const n = a.rows;
  if (a.cols !== n) throw new Error(`LU needs a square matrix, not ${a.rows}×${a.cols}`);
  const lu = a.data.slice();
  const perm = new Int32Array(n);
  const { singular, pivotRatio } = luFactorInPlace(lu, n, perm);
  return { n, lu, perm, singular, pivotRatio };
}

/**
 * The kernel of luFactor, in place and without allocating: `lu` (n×n, row
 * major) becomes L and U packed, `perm` the row permutation. For inner
 * loops that refactor a matrix of their own at every step (the Radau
 * integrator's iteration matrix).
 */
export function luFactorInPlace(lu: Float64Array, n: number, perm: Int32Array): { singular: boolean; pivotRatio: number } {
  for (let i = 0; i < n; i++) perm[i] = i;
  let singular = false;
  let pmin = Infinity, pmax = 0;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j];
        lu[k * n + j] = lu[p * n + j];
        lu[p * n + j] = t;
      }
      const t = perm[k]; perm[k] = perm[p]; perm[p] = t;
    }
    const piv = lu[k * n + k];
    pmin = Math.min(pmin, Math.abs(piv));
    pmax = Math.max(pmax, Math.abs(piv));
    if (piv === 0 || !Number.isFinite(piv)) { singular = true; continue; }
    for (let i = k + 1; i < n; i++) {
      const f = (lu[i * n + k] /= piv);
      if (f === 0) continue;
      for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
    }
  }
  return { singular, pivotRatio: n === 0 ? 1 : pmax === 0 ? 0 : pmin / pmax };
}

/** Solve A x = b with a factorisation from luFactor. */
export function luSolve(f: LU, b: ArrayLike<number>): Float64Array {
  const x = new Float64Array(f.n);
  luSolveInto(f.lu, f.perm, f.n, b, x);
  return x;
}

/** The kernel of luSolve: forward and back substitution into `x` (length n), without allocating. */
export function luSolveInto(lu: Float64Array, perm: Int32Array, n: number, b: ArrayLike<number>, x: Float64Array): void {
  for (let i = 0; i < n; i++) x[i] = b[perm[i]];
  for (let i = 0; i < n; i++) {
    let s = x[i];
    for (let j = 0; j < i; j++) s -= lu[i * n + j] * x[j];
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j] * x[j];
    x[i] = s / lu[i * n + i];
  }
}

/** Solve A X = B for a matrix right-hand side. */
export function luSolveMat(f: LU, b: Mat): Mat {
  const { n, lu, perm } = f;
  const m = b.cols;
  const x = new Float64Array(n * m);
  for (let i = 0; i < n; i++) x.set(b.data.subarray(perm[i] * m, perm[i] * m + m), i * m);
  for (let i = 0; i < n; i++)
    for (let k = 0; k < i; k++) {
      const l = lu[i * n + k];
      if (l === 0) continue;
      for (let j = 0; j < m; j++) x[i * m + j] -= l * x[k * m + j];
    }
  for (let i = n - 1; i >= 0; i--) {
    for (let k = i + 1; k < n; k++) {
      const u = lu[i * n + k];
      if (u === 0) continue;
      for (let j = 0; j < m; j++) x[i * m + j] -= u * x[k * m + j];
    }
    const d = lu[i * n + i];
    for (let j = 0; j < m; j++) x[i * m + j] /= d;
  }
  return { rows: n, cols: m, data: x };
}

export function solve(a: Mat, b: Mat): Mat {
  return luSolveMat(luFactor(a), b);
}

export function inverse(a: Mat): Mat {
  return luSolveMat(luFactor(a), identity(a.rows));
}

export interface RankResult {
  rank: number;
  /** Column indices in pivot order; the first `rank` are independent. */
  pivots: number[];
  /** |R_kk| in pivot order. */
  diagonal: number[];
  tolerance: number;
}

/**
 * Numerical rank by Householder QR with column pivoting (Businger & Golub
 * 1965; Golub & Van Loan Alg. 5.4.1). Columns whose remaining norm falls below
 * tol = max(rows, cols)·eps·|R_11| (the default rank tolerance of common
 * practice, as in numpy.linalg.matrix_rank) are dependent on the pivots before them.
 */
export function rankQR(a: Mat, relTol?: number): RankResult {
  const m = a.rows, n = a.cols;
  const r = a.data.slice();
  const piv = Array.from({ length: n }, (_, j) => j);
  const norms = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) s += r[i * n + j] ** 2;
    norms[j] = s;
  }
  const diag: number[] = [];
  const steps = Math.min(m, n);
  for (let k = 0; k < steps; k++) {
    // Recompute the remaining column norms exactly (cheap at our sizes, avoids downdating drift).
    let p = k, best = -1;
    for (let j = k; j < n; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += r[i * n + j] ** 2;
      norms[j] = s;
      if (s > best) { best = s; p = j; }
    }
    if (p !== k) {
      for (let i = 0; i < m; i++) {
        const t = r[i * n + k]; r[i * n + k] = r[i * n + p]; r[i * n + p] = t;
      }
      const t = piv[k]; piv[k] = piv[p]; piv[p] = t;
    }
    const alpha0 = Math.sqrt(norms[p]);
    if (alpha0 === 0) { diag.push(0); continue; }
    const x0 = r[k * n + k];
    const alpha = x0 > 0 ? -alpha0 : alpha0;
    const v = new Float64Array(m - k);
    v[0] = x0 - alpha;
    for (let i = k + 1; i < m; i++) v[i - k] = r[i * n + k];
    let vn = 0;
    for (let i = 0; i < v.length; i++) vn += v[i] * v[i];
    if (vn > 0) {
      for (let j = k; j < n; j++) {
        let s = 0;
        for (let i = k; i < m; i++) s += v[i - k] * r[i * n + j];
        const f = (2 * s) / vn;
        for (let i = k; i < m; i++) r[i * n + j] -= f * v[i - k];
      }
    }
    diag.push(Math.abs(r[k * n + k]));
  }
  const top = diag.length > 0 ? diag[0] : 0;
  const tolerance = (relTol ?? Math.max(m, n) * Number.EPSILON) * top;
  let rank = 0;
  for (const d of diag) if (d > tolerance) rank++;
  return { rank, pivots: piv, diagonal: diag, tolerance };
}

export interface Eigen {
  /** Real parts of the eigenvalues. */
  re: Float64Array;
  /** Imaginary parts; complex pairs come as (a + bi, a − bi), positive part first. */
  im: Float64Array;
  /**
   * Real eigenvector matrix in the usual real packing: for a real eigenvalue,
   * column j is its eigenvector; for a pair at (j, j+1), columns j and j+1
   * are the real and imaginary parts of the eigenvector of re[j] + i·im[j].
   */
  vectors: Mat;
}

/**
 * Eigenvalues and eigenvectors of a real, possibly non-symmetric matrix
 * (Hessenberg reduction + shifted QR, as in ml-matrix's EigenvalueDecomposition).
 */
export function eigen(a: Mat): Eigen {
  const n = a.rows;
  if (n === 0) return { re: new Float64Array(0), im: new Float64Array(0), vectors: zeros(0) };
  for (let i = 0; i < a.data.length; i++) if (!Number.isFinite(a.data[i])) throw new Error('the matrix has entries that are not finite numbers');
  const e = new EigenvalueDecomposition(new MlMatrix(toRows(a)), { assumeSymmetric: false });
  const re = Float64Array.from(e.realEigenvalues);
  const im = Float64Array.from(e.imaginaryEigenvalues);
  const vectors = fromRows(e.eigenvectorMatrix.to2DArray());
  return { re, im, vectors };
}

/** Eigenvalues only. */
export function eigenvalues(a: Mat): { re: Float64Array; im: Float64Array } {
  const { re, im } = eigen(a);
  return { re, im };
}
