/**
 * One mechanism seen at three levels: within persons, between persons and
 * across a cross-section, from the model linearized at its equilibrium.
 *
 * Each person runs the same mechanism dX = (A X + B u) dt + G dW around an
 * equilibrium set by the person-level inputs u (traits, circumstances), which
 * vary across persons with the inputs' `personSD`. Then:
 * - the persons' equilibria vary with covariance S V Sᵀ, S = −A⁻¹B (the
 *   equilibrium's sensitivity to the inputs; for a nonlinear model by
 *   linearization at the equilibrium), V = diag(personSD²);
 * - within a person the states fluctuate around that equilibrium with the
 *   stationary covariance Σ (AΣ + ΣAᵀ + GGᵀ = 0);
 * - a study of T prompts at interval Δ sees each person's mean with sampling
 *   covariance C_T = (1/T)[Σ + Σ_{h=1}^{T−1} (1 − h/T)(Φ^h Σ + Σ Φ′^h)],
 *   Φ = e^{AΔ} (the variance of the mean of a stationary series: Hamilton,
 *   "Time Series Analysis", 1994, eq. 7.2.6, in matrix form; common practice);
 * - so the pooled within-person covariance (person-mean centred) is Σ − C_T,
 *   the covariance of the person means S V Sᵀ + C_T, and a one-time survey
 *   sees S V Sᵀ + Σ. A state slow against the study moves little within a
 *   person: its fluctuations show up as differences between persons.
 * Person differences in a link's strength (the link's `personSD` σ_l) move
 * the equilibrium too; by the delta method (first-order Taylor expansion of
 * x̄(w) around the strengths w, strengths independent across persons and of
 * the inputs) they add Σ_l σ_l² g_l g_lᵀ, g_l = ∂x̄/∂w_l (central differences
 * of the solved equilibrium). Only the equilibrium is taken to differ: each
 * person's fluctuations keep the model's drift.
 * Measurement error (a variable's `reliability` r, the share of true-score
 * within-person variance) adds e = Σ_ii(1 − r)/r per occasion: e(1 − 1/T)
 * within, e/T to the means, e to the cross-section.
 */
import { DEFAULT_SAMPLES, type Model, type VariableId } from '../model/types';
import { modelAxis, noiseOf } from '../study/convert';
import { studyPrompts } from '../study/schedule';
import { driftAtEquilibrium } from '../numeric/index';
import { solveEquilibrium } from '../numeric/equilibrium';
import { linkCounts, linkStrengths } from '../model/strength';
import { identity, luFactor, luSolveMat, mul, transpose, zeros, type Mat } from '../numeric/dense';
import { expm } from '../numeric/expm';
import { lyapunov } from '../numeric/lyapunov';
import { diagonalNoise } from '../numeric/expm';
import { residualGradient, type NumericSystem } from '../numeric/system';
import { scale } from '../numeric/dense';

export type Level = 'within' | 'between' | 'cross';
export const LEVELS: readonly Level[] = ['within', 'between', 'cross'];

export interface LevelOptions {
  /** The study's interval Δ (model time unit). */
  interval: number;
  /** Prompts per person T (default: the model's study length, else 50). */
  samples?: number;
  /** Persons in the study (default: the model's study, else 100). */
  persons?: number;
  /** The variables analysed (default: the states that carry a reliability, else every state). */
  observed?: VariableId[];
  /** Person differences to use instead of the model's: input id → SD across persons. */
  personSD?: Record<VariableId, number>;
}

