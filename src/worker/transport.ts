/**
 * The browser transport to the core worker. A module worker that fails to
 * load does not throw: it fires "error", which rejects every pending call so
 * the client can fall back to the main thread.
 */
import { releaseProxy, wrap } from 'comlink';
import type { CoreApi } from './protocol';
import { createCoreClient, type CoreClient } from './client';
import { localCore } from './analyze';
import { guardWorker } from './guard';

export function workerCore(): CoreApi & { dispose: () => void } {
  if (typeof Worker === 'undefined') throw new Error('this browser has no Web Workers');
  const worker = new Worker(new URL('./core.worker.ts', import.meta.url), { type: 'module' });
  const guard = guardWorker(worker, 'core worker');
  const wrapped = wrap<CoreApi>(worker);
  // comlink's Remote<T> widens the answers to a union TypeScript cannot narrow back; the answers are plain data.
  const remote = wrapped as unknown as CoreApi;
  return {
    analyze: (model, design) => guard.call(() => remote.analyze(model, design)),
    dispose() {
      wrapped[releaseProxy]();
      worker.terminate();
    },
  };
}

/** The app's core client: in a worker when possible, else on the main thread. */
export function createAppCoreClient(): CoreClient {
  const noWorker = typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
  return createCoreClient(noWorker ? null : workerCore, () => localCore);
}
