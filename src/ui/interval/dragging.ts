/**
 * Whether the interval control is being dragged with the pointer: the
 * figure then follows the band where the thumb rests, not every band the
 * thumb passes.
 */
import { useSyncExternalStore } from 'react';

export interface Drag {
  /** Counts the drags of this page (0: none yet). */
  id: number;
  /** The interval when the drag began. */
  from: number | null;
}

let current: Drag | null = null;
let drags = 0;
const listeners = new Set<() => void>();

/** The shortest rest that counts as the thumb resting (ms). */
export const REST_MIN_MS = 100;
/** Frames measured during the drag (a slow page gets a longer rest, see restDelay). */
let frameMs = 16.7;
let lastFrame = 0;
let frameLoop = 0;
const measureFrames = (t: number) => {
  if (lastFrame) frameMs = 0.8 * frameMs + 0.2 * Math.min(500, t - lastFrame);
  lastFrame = t;
  frameLoop = requestAnimationFrame(measureFrames);
};

/**
 * How long the thumb must stay still before the figure follows it: at least
 * REST_MIN_MS, and at least four frames of this page (on a slow page pointer
 * events arrive a frame apart, and a shorter rest would draw a band at every
 * event, which slows the frames further).
 */
export function restDelay(): number {
  return Math.max(REST_MIN_MS, 4 * frameMs);
}

/** A drag begins (with the interval before the pointer moved it) or ends (null). */
export function setIntervalDrag(from: number | null | undefined): void {
  if (from === undefined) {
    if (!current) return;
    current = null;
    if (typeof cancelAnimationFrame !== 'undefined') cancelAnimationFrame(frameLoop);
  } else {
    if (current) return;
    current = { id: ++drags, from };
    frameMs = 16.7;
    lastFrame = 0;
    if (typeof requestAnimationFrame !== 'undefined') frameLoop = requestAnimationFrame(measureFrames);
  }
  listeners.forEach((l) => l());
}

/** The drag in progress, or null. */
export function useIntervalDrag(): Drag | null {
  return useSyncExternalStore(
    (l) => { listeners.add(l); return () => { listeners.delete(l); }; },
    () => current,
    () => null,
  );
}

/** Whether a drag is in progress (for code outside React). */
export function isIntervalDragging(): boolean {
  return current !== null;
}

/** Call `listener` when a drag begins or ends; returns a function that stops it. */
export function onIntervalDrag(listener: () => void): () => void {
  listeners.add(listener);
  return () => { listeners.delete(listener); };
}
