/**
 * The browser transport to the core worker. A module worker that fails to
 * load does not throw: it fires "error", which rejects every pending call so
 * the client can fall back to the main thread.
 */
import type { CoreApi } from './protocol';
import { createCoreClient, type CoreClient } from './client';
import { localCore } from './analyze';
import { startWorker } from './guard';
import { noWorkerRequested } from './lane';
import { createBandHost, type BandApi } from './bands';
import { createBandClient, type BandClient, type BandTransport } from './bandClient';

export function workerCore(): CoreApi & { dispose: () => void } {
  const w = startWorker<CoreApi>(() => new Worker(new URL('./core.worker.ts', import.meta.url), { type: 'module' }), 'core worker');
  return { analyze: (model, design) => w.call(() => w.remote.analyze(model, design)), dispose: w.dispose };
}

/** The app's core client: in a worker when possible, else on the main thread. */
export function createAppCoreClient(): CoreClient {
  return createCoreClient(noWorkerRequested() ? null : workerCore, () => localCore);
}

/**
 * The band orderings get a core worker of their own (the same worker code):
 * a full analysis (ordering, breakpoints, equation matching) of a big model
 * takes several times as long as one band, and a band the modeller moved to
 * must not wait behind it.
 */
export function workerBands(): BandTransport {
  const w = startWorker<BandApi>(() => new Worker(new URL('./core.worker.ts', import.meta.url), { type: 'module' }), 'core worker');
  return {
    openBands: (set, model, study, hold) => w.call(() => w.remote.openBands(set, model, study, hold)),
    bandOrdering: (set, seq, interval) => w.call(() => w.remote.bandOrdering(set, seq, interval)),
    closeBands: (set) => w.call(() => w.remote.closeBands(set)),
    dispose: w.dispose,
  };
}

let bandClient: BandClient | null = null;
/** The app's band client, created on first use: in a worker when possible, else on the main thread (`?noworker`). */
export function appBandClient(): BandClient {
  bandClient ??= createBandClient(noWorkerRequested() ? null : workerBands, () => createBandHost());
  return bandClient;
}
