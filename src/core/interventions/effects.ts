/**
 * With formulas: what an intervention does to the numbers. The equilibrium
 * with and without the hold, the trajectory from the unheld equilibrium with
 * and without it, and the states that keep moving in the held run (the
 * numeric face of "the held system has no equilibrium"). Also the numeric
 * confirmation of perfect adaptation: a step in the input, from rest.
 */
import type { Model, VariableId } from '../model/types';
import { readTimescale } from '../model/timescale';
import { compareIds } from '../ordering/structure';
import { orderingAt } from '../ordering/index';
import { solveEquilibrium } from '../numeric/equilibrium';
import { simulate, type SimulationResult } from '../numeric/simulate';
import { linearize } from '../numeric/linearize';
import { timescalesOf, type TimescaleReport } from '../numeric/timescales';
import { startedAt, steppedModel } from './transform';
import type { Adapted } from './adaptation';

export interface EquilibriumShift {
  variable: VariableId;
  before: number;
  after: number;
  change: number;
}

export interface Trajectories {
  times: number[];
  /** Unheld, from the unheld equilibrium (flat when that equilibrium is exact). */
  without: Record<VariableId, number[]>;
  /** Held from t = 0, from the same start. */
  with: Record<VariableId, number[]>;
}

export interface Mover {
  variable: VariableId;
  /** Change over the last quarter of the run, per model time unit. */
  slope: number;
}

export interface InterventionEffect {
  ok: boolean;
  hold: Record<VariableId, number>;
  /** Present when both equilibria could be computed. */
  equilibrium: EquilibriumShift[] | null;
  trajectories: Trajectories | null;
  /** States the held equilibrium model leaves undetermined that are still moving at the end of the held run without slowing down. */
  drifting: Mover[];
  /** What could not be computed, in words. */
  messages: string[];
}

/** The longest state timescale in the model's time unit (1 when none is given). */
export function longestTimescale(model: Model): number {
  let tau = 0;
  for (const v of model.variables) {
    if (v.kind !== 'state' || v.timescale === undefined) continue;
    const d = readTimescale(v.timescale, model.timeUnit);
    if (d.ok) tau = Math.max(tau, d.high);
  }
  return tau > 0 ? tau : 1;
}

/**
 * States that still move at the end of a run and do not slow down: the move
 * over the last quarter is at least `keep` times the move over the quarter
 * before (a settling state's moves shrink geometrically; a drifting one's do
 * not), and larger than a tolerance. Common practice for telling drift from
 * slow settling on a finite run.
 */
export function driftingStates(run: SimulationResult, states: readonly VariableId[], keep = 0.5): Mover[] {
  const n = run.times.length;
  if (n < 5) return [];
  const i2 = Math.floor((n - 1) / 2);
  const i3 = Math.floor((3 * (n - 1)) / 4);
  const T = run.times[n - 1];
  const out: Mover[] = [];
  for (const s of states) {
    const x = run.series[s];
    if (!x) continue;
    const late = x[n - 1] - x[i3];
    const mid = x[i3] - x[i2];
    const scale = 1e-6 * (1 + Math.abs(x[n - 1]) + Math.abs(x[0]));
    if (Math.abs(late) > scale && Math.abs(late) >= keep * Math.abs(mid) * ((n - 1 - i3) / Math.max(1, i3 - i2))) out.push({ variable: s, slope: late / (T - run.times[i3]) });
  }
  return out.sort((a, b) => compareIds(a.variable, b.variable));
}

/**
 * The numeric effect of holding `hold`, over `until` (default: 10 × the
 * longest timescale of the states the hold moves), sampled 1000 times. Example: `interventionEffect(model, { heater: 0 }).equilibrium`.
 */
