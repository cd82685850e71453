/**
 * The conversions of a study that live in one place: an interval typed in
 * words, the study length as samples or a window, the design the ordering
 * reads, the study in another time unit, and the per-state noise and
 * reliability with their defaults. Pure; no ordering or numerics here.
 */
import { DEFAULT_SAMPLES, type Duration, type Model, type Study, type TimeUnit, type VariableId } from '../model/types';
import { convertDuration, formatDuration, parseDuration, SECONDS_PER_UNIT, type DurationResult } from '../model/units';
import type { StudyDesign } from '../ordering/types';
import { significant } from '../../present/index';

/** Process noise intensity of a state when the model gives none (variance added per unit time). */
export const DEFAULT_NOISE = 1;
/** Reliability of a measurement when the model gives none: no measurement error. */
export const DEFAULT_RELIABILITY = 1;
/** Persons in a study when the study gives none. */
export const DEFAULT_PERSONS = 1;

/** Words that name an interval of one unit: "daily", "weekly", "every day". */
const ONE_UNIT_WORDS: Record<string, string> = {
  secondly: '1 s',
  minutely: '1 min',
  hourly: '1 h',
  daily: '1 day',
  nightly: '1 day',
  weekly: '1 week',
  monthly: '1 month',
  yearly: '1 year',
  annually: '1 year',
};

/**
 * Parse a sampling interval as a modeller types it, into the model's time unit.
 * Accepts every duration `parseDuration` takes ("3h", "90 min", "2.5 days"),
 * "every 3 h", "every day", "daily", "weekly", "hourly", "once a day",
 * "twice a day", "5 times a day", "5 a day", and every label the app shows.
 * Example: `parseInterval("every 3 h", "day")` → { ok: true, value: 0.125 }.
 */
export function parseInterval(text: number | string, unit: TimeUnit): DurationResult {
  if (typeof text === 'number') return parseDuration(text, unit);
  let s = text.trim().toLowerCase().replace(/\s+/g, ' ');
  if (s === '') return { ok: false, message: 'the interval is empty: write a duration such as "3h", "90 min", "every 3 h", "daily" or "weekly"' };
  if (ONE_UNIT_WORDS[s]) return parseDuration(ONE_UNIT_WORDS[s], unit);
  // "5 a day", "5 times a day", "twice a day", "once a week", "5 per day", "5/day"
  const per = /^(once|twice|[0-9]*\.?[0-9]+)(?: times)? ?(?:a|an|per|each|every|\/) ?([a-z]+)$/.exec(s);
  if (per) {
    const count = per[1] === 'once' ? 1 : per[1] === 'twice' ? 2 : Number(per[1]);
    const span = parseDuration(`1 ${per[2]}`, unit);
    if (!span.ok) return { ok: false, message: `"${text}": "${per[2]}" is not a time unit: use s, min, h, day, week, month or year` };
    if (!(count > 0) || !Number.isFinite(count)) return { ok: false, message: `"${text}": the number of prompts must be positive` };
    return { ok: true, value: span.value / count };
  }
  if (s.startsWith('every ')) s = s.slice(6).trim();
  else if (s.startsWith('each ')) s = s.slice(5).trim();
  // "every day", "every week": one unit
  if (/^[a-z]+$/.test(s)) {
    const one = parseDuration(`1 ${s}`, unit);
    if (one.ok) return one;
  }
  const r = parseDuration(s, unit);
  if (r.ok) return r;
  return { ok: false, message: `"${text}" is not an interval: write a duration such as "3h", "90 min", "every 3 h", "daily" or "weekly"` };
}

/** The label the app shows for an interval; `parseInterval` reads it back. Example: `intervalLabel(0.125, "day")` → "every 3 h". */
export function intervalLabel(value: number, unit: TimeUnit): string {
  return `every ${formatDuration(value, unit)}`;
}

/**
 * A duration written exactly as text with the unit that reads best, so that
 * it survives a change of the model's time unit and reads back to the same
 * number: `exactDuration(0.125, "day")` → "3 h"; `exactDuration(1.37, "h")` → "1.37 h".
 */
export function exactDuration(value: number, unit: TimeUnit): string {
  const seconds = value * SECONDS_PER_UNIT[unit];
  const order: TimeUnit[] = ['year', 'month', 'week', 'day', 'h', 'min', 's'];
  // the largest unit in which the amount is a whole number, else the largest unit ≥ 1
  for (const u of order) {
    const amount = seconds / SECONDS_PER_UNIT[u];
    if (amount >= 1 && Math.abs(amount - Math.round(amount)) <= 8 * Number.EPSILON * amount) return `${Math.round(amount)} ${u}`;
  }
  let chosen: TimeUnit = 's';
  for (const u of order) if (seconds >= SECONDS_PER_UNIT[u]) { chosen = u; break; }
  return `${significant(seconds / SECONDS_PER_UNIT[chosen], 15)} ${chosen}`;
}