export interface LevelCovariances {
  observed: VariableId[];
  interval: number;
  samples: number;
  persons: number;
  /** Inputs that differ across persons, with their SD. */
  personInputs: { id: VariableId; sd: number }[];
  /** Links whose strength differs across persons (their `personSD`), with the equilibrium's sensitivity ∂x̄/∂w over the states. */
  personLinks: { from: VariableId; to: VariableId; sd: number; gradient: number[] }[];
  /** Covariances over `observed`, rows. */
  within: number[][];
  between: number[][];
  cross: number[][];
  /** Covariance of the persons' equilibria S V Sᵀ. */
  equilibria: number[][];
  /** Stationary within-person covariance Σ. */
  stationary: number[][];
  /** Sampling covariance of a person's mean over T prompts, C_T. */
  meanError: number[][];
  /** Observations behind each level's covariance: persons × (T − 1) within, persons between and across. */
  n: Record<Level, number>;
  /** The full drift and the states (for the lagged matrix). */
  drift: Mat;
  states: VariableId[];
  noise: number[];
  warnings: string[];
}

export type LevelResult = ({ ok: true } & LevelCovariances) | { ok: false; reason: string };

/** Default persons when a study names none. */
export const DEFAULT_PERSONS = 100;

/** The variables a factor analysis looks at by default: measured states (with a reliability), else all states. */
export function defaultObserved(model: Model): VariableId[] {
  const states = model.variables.filter((v) => v.kind === 'state');
  const measured = states.filter((v) => v.reliability !== undefined);
  return (measured.length > 0 ? measured : states).map((v) => v.id);
}

/** ∂(rates)/∂(inputs) with the algebraic variables eliminated: B = G_u − G_z R_z⁻¹ R_u (cf. linearize.ts). */
function inputGain(system: NumericSystem, point: Float64Array, inputs: VariableId[]): Mat | string {
  const states = system.states;
  const n = states.length, q = inputs.length;
  const algebraic = system.ids.filter((_, i) => system.kinds[i] === 'derived');
  const algEqs = system.equations.filter((e) => e.kind !== 'rate');
  const m = algebraic.length;
  const su = new Map(inputs.map((u, i) => [system.slot.get(u)!, i]));
  const sz = new Map(algebraic.map((z, i) => [system.slot.get(z)!, i]));
  const Gu = zeros(n, q), Gz = zeros(n, m), Ru = zeros(m, q), Rz = zeros(m, m);
  for (const [i, x] of states.entries()) {
    const eq = system.byId.get(`rate(${x})`);
    if (!eq) return `the rate of ${x} could not be read`;
    for (const p of eq.partials) {
      const d = p.at(point);
      const a = su.get(p.slot), b = sz.get(p.slot);
      if (a !== undefined) Gu.data[i * q + a] += d;
      if (b !== undefined) Gz.data[i * m + b] += d;
    }
  }
  for (const [i, eq] of algEqs.entries()) {
    for (const [slot, d] of residualGradient(system, eq, point)) {
      const a = su.get(slot), b = sz.get(slot);
      if (a !== undefined) Ru.data[i * q + a] += d;
      if (b !== undefined) Rz.data[i * m + b] += d;
    }
  }
  if (m === 0) return Gu;
  const lu = luFactor(Rz);
  if (lu.singular) return 'the formulas and relations do not determine the derived variables at the equilibrium';
  const dz = luSolveMat(lu, Ru);
  const B = zeros(n, q);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < q; j++) {
      let s = Gu.data[i * q + j];
      for (let k = 0; k < m; k++) s -= Gz.data[i * m + k] * dz.data[k * q + j];
      B.data[i * q + j] = s;
    }
  return B;
}

/**
 * ∂x̄/∂w_l for every link with a person SD: the equilibrium solved with the
 * strength moved by ±h (central difference, h = 1e-4·max(1, |w|)).
 */
