/**
 * Orderings per band of the interval axis, as plain code shared by the core
 * worker and the main-thread fallback. A band set (model, study length,
 * holds) is opened once — the model crosses to the core once — and answers
 * with its breakpoints; then each band's ordering is asked for by interval
 * and kept here per band. Between breakpoints nothing changes, so an
 * interval inside a band already asked for costs a lookup.
 * Exceptions become a message; nothing is thrown across.
 */
import type { Model, VariableId } from '../core/model/types';
import type { Breakpoint, Ordering, StudyDesign } from '../core/ordering/types';
import { breakpoints, orderingAt } from '../core/ordering/index';
import { bandOfCuts, cutsOf, intervalInBand, type Cut } from '../core/view/interval';

/** The study length of a band set: a number of samples or a fixed window (model time unit). */
export type BandStudy = { samples: number; window?: undefined } | { window: number; samples?: undefined };

export type OpenAnswer = { ok: true; breakpoints: Breakpoint[]; elapsedMs: number } | { ok: false; message: string };

export type BandAnswer =
  | {
      ok: true;
      /** The request's sequence number, echoed. */
      seq: number;
      band: number;
      ordering: Ordering;
      /** Milliseconds the core took to compute this band's ordering (when it was first asked for). */
      computeMs: number;
      /** Answered from the per-band cache (no computation for this request). */
      cached: boolean;
    }
  | { ok: false; seq: number; band: number; message: string };

/** What the core worker hosts beside the analysis; the main-thread fallback is the same code. */
export interface BandApi {
  /** Open band set `set` (a number the caller chooses); answers with the breakpoints. */
  openBands(set: number, model: Model, study: BandStudy, hold?: Record<VariableId, number>): Promise<OpenAnswer>;
  /** The ordering of the band that holds `interval`; `seq` comes back with the answer. */
  bandOrdering(set: number, seq: number, interval: number): Promise<BandAnswer>;
  /** Forget a band set and its orderings. */
  closeBands(set: number): Promise<void>;
}

/** Orderings the host keeps per band set (least recently used dropped first). */
export const HOST_BANDS_KEPT = 48;
/** Bands on each side of the band last asked for that a worker host computes ahead, while idle. */
export const PREFETCH_REACH = 6;

export interface BandHostOptions {
  /** Orderings kept per band set. */
  kept?: number;
  /**
   * Compute the neighbours of the band last asked for while idle (one band per
   * task, so a request waits for at most one): the next band the control
   * reaches is then a lookup, and the core's code is compiled by the time the
   * modeller moves. For a worker host; on the main thread it would take frames.
   */
  prefetch?: boolean;
  /** Schedules the next step of the computing ahead (tests pass their own). */
  schedule?: (step: () => void) => void;
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

interface OpenSet {
  model: Model;
  study: BandStudy;
  hold?: Record<VariableId, number>;
  cuts: Cut[];
  perBand: Map<number, { ordering: Ordering; computeMs: number }>;
  /** Bands to compute ahead, nearest to the band last asked for first. */
  ahead: number[];
}

/** The design a band set computes at an interval: its study length, the interval and any holds. */
export function bandDesign(study: BandStudy, interval: number, hold?: Record<VariableId, number>): StudyDesign {
  const base: StudyDesign = study.window !== undefined ? { window: study.window } : { samples: study.samples };
  return { ...base, interval, ...(hold && Object.keys(hold).length ? { hold } : {}) };
}

/** A host of band sets (one per worker, or one on the main thread). */
export function createBandHost(options: BandHostOptions = {}): BandApi {
  const kept = options.kept ?? HOST_BANDS_KEPT;
  const schedule = options.schedule ?? ((step: () => void) => void setTimeout(step, 0));
  const sets = new Map<number, OpenSet>();
  const compute = (s: OpenSet, band: number, interval: number) => {
    const t0 = now();
    const ordering = orderingAt(s.model, bandDesign(s.study, interval, s.hold));
    const entry = { ordering, computeMs: now() - t0 };
    s.perBand.set(band, entry);
    if (s.perBand.size > kept) s.perBand.delete(s.perBand.keys().next().value!);
    return entry;
  };
  let running = false;
  const step = () => {
    running = false;
    for (const s of sets.values()) {
      while (s.ahead.length > 0) {
        const band = s.ahead.shift()!;
        if (s.perBand.has(band)) continue;
        const x = intervalInBand(s.cuts, band);
        if (x === null) continue;
        try {
          compute(s, band, x);
        } catch {
          // a band that fails here gives its message when it is asked for
        }
        running = true;
        schedule(step);
        return;
      }
    }
  };
  const ahead = (s: OpenSet, band: number) => {
    if (!options.prefetch) return;
    s.ahead = [];
    for (let d = 1; d <= PREFETCH_REACH; d++) s.ahead.push(band + d, band - d);
    s.ahead = s.ahead.filter((k) => k >= 0 && k <= s.cuts.length && !s.perBand.has(k));
    if (!running && s.ahead.length > 0) {
      running = true;
      schedule(step);
    }
  };
  return {
    async openBands(set, model, study, hold) {
      const t0 = now();
      try {
        const axis: StudyDesign = study.window !== undefined ? { window: study.window } : { samples: study.samples };
        const bps = breakpoints(model, axis);
        sets.set(set, { model, study, hold, cuts: cutsOf(bps), perBand: new Map(), ahead: [] });
        return { ok: true, breakpoints: bps, elapsedMs: now() - t0 };
      } catch (e) {
        sets.delete(set);
        return { ok: false, message: `the breakpoints could not be computed: ${(e as Error).message}` };
      }
    },
    async bandOrdering(set, seq, interval) {
      const s = sets.get(set);
      if (!s) return { ok: false, seq, band: -1, message: `band set ${set} is not open` };
      const band = bandOfCuts(s.cuts, interval);
      const hit = s.perBand.get(band);
      if (hit) {
        s.perBand.delete(band);
        s.perBand.set(band, hit); // most recently used last
        ahead(s, band);
        return { ok: true, seq, band, ordering: hit.ordering, computeMs: hit.computeMs, cached: true };
      }
      try {
        const { ordering, computeMs } = compute(s, band, interval);
        ahead(s, band);
        return { ok: true, seq, band, ordering, computeMs, cached: false };
      } catch (e) {
        return { ok: false, seq, band, message: `the ordering could not be computed: ${(e as Error).message}` };
      }
    },
    async closeBands(set) {
      sets.delete(set);
    },
  };
}
