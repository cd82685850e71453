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
 * margin of RANGE_MARGIN on both sides, clamped to one second … fifty years.
 */
export function intervalRange(model: Model, breakpoints: readonly Breakpoint[]): IntervalRange {
  const values: number[] = breakpoints.map((b) => b.interval).filter((x) => x > 0 && Number.isFinite(x));
  for (const v of model.variables) {
    const t = timescaleOf(model, v.id);
    if (t !== undefined && t > 0) values.push(t);
  }
  const unit = SECONDS_PER_UNIT[model.timeUnit];
  const floor = 1 / unit;
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

/**
 * Index of the band for a sorted list of breakpoint intervals: the number of
 * breakpoints at or below the interval (a breakpoint's new role holds from it on).
 */
export function bandOfBreakpoints(sortedIntervals: readonly number[], interval: number): number {
  let lo = 0;
  let hi = sortedIntervals.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sortedIntervals[mid] <= interval) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export type IntervalKey = 'ArrowLeft' | 'ArrowRight' | 'ArrowUp' | 'ArrowDown' | 'PageUp' | 'PageDown' | 'Home' | 'End';

/** Fine step of the arrow keys, as a fraction of the control. */
export const ARROW_STEP = 1 / 60;

/**
 * The interval after a key press on the control. Arrows move by a fine
 * step but stop at a breakpoint on the way (so no band is skipped);
 * PageUp/PageDown jump to the next/previous breakpoint; Home/End go to the ends.
 * Going down, a breakpoint is left just below it, into the lower band.
 */
export function stepInterval(range: IntervalRange, breakpoints: readonly number[], interval: number, key: IntervalKey): number {
  const bps = [...breakpoints].filter((b) => b > range.min && b < range.max).sort((a, b) => a - b);
  const up = key === 'ArrowRight' || key === 'ArrowUp' || key === 'PageUp';
  if (key === 'Home') return range.min;
  if (key === 'End') return range.max;
  const below = (b: number) => b * (1 - 1e-9);
  if (key === 'PageUp') return bps.find((b) => b > interval) ?? range.max;
  if (key === 'PageDown') {
    // from inside band [b_i, b_i+1) to b_i−1, the start of the band below (or the bottom)
    const lower = bps.filter((b) => b <= interval);
    return lower.length > 1 ? lower[lower.length - 2] : range.min;
  }
  const next = fromPosition(range, toPosition(range, interval) + (up ? ARROW_STEP : -ARROW_STEP));
  if (up) {
    const b = bps.find((x) => x > interval && x < next);
    return b ?? next;
  }
  const b = [...bps].reverse().find((x) => x <= interval && below(x) > next);
  return b !== undefined ? below(b) : next;
}
