import { describe, expect, it } from 'vitest';
import { eigen, fromRows, get, inverse, mul, rankQR, toRows } from '../../../src/core/numeric/dense';
import { expm, vanLoan } from '../../../src/core/numeric/expm';
import { lyapunov } from '../../../src/core/numeric/lyapunov';
import { realSchur } from '../../../src/core/numeric/schur';
import { axpby, identity, mulT, normMax, transpose } from '../../../src/core/numeric/dense';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';
import { randomDiffusion, randomStable } from './random';

interface Reference {
  expm: number[][];
  phi: number[][];
  q: number[][];
  lyap?: number[][];
  eig_re: number[];
  eig_im: number[];
}

const REF = 'tests/reference/numeric_linalg.py';

/** Normwise relative check: every entry within relTol of the largest entry of the reference. */
function expectNormwise(actual: number[][], expected: number[][], relTol: number, label: string): void {
  const big = Math.max(...expected.flat().map(Math.abs));
  expectClose(actual, expected, { relTol, absTol: relTol * big }, label);
}

const SIZES = [2, 3, 5, 8, 12, 20, 40, 100];
const cases = SIZES.map((n, k) => ({
  n,
  seed: 1000 + k,
  a: randomStable(n, 1000 + k, 1.5, n >= 12 ? 2 : 0),
  c: randomDiffusion(n, 2000 + k),
  interval: [0.3, 1, 2.5, 0.7, 4, 1.5, 3, 0.5][k],
}));

describe('dense numerics against SciPy/NumPy (seeded random stable systems, 2 to 100 states)', () => {
  const refs = runPython<Reference[]>(REF, { cases: cases.map(({ a, c, interval }) => ({ a, c, interval })) });

  for (const [k, cs] of cases.entries()) {
    const ref = refs[k];
    const A = fromRows(cs.a);
    const C = fromRows(cs.c);

    it(`expm matches scipy.linalg.expm (n=${cs.n}, seed ${cs.seed})`, () => {
      // Reference: scipy.linalg.expm (Al-Mohy & Higham scaling and squaring).
      expectNormwise(toRows(expm(A)), ref.expm, 1e-10, `expm n=${cs.n} seed ${cs.seed}`);
    });

    it(`Van Loan Φ and Q match the block exponential in SciPy (n=${cs.n}, seed ${cs.seed})`, () => {
      // Reference: the defining integral by scipy.integrate.quad_vec over scipy.linalg.expm (Van Loan 1978 defines Q this way).
      const { phi, q } = vanLoan(A, C, cs.interval);
      expectNormwise(toRows(phi), ref.phi, 1e-10, `Φ n=${cs.n} seed ${cs.seed}`);
      expectNormwise(toRows(q), ref.q, 1e-10, `Q n=${cs.n} seed ${cs.seed}`);
    });

    it(`Lyapunov matches scipy.linalg.solve_continuous_lyapunov (n=${cs.n}, seed ${cs.seed})`, () => {
      expect(ref.lyap, 'reference says the matrix is stable').toBeDefined();
      const r = lyapunov(A, C);
      if (!r.ok) throw new Error(r.reason);
      expect(r.method).toBe(cs.n <= 10 ? 'kronecker' : 'bartels-stewart');
      expectNormwise(toRows(r.sigma), ref.lyap!, 1e-10, `Σ n=${cs.n} seed ${cs.seed}`);
    });

    it(`eigenvalues match numpy.linalg.eigvals (n=${cs.n}, seed ${cs.seed})`, () => {
      const e = eigen(A);
      const scaleA = Math.max(...cs.a.flat().map(Math.abs));
      const used = new Set<number>();
      for (let i = 0; i < cs.n; i++) {
        let best = -1, dist = Infinity;
        for (let j = 0; j < cs.n; j++) {
          if (used.has(j)) continue;
          const d = Math.hypot(e.re[j] - ref.eig_re[i], e.im[j] - ref.eig_im[i]);
          if (d < dist) { dist = d; best = j; }
        }
        used.add(best);
        expect(dist, `eigenvalue ${ref.eig_re[i]}+${ref.eig_im[i]}i, n=${cs.n} seed ${cs.seed}`).toBeLessThan(1e-10 * scaleA * Math.max(1, cs.n / 10));
      }
      // A v = λ v for the packed real eigenvectors.
      const AV = mul(A, e.vectors);
      for (let j = 0; j < cs.n; j++) {
        const pair = e.im[j] !== 0;
        for (let i = 0; i < cs.n; i++) {
          if (!pair) {
            expect(Math.abs(get(AV, i, j) - e.re[j] * get(e.vectors, i, j))).toBeLessThan(1e-9 * scaleA);
          } else if (e.im[j] > 0) {
            const vr = get(e.vectors, i, j), vi = get(e.vectors, i, j + 1);
            const lr = e.re[j], li = e.im[j];
            expect(Math.abs(get(AV, i, j) - (lr * vr - li * vi))).toBeLessThan(1e-9 * scaleA);
            expect(Math.abs(get(AV, i, j + 1) - (lr * vi + li * vr))).toBeLessThan(1e-9 * scaleA);
          }
        }
      }
    });
  }
});

