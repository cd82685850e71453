/**
 * Main-thread client of the data worker, on a lane (lane.ts): reading the
 * header and importing are serial latest-wins queues (a newer file replaces
 * one still waiting); each fit is a cancellable job on a worker of its own,
 * with progress, that Cancel stops by ending that worker. When a worker
 * cannot start or fails, the same code answers on the main thread
 * (`?noworker` too).
 */
import { proxy } from 'comlink';
import { startWorker } from './guard';
import { createLane, noWorkerRequested, type CancellableRun, type Transport, type Where } from './lane';
import type { CointAnswer, CtAnswer, DataApi, Failed, HeaderAnswer, ImportAnswer, VarAnswer } from './dataApi';

export type FitAnswer<T> = T | { ok: false; reason: string; cancelled: true };

export interface DataClient {
  header(...args: Parameters<DataApi['header']>): Promise<HeaderAnswer | Failed | null>;
  importData(...args: Parameters<DataApi['importData']>): Promise<ImportAnswer | null>;
  /** Import a File or Blob read in the worker (the main thread never holds the text); same queue rule as importData. */
  importBlob(...args: Parameters<DataApi['importBlob']>): Promise<ImportAnswer | null>;
  fitVar(model: Parameters<DataApi['fitVar']>[0], panel: Parameters<DataApi['fitVar']>[1], request: Parameters<DataApi['fitVar']>[2], onProgress?: (fraction: number) => void): CancellableRun<FitAnswer<VarAnswer>>;
  fitCt(model: Parameters<DataApi['fitCt']>[0], panel: Parameters<DataApi['fitCt']>[1], request: Parameters<DataApi['fitCt']>[2], onProgress?: (fraction: number) => void): CancellableRun<FitAnswer<CtAnswer>>;
  /** Latest wins: null when a newer test was asked for first. */
  coint(...args: Parameters<DataApi['coint']>): Promise<CointAnswer | null>;
  where(): Where;
  dispose(): void;
}

const cancelled = () => ({ ok: false as const, reason: 'the fit was stopped', cancelled: true as const });

export function createDataClient(worker: (() => Transport<DataApi>) | null, fallback: () => DataApi): DataClient {
  const lane = createLane<DataApi>({ worker, fallback, lazy: true });
  const failed = (e: unknown): Failed => ({ ok: false, reason: (e as Error)?.message ?? String(e) });
  const header = lane.latest((...a: Parameters<DataApi['header']>) => lane.run((x) => x.header(...a)).then((r) => r.value), { failed });
  const importData = lane.latest((...a: Parameters<DataApi['importData']>) => lane.run((x) => x.importData(...a)).then((r) => r.value), { failed });
  const importBlob = lane.latest((...a: Parameters<DataApi['importBlob']>) => lane.run((x) => x.importBlob(...a)).then((r) => r.value), { failed });
  const coint = lane.latest((...a: Parameters<DataApi['coint']>) => lane.run((x) => x.coint(...a)).then((r) => r.value), { failed });
  return {
    header: (...a) => header.latest(...a),
    coint: (...a) => coint.latest(...a),
    importData: (...a) => importData.latest(...a),
    importBlob: (...a) => importBlob.latest(...a),
    fitVar: (model, panel, request, onProgress) => lane.cancellable('var', (x, progress) => x.fitVar(model, panel, request, progress), { onProgress, cancelled, failed }),
    fitCt: (model, panel, request, onProgress) => lane.cancellable('ct', (x, progress) => x.fitCt(model, panel, request, progress), { onProgress, cancelled, failed }),
    where: () => lane.where(),
    dispose: () => lane.dispose(),
  };
}

function workerData(): Transport<DataApi> {
  const w = startWorker<DataApi>(() => new Worker(new URL('./data.worker.ts', import.meta.url), { type: 'module' }), 'data worker');
  return {
    header: (t, v, u, d) => w.call(() => w.remote.header(t, v, u, d)),
    importData: (t, m, d) => w.call(() => w.remote.importData(t, m, d)),
    importBlob: (b, m, d) => w.call(() => w.remote.importBlob(b, m, d)),
    fitVar: (m, p, r, on) => w.call(() => w.remote.fitVar(m, p, r, on ? proxy(on) : undefined)),
    fitCt: (m, p, r, on) => w.call(() => w.remote.fitCt(m, p, r, on ? proxy(on) : undefined)),
    coint: (t, r, d) => w.call(() => w.remote.coint(t, r, d)),
    dispose: w.dispose,
  };
}

let appClient: Promise<DataClient> | null = null;
/** The app's data client, created on first use (the worker and the fits load when the Data pane opens). */
export function appDataClient(): Promise<DataClient> {
  appClient ??= import('./dataApi').then(({ localData }) => createDataClient(noWorkerRequested() ? null : workerData, () => localData));
  return appClient;
}
