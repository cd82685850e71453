/**
 * Undo history as plain data: snapshots of the (immutable, structurally
 * shared) model. A `squash` key merges consecutive edits of one gesture
 * (typing in a field, one drag) into a single step.
 */
import type { Model } from '../core/model/types';

export const HISTORY_LIMIT = 500;

export interface History {
  past: Model[];
  present: Model;
  future: Model[];
  /** Key of the gesture that produced `present`; the next edit with the same key replaces it. */
  squash?: string;
}

export function startHistory(model: Model): History {
  return { past: [], present: model, future: [] };
}

/** Record a new present. Identical models are not recorded. */
export function record(h: History, next: Model, squash?: string): History {
  if (next === h.present) return h;
  if (squash !== undefined && squash === h.squash && h.past.length > 0) return { past: h.past, present: next, future: [], squash };
  const past = h.past.length >= HISTORY_LIMIT ? h.past.slice(h.past.length - HISTORY_LIMIT + 1) : h.past.slice();
  past.push(h.present);
  return { past, present: next, future: [], squash };
}

/** End the current gesture: the next edit starts a new step even with the same key. */
export function stop(h: History): History {
  return h.squash === undefined ? h : { ...h, squash: undefined };
}

export function undo(h: History): History {
  if (h.past.length === 0) return h;
  const past = h.past.slice(0, -1);
  return { past, present: h.past[h.past.length - 1], future: [h.present, ...h.future] };
}

export function redo(h: History): History {
  if (h.future.length === 0) return h;
  return { past: [...h.past, h.present], present: h.future[0], future: h.future.slice(1) };
}
