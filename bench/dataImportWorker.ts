// The worker side of the data bench: the Data pane's import API (`localData.importBlob`, the same code the
// app's data worker runs) in a Node worker thread; the panel's buffers go back by transfer, as in the app.
import { parentPort } from 'node:worker_threads';
import { localData, panelBuffers } from '../src/worker/dataApi';
import type { ColumnMapping } from '../src/core/data/import';

parentPort!.on('message', async (m: { blob: Blob; mapping: ColumnMapping }) => {
  const t0 = performance.now();
  const r = await localData.importBlob(m.blob, m.mapping);
  const ms = performance.now() - t0;
  parentPort!.postMessage({ answer: r, ms }, panelBuffers(r));
});
parentPort!.postMessage('ready');
