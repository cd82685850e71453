/**
 * ELK in the browser, in a worker (loaded lazily: the layout code is not in
 * the first page load). Latest request wins (a lane, worker/lane.ts): a
 * layout made obsolete by a newer request is dropped. Falls back to the
 * bundled ELK on the main thread when a worker cannot start.
 */
import type { ViewModel } from '../core/view/types';
import { elkLayout, type ElkLayoutOptions, type ElkRunner } from './elk';
import type { Layout } from './types';
import { createLane, type Transport } from '../worker/lane';

/** How long a new ELK worker may take to answer its first question before ELK runs on the main thread instead. */
export const WORKER_ANSWER_MS = 20_000;

/** A worker as ELK's client uses it (and as a test can stand in for one). */
export interface WorkerLike {
  postMessage(msg: unknown): void;
  terminate(): void;
  addEventListener?(type: 'error', listener: (e: unknown) => void): void;
}

export interface StartElkOptions {
  /** Make the worker (default: `new Worker(url)` with the bundled worker script's URL). */
  worker?: () => WorkerLike;
  /** How long the worker may take to answer (ms). */
  answerWithinMs?: number;
}

/** Stop a runner's worker, if it has one; never throws (a runner on the main thread has nothing to stop). */
export function stopElk(elk: ElkRunner | undefined): void {
  try {
    (elk as (ElkRunner & { terminateWorker?: () => void }) | undefined)?.terminateWorker?.();
  } catch {
    /* no worker, or already stopped */
  }
}

/** The bundled ELK on the main thread. */
async function mainThreadElk(): Promise<ElkRunner> {
  const { default: ELK } = await import('elkjs/lib/elk.bundled.js');
  return new ELK() as unknown as ElkRunner;
}

/**
 * Start ELK in a worker; the bundled build on the main thread when no worker can start. A worker
 * that cannot load its script (a bad URL, a blocked one) raises no exception where it is made: it
 * fires an error event and never answers, and every layout sent to it would wait forever. So the
 * new worker is asked one question first (its algorithms); an error event, a refusal or no answer
 * within `answerWithinMs` stops it and ELK runs on the main thread instead.
 */
export async function startElk(options: StartElkOptions = {}): Promise<ElkRunner> {
  let made: WorkerLike | undefined;
  let elk: ElkRunner | undefined;
  try {
    const { default: ELK } = await import('elkjs/lib/elk-api.js');
    let factory = options.worker;
    if (!factory) {
      if (typeof Worker === 'undefined') throw new Error('no Worker');
      const { default: workerUrl } = await import('elkjs/lib/elk-worker.min.js?url');
      factory = () => new Worker(workerUrl);
    }
    const make: () => WorkerLike = factory;
    elk = new ELK({ workerFactory: () => (made = make()) as unknown as Worker }) as unknown as ElkRunner;
    const asked = elk as ElkRunner & { knownLayoutAlgorithms(): Promise<unknown> };
    const within = options.answerWithinMs ?? WORKER_ANSWER_MS;
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`the layout worker did not answer within ${within} ms`)), within);
      made?.addEventListener?.('error', () => { clearTimeout(timer); reject(new Error('the layout worker could not start')); });
      asked.knownLayoutAlgorithms().then(() => { clearTimeout(timer); resolve(); }, (e: unknown) => { clearTimeout(timer); reject(e instanceof Error ? e : new Error(String(e))); });
    });
    return elk;
  } catch {
    stopElk(elk);
    if (!elk) { try { made?.terminate(); } catch { /* never started */ } }
    return mainThreadElk();
  }
}

let shared: Promise<ElkRunner> | undefined;
/** One worker for one-off layouts (figure export). */
export function browserElk(): Promise<ElkRunner> {
  shared ??= startElk();
  return shared;
}

/**
 * A layout queue for one view, with its own worker, on a lane (the lane's
 * preempt policy): results of requests a newer one overtook resolve to null.
 * A request that comes while a layout is running stops that worker (a big
 * graph can take seconds) and starts a fresh one, so the newest view never
 * waits for a stale one; a cancelled layout that nobody waits behind
 * finishes in its worker (a fresh worker costs a new start of ELK).
 */
export function createLayoutQueue(start: () => Promise<ElkRunner> = startElk) {
  // startElk falls back to the bundled ELK by itself; the lane only starts and stops it
  const runner = (): Transport<{ elk: Promise<ElkRunner> }> => {
    const elk = start();
    return { elk, dispose: async () => stopElk(await elk.catch(() => undefined)) };
  };
  const lane = createLane({ worker: runner, fallback: runner, lazy: true });
  const queue = lane.latest(async (vm: ViewModel, opts: ElkLayoutOptions) => elkLayout(await lane.api().elk, vm, opts), {
    mode: 'preempt',
    ready: () => lane.api().elk,
  });
  return {
    request: (vm: ViewModel, opts: ElkLayoutOptions): Promise<Layout | null> => queue.latest(vm, opts),
    /** Drop the pending request; a layout running goes on in its worker and is dropped when done. */
    cancel() { queue.supersede(); },
    /** Drop the pending request and stop a layout that is running (its worker is started afresh on the next request). */
    async abandon() {
      const running = queue.busy();
      queue.supersede();
      if (running) await lane.restart();
    },
    /** Stop the worker (when the view goes away). */
    async dispose() {
      queue.supersede();
      await lane.restart();
    },
  };
}
