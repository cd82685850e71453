/**
 * ELK in the browser, in a worker (loaded lazily: the layout code is not in
 * the first page load). Latest request wins: a layout made obsolete by a
 * newer request is dropped. Falls back to the bundled ELK on the main thread
 * when a worker cannot start.
 */
import type { ViewModel } from '../core/view/types';
import { elkLayout, type ElkLayoutOptions, type ElkRunner } from './elk';
import type { Layout } from './types';

let runner: Promise<ElkRunner> | undefined;

async function startElk(): Promise<ElkRunner> {
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

export function browserElk(): Promise<ElkRunner> {
  runner ??= startElk();
  return runner;
}

/** A layout queue for one view: each request gets a ticket; results of old tickets resolve to null. */
export function createLayoutQueue(getElk: () => Promise<ElkRunner> = browserElk) {
  let ticket = 0;
  return {
    async request(vm: ViewModel, opts: ElkLayoutOptions): Promise<Layout | null> {
      const mine = ++ticket;
      const elk = await getElk();
      if (mine !== ticket) return null;
      const result = await elkLayout(elk, vm, opts);
      return mine === ticket ? result : null;
    },
    cancel() { ticket++; },
  };
}
