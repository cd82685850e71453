/**
 * Main-thread client of the pictures worker: each kind of question keeps
 * only its latest answer (older ones resolve with null); when the worker
 * cannot start or fails, the same code answers on the main thread.
 */
import { latestWins } from './client';
import { startWorker } from './guard';
import type { PicturesApi } from './picturesApi';

type Kind = keyof PicturesApi;
type Answer<K extends Kind> = Awaited<ReturnType<PicturesApi[K]>>;

export interface PicturesClient {
  ask<K extends Kind>(kind: K, ...args: Parameters<PicturesApi[K]>): Promise<Answer<K> | null>;
  readonly where: () => 'worker' | 'main thread';
  dispose(): void;
}

export function createPicturesClient(primary: (() => PicturesApi & { dispose?: () => void }) | null, fallback: () => PicturesApi): PicturesClient {
  let onMain = primary === null;
  let remote: (PicturesApi & { dispose?: () => void }) | null = null;
  let started = false;
  const api = (): PicturesApi => {
    if (!started && !onMain && primary) {
      started = true;
      try { remote = primary(); } catch { onMain = true; }
    }
    return onMain || !remote ? fallback() : remote;
  };
  const call = async (kind: Kind, args: unknown[]): Promise<unknown> => {
    const a = api();
    try {
      return await (a[kind] as (...x: unknown[]) => Promise<unknown>)(...args);
    } catch (e) {
      if (a === fallback()) throw e;
      onMain = true;
      remote?.dispose?.();
      return (fallback()[kind] as (...x: unknown[]) => Promise<unknown>)(...args);
    }
  };
  const lanes = new Map<Kind, ReturnType<typeof latestWins<unknown[], unknown>>>();
  return {
    async ask(kind, ...args) {
      let l = lanes.get(kind);
      if (!l) { l = latestWins((...a: unknown[]) => call(kind, a)); lanes.set(kind, l); }
      const d = await l.call(...(args as unknown[]));
      return d.stale ? null : (d.value as never);
    },
    where: () => (onMain || !remote ? 'main thread' : 'worker'),
    dispose() {
      for (const l of lanes.values()) l.invalidate();
      remote?.dispose?.();
    },
  };
}

function workerPictures(): PicturesApi & { dispose: () => void } {
  const w = startWorker<PicturesApi>(() => new Worker(new URL('./pictures.worker.ts', import.meta.url), { type: 'module' }), 'pictures worker');
  return {
    pictures: (m, o) => w.call(() => w.remote.pictures(m, o)),
    probabilities: (m, d, n, s) => w.call(() => w.remote.probabilities(m, d, n, s)),
    dispose: w.dispose,
  };
}

let appClient: Promise<PicturesClient> | null = null;
/** The app's pictures client, created on first use; `?noworker` runs it on the main thread. */
export function appPicturesClient(): Promise<PicturesClient> {
  appClient ??= import('./picturesApi').then(({ localPictures }) => {
    const noWorker = typeof location !== 'undefined' && new URLSearchParams(location.search).has('noworker');
    return createPicturesClient(noWorker ? null : workerPictures, () => localPictures);
  });
  return appClient;
}
