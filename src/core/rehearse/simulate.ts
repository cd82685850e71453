/**
 * Synthetic studies of a linear(ized) mechanism: each person's states follow
 * dX = A (X − μ) dt + G dW, observed at the person's own prompt times with measurement error.
 *
 * Between two prompts Δ apart the exact discrete model holds (common practice for linear
 * stochastic differential equations): X(t+Δ) − μ = Φ(Δ)(X(t) − μ) + w, w ~ N(0, Q(Δ)), with
 * Φ = e^{AΔ} and, for a stable drift, Q(Δ) = Σ − Φ Σ Φᵀ (Σ the stationary covariance),
 * which stays positive semidefinite across long gaps; otherwise Van Loan's integral.
 * Each person starts from the stationary distribution, so the study samples a process
 * that has run long before the first prompt.
 */
import type { VariableId } from '../model/types';
import type { Panel, PersonSeries } from '../data/panel';
import { expm, vanLoan, diagonalNoise } from '../numeric/expm';
import { axpby, mul, mulT, scale, symmetrize, type Mat } from '../numeric/dense';
import { lyapunov } from '../numeric/lyapunov';
import type { Random } from '../stats/random';

/** One person's linear process. */
export interface PersonProcess {
  drift: Mat;
  /** Diagonal of G Gᵀ: the variance each state gains per unit time. */
  noise: ArrayLike<number>;
  /** The level the states return to (the person's equilibrium). */
  mean: ArrayLike<number>;
}

/** When one person is prompted, and which prompts are answered. */
export interface PersonPrompts {
  id: string;
  /** Prompt times in the model's time unit, increasing. */
  times: ArrayLike<number>;
  day?: ArrayLike<number>;
  prompt?: ArrayLike<number>;
}

export interface StudySimulationOptions {
  states: VariableId[];
  /** Measurement error variance of each state (0: measured without error). */
  errorVariance: ArrayLike<number>;
  timeUnit: Panel['timeUnit'];
}

/** Cholesky factor of a positive semidefinite matrix (pivots below round-off are set to zero). */
export function choleskyPsd(m: Mat): Mat {
  const n = m.rows;
  const l = { rows: n, cols: n, data: new Float64Array(n * n) };
  const tol = 1e-13 * Math.max(1e-300, ...Array.from({ length: n }, (_, i) => Math.abs(m.data[i * n + i])));
  for (let j = 0; j < n; j++) {
    let d = m.data[j * n + j];
    for (let k = 0; k < j; k++) d -= l.data[j * n + k] ** 2;
    if (d < -1e3 * tol) throw new Error(`the covariance is not positive semidefinite (pivot ${d.toExponential(3)} at ${j})`);
    const ljj = d > tol ? Math.sqrt(d) : 0;
    l.data[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = m.data[i * n + j];
      for (let k = 0; k < j; k++) s -= l.data[i * n + k] * l.data[j * n + k];
      l.data[i * n + j] = ljj > 0 ? s / ljj : 0;
    }
  }
  return l;
}

/** Φ(Δ) and the Cholesky factor of Q(Δ) for one process, cached by gap. */
export function gapTransitions(process: PersonProcess): { stationary: Mat | null; at(gap: number): { phi: Mat; qChol: Mat } } {
  const gg = diagonalNoise(Array.from(process.noise, (x) => Math.sqrt(x)));
  const ly = lyapunov(process.drift, gg);
  const stationary = ly.ok ? ly.sigma : null;
  const cache = new Map<number, { phi: Mat; qChol: Mat }>();
  return {
    stationary,
    at(gap) {
      let hit = cache.get(gap);
      if (!hit) {
        let phi: Mat, q: Mat;
        if (stationary) {
          phi = expm(scale(process.drift, gap));
          q = symmetrize(axpby(1, stationary, -1, mulT(mul(phi, stationary), phi)));
        } else ({ phi, q } = vanLoan(process.drift, gg, gap));
        hit = { phi, qChol: choleskyPsd(q) };
        if (cache.size > 4096) cache.clear();
        cache.set(gap, hit);
      }
      return hit;
    },
  };
}

const transitionCache = new WeakMap<PersonProcess, ReturnType<typeof gapTransitions>>();

/**
 * Simulate one person: the states at each prompt, then the measurements (state + error).
 * Throws when the process has no stationary distribution (a growing or undamped mode):
 * a study of such a person has no start to draw from.
 */
export function simulatePerson(process: PersonProcess, prompts: PersonPrompts, opt: StudySimulationOptions, rng: Random): PersonSeries {
  const n = opt.states.length;
  // Persons without differences share one process object: its transitions are worked out once.
  let tr = transitionCache.get(process);
  if (!tr) {
    tr = gapTransitions(process);
    transitionCache.set(process, tr);
  }
  if (!tr.stationary) throw new Error('the mechanism has no stationary distribution (a state grows or drifts without bound), so a study of it cannot be simulated from a steady start: make every state self-regulating or lower the loop gains');
  const start = choleskyPsd(tr.stationary);
  const times = Float64Array.from(prompts.times);
  const m = times.length;
  const values = new Float64Array(m * n);
  const x = new Float64Array(n), z = new Float64Array(n), next = new Float64Array(n);
  const draw = (chol: Mat, out: Float64Array) => {
    for (let i = 0; i < n; i++) z[i] = rng.normal();
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let k = 0; k <= i; k++) s += chol.data[i * n + k] * z[k];
      out[i] = s;
    }
  };
  draw(start, x);
  for (let k = 0; k < m; k++) {
    if (k > 0) {
      const gap = times[k] - times[k - 1];
      if (!(gap > 0)) throw new Error(`prompt times of person ${prompts.id} must increase (prompt ${k + 1} is not after prompt ${k})`);
      const { phi, qChol } = tr.at(gap);
      draw(qChol, next);
      for (let i = 0; i < n; i++) {
        let s = next[i];
        for (let j = 0; j < n; j++) s += phi.data[i * n + j] * x[j];
        z[i] = s;
      }
      x.set(z.subarray(0, n));
    }
    for (let i = 0; i < n; i++) {
      const ev = opt.errorVariance[i];
      values[k * n + i] = process.mean[i] + x[i] + (ev > 0 ? Math.sqrt(ev) * rng.normal() : 0);
    }
  }
  return personSeries(prompts, times, values);
}

/** Simulate every person (person i on stream `rng.fork(i)`, so adding persons keeps the first ones). */
export function simulatePanel(processes: (person: number) => PersonProcess, prompts: readonly PersonPrompts[], opt: StudySimulationOptions, rng: Random): Panel {
  return {
    variables: opt.states.slice(),
    timeUnit: opt.timeUnit,
    persons: prompts.map((p, i) => simulatePerson(processes(i), p, opt, rng.fork(i))),
  };
}

/** One person's simulated series on their prompts (day and prompt numbers kept when planned). */
export function personSeries(prompts: PersonPrompts, times: Float64Array, values: Float64Array): PersonSeries {
  return {
    id: prompts.id,
    time: times,
    ...(prompts.day ? { day: Int32Array.from(prompts.day) } : {}),
    ...(prompts.prompt ? { prompt: Int32Array.from(prompts.prompt) } : {}),
    values,
  };
}
