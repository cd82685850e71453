import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createDataClient } from '../../src/worker/dataClient';
import { localData, panelBuffers, type DataApi } from '../../src/worker/dataApi';
import { parseModelText } from '../../src/core/model/schema';
import { fitVar } from '../../src/core/fit/var';
import { fitCt } from '../../src/core/fit/ct';
import { simulateCt } from '../../src/core/fit/simulate';
import type { Panel } from '../../src/core/data/panel';
import { expectClose } from '../helpers/tolerance';

const sleepStress = (() => {
  const r = parseModelText(readFileSync('src/examples/sleep-stress.json', 'utf8'));
  if (!r.ok) throw new Error('example does not load');
  return r.model;
})();

const CSV = [
  'participant,answered,stress,mood',
  'A,2026-03-02T09:00:00+01:00,4,6',
  'A,2026-03-02T12:00:00+01:00,5,5',
  'A,2026-02-30T15:00:00+01:00,6,4', // row 4: there is no 30 February
  'A,2026-03-02T18:00:00+01:00,-99,5',
  'B,2026-03-02T09:30:00+01:00,3,7',
  'B,2026-03-02T12:30:00+01:00,x,6', // row 7: not a number
].join('\n');

/** One variable alternating +1, −1: person-mean centred lag-1 least squares gives Σx₍t−1₎x_t / Σx²₍t−1₎ = −1 (hand calculation, common practice). */
function alternating(persons: number, length: number): Panel {
  return {
    variables: ['stress'],
    timeUnit: 'h',
    persons: Array.from({ length: persons }, (_, p) => ({
      id: `P${p}`,
      time: Float64Array.from({ length }, (_, k) => 3 * k),
      values: Float64Array.from({ length }, (_, k) => (k % 2 === 0 ? 1 : -1) * (1 + 0.01 * p)),
    })),
  };
}

/** A transport whose fit calls wait until the test releases them. */
function deferred() {
  const pending: { kind: string; resolve: (r: unknown) => void; progress?: (f: number) => void }[] = [];
  let disposed = 0;
  const call = (kind: string) => (...args: unknown[]) => new Promise((resolve) => { pending.push({ kind, resolve, progress: args[3] as ((f: number) => void) | undefined }); });
  const api = { header: call('header'), importData: call('importData'), importBlob: call('importBlob'), fitVar: call('fitVar'), fitCt: call('fitCt'), dispose: () => { disposed++; } } as unknown as DataApi;
  return { api, pending, disposed: () => disposed };
}
const tick = () => new Promise((r) => setTimeout(r, 0));

