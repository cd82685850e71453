/**
 * Main-thread client of the pictures worker, on a lane (lane.ts): each kind
 * of question is a serial latest-wins queue (a newer question replaces one
 * still waiting, whose promise resolves null); when the worker cannot start
 * or fails, the same code answers on the main thread (`?noworker` too).
 */
import { startWorker } from './guard';
import { createLane, noWorkerRequested, type Transport, type Where } from './lane';
import type { PicturesApi, PicturesAnswer, ProbabilitiesAnswer, StrengthAdviceAnswer } from './picturesApi';

export interface PicturesClient {
  pictures(...args: Parameters<PicturesApi['pictures']>): Promise<PicturesAnswer | null>;
  probabilities(...args: Parameters<PicturesApi['probabilities']>): Promise<ProbabilitiesAnswer | null>;
  strengthAdvice(...args: Parameters<PicturesApi['strengthAdvice']>): Promise<StrengthAdviceAnswer | null>;
  where(): Where;
  dispose(): void;
}

export function createPicturesClient(worker: (() => Transport<PicturesApi>) | null, fallback: () => PicturesApi): PicturesClient {
  const lane = createLane<PicturesApi>({ worker, fallback, lazy: true });
  const failed = (e: unknown) => ({ ok: false as const, reason: (e as Error)?.message ?? String(e) });
  const pictures = lane.latest((...a: Parameters<PicturesApi['pictures']>) => lane.run((x) => x.pictures(...a)).then((r) => r.value), { failed });
  const probabilities = lane.latest((...a: Parameters<PicturesApi['probabilities']>) => lane.run((x) => x.probabilities(...a)).then((r) => r.value), { failed });
  const strengthAdvice = lane.latest((...a: Parameters<PicturesApi['strengthAdvice']>) => lane.run((x) => x.strengthAdvice(...a)).then((r) => r.value), { failed });
  return {
    pictures: (...a) => pictures.latest(...a),
    probabilities: (...a) => probabilities.latest(...a),
    strengthAdvice: (...a) => strengthAdvice.latest(...a),
    where: () => lane.where(),
    dispose: () => lane.dispose(),
  };
}

function workerPictures(): Transport<PicturesApi> {
  const w = startWorker<PicturesApi>(() => new Worker(new URL('./pictures.worker.ts', import.meta.url), { type: 'module' }), 'pictures worker');
  return {
    pictures: (m, o) => w.call(() => w.remote.pictures(m, o)),
    probabilities: (m, d, n, s) => w.call(() => w.remote.probabilities(m, d, n, s)),
    strengthAdvice: (m, l, o) => w.call(() => w.remote.strengthAdvice(m, l, o)),
    dispose: w.dispose,
  };
}

let appClient: Promise<PicturesClient> | null = null;
/** The app's pictures client, created on first use (the worker and the core load when the pane opens). */
export function appPicturesClient(): Promise<PicturesClient> {
  appClient ??= import('./picturesApi').then(({ localPictures }) => createPicturesClient(noWorkerRequested() ? null : workerPictures, () => localPictures));
  return appClient;
}
