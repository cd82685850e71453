/**
 * The matrix exponential by Padé scaling and squaring, and the Van Loan
 * block-matrix method for the noise accumulated over an interval.
 */
import { axpby, clone, identity, luFactor, luSolveMat, mul, mulT, norm1, scale, symmetrize, transpose, zeros, type Mat } from './dense';

// Padé coefficients b_0..b_m and the bounds θ_m on ‖A‖₁ below which degree m
// is accurate to unit roundoff: Higham (2005), "The scaling and squaring
// method for the matrix exponential revisited", SIAM J. Matrix Anal. Appl.
// 26(4), Table 2.3 (θ) and the coefficients of Algorithm 2.3.
const PADE: Record<number, number[]> = {
  3: [120, 60, 12, 1],
  5: [30240, 15120, 3360, 420, 30, 1],
  7: [17297280, 8648640, 1995840, 277200, 25200, 1512, 56, 1],
  9: [17643225600, 8821612800, 2075673600, 302702400, 30270240, 2162160, 110880, 3960, 90, 1],
  13: [
    64764752532480000, 32382376266240000, 7771770303897600, 1187353796428800, 129060195264000, 10559470521600, 670442572800,
    33522128640, 1323241920, 40840800, 960960, 16380, 182, 1,
  ],
};
const THETA: [number, number][] = [
  [3, 1.495585217958292e-2],
  [5, 2.539398330063230e-1],
  [7, 9.504178996162932e-1],
  [9, 2.097847961257068e0],
];
const THETA_13 = 5.371920351148152;

function addScaledInto(acc: Mat, s: number, m: Mat): void {
  for (let i = 0; i < acc.data.length; i++) acc.data[i] += s * m.data[i];
}

function padeLow(a: Mat, m: number, a2: Mat): { u: Mat; v: Mat } {
  const b = PADE[m];
  const n = a.rows;
  const powers: Mat[] = [identity(n), a2];
  for (let k = 2; 2 * k <= m; k++) powers.push(mul(powers[k - 1], a2));
  const uInner = zeros(n);
  const v = zeros(n);
  for (let k = 0; 2 * k <= m; k++) {
    addScaledInto(v, b[2 * k], powers[k]);
    if (2 * k + 1 <= m) addScaledInto(uInner, b[2 * k + 1], powers[k]);
  }
  return { u: mul(a, uInner), v };
}

function pade13(a: Mat): { u: Mat; v: Mat } {
  const b = PADE[13];
  const n = a.rows;
  const ident = identity(n);
  const a2 = mul(a, a);
  const a4 = mul(a2, a2);
  const a6 = mul(a4, a2);
  // U = A[A6(b13 A6 + b11 A4 + b9 A2) + b7 A6 + b5 A4 + b3 A2 + b1 I]
  const t1 = zeros(n);
  addScaledInto(t1, b[13], a6); addScaledInto(t1, b[11], a4); addScaledInto(t1, b[9], a2);
  const uIn = mul(a6, t1);
  addScaledInto(uIn, b[7], a6); addScaledInto(uIn, b[5], a4); addScaledInto(uIn, b[3], a2); addScaledInto(uIn, b[1], ident);
  const u = mul(a, uIn);
  // V = A6(b12 A6 + b10 A4 + b8 A2) + b6 A6 + b4 A4 + b2 A2 + b0 I
  const t2 = zeros(n);
  addScaledInto(t2, b[12], a6); addScaledInto(t2, b[10], a4); addScaledInto(t2, b[8], a2);
  const v = mul(a6, t2);
  addScaledInto(v, b[6], a6); addScaledInto(v, b[4], a4); addScaledInto(v, b[2], a2); addScaledInto(v, b[0], ident);
  return { u, v };
}

/**
 * e^A by Padé approximation with scaling and squaring (Higham 2005, Algorithm 2.3).
 * Example: `expm(fromRows([[0, 1], [-1, 0]]))` is the rotation by one radian.
 */
export function expm(a: Mat): Mat {
  const n = a.rows;
  if (a.cols !== n) throw new Error(`expm needs a square matrix, not ${a.rows}×${a.cols}`);
  if (n === 0) return zeros(0);
  for (let i = 0; i < a.data.length; i++) if (!Number.isFinite(a.data[i])) throw new Error('expm: the matrix has entries that are not finite numbers');
  const nrm = norm1(a);
  for (const [m, theta] of THETA) {
    if (nrm <= theta) {
      const { u, v } = padeLow(a, m, mul(a, a));
      return padeQuotient(u, v);
    }
  }
  const s = Math.max(0, Math.ceil(Math.log2(nrm / THETA_13)));
  const as = s > 0 ? scale(a, 2 ** -s) : a;
  const { u, v } = pade13(as);
  let r = padeQuotient(u, v);
  for (let k = 0; k < s; k++) r = mul(r, r);
  return r;
}

/** r = (V − U)⁻¹ (V + U). */
function padeQuotient(u: Mat, v: Mat): Mat {
  const p = axpby(1, v, 1, u);
  const q = axpby(1, v, -1, u);
  return luSolveMat(luFactor(q), p);
}

/** A block upper-triangular matrix [[x, y], [0, z]] with n×n blocks. */
interface BlockUpper { x: Mat; y: Mat; z: Mat }

function bmul(a: BlockUpper, b: BlockUpper): BlockUpper {
  const y = mul(a.x, b.y);
  addScaledInto(y, 1, mul(a.y, b.z));
  return { x: mul(a.x, b.x), y, z: mul(a.z, b.z) };
}

