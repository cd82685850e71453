/**
 * Orderings per band of the interval axis, computed on the main thread by
 * the ordering core (loaded lazily) and cached: moving the interval inside a
 * band reuses the cached ordering; only crossing a breakpoint computes one.
 */
import { useEffect, useState } from 'react';
import type { Model } from '../../core/model/types';
import type { Breakpoint, Ordering, StudyDesign } from '../../core/ordering/types';
import { bandOfCuts, cutsOf, intervalRange, type Cut, type IntervalRange } from '../../core/view/interval';
import type { StudyLength } from '../../state/study';

interface OrderingCore {
  orderingAt(model: Model, design: StudyDesign): Ordering;
  breakpoints?(model: Model, design?: StudyDesign): Breakpoint[];
}

// Resolved at build time; while the core is absent the views say so instead of failing to build.
const modules = import.meta.glob<OrderingCore>('../../core/ordering/index.ts');
let loading: Promise<OrderingCore | null> | null = null;
export function loadOrderingCore(): Promise<OrderingCore | null> {
  const loader = Object.values(modules)[0];
  loading ??= loader ? loader() : Promise.resolve(null);
  return loading;
}

/** Orderings kept per model and study (least recently used dropped first). */
export const BANDS_KEPT = 32;

export interface BandCache {
  model: Model;
  breakpoints: Breakpoint[];
  /** Breakpoint places, ascending. */
  cuts: Cut[];
  range: IntervalRange;
  /** Band number of an interval: how many breakpoints lie at or below it. */
  band(interval: number): number;
  /** The ordering at an interval (cached per band). */
  orderingAt(interval: number): Ordering;
  /** The study design at an interval. */
  design(interval: number): StudyDesign;
  /** Milliseconds of the last fresh computation (not cached). */
  lastComputeMs: number;
}

function studyOf(length: StudyLength): StudyDesign {
  return length.by === 'window' ? { window: length.window } : { samples: length.samples };
}

/** With a fixed study window only intervals up to the window are studied. */
function clampToWindow(r: IntervalRange, length: StudyLength): IntervalRange {
  if (length.by !== 'window' || r.max <= length.window) return r;
  return { min: Math.min(r.min, length.window / 100), max: length.window };
}

export function createBandCache(core: OrderingCore, model: Model, length: StudyLength, hold?: Record<string, number>): BandCache {
  const study = studyOf(length);
  const breakpoints = core.breakpoints ? core.breakpoints(model, study) : [];
  const cuts = cutsOf(breakpoints);
  const perBand = new Map<number, Ordering>();
  const cache: BandCache = {
    model, breakpoints, cuts,
    range: clampToWindow(intervalRange(model, breakpoints), length),
    band: (interval) => bandOfCuts(cuts, interval),
    design: (interval) => ({ ...study, interval, ...(hold && Object.keys(hold).length ? { hold } : {}) }),
    lastComputeMs: 0,
    orderingAt(interval) {
      const k = cache.band(interval);
      let o = perBand.get(k);
      if (!o) {
        const t0 = performance.now();
        o = core.orderingAt(model, cache.design(interval));
        cache.lastComputeMs = performance.now() - t0;
        perBand.set(k, o);
        // a drag across a big model visits hundreds of bands: keep the latest few
        if (perBand.size > BANDS_KEPT) perBand.delete(perBand.keys().next().value!);
      } else {
        perBand.delete(k);
        perBand.set(k, o); // most recently used last
      }
      return o;
    },
  };
  return cache;
}

const caches = new WeakMap<Model, Map<string, BandCache>>();
function cached(core: OrderingCore, model: Model, length: StudyLength, hold?: Record<string, number>): BandCache {
  let m = caches.get(model);
  if (!m) caches.set(model, (m = new Map()));
  const key = JSON.stringify([length, hold ?? {}]);
  let c = m.get(key);
  if (!c) m.set(key, (c = createBandCache(core, model, length, hold)));
  return c;
}

export type BandCacheState = { status: 'loading' } | { status: 'missing' } | { status: 'failed'; message: string } | { status: 'ready'; cache: BandCache };

/** The band cache of a model, study length and interventions, shared by every view of the page. */
export function useBandCache(model: Model | null, length: StudyLength, hold?: Record<string, number>): BandCacheState {
  const [core, setCore] = useState<OrderingCore | null | undefined>(undefined);
  useEffect(() => {
    let live = true;
    void loadOrderingCore().then((c) => { if (live) setCore(c); });
    return () => { live = false; };
  }, []);
  if (core === undefined || !model) return { status: 'loading' };
  if (core === null) return { status: 'missing' };
  try {
    return { status: 'ready', cache: cached(core, model, length, hold) };
  } catch (e) {
    return { status: 'failed', message: (e as Error).message };
  }
}
