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

/** Start ELK in a worker (the bundled build on the main thread when no worker can start). */
export async function startElk(): Promise<ElkRunner> {
  try {
    const [{ default: ELK }, { default: workerUrl }] = await Promise.all([
      import('elkjs/lib/elk-api.js'),
      import('elkjs/lib/elk-worker.min.js?url'),
    ]);
    if (typeof Worker === 'undefined') throw new Error('no Worker');
    return new ELK({ workerFactory: () => new Worker(workerUrl) }) as unknown as ElkRunner;
  } catch {
    const { default: ELK } = await import('elkjs/lib/elk.bundled.js');
    return new ELK() as unknown as ElkRunner;
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
    return { elk, dispose: async () => ((await elk) as ElkRunner & { terminateWorker?: () => void }).terminateWorker?.() };
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
