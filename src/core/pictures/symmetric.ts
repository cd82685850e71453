/**
 * Eigen-decomposition of real symmetric matrices by the cyclic Jacobi method
 * (Golub & Van Loan, "Matrix Computations", 4th ed., §8.5). Jacobi is
 * slower than tridiagonal QR but accurate to the last digits for the small
 * matrices of a factor analysis (a few dozen variables); singular values by
 * one-sided Jacobi.
 */
import { zeros, type Mat } from '../numeric/dense';

export interface SymmetricEigen {
  /** Eigenvalues, largest first. */
  values: Float64Array;
  /** Column j is the unit eigenvector of values[j]. */
  vectors: Mat;
}

/**
 * Example: `symmetricEigen(fromRows([[2, 1], [1, 2]])).values` → [3, 1].
 * The matrix is read from its upper triangle.
 */
export function symmetricEigen(a: Mat): SymmetricEigen {
  const n = a.rows;
  if (a.cols !== n) throw new Error(`a symmetric eigen-decomposition needs a square matrix, not ${a.rows}×${a.cols}`);
  const s = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const x = a.data[i * n + j];
      if (!Number.isFinite(x)) throw new Error('the matrix has entries that are not finite numbers');
      s[i * n + j] = x;
      s[j * n + i] = x;
    }
  const v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  let scaleNorm = 0;
  for (const x of s) scaleNorm += x * x;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) off += s[i * n + j] * s[i * n + j];
    if (off <= 1e-32 * scaleNorm || off === 0) break;
    for (let p = 0; p < n; p++)
      for (let q = p + 1; q < n; q++) {
        const apq = s[p * n + q];
        if (apq === 0) continue;
        const app = s[p * n + p], aqq = s[q * n + q];
        // Rotation that zeroes (p, q): Golub & Van Loan Algorithm 8.5.1 (sym.schur2).
        const tau = (aqq - app) / (2 * apq);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t), sn = t * c;
        for (let k = 0; k < n; k++) {
          const akp = s[k * n + p], akq = s[k * n + q];
          s[k * n + p] = c * akp - sn * akq;
          s[k * n + q] = sn * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = s[p * n + k], aqk = s[q * n + k];
          s[p * n + k] = c * apk - sn * aqk;
          s[q * n + k] = sn * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k * n + p], vkq = v[k * n + q];
          v[k * n + p] = c * vkp - sn * vkq;
          v[k * n + q] = sn * vkp + c * vkq;
        }
      }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => s[j * n + j] - s[i * n + i]);
  const values = Float64Array.from(order, (i) => s[i * n + i]);
  const vectors = zeros(n);
  order.forEach((src, dst) => {
    for (let k = 0; k < n; k++) vectors.data[k * n + dst] = v[k * n + src];
  });
  return { values, vectors };
}

/**
 * Singular values of a matrix, largest first, by one-sided Jacobi (Hestenes
 * 1958; Demmel & Veselić 1992, SIAM J. Matrix Anal. Appl. 13: small singular
 * values to high relative accuracy, unlike the square roots of AᵀA's eigenvalues).
 * Example: `singularValues(fromRows([[3, 0], [0, 0.5]]))` → [3, 0.5].
 */
export function singularValues(a: Mat): number[] {
  const m = a.rows, n = a.cols;
  const u = new Float64Array(m * n);
  for (let i = 0; i < m * n; i++) {
    if (!Number.isFinite(a.data[i])) throw new Error('the matrix has entries that are not finite numbers');
    u[i] = a.data[i];
  }
  for (let sweep = 0; sweep < 80; sweep++) {
    let rotated = false;
    for (let p = 0; p < n; p++)
      for (let q = p + 1; q < n; q++) {
        let alpha = 0, beta = 0, gamma = 0;
        for (let k = 0; k < m; k++) {
          const x = u[k * n + p], y = u[k * n + q];
          alpha += x * x; beta += y * y; gamma += x * y;
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t), sn = c * t;
        for (let k = 0; k < m; k++) {
          const x = u[k * n + p], y = u[k * n + q];
          u[k * n + p] = c * x - sn * y;
          u[k * n + q] = sn * x + c * y;
        }
      }
    if (!rotated) break;
  }
  const out: number[] = [];
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let k = 0; k < m; k++) s += u[k * n + j] * u[k * n + j];
    out.push(Math.sqrt(s));
  }
  return out.sort((x, y) => y - x);
}
