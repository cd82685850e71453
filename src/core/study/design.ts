/**
 * The study as the rest of the program reads it: the model's own study or
 * the default one, the range of intervals the control offers, and the
 * interval a study starts at when the model names none.
 */
import type { Model, Study } from '../model/types';
import { breakpoints } from '../ordering/index';
import { intervalRange, type IntervalRange } from '../view/interval';
import { modelAxis, type StudyAxis } from './convert';

/**
 * The range of the interval control for a study length: every breakpoint and
 * timescale with a margin; with a fixed window, only intervals up to the window.
 * Example: `studyRange(model, { samples: 50 })` → { min, max } in the model's unit.
 */
export function studyRange(model: Model, axis: StudyAxis): IntervalRange {
  let r: IntervalRange;
  try {
    r = intervalRange(model, breakpoints(model, axis.window !== undefined ? { window: axis.window } : { samples: axis.samples }));
  } catch {
    r = intervalRange(model, []);
  }
  if (axis.window === undefined || r.max <= axis.window) return r;
  return { min: Math.min(r.min, axis.window / 100), max: axis.window };
}

/** The interval a study starts at when none is given: the middle of the control (geometric mean of its range). */
export function defaultInterval(model: Model, axis: StudyAxis = modelAxis(model)): number {
  const r = studyRange(model, axis);
  return Math.sqrt(r.min * r.max);
}

/**
 * The model's study, or the one the app starts with when the model has none:
 * the length of a version-1 file (else 50 samples), prompts at a fixed
 * interval in the middle of the control, one person.
 */
export function studyOfModel(model: Model): Study {
  if (model.study) return model.study;
  const axis = modelAxis(model);
  return { interval: defaultInterval(model, axis), length: axis.window !== undefined ? String(axis.window) : axis.samples, schedule: { kind: 'fixed' } };
}
