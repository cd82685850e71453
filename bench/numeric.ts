// Numerics benchmark: each figure beside the same measurement of SciPy (timed
// inside Python, in the same run). Run alone with `npx tsx bench/numeric.ts`.
import { compile as mathjsCompile } from 'mathjs';
import { fileURLToPath } from 'node:url';
import { compileExpression } from '../src/core/expr/compile';
import { parseExpression } from '../src/core/expr/parse';
import { fromRows, normMax, toRows, axpby, type Mat } from '../src/core/numeric/dense';
import { expm, vanLoan } from '../src/core/numeric/expm';
import { integrateRadau, type OdeProblem } from '../src/core/numeric/radau';
import { runPython } from '../tests/helpers/python';
import { randomDiffusion, randomStable } from '../tests/core/numeric/random';

interface PyBench {
  expm: number[][];
  expm_s: number;
  phi: number[][];
  q: number[][];
  vanloan_s: number;
  rob_values: number[][];
  rob_nfev: number;
  rob_s: number;
  rob_tight: number[][];
}

function medianMs(fn: () => void, repeat = 15): number {
  for (let k = 0; k < 3; k++) fn(); // warm-up: the JIT compiles the kernels first
  const ts: number[] = [];
  for (let k = 0; k < repeat; k++) {
    const t0 = performance.now();
    fn();
    ts.push(performance.now() - t0);
  }
  ts.sort((a, b) => a - b);
  return ts[Math.floor(ts.length / 2)];
}

function relErr(a: Mat, ref: number[][]): number {
  const r = fromRows(ref);
  return normMax(axpby(1, a, -1, r)) / normMax(r);
}

const robertson: OdeProblem = {
  n: 3,
  rhs(_t, y, d) {
    d[0] = -0.04 * y[0] + 1e4 * y[1] * y[2];
    d[1] = 0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] * y[1];
    d[2] = 3e7 * y[1] * y[1];
  },
  jacobian(_t, y, J) {
    J.data.set([-0.04, 1e4 * y[2], 1e4 * y[1], 0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1], 0, 6e7 * y[1], 0]);
  },
};

/** Largest componentwise error scaled by (atol + rtol·|ref|): ≤ 1 means within tolerance. */
function tolErr(values: ArrayLike<number>[], ref: number[][], rtol: number, atol: number): number {
  let worst = 0;
  values.forEach((v, k) => { for (let i = 0; i < ref[k].length; i++) worst = Math.max(worst, Math.abs(v[i] - ref[k][i]) / (atol + rtol * Math.abs(ref[k][i]))); });
  return worst;
}

export async function benchNumeric(): Promise<void> {
  // One BLAS thread for NumPy/SciPy: the machine is shared, and JS runs on one thread too.
  for (const k of ['OPENBLAS_NUM_THREADS', 'OMP_NUM_THREADS', 'MKL_NUM_THREADS']) process.env[k] ??= '1';
  const n = 100;
  // A moderate norm (‖A‖Δ ≈ 10), so the block exponential SciPy is timed on is itself accurate.
  const a = randomStable(n, 4242, 1.5, 0);
  const c = randomDiffusion(n, 4343);
  const interval = 1;
  const rob = { rtol: 1e-6, atol: 1e-10, times: [1e-3, 1, 10, 100, 1e3, 1e4, 1e5] };
  const py = runPython<PyBench>(fileURLToPath(new URL('../tests/reference/numeric_bench.py', import.meta.url)), { a, c, interval, robertson: rob });
  const A = fromRows(a), C = fromRows(c);

  let E: Mat = A;
  const tExpm = medianMs(() => { E = expm(A); });
  console.log(`expm ${n}×${n}: ${tExpm.toFixed(2)} ms (SciPy ${(py.expm_s * 1e3).toFixed(2)} ms, ratio ${(tExpm / (py.expm_s * 1e3)).toFixed(1)}×; goal < 20 ms ${tExpm < 20 ? 'met' : 'NOT met'}); error vs SciPy ${relErr(E, py.expm).toExponential(2)}`);

  let vl = vanLoan(A, C, interval);
  const tVl = medianMs(() => { vl = vanLoan(A, C, interval); }, 7);
  console.log(`Van Loan Φ, Q ${n}×${n} (Δ = ${interval}): ${tVl.toFixed(1)} ms (SciPy block expm ${(py.vanloan_s * 1e3).toFixed(1)} ms, ratio ${(tVl / (py.vanloan_s * 1e3)).toFixed(1)}×); error vs SciPy Φ ${relErr(vl.phi, py.phi).toExponential(2)}, Q ${relErr(vl.q, py.q).toExponential(2)}`);

  const text = 'k * (a - b) + exp(-c) * sin(a) - b^2 / (1 + c^2)';
  const names = ['a', 'b', 'c', 'k'];
  const p = parseExpression(text, new Set(names));
  if (!p.ok) throw new Error(p.error.message);
  const f = compileExpression(p.node, new Map(names.map((x, i) => [x, i])));
  const v = Float64Array.of(0.3, 0.7, 1.1, 2);
  const N = 5_000_000;
  let acc = 0;
  for (let k = 0; k < 100_000; k++) { v[0] = k * 1e-6; acc += f(v); }
  let t0 = performance.now();
  for (let k = 0; k < N; k++) { v[0] = k * 1e-7; acc += f(v); }
  const ours = N / ((performance.now() - t0) / 1e3);
  const mj = mathjsCompile(text);
  const scope = { a: 0.3, b: 0.7, c: 1.1, k: 2 };
  const M = 200_000;
  t0 = performance.now();
  for (let k = 0; k < M; k++) { scope.a = k * 1e-7; acc += mj.evaluate(scope) as number; }
  const theirs = M / ((performance.now() - t0) / 1e3);
  console.log(`compiled formula "${text}": ${(ours / 1e6).toFixed(1)} M evaluations/s (mathjs compiled evaluate ${(theirs / 1e6).toFixed(2)} M/s, ratio ${(ours / theirs).toFixed(0)}×; goal ≥ 10 M/s ${ours >= 1e7 ? 'met' : 'NOT met'})${acc === 0.123 ? '' : ''}`);

  let res = integrateRadau(robertson, 0, Float64Array.of(1, 0, 0), rob.times, { rtol: rob.rtol, atol: rob.atol });
  const tRob = medianMs(() => { res = integrateRadau(robertson, 0, Float64Array.of(1, 0, 0), rob.times, { rtol: rob.rtol, atol: rob.atol }); }, 5);
  const errOurs = tolErr(res.values, py.rob_tight, rob.rtol, rob.atol);
  const errPy = tolErr(py.rob_values, py.rob_tight, rob.rtol, rob.atol);
  console.log(
    `Robertson to t = 1e5 (rtol ${rob.rtol}, atol ${rob.atol}): ${res.stats.nfev} RHS evaluations, ${res.stats.steps} steps, ${tRob.toFixed(1)} ms, error ${errOurs.toFixed(2)}× tolerance vs a SciPy rtol 1e-12 reference` +
      ` | SciPy Radau: ${py.rob_nfev} RHS evaluations, ${(py.rob_s * 1e3).toFixed(1)} ms, error ${errPy.toFixed(2)}× tolerance` +
      ` | goal: no more evaluations than SciPy ${res.stats.nfev <= py.rob_nfev ? 'met' : 'NOT met'}, within tolerance ${errOurs <= 1 ? 'met' : 'NOT met'}`,
  );
  void toRows;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await benchNumeric();
