/**
 * The study length under the interval control, read from the study itself:
 * the text the field shows (the study's own, exactly as stored), the length
 * given the other way when the modeller switches between a duration and a
 * number of samples (the schedule's planned prompts, never an assumed count),
 * the line beside the field, and the patch a typed length makes. Pure; tested
 * in Node.
 */
import type { Study, TimeUnit } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { lengthAxis, studyInterval } from '../../core/study/convert';
import { plannedSlots } from '../../core/study/schedule';
import { lengthAs, lengthBy, type LengthBy } from '../study/edit';

export type { LengthBy };

/** The field's text: the study's length as stored ("14 days" stays "14 days" in any time unit; 70 → "70"). */
export function lengthFieldText(study: Study): string {
  return String(study.length);
}

/**
 * The study length given the other way, as the field shows it after the
 * switch: 14 days of 5 prompts a day → 70; 70 prompts at every 3 h → "210 h"
 * written exactly ("8 day 18 h" is never rounded to "1.25 weeks").
 */
export function switchedLength(study: Study, unit: TimeUnit, by: LengthBy): string | number {
  return lengthAs(study, unit, by);
}

/**
 * The line beside the field: a duration gives the prompts it plans ("70 prompts
 * planned"); a number of samples the time they take ("lasts 8.75 days").
 * Null when the study does not check out.
 */
export function lengthOther(study: Study, unit: TimeUnit): string | null {
  const interval = studyInterval(study, unit);
  const axis = lengthAxis(study.length, unit);
  if (interval === undefined || !axis.ok) return null;
  if (axis.window !== undefined) {
    let n: number;
    try {
      n = plannedSlots(study, unit).base.length;
    } catch {
      n = Math.floor(axis.window / interval);
    }
    return `${n} ${n === 1 ? 'prompt' : 'prompts'} planned`;
  }
  const span = lengthAs(study, unit, 'duration');
  const d = lengthAxis(span, unit);
  return d.ok && d.window !== undefined ? `lasts ${formatDuration(d.window, unit)}` : null;
}

/**
 * The study's length from the text typed in the field, or the message that
 * names the field. A duration is kept as typed (with its unit, so that a
 * change of the model's time unit keeps the same real time); a count of
 * samples is a whole number of at least 2.
 * Example: `typedLength("14 days", "duration", "h")` → { ok: true, length: "14 days" }.
 */
export function typedLength(text: string, by: LengthBy, unit: TimeUnit): { ok: true; length: string | number } | { ok: false; message: string } {
  const t = text.trim();
  if (by === 'samples') {
    const n = Number(t);
    if (t === '' || !Number.isInteger(n) || n < 2) return { ok: false, message: 'Study length: give a whole number of samples, 2 or more' };
    return { ok: true, length: n };
  }
  const a = lengthAxis(t, unit);
  if (!a.ok) return { ok: false, message: `Study length: ${a.message}` };
  if (!(a.window! > 0)) return { ok: false, message: 'Study length: must be longer than zero' };
  return { ok: true, length: t };
}

export { lengthBy };
