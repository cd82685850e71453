/**
 * What the Study tab's fields turn into: a patch of the study for each
 * finished field, checked against the model by the core (`studyIssues`)
 * before it is stored, and a message that names the field when it is not.
 * Pure (no React): tested in Node.
 */
import { studyIssues } from '../../core/model/schema';
import type { Model, Schedule, Study, TimeUnit } from '../../core/model/types';
import { exactDuration, lengthAxis, studyInterval } from '../../core/study/convert';
import { nominalSpacing, plannedSlots } from '../../core/study/schedule';
import { significant } from '../../present/index';

/** The name of each field as the Study tab shows it, by the path the core reports. */
export const FIELD_NAMES: Record<string, string> = {
  study: 'Study',
  'study.interval': 'Interval',
  'study.length': 'Study length',
  'study.schedule': 'Schedule',
  'study.schedule.kind': 'Schedule',
  'study.schedule.promptsPerDay': 'Prompts per day',
  'study.schedule.from': 'First prompt from',
  'study.schedule.to': 'Last prompt by',
  'study.schedule.timing': 'Timing',
  'study.persons': 'Persons',
  'study.missedPrompts': 'Missed prompts',
};

/** The field name of a path ("study.holds.stress" → "Hold on stress"). */
export function fieldName(path: string): string {
  if (FIELD_NAMES[path]) return FIELD_NAMES[path];
  if (path.startsWith('study.holds.')) return `Hold on ${path.slice('study.holds.'.length)}`;
  return path;
}

export type Patch = { ok: true; patch: Partial<Study> } | { ok: false; message: string };

/**
 * The first problem the study has after `patch`, as "Field: message"; null
 * when it may be stored. Example: `patchProblem(study, { persons: 0 }, model)`
 * → "Persons: must be at least 1".
 */
export function patchProblem(study: Study, patch: Partial<Study>, model: Model): string | null {
  const next: Record<string, unknown> = { ...study, ...patch };
  for (const [k, v] of Object.entries(patch)) if (v === undefined) delete next[k];
  const { issues } = studyIssues(next, model);
  return issues.length > 0 ? `${fieldName(issues[0].path)}: ${issues[0].message}` : null;
}

/** A whole number typed in a field: "40" → 40; the message names the field. */
export function wholeNumber(text: string, field: string, min: number): { ok: true; value: number } | { ok: false; message: string } {
  const t = text.trim();
  const n = Number(t);
  if (t === '' || !Number.isFinite(n)) return { ok: false, message: `${field}: "${text}" is not a number` };
  if (!Number.isInteger(n)) return { ok: false, message: `${field}: must be a whole number, not ${t}` };
  if (n < min) return { ok: false, message: `${field}: must be at least ${min}` };
  return { ok: true, value: n };
}

/** The missed-prompt share typed as a percentage ("20", "20 %", "" for none) → 0.2. */
export function missedShare(text: string): { ok: true; value: number | undefined } | { ok: false; message: string } {
  const t = text.trim().replace(/\s*%$/, '');
  if (t === '') return { ok: true, value: undefined };
  const n = Number(t);
  if (!Number.isFinite(n)) return { ok: false, message: `Missed prompts: "${text}" is not a percentage such as 20` };
  if (n < 0 || n >= 100) return { ok: false, message: 'Missed prompts: must be a percentage from 0 up to (not including) 100' };
  return { ok: true, value: n / 100 };
}

/** The share as the field shows it: 0.2 → "20". */
export function missedText(share: number | undefined): string {
  return share === undefined ? '' : String(significant(share * 100, 10));
}

/** A clock time typed loosely ("9", "9:00", "09:00") → "09:00"; anything else is left for the core to reject. */
export function clockText(text: string): string {
  const m = /^\s*(\d{1,2})(?::(\d{2}))?\s*$/.exec(text);
  if (!m) return text.trim();
  return `${m[1].padStart(2, '0')}:${m[2] ?? '00'}`;
}

/** A schedule of `kind`, keeping what the current one has in common with it. */
export function scheduleOfKind(kind: Schedule['kind'], current: Schedule): Schedule {
  if (kind === current.kind) return current;
  if (kind === 'daily-window') return { kind, promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'stratified-random' };
  return { kind };
}

/**
 * The patch for a new schedule: the schedule, and the interval it gives
 * (the spacing of prompts within the day, one day, one week; a fixed
 * schedule keeps the interval). Example: 5 stratified prompts 09:00–21:00 → interval "2.4 h".
 */
export function schedulePatch(schedule: Schedule, unit: TimeUnit): Partial<Study> {
  if (schedule.kind === 'fixed') return { schedule };
  const spacing = nominalSpacing(schedule, unit);
  return Number.isFinite(spacing) && spacing > 0 ? { schedule, interval: exactDuration(spacing, unit) } : { schedule };
}

/** How the study length is given. */
export type LengthBy = 'duration' | 'samples';

export function lengthBy(study: Study): LengthBy {
  return typeof study.length === 'number' ? 'samples' : 'duration';
}

/**
 * The study length given the other way, for about the same study: a duration
 * becomes the prompts it plans; a count of prompts the days (or weeks, or
 * time) they take. Example: 14 days at 5 a day → 70; 70 prompts at 5 a day → "14 day".
 */
export function lengthAs(study: Study, unit: TimeUnit, by: LengthBy): string | number {
  if (lengthBy(study) === by) return study.length;
  if (by === 'samples') {
    try {
      return Math.max(2, plannedSlots(study, unit).base.length);
    } catch {
      // a study too long to plan prompt by prompt: its window over its interval
      const w = lengthAxis(study.length, unit);
      const interval = studyInterval(study, unit);
      return w.ok && w.window !== undefined && interval ? Math.max(2, Math.floor(w.window / interval)) : study.length;
    }
  }
  const n = study.length as number;
  const sch = study.schedule;
  if (sch.kind === 'daily-window') return `${Math.ceil(n / sch.promptsPerDay)} day`;
  if (sch.kind === 'daily') return `${n} day`;
  if (sch.kind === 'weekly') return `${n} week`;
  const interval = studyInterval(study, unit);
  return interval !== undefined ? exactDuration(n * interval, unit) : `${n} ${unit}`;
}