describe('data client', () => {
  it('reads the header with a first mapping, and imports with refused rows named by row and column (main thread after a failed worker)', async () => {
    const broken = (): DataApi => {
      const no = () => Promise.reject(new Error('the data worker could not start'));
      return { header: no, importData: no, importBlob: no, fitVar: no, fitCt: no, coint: no };
    };
    const c = createDataClient(broken, () => localData);
    const h = await c.header(CSV, sleepStress.variables, 'h');
    expect(c.where()).toBe('main thread');
    if (!h || !h.ok) throw new Error('header refused');
    expect(h.fields).toEqual(['participant', 'answered', 'stress', 'mood']);
    expect(h.suggestion).toMatchObject({ format: 'long', person: 'participant', time: 'answered', variables: [{ column: 'stress', variable: 'stress' }, { column: 'mood', variable: 'mood' }] });
    expect(h.preview[0]).toEqual(['A', '2026-03-02T09:00:00+01:00', '4', '6']);
    const r = await c.importData(CSV, { ...h.suggestion, missing: ['-99'] });
    if (!r || !r.ok) throw new Error('import refused');
    expect(r.summary).toMatchObject({ rows: 6, kept: 5, refused: 1, persons: 2 });
    expect(r.issues).toEqual(expect.arrayContaining([
      expect.objectContaining({ row: 4, column: 'answered', action: 'row refused' }),
      expect.objectContaining({ row: 7, column: 'stress', action: 'cell set missing' }),
    ]));
    // −99 is the missing code: A's last stress and B's "x" are the two missing stress cells among 5 kept occasions.
    expect(r.summary.missing.find((m) => m.variable === 'stress')).toEqual({ variable: 'stress', missing: 2, total: 5 });
    c.dispose();
  });

  it('imports a Blob read where the import runs, with the same answer as the text, and lists the panel buffers to transfer', async () => {
    const c = createDataClient(null, () => localData);
    const h = await c.header(CSV, sleepStress.variables, 'h');
    if (!h || !h.ok) throw new Error('header refused');
    const mapping = { ...h.suggestion, missing: ['-99'] };
    const fromText = await c.importData(CSV, mapping);
    const fromBlob = await c.importBlob(new Blob([CSV]), mapping);
    expect(fromBlob).toEqual(fromText);
    // The header from the File/Blob itself (the pane never reads the file on the main thread).
    expect(await c.header(new Blob([CSV]), sleepStress.variables, 'h')).toEqual(h);
    if (!fromBlob || !fromBlob.ok || !fromBlob.panel) throw new Error('import refused');
    // Two persons, each with times, values, days (from the dates): six distinct buffers, none twice.
    const buffers = panelBuffers(fromBlob);
    expect(buffers).toHaveLength(fromBlob.panel.persons.reduce((n, p) => n + 2 + (p.day ? 1 : 0) + (p.prompt ? 1 : 0), 0));
    expect(new Set(buffers).size).toBe(buffers.length);
    c.dispose();
  });

  it('a header naming a column twice is refused with the column named', async () => {
    const c = createDataClient(null, () => localData);
    expect(await c.header('id,time,stress,stress\n1,0,1,2', sleepStress.variables, 'h')).toEqual({ ok: false, reason: expect.stringMatching(/"stress" twice/) });
  });

  it('fits the VAR with progress and the same answer as the core; an alternating series gives −1', async () => {
    const c = createDataClient(null, () => localData);
    const seen: number[] = [];
    const panel = alternating(3, 12);
    const run = c.fitVar(sleepStress, panel, {}, (f) => seen.push(f));
    const a = await run.result;
    if (!a || !a.ok) throw new Error(`fit failed: ${a && !a.ok ? a.reason : 'replaced'}`);
    expectClose(a.fit.phi[0][0], -1, { relTol: 1e-12, absTol: 1e-12 }, 'alternating lag-1 coefficient');
    expect(a.fit.phi).toEqual(fitVar(panel, { perPerson: true }).phi);
    expect(a.interval).toBe(3);
    expect(a.comparison).toHaveLength(1);
    expect(a.comparison[0]).toMatchObject({ from: 'stress', to: 'stress' });
    expect(seen).toEqual([0, 1]);
  });

  it('fits the continuous-time model, open and the sketch\'s, with rising progress and the core\'s answer', async () => {
    // One measured state, stress, simulated with drift −0.5 per hour (invented values): small enough to fit in a second.
    const times = Array.from({ length: 6 }, (_, p) => Array.from({ length: 12 }, (_, k) => k * 2 + (p % 3) * 0.5 * (k % 2)));
    const panel = simulateCt({ states: ['stress'], drift: [[-0.5]], diffusion: [[1]], levels: [3], between: [[0.5]] }, times, { seed: 7 });
    const c = createDataClient(null, () => localData);
    const seen: number[] = [];
    const a = await c.fitCt(sleepStress, panel, { maxIterations: 60 }, (f) => seen.push(f)).result;
    if (!a || !a.ok) throw new Error(`fit failed: ${a && !a.ok ? a.reason : 'replaced'}`);
    const direct = fitCt(panel, { states: ['stress'], initial: 'free', intercepts: 'random', maxIterations: 60 });
    expect(a.open.minus2LL).toBe(direct.minus2LL);
    // The sketch has stress regulating itself: the confirmatory fit frees the same single drift entry, so the test has 0 df.
    expect(a.lr.df).toBe(0);
    expect(a.comparison).toHaveLength(1);
    expect(seen.at(-1)).toBe(1);
    expect(seen.every((f, i) => i === 0 || f >= seen[i - 1] || f === 0.5)).toBe(true);
  });

  it('a column mapped to a variable that is not a state of the sketch is a reason naming it', async () => {
    const c = createDataClient(null, () => localData);
    const panel = { ...alternating(2, 6), variables: ['workload'] };
    const a = await c.fitVar(sleepStress, panel, {}).result;
    expect(a).toEqual({ ok: false, reason: expect.stringMatching(/workload is mapped to data but not a state of the sketch/) });
  });

  it('Cancel ends the fit worker and answers "stopped"; a newer fit of the same kind replaces the older', async () => {
    const t = deferred();
    const c = createDataClient(() => t.api, () => localData);
    const progress: number[] = [];
    const run = c.fitCt(sleepStress, alternating(2, 6), {}, (f) => progress.push(f));
    await tick();
    expect(t.pending.map((p) => p.kind)).toEqual(['fitCt']);
    t.pending[0].progress?.(0.25);
    expect(progress).toEqual([0.25]);
    run.cancel();
    const r = await run.result;
    expect(r).toEqual({ ok: false, reason: 'the fit was stopped', cancelled: true });
    expect(t.disposed()).toBeGreaterThan(0);
    // Progress and a late answer from the ended worker change nothing.
    t.pending[0].progress?.(0.5);
    t.pending[0].resolve({ ok: false, reason: 'late' });
    expect(progress).toEqual([0.25]);
    expect(await run.result).toBe(r);
    const older = c.fitVar(sleepStress, alternating(2, 6), {});
    const newer = c.fitVar(sleepStress, alternating(2, 6), { sameDay: false });
    await tick();
    t.pending[2].resolve({ ok: false, reason: 'newer answer' });
    expect(await older.result).toBeNull();
    expect(await newer.result).toEqual({ ok: false, reason: 'newer answer' });
  });
});

describe('data client: unit roots and cointegration', () => {
  it('names the row and column of a missing cell and tests nothing; tests complete series per person', async () => {
    const c = createDataClient(null, () => localData);
    const holed = ['site,level,inflow', 'a,1,2', 'a,,3', 'a,2,x'].join('\n');
    const bad = await c.coint(holed, { columns: ['level', 'inflow'], person: 'site' });
    if (!bad || bad.ok) throw new Error('a file with holes was tested');
    // Rows count the header as row 1 (common practice for spreadsheets).
    expect(bad.reason).toContain('row 3, column level: missing value');
    expect(bad.reason).toContain('row 4, column inflow: "x" is not a number');
    expect(bad.reason).toContain('Nothing was tested');
    // The same from the kept Blob.
    const fromBlob = await c.coint(new Blob([holed]), { columns: ['level', 'inflow'], person: 'site' });
    expect(fromBlob).toEqual(bad);
    const one = await c.coint(holed, { columns: ['level'] });
    expect(one && !one.ok && one.reason).toBe('choose 2 to 6 columns to test, not 1');
  });
});
