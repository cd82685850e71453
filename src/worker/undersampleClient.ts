/**
 * Main-thread client of the inverse search, on a lane (lane.ts): each run is
 * a cancellable job on a worker of its own (a busy worker reads no messages,
 * so Cancel ends that worker) with progress; a newer run replaces an older
 * one. When a worker cannot start or fails, the same job runs on the main
 * thread (`?noworker` too; there Cancel only drops the answer).
 */
import { proxy } from 'comlink';
import type { InverseProgress } from '../core/undersample/index';
import { startWorker } from './guard';
import { createLane, noWorkerRequested, type Transport, type Where } from './lane';
import type { InverseJobAnswer, InverseRequest, UndersampleApi } from './undersampleApi';

export type InverseOutcome =
  | { status: 'done'; answer: InverseJobAnswer; where: Where }
  | { status: 'cancelled' };

export interface InverseRun {
  /** The outcome; null when a newer run replaced this one. */
  result: Promise<InverseOutcome | null>;
  cancel(): void;
}

export interface UndersampleClient {
  runInverse(req: InverseRequest, onProgress?: (p: InverseProgress) => void): InverseRun;
  where(): Where;
  dispose(): void;
}

type Answer = InverseJobAnswer | 'cancelled';

export function createUndersampleClient(worker: (() => Transport<UndersampleApi>) | null, fallback: () => UndersampleApi): UndersampleClient {
  const lane = createLane<UndersampleApi>({ worker, fallback, lazy: true });
  return {
    runInverse(req, onProgress) {
      const run = lane.cancellable<Answer, InverseProgress>('inverse', (api, progress) => api.inverse(req, progress), {
        onProgress,
        cancelled: () => 'cancelled',
        failed: (e): Answer => ({ ok: false, reason: (e as Error)?.message ?? String(e) }),
      });
      return {
        result: run.result.then((a): InverseOutcome | null => (a === null ? null : a === 'cancelled' ? { status: 'cancelled' } : { status: 'done', answer: a, where: lane.where() })),
        cancel: run.cancel,
      };
    },
    where: () => lane.where(),
    dispose: () => lane.dispose(),
  };
}

function workerUndersample(): Transport<UndersampleApi> {
  const w = startWorker<UndersampleApi>(() => new Worker(new URL('./undersample.worker.ts', import.meta.url), { type: 'module' }), 'undersample worker');
  return {
    inverse: (req, p) => w.call(() => w.remote.inverse(req, p ? proxy(p) : undefined)),
    dispose: w.dispose,
  };
}

let appClient: Promise<UndersampleClient> | null = null;
/** The app's inverse-search client, created on first use (the search code loads when the Steps tab runs it). */
export function appUndersampleClient(): Promise<UndersampleClient> {
  appClient ??= import('./undersampleApi').then(({ localUndersample }) => createUndersampleClient(noWorkerRequested() ? null : workerUndersample, () => localUndersample));
  return appClient;
}
