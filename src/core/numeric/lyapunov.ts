/**
 * The stationary covariance Σ of dX = A X dt + G dW: the solution of the
 * continuous Lyapunov equation A Σ + Σ Aᵀ + G Gᵀ = 0, which exists when
 * every eigenvalue of A has a negative real part.
 *
 * Method: for n ≤ KRONECKER_MAX a direct Kronecker solve of
 * (I ⊗ A + A ⊗ I) vec Σ = −vec(G Gᵀ); above it Bartels & Stewart (1972),
 * "Solution of the matrix equation AX + XB = C", Comm. ACM 15(9): with the
 * real Schur form A = Z T Zᵀ, solve T Y + Y Tᵀ = −Zᵀ C Z block by block
 * (1×1 and 2×2 diagonal blocks, from the bottom right) and return Z Y Zᵀ.
 * Should the Schur iteration fail, the squared Smith iteration (Smith 1968,
 * "Matrix equation XA + BX = C", SIAM J. Appl. Math. 16(1)) on the exact
 * discretisation is the fallback: Σ = Σ_k Φ^k Q Φ^kᵀ summed by doubling.
 */
import { axpby, eigenvalues, luFactor, luSolve, mul, mulT, normMax, symmetrize, transpose, zeros, type Mat } from './dense';
import { vanLoan } from './expm';
import { realSchur } from './schur';
import { precisionText } from '../../present/numbers';

export const KRONECKER_MAX = 10;

export type LyapunovResult =
  | { ok: true; sigma: Mat; method: 'kronecker' | 'bartels-stewart' | 'smith-doubling'; residual: number }
  | { ok: false; reason: string; unstable: { re: number; im: number }[] };

/**
 * Solve A Σ + Σ Aᵀ + C = 0 (C = G Gᵀ). Refuses when A is not stable: then
 * the process has no stationary covariance.
 * Example: `lyapunov(fromRows([[-1]]), fromRows([[2]]))` gives Σ = [[1]].
 */
export function lyapunov(a: Mat, c: Mat): LyapunovResult {
  const n = a.rows;
  const ev = eigenvalues(a);
  const unstable: { re: number; im: number }[] = [];
  for (let i = 0; i < n; i++) if (!(ev.re[i] < 0)) unstable.push({ re: ev.re[i], im: ev.im[i] });
  if (unstable.length > 0)
    return {
      ok: false,
      reason: `the drift matrix has ${unstable.length} eigenvalue${unstable.length > 1 ? 's' : ''} with non-negative real part (largest ${precisionText(Math.max(...unstable.map((u) => u.re)), 3)}): the process is not stable, so it has no stationary covariance`,
      unstable,
    };
  if (n <= KRONECKER_MAX) {
    const sigma = kronecker(a, c);
    return { ok: true, sigma, method: 'kronecker', residual: residual(a, sigma, c) };
  }
  const bs = bartelsStewart(a, c);
  if (bs) return { ok: true, sigma: bs, method: 'bartels-stewart', residual: residual(a, bs, c) };
  let sigma = smith(a, c);
  const r = lyapunovResidual(a, sigma, c);
  sigma = symmetrize(axpby(1, sigma, 1, smith(a, r)));
  return { ok: true, sigma, method: 'smith-doubling', residual: residual(a, sigma, c) };
}

function kronecker(a: Mat, c: Mat): Mat {
  const n = a.rows;
  const N = n * n;
  const k = zeros(N);
  // Row-major vec: Σ_ij at i*n+j; (AΣ)_ij = Σ_l A_il Σ_lj, (ΣAᵀ)_ij = Σ_l Σ_il A_jl.
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const row = (i * n + j) * N;
      for (let l = 0; l < n; l++) {
        k.data[row + l * n + j] += a.data[i * n + l];
        k.data[row + i * n + l] += a.data[j * n + l];
      }
    }
  const rhs = new Float64Array(N);
  for (let i = 0; i < N; i++) rhs[i] = -c.data[i];
  const x = luSolve(luFactor(k), rhs);
  return symmetrize({ rows: n, cols: n, data: x });
}

/** A Σ + Σ Aᵀ + C. */
export function lyapunovResidual(a: Mat, sigma: Mat, c: Mat): Mat {
  const as = mul(a, sigma);
  const r = zeros(a.rows);
  const n = a.rows;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) r.data[i * n + j] = as.data[i * n + j] + as.data[j * n + i] + c.data[i * n + j];
  return r;
}

function residual(a: Mat, sigma: Mat, c: Mat): number {
  const scaleRef = Math.max(normMax(c), 2 * normMax(a) * normMax(sigma), Number.MIN_VALUE);
  return normMax(lyapunovResidual(a, sigma, c)) / scaleRef;
}

function smith(a: Mat, c: Mat): Mat {
  const nrm = normMax(a) * a.rows;
  const h = nrm > 0 ? 0.5 / nrm : 1;
  let { phi, q } = vanLoan(a, c, h);
  for (let k = 0; k < 200; k++) {
    const add = mulT(mul(phi, q), phi);
    q = symmetrize(axpby(1, q, 1, add));
    const phiSize = normMax(phi);
    if (normMax(add) <= 1e-18 * normMax(q) && phiSize < 1e-9) break;
    if (phiSize === 0) break;
    phi = mul(phi, phi);
  }
  return q;
}

function bartelsStewart(a: Mat, c: Mat): Mat | null {
  const n = a.rows;
  let schur;
  try {
    schur = realSchur(a);
  } catch {
    return null;
  }
  const { t, z, blocks } = schur;
  const T = t.data;
  // F = −Zᵀ C Z
  const F = mul(transpose(z), mul(c, z));
  const Y = zeros(n);
  const y = Y.data;
  for (let bi = blocks.length - 1; bi >= 0; bi--) {
    const { start: i0, size: p } = blocks[bi];
    for (let bj = blocks.length - 1; bj >= 0; bj--) {
      const { start: j0, size: q } = blocks[bj];
      // R = F_ij − Σ_{k beyond block i} T_ik Y_kj − Σ_{l beyond block j} Y_il T_jlᵀ
      const R = new Float64Array(p * q);
      for (let a1 = 0; a1 < p; a1++)
        for (let b1 = 0; b1 < q; b1++) {
          const i = i0 + a1, j = j0 + b1;
          let s = -F.data[i * n + j];
          for (let k = i0 + p; k < n; k++) s -= T[i * n + k] * y[k * n + j];
          for (let l = j0 + q; l < n; l++) s -= y[i * n + l] * T[j * n + l];
          R[a1 * q + b1] = s;
        }
      // T_ii Y + Y T_jjᵀ = R as a (pq)×(pq) system over Y's entries (row-major).
      const K = zeros(p * q);
      for (let a1 = 0; a1 < p; a1++)
        for (let b1 = 0; b1 < q; b1++) {
          const row = (a1 * q + b1) * p * q;
          for (let c1 = 0; c1 < p; c1++) K.data[row + c1 * q + b1] += T[(i0 + a1) * n + i0 + c1];
          for (let d1 = 0; d1 < q; d1++) K.data[row + a1 * q + d1] += T[(j0 + b1) * n + j0 + d1];
        }
      const f = luFactor(K);
      if (f.singular) return null;
      const sol = luSolve(f, R);
      for (let a1 = 0; a1 < p; a1++) for (let b1 = 0; b1 < q; b1++) y[(i0 + a1) * n + j0 + b1] = sol[a1 * q + b1];
    }
  }
  const sigma = symmetrize(mulT(mul(z, Y), z));
  return sigma.data.every(Number.isFinite) ? sigma : null;
}
