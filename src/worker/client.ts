/**
 * Main-thread client of the core: every request carries a sequence number
 * and only the answer to the latest request is delivered (latest wins);
 * older answers that arrive late are dropped. The transport is injected, so
 * the logic is tested in Node with a fake one.
 */
import type { Model } from '../core/model/types';
import type { AnalysisResult, CoreApi, StudyDesign } from './protocol';

export type Delivered<T> = { stale: false; seq: number; value: T } | { stale: true; seq: number };

/**
 * Wrap an async call so that each call is stamped and a result is marked
 * stale when a newer call was made before it arrived.
 */
export function latestWins<A extends unknown[], T>(call: (...args: A) => Promise<T>) {
  let latest = 0;
  return {
    async call(...args: A): Promise<Delivered<T>> {
      const seq = ++latest;
      const value = await call(...args);
      return seq === latest ? { stale: false, seq, value } : { stale: true, seq };
    },
    /** Make every answer still in flight stale (e.g. the document was replaced). */
    invalidate() {
      latest++;
    },
    get latest() {
      return latest;
    },
  };
}

export interface CoreClient {
  /** Resolves with the analysis, or `null` when a newer request overtook this one. */
  analyze(model: Model, design: StudyDesign): Promise<AnalysisResult | null>;
  /** Where the core runs. */
  readonly where: () => 'worker' | 'main thread';
  dispose(): void;
}

/**
 * A client over a primary transport (the worker) with a fallback (the core
 * on the main thread) used when the primary cannot start or fails.
 */
export function createCoreClient(primary: (() => CoreApi & { dispose?: () => void }) | null, fallback: () => CoreApi): CoreClient {
  let api: (CoreApi & { dispose?: () => void }) | null = null;
  let onMain = false;
  try {
    api = primary ? primary() : null;
  } catch {
    api = null;
  }
  if (!api) onMain = true;
  let fb: CoreApi | null = null;
  const mainApi = () => (fb ??= fallback());
  const run = async (model: Model, design: StudyDesign): Promise<AnalysisResult> => {
    if (!onMain && api) {
      try {
        return await api.analyze(model, design);
      } catch {
        // The worker failed (could not load, crashed): run the core here from now on.
        onMain = true;
        api.dispose?.();
      }
    }
    return mainApi().analyze(model, design);
  };
  const lw = latestWins(run);
  // At most one request is with the core; a newer one waits, and replaces any
  // older one still waiting (which is then never sent). An answer is delivered
  // only if no newer request came meanwhile.
  type Job = { model: Model; design: StudyDesign; resolve: (r: AnalysisResult | null) => void };
  let waiting: Job | null = null;
  let busy = false;
  const pump = () => {
    if (busy || !waiting) return;
    const job = waiting;
    waiting = null;
    busy = true;
    lw.call(job.model, job.design)
      .then(
        (d) => job.resolve(d.stale || waiting ? null : d.value),
        (e: unknown) => job.resolve({ ok: false, message: `the analysis failed: ${(e as Error).message}` }),
      )
      .finally(() => {
        busy = false;
        pump();
      });
  };
  return {
    analyze(model, design) {
      return new Promise((resolve) => {
        waiting?.resolve(null);
        waiting = { model, design, resolve };
        pump();
      });
    },
    where: () => (onMain ? 'main thread' : 'worker'),
    dispose() {
      waiting?.resolve(null);
      waiting = null;
      lw.invalidate();
      api?.dispose?.();
    },
  };
}
