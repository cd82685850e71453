/**
 * From a model file's study to a rehearsal: who is prompted when (`promptPlan`), the process
 * each person follows (`studyProcess`: drift at equilibrium, noise per state, person
 * differences), the measurement error each variable's reliability implies, and the links
 * whose power is asked for. Pure core: the CLI and the app build their runs from it.
 */
import type { Model, Study, TimeUnit, VariableId } from '../model/types';
import type { Panel } from '../data/panel';
import type { VarOptions } from '../fit/var';
import { diagonalNoise } from '../numeric/expm';
import { lyapunov } from '../numeric/lyapunov';
import type { Mat } from '../numeric/dense';
import { DEFAULT_PERSONS, DEFAULT_SEED, answeredOccasions, plannedSlots, promptPlan, reliabilityOf, studyOfModel } from '../study/index';
import { seededRandom, type Random } from '../stats/random';
import { drawPerson, studyProcess } from './process';
import { integratorFor, isNonlinear, personModel, simulateNonlinearPanel, type IntegratorChoice } from './nonlinear';
import { simulatePanel, type PersonPrompts } from './simulate';
import type { LinkOfInterest, RehearsalSetup } from './montecarlo';
import { labelOf } from '../../present/index';

function nameOf(model: Model, id: VariableId): string {
  const label = labelOf(model, id);
  return label && label !== id ? `${label} (${id})` : id;
}

/** A variable by id, else by label (case and surrounding spaces ignored). */
function resolveVariable(model: Model, text: string, where: string): VariableId {
  const t = text.trim();
  if (!t) throw new Error(`${where}: a variable name is missing`);
  const byId = model.variables.find((v) => v.id === t);
  if (byId) return byId.id;
  const byLabel = model.variables.filter((v) => (v.label ?? '').trim().toLowerCase() === t.toLowerCase());
  if (byLabel.length === 1) return byLabel[0].id;
  if (byLabel.length > 1) throw new Error(`${where}: "${t}" is the label of ${byLabel.length} variables (${byLabel.map((v) => v.id).join(', ')}): use the id`);
  throw new Error(`${where}: "${t}" is not a variable of the model (its variables: ${model.variables.map((v) => nameOf(model, v.id)).join(', ')})`);
}

/**
 * Links of interest from text: "from->to" pairs separated by commas ("→" also works), each
 * side an id or a label. Example: `linksOfText(model, "stress->mood, Sleep debt->mood")`.
 */
export function linksOfText(model: Model, text: string): LinkOfInterest[] {
  const parts = text.split(',').map((s) => s.trim()).filter((s) => s.length > 0);
  if (parts.length === 0) throw new Error('--link: name at least one link as from->to');
  return parts.map((p) => {
    const m = /^(.*?)(?:->|→)(.*)$/.exec(p);
    if (!m) throw new Error(`--link "${p}": write a link as from->to`);
    const where = `--link "${p}"`;
    return { from: resolveVariable(model, m[1], where), to: resolveVariable(model, m[2], where) };
  });
}

export interface RehearsalOverrides {
  persons?: number;
  seed?: number;
  /** Replaces parts of the model's study (interval, length, schedule, missed prompts). */
  study?: Partial<Study>;
  links?: LinkOfInterest[];
  alpha?: number;
  analysis?: VarOptions;
  /** How Monte Carlo analyses each simulated study: the VAR (default) or the continuous-time fit. */
  method?: 'var' | 'ct';
}

export interface Rehearsal extends RehearsalSetup {
  model: Model;
  study: Study;
  persons: number;
  /** Stationary covariance of the states (base person). */
  stationary: Mat;
  /** Reliability of each state's measurement (share of true-score variance). */
  reliability: Float64Array;
  /** Planned prompts per person, and the expected answered ones. */
  plannedPerPerson: number;
  answeredPerPerson: number;
  /**
   * How `simulateStudy` simulates: null for a linear mechanism (the exact discrete model of each
   * gap), else Euler–Maruyama on the model's own rates with its step. Power (analytic and Monte
   * Carlo) uses the linearization at equilibrium either way.
   */
  integrator: IntegratorChoice | null;
}

/**
 * The rehearsal of a model's study with flags applied.
 * Example: `rehearsalOf(model, { persons: 50, links: linksOfText(model, "a->b") })`.
 */
