import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './ui/App';
import { openInitialDocument, startAutosave } from './ui/startup';
import { startAnalysis } from './state/analysis';
import { createAppCoreClient } from './worker/transport';
import { documentStore } from './state/document';
import { startSelectionPruning } from './state/selection';
import type { Model } from './core/model/types';
import { parseModel } from './core/model/schema';

declare global {
  interface Window {
    /** For end-to-end tests and benchmarks: load a model without the file picker. */
    __loopfold?: { load(model: Model): void; model(): Model };
  }
}

async function start() {
  await openInitialDocument();
  startAutosave();
  startSelectionPruning(documentStore);
  startAnalysis(createAppCoreClient());
  window.__loopfold = {
    load: (m) => {
      // the hook takes the same road as a file: validated, never executed
      const r = parseModel(m);
      if (!r.ok) throw new Error(r.issues.map((i) => `${i.path}: ${i.message}`).join('; '));
      documentStore.getState().load(r.model);
    },
    model: () => documentStore.getState().history.present,
  };
  createRoot(document.getElementById('root')!).render(
    <StrictMode>
      <App />
    </StrictMode>,
  );
}

void start();
