/**
 * Main-thread client of the band API of the core worker. A band set (model,
 * study length, holds) is opened once: the model crosses to the core once
 * and the breakpoints come back. Orderings are then asked for by interval;
 * every request carries a sequence number and the views' requests follow
 * latest wins: at most one request is with the core, a newer one replaces
 * any older one still waiting (which is never sent), and an answer that a
 * newer request overtook is not delivered (it still fills the cache). The
 * core keeps the per-band cache; this side keeps a small one of answers, so
 * a band seen recently costs no request at all. When the worker cannot start
 * or fails, the same code runs on the main thread. The transports are
 * injected, so the logic is tested in Node with fakes.
 */
import type { Model, VariableId } from '../core/model/types';
import type { Breakpoint, Ordering, StudyDesign } from '../core/ordering/types';
import { bandOfCuts, cutsOf, type Cut } from '../core/view/interval';
import { bandDesign, type BandApi, type BandStudy } from './bands';
import { createLane, lru, type Transport, type Where } from './lane';

export type BandTransport = Transport<BandApi>;
export type { Where };

/** A band's ordering as the main thread holds it. */
export interface BandOrdering {
  ok: true;
  set: BandSet;
  band: number;
  /** The interval the request was made for. */
  interval: number;
  ordering: Ordering;
  /** Milliseconds the core took for this band's ordering, measured where it ran. */
  computeMs: number;
  where: Where;
}
export type BandFailure = { ok: false; band: number; message: string };
export type BandResult = BandOrdering | BandFailure;

export interface BandSet {
  readonly id: number;
  readonly model: Model;
  readonly study: BandStudy;
  readonly hold?: Record<VariableId, number>;
  readonly breakpoints: Breakpoint[];
  /** Breakpoint places, ascending. */
  readonly cuts: Cut[];
  /** Band number of an interval: how many breakpoints it has passed. */
  band(interval: number): number;
  /** The study design at an interval (study length, interval, holds). */
  design(interval: number): StudyDesign;
  /** The answer for the band of `interval` if this side holds it (no request). */
  cached(interval: number): BandOrdering | undefined;
  /**
   * Latest wins: the ordering of the band of `interval`, or null when a newer
   * `latest` call (for any set of the client) came before the answer. A band
   * held on this side answers at once, without a request.
   */
  latest(interval: number): Promise<BandResult | null>;
  /** Always answers (an export, say): from the cache, or a request no newer one replaces. */
  ordering(interval: number): Promise<BandResult>;
}

export type OpenResult = { ok: true; set: BandSet } | { ok: false; message: string };

export interface BandClient {
  /** The band set of a model, study length and holds: the same set while it is kept, else opened anew. */
  open(model: Model, study: BandStudy, hold?: Record<VariableId, number>): Promise<OpenResult>;
  /** The set already opened for these arguments, if any (no request). */
  peek(model: Model, study: BandStudy, hold?: Record<VariableId, number>): BandSet | undefined;
  /** Where the core runs now. */
  readonly where: () => Where;
  /** Requests sent to the core (opens not counted): for tests. */
  readonly sent: () => number;
  dispose(): void;
}

export interface BandClientOptions {
  /** Band sets kept open (least recently opened or used closed first). */
  setsKept?: number;
  /** Answers kept on this side per set. */
  bandsKept?: number;
}

/** A stable text for a study length and holds (holds sorted by variable). */
export function bandKey(study: BandStudy, hold?: Record<VariableId, number>): string {
  const h = hold ? Object.keys(hold).sort().map((k) => [k, hold[k]]) : [];
  return JSON.stringify([study.window !== undefined ? { window: study.window } : { samples: study.samples }, h]);
}

interface SetState {
  set: BandSet;
  key: string;
  /** The transport this set is open on (null: not open anywhere now). */
  openedOn: BandApi | null;
  answers: ReturnType<typeof lru<number, BandOrdering>>;
}

