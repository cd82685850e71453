/**
 * A state's timescale: one duration ("90 min", or a number in the model's
 * time unit), or a range when it is only roughly known — `{ low, high }` in
 * the file, "30 min..3 h" when typed. Analyses that need one value (the
 * ordering at an interval, the numerics, simulation) use the geometric mean
 * √(low·high): the middle of the range on the log scale on which timescales
 * are compared. Analyses of the uncertainty draw from the whole range.
 */
import type { TimeUnit, TimescaleRange, Variable } from './types';
import { formatDuration, parseDuration } from './units';

export type { TimescaleRange } from './types';

export type TimescaleValue = number | string | TimescaleRange;

export type TimescaleRead =
  | {
      ok: true;
      /** The value point analyses use (model time unit): the timescale itself, or √(low·high) for a range. */
      point: number;
      /** Ends of the range (model time unit); equal to `point` for a single value. */
      low: number;
      high: number;
      /** Whether the timescale is a range with low < high. */
      uncertain: boolean;
      /** The timescale as the modeller wrote it: "90 min", "30 min..3 h". */
      text: string;
    }
  | { ok: false; message: string; field?: 'low' | 'high' };

export function isTimescaleRange(t: unknown): t is TimescaleRange {
  return typeof t === 'object' && t !== null && 'low' in t && 'high' in t;
}

function textOf(x: number | string, unit: TimeUnit, value: number): string {
  return typeof x === 'string' ? x.trim() : formatDuration(value, unit);
}

/**
 * Read a timescale into the model's time unit.
 * Example: `readTimescale({ low: '30 min', high: '3 h' }, 'h')` → point √1.5 ≈ 1.22, low 0.5, high 3.
 */
export function readTimescale(t: TimescaleValue, unit: TimeUnit): TimescaleRead {
  if (!isTimescaleRange(t)) {
    const d = parseDuration(t, unit);
    if (!d.ok) return d;
    return { ok: true, point: d.value, low: d.value, high: d.value, uncertain: false, text: textOf(t, unit, d.value) };
  }
  const lo = parseDuration(t.low, unit);
  if (!lo.ok) return { ok: false, message: `the low end: ${lo.message}`, field: 'low' };
  const hi = parseDuration(t.high, unit);
  if (!hi.ok) return { ok: false, message: `the high end: ${hi.message}`, field: 'high' };
  if (hi.value < lo.value) return { ok: false, message: `the high end (${textOf(t.high, unit, hi.value)}) is shorter than the low end (${textOf(t.low, unit, lo.value)}): write the range from short to long`, field: 'high' };
  return { ok: true, point: Math.sqrt(lo.value * hi.value), low: lo.value, high: hi.value, uncertain: hi.value > lo.value, text: `${textOf(t.low, unit, lo.value)}..${textOf(t.high, unit, hi.value)}` };
}

/** A state's timescale read, or null when it has none. */
export function stateTimescale(v: Variable, unit: TimeUnit): TimescaleRead | null {
  return v.timescale === undefined ? null : readTimescale(v.timescale, unit);
}

/** The timescale as text for a field or a caption: "90 min", "30 min..3 h". */
export function timescaleText(t: TimescaleValue): string {
  return isTimescaleRange(t) ? `${String(t.low).trim()}..${String(t.high).trim()}` : String(t);
}

/**
 * What a typed timescale means: "90 min" stays text, "30 min..3 h" becomes a
 * range (the ends as typed). An empty end is an error naming that end.
 */
export function parseTimescaleText(text: string, unit: TimeUnit): { ok: true; value: TimescaleValue } | { ok: false; message: string } {
  const s = text.trim();
  const parts = s.split('..');
  if (parts.length === 1) {
    const d = parseDuration(s, unit);
    return d.ok ? { ok: true, value: s } : d;
  }
  if (parts.length !== 2) return { ok: false, message: `"${text}" has more than one "..": write a range as "30 min..3 h"` };
  const [low, high] = parts.map((p) => p.trim());
  if (low === '' || high === '') return { ok: false, message: `"${text}" needs a duration on both sides of "..", such as "30 min..3 h"` };
  const value: TimescaleRange = { low, high };
  const r = readTimescale(value, unit);
  return r.ok ? { ok: true, value } : { ok: false, message: r.message };
}
