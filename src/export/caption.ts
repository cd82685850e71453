/** The caption the app and the command line put under a figure at a sampling interval. */
import type { Model } from '../core/model/types';
import { formatDuration } from '../core/model/units';
import { studyText } from '../core/view/derive';
import { designAxis, windowOf } from '../core/study/convert';

export interface StudyAt {
  interval?: number;
  /** Study length as a duration (wins over `samples`). */
  window?: number;
  /** Study length in samples (default: the model's settings, else 50). */
  samples?: number;
}

/** "Sampling interval every 1 h · study 50 samples (2.08 days)"; undefined without an interval. */
export function studyCaption(model: Model, study: StudyAt): string | undefined {
  if (study.interval === undefined) return undefined;
  return `Sampling interval every ${formatDuration(study.interval, model.timeUnit)} · ${studyText(model, study.interval, study.window, study.samples)}`;
}

/** The study length in model time: the window, or samples × interval. */
export function studyLength(model: Model, study: StudyAt): number | undefined {
  if (study.interval === undefined) return undefined;
  return windowOf(designAxis(model, study), study.interval);
}
