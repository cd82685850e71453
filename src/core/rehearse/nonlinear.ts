/**
 * Synthetic studies of a nonlinear mechanism: each person's states follow the model's own rates,
 * dX = f(X) dt + G dW, integrated by Euler–Maruyama (`numeric/stochastic.ts`) on a step of
 * 1/20 of the fastest timescale of the mechanism at its equilibrium (1/|λ|max of the drift), and
 * read at the person's prompt times with measurement error. A linear mechanism keeps the exact
 * discrete model (`simulate.ts`); analytic and Monte Carlo power use the linearization.
 *
 * Person differences are drawn as for the linear process (each varying input, then each varying
 * link strength, one normal each) but enter the model itself: the person's inputs and strengths
 * are set in the model, and the person starts near their own equilibrium (the linearized
 * stationary spread), then runs a burn-in of three slowest timescales (at most 5,000 steps).
 */
import type { Model, VariableId } from '../model/types';
import type { Panel, PersonSeries } from '../data/panel';
import { algebraicSolver } from '../numeric/simulate';
import { linearize } from '../numeric/linearize';
import { solveEquilibrium } from '../numeric/equilibrium';
import { eigenvalues, type Mat } from '../numeric/dense';
import { eulerMaruyama, type SdeSystem } from '../numeric/stochastic';
import type { Random } from '../stats/random';
import { choleskyPsd, personSeries, type PersonPrompts } from './simulate';
import type { StudyProcess } from './process';

/** Steps per fastest timescale. */
export const STEPS_PER_TIMESCALE = 20;
/** The burn-in before the first prompt: this many slowest timescales, at most `BURN_IN_STEPS` steps. */
const BURN_IN_TIMESCALES = 3, BURN_IN_STEPS = 5000;

export interface IntegratorChoice {
  method: 'euler-maruyama';
  /** The longest step, in the model's time unit. */
  step: number;
  /** The fastest and slowest timescales of the drift at equilibrium. */
  fastest: number;
  slowest: number;
}

function timescales(drift: Mat): { fastest: number; slowest: number } {
  const ev = eigenvalues(drift);
  let big = 0, small = Infinity;
  for (let i = 0; i < ev.re.length; i++) {
    const m = Math.hypot(ev.re[i], ev.im[i]);
    big = Math.max(big, m);
    if (ev.re[i] < 0) small = Math.min(small, -ev.re[i]);
  }
  return { fastest: big > 0 ? 1 / big : Infinity, slowest: Number.isFinite(small) ? 1 / small : Infinity };
}

/**
 * Whether the mechanism is nonlinear over the spread a study sees: a sketch is linear; otherwise
 * the drift is compared at the equilibrium and one stationary SD either side of it along each state.
 * Example: `isNonlinear(model, studyProcess(model), stationary)`.
 */
export function isNonlinear(model: Model, process: StudyProcess, stationary: Mat): boolean {
  const eq = solveEquilibrium(model);
  const sys = eq.system;
  if (sys.equations.every((e) => e.fromLinks) || !eq.ok) return false;
  const solve = algebraicSolver(sys, model);
  const base = process.base.drift;
  const scaleOf = Math.max(1e-300, ...Array.from(base.data, Math.abs));
  const n = process.states.length;
  for (let k = 0; k < n; k++) {
    const sd = Math.sqrt(Math.max(0, stationary.data[k * n + k])) || 1;
    for (const sign of [1, -1]) {
      const v = eq.point.slice();
      v[sys.slot.get(process.states[k])!] += sign * sd;
      if (solve(v) !== null) return true; // not solvable there: not verified linear (the integrator will say what fails)
      const lin = linearize(sys, v);
      if (!lin.ok) return true;
      for (let x = 0; x < base.data.length; x++) if (Math.abs(lin.drift.data[x] - base.data[x]) > 1e-7 * scaleOf) return true;
    }
  }
  return false;
}

/**
 * How a study is simulated, in words. Example: `simulatorText(null, fmt)` → "the exact discrete model…".
 * `format` writes a duration in the model's unit.
 */
export function simulatorText(choice: IntegratorChoice | null, format: (x: number) => string): string {
  if (!choice) return 'the exact discrete model of each gap between prompts (a linear mechanism)';
  return `Euler–Maruyama on the model's own nonlinear rates, with steps of at most ${format(choice.step)} (1/${STEPS_PER_TIMESCALE} of the fastest timescale, ${format(choice.fastest)})`;
}

