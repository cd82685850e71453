import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createNumericClient, type NumericTransport } from '../../src/worker/numericClient';
import { localNumeric, type NumericApi } from '../../src/worker/numericApi';
import { parseModelText } from '../../src/core/model/schema';
import { emptyModel } from '../../src/state/changes';
import { decimals, expectClose } from '../helpers/tolerance';

/** A fake transport whose answers the test releases in any order. */
function deferredTransport() {
  const pending: { kind: string; args: unknown[]; resolve: (r: unknown) => void; reject: (e: Error) => void }[] = [];
  let disposed = 0;
  const call = (kind: string) => (...args: unknown[]) => new Promise((resolve, reject) => { pending.push({ kind, args, resolve, reject }); });
  const api = {
    equilibrium: call('equilibrium'), simulate: call('simulate'), sampled: call('sampled'), timescales: call('timescales'), curve: call('curve'), advise: call('advise'),
    dispose: () => { disposed++; },
  } as unknown as NumericTransport;
  return { api, pending, disposed: () => disposed };
}
const tick = () => new Promise((r) => setTimeout(r, 0));
const greenhouse = (() => {
  const r = parseModelText(readFileSync('src/examples/greenhouse.json', 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
})();

// Latest-wins is common practice for request/response over an asynchronous channel:
// an answer is delivered only if no newer request of the same kind was made before it arrived.
describe('numeric client', () => {
  it('drops a stale answer that arrives after a newer one, per kind of question', async () => {
    const t = deferredTransport();
    const c = createNumericClient(() => t.api, () => localNumeric);
    const a = c.ask('sampled', emptyModel(), 1);
    const b = c.ask('sampled', emptyModel(), 2);
    const e = c.ask('equilibrium', emptyModel());
    await tick();
    expect(t.pending.map((p) => p.kind)).toEqual(['sampled', 'sampled', 'equilibrium']);
    // The newer answer comes first, the older one late.
    t.pending[1].resolve({ ok: false, reason: 'second' });
    t.pending[0].resolve({ ok: false, reason: 'first' });
    t.pending[2].resolve({ ok: false, reason: 'balance' });
    expect(await a).toBeNull();
    expect(await b).toEqual({ ok: false, reason: 'second' });
    // Another kind of question is not made stale by the sampled ones.
    expect(await e).toEqual({ ok: false, reason: 'balance' });
  });

  it('questions asked in named slots (designs side by side) each keep their latest answer', async () => {
    const t = deferredTransport();
    const c = createNumericClient(() => t.api, () => localNumeric);
    const one = c.askIn('row-0', 'sampled', emptyModel(), 1);
    const two = c.askIn('row-1', 'sampled', emptyModel(), 2);
    const plain = c.ask('sampled', emptyModel(), 3);
    const oneAgain = c.askIn('row-0', 'sampled', emptyModel(), 4);
    await tick();
    expect(t.pending.map((p) => p.args[1])).toEqual([1, 2, 3, 4]);
    t.pending.forEach((p, i) => p.resolve({ ok: false, reason: `answer ${i}` }));
    // row 1 and the plain question are not overtaken by row 0; row 0's older question is
    expect(await two).toEqual({ ok: false, reason: 'answer 1' });
    expect(await plain).toEqual({ ok: false, reason: 'answer 2' });
    expect(await one).toBeNull();
    expect(await oneAgain).toEqual({ ok: false, reason: 'answer 3' });
  });

  it('falls back to the main thread when the worker cannot start or fails', async () => {
    const c1 = createNumericClient(() => { throw new Error('no workers here'); }, () => localNumeric);
    const r1 = await c1.ask('equilibrium', greenhouse);
    expect(c1.where()).toBe('main thread');
    // 0.3 L/min irrigation balances transpiration 0.0003·w·(1 + 0.05·T), T from the heater balance (hand calculation, common practice).
    const T = (8 / 12 + 0.04 * 2 * 21 + 0.3 * 0.6 * (1 - 0.4)) / (1 / 12 + 0.08);
    expectClose(r1 && 'values' in r1 ? r1.values.airTemp : NaN, T, decimals(9));
    expectClose(r1 && 'values' in r1 ? r1.values.soilWater : NaN, 0.3 / (0.0003 * (1 + 0.05 * T)), decimals(6));
    const t = deferredTransport();
    const c2 = createNumericClient(() => t.api, () => localNumeric);
    const r2 = c2.ask('timescales', greenhouse);
    await tick();
    t.pending[0].reject(new Error('the numeric worker could not start'));
    const a = await r2;
    expect(a && a.ok).toBe(true);
    expect(c2.where()).toBe('main thread');
  });

  it('Cancel ends the simulation worker and answers "stopped"; a newer run makes the older one stale', async () => {
    const t = deferredTransport();
    const c = createNumericClient(() => t.api, () => localNumeric as NumericApi);
    const run = c.simulate(emptyModel(), { until: 10 });
    await tick();
    expect(t.pending[0].kind).toBe('simulate');
    run.cancel();
    const r = await run.result;
    expect(r && 'cancelled' in r && r.cancelled).toBe(true);
    expect(t.disposed()).toBeGreaterThan(0);
    // A late answer of the ended worker changes nothing.
    t.pending[0].resolve({ ok: true, times: [0], series: {}, diagnostics: [], cancelled: false });
    expect(await run.result).toBe(r);
    const older = c.simulate(emptyModel(), { until: 10 });
    const newer = c.simulate(emptyModel(), { until: 20 });
    await tick();
    t.pending[t.pending.length - 1].resolve({ ok: true, times: [0, 20], series: {}, diagnostics: [], cancelled: false });
    expect(await older.result).toBeNull();
    expect(await newer.result).toMatchObject({ ok: true, times: [0, 20] });
  });
});
