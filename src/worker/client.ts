/**
 * Main-thread client of the core's analysis, on a lane (lane.ts): at most
 * one request is with the core; a newer one waits and replaces any older one
 * still waiting (which is then never sent); an answer is delivered only if no
 * newer request came meanwhile. The transport is injected, so the logic is
 * tested in Node with a fake one.
 */
import type { Model } from '../core/model/types';
import type { AnalysisResult, CoreApi, StudyDesign } from './protocol';
import { createLane, latestWins, type Delivered, type Transport, type Where } from './lane';

export { latestWins, type Delivered };

export interface CoreClient {
  /** Resolves with the analysis, or `null` when a newer request overtook this one. */
  analyze(model: Model, design: StudyDesign): Promise<AnalysisResult | null>;
  /** Where the core runs. */
  readonly where: () => Where;
  dispose(): void;
}

/**
 * A client over a primary transport (the worker) with a fallback (the core
 * on the main thread) used when the primary cannot start or fails.
 */
export function createCoreClient(primary: (() => Transport<CoreApi>) | null, fallback: () => CoreApi): CoreClient {
  const lane = createLane({ worker: primary, fallback });
  const queue = lane.latest((model: Model, design: StudyDesign) => lane.run((api) => api.analyze(model, design)).then((r) => r.value), {
    failed: (e): AnalysisResult => ({ ok: false, message: `the analysis failed: ${(e as Error).message}` }),
  });
  return {
    analyze: (model, design) => queue.latest(model, design),
    where: lane.where,
    dispose() {
      queue.supersede();
      lane.dispose();
    },
  };
}