describe('real Schur decomposition', () => {
  it('A = Z T Zᵀ with Z orthogonal and T quasi-triangular (definition, Golub & Van Loan Thm 7.4.1), on seeded 3 to 100 state drifts', () => {
    for (const [n, seed] of [[3, 11], [17, 12], [60, 13], [100, 14]]) {
      const A = fromRows(randomStable(n, seed, 1.5, 2));
      const s = realSchur(A);
      expect(normMax(axpby(1, mulT(mul(s.z, s.t), s.z), -1, A)) / normMax(A), `reconstruction n=${n}`).toBeLessThan(1e-13);
      expect(normMax(axpby(1, mul(transpose(s.z), s.z), -1, identity(n))), `orthogonality n=${n}`).toBeLessThan(1e-13);
      for (let i = 0; i < n; i++) for (let j = 0; j < i - 1; j++) expect(s.t.data[i * n + j]).toBe(0);
      for (let b = 0; b + 1 < s.blocks.length; b++) {
        const next = s.blocks[b + 1].start;
        expect(s.t.data[next * n + next - 1], 'no coupling between blocks').toBe(0);
      }
    }
  });
});

describe('hard cases for the exponential and the noise integral', () => {
  it('Van Loan stays accurate for a large ‖A‖Δ, a singular and an unstable drift (against SciPy)', () => {
    const hard = [
      { a: [[-50, 3], [0.5, -0.02]], c: [[1, 0.2], [0.2, 2]], interval: 40 }, // stiff, ‖A‖Δ = 2000
      { a: [[0, 1], [0, 0]], c: [[0, 0], [0, 1]], interval: 3 }, // singular (integrated random walk)
      { a: [[0.3, 1], [-1, 0.3]], c: [[1, 0], [0, 1]], interval: 5 }, // unstable oscillation
    ];
    const refs = runPython<Reference[]>(REF, { cases: hard });
    for (const [k, h] of hard.entries()) {
      const { phi, q } = vanLoan(fromRows(h.a), fromRows(h.c), h.interval);
      expectNormwise(toRows(phi), refs[k].phi, 1e-10, `Φ hard case ${k}`);
      expectNormwise(toRows(q), refs[k].q, 1e-9, `Q hard case ${k}`);
    }
    // Integrated random walk: Q(Δ) = [[Δ³/3, Δ²/2], [Δ²/2, Δ]] (a closed form, common practice).
    const { q } = vanLoan(fromRows(hard[1].a), fromRows(hard[1].c), 3);
    expectClose(toRows(q), [[9, 4.5], [4.5, 3]], {}, 'integrated random walk Q');
  });

  it('with no drift at all, Φ = I and Q(Δ) = Δ·G Gᵀ (pure diffusion, closed form, common practice)', () => {
    const { phi, q } = vanLoan(fromRows([[0, 0], [0, 0]]), fromRows([[400, 30], [30, 9]]), 5);
    expectClose(toRows(phi), [[1, 0], [0, 1]]);
    expectClose(toRows(q), [[2000, 150], [150, 45]]);
  });

  it('expm of a rotation generator is a rotation (closed form, common practice)', () => {
    const r = expm(fromRows([[0, 2], [-2, 0]]));
    expectClose(toRows(r), [[Math.cos(2), Math.sin(2)], [-Math.sin(2), Math.cos(2)]]);
  });

  it('Lyapunov refuses an unstable drift and names the problem', () => {
    const r = lyapunov(fromRows([[0.1, 0], [0, -1]]), fromRows([[1, 0], [0, 1]]));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/not stable/);
  });

  it('rank by pivoted QR finds dependent columns (numpy.linalg.matrix_rank gives 2 for this matrix, checked in SciPy below)', () => {
    const m = [[1, 2, 3], [2, 4, 6.0000000001], [1, 0, 1]];
    const dep = [[1, 1, 0], [-1, -1, 0], [2, 3, 1]]; // column 2 = columns 0+1 ... rows sum to zero
    const refRank = runPython<number[]>('tests/reference/numeric_rank.py', { matrices: [m, dep] });
    expect(rankQR(fromRows(m)).rank).toBe(refRank[0]);
    expect(rankQR(fromRows(dep)).rank).toBe(refRank[1]);
    const inv = inverse(fromRows([[4, 7], [2, 6]]));
    expectClose(toRows(inv), [[0.6, -0.7], [-0.2, 0.4]], {}, 'inverse (hand computation, common practice)');
  });
});
