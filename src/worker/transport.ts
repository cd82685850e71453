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
import { createBandHost, type BandApi } from './bands';
import { createBandClient, type BandClient, type BandTransport } from './bandClient';

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

/**
 * The band orderings get a core worker of their own (the same worker code):
 * a full analysis (ordering, breakpoints, equation matching) of a big model
 * takes several times as long as one band, and a band the modeller moved to
 * must not wait behind it.
 */
export function workerBands(): BandTransport {
  if (typeof Worker === 'undefined') throw new Error('this browser has no Web Workers');
  const worker = new Worker(new URL('./core.worker.ts', import.meta.url), { type: 'module' });
  const guard = guardWorker(worker, 'core worker');
  const wrapped = wrap<BandApi>(worker);
  // the answers are plain data (see above)
  const remote = wrapped as unknown as BandApi;
  let disposed = false;
  return {
    openBands: (set, model, study, hold) => guard.call(() => remote.openBands(set, model, study, hold)),
    bandOrdering: (set, seq, interval) => guard.call(() => remote.bandOrdering(set, seq, interval)),
    closeBands: (set) => guard.call(() => remote.closeBands(set)),
    dispose() {
      if (disposed) return;
      disposed = true;
      guard.fail('the core worker was stopped');
      wrapped[releaseProxy]();
      worker.terminate();
    },
  };
}

let bandClient: BandClient | null = null;
/** The app's band client, created on first use: in a worker when possible, else on the main thread (`?noworker`). */
export function appBandClient(): BandClient {
  const noWorker = typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
  bandClient ??= createBandClient(noWorker ? null : workerBands, () => createBandHost());
  return bandClient;
}