function linkDifferences(model: Model, states: VariableId[], warnings: string[]): LevelCovariances['personLinks'] | string {
  const strengths = linkStrengths(model);
  const out: LevelCovariances['personLinks'] = [];
  for (const [li, l] of model.links.entries()) {
    const sd = l.personSD ?? 0;
    if (!(sd > 0)) continue;
    const target = model.variables.find((v) => v.id === l.to);
    if (!linkCounts(model, l) || target?.rate !== undefined || target?.formula !== undefined) {
      warnings.push(`the strength of ${l.from} → ${l.to} does not enter the equations (${l.to} has its own ${target?.rate !== undefined ? 'rate' : 'formula'} or the link does not count), so its person SD is not used`);
      continue;
    }
    const w = strengths[li].value;
    const h = 1e-4 * Math.max(1, Math.abs(w));
    const at = (x: number) => {
      const links = model.links.map((k, i) => (i === li ? { ...k, weight: x } : k));
      const r = solveEquilibrium({ ...model, links });
      return r.ok ? states.map((s) => r.values[s]) : null;
    };
    const up = at(w + h), down = at(w - h);
    if (!up || !down) return `the equilibrium could not be solved with the strength of ${l.from} → ${l.to} moved slightly, so its person SD cannot be used`;
    out.push({ from: l.from, to: l.to, sd, gradient: up.map((x, i) => (x - down[i]) / (2 * h)) });
  }
  return out;
}

function sub(m: Mat, idx: number[]): number[][] {
  return idx.map((i) => idx.map((j) => m.data[i * m.cols + j]));
}

/**
 * The three covariances a study of a model would meet.
 * Example: `levelCovariances(model, { interval: 3, samples: 70, persons: 150 })`.
 */
