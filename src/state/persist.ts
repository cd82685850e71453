/**
 * Autosave to IndexedDB, so a reload or a crashed tab restores the last
 * state. The snapshot is versioned and validated on the way back in.
 */
import { createStore, get, set, del, type UseStore } from 'idb-keyval';
import { parseModel } from '../core/model/schema';
import type { Model } from '../core/model/types';
import { withLinkIds } from './changes';

export const SNAPSHOT_VERSION = 1;
const KEY = 'current';

export interface Snapshot {
  version: typeof SNAPSHOT_VERSION;
  model: Model;
  /** The file name the model was last saved to or opened from. */
  fileName?: string;
  /** Unsaved changes since the last save or open. */
  dirty: boolean;
  savedAt: number;
}

/** An IndexedDB store opened on first use; a store passed in (a test's) wins. */
export function lazyStore(db: string, name: string): (s?: UseStore) => UseStore {
  let opened: UseStore | undefined;
  return (s) => s ?? (opened ??= createStore(db, name));
}
const store = lazyStore('loopfold', 'autosave');

export async function saveSnapshot(snap: Omit<Snapshot, 'version' | 'savedAt'>, s?: UseStore): Promise<void> {
  const full: Snapshot = { version: SNAPSHOT_VERSION, savedAt: Date.now(), ...snap };
  await set(KEY, full, store(s));
}

/** The last snapshot, or null when there is none or it no longer validates. */
export async function loadSnapshot(s?: UseStore): Promise<Snapshot | null> {
  const raw = (await get(KEY, store(s))) as Partial<Snapshot> | undefined;
  if (!raw || raw.version !== SNAPSHOT_VERSION) return null;
  const r = parseModel(raw.model);
  if (!r.ok) return null;
  return { version: SNAPSHOT_VERSION, model: withLinkIds(r.model), fileName: typeof raw.fileName === 'string' ? raw.fileName : undefined, dirty: raw.dirty === true, savedAt: Number(raw.savedAt) || 0 };
}

export async function clearSnapshot(s?: UseStore): Promise<void> {
  await del(KEY, store(s));
}

export { createStore };
