import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseModelText } from '../../src/core/model/schema';
import { studyOfModel } from '../../src/core/study/design';
import { monteCarloPower } from '../../src/core/rehearse/power';
import { linksOfText, rehearsalOf } from '../../src/core/rehearse/setup';
import { MAX_WORKERS, createRehearseClient, splitReplications, workerCount } from '../../src/worker/rehearseClient';
import { localRehearse } from '../../src/worker/rehearseApi';
import { expectClose } from '../helpers/tolerance';

// An invented two-state greenhouse sketch (air heat drives leaf damp, damp cools the air).
const parsed = parseModelText(readFileSync('tests/fixtures/rehearse/greenhouse-air.json', 'utf8'));
if (!parsed.ok) throw new Error('fixture does not load');
const model = parsed.model;

describe('the rehearsal client', () => {
  it('uses as many workers as the machine reports cores, at least one and at most eight', () => {
    expect(workerCount(2)).toBe(2);
    expect(workerCount(6)).toBe(6);
    expect(workerCount(64)).toBe(MAX_WORKERS);
    expect(MAX_WORKERS).toBe(8);
    expect(workerCount(undefined)).toBe(1);
    expect(workerCount(0)).toBe(1);
    expect(workerCount(Number.NaN)).toBe(1);
    expect(workerCount(3.7)).toBe(3);
  });

  it('splits K replications over at most the cores reported, covering each replication once', () => {
    expect(splitReplications(10, 4)).toEqual([[0, 2], [2, 5], [5, 7], [7, 10]]);
    expect(splitReplications(3, 8)).toEqual([[0, 1], [1, 2], [2, 3]]);
    expect(splitReplications(5, 0)).toEqual([[0, 5]]);
  });

  it('a run split over parts gives the same tallies as one run of the core', async () => {
    const links = linksOfText(model, 'heat->damp');
    const study = { ...studyOfModel(model), persons: 4, length: 30 };
    const c = createRehearseClient(null, () => localRehearse);
    let last = 0;
    const o = await c.monteCarlo({ model, study, links, seed: 9 }, 24, 3, (n) => { last = n; }).result;
    expect(o.status).toBe('done');
    if (o.status !== 'done') return;
    expect(o.summary.workers).toBe(3);
    expect(last).toBe(24);
    const one = monteCarloPower(rehearsalOf({ ...model, study }, { links, seed: 9 }), 24);
    expect(o.summary.replications).toBe(24);
    expect(o.summary.links[0].power).toBe(one.links[0].power);
    expectClose(o.summary.links[0].effect, one.links[0].effect, { absTol: 1e-12 }, 'mean estimate (sums added in another order)');
  });

  it('Cancel stops the run and says so; a bad study comes back as a message', async () => {
    const links = linksOfText(model, 'heat->damp');
    const c = createRehearseClient(null, () => localRehearse);
    const run = c.monteCarlo({ model, study: studyOfModel(model), links }, 2000, 2);
    run.cancel();
    expect((await run.result).status).toBe('cancelled');
    const bad = await c.analytic({ model, study: { ...studyOfModel(model), persons: 0 }, links });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.reason).toMatch(/persons/);
  });

  it('runs the parts at once, each on a worker of its own, and Cancel ends every one of them', async () => {
    const links = linksOfText(model, 'heat->damp');
    const study = { ...studyOfModel(model), persons: 2, length: 20 };
    let started = 0, live = 0, most = 0, disposed = 0;
    // A stand-in for the browser's worker: the core itself, counted while it runs.
    // A long part waits until its worker is ended (as a busy worker would be, by Cancel).
    const factory = () => {
      started++;
      let end: () => void = () => {};
      const ended = new Promise<void>((r) => { end = r; });
      return {
        ...localRehearse,
        async replications(req: Parameters<typeof localRehearse.replications>[0], from: number, to: number, p?: (n: number) => void) {
          live++;
          most = Math.max(most, live);
          await new Promise((r) => setTimeout(r, 20));
          if (to - from > 100) {
            await ended;
            live--;
            return { ok: false as const, reason: 'worker ended' };
          }
          const a = await localRehearse.replications(req, from, to, p);
          live--;
          return a;
        },
        dispose: () => { disposed++; end(); },
      };
    };
    const c = createRehearseClient(factory, () => localRehearse);
    const o = await c.monteCarlo({ model, study, links, seed: 3 }, 12, workerCount(4)).result;
    expect(o.status).toBe('done');
    expect(started).toBe(4);
    expect(most).toBe(4);
    expect(disposed).toBe(4);
    const slow = c.monteCarlo({ model, study, links, seed: 3 }, 4000, workerCount(3));
    await new Promise((r) => setTimeout(r, 5));
    slow.cancel();
    expect((await slow.result).status).toBe('cancelled');
    expect(started).toBe(7);
    expect(disposed).toBe(7);
  });

  it('the simulated study reports persons done, and Cancel ends it without a file', async () => {
    const links = linksOfText(model, 'heat->damp');
    const study = { ...studyOfModel(model), persons: 5, length: 20 };
    const c = createRehearseClient(null, () => localRehearse);
    const seen: number[] = [];
    const a = await c.csv({ model, study, links }, (n) => seen.push(n)).result;
    expect(a.ok).toBe(true);
    expect(seen[seen.length - 1]).toBe(5);
    expect(seen).toEqual([...seen].sort((x, y) => x - y));
    if (a.ok) expect(a.simulator).toMatch(/exact discrete model/);
    const run = c.csv({ model, study, links });
    run.cancel();
    const b = await run.result;
    expect(b.ok).toBe(false);
    expect('cancelled' in b).toBe(true);
  });
});
