/**
 * The interval axis of the timescale views: breakpoints and one ordering per
 * band, from the core worker through the band client (`src/worker/bandClient.ts`;
 * on the main thread when no worker can start). A model, study length and
 * holds open one band set; moving the interval inside a band asks for
 * nothing, crossing a breakpoint asks for that band's ordering (latest
 * wins), and until it arrives the views keep the figure they show.
 */
import { useEffect, useRef, useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import type { Ordering } from '../../core/ordering/types';
import { intervalRange, type IntervalRange } from '../../core/view/interval';
import type { StudyLength } from '../../state/study';
import type { BandStudy } from '../../worker/bands';
import { bandKey, type BandOrdering, type BandResult, type BandSet, type OpenResult, type Where } from '../../worker/bandClient';
import { appBandClient } from '../../worker/transport';

/** A band set as the views read it: the set, its study length and the range of the control. */
export interface BandCache extends BandSet {
  length: StudyLength;
  range: IntervalRange;
}

export function studyOf(length: StudyLength): BandStudy {
  return length.by === 'window' ? { window: length.window } : { samples: length.samples };
}

/** With a fixed study window only intervals up to the window are studied. */
function clampToWindow(r: IntervalRange, length: StudyLength): IntervalRange {
  if (length.by !== 'window' || r.max <= length.window) return r;
  return { min: Math.min(r.min, length.window / 100), max: length.window };
}

const views = new WeakMap<BandSet, BandCache>();
function cacheOf(set: BandSet, length: StudyLength): BandCache {
  let c = views.get(set);
  if (!c) {
    c = { ...set, length, range: clampToWindow(intervalRange(set.model, set.breakpoints), length) };
    views.set(set, c);
  }
  return c;
}

/** The band set of the current model, study length and holds, opened if need be (for exports). */
export async function openBandCache(model: Model, length: StudyLength, hold?: Record<VariableId, number>): Promise<{ ok: true; cache: BandCache } | { ok: false; message: string }> {
  const r = await appBandClient().open(model, studyOf(length), hold);
  return r.ok ? { ok: true, cache: cacheOf(r.set, length) } : r;
}

/**
 * `current: false` while the set for new arguments (an edit, a hold, another
 * study length) is being opened: the previous set is shown meanwhile.
 */
export type BandCacheState = { status: 'loading' } | { status: 'failed'; message: string } | { status: 'ready'; cache: BandCache; current: boolean };

/** The band set of a model, study length and interventions; every view of the page gets the same one. */
export function useBandCache(model: Model | null, length: StudyLength, hold?: Record<VariableId, number>): BandCacheState {
  const client = appBandClient();
  const study = studyOf(length);
  const key = bandKey(study, hold);
  const known = model ? client.peek(model, study, hold) : undefined;
  const [opened, setOpened] = useState<{ model: Model; key: string; result: OpenResult } | null>(null);
  useEffect(() => {
    if (!model || known) return;
    let live = true;
    void client.open(model, study, hold).then((result) => { if (live) setOpened({ model, key, result }); });
    return () => { live = false; };
  }, [model, key, known]); // eslint-disable-line react-hooks/exhaustive-deps
  const last = useRef<BandCache | null>(null);
  let state: BandCacheState;
  const mine = opened && opened.model === model && opened.key === key ? opened.result : null;
  if (known) state = { status: 'ready', cache: cacheOf(known, length), current: true };
  else if (mine && mine.ok) state = { status: 'ready', cache: cacheOf(mine.set, length), current: true };
  else if (mine && !mine.ok) state = { status: 'failed', message: mine.message };
  else if (last.current) state = { status: 'ready', cache: last.current, current: false };
  else state = { status: 'loading' };
  const ready = state.status === 'ready' && state.current ? state.cache : null;
  useEffect(() => { if (ready) last.current = ready; }, [ready]);
  return state;
}

/** The band on screen: its set, its number, the interval it is drawn at and its ordering. */
export interface ShownBand {
  cache: BandCache;
  band: number;
  interval: number;
  ordering: Ordering;
  /** Milliseconds the core took for this ordering, and where it ran. */
  computeMs: number;
  where: Where;
}

/**
 * The ordering to draw for an interval: the band's own once its answer is
 * here (at once when this side holds it), else the band drawn before (never
 * an empty view while a band is computed). `problem`: the band's ordering
 * could not be computed.
 */
export function useShownBand(cache: BandCache | null, interval: number | null): { shown: ShownBand | null; problem: string | null } {
  const band = cache && interval !== null ? cache.band(interval) : -1;
  const [arrived, setArrived] = useState<{ cache: BandCache; result: BandResult } | null>(null);
  useEffect(() => {
    if (!cache || interval === null) return;
    let live = true;
    // asked even when held here: an answer still on its way for another band is then stale
    void cache.latest(interval).then((result) => { if (live && result) setArrived({ cache, result }); });
    return () => { live = false; };
  }, [cache, band]); // eslint-disable-line react-hooks/exhaustive-deps
  const hit: BandResult | undefined = cache && interval !== null ? cache.cached(interval) : undefined;
  const mine = arrived && arrived.cache === cache && arrived.result.band === band ? arrived.result : undefined;
  const result = hit ?? mine;
  const last = useRef<ShownBand | null>(null);
  const now: ShownBand | null = result?.ok && cache && interval !== null ? shownOf(cache, result, interval) : null;
  useEffect(() => { if (now) last.current = now; });
  return { shown: now ?? last.current, problem: result && !result.ok ? result.message : null };
}

function shownOf(cache: BandCache, r: BandOrdering, interval: number): ShownBand {
  return { cache, band: r.band, interval, ordering: r.ordering, computeMs: r.computeMs, where: r.where };
}
