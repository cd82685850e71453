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

/** A drag begins (with the interval before the pointer moved it) or ends (null). */
export function setIntervalDrag(from: number | null | undefined): void {
  if (from === undefined) {
    if (!current) return;
    current = null;
  } else {
    if (current) return;
    current = { id: ++drags, from };
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
