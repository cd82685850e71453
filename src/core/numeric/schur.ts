/**
 * Real Schur decomposition A = Z T Zᵀ (T upper quasi-triangular with 1×1 and
 * 2×2 diagonal blocks, Z orthogonal): Householder reduction to Hessenberg
 * form, then Francis double-shift QR steps with deflation (Golub & Van Loan,
 * Matrix Computations, 4th ed., Alg. 7.4.2, 7.5.1 and 7.5.2).
 */
import { clone, identity, type Mat } from './dense';

export interface RealSchur {
  t: Mat;
  z: Mat;
  /** Start index of each diagonal block, and its size (1 or 2). */
  blocks: { start: number; size: 1 | 2 }[];
}

/** Apply the reflector I − 2vvᵀ/(vᵀv) (v of length L starting at row k) from the left to rows k..k+L−1, columns c0..c1. */
function reflectRows(h: Float64Array, n: number, v: number[], k: number, c0: number, c1: number): void {
  const vv = v.reduce((s, x) => s + x * x, 0);
  if (vv === 0) return;
  for (let j = c0; j <= c1; j++) {
    let s = 0;
    for (let a = 0; a < v.length; a++) s += v[a] * h[(k + a) * n + j];
    const f = (2 * s) / vv;
    for (let a = 0; a < v.length; a++) h[(k + a) * n + j] -= f * v[a];
  }
}

/** The same reflector from the right to columns k..k+L−1, rows r0..r1. */
function reflectCols(h: Float64Array, n: number, v: number[], k: number, r0: number, r1: number): void {
  const vv = v.reduce((s, x) => s + x * x, 0);
  if (vv === 0) return;
  for (let i = r0; i <= r1; i++) {
    let s = 0;
    for (let a = 0; a < v.length; a++) s += h[i * n + k + a] * v[a];
    const f = (2 * s) / vv;
    for (let a = 0; a < v.length; a++) h[i * n + k + a] -= f * v[a];
  }
}

/** Householder vector v with (I − 2vvᵀ/vᵀv) x = ∓‖x‖ e₁. */
function house(x: number[]): number[] {
  const norm = Math.hypot(...x);
  const v = x.slice();
  if (norm === 0) return v.map(() => 0);
  v[0] += x[0] >= 0 ? norm : -norm;
  return v;
}

/**
 * Example: `realSchur(fromRows([[0, 1], [-2, -3]]))` gives T upper triangular with −1, −2 on the diagonal.
 * Throws when the QR iteration does not converge (30 iterations per eigenvalue, as in LAPACK).
 */
export function realSchur(a: Mat): RealSchur {
  const n = a.rows;
  const T = clone(a);
  const Z = identity(n);
  const h = T.data, z = Z.data;
  // Hessenberg reduction.
  for (let k = 0; k < n - 2; k++) {
    const x: number[] = [];
    for (let i = k + 1; i < n; i++) x.push(h[i * n + k]);
    if (x.slice(1).every((e) => e === 0)) continue;
    const v = house(x);
    reflectRows(h, n, v, k + 1, 0, n - 1);
    reflectCols(h, n, v, k + 1, 0, n - 1);
    reflectCols(z, n, v, k + 1, 0, n - 1);
    for (let i = k + 2; i < n; i++) h[i * n + k] = 0;
  }
  const eps = Number.EPSILON;
  let m = n - 1;
  let iter = 0, total = 0;
  while (m > 0) {
    // Deflate negligible subdiagonal entries and find the active unreduced block [l, m].
    let l = m;
    while (l > 0) {
      const s = Math.abs(h[(l - 1) * n + l - 1]) + Math.abs(h[l * n + l]);
      if (Math.abs(h[l * n + l - 1]) <= eps * (s === 0 ? 1 : s)) { h[l * n + l - 1] = 0; break; }
      l--;
    }
    if (l === m) { m -= 1; iter = 0; continue; }
    if (l === m - 1) { m -= 2; iter = 0; continue; }
    if (++total > 30 * n) throw new Error('the Schur decomposition did not converge');
    iter++;
    // Francis double shift from the trailing 2×2 (an exceptional shift every 10th iteration).
    let s: number, t: number;
    if (iter % 10 === 0) {
      const w = Math.abs(h[m * n + m - 1]) + Math.abs(h[(m - 1) * n + m - 2]);
      s = 1.5 * w;
      t = w * w;
    } else {
      s = h[(m - 1) * n + m - 1] + h[m * n + m];
      t = h[(m - 1) * n + m - 1] * h[m * n + m] - h[(m - 1) * n + m] * h[m * n + m - 1];
    }
    let x = h[l * n + l] * h[l * n + l] + h[l * n + l + 1] * h[(l + 1) * n + l] - s * h[l * n + l] + t;
    let y = h[(l + 1) * n + l] * (h[l * n + l] + h[(l + 1) * n + l + 1] - s);
    let zz = h[(l + 1) * n + l] * h[(l + 2) * n + l + 1];
    for (let k = l; k <= m - 2; k++) {
      const v = house([x, y, zz]);
      const r = Math.max(l, k - 1);
      reflectRows(h, n, v, k, r, n - 1);
      const rr = Math.min(k + 3, m);
      reflectCols(h, n, v, k, 0, rr);
      reflectCols(z, n, v, k, 0, n - 1);
      if (k > l) { h[(k + 1) * n + k - 1] = 0; h[(k + 2) * n + k - 1] = 0; }
      x = h[(k + 1) * n + k];
      y = h[(k + 2) * n + k];
      if (k < m - 2) zz = h[(k + 3) * n + k];
    }
    const v = house([x, y]);
    reflectRows(h, n, v, m - 1, m - 2, n - 1);
    reflectCols(h, n, v, m - 1, 0, m);
    reflectCols(z, n, v, m - 1, 0, n - 1);
    h[m * n + m - 2] = 0;
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < i - 1; j++) h[i * n + j] = 0;
  const blocks: RealSchur['blocks'] = [];
  for (let i = 0; i < n; ) {
    if (i + 1 < n && h[(i + 1) * n + i] !== 0) { blocks.push({ start: i, size: 2 }); i += 2; }
    else { blocks.push({ start: i, size: 1 }); i += 1; }
  }
  return { t: T, z: Z, blocks };
}