export function interventionEffect(model: Model, hold: Record<VariableId, number>, options: { until?: number; every?: number } = {}): InterventionEffect {
  const messages: string[] = [];
  const base = solveEquilibrium(model);
  const held = solveEquilibrium(model, { hold });
  // Only states that the held equilibrium model leaves undetermined can drift; the run confirms that they keep moving
  // (a state still settling on a short run is not drifting).
  const noEquilibrium = new Set(orderingAt(model, { settleAll: true, hold }).blocks.filter((b) => b.determination !== 'well').flatMap((b) => b.variables));
  // The run lasts 10 timescales of the slowest state the hold moves (its equilibrium changes, or it has none).
  const moved = model.variables.filter((v) => v.kind === 'state' && !(v.id in hold) && (noEquilibrium.has(v.id) || !base.ok || !held.ok || Math.abs(held.values[v.id] - base.values[v.id]) > 1e-9 * (1 + Math.abs(base.values[v.id]))));
  const until = options.until ?? 10 * longestTimescale({ ...model, variables: moved.length ? moved : model.variables });
  const every = options.every ?? until / 1000;
  let equilibrium: EquilibriumShift[] | null = null;
  if (base.ok && held.ok) {
    equilibrium = model.variables
      .map((v) => v.id)
      .sort(compareIds)
      .map((id) => ({ variable: id, before: base.values[id], after: held.values[id], change: held.values[id] - base.values[id] }));
  } else {
    if (!base.ok) messages.push(`the equilibrium without the hold could not be computed: ${base.diagnostics.find((d) => d.level === 'error')?.message ?? 'no reason given'}`);
    if (!held.ok) messages.push(`the equilibrium with the hold could not be computed: ${held.diagnostics.find((d) => d.level === 'error')?.message ?? 'no reason given'}`);
  }
  // Start both runs at rest when there is a rest to start from.
  const start = base.ok ? startedAt(model, base.values) : model;
  const without = simulate(start, { until, every });
  const withHold = simulate(start, { until, every, hold });
  let trajectories: Trajectories | null = null;
  if (without.ok && withHold.ok) trajectories = { times: withHold.times, without: without.series, with: withHold.series };
  else messages.push(`the simulation failed: ${[...without.diagnostics, ...withHold.diagnostics].find((d) => d.level === 'error')?.message ?? 'no reason given'}`);
  const states = model.variables.filter((v) => v.kind === 'state' && !(v.id in hold) && noEquilibrium.has(v.id)).map((v) => v.id);
  const drifting = withHold.ok ? driftingStates(withHold, states) : [];
  return { ok: equilibrium !== null && trajectories !== null, hold: { ...hold }, equilibrium, trajectories, drifting, messages };
}

export interface AdaptationCheck extends Adapted {
  confirmed: boolean;
  before: number;
  end: number;
  /** The largest distance from `before` during the run. */
  maxDeviation: number;
  message?: string;
}

/**
 * Confirm perfect adaptation numerically: from the equilibrium, step the
 * input by `step` (default: 10% of its value, or 1), simulate, and check that
 * the variable moved and came back (within `tol` of the range it moved).
 */
export function confirmAdaptation(model: Model, pair: Adapted, options: { step?: number; until?: number; tol?: number } = {}): AdaptationCheck {
  const base = solveEquilibrium(model);
  const fail = (message: string): AdaptationCheck => ({ ...pair, confirmed: false, before: NaN, end: NaN, maxDeviation: NaN, message });
  if (!base.ok) return fail('the equilibrium could not be computed, so there is no rest to step from');
  const u = model.variables.find((v) => v.id === pair.input);
  if (!u || u.kind !== 'input') return fail(`${pair.input} is not an input`);
  const value = u.value ?? 0;
  const step = options.step ?? (value !== 0 ? 0.1 * Math.abs(value) : 1);
  const until = options.until ?? 20 * longestTimescale(model);
  const run = simulate(steppedModel(startedAt(model, base.values), pair.input, value + step), { until, every: until / 400 });
  if (!run.ok) return fail(run.diagnostics.find((d) => d.level === 'error')?.message ?? 'the simulation failed');
  const x = run.series[pair.variable];
  const before = base.values[pair.variable];
  const end = x[x.length - 1];
  const maxDeviation = Math.max(...x.map((y) => Math.abs(y - before)));
  const tol = options.tol ?? 1e-3;
  const confirmed = maxDeviation > 1e-9 * (1 + Math.abs(before)) && Math.abs(end - before) <= tol * Math.max(maxDeviation, 1e-12);
  return { ...pair, confirmed, before, end, maxDeviation };
}

/** Whether the model carries formulas (a rate or a formula somewhere): then numbers mean something beyond the sketch. */
export function hasFormulas(model: Model): boolean {
  return model.variables.some((v) => v.formula !== undefined || v.rate !== undefined) || (model.relations ?? []).length > 0;
}

export interface ModelNumbers {
  ok: boolean;
  /** The equilibrium, every state settled. */
  equilibrium: Record<VariableId, number> | null;
  /** Modes and per-state timescales of the mechanism linearized at the equilibrium. */
  timescales: TimescaleReport | null;
  messages: string[];
}

/** Equilibrium values and the timescales derived at that equilibrium. Example: `modelNumbers(model).timescales?.perState`. */
export function modelNumbers(model: Model): ModelNumbers {
  const eq = solveEquilibrium(model);
  const messages = eq.diagnostics.filter((d) => d.level === 'error').map((d) => d.message);
  if (!eq.ok) return { ok: false, equilibrium: null, timescales: null, messages };
  const lin = linearize(eq.system, eq.point);
  if (!lin.ok) return { ok: false, equilibrium: eq.values, timescales: null, messages: [...messages, lin.reason] };
  return { ok: true, equilibrium: eq.values, timescales: timescalesOf(lin.drift, lin.states, eq.system.timescales), messages };
}