/** The integrator and its step for a mechanism with this drift at equilibrium. */
export function integratorFor(drift: Mat): IntegratorChoice {
  const { fastest, slowest } = timescales(drift);
  if (!Number.isFinite(fastest)) throw new Error('the mechanism has no timescale (its drift is zero): it cannot be integrated');
  return { method: 'euler-maruyama', step: fastest / STEPS_PER_TIMESCALE, fastest, slowest };
}

/** The model of one person: the varying inputs and link strengths drawn (same order of draws as `drawPerson`). */
export function personModel(model: Model, process: StudyProcess, rng: Random): Model {
  if (process.inputs.length === 0 && process.links.length === 0) return model;
  const inputs = new Map<VariableId, number>();
  for (const u of process.inputs) inputs.set(u.id, u.sd * rng.normal());
  const links: number[] = process.links.map((l) => l.sd * rng.normal());
  let k = 0;
  return {
    ...model,
    variables: model.variables.map((v) => (inputs.has(v.id) ? { ...v, value: (v.value ?? 0) + inputs.get(v.id)! } : v)),
    links: model.links.map((l) => (l.personSD && l.personSD > 0 ? { ...l, weight: (l.weight ?? 1) + links[k++] } : l)),
  };
}

/**
 * One person of a nonlinear study: start near the person's equilibrium, burn in, then integrate
 * across the prompt times and measure with error. `stationary` is the base person's linearized
 * stationary covariance (the start's spread).
 */
export function simulateNonlinearPerson(model: Model, states: readonly VariableId[], noise: ArrayLike<number>, stationary: Mat, choice: IntegratorChoice, prompts: PersonPrompts, errorVariance: ArrayLike<number>, rng: Random): PersonSeries {
  const eq = solveEquilibrium(model);
  if (!eq.ok) throw new Error(`person ${prompts.id}: ${eq.diagnostics.find((d) => d.level === 'error')?.message ?? 'the equilibrium cannot be found'}`);
  const sys = eq.system;
  const solve = algebraicSolver(sys, model);
  const n = states.length;
  const slots = states.map((s) => sys.slot.get(s)!);
  const rates = states.map((s) => {
    const r = sys.byId.get(`rate(${s})`);
    if (!r) throw new Error(`the rate of ${s} could not be read`);
    return r;
  });
  const v = eq.point.slice();
  const sde: SdeSystem = {
    n,
    diffusion: Array.from(noise, (x) => Math.sqrt(x)),
    drift(y, dy) {
      for (let i = 0; i < n; i++) v[slots[i]] = y[i];
      if (solve(v) !== null) return false;
      for (let i = 0; i < n; i++) dy[i] = rates[i].value(v);
      return true;
    },
  };
  const normal = () => rng.normal();
  const chol = choleskyPsd(stationary);
  const z = Array.from({ length: n }, () => rng.normal());
  const y0 = slots.map((s, i) => {
    let d = 0;
    for (let k = 0; k <= i; k++) d += chol.data[i * n + k] * z[k];
    return eq.point[s] + d;
  });
  const burn = Math.min(BURN_IN_TIMESCALES * choice.slowest, BURN_IN_STEPS * choice.step);
  const start = burn > 0 && Number.isFinite(burn) ? eulerMaruyama(sde, y0, [0, burn], { step: choice.step, normal }).subarray(n, 2 * n) : Float64Array.from(y0);
  const times = Float64Array.from(prompts.times);
  const path = times.length > 0 ? eulerMaruyama(sde, start, times, { step: choice.step, normal }) : new Float64Array(0);
  const values = new Float64Array(path.length);
  for (let k = 0; k < times.length; k++)
    for (let i = 0; i < n; i++) {
      const ev = errorVariance[i];
      values[k * n + i] = path[k * n + i] + (ev > 0 ? Math.sqrt(ev) * rng.normal() : 0);
    }
  return personSeries(prompts, times, values);
}

/** Every person of a nonlinear study (person i on `rng.fork(i)`), as `simulatePanel` does for a linear one. */
export function simulateNonlinearPanel(models: (person: number) => Model, prompts: readonly PersonPrompts[], opt: { states: VariableId[]; noise: ArrayLike<number>; stationary: Mat; choice: IntegratorChoice; errorVariance: ArrayLike<number>; timeUnit: Panel['timeUnit'] }, rng: Random): Panel {
  return {
    variables: opt.states.slice(),
    timeUnit: opt.timeUnit,
    persons: prompts.map((p, i) => simulateNonlinearPerson(models(i), opt.states, opt.noise, opt.stationary, opt.choice, p, opt.errorVariance, rng.fork(i))),
  };
}
