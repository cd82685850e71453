/**
 * The sampling-interval axis: a logarithmic scale whose range follows the
 * model's timescales and every breakpoint, band lookup, and the keyboard
 * steps of the interval control (which never skip a breakpoint).
 */
import type { Model } from '../model/types';
import { SECONDS_PER_UNIT } from '../model/units';
import type { Band, Breakpoint } from './contract';
import { timescaleOf } from './explain';

export interface IntervalRange {
  /** Smallest and largest interval on the control, in the model unit. */
  min: number;
  max: number;
}

/** Margin on each side of the outermost breakpoint or timescale, as a factor. */
export const RANGE_MARGIN = 4;

/**
 * A range that holds every breakpoint and every state's timescale with a
 * margin of RANGE_MARGIN on both sides, clamped to a tenth of a second … fifty years.
 */
export function intervalRange(model: Model, breakpoints: readonly Breakpoint[]): IntervalRange {
  const values: number[] = breakpoints.map((b) => b.interval).filter((x) => x > 0 && Number.isFinite(x));
  for (const v of model.variables) {
    const t = timescaleOf(model, v.id);
    if (t !== undefined && t > 0) values.push(t);
  }
  const unit = SECONDS_PER_UNIT[model.timeUnit];
  const floor = 0.1 / unit;
  const ceil = (50 * SECONDS_PER_UNIT.year) / unit;
  if (!values.length) return { min: Math.max(floor, 0.01), max: Math.min(ceil, 100) };
  const lo = Math.min(...values) / RANGE_MARGIN;
  const hi = Math.max(...values) * RANGE_MARGIN;
  return { min: Math.max(floor, Math.min(lo, hi / 100)), max: Math.min(ceil, Math.max(hi, lo * 100)) };
}

/** Position 0…1 on the control for an interval (logarithmic). */
export function toPosition(range: IntervalRange, interval: number): number {
  const p = Math.log(interval / range.min) / Math.log(range.max / range.min);
  return Math.min(1, Math.max(0, p));
}

/** The interval at a position 0…1 on the control. */
export function fromPosition(range: IntervalRange, position: number): number {
  const p = Math.min(1, Math.max(0, position));
  return range.min * Math.pow(range.max / range.min, p);
}

/** Index of the band that holds an interval: bands are [from, to). */
export function bandIndex(bands: readonly Band[], interval: number): number {
  for (let i = 0; i < bands.length; i++) if (interval >= bands[i].from && interval < bands[i].to) return i;
  return bands.length ? (interval < bands[0].from ? 0 : bands.length - 1) : -1;
}

/** A place on the axis where the band changes; `exclusive`: the upper band starts just above `at`. */
export interface Cut {
  at: number;
  exclusive?: boolean;
}

export function cutsOf(breakpoints: readonly Breakpoint[]): Cut[] {
  return breakpoints.map((b) => ({ at: b.interval, ...(b.exclusive ? { exclusive: true } : {}) })).sort((a, b) => a.at - b.at);
}

/** Whether an interval lies in the band above a cut. */
export function passed(c: Cut, interval: number): boolean {
  return c.exclusive ? interval > c.at : interval >= c.at;
}

/** The first interval above the cut, and the last one below it. */
const enter = (c: Cut) => (c.exclusive ? c.at * (1 + 1e-9) : c.at);
const leave = (c: Cut) => (c.exclusive ? c.at : c.at * (1 - 1e-9));

/**
 * Band number of an interval: how many cuts it has passed (a breakpoint's
 * new role holds from it on, or just above it when exclusive).
 */
export function bandOfCuts(cuts: readonly Cut[], interval: number): number {
  let n = 0;
  for (const c of cuts) if (passed(c, interval)) n++;
  return n;
}

/**
 * An interval inside band k of the cuts (0: below the first cut): the
 * geometric middle of its two cuts; the outer bands reach a factor 2 beyond
 * their one cut. Null for a band that does not exist (or holds no interval).
 */
export function intervalInBand(cuts: readonly Cut[], k: number): number | null {
  if (k < 0 || k > cuts.length || !Number.isInteger(k)) return null;
  if (cuts.length === 0) return 1;
  const lo = k === 0 ? null : enter(cuts[k - 1]);
  const hi = k === cuts.length ? null : leave(cuts[k]);
  const x = lo === null ? hi! / 2 : hi === null ? lo * 2 : Math.sqrt(lo * hi);
  return bandOfCuts(cuts, x) === k ? x : lo !== null && bandOfCuts(cuts, lo) === k ? lo : null;
}

export type IntervalKey = 'ArrowLeft' | 'ArrowRight' | 'ArrowUp' | 'ArrowDown' | 'PageUp' | 'PageDown' | 'Home' | 'End';

/** Fine step of the arrow keys, as a fraction of the control. */
export const ARROW_STEP = 1 / 60;

/**
 * The interval after a key press on the control. Arrows move by a fine
 * step but stop where the next band begins (so no band is skipped);
 * PageUp/PageDown jump to the start of the next/previous band; Home/End go
 * to the ends of the control.
 */
export function stepInterval(range: IntervalRange, cutsIn: readonly Cut[], interval: number, key: IntervalKey): number {
  const cuts = cutsIn.filter((c) => c.at > range.min && c.at < range.max);
  if (key === 'Home') return range.min;
  if (key === 'End') return range.max;
  if (key === 'PageUp') {
    const c = cuts.find((x) => !passed(x, interval));
    return c ? enter(c) : range.max;
  }
  if (key === 'PageDown') {
    const done = cuts.filter((x) => passed(x, interval));
    return done.length > 1 ? enter(done[done.length - 2]) : range.min;
  }
  const up = key === 'ArrowRight' || key === 'ArrowUp';
  const next = fromPosition(range, toPosition(range, interval) + (up ? ARROW_STEP : -ARROW_STEP));
  if (up) {
    const c = cuts.find((x) => !passed(x, interval) && passed(x, next));
    return c ? enter(c) : next;
  }
  const c = [...cuts].reverse().find((x) => passed(x, interval) && !passed(x, next));
  return c ? leave(c) : next;
}
