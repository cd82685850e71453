import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createBandClient, type BandSet, type BandTransport } from '../../src/worker/bandClient';
import { createBandHost, PREFETCH_REACH, type BandAnswer, type BandApi, type BandStudy, type OpenAnswer } from '../../src/worker/bands';
import { breakpoints, orderingAt } from '../../src/core/ordering/index';
import { bandOfCuts, cutsOf, intervalInBand } from '../../src/core/view/interval';
import { parseModelText } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import type { Breakpoint, Ordering } from '../../src/core/ordering/types';
import { emptyModel } from '../../src/state/changes';
import { decimals, expectClose } from '../helpers/tolerance';

const example = (name: string): Model => {
  const r = parseModelText(readFileSync(`src/examples/${name}.json`, 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
};
const sleepStress = example('sleep-stress');

/** Two breakpoints, at 1 and 10: bands 0 (below 1), 1 ([1, 10)) and 2 (10 and above). */
const BPS: Breakpoint[] = [{ interval: 1, changes: [] }, { interval: 10, changes: [] }];
/** An ordering that names the interval it was computed for, so the test can tell answers apart. */
const orderingFor = (interval: number): Ordering => ({ roles: { [`at ${interval}`]: 'state' }, blocks: [], edges: [], integrations: [], diagnostics: [] });

type Call = { kind: 'open' | 'band' | 'close'; args: unknown[]; resolve: (v: unknown) => void; reject: (e: Error) => void };

/**
 * A fake transport: opens answer at once with BPS; band requests wait until
 * the test releases them (in any order), with `answer(i)` or `fail(i)`.
 */
function fakeTransport() {
  const calls: Call[] = [];
  let disposed = 0;
  const record = (kind: Call['kind'], args: unknown[]) => new Promise<unknown>((resolve, reject) => calls.push({ kind, args, resolve, reject }));
  const api: BandTransport = {
    openBands: (...args) => { void record('open', args); return Promise.resolve<OpenAnswer>({ ok: true, breakpoints: BPS, elapsedMs: 0.1 }); },
    bandOrdering: (...args) => record('band', args) as Promise<BandAnswer>,
    closeBands: (...args) => { void record('close', args); return Promise.resolve(); },
    dispose: () => { disposed++; },
  };
  const bands = () => calls.filter((c) => c.kind === 'band');
  const answer = (i: number) => {
    const c = bands()[i];
    const [, seq, interval] = c.args as [number, number, number];
    c.resolve({ ok: true, seq, band: cutsOf(BPS).filter((k) => interval >= k.at).length, ordering: orderingFor(interval), computeMs: 2, cached: false });
  };
  return { api, calls, bands, answer, fail: (i: number, e: Error) => bands()[i].reject(e), disposed: () => disposed };
}
const tick = () => new Promise((r) => setTimeout(r, 0));
const until = async (cond: () => boolean) => {
  for (let i = 0; i < 200 && !cond(); i++) await tick();
};
async function openSet(c: ReturnType<typeof createBandClient>, model: Model = emptyModel(), study: BandStudy = { samples: 50 }, hold?: Record<string, number>): Promise<BandSet> {
  const r = await c.open(model, study, hold);
  if (!r.ok) throw new Error(r.message);
  return r.set;
}
const noMain = (): BandApi => { throw new Error('the main thread was not to be used'); };

// Latest-wins is common practice for request/response over an asynchronous channel:
// an answer is delivered only if no newer request was made before it arrived.
describe('band client: latest wins', () => {
  it('an answer overtaken by a newer request is not delivered, but fills the cache', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain);
    const set = await openSet(c);
    const first = set.latest(0.5);
    const second = set.latest(5);
    await tick();
    expect(t.bands()).toHaveLength(1); // one request at a time with the core
    t.answer(0);
    expect(await first).toBeNull();
    // the stale answer is kept: band 0 is now held on this side
    expect(set.cached(0.7)?.ordering).toEqual(orderingFor(0.5));
    await until(() => t.bands().length === 2);
    t.answer(1);
    const got = await second;
    expect(got && got.ok ? [got.band, got.ordering] : got).toEqual([1, orderingFor(5)]);
  });

  it('requests carry increasing sequence numbers; one overtaken while waiting is never sent', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain);
    const set = await openSet(c);
    const asks = [0.5, 2, 20, 3].map((x) => set.latest(x));
    await tick();
    expect(await asks[1]).toBeNull();
    expect(await asks[2]).toBeNull();
    t.answer(0);
    await until(() => t.bands().length === 2);
    t.answer(1);
    const results = await Promise.all(asks);
    expect(results.slice(0, 3)).toEqual([null, null, null]);
    expect(results[3] && results[3].ok ? results[3].ordering : null).toEqual(orderingFor(3));
    expect(t.bands().map((b) => b.args[2])).toEqual([0.5, 3]); // the two overtaken ones never reached the core
    const seqs = t.bands().map((b) => b.args[1] as number);
    expect(seqs[1]).toBeGreaterThan(seqs[0]);
    // Rule: one request with the core, one waiting; of four asks, the first (sent at once) and the last (the waiting one) are sent.
    expect(c.sent()).toBe(2);
  });

  it('a band held on this side answers at once without a request, and makes an answer in flight stale', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain);
    const set = await openSet(c);
    const a = set.latest(0.5);
    await tick();
    t.answer(0);
    await a;
    const slow = set.latest(50); // band 2, in flight
    await tick();
    expect(t.bands()).toHaveLength(2);
    const hit = await set.latest(0.9); // band 0 again: from the cache
    expect(hit && hit.ok ? hit.ordering : null).toEqual(orderingFor(0.5));
    expect(t.bands()).toHaveLength(2);
    // Rule: a band held on this side costs no request, so the count stays at the two sent before (bands 0 and 2).
    expect(c.sent()).toBe(2);
    t.answer(1);
    expect(await slow).toBeNull();
    expect(set.cached(20)?.band).toBe(2);
  });

  it('an export asks with ordering(): it is answered even when views ask for newer bands meanwhile', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain);
    const set = await openSet(c);
    const view = set.latest(0.5);
    const exported = set.ordering(5);
    const newer = set.latest(50);
    await tick();
    t.answer(0);
    expect(await view).toBeNull();
    await until(() => t.bands().length === 2);
    expect(t.bands()[1].args[2]).toBe(5); // the export goes before the waiting view request
    t.answer(1);
    const e = await exported;
    expect(e.ok ? e.ordering : null).toEqual(orderingFor(5));
    await until(() => t.bands().length === 3);
    t.answer(2);
    const n = await newer;
    expect(n && n.ok ? n.band : null).toBe(2);
  });
});