export function rehearsalOf(model: Model, overrides: RehearsalOverrides = {}): Rehearsal {
  // (The mechanism's linearity is judged once here: `integrator`.)
  const study: Study = { ...studyOfModel(model), ...(overrides.study ?? {}) };
  const persons = overrides.persons ?? study.persons ?? DEFAULT_PERSONS;
  if (!Number.isInteger(persons) || persons < 1) throw new Error(`persons: a study needs a whole number of persons ≥ 1, not ${persons}`);
  const seed = overrides.seed ?? study.seed ?? DEFAULT_SEED;
  if (!Number.isFinite(seed)) throw new Error(`seed: a seed must be a number, not ${seed}`);
  const missed = study.missedPrompts ?? 0;
  if (!(missed >= 0 && missed < 1)) throw new Error(`study.missedPrompts: the share of missed prompts must be at least 0 and below 1, not ${missed}`);
  const process = studyProcess(model);
  const states = process.states;
  const unit: TimeUnit = model.timeUnit;
  const ly = lyapunov(process.base.drift, diagonalNoise(Array.from(process.base.noise, (x) => Math.sqrt(x))));
  if (!ly.ok) throw new Error(`the mechanism has no steady state to rehearse a study of: ${ly.reason}`);
  const n = states.length;
  const reliability = Float64Array.from(states, (s) => reliabilityOf(model, s));
  const errorVariance = new Float64Array(n);
  states.forEach((s, i) => {
    const r = reliability[i];
    if (!(r > 0 && r <= 1)) throw new Error(`the reliability of "${nameOf(model, s)}" must be above 0 and at most 1, not ${r}`);
    errorVariance[i] = (ly.sigma.data[i * n + i] * (1 - r)) / r;
  });
  const links = overrides.links ?? [];
  for (const l of links)
    for (const v of [l.from, l.to])
      if (!states.includes(v)) throw new Error(`--link ${l.from}->${l.to}: "${nameOf(model, v)}" is not a state of the model (an input or a computed variable has no lagged effect of its own to detect); states: ${states.join(', ')}`);
  const planned = plannedSlots(study, unit).base.length;
  if (planned < 2) throw new Error(`study: the schedule plans ${planned} prompt per person; a lagged analysis needs at least two`);
  const prompts = (rng: Random): PersonPrompts[] => promptsOf(study, unit, persons, rng.nextU32());
  return {
    model, study, persons, stationary: ly.sigma, reliability,
    plannedPerPerson: planned, answeredPerPerson: planned * (1 - missed),
    integrator: isNonlinear(model, process, ly.sigma) ? integratorFor(process.base.drift) : null,
    process, prompts, errorVariance, timeUnit: unit, links,
    analysis: overrides.analysis ?? {}, method: overrides.method ?? 'var', alpha: overrides.alpha ?? 0.05, seed,
  };
}

/** Each person's answered prompts (times, days, prompt numbers) for one draw of the schedule. */
export function promptsOf(study: Study, unit: TimeUnit, persons: number, seed: number): PersonPrompts[] {
  return promptPlan(study, unit, { seed, persons }).persons.map((p) => {
    const o = answeredOccasions(p);
    return { id: o.id, times: o.time, day: o.day, prompt: o.prompt };
  });
}

/**
 * One synthetic study: the study's own prompt plan (its seed), each person drawn with their
 * differences, their states at their own prompt times, measured with error. A linear mechanism
 * by the exact discrete model of each gap; a nonlinear one by Euler–Maruyama on its own rates
 * (`r.integrator`, `nonlinear.ts`).
 */
export function simulateStudy(r: Rehearsal, onProgress?: (personsDone: number) => void): Panel {
  const prompts = promptsOf(r.study, r.timeUnit, r.persons, r.seed);
  const rng = seededRandom(r.seed);
  const people = rng.fork(1);
  // Person p is asked for just before it is simulated: p persons are done.
  const tell = <T>(f: (p: number) => T) => (p: number) => {
    onProgress?.(p);
    return f(p);
  };
  if (r.integrator) {
    const models = prompts.map(() => personModel(r.model, r.process, people));
    const panel = simulateNonlinearPanel(tell((p) => models[p]), prompts, { states: r.process.states, noise: r.process.base.noise, stationary: r.stationary, choice: r.integrator, errorVariance: r.errorVariance, timeUnit: r.timeUnit }, rng.fork(2));
    onProgress?.(prompts.length);
    return panel;
  }
  const processes = prompts.map(() => drawPerson(r.process, people));
  const panel = simulatePanel(tell((p) => processes[p]), prompts, { states: r.process.states, errorVariance: r.errorVariance, timeUnit: r.timeUnit }, rng.fork(2));
  onProgress?.(prompts.length);
  return panel;
}
