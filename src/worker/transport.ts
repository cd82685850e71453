/**
 * The browser transport to the core worker. A module worker that fails to
 * load does not throw: it fires "error", which rejects every pending call so
 * the client can fall back to the main thread.
 */
import { releaseProxy, wrap } from 'comlink';
import type { CoreApi } from './protocol';
import { createCoreClient, type CoreClient } from './client';
import { localCore } from './analyze';

export function workerCore(): CoreApi & { dispose: () => void } {
  if (typeof Worker === 'undefined') throw new Error('this browser has no Web Workers');
  const worker = new Worker(new URL('./core.worker.ts', import.meta.url), { type: 'module' });
  let failure: Error | null = null;
  const pending = new Set<(e: Error) => void>();
  const fail = (message: string) => {
    failure = new Error(message);
    for (const reject of pending) reject(failure);
    pending.clear();
  };
  worker.addEventListener('error', (ev) => fail(ev.message || 'the core worker could not start'));
  worker.addEventListener('messageerror', () => fail('the core worker sent a message that could not be read'));
  const remote = wrap<CoreApi>(worker);
  return {
    analyze(model, design) {
      if (failure) return Promise.reject(failure);
      return new Promise((resolve, reject) => {
        pending.add(reject);
        remote.analyze(model, design).then(resolve, reject).finally(() => pending.delete(reject));
      });
    },
    dispose() {
      remote[releaseProxy]();
      worker.terminate();
    },
  };
}

/** The app's core client: in a worker when possible, else on the main thread. */
export function createAppCoreClient(): CoreClient {
  const noWorker = typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
  return createCoreClient(noWorker ? null : workerCore, () => localCore);
}