describe('band client: band sets', () => {
  it('the model is sent once per set; the same model, study and holds give the same set', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain);
    const m = emptyModel();
    const s1 = await openSet(c, m, { samples: 50 }, { a: 1, b: 2 });
    const s2 = await openSet(c, m, { samples: 50 }, { b: 2, a: 1 });
    expect(s2).toBe(s1);
    expect(c.peek(m, { samples: 50 }, { a: 1, b: 2 })).toBe(s1);
    const opens = () => t.calls.filter((x) => x.kind === 'open');
    expect(opens()).toHaveLength(1);
    expect(opens()[0].args[1]).toBe(m);
    expect(s1.breakpoints).toEqual(BPS);
    expect(s1.band(0.5)).toBe(0);
    expect(s1.band(1)).toBe(1); // inclusive breakpoint
    expect(s1.design(3)).toEqual({ samples: 50, interval: 3, hold: { a: 1, b: 2 } });
    // band requests name the set, never the model
    const p = s1.latest(3);
    await tick();
    expect(t.bands()[0].args).toEqual([s1.id, expect.any(Number), 3]);
    t.answer(0);
    await p;
  });

  it('a changed model, study length or hold opens a new set; sets beyond the kept ones are closed', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain, { setsKept: 3 });
    const m = emptyModel();
    const base = await openSet(c, m, { samples: 50 });
    const edited = await openSet(c, { ...m, name: 'edited' }, { samples: 50 });
    const longer = await openSet(c, m, { samples: 80 });
    const windowed = await openSet(c, m, { window: 80 });
    const held = await openSet(c, m, { samples: 50 }, { x: 1 });
    const ids = [base, edited, longer, windowed, held].map((s) => s.id);
    // Rule: model, study length (samples or window) and holds form the key; five keys, five sets.
    expect(new Set(ids).size).toBe(5);
    expect(t.calls.filter((x) => x.kind === 'open')).toHaveLength(5);
    // three kept: the two oldest were closed in the core
    expect(t.calls.filter((x) => x.kind === 'close').map((x) => x.args[0])).toEqual([base.id, edited.id]);
    expect(c.peek(m, { samples: 50 })).toBeUndefined();
    // an empty hold is no hold
    const again = await openSet(c, m, { samples: 50 }, {});
    expect(again.id).not.toBe(base.id);
    expect(await openSet(c, m, { samples: 50 })).toBe(again);
  });

  it('a set closed for room is opened again when a view still asks it for a band', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, noMain, { setsKept: 1 });
    const old = await openSet(c, emptyModel());
    await openSet(c, emptyModel());
    const p = old.latest(5);
    await until(() => t.bands().length === 1);
    // Rule: set ids count up from the first; with one set kept, opening the second closes the first, and asking the first again reopens it under its own id.
    expect(t.calls.filter((x) => x.kind === 'open').map((x) => x.args[0])).toEqual([old.id, old.id + 1, old.id]);
    t.answer(0);
    const r = await p;
    expect(r && r.ok ? r.band : null).toBe(1);
  });
});

