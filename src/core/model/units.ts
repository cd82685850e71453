import { TIME_UNITS, type TimeUnit } from './types';
import { significant, timeUnitWord } from '../../present/numbers';

/** Length of each time unit in seconds (month = 1/12 of a Julian year of 365.25 days: common practice). */
export const SECONDS_PER_UNIT: Record<TimeUnit, number> = {
  s: 1,
  min: 60,
  h: 3600,
  day: 86400,
  week: 7 * 86400,
  month: (365.25 / 12) * 86400,
  year: 365.25 * 86400,
};

const UNIT_ALIASES: Record<string, TimeUnit> = {
  s: 's', sec: 's', secs: 's', second: 's', seconds: 's',
  m: 'min', min: 'min', mins: 'min', minute: 'min', minutes: 'min',
  h: 'h', hr: 'h', hrs: 'h', hour: 'h', hours: 'h',
  d: 'day', day: 'day', days: 'day',
  w: 'week', wk: 'week', week: 'week', weeks: 'week',
  mo: 'month', month: 'month', months: 'month',
  y: 'year', yr: 'year', yrs: 'year', year: 'year', years: 'year',
};

export function isTimeUnit(u: string): u is TimeUnit {
  return (TIME_UNITS as readonly string[]).includes(u);
}

export type DurationResult = { ok: true; value: number } | { ok: false; message: string };

/**
 * Parse a duration into the model's time unit.
 * `parseDuration("90 min", "h")` → 1.5; a bare number is taken in `unit`.
 */
export function parseDuration(text: number | string, unit: TimeUnit): DurationResult {
  if (typeof text === 'number') {
    if (!Number.isFinite(text) || text <= 0) return { ok: false, message: `a duration must be a positive number, not ${text}` };
    return { ok: true, value: text };
  }
  const s = text.trim();
  const m = /^([0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?)\s*([A-Za-z]*)$/.exec(s);
  if (!m) return { ok: false, message: `"${text}" is not a duration: write a number and a unit, such as "90 min", "3h" or "2 days"` };
  const n = Number(m[1]);
  if (!(n > 0) || !Number.isFinite(n)) return { ok: false, message: `a duration must be positive, not "${text}"` };
  if (m[2] === '') return { ok: true, value: n };
  if (m[2] === 'ms') return { ok: true, value: (n * 0.001) / SECONDS_PER_UNIT[unit] };
  const u = UNIT_ALIASES[m[2].toLowerCase()];
  if (!u) return { ok: false, message: `"${m[2]}" in "${text}" is not a time unit: use ms, s, min, h, day, week, month or year` };
  return { ok: true, value: (n * SECONDS_PER_UNIT[u]) / SECONDS_PER_UNIT[unit] };
}

/** Convert an amount between time units. */
export function convertDuration(value: number, from: TimeUnit, to: TimeUnit): number {
  return (value * SECONDS_PER_UNIT[from]) / SECONDS_PER_UNIT[to];
}

/**
 * A duration in words a modeller reads at a glance, choosing the unit:
 * `formatDuration(0.125, "day")` → "3 h".
 */
export function formatDuration(value: number, unit: TimeUnit): string {
  const seconds = value * SECONDS_PER_UNIT[unit];
  // Below a second: milliseconds with three significant digits (never "0 s").
  if (seconds > 0 && seconds < 0.9995) return `${significant(seconds * 1000, 3)} ms`;
  const order: TimeUnit[] = ['year', 'month', 'week', 'day', 'h', 'min', 's'];
  let chosen: TimeUnit = 's';
  for (const u of order) {
    if (seconds >= SECONDS_PER_UNIT[u] * 0.999) { chosen = u; break; }
  }
  const amount = seconds / SECONDS_PER_UNIT[chosen];
  const rounded = amount >= 100 ? Math.round(amount) : amount >= 10 ? Math.round(amount * 10) / 10 : Math.round(amount * 100) / 100;
  return `${rounded} ${timeUnitWord(chosen, rounded)}`;
}
