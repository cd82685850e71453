/**
 * What the editor opens with, and what keeps it safe: a model in the URL
 * fragment (#m=…), else ?example=ID, else the autosaved state, else an empty
 * canvas. After opening, the URL is cleaned so a reload restores the autosave.
 */
import { documentStore, selectDirty } from '../state/document';
import { loadSnapshot, saveSnapshot } from '../state/persist';
import { uiStore } from '../state/ui';
import { openExample, openShareFragment } from './actions';

export async function openInitialDocument(): Promise<void> {
  const url = new URL(location.href);
  let opened = false;
  const fromLink = openShareFragment(location.hash);
  if (fromLink !== null) opened = fromLink;
  const example = url.searchParams.get('example');
  if (!opened && example) opened = openExample(example);
  if (fromLink !== null || example) {
    url.hash = '';
    url.searchParams.delete('example');
    history.replaceState(null, '', url.pathname + url.search);
  }
  if (!opened) {
    try {
      const snap = await loadSnapshot();
      if (snap) documentStore.getState().load(snap.model, { fileName: snap.fileName, dirty: snap.dirty });
    } catch {
      // no IndexedDB (private mode): start empty
    }
  }
}

/** Keep the document in IndexedDB a moment after each change. */
export function startAutosave(pauseMs = 150): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const write = () => {
    const s = documentStore.getState();
    saveSnapshot({ model: s.history.present, fileName: s.fileName, dirty: selectDirty(s) })
      .then(() => uiStore.getState().set({ autosaved: new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' }) }))
      .catch(() => uiStore.getState().set({ autosaved: null }));
  };
  const unsub = documentStore.subscribe((s, prev) => {
    if (s.history.present === prev.history.present && s.fileName === prev.fileName && s.savedModel === prev.savedModel) return;
    clearTimeout(timer);
    timer = setTimeout(write, pauseMs);
  });
  const flush = () => {
    if (timer !== undefined) {
      clearTimeout(timer);
      timer = undefined;
      write();
    }
  };
  window.addEventListener('pagehide', flush);
  const warn = (e: BeforeUnloadEvent) => {
    const s = documentStore.getState();
    if (s.fileName !== undefined && selectDirty(s)) {
      e.preventDefault();
      e.returnValue = '';
    }
  };
  window.addEventListener('beforeunload', warn);
  return () => {
    unsub();
    window.removeEventListener('pagehide', flush);
    window.removeEventListener('beforeunload', warn);
  };
}