describe('band client: where the core runs', () => {
  it('runs the same code on the main thread when the worker cannot start', async () => {
    const c = createBandClient(() => { throw new Error('no workers here'); }, () => createBandHost());
    expect(c.where()).toBe('main thread');
    const set = await openSet(c, sleepStress);
    expect(set.breakpoints).toEqual(breakpoints(sleepStress, { samples: 50 }));
    const r = await set.latest(24);
    expect(r && r.ok ? [r.where, r.ordering] : r).toEqual(['main thread', orderingAt(sleepStress, { samples: 50, interval: 24 })]);
  });

  it('falls back when the worker fails: the set is opened again on the main thread and the answer delivered', async () => {
    const t = fakeTransport();
    const c = createBandClient(() => t.api, () => createBandHost());
    const set = await openSet(c, sleepStress, { samples: 50 }, { stress: 1 });
    expect(c.where()).toBe('worker');
    const p = set.latest(24);
    await tick();
    t.fail(0, new Error('the core worker could not start'));
    const r = await p;
    expect(c.where()).toBe('main thread');
    expect(t.disposed()).toBe(1);
    expect(r && r.ok ? [r.where, r.ordering] : r).toEqual(['main thread', orderingAt(sleepStress, { samples: 50, interval: 24, hold: { stress: 1 } })]);
    // later sets open on the main thread at once
    const other = await openSet(c, sleepStress, { samples: 20 });
    const r2 = await other.latest(24);
    expect(r2 && r2.ok ? r2.where : r2).toBe('main thread');
    expect(t.calls.filter((x) => x.kind === 'open')).toHaveLength(1);
  });

  it('an open the worker cannot answer is done on the main thread', async () => {
    const broken: BandTransport = {
      openBands: () => Promise.reject(new Error('worker crashed')),
      bandOrdering: () => Promise.reject(new Error('worker crashed')),
      closeBands: () => Promise.reject(new Error('worker crashed')),
    };
    const c = createBandClient(() => broken, () => createBandHost());
    const set = await openSet(c, sleepStress);
    expect(c.where()).toBe('main thread');
    expect(set.breakpoints).toEqual(breakpoints(sleepStress, { samples: 50 }));
  });
});

