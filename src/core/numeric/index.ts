/**
 * The numerics of a model in one place: equilibrium, simulation, the
 * linearized drift, timescales and the exact sampled model.
 */
import type { Model, VariableId } from '../model/types';
import type { Mat } from './dense';
import { solveEquilibrium, type EquilibriumResult } from './equilibrium';
import { linearize } from './linearize';
import { sampledModel, type SampledModel } from './sampled';
import { fastPartWarnings, timescalesOf, type TimescaleReport } from './timescales';
import { orderingAt } from '../ordering/index';
import { noiseOf } from '../study/convert';

export { solveEquilibrium } from './equilibrium';
export type { EquilibriumResult } from './equilibrium';
export { simulate, outputGrid } from './simulate';
export { sampleTimes, valueAt } from './samples';
export type { SimulateOptions, SimulationResult } from './simulate';
export { sampledModel, linkCurve, adviseInterval, logGrid } from './sampled';
export type { SampledModel, LinkCurve, IntervalAdvice } from './sampled';
export { timescalesOf, fastPartWarnings } from './timescales';
export type { TimescaleReport, Mode, StateTimescaleReport } from './timescales';
export { buildNumericSystem } from './system';
export type { NumericSystem } from './system';
export { toRows } from './dense';
export type { Mat } from './dense';

export type DriftResult =
  | { ok: true; states: VariableId[]; drift: Mat; equilibrium: EquilibriumResult; warnings: string[] }
  | { ok: false; reason: string; equilibrium?: EquilibriumResult };

/**
 * The drift of the states at the model's equilibrium (the linear part of a
 * sketch needs no equilibrium: it is the same everywhere).
 * Example: `driftAtEquilibrium(model)` → { states, drift }.
 */
export function driftAtEquilibrium(model: Model): DriftResult {
  const eq = solveEquilibrium(model);
  const sys = eq.system;
  const err = sys.diagnostics.find((d) => d.level === 'error');
  if (err) return { ok: false, reason: err.message, equilibrium: eq };
  const linear = sys.equations.every((e) => e.fromLinks);
  const warnings: string[] = [];
  let point = eq.point;
  if (!eq.ok) {
    const why = eq.diagnostics.find((d) => d.level === 'error')?.message ?? 'no equilibrium';
    if (!linear) return { ok: false, reason: `the model must be linearized at its equilibrium, and ${why}`, equilibrium: eq };
    warnings.push(`the model has no single equilibrium (${why}); its sketch is linear, so the drift is the same everywhere`);
    point = sys.start.slice();
  }
  const lin = linearize(sys, point);
  if (!lin.ok) return { ok: false, reason: lin.reason, equilibrium: eq };
  return { ok: true, states: lin.states, drift: lin.drift, equilibrium: eq, warnings };
}

/** The exact sampled model at `interval`, noise per state from each state's `noise` (default 1). */
export function sampledAt(model: Model, interval: number): ({ ok: true; sampled: SampledModel; warnings: string[] }) | { ok: false; reason: string } {
  const d = driftAtEquilibrium(model);
  if (!d.ok) return d;
  const noise = d.states.map((s) => noiseOf(model, s));
  const bad = d.states.find((s, i) => !(noise[i] >= 0) || !Number.isFinite(noise[i]));
  if (bad) return { ok: false, reason: `the noise of ${bad} must be a non-negative number` };
  const sampled = sampledModel(d.drift, d.states, interval, noise);
  return { ok: true, sampled, warnings: [...d.warnings, ...sampled.warnings] };
}

/**
 * Eigenvalues and per-state timescales (given and derived) at equilibrium.
 * With an interval, also checks that the states settled at that interval
 * form a stable fast part.
 */
export function timescalesAt(model: Model, interval?: number): ({ ok: true; report: TimescaleReport; settled: VariableId[]; warnings: string[] }) | { ok: false; reason: string } {
  const d = driftAtEquilibrium(model);
  if (!d.ok) return d;
  const report = timescalesOf(d.drift, d.states, d.equilibrium.system.timescales);
  let settled: VariableId[] = [];
  const warnings = [...d.warnings, ...report.warnings];
  if (interval !== undefined) {
    const roles = orderingAt(model, { interval }).roles;
    settled = d.states.filter((s) => roles[s] === 'settled');
    warnings.push(...fastPartWarnings(d.drift, d.states, settled));
  }
  return { ok: true, report, settled, warnings };
}
