import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './ui/App';
import { openInitialDocument, startAutosave } from './ui/startup';
import { startAnalysis } from './state/analysis';
import { createAppCoreClient } from './worker/transport';
import { documentStore } from './state/document';
import type { Model } from './core/model/types';

declare global {
  interface Window {
    /** For end-to-end tests and benchmarks: load a model without the file picker. */
    __loopfold?: { load(model: Model): void; model(): Model };
  }
}

async function start() {
  await openInitialDocument();
  startAutosave();
  startAnalysis(createAppCoreClient());
  window.__loopfold = { load: (m) => documentStore.getState().load(m), model: () => documentStore.getState().history.present };
  createRoot(document.getElementById('root')!).render(
    <StrictMode>
      <App />
    </StrictMode>,
  );
}

void start();