/** How long a study runs, as the ordering reads it: a number of samples or a window in the model's time unit. */
export type StudyAxis = { samples: number; window?: undefined } | { window: number; samples?: undefined };

/** A study's `length`: a number is a count of samples, text a duration. */
export function lengthAxis(length: string | number, unit: TimeUnit): ({ ok: true } & StudyAxis) | { ok: false; message: string } {
  if (typeof length === 'number') {
    if (!Number.isInteger(length) || length < 2) return { ok: false, message: `a study length in samples must be a whole number of at least 2, not ${length}` };
    return { ok: true, samples: length };
  }
  const d = parseDuration(length, unit);
  if (!d.ok) return { ok: false, message: d.message };
  return { ok: true, window: d.value };
}

/** The study length of a model: its study's, else a version-1 `settings.samples`, else 50 samples. */
export function modelAxis(model: Model): StudyAxis {
  if (model.study) {
    const a = lengthAxis(model.study.length, model.timeUnit);
    if (a.ok) return a.window !== undefined ? { window: a.window } : { samples: a.samples };
  }
  return { samples: model.settings?.samples ?? DEFAULT_SAMPLES };
}

/** The window W of a study: the window itself, or samples × interval. */
export function windowOf(axis: StudyAxis, interval: number): number {
  return axis.window !== undefined ? axis.window : axis.samples * interval;
}

/**
 * The length of a design when the design gives none: `design.window`, else
 * `design.samples`, else the model's study. Example: `designAxis(model, { samples: 14 })` → { samples: 14 }.
 */
export function designAxis(model: Model, design: { window?: number; samples?: number }): StudyAxis {
  if (design.window !== undefined) return { window: design.window };
  if (design.samples !== undefined) return { samples: design.samples };
  return modelAxis(model);
}

/** The interval of a study in the model's time unit (undefined when it does not parse; the schema reports it). */
export function studyInterval(study: Pick<Study, 'interval'>, unit: TimeUnit): number | undefined {
  const r = parseInterval(study.interval, unit);
  return r.ok ? r.value : undefined;
}

/**
 * The design the ordering reads for a study: interval, window or samples, holds.
 * Example: `designOfStudy({ interval: "3h", length: "14 days", schedule: { kind: "fixed" } }, "h")`
 * → { interval: 3, window: 336 }.
 */
export function designOfStudy(study: Study, unit: TimeUnit): StudyDesign {
  const d: StudyDesign = {};
  const interval = studyInterval(study, unit);
  if (interval !== undefined) d.interval = interval;
  const a = lengthAxis(study.length, unit);
  if (a.ok) {
    if (a.window !== undefined) d.window = a.window;
    else d.samples = a.samples;
  }
  if (study.holds && Object.keys(study.holds).length > 0) d.hold = { ...study.holds };
  return d;
}

/** A duration of the study written in `from` units, written for `to` units: the same real time. */
function convertStudyDuration<T extends Duration>(d: T, from: TimeUnit, to: TimeUnit): T | number {
  if (typeof d === 'number') return convertDuration(d, from, to);
  // text with a unit of its own keeps it; a bare number in text is in the model's unit
  const bare = /^\s*[0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?\s*$/.test(d);
  return bare ? convertDuration(Number(d), from, to) : d;
}

/**
 * The study written for another time unit, meaning the same real times.
 * A number of samples stays a number of samples; durations in text with
 * their own unit stay as they are. Example: `convertStudy({ interval: 1, … }, "day", "week")` → interval 1/7.
 */
export function convertStudy(study: Study, from: TimeUnit, to: TimeUnit): Study {
  if (from === to) return study;
  const out: Study = { ...study, interval: convertStudyDuration(study.interval, from, to) };
  if (typeof study.length === 'string') out.length = String(convertStudyDuration(study.length, from, to));
  return out;
}

/**
 * A state's timescale written for another time unit, meaning the same real time:
 * numbers (and bare numbers in text) are converted, text with a unit is kept;
 * any other form (such as a range { low, high }) has each number converted.
 * Example: `convertTimescale(2, "h", "min")` → 120; `convertTimescale("90 min", "h", "day")` → "90 min".
 */
export function convertTimescale<T>(value: T, from: TimeUnit, to: TimeUnit): T {
  if (typeof value === 'number' || typeof value === 'string') return convertStudyDuration(value, from, to) as T;
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = typeof v === 'number' || typeof v === 'string' ? convertStudyDuration(v, from, to) : v;
    return out as T;
  }
  return value;
}

/** Process noise intensity of a state: its own, else a version-1 `settings.noise`, else 1. */
export function noiseOf(model: Model, id: VariableId): number {
  return model.variables.find((v) => v.id === id)?.noise ?? model.settings?.noise?.[id] ?? DEFAULT_NOISE;
}

/** Reliability of the measurement of a variable (share of true-score variance), default 1. */
export function reliabilityOf(model: Model, id: VariableId): number {
  return model.variables.find((v) => v.id === id)?.reliability ?? DEFAULT_RELIABILITY;
}
