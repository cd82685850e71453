/**
 * Data from a known continuous-time model, for checking fits and for demo
 * data: exact discrete steps over each interval (Φ = e^{AΔ}, Q by Van Loan),
 * person levels drawn from N(μ, Ψ), measurement error, missing cells.
 * Deterministic for a seed (the app's one generator, src/core/stats/random.ts).
 */
import type { VariableId } from '../model/types';
import type { Panel, PersonSeries } from '../data/panel';
import { expm, vanLoan } from '../numeric/expm';
import { lyapunov } from '../numeric/lyapunov';
import { fromRows, type Mat } from '../numeric/dense';
import { seededRandom } from '../stats/random';

function cholLower(c: number[][]): number[][] {
  const n = c.length;
  const L = c.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = c[i][j];
      for (let k = 0; k < j; k++) s -= L[i][k] * L[j][k];
      L[i][j] = i === j ? Math.sqrt(Math.max(0, s)) : L[j][j] > 0 ? s / L[j][j] : 0;
    }
  return L;
}

function draw(L: number[][], z: () => number): number[] {
  const e = L.map(() => z());
  return L.map((row) => row.reduce((s, l, k) => s + l * e[k], 0));
}

export interface CtTruth {
  states: VariableId[];
  /** Which states are measured (default: all). */
  measured?: VariableId[];
  drift: number[][];
  /** G G′. */
  diffusion: number[][];
  /** Levels of the measured states. */
  levels?: number[];
  /** Between-person covariance of the levels. */
  between?: number[][];
  /** Measurement-error variances of the measured states. */
  error?: number[];
}

/**
 * Example: `simulateCt(truth, persons.map(() => times), { seed: 1, missing: 0.1 })`.
 * Each person starts from the stationary distribution of a stable drift.
 */
export function simulateCt(truth: CtTruth, times: number[][], opt: { seed: number; missing?: number; timeUnit?: Panel['timeUnit'] }): Panel {
  const n = truth.states.length;
  const measured = truth.measured ?? truth.states;
  const reads = measured.map((v) => truth.states.indexOf(v));
  const m = measured.length;
  const rng = seededRandom(opt.seed);
  const rand = (): number => rng.uniform();
  const z = (): number => rng.normal();
  const A: Mat = fromRows(truth.drift), GG: Mat = fromRows(truth.diffusion);
  const ly = lyapunov(A, GG);
  if (!ly.ok) throw new Error(ly.reason);
  const sigma = Array.from({ length: n }, (_, i) => Array.from(ly.sigma.data.subarray(i * n, (i + 1) * n)));
  const Ls = cholLower(sigma);
  const Lb = truth.between ? cholLower(truth.between) : null;
  const cache = new Map<number, { phi: Float64Array; Lq: number[][] }>();
  const step = (dt: number) => {
    let s = cache.get(dt);
    if (!s) {
      const phi = expm({ rows: n, cols: n, data: A.data.map((v) => v * dt) }).data;
      const q = vanLoan(A, GG, dt).q.data;
      s = { phi, Lq: cholLower(Array.from({ length: n }, (_, i) => Array.from(q.subarray(i * n, (i + 1) * n)))) };
      cache.set(dt, s);
    }
    return s;
  };
  const persons: PersonSeries[] = times.map((ts, p) => {
    const level = (truth.levels ?? new Array<number>(m).fill(0)).slice();
    if (Lb) draw(Lb, z).forEach((v, j) => { level[j] += v; });
    let x = draw(Ls, z);
    const values = new Float64Array(ts.length * m);
    ts.forEach((t, k) => {
      if (k > 0) {
        const { phi, Lq } = step(t - ts[k - 1]);
        const w = draw(Lq, z);
        x = x.map((_, i) => x.reduce((s, xj, j) => s + phi[i * n + j] * xj, 0) + w[i]);
      }
      for (let j = 0; j < m; j++) {
        const e = truth.error ? Math.sqrt(truth.error[j]) * z() : 0;
        values[k * m + j] = rand() < (opt.missing ?? 0) ? NaN : x[reads[j]] + level[j] + e;
      }
    });
    return { id: `p${p + 1}`, time: Float64Array.from(ts), values };
  });
  return { variables: measured, timeUnit: opt.timeUnit ?? 'h', persons };
}
