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

export type BandTransport = BandApi & { dispose?: () => void };
export type Where = 'worker' | 'main thread';

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
  answers: Map<number, BandOrdering>;
}

type Job = { state: SetState; stamp: number; interval: number; droppable: boolean; resolve: (r: BandResult | null) => void };

export function createBandClient(primary: (() => BandTransport) | null, fallback: () => BandApi, options: BandClientOptions = {}): BandClient {
  const setsKept = options.setsKept ?? 4;
  const bandsKept = options.bandsKept ?? 8;
  let api: BandTransport | null = null;
  try {
    api = primary ? primary() : null;
  } catch {
    api = null;
  }
  let onMain = !api;
  let fb: BandApi | null = null;
  const mainApi = () => (fb ??= fallback());
  const current = (): BandApi => (onMain || !api ? mainApi() : api);
  const whereOf = (a: BandApi): Where => (a === api ? 'worker' : 'main thread');

  /** Run on the worker; when it fails (could not load, crashed) run here from now on. */
  const run = async <T>(f: (a: BandApi) => Promise<T>): Promise<{ value: T; on: BandApi }> => {
    const a = current();
    if (a !== fb) {
      try {
        return { value: await f(a), on: a };
      } catch {
        onMain = true;
        api?.dispose?.();
      }
    }
    const m = mainApi();
    return { value: await f(m), on: m };
  };

  // open sets, least recently used first
  const open: SetState[] = [];
  const opening = new WeakMap<Model, Map<string, Promise<OpenResult>>>();
  const byModel = new WeakMap<Model, Map<string, SetState>>();
  let ids = 0;
  const remember = (s: SetState) => {
    let m = byModel.get(s.set.model);
    if (!m) byModel.set(s.set.model, (m = new Map()));
    m.set(s.key, s);
    const i = open.indexOf(s);
    if (i >= 0) open.splice(i, 1);
    open.push(s);
    while (open.length > setsKept) {
      const old = open.shift()!;
      byModel.get(old.set.model)?.delete(old.key);
      const on = old.openedOn;
      old.openedOn = null;
      old.answers.clear();
      if (on) void on.closeBands(old.set.id).catch(() => undefined);
    }
  };
  const lookup = (model: Model, key: string) => byModel.get(model)?.get(key);

  /** Open a set on a transport (again, after a failover or after it was closed). */
  const openOn = async (a: BandApi, s: SetState): Promise<string | null> => {
    const r = await a.openBands(s.set.id, s.set.model, s.set.study, s.set.hold);
    if (!r.ok) return r.message;
    s.openedOn = a;
    if (!open.includes(s)) remember(s);
    return null;
  };

  let stamp = 0;
  let latestStamp = 0;
  let requests = 0;
  let waiting: Job | null = null;
  const musts: Job[] = [];
  let busy = false;

  const ask = async (job: Job): Promise<BandResult> => {
    const s = job.state;
    const { value, on } = await run(async (a) => {
      if (s.openedOn !== a) {
        const problem = await openOn(a, s);
        if (problem) return { ok: false as const, seq: job.stamp, band: s.set.band(job.interval), message: problem };
      }
      requests++;
      return a.bandOrdering(s.set.id, job.stamp, job.interval);
    });
    if (!value.ok) return { ok: false, band: value.band, message: value.message };
    const answer: BandOrdering = { ok: true, set: s.set, band: value.band, interval: job.interval, ordering: value.ordering, computeMs: value.computeMs, where: whereOf(on) };
    if (s.openedOn) {
      // a closed set keeps no answers
      s.answers.delete(answer.band);
      s.answers.set(answer.band, answer);
      if (s.answers.size > bandsKept) s.answers.delete(s.answers.keys().next().value!);
    }
    return answer;
  };

  const pump = () => {
    if (busy) return;
    const job = musts.shift() ?? waiting;
    if (!job) return;
    if (job === waiting) waiting = null;
    busy = true;
    ask(job)
      .then(
        (r) => job.resolve(job.droppable && job.stamp !== latestStamp ? null : r),
        (e: unknown) => job.resolve(job.droppable && job.stamp !== latestStamp ? null : { ok: false, band: job.state.set.band(job.interval), message: `the ordering could not be computed: ${(e as Error).message}` }),
      )
      .finally(() => {
        busy = false;
        pump();
      });
  };

  const makeSet = (id: number, model: Model, study: BandStudy, hold: Record<VariableId, number> | undefined, breakpoints: Breakpoint[], key: string): SetState => {
    const cuts = cutsOf(breakpoints);
    const heldCopy = hold && Object.keys(hold).length ? { ...hold } : undefined;
    const state: SetState = { key, openedOn: null, answers: new Map(), set: null as unknown as BandSet };
    const hit = (interval: number) => {
      const k = bandOfCuts(cuts, interval);
      const a = state.answers.get(k);
      if (a) {
        state.answers.delete(k);
        state.answers.set(k, a); // most recently used last
      }
      return a;
    };
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
        const s = ++stamp;
        latestStamp = s;
        waiting?.resolve(null);
        waiting = null;
        const a = hit(interval);
        if (a) return Promise.resolve(a);
        return new Promise((resolve) => {
          waiting = { state, stamp: s, interval, droppable: true, resolve };
          pump();
        });
      },
      ordering(interval) {
        const a = hit(interval);
        if (a) return Promise.resolve(a);
        return new Promise((resolve) => {
          musts.push({ state, stamp: ++stamp, interval, droppable: false, resolve: (r) => resolve(r!) });
          pump();
        });
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
          const { value, on } = await run((a) => a.openBands(id, model, study, hold));
          if (!value.ok) return { ok: false, message: value.message };
          const s = makeSet(id, model, study, hold, value.breakpoints, key);
          s.openedOn = on;
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
    where: () => (onMain || !api ? 'main thread' : 'worker'),
    sent: () => requests,
    dispose() {
      waiting?.resolve(null);
      waiting = null;
      latestStamp = ++stamp;
      api?.dispose?.();
    },
  };
}
