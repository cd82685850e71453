import { useRef } from 'react';
import { documentStore, selectCanRedo, selectCanUndo, selectDirty, useDocument } from '../state/document';
import { uiStore } from '../state/ui';
import { addRelation, addVariable, copyShareLink, newModel, openFile, openWithPicker, save, saveAs } from './actions';

const mod = typeof navigator !== 'undefined' && /Mac/.test(navigator.platform) ? '⌘' : 'Ctrl+';

/** Wordmark, file actions, undo/redo and the gallery. */
export function TopBar() {
  const canUndo = useDocument(selectCanUndo);
  const canRedo = useDocument(selectCanRedo);
  const dirty = useDocument(selectDirty);
  const fileName = useDocument((s) => s.fileName);
  const name = useDocument((s) => s.history.present.name);
  const input = useRef<HTMLInputElement>(null);
  return (
    <header className="lf-topbar">
      <span className="lf-wordmark" aria-label="Loopfold">
        <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true"><path d="M4,15 C4,5 18,5 18,11 C18,17 9,17 9,12" fill="none" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" /><path d="M15,8 l3,3 l-3.6,1.4" fill="none" stroke="currentColor" strokeWidth="2" /></svg>
        <h1>Loopfold</h1>
      </span>
      <span className="lf-docname" title={fileName ?? 'not saved to a file yet'}>
        {name}
        {dirty && fileName ? <span className="lf-dirty" aria-label="unsaved changes"> •</span> : null}
      </span>
      <nav className="lf-toolbar" aria-label="File and edit">
        <div role="group" aria-label="File">
          <button type="button" onClick={newModel}>New</button>
          <button type="button" onClick={() => void openWithPicker().then((used) => { if (!used) input.current?.click(); })}>Open…</button>
          <button type="button" onClick={() => void save()} title={`${mod}S`}>Save</button>
          <button type="button" onClick={() => void saveAs()}>Save as…</button>
          <button type="button" onClick={() => void copyShareLink()}>Share link</button>
          <input
            ref={input}
            type="file"
            accept=".json,application/json"
            hidden
            aria-label="Open a model file"
            data-testid="open-file-input"
            onChange={(e) => {
              const f = e.target.files?.[0];
              e.target.value = '';
              if (f) void openFile(f);
            }}
          />
        </div>
        <div role="group" aria-label="Edit">
          <button type="button" onClick={() => documentStore.getState().undo()} disabled={!canUndo} title={`${mod}Z`}>Undo</button>
          <button type="button" onClick={() => documentStore.getState().redo()} disabled={!canRedo} title={`Shift+${mod}Z`}>Redo</button>
        </div>
        <div role="group" aria-label="Add">
          <button type="button" onClick={() => addVariable('derived')} title="N">+ Variable</button>
          <button type="button" onClick={() => addRelation()}>+ Relation</button>
        </div>
        <button type="button" className="lf-primary" onClick={() => uiStore.getState().set({ galleryOpen: true })}>Examples</button>
      </nav>
    </header>
  );
}