describe('band host (the code the core worker runs)', () => {
  it('answers each band with the ordering at the interval, computed once per band', async () => {
    const host = createBandHost();
    const opened = await host.openBands(7, sleepStress, { samples: 50 });
    if (!opened.ok) throw new Error(opened.message);
    expect(opened.breakpoints).toEqual(breakpoints(sleepStress, { samples: 50 }));
    const cuts = cutsOf(opened.breakpoints).map((k) => k.at);
    // one interval inside every band: below the first cut, between cuts, above the last
    const inside = [cuts[0] / 2, ...cuts.map((x, i) => (i + 1 < cuts.length ? Math.sqrt(x * cuts[i + 1]) : x * 2))];
    for (const [band, interval] of inside.entries()) {
      const a = await host.bandOrdering(7, band + 100, interval);
      expect(a.ok && [a.seq, a.band, a.cached]).toEqual([band + 100, band, false]);
      expect(a.ok ? a.ordering : null).toEqual(orderingAt(sleepStress, { samples: 50, interval }));
      expect(a.ok ? a.computeMs : -1).toBeGreaterThanOrEqual(0);
    }
    // another interval in a band already computed: from the host's cache, with the time it took then
    const first = await host.bandOrdering(7, 1, inside[1]);
    const again = await host.bandOrdering(7, 2, inside[1] * 1.0001);
    expect(again.ok && again.cached).toBe(true);
    expect(again.ok && first.ok ? again.computeMs : -1).toBe(first.ok ? first.computeMs : -2);
  });

  it('a held variable shows in the ordering; an unknown set gets a message naming it', async () => {
    const host = createBandHost();
    await host.openBands(1, sleepStress, { window: 24 * 60 }, { stress: 0.5 });
    const a = await host.bandOrdering(1, 1, 24);
    expect(a.ok ? a.ordering : null).toEqual(orderingAt(sleepStress, { window: 24 * 60, interval: 24, hold: { stress: 0.5 } }));
    expect(a.ok ? a.ordering.roles.stress : null).toBe('held');
    expect(await host.bandOrdering(2, 5, 24)).toEqual({ ok: false, seq: 5, band: -1, message: 'band set 2 is not open' });
    await host.closeBands(1);
    expect((await host.bandOrdering(1, 6, 24)).ok).toBe(false);
  });

  it('a worker host computes the neighbours of the band asked for while idle, one band per step, and answers them from its cache', async () => {
    const steps: (() => void)[] = [];
    const host = createBandHost({ prefetch: true, schedule: (f) => steps.push(f) });
    const opened = await host.openBands(3, sleepStress, { samples: 50 });
    if (!opened.ok) throw new Error(opened.message);
    const cuts = cutsOf(opened.breakpoints);
    expect(steps).toHaveLength(0); // nothing ahead before a band is asked for
    const mid = Math.floor(cuts.length / 2);
    const a = await host.bandOrdering(3, 1, intervalInBand(cuts, mid)!);
    expect(a.ok && a.cached).toBe(false);
    // run the steps: each computes one band, nearest first, then schedules the next
    let ran = 0;
    while (steps.length > 0 && ran < 100) { steps.shift()!(); ran++; }
    const reach = [...Array(2 * PREFETCH_REACH + 1).keys()].map((i) => mid - PREFETCH_REACH + i).filter((k) => k >= 0 && k <= cuts.length && k !== mid);
    expect(ran).toBe(reach.length + 1); // one step per band, and a last one that finds nothing left
    for (const k of reach) {
      const x = intervalInBand(cuts, k)!;
      const b = await host.bandOrdering(3, 10 + k, x);
      expect(b.ok && [b.band, b.cached]).toEqual([k, true]);
      // the same ordering the core gives at the interval asked for
      expect(b.ok ? b.ordering : null).toEqual(orderingAt(sleepStress, { samples: 50, interval: x }));
    }
  });

  it('a main-thread host computes nothing ahead, and a closed set stops the computing ahead', async () => {
    const steps: (() => void)[] = [];
    const quiet = createBandHost({ schedule: (f) => steps.push(f) });
    await quiet.openBands(1, sleepStress, { samples: 50 });
    await quiet.bandOrdering(1, 1, 24);
    expect(steps).toHaveLength(0);
    const host = createBandHost({ prefetch: true, schedule: (f) => steps.push(f) });
    await host.openBands(1, sleepStress, { samples: 50 });
    await host.bandOrdering(1, 1, 24);
    expect(steps).toHaveLength(1);
    await host.closeBands(1);
    steps.shift()!();
    expect(steps).toHaveLength(0);
  });
});

describe('an interval inside each band', () => {
  it('lies in the band it is asked for, for the example and for cuts with exclusive ends', () => {
    const cuts = cutsOf(breakpoints(sleepStress, { samples: 50 }));
    for (let k = 0; k <= cuts.length; k++) expect(bandOfCuts(cuts, intervalInBand(cuts, k)!)).toBe(k);
    const odd = [{ at: 1 }, { at: 1, exclusive: true }, { at: 4 }];
    // band 1 is [1, 1]: the interval 1 alone
    const got = [0, 1, 2, 3].map((k) => intervalInBand(odd, k)!);
    expect(got[1]).toBe(1);
    [0.5, 1, 2, 8].forEach((want, k) => expectClose(got[k], want, decimals(6)));
    got.forEach((x, k) => expect(bandOfCuts(odd, x)).toBe(k));
    expect(intervalInBand(odd, 4)).toBeNull();
    expect(intervalInBand(odd, -1)).toBeNull();
  });
});
