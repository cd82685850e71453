import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCoreClient, latestWins } from '../../src/worker/client';
import type { AnalysisResult, CoreApi } from '../../src/worker/protocol';
import { emptyModel } from '../../src/state/changes';

/** A fake transport whose answers the test releases in any order. */
function deferredTransport() {
  const pending: { n: number; resolve: (r: AnalysisResult) => void; reject: (e: Error) => void }[] = [];
  let calls = 0;
  const api: CoreApi = {
    analyze: () =>
      new Promise<AnalysisResult>((resolve, reject) => {
        pending.push({ n: calls++, resolve, reject });
      }),
  };
  return { api, pending };
}
const until = async (cond: () => boolean) => {
  for (let i = 0; i < 200 && !cond(); i++) await new Promise((r) => setTimeout(r, 1));
};
const answer = (n: number): AnalysisResult => ({ ok: false, message: `answer ${n}` });

// Latest-wins is common practice for request/response over an asynchronous channel:
// an answer is delivered only if no newer request was made before it arrived.
describe('latest-wins core client', () => {
  it('drops an answer when a newer request came while it was computed', async () => {
    const t = deferredTransport();
    const client = createCoreClient(() => t.api, () => t.api);
    const first = client.analyze(emptyModel(), {});
    const second = client.analyze(emptyModel(), {});
    await Promise.resolve();
    expect(t.pending).toHaveLength(1); // one request at a time with the core
    t.pending[0].resolve(answer(0));
    expect(await first).toBeNull();
    await until(() => t.pending.length === 2);
    t.pending[1].resolve(answer(1));
    expect(await second).toEqual(answer(1));
  });

  it('a request overtaken while waiting is never sent', async () => {
    const t = deferredTransport();
    const client = createCoreClient(() => t.api, () => t.api);
    const calls = [0, 1, 2, 3].map(() => client.analyze(emptyModel(), {}));
    await Promise.resolve();
    expect(await calls[1]).toBeNull();
    expect(await calls[2]).toBeNull();
    t.pending[0].resolve(answer(0));
    await until(() => t.pending.length === 2);
    t.pending[1].resolve(answer(3));
    expect(await Promise.all(calls)).toEqual([null, null, null, answer(3)]);
    expect(t.pending).toHaveLength(2); // the two overtaken ones never reached the transport
  });

  it('for any order of arrival, only the last request is delivered (property test, seeded)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 1, max: 8 }).chain((n) => fc.tuple(fc.constant(n), fc.shuffledSubarray([...Array(n).keys()], { minLength: n, maxLength: n }))), async ([n, order]) => {
        let release: ((v: number) => void)[] = [];
        const lw = latestWins((i: number) => new Promise<number>((res) => release.push(() => res(i))));
        const results = [...Array(n).keys()].map((i) => lw.call(i));
        for (const i of order) release[i](i);
        const delivered = await Promise.all(results);
        release = [];
        const fresh = delivered.filter((d) => !d.stale);
        return fresh.length === 1 && !fresh[0].stale && fresh[0].value === n - 1 && delivered.every((d, i) => d.seq === i + 1);
      }),
      { seed: 20261201, numRuns: 200 },
    );
  });

  it('falls back to the main thread when the worker cannot start or fails', async () => {
    const main: CoreApi = { analyze: async () => ({ ok: false, message: 'main thread' }) };
    const noStart = createCoreClient(() => {
      throw new Error('no workers here');
    }, () => main);
    expect(noStart.where()).toBe('main thread');
    expect(await noStart.analyze(emptyModel(), {})).toEqual({ ok: false, message: 'main thread' });

    let disposed = false;
    const broken = createCoreClient(() => ({ analyze: () => Promise.reject(new Error('worker crashed')), dispose: () => (disposed = true) }), () => main);
    expect(broken.where()).toBe('worker');
    expect(await broken.analyze(emptyModel(), {})).toEqual({ ok: false, message: 'main thread' });
    expect(broken.where()).toBe('main thread');
    expect(disposed).toBe(true);
  });

  it('invalidate makes every answer in flight stale', async () => {
    let release!: () => void;
    const lw = latestWins(() => new Promise<string>((res) => (release = () => res('late'))));
    const p = lw.call();
    lw.invalidate();
    release();
    expect((await p).stale).toBe(true);
  });
});
