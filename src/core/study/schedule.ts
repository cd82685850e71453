/**
 * When a study's prompts come: the planned prompt times of each schedule
 * kind, which prompts each person misses, seeded.
 *
 * Time 0 is midnight at the start of the first day of the study; times are
 * in the model's time unit. Kinds:
 * - `fixed`: one prompt every interval, day and night (t = kΔ);
 * - `daily-window`, timing `fixed`: `promptsPerDay` prompts evenly spaced from
 *   `from` to `to` (both ends prompted; one prompt: at `from`);
 * - `daily-window`, timing `stratified-random`: the window cut into
 *   `promptsPerDay` equal parts, one prompt at a uniformly random time in each
 *   (the usual signal-contingent design of experience sampling);
 * - `daily`: one prompt a day, `weekly`: one a week, at the start of the day.
 * The study's length is a number of planned prompts, or a window W holding
 * the prompts planned before W.
 */
import type { Schedule, Study, TimeUnit } from '../model/types';
import { convertDuration } from '../model/units';
import { DEFAULT_PERSONS, lengthAxis, parseInterval, studyInterval } from './convert';
import { seededRandom, type Random } from '../stats/random';

/** Default seed of a study that names none. */
export const DEFAULT_SEED = 1;

/** Minutes after midnight of a clock time "HH:MM". */
export function clockMinutes(text: string): number {
  const [h, m] = text.split(':').map(Number);
  return h * 60 + m;
}

/** One day in the model's time unit. */
function dayIn(unit: TimeUnit): number {
  return convertDuration(1, 'day', unit);
}

/**
 * The spacing a schedule gives prompts within a day, in the model's unit:
 * evenly spaced prompts `(to − from)/(n − 1)`; stratified-random prompts the
 * width of one part `(to − from)/n` (also their mean gap within a day);
 * daily one day, weekly one week; undefined for `fixed` (the interval itself).
 */
export function nominalSpacing(schedule: Schedule, unit: TimeUnit): number {
  const day = dayIn(unit);
  switch (schedule.kind) {
    case 'daily':
      return day;
    case 'weekly':
      return 7 * day;
    case 'daily-window': {
      const span = ((clockMinutes(schedule.to) - clockMinutes(schedule.from)) / 1440) * day;
      if (schedule.timing === 'stratified-random') return span / schedule.promptsPerDay;
      return schedule.promptsPerDay > 1 ? span / (schedule.promptsPerDay - 1) : day;
    }
    case 'fixed':
      return NaN;
  }
}

/**
 * The planned prompts of one person before any randomness: the time each
 * prompt's slot starts, the width of the slot (0 unless stratified-random),
 * its day and its number within the day.
 */
export interface PlannedSlots {
  /** Start of each prompt's slot (the prompt time itself when `width` is 0). */
  base: Float64Array;
  /** Width of each slot: the prompt falls uniformly in [base, base + width). */
  width: number;
  day: Int32Array;
  prompt: Int32Array;
}

/** The most prompts a study may plan per person. */
export const MAX_PROMPTS = 1_000_000;

/**
 * Prompts per person a study plans, read at `interval` (the study's own when
 * absent): the planned slots of its schedule (a daily window of 5 prompts for
 * 14 days: 70, whatever its nominal interval), or, at another interval, a
 * prompt every interval over the study's length (a count of samples stays
 * that count). At least 2. The one conversion from a study's length to prompts
 * that the pictures, the app and the command line share.
 * Example: `studyPrompts({ interval: "2.4 h", length: "14 days", schedule: { kind: "daily-window", promptsPerDay: 5, from: "09:00", to: "21:00", timing: "stratified-random" } }, "h")` → 70;
 * the same study at 3 h → 112.
 */
export function studyPrompts(study: Study, unit: TimeUnit, interval?: number): number {
  const own = studyInterval(study, unit);
  const same = interval === undefined || (own !== undefined && Math.abs(interval - own) <= 1e-9 * own);
  if (!same && !(interval! > 0 && Number.isFinite(interval))) throw new Error(`the interval must be a positive duration, not ${interval}`);
  const read: Study = same ? study : { ...study, interval: interval!, schedule: { kind: 'fixed' } };
  try {
    return Math.max(2, plannedSlots(read, unit).base.length);
  } catch (e) {
    // more than MAX_PROMPTS: the count without listing the slots
    const axis = lengthAxis(study.length, unit);
    const step = studyInterval(read, unit);
    if (!axis.ok || step === undefined) throw e;
    return axis.samples !== undefined ? axis.samples : Math.max(2, Math.ceil(axis.window / step - 1e-12));
  }
}

/**
 * The planned slots of a study (the same for every person).
 * Example: `plannedSlots({ interval: "4h", length: "2 days", schedule: { kind: "daily-window", promptsPerDay: 4, from: "09:00", to: "21:00", timing: "fixed" } }, "h")`
 * → bases 9, 13, 17, 21, 33, 37, 41, 45.
 */
