/**
 * Roles of the states at a sampling interval Δ and a study length W: a state
 * with timescale τ is settled when k·τ ≤ Δ (it reaches balance between two
 * samples), frozen when τ ≥ k·W (it hardly moves over the study), dynamic
 * otherwise. k is the separation factor (settings.separation, default 5).
 * The factor-of-k rule of thumb for separating timescales is common practice
 * (singular perturbation: Kokotović, Khalil & O'Reilly, "Singular Perturbation
 * Methods in Control", 1986, ch. 1).
 */
import { DEFAULT_SAMPLES, DEFAULT_SEPARATION, type Model, type VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { readTimescale } from '../model/timescale';
import type { Band, Breakpoint, Diagnostic, Role, StudyDesign } from './types';
import { designAxis } from '../study/convert';
import { compareIds } from './structure';

export interface RolesResult {
  roles: Record<VariableId, Role>;
  diagnostics: Diagnostic[];
  /** The study length used (model time unit); undefined without an interval. */
  window?: number;
}

interface StateScale {
  id: VariableId;
  tau: number | null;
  text: string;
}

function stateScales(model: Model): StateScale[] {
  return model.variables
    .filter((v) => v.kind === 'state')
    .map((v) => {
      if (v.timescale === undefined) return { id: v.id, tau: null, text: '' };
      // A range counts at its geometric mean here (orderingProbabilities draws from the whole range).
      const d = readTimescale(v.timescale, model.timeUnit);
      return { id: v.id, tau: d.ok ? d.point : null, text: d.ok ? (d.uncertain ? `≈ ${formatDuration(d.point, model.timeUnit)} (${d.text})` : d.text) : '' };
    })
    .sort((a, b) => compareIds(a.id, b.id));
}

function separationOf(model: Model): number {
  const k = model.settings?.separation;
  return typeof k === 'number' && Number.isFinite(k) && k >= 1 ? k : DEFAULT_SEPARATION;
}

/** The study length of a design; when it gives none, the model's study (`designAxis`). */
function axisOf(model: Model, design: { window?: number; samples?: number }): { window: number | undefined; samples: number } {
  const a = designAxis(model, design);
  return { window: a.window, samples: a.samples ?? DEFAULT_SAMPLES };
}

/**
 * The role of one state. With `window` omitted the study is `samples × Δ`,
 * and "τ ≥ k·W" is evaluated as "Δ ≤ τ / (k·N)" — the same quantity the
 * breakpoints report, so a breakpoint's own interval gets exactly the role
 * the breakpoint says.
 */
function stateRole(tau: number, k: number, interval: number, window: number | undefined, samples: number): Role {
  if (interval >= k * tau) return 'settled';
  const frozen = window !== undefined ? tau >= k * window : interval <= tau / (k * samples);
  return frozen ? 'frozen' : 'state';
}

/**
 * Roles at a design. No interval: the mechanism (every state dynamic).
 * Example: `rolesAt(model, { interval: 24 })` for an hourly model sampled daily.
 */
export function rolesAt(model: Model, design: StudyDesign): RolesResult {
  const roles: Record<VariableId, Role> = {};
  const diagnostics: Diagnostic[] = [];
  for (const v of [...model.variables].sort((a, b) => compareIds(a.id, b.id))) roles[v.id] = v.kind === 'input' ? 'input' : v.kind === 'state' ? 'state' : 'derived';
  const k = separationOf(model);
  const scales = stateScales(model);
  let window: number | undefined;
  let interval = design.interval;
  if (interval !== undefined && !(Number.isFinite(interval) && interval > 0)) {
    diagnostics.push({ level: 'error', code: 'bad-interval', message: `the sampling interval must be a positive number, not ${interval}; showing the mechanism instead`, variables: [], equations: [] });
    interval = undefined;
  }
  if (design.settleAll) {
    for (const s of scales) roles[s.id] = 'settled';
  } else if (interval !== undefined) {
    const axis = axisOf(model, design);
    const samples = axis.samples;
    window = axis.window ?? samples * interval;
    if (!(Number.isFinite(window) && window > 0)) {
      diagnostics.push({ level: 'error', code: 'bad-window', message: `the study length must be a positive number, not ${axis.window ?? window}`, variables: [], equations: [] });
    } else if (interval > window) {
      diagnostics.push({
        level: 'error',
        code: 'interval-exceeds-window',
        message: `the sampling interval (${formatDuration(interval, model.timeUnit)}) is longer than the study (${formatDuration(window, model.timeUnit)}): no two samples fit in it; shorten the interval or lengthen the study`,
        variables: [],
        equations: [],
      });
    }
    const missing: VariableId[] = [];
    for (const s of scales) {
      if (s.tau === null) missing.push(s.id);
      else roles[s.id] = stateRole(s.tau, k, interval, axis.window, samples);
    }
    if (missing.length > 0)
      diagnostics.push({
        level: 'warning',
        code: 'no-timescale',
        message: `${missing.join(', ')} ${missing.length > 1 ? 'have' : 'has'} no timescale, so ${missing.length > 1 ? 'they stay' : 'it stays'} dynamic at every interval: give ${missing.length > 1 ? 'each' : 'it'} a timescale (such as "30 min") to let ${missing.length > 1 ? 'them' : 'it'} settle or freeze`,
        variables: missing,
        equations: [],
      });
  }
  const unknownHolds: string[] = [];
  for (const x of Object.keys(design.hold ?? {}).sort(compareIds)) {
    if (x in roles) roles[x] = 'held';
    else unknownHolds.push(x);
  }
  if (unknownHolds.length > 0)
    diagnostics.push({ level: 'error', code: 'unknown-variable', message: `cannot hold ${unknownHolds.map((x) => `"${x}"`).join(', ')}: no such variable in this model`, variables: [], equations: [] });
  return { roles, diagnostics, window };
}

export interface AxisOptions {
  /** A fixed study length W (model time unit). */
  window?: number;
  /** Or a study of N samples (W = N·Δ). Default: the model's study length, else 50 samples. */
  samples?: number;
}

/**
 * The exact intervals where some state changes role as Δ grows from 0.
 * - Settling: dynamic (or frozen) → settled at Δ = k·τ, inclusive (k·τ ≤ Δ).
 * - With N samples, frozen → dynamic at Δ = τ/(k·N), exclusive: at that Δ
 *   τ = k·N·Δ still counts as frozen, so the breakpoint carries
 *   `exclusive: true` (the new role holds for Δ strictly above it).
 * - With a fixed window W, freezing does not depend on Δ; only Δ ≤ W is
 *   studied, so breakpoints beyond W are left out.
 * Example: `breakpoints(model, { samples: 50 })`.
 */
export function breakpoints(model: Model, options: AxisOptions = {}): Breakpoint[] {
  const k = separationOf(model);
  const scales = stateScales(model);
  const axis = axisOf(model, options);
  const fixed = axis.window;
  const samples = axis.samples;
  type Item = { interval: number; exclusive: boolean; change: Breakpoint['changes'][number] };
  const items: Item[] = [];
  for (const s of scales) {
    if (s.tau === null) continue;
    const settleAt = k * s.tau;
    if (fixed !== undefined) {
      if (settleAt <= fixed)
        items.push({ interval: settleAt, exclusive: false, change: { variable: s.id, from: s.tau >= k * fixed ? 'frozen' : 'state', to: 'settled', reason: `${s.id} settles: timescale ${s.text} × ${k} ≤ interval` } });
    } else {
      const thawAt = s.tau / (k * samples);
      items.push({ interval: thawAt, exclusive: true, change: { variable: s.id, from: 'frozen', to: 'state', reason: `${s.id} becomes dynamic: timescale ${s.text} < ${k} × study length (${samples} samples × interval)` } });
      items.push({ interval: settleAt, exclusive: false, change: { variable: s.id, from: 'state', to: 'settled', reason: `${s.id} settles: timescale ${s.text} × ${k} ≤ interval` } });
    }
  }
  items.sort((a, b) => a.interval - b.interval || Number(a.exclusive) - Number(b.exclusive) || compareIds(a.change.variable, b.change.variable));
  const out: Breakpoint[] = [];
  for (const it of items) {
    const last = out[out.length - 1];
    if (last && last.interval === it.interval && Boolean(last.exclusive) === it.exclusive) last.changes.push(it.change);
    else {
      const b: Breakpoint = { interval: it.interval, changes: [it.change] };
      if (it.exclusive) b.exclusive = true;
      out.push(b);
    }
  }
  return out;
}

/**
 * The ranges of Δ between breakpoints, each with its roles. A band is
 * [from, to) unless `excludesFrom` (then (from, …) or `includesTo` (then
 * …, to]) says otherwise; with a fixed window the last band ends at W,
 * included. Example: `bands(model, { samples: 50 })`.
 */
export function bands(model: Model, options: AxisOptions = {}): Band[] {
  const axis = axisOf(model, options);
  const bps = breakpoints(model, options);
  const design = (interval: number): StudyDesign => (axis.window !== undefined ? { interval, window: axis.window } : { interval, samples: axis.samples });
  const out: Band[] = [];
  let from = 0;
  let excludesFrom = false;
  const close = (to: number, includesTo: boolean) => {
    const rep = from === to ? from : to === Infinity ? (from > 0 ? from * 2 : 1) : from === 0 ? to / 2 : (from + to) / 2;
    const band: Band = { from, to, roles: rolesAt(model, design(rep)).roles };
    if (excludesFrom) band.excludesFrom = true;
    if (includesTo) band.includesTo = true;
    out.push(band);
  };
  for (const b of bps) {
    if (!(b.interval === from && excludesFrom === Boolean(b.exclusive)) && !(b.interval === 0)) close(b.interval, Boolean(b.exclusive));
    from = b.interval;
    excludesFrom = Boolean(b.exclusive);
  }
  if (axis.window !== undefined) {
    if (from < axis.window || (from === axis.window && !excludesFrom)) close(axis.window, true);
  } else close(Infinity, false);
  return out;
}
