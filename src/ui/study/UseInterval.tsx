/**
 * "Use this interval": sets the study's interval through the session owner
 * (one undo step), written as the label the app shows ("7.33 h"), which
 * reads back to the interval shown.
 */
import type { TimeUnit } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { studyInterval } from '../../core/study/convert';
import { setStudyInterval, useSessionStudy } from '../../state/session';

export function UseInterval({ value, unit, what }: { value: number; unit: TimeUnit; what?: string }) {
  const s = useSessionStudy();
  const text = formatDuration(value, unit);
  const current = s ? studyInterval(s.study, unit) : undefined;
  const inUse = current !== undefined && Math.abs(current - (studyInterval({ interval: text }, unit) ?? NaN)) <= 1e-9 * current;
  return (
    <button
      type="button"
      className="lf-use-interval"
      data-interval={text}
      disabled={!s || inUse}
      aria-label={`Use every ${text}${what ? ` (${what})` : ''} as the study interval`}
      title={inUse ? 'The study uses this interval' : 'Set the study interval to this (undo brings back the one before)'}
      onClick={() => setStudyInterval(text)}
    >
      {inUse ? `every ${text}: in use` : `Use every ${text}`}
    </button>
  );
}