export function plannedSlots(study: Study, unit: TimeUnit): PlannedSlots {
  const interval = parseInterval(study.interval, unit);
  if (!interval.ok) throw new Error(`study.interval: ${interval.message}`);
  const axis = lengthAxis(study.length, unit);
  if (!axis.ok) throw new Error(`study.length: ${axis.message}`);
  const day = dayIn(unit);
  const sch = study.schedule;
  const base: number[] = [];
  const days: number[] = [];
  const prompts: number[] = [];
  let width = 0;
  const limit = axis.window !== undefined ? axis.window : Infinity;
  const count = axis.samples !== undefined ? axis.samples : Infinity;
  const push = (t: number, d: number, p: number): boolean => {
    if (t >= limit * (1 - 1e-12) || base.length >= count) return false;
    if (base.length >= MAX_PROMPTS) throw new Error(`the study plans more than ${MAX_PROMPTS.toLocaleString('en')} prompts per person: shorten it or lengthen the interval`);
    base.push(t);
    days.push(d);
    prompts.push(p);
    return true;
  };
  if (sch.kind === 'daily-window') {
    const from = (clockMinutes(sch.from) / 1440) * day;
    const span = ((clockMinutes(sch.to) - clockMinutes(sch.from)) / 1440) * day;
    const n = sch.promptsPerDay;
    if (sch.timing === 'stratified-random') width = span / n;
    outer: for (let d = 0; ; d++) {
      for (let i = 0; i < n; i++) {
        const offset = sch.timing === 'stratified-random' ? i * width : n > 1 ? (i * span) / (n - 1) : 0;
        if (!push(d * day + from + offset, d, i)) break outer;
      }
    }
  } else {
    const step = sch.kind === 'daily' ? day : sch.kind === 'weekly' ? 7 * day : interval.value;
    let lastDay = -1;
    let within = 0;
    for (let k = 0; ; k++) {
      const t = k * step;
      const d = Math.floor(t / day + 1e-9);
      within = d === lastDay ? within + 1 : 0;
      lastDay = d;
      if (!push(t, d, within)) break;
    }
  }
  return { base: Float64Array.from(base), width, day: Int32Array.from(days), prompt: Int32Array.from(prompts) };
}

/** The prompts of one person: planned times, which were answered, day and number within the day. */
export interface PersonPrompts {
  id: string;
  /** Planned prompt times (model unit), increasing. */
  time: Float64Array;
  /** 1 where the prompt was answered, 0 where it was missed. */
  answered: Uint8Array;
  day: Int32Array;
  prompt: Int32Array;
}

/** The prompts of every person of a study. */
export interface PromptPlan {
  timeUnit: TimeUnit;
  persons: PersonPrompts[];
}

/**
 * Prompt times and missed prompts for every person of a study, seeded by
 * `study.seed` (or `seed`); person p draws from `rng.fork(p)`, so adding
 * persons keeps the first ones unchanged.
 * Example: `promptPlan(study, "h").persons[0].time`.
 */
export function promptPlan(study: Study, unit: TimeUnit, options: { seed?: number; persons?: number } = {}): PromptPlan {
  const slots = plannedSlots(study, unit);
  const n = options.persons ?? study.persons ?? DEFAULT_PERSONS;
  const rng = seededRandom(options.seed ?? study.seed ?? DEFAULT_SEED);
  const p = study.missedPrompts ?? 0;
  const persons: PersonPrompts[] = [];
  for (let i = 0; i < n; i++) persons.push(personPrompts(slots, p, rng.fork(i), `p${i + 1}`));
  return { timeUnit: unit, persons };
}

function personPrompts(slots: PlannedSlots, missed: number, rng: Random, id: string): PersonPrompts {
  const m = slots.base.length;
  const time = new Float64Array(m);
  const answered = new Uint8Array(m);
  for (let k = 0; k < m; k++) {
    time[k] = slots.base[k] + (slots.width > 0 ? rng.uniform() * slots.width : 0);
    answered[k] = missed > 0 && rng.uniform() < missed ? 0 : 1;
  }
  return { id, time, answered, day: slots.day.slice(), prompt: slots.prompt.slice() };
}

/**
 * The answered occasions of a person, in the shape of a `PersonSeries`
 * (src/core/data/panel.ts) without values: times, days, prompt numbers.
 */
export function answeredOccasions(person: PersonPrompts): { id: string; time: Float64Array; day: Int32Array; prompt: Int32Array } {
  const keep: number[] = [];
  for (let k = 0; k < person.time.length; k++) if (person.answered[k]) keep.push(k);
  return {
    id: person.id,
    time: Float64Array.from(keep, (k) => person.time[k]),
    day: Int32Array.from(keep, (k) => person.day[k]),
    prompt: Int32Array.from(keep, (k) => person.prompt[k]),
  };
}
