/**
 * The unit labels under the interval track ("1 h", "1 day", "1 week", …): round units inside the
 * track's range, and which of them keep their text at the track's width so that no two labels
 * overlap or run past the track's ends. A mark whose label would collide keeps its tick and loses
 * its text. Pure; tested in Node (`tests/ui/interval/scale.test.ts`).
 */
import type { TimeUnit } from '../../core/model/types';
import { SECONDS_PER_UNIT } from '../../core/model/units';
import { toPosition, type IntervalRange } from '../../core/view/interval';

/** Clear space kept between two labels, in CSS pixels. */
export const LABEL_GAP_PX = 8;

/** Round unit marks inside the range: 1 s, 1 min, 1 h, 1 day, 1 week, 1 month, 1 year, 10 years. */
export function unitMarks(range: IntervalRange, unit: TimeUnit): { at: number; label: string }[] {
  const marks: [number, string][] = [[1, '1 s'], [60, '1 min'], [3600, '1 h'], [86400, '1 day'], [7 * 86400, '1 week'], [SECONDS_PER_UNIT.month, '1 month'], [SECONDS_PER_UNIT.year, '1 year'], [10 * SECONDS_PER_UNIT.year, '10 years']];
  return marks.map(([s, label]) => ({ at: s / SECONDS_PER_UNIT[unit], label })).filter((m) => m.at >= range.min && m.at <= range.max);
}

/**
 * A mark on the scale, placed: its tick in pixels from the track's left end, whether its text is
 * shown, and where the text starts (centred on the tick, moved inwards at the track's ends).
 */
export interface PlacedMark { at: number; label: string; x: number; shown: boolean; left: number; width: number }

/**
 * Which labels to show on a scale `width` pixels wide: each label is centred on its mark, and
 * shown when its box (its measured width) is clear of every shown label by
 * `LABEL_GAP_PX` (a label at an end of the track is moved inwards to fit). The coarser unit wins a collision (a week beats a day, a month beats a week):
 * labels are taken from the coarsest down.
 */
export function placeLabels(marks: readonly { at: number; label: string }[], range: IntervalRange, width: number, measure: (text: string) => number): PlacedMark[] {
  const placed: PlacedMark[] = marks.map((m) => ({ ...m, x: toPosition(range, m.at) * width, shown: false, left: 0, width: 0 }));
  const boxes: [number, number][] = [];
  // marks arrive finest first; the coarsest is tried first
  for (let i = placed.length - 1; i >= 0; i--) {
    const m = placed[i];
    const w = measure(m.label);
    if (w > width) continue;
    const left = Math.min(Math.max(m.x - w / 2, 0), width - w), right = left + w;
    if (boxes.some(([l, r]) => left < r + LABEL_GAP_PX && l < right + LABEL_GAP_PX)) continue;
    boxes.push([left, right]);
    Object.assign(m, { shown: true, left, width: w });
  }
  return placed;
}
