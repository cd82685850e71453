/**
 * ELK in the browser, in a worker (loaded lazily: the layout code is not in
 * the first page load). Latest request wins: a layout made obsolete by a
 * newer request is dropped. Falls back to the bundled ELK on the main thread
 * when a worker cannot start.
 */
import type { ViewModel } from '../core/view/types';
import { elkLayout, type ElkLayoutOptions, type ElkRunner } from './elk';
import type { Layout } from './types';

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
 * A layout queue for one view, with its own worker: each request gets a
 * ticket and results of old tickets resolve to null. A request that comes
 * while a layout is running stops that worker (a big graph can take seconds)
 * and starts a fresh one, so the newest view never waits for a stale one;
 * a cancelled layout that nobody waits behind finishes in its worker (a
 * fresh worker costs a new start of ELK).
 */
export function createLayoutQueue(start: () => Promise<ElkRunner> = startElk) {
  let ticket = 0;
  /** The ticket of the layout running in the worker (0: the worker is idle). */
  let running = 0;
  let runner: Promise<ElkRunner> | undefined;
  const stop = async () => {
    const r = runner;
    runner = undefined;
    running = 0;
    ((await r) as (ElkRunner & { terminateWorker?: () => void }) | undefined)?.terminateWorker?.();
  };
  return {
    async request(vm: ViewModel, opts: ElkLayoutOptions): Promise<Layout | null> {
      const mine = ++ticket;
      // a stale layout still running: stop its worker rather than wait for it
      if (running && runner) await stop();
      runner ??= start();
      const elk = await runner;
      if (mine !== ticket) return null;
      running = mine;
      try {
        const result = await elkLayout(elk, vm, opts);
        return mine === ticket ? result : null;
      } finally {
        if (running === mine) running = 0;
      }
    },
    /** Drop the pending request; a layout running goes on in its worker and is dropped when done. */
    cancel() { ticket++; },
    /** Drop the pending request and stop a layout that is running (its worker is started afresh on the next request). */
    async abandon() {
      ticket++;
      if (running && runner) await stop();
    },
    /** Stop the worker (when the view goes away). */
    async dispose() {
      ticket++;
      await stop();
    },
  };
}
