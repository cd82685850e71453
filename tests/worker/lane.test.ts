import { describe, expect, it } from 'vitest';
import { createLane, latestQueue, lru, noWorkerRequested } from '../../src/worker/lane';

/** An async call whose answers the test releases in any order. */
function deferred<T>() {
  const pending: { args: unknown[]; resolve: (v: T) => void; reject: (e: Error) => void }[] = [];
  const call = (...args: unknown[]) => new Promise<T>((resolve, reject) => pending.push({ args, resolve, reject }));
  return { call, pending };
}
const tick = () => new Promise((r) => setTimeout(r, 0));

// Latest-wins, cancel-by-ending-the-worker and least-recently-used caches are
// common practice for request/response over an asynchronous channel.
describe('lane policies', () => {
  it('serial: one call at a time; a waiting call is replaced by a newer one; a must goes before a waiting call', async () => {
    const d = deferred<string>();
    const q = latestQueue((x: string) => d.call(x));
    const a = q.latest('a');
    const b = q.latest('b');
    const c = q.latest('c');
    const m = q.must('export');
    expect(d.pending.map((p) => p.args[0])).toEqual(['a']);
    expect(await b).toBeNull(); // replaced while waiting, never sent
    d.pending[0].resolve('A');
    expect(await a).toBeNull(); // overtaken by c
    await tick();
    expect(d.pending.map((p) => p.args[0])).toEqual(['a', 'export']);
    d.pending[1].resolve('E');
    expect(await m).toBe('E');
    await tick();
    d.pending[2].resolve('C');
    expect(await c).toBe('C');
  });

  it('serial: a failure becomes the policy\'s answer, or null when a newer call overtook it', async () => {
    const d = deferred<string>();
    const q = latestQueue((x: string) => d.call(x), { failed: (e, x) => `${x}: ${(e as Error).message}` });
    const a = q.latest('a');
    d.pending[0].reject(new Error('broke'));
    expect(await a).toBe('a: broke');
    const b = q.latest('b');
    await tick();
    q.supersede();
    d.pending[1].reject(new Error('broke'));
    expect(await b).toBeNull();
  });

  it('parallel: every call goes at once; only the newest answer is delivered, whatever the order of arrival', async () => {
    const d = deferred<number>();
    const q = latestQueue((x: number) => d.call(x), { mode: 'parallel' });
    const calls = [1, 2, 3].map((x) => q.latest(x));
    expect(d.pending).toHaveLength(3);
    d.pending[2].resolve(3);
    d.pending[0].resolve(1);
    d.pending[1].resolve(2);
    expect(await Promise.all(calls)).toEqual([null, null, 3]);
  });

  it('preempt: a newer call stops the running one instead of waiting for it', async () => {
    const d = deferred<string>();
    let stopped = 0;
    const q = latestQueue((x: string) => d.call(x), { mode: 'preempt', preempt: async () => { stopped++; d.pending[0].reject(new Error('stopped')); } });
    const a = q.latest('a');
    await tick();
    expect(q.busy()).toBe(true);
    const b = q.latest('b');
    await tick();
    expect(stopped).toBe(1);
    expect(await a).toBeNull();
    d.pending[1].resolve('B');
    expect(await b).toBe('B');
    expect(q.busy()).toBe(false);
  });

  it('falls back to the main thread for good when the worker fails, and runs the call again there', async () => {
    let disposed = 0;
    const lane = createLane<{ f(x: number): Promise<string> }>({
      worker: () => ({ f: () => Promise.reject(new Error('crashed')), dispose: () => { disposed++; } }),
      fallback: () => ({ f: async (x) => `main ${x}` }),
    });
    expect(lane.where()).toBe('worker');
    expect(await lane.run((a) => a.f(1))).toMatchObject({ value: 'main 1', where: 'main thread' });
    expect(lane.where()).toBe('main thread');
    expect(disposed).toBe(1);
    const none = createLane<{ f(): Promise<string> }>({ worker: () => { throw new Error('no workers'); }, fallback: () => ({ f: async () => 'here' }) });
    expect(none.where()).toBe('main thread');
    expect((await none.run((a) => a.f())).value).toBe('here');
  });

  it('cancellable: progress stops at cancel, the job\'s own worker is ended, a newer job makes the older resolve null', async () => {
    const workers: { disposed: boolean; progress?: (x: number) => void; resolve?: (v: string) => void }[] = [];
    const lane = createLane<{ run(p?: (x: number) => void): Promise<string> }>({
      worker: () => {
        const w: (typeof workers)[number] = { disposed: false };
        workers.push(w);
        return { run: (p) => new Promise<string>((res) => { w.progress = p; w.resolve = res; }), dispose: () => { w.disposed = true; } };
      },
      fallback: () => ({ run: async () => 'main' }),
      lazy: true,
    });
    const seen: number[] = [];
    const job = lane.cancellable('sim', (api, p) => api.run(p), { onProgress: (x) => seen.push(x), cancelled: () => 'stopped', failed: () => 'failed' });
    workers[0].progress!(0.5);
    job.cancel();
    workers[0].progress!(0.9);
    expect(await job.result).toBe('stopped');
    expect(seen).toEqual([0.5]);
    expect(workers[0].disposed).toBe(true);
    const older = lane.cancellable('sim', (api, p) => api.run(p), { cancelled: () => 'stopped', failed: () => 'failed' });
    const newer = lane.cancellable('sim', (api, p) => api.run(p), { cancelled: () => 'stopped', failed: () => 'failed' });
    expect(await older.result).toBeNull();
    workers[2].resolve!('done');
    expect(await newer.result).toBe('done');
    expect(workers[2].disposed).toBe(true);
  });

  it('lru keeps the entries used last and reports each one dropped', () => {
    const dropped: string[] = [];
    const c = lru<string, number>(2, (k) => dropped.push(k));
    c.set('a', 1);
    c.set('b', 2);
    expect(c.get('a')).toBe(1); // a is now the newest
    c.set('c', 3);
    expect(dropped).toEqual(['b']);
    expect([c.has('a'), c.has('b'), c.has('c'), c.size]).toEqual([true, false, true, 2]);
  });

  it('without a page address (Node, the command line) no one asked for the main thread', () => {
    expect(noWorkerRequested()).toBe(false);
  });
});

describe('?noworker is read in one place', () => {
  it('no source file but the lane reads the page address for it', async () => {
    const { readdirSync, readFileSync, statSync } = await import('node:fs');
    const { join } = await import('node:path');
    const walk = (d: string): string[] => readdirSync(d).flatMap((f) => (statSync(join(d, f)).isDirectory() ? walk(join(d, f)) : /\.tsx?$/.test(f) ? [join(d, f)] : []));
    const readers = walk('src').filter((f) => /has\(\s*['"]noworker['"]\s*\)/.test(readFileSync(f, 'utf8')));
    expect(readers).toEqual([join('src', 'worker', 'lane.ts')]);
  });
});