export function createBandClient(primary: (() => BandTransport) | null, fallback: () => BandApi, options: BandClientOptions = {}): BandClient {
  const setsKept = options.setsKept ?? 4;
  const bandsKept = options.bandsKept ?? 8;
  const lane = createLane({ worker: primary, fallback });

  // open sets, least recently used first; a set dropped is closed where it is open
  const byModel = new WeakMap<Model, Map<string, SetState>>();
  const open = lru<SetState, true>(setsKept, (old) => {
    byModel.get(old.set.model)?.delete(old.key);
    const on = old.openedOn;
    old.openedOn = null;
    old.answers.clear();
    if (on) void on.closeBands(old.set.id).catch(() => undefined);
  });
  const opening = new WeakMap<Model, Map<string, Promise<OpenResult>>>();
  let ids = 0;
  const remember = (s: SetState) => {
    let m = byModel.get(s.set.model);
    if (!m) byModel.set(s.set.model, (m = new Map()));
    m.set(s.key, s);
    open.set(s, true);
  };
  const lookup = (model: Model, key: string) => byModel.get(model)?.get(key);

  /** Open a set on a transport (again, after a failover or after it was closed). */
  const openOn = async (a: BandApi, s: SetState): Promise<string | null> => {
    const r = await a.openBands(s.set.id, s.set.model, s.set.study, s.set.hold);
    if (!r.ok) return r.message;
    s.openedOn = a;
    if (!open.has(s)) remember(s);
    return null;
  };

  let requests = 0;
  let seq = 0;
  const ask = async (s: SetState, interval: number): Promise<BandResult> => {
    const mine = ++seq;
    const { value, where } = await lane.run(async (a) => {
      if (s.openedOn !== a) {
        const problem = await openOn(a, s);
        if (problem) return { ok: false as const, seq: mine, band: s.set.band(interval), message: problem };
      }
      requests++;
      return a.bandOrdering(s.set.id, mine, interval);
    });
    if (!value.ok) return { ok: false, band: value.band, message: value.message };
    const answer: BandOrdering = { ok: true, set: s.set, band: value.band, interval, ordering: value.ordering, computeMs: value.computeMs, where };
    if (s.openedOn) s.answers.set(answer.band, answer); // a closed set keeps no answers
    return answer;
  };
  const queue = lane.latest(ask, {
    failed: (e, s, interval): BandResult => ({ ok: false, band: s.set.band(interval), message: `the ordering could not be computed: ${(e as Error).message}` }),
  });

  const makeSet = (id: number, model: Model, study: BandStudy, hold: Record<VariableId, number> | undefined, breakpoints: Breakpoint[], key: string): SetState => {
    const cuts = cutsOf(breakpoints);
    const heldCopy = hold && Object.keys(hold).length ? { ...hold } : undefined;
    const state: SetState = { key, openedOn: null, answers: lru(bandsKept), set: null as unknown as BandSet };
    const hit = (interval: number) => state.answers.get(bandOfCuts(cuts, interval));
    state.set = {
      id,
      model,
      study,
      hold: heldCopy,
      breakpoints,
      cuts,
      band: (interval) => bandOfCuts(cuts, interval),
      design: (interval) => bandDesign(study, interval, heldCopy),
      cached: hit,
      latest(interval) {
        const a = hit(interval);
        if (!a) return queue.latest(state, interval);
        queue.supersede(); // a band held here answers at once, and still overtakes older requests
        return Promise.resolve(a);
      },
      ordering(interval) {
        const a = hit(interval);
        return a ? Promise.resolve(a) : queue.must(state, interval);
      },
    };
    return state;
  };

  return {
    peek(model, study, hold) {
      return lookup(model, bandKey(study, hold))?.set;
    },
    open(model, study, hold) {
      const key = bandKey(study, hold);
      const known = lookup(model, key);
      if (known) {
        remember(known);
        return Promise.resolve({ ok: true, set: known.set });
      }
      const inFlight = opening.get(model) ?? new Map<string, Promise<OpenResult>>();
      opening.set(model, inFlight);
      const already = inFlight.get(key);
      if (already) return already;
      const id = ++ids;
      const p = (async (): Promise<OpenResult> => {
        try {
          const { value, api } = await lane.run((a) => a.openBands(id, model, study, hold));
          if (!value.ok) return { ok: false, message: value.message };
          const s = makeSet(id, model, study, hold, value.breakpoints, key);
          s.openedOn = api;
          remember(s);
          return { ok: true, set: s.set };
        } catch (e) {
          return { ok: false, message: `the breakpoints could not be computed: ${(e as Error).message}` };
        } finally {
          inFlight.delete(key);
        }
      })();
      inFlight.set(key, p);
      return p;
    },
    where: lane.where,
    sent: () => requests,
    dispose() {
      queue.supersede();
      lane.dispose();
    },
  };
}
