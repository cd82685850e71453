/**
 * Main-thread client of the inverse search: each run starts a worker of its
 * own (a busy worker reads no messages, so Cancel terminates it) and reports
 * progress; when a worker cannot start, the same job runs on the main thread
 * (no progress, and Cancel only drops the answer).
 */
import type { InverseProgress } from '../core/undersample/index';
import { noWorkerRequested } from './lane';
import { inverseJob, type InverseJobAnswer, type InverseRequest } from './undersampleApi';

export type InverseOutcome =
  | { status: 'done'; answer: InverseJobAnswer; where: 'worker' | 'main thread' }
  | { status: 'cancelled' };

export interface InverseRun {
  result: Promise<InverseOutcome>;
  cancel(): void;
}

type WorkerMessage = { type: 'progress'; progress: InverseProgress } | { type: 'done'; answer: InverseJobAnswer };

function onMainThread(req: InverseRequest): InverseRun {
  let cancelled = false;
  let finish: (o: InverseOutcome) => void = () => {};
  const result = new Promise<InverseOutcome>((resolve) => { finish = resolve; });
  setTimeout(() => {
    if (cancelled) return;
    const answer = inverseJob(req, undefined, () => cancelled);
    finish(cancelled ? { status: 'cancelled' } : { status: 'done', answer, where: 'main thread' });
  }, 0);
  return { result, cancel: () => { cancelled = true; finish({ status: 'cancelled' }); } };
}

/** Start one inverse search. `noWorker` (by default the app's `?noworker`, read once by the lane) runs it on the main thread. */
export function runInverse(req: InverseRequest, onProgress: (p: InverseProgress) => void, noWorker = noWorkerRequested()): InverseRun {
  let worker: Worker;
  try {
    if (noWorker || typeof Worker === 'undefined') return onMainThread(req);
    worker = new Worker(new URL('./undersample.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return onMainThread(req);
  }
  let settled = false;
  let finish: (o: InverseOutcome) => void = () => {};
  const result = new Promise<InverseOutcome>((resolve) => { finish = resolve; });
  const end = (o: InverseOutcome) => {
    if (settled) return;
    settled = true;
    worker.terminate();
    finish(o);
  };
  worker.onmessage = (ev: MessageEvent<WorkerMessage>) => {
    if (ev.data.type === 'progress') onProgress(ev.data.progress);
    else end({ status: 'done', answer: ev.data.answer, where: 'worker' });
  };
  worker.onerror = () => {
    // the worker did not load: run the same job here
    if (settled) return;
    settled = true;
    worker.terminate();
    onMainThread(req).result.then(finish);
  };
  worker.postMessage(req);
  return { result, cancel: () => end({ status: 'cancelled' }) };
}
