/**
 * The integer-step mode's inverse search as one job: every causal-step graph
 * behind a measured graph, and when there is none the nearest consistent
 * measured graphs. Runs in `undersample.worker.ts`, or on the main thread
 * when a worker cannot start. Plain data in and out.
 */
import { causalGraphsFor, nearestMeasuredGraphs, type InverseAnswer, type InverseMethod, type InverseProgress, type MeasuredGraph, type NearestAnswer } from '../core/undersample/index';

export interface InverseRequest {
  graph: MeasuredGraph;
  rates: number[];
  method?: InverseMethod;
  /** Most solutions listed (all are counted). */
  maxSolutions?: number;
}

export type InverseJobAnswer = { ok: true; answer: InverseAnswer; nearest: NearestAnswer | null } | { ok: false; reason: string };

export function inverseJob(req: InverseRequest, onProgress?: (p: InverseProgress) => void, shouldStop?: () => boolean): InverseJobAnswer {
  try {
    const answer = causalGraphsFor(req.graph, req.rates, { method: req.method, maxSolutions: req.maxSolutions ?? 200, onProgress, progressEvery: 5000, shouldStop });
    const nearest = answer.count === 0 && !answer.stopped ? nearestMeasuredGraphs(req.graph, req.rates, { maxResults: 5, shouldStop }) : null;
    return { ok: true, answer, nearest };
  } catch (e) {
    return { ok: false, reason: (e as Error).message };
  }
}

/** The inverse search as a lane API (lane.ts): the worker exposes it, the main thread uses it when no worker runs. */
export interface UndersampleApi {
  inverse(req: InverseRequest, onProgress?: (p: InverseProgress) => void): Promise<InverseJobAnswer>;
}

export const localUndersample: UndersampleApi = {
  async inverse(req, onProgress) {
    // Let the page draw the progress bar before a main-thread search holds the thread.
    await new Promise((r) => setTimeout(r, 0));
    return inverseJob(req, onProgress);
  },
};
