/**
 * The study rides in the document (`model.study`) so that undo, autosave,
 * files and share links carry it; the analysis reads the model without it
 * (the design reaches the core separately), so an edit of the study alone
 * leaves the checked model, its analysis and its band sets as they are.
 */
import type { Model } from '../core/model/types';

/** Whether two models differ at most in their study. */
export function onlyStudyDiffers(a: Model, b: Model): boolean {
  if (a === b) return true;
  for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) if (k !== 'study' && (a as unknown as Record<string, unknown>)[k] !== (b as unknown as Record<string, unknown>)[k]) return false;
  return true;
}

/** The model without its study: what the core reads (the design comes with each request). */
export function withoutStudy(model: Model): Model {
  if (model.study === undefined) return model;
  const { study: _s, ...rest } = model;
  void _s;
  return rest;
}
