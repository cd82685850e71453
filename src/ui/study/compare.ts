/**
 * The designs the "Compare designs" dialog sets side by side: whole
 * schedules (prompts in a daily window, at a fixed interval, daily, weekly)
 * that share the study's duration, persons and missed prompts, so that only
 * the schedule differs. Pure (no React): tested in Node.
 */
import type { Schedule, Study, TimeUnit } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { studyInterval } from '../../core/study/convert';
import { lengthAs, schedulePatch } from './edit';

/** The most designs compared at once. */
export const MAX_DESIGNS = 3;

/** The schedule in a few words: "5 a day 09:00–21:00, stratified random", "every 3 h, day and night", "daily", "weekly". */
export function designText(d: Study, unit: TimeUnit): string {
  const s = d.schedule;
  switch (s.kind) {
    case 'daily-window':
      return `${s.promptsPerDay} a day ${s.from}–${s.to}, ${s.timing === 'stratified-random' ? 'stratified random' : 'evenly spaced'}`;
    case 'daily':
      return 'daily';
    case 'weekly':
      return 'weekly';
    case 'fixed': {
      const i = studyInterval(d, unit);
      return i === undefined ? `every ${String(d.interval)}` : `every ${formatDuration(i, unit)}, day and night`;
    }
  }
}

/**
 * A design with `schedule` over the same study: the interval the schedule
 * gives (a fixed schedule keeps `interval`, else the base study's), the
 * study's length as a duration (the same weeks for every design), its
 * persons, missed prompts and holds.
 */
export function designWith(base: Study, unit: TimeUnit, schedule: Schedule, interval?: Study['interval']): Study {
  const length = durationOf(base, unit);
  const patch = schedulePatch(schedule, unit);
  const out: Study = { ...base, length, schedule, interval: patch.interval ?? interval ?? base.interval };
  if (schedule.kind === 'fixed' && interval !== undefined) out.interval = interval;
  return out;
}

/** The study's length as a duration (a count of prompts: the time they take). */
function durationOf(study: Study, unit: TimeUnit): string {
  return typeof study.length === 'number' ? String(lengthAs(study, unit, 'duration')) : study.length;
}

/** Whether two designs plan the same prompts (the same schedule and interval). */
export function sameDesign(a: Study, b: Study, unit: TimeUnit): boolean {
  if (JSON.stringify(a.schedule) !== JSON.stringify(b.schedule)) return false;
  const x = studyInterval(a, unit), y = studyInterval(b, unit);
  return x !== undefined && y !== undefined && Math.abs(x - y) <= 1e-9 * Math.max(x, y);
}

/**
 * The designs the dialog opens with: the study itself, then other kinds of
 * schedule over the same weeks — prompts at a fixed interval day and night
 * (at the study's interval), 5 prompts a day 09:00–21:00 stratified random,
 * daily, weekly — the first two the study is not already.
 * Example: 5 a day 09:00–21:00 → [that, every 2.4 h day and night, daily].
 */
export function startingDesigns(study: Study, unit: TimeUnit): Study[] {
  // the study itself, exactly as it is (its typed interval kept), over its duration
  const out: Study[] = [{ ...study, length: durationOf(study, unit) }];
  const candidates: Study[] = [
    designWith(study, unit, { kind: 'fixed' }, study.interval),
    designWith(study, unit, { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'stratified-random' }),
    designWith(study, unit, { kind: 'daily' }),
    designWith(study, unit, { kind: 'weekly' }),
  ];
  for (const c of candidates) {
    if (out.length >= MAX_DESIGNS) break;
    if (!out.some((o) => o.schedule.kind === c.schedule.kind || sameDesign(o, c, unit))) out.push(c);
  }
  return out;
}
