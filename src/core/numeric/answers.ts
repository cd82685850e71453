/**
 * The numeric questions the Numbers pane and the command line ask, as plain
 * functions over the numerics that return plain data (no functions, no class
 * instances), so the same code runs in the numeric worker, on the main
 * thread and in the command line. Exceptions become a message; nothing is
 * thrown across.
 */
import type { Model, VariableId } from '../model/types';
import type { Diagnostic } from '../ordering/types';
import {
  adviseInterval,
  driftAtEquilibrium,
  linkCurve,
  logGrid,
  sampledAt,
  simulate,
  solveEquilibrium,
  timescalesAt,
  toRows,
  type IntervalAdvice,
  type LinkCurve,
  type TimescaleReport,
} from './index';

export type Failed = { ok: false; reason: string };

export interface EquilibriumAnswer {
  ok: boolean;
  values: Record<VariableId, number>;
  /** With holds: the equilibrium without them, for comparison. */
  unheld?: Record<VariableId, number>;
  diagnostics: Diagnostic[];
}

export interface SimulationAnswer {
  ok: boolean;
  times: number[];
  series: Record<VariableId, number[]>;
  diagnostics: Diagnostic[];
  cancelled: boolean;
}

export interface SampledAnswer {
  ok: true;
  states: VariableId[];
  interval: number;
  phi: number[][];
  phiStandardized: number[][] | null;
  innovationPartial: number[][] | null;
  aliasing: { re: number; im: number; limit: number }[];
  warnings: string[];
}

export interface TimescalesAnswer {
  ok: true;
  report: TimescaleReport;
  settled: VariableId[];
  warnings: string[];
}

export interface CurveAnswer {
  ok: true;
  curve: LinkCurve;
}

export interface AdviceAnswer {
  ok: true;
  advice: IntervalAdvice;
  /** The grid the advice was computed on. */
  intervals: number[];
}

/**
 * The intervals a link curve and the interval advice are drawn over: a
 * decade below the fastest mode to a decade above the slowest, where a
 * lagged effect rises from nothing and has died away again. Not the range
 * of the interval control (core/view/interval.ts `intervalRange`), which
 * must hold every breakpoint and is clamped to a tenth of a second … fifty
 * years: a curve has no breakpoints to show, only the modes' rise and fall.
 * Example: `curveRange([2, 30])` → [0.2, 300].
 */
export function curveRange(times: number[]): [number, number] {
  const finite = times.filter((t) => Number.isFinite(t) && t > 0);
  if (finite.length === 0) return [0.01, 100];
  return [Math.min(...finite) / 10, Math.max(...finite) * 10];
}

function failure(e: unknown): Failed {
  return { ok: false, reason: (e as Error).message ?? String(e) };
}

export function equilibriumOf(model: Model, hold?: Record<VariableId, number>): EquilibriumAnswer | Failed {
  try {
    const held = hold && Object.keys(hold).length > 0 ? hold : undefined;
    const r = solveEquilibrium(model, { hold: held });
    const out: EquilibriumAnswer = { ok: r.ok, values: r.values, diagnostics: r.diagnostics };
    if (held) out.unheld = solveEquilibrium(model).values;
    return out;
  } catch (e) {
    return failure(e);
  }
}

export function simulationOf(
  model: Model,
  options: { until: number; every?: number; hold?: Record<VariableId, number> },
  onProgress?: (fraction: number) => void,
  shouldStop?: () => boolean,
  now: () => number = Date.now,
): SimulationAnswer | Failed {
  try {
    let last = 0;
    const hold = options.hold && Object.keys(options.hold).length > 0 ? options.hold : undefined;
    const r = simulate(model, {
      until: options.until,
      every: options.every,
      hold,
      // Progress is reported at most every 50 ms: each report is a message to the page.
      onProgress: onProgress
        ? (t) => {
            const n = now();
            if (n - last < 50) return;
            last = n;
            onProgress(Math.min(1, t / options.until));
          }
        : undefined,
      shouldStop,
    });
    const cancelled = r.diagnostics.some((d) => d.code === 'simulation-cancelled');
    return { ok: r.ok, times: r.times, series: r.series, diagnostics: r.diagnostics, cancelled };
  } catch (e) {
    return failure(e);
  }
}

export function sampledOf(model: Model, interval: number): SampledAnswer | Failed {
  try {
    const r = sampledAt(model, interval);
    if (!r.ok) return r;
    const s = r.sampled;
    return {
      ok: true,
      states: s.states,
      interval: s.interval,
      phi: toRows(s.phi),
      phiStandardized: s.phiStandardized ? toRows(s.phiStandardized) : null,
      innovationPartial: s.innovationPartial ? toRows(s.innovationPartial) : null,
      aliasing: s.aliasing,
      warnings: r.warnings,
    };
  } catch (e) {
    return failure(e);
  }
}

export function timescalesOfModel(model: Model, interval?: number): TimescalesAnswer | Failed {
  try {
    return timescalesAt(model, interval);
  } catch (e) {
    return failure(e);
  }
}

/** A log grid over the model's own range of timescales (or the given range). */
function gridFor(model: Model, count: number, range?: [number, number]): { states: VariableId[]; drift: ReturnType<typeof driftAtEquilibrium>; intervals: number[] } | Failed {
  const d = driftAtEquilibrium(model);
  if (!d.ok) return { ok: false, reason: d.reason };
  let r = range;
  if (!r) {
    const t = timescalesAt(model);
    r = curveRange(t.ok ? t.report.modes.map((m) => m.time) : []);
  }
  return { states: d.states, drift: d, intervals: logGrid(r[0], r[1], count) };
}

export function curveOf(model: Model, from: VariableId, to: VariableId, count = 121, range?: [number, number]): CurveAnswer | Failed {
  try {
    const g = gridFor(model, count, range);
    if ('ok' in g) return g;
    if (!g.drift.ok) return { ok: false, reason: g.drift.reason };
    for (const v of [from, to]) if (!g.states.includes(v)) return { ok: false, reason: `${v} is not a state: lagged effects run between states (${g.states.join(', ')})` };
    return { ok: true, curve: linkCurve(g.drift.drift, g.states, from, to, g.intervals) };
  } catch (e) {
    return failure(e);
  }
}

export function adviceOf(model: Model, links: { from: VariableId; to: VariableId }[], fraction = 0.5, count = 121, range?: [number, number]): AdviceAnswer | Failed {
  try {
    if (links.length === 0) return { ok: false, reason: 'choose at least one link' };
    if (!(fraction > 0 && fraction < 1)) return { ok: false, reason: `the share of the peak must be between 0 and 1, not ${fraction}` };
    const g = gridFor(model, count, range);
    if ('ok' in g) return g;
    if (!g.drift.ok) return { ok: false, reason: g.drift.reason };
    for (const l of links)
      for (const v of [l.from, l.to]) if (!g.states.includes(v)) return { ok: false, reason: `${v} is not a state: lagged effects run between states (${g.states.join(', ')})` };
    return { ok: true, advice: adviseInterval(g.drift.drift, g.states, links, g.intervals, fraction, model.timeUnit), intervals: g.intervals };
  } catch (e) {
    return failure(e);
  }
}