export function levelCovariances(model: Model, options: LevelOptions): LevelResult {
  const warnings: string[] = [];
  if (!(options.interval > 0) || !Number.isFinite(options.interval)) return { ok: false, reason: `the interval must be a positive duration, not ${options.interval}` };
  // Prompts per person: the option, else the prompts the model's study plans at this interval (`studyPrompts`).
  let samples: number;
  try {
    samples = options.samples ?? (model.study ? studyPrompts(model.study, model.timeUnit, options.interval) : modelAxis(model).samples ?? DEFAULT_SAMPLES);
  } catch (e) {
    return { ok: false, reason: e instanceof Error ? e.message : String(e) };
  }
  if (!Number.isInteger(samples) || samples < 2) return { ok: false, reason: `the study needs at least 2 prompts per person, not ${samples}` };
  const persons = options.persons ?? (model.study?.persons !== undefined && model.study.persons >= 2 ? model.study.persons : DEFAULT_PERSONS);
  if (!Number.isInteger(persons) || persons < 2) return { ok: false, reason: `the study needs at least 2 persons, not ${persons}` };
  const d = driftAtEquilibrium(model);
  if (!d.ok) return { ok: false, reason: d.reason };
  warnings.push(...d.warnings);
  const states = d.states;
  const n = states.length;
  const observed = options.observed ?? defaultObserved(model);
  if (observed.length === 0) return { ok: false, reason: 'the model has no states to analyse' };
  const idx: number[] = [];
  for (const id of observed) {
    const i = states.indexOf(id);
    if (i < 0) return { ok: false, reason: `"${id}" is not a state of the model: only states are analysed (their covariance comes from the linearized dynamics)` };
    idx.push(i);
  }
  const noise = states.map((s) => noiseOf(model, s));
  const badNoise = states.find((s, i) => !(noise[i] >= 0) || !Number.isFinite(noise[i]));
  if (badNoise) return { ok: false, reason: `the noise of ${badNoise} must be a non-negative number` };
  const ly = lyapunov(d.drift, diagonalNoise(noise.map(Math.sqrt)));
  if (!ly.ok) return { ok: false, reason: `within persons the states have no stationary spread: ${ly.reason}` };
  const sigma = ly.sigma;

  // Person differences.
  const sdOf = (id: VariableId) => options.personSD?.[id] ?? model.variables.find((v) => v.id === id)?.personSD ?? 0;
  for (const id of Object.keys(options.personSD ?? {}))
    if (!model.variables.some((v) => v.id === id && v.kind === 'input')) return { ok: false, reason: `person differences apply to inputs; "${id}" is not an input of the model` };
  const personInputs = model.variables.filter((v) => v.kind === 'input' && sdOf(v.id) > 0).map((v) => ({ id: v.id, sd: sdOf(v.id) }));
  const equilibria = zeros(n);
  if (personInputs.length > 0) {
    const sys = d.equilibrium.system;
    const B = inputGain(sys, d.equilibrium.point, personInputs.map((p) => p.id));
    if (typeof B === 'string') return { ok: false, reason: B };
    const lu = luFactor(d.drift);
    if (lu.singular || lu.pivotRatio < 1e-14) return { ok: false, reason: 'the drift is singular (a state without self-regulation, or a loop without loss): the persons have no single equilibrium to differ in' };
    const S = scale(luSolveMat(lu, B), -1); // −A⁻¹B
    const q = personInputs.length;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let k = 0; k < q; k++) s += S.data[i * q + k] * personInputs[k].sd ** 2 * S.data[j * q + k];
        equilibria.data[i * n + j] = s;
      }
  }
  const personLinks = linkDifferences(model, states, warnings);
  if (typeof personLinks === 'string') return { ok: false, reason: personLinks };
  for (const l of personLinks)
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) equilibria.data[i * n + j] += l.sd ** 2 * l.gradient[i] * l.gradient[j];
  if (personInputs.length === 0 && personLinks.length === 0) warnings.push('no input differs across persons (no personSD): the persons share one equilibrium, so differences between them come only from slow within-person fluctuations');

  // C_T: covariance of a person's mean over T prompts.
  const phi = expm(scale(d.drift, options.interval));
  const meanErr = zeros(n);
  const T = samples;
  let power = identity(n);
  for (let i = 0; i < n * n; i++) meanErr.data[i] = sigma.data[i];
  const phiT = transpose(phi);
  let powerT = identity(n);
  for (let h = 1; h < T; h++) {
    power = mul(power, phi);
    powerT = mul(powerT, phiT);
    const w = 1 - h / T;
    const a = mul(power, sigma), b = mul(sigma, powerT);
    let small = true;
    for (let i = 0; i < n * n; i++) {
      const add = w * (a.data[i] + b.data[i]);
      meanErr.data[i] += add;
      if (Math.abs(add) > 1e-16 * Math.abs(meanErr.data[i])) small = false;
    }
    if (small) break; // Φ^h Σ has died away
  }
  for (let i = 0; i < n * n; i++) meanErr.data[i] /= T;

  // Measurement error from reliabilities.
  const err = new Float64Array(n);
  for (const [i, s] of states.entries()) {
    const r = model.variables.find((v) => v.id === s)?.reliability;
    if (r === undefined) continue;
    if (!(r > 0 && r <= 1)) return { ok: false, reason: `the reliability of ${s} must lie in (0, 1], not ${r}` };
    err[i] = (sigma.data[i * n + i] * (1 - r)) / r;
  }
  const within = zeros(n), between = zeros(n), cross = zeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const k = i * n + j;
      const e = i === j ? err[i] : 0;
      within.data[k] = sigma.data[k] - meanErr.data[k] + e * (1 - 1 / T);
      between.data[k] = equilibria.data[k] + meanErr.data[k] + e / T;
      cross.data[k] = equilibria.data[k] + sigma.data[k] + e;
    }
  const sym = (m: number[][]) => m.map((row, i) => row.map((x, j) => 0.5 * (x + m[j][i])));
  return {
    ok: true,
    observed,
    interval: options.interval,
    samples,
    persons,
    personInputs,
    personLinks,
    within: sym(sub(within, idx)),
    between: sym(sub(between, idx)),
    cross: sym(sub(cross, idx)),
    equilibria: sym(sub(equilibria, idx)),
    stationary: sym(sub(sigma, idx)),
    meanError: sym(sub(meanErr, idx)),
    n: { within: persons * (T - 1), between: persons, cross: persons },
    drift: d.drift,
    states,
    noise,
    warnings,
  };
}