function bcombine(terms: [number, BlockUpper][], n: number): BlockUpper {
  const r = { x: zeros(n), y: zeros(n), z: zeros(n) };
  for (const [c, m] of terms) { addScaledInto(r.x, c, m.x); addScaledInto(r.y, c, m.y); addScaledInto(r.z, c, m.z); }
  return r;
}

/**
 * e^M for M = [[x, y], [0, z]] with ‖M‖₁ ≤ θ₉ (no squaring needed), exploiting
 * the block structure: half the work of the full 2n×2n products and two n×n
 * LU factorisations instead of one of size 2n. Same Padé approximants as expm.
 */
function expmBlockUpperSmall(mIn: BlockUpper, norm: number): BlockUpper {
  const n = mIn.x.rows;
  let degree = 9;
  for (const [m, theta] of THETA) if (norm <= theta) { degree = m; break; }
  const b = PADE[degree];
  const ident: BlockUpper = { x: identity(n), y: zeros(n), z: identity(n) };
  const m2 = bmul(mIn, mIn);
  const powers: BlockUpper[] = [ident, m2];
  for (let k = 2; 2 * k <= degree; k++) powers.push(bmul(powers[k - 1], m2));
  const uInner = bcombine(powers.map((p, k) => [2 * k + 1 <= degree ? b[2 * k + 1] : 0, p] as [number, BlockUpper]), n);
  const v = bcombine(powers.map((p, k) => [b[2 * k], p] as [number, BlockUpper]), n);
  const u = bmul(mIn, uInner);
  const num = bcombine([[1, v], [1, u]], n);
  const den = bcombine([[1, v], [-1, u]], n);
  // den · r = num, block by block.
  const l11 = luFactor(den.x), l22 = luFactor(den.z);
  const rz = luSolveMat(l22, num.z);
  const rx = luSolveMat(l11, num.x);
  const rhs = clone(num.y);
  addScaledInto(rhs, -1, mul(den.y, rz));
  return { x: rx, y: luSolveMat(l11, rhs), z: rz };
}

export interface NoiseOverInterval {
  /** Φ(Δ) = e^{AΔ}. */
  phi: Mat;
  /** Q(Δ) = ∫₀^Δ e^{As} G Gᵀ e^{Aᵀs} ds, the covariance of the innovations over one interval. */
  q: Mat;
}

/**
 * Φ(Δ) and Q(Δ) for dX = A X dt + G dW (`diffusion` is G Gᵀ), by Van Loan (1978), "Computing
 * integrals involving the matrix exponential", IEEE Trans. Autom. Control
 * 23(3), Theorem 1: exp([[−A, GGᵀ], [0, Aᵀ]]·h) = [[·, F12], [0, F22]],
 * Φ(h) = F22ᵀ, Q(h) = Φ(h)·F12.
 *
 * The block exponential is formed at a short interval h = Δ/2^m (so that the
 * blocks e^{−Ah} and e^{Aᵀh} stay well scaled even when A is unstable,
 * singular or ‖A‖Δ is large), then doubled m times with
 * Φ(2h) = Φ(h)², Q(2h) = Q(h) + Φ(h) Q(h) Φ(h)ᵀ (common practice; it follows
 * from splitting the integral at h).
 */
export function vanLoan(a: Mat, diffusion: Mat, interval: number): NoiseOverInterval {
  const n = a.rows;
  if (!(interval > 0) || !Number.isFinite(interval)) throw new Error(`the interval must be a positive number, not ${interval}`);
  if (diffusion.rows !== n || diffusion.cols !== n) throw new Error(`G Gᵀ must be ${n}×${n}, not ${diffusion.rows}×${diffusion.cols}`);
  // Q is linear in G Gᵀ: scale that block to the size of A so it does not inflate the norm of the
  // block matrix (which would only cost extra squarings), and scale Q back at the end.
  const at = transpose(a);
  const an = Math.max(norm1(a), norm1(at)), gn = norm1(diffusion);
  const sigma = gn === 0 ? 1 : an > 0 ? an / gn : 1 / (gn * interval);
  const gg = sigma === 1 ? diffusion : scale(diffusion, sigma);
  const nrm = an * interval;
  // Keep ‖A‖h ≤ 1/2: the block matrix then has no large exponentials to cancel.
  const m = nrm > 0.5 ? Math.ceil(Math.log2(nrm / 0.5)) : 0;
  const h = interval / 2 ** m;
  // The block matrix [[−A, G Gᵀ], [0, Aᵀ]]·h, exponentiated in block form (its norm is ≤ 1 here).
  const mh: BlockUpper = { x: scale(a, -h), y: scale(gg, h), z: scale(at, h) };
  // ‖·‖₁ of the block matrix: ≤ ‖A‖h + ‖σ G Gᵀ‖h ≤ 1 < θ₉ by the choice of h and σ.
  const normBlock = Math.max(norm1(mh.x), norm1(mh.y) + norm1(mh.z));
  const f = expmBlockUpperSmall(mh, normBlock);
  const f12 = f.y, f22 = f.z;
  let phi = transpose(f22);
  let q = symmetrize(mul(phi, f12));
  for (let k = 0; k < m; k++) {
    q = symmetrize(axpby(1, q, 1, mulT(mul(phi, q), phi)));
    phi = mul(phi, phi);
  }
  return { phi, q: sigma === 1 ? q : scale(q, 1 / sigma) };
}

/** G Gᵀ for a diagonal G with the given intensities (standard deviations of the noise per unit time). */
export function diagonalNoise(intensity: ArrayLike<number>): Mat {
  const n = intensity.length;
  const m = zeros(n);
  for (let i = 0; i < n; i++) m.data[i * n + i] = intensity[i] * intensity[i];
  return m;
}
