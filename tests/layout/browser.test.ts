import { describe, expect, it } from 'vitest';
import ELK from 'elkjs/lib/elk.bundled.js';
import { parseModel } from '../../src/core/model/schema';
import { orderingAt } from '../../src/core/ordering/index';
import { orderingView } from '../../src/core/view/derive';
import { createLayoutQueue, startElk, stopElk, type WorkerLike } from '../../src/layout/browser';
import type { ElkRunner } from '../../src/layout/elk';
import { EXAMPLES } from '../../src/examples/index';

/** A worker whose script cannot load (a bad URL): it fires an error event and never answers, as browsers do. */
function brokenWorker(log: string[]): WorkerLike {
  let onError: ((e: unknown) => void) | undefined;
  setTimeout(() => onError?.({ message: 'failed to load worker script' }), 5);
  return {
    postMessage: () => { log.push('posted'); },
    terminate: () => { log.push('terminated'); },
    addEventListener: (_type, listener) => { onError = listener; },
  };
}
/** A worker that never answers and raises nothing. */
const silentWorker = (log: string[]): WorkerLike => ({ postMessage: () => {}, terminate: () => { log.push('terminated'); } });

const graph = () => ({
  id: 'root',
  layoutOptions: { 'elk.algorithm': 'layered' },
  children: [{ id: 'a', width: 80, height: 30 }, { id: 'b', width: 80, height: 30 }, { id: 'c', width: 80, height: 30 }],
  edges: [{ id: 'e1', sources: ['a'], targets: ['b'] }, { id: 'e2', sources: ['b'], targets: ['c'] }],
});
type Placed = { children: { id: string; x: number; y: number }[] };
const positions = (g: Placed) => g.children.map((c) => [c.id, c.x, c.y]);

describe('ELK in the browser when its worker cannot start', () => {
  it('falls back to ELK on the main thread after the worker\'s error event, and stops the worker', async () => {
    const log: string[] = [];
    const elk = await startElk({ worker: () => brokenWorker(log) });
    // the same placement as ELK's own bundled build (elkjs) gives for the graph
    const expected = (await new ELK().layout(graph())) as unknown as Placed;
    const got = (await (elk as unknown as InstanceType<typeof ELK>).layout(graph())) as unknown as Placed;
    expect(positions(got)).toEqual(positions(expected));
    expect(log).toContain('terminated');
  });

  it('falls back when the worker never answers', async () => {
    const log: string[] = [];
    const t0 = Date.now();
    const elk = await startElk({ worker: () => silentWorker(log), answerWithinMs: 50 });
    expect(Date.now() - t0).toBeLessThan(4000);
    const got = (await (elk as unknown as InstanceType<typeof ELK>).layout(graph())) as unknown as Placed;
    expect(got.children).toHaveLength(3);
    expect(log).toContain('terminated');
  });

  it('a layout queue whose worker cannot start still lays a view out (no hang), and stops cleanly', async () => {
    const r = parseModel(EXAMPLES.find((e) => e.id === 'lake')!.model);
    if (!r.ok) throw new Error('bad example');
    const vm = orderingView(r.model, orderingAt(r.model, { interval: 1, samples: 50 }), { mode: 'ordering', interval: 1, samples: 50 });
    const queue = createLayoutQueue(() => startElk({ worker: () => brokenWorker([]) }));
    const l = await queue.request(vm, {});
    expect(l).not.toBeNull();
    expect(Object.keys(l!.nodes).sort()).toEqual(vm.nodes.map((n) => n.id).sort());
    await expect(queue.dispose()).resolves.toBeUndefined();
  });

  it('stopping never throws: a runner without a worker, or one whose worker is already gone', () => {
    expect(() => stopElk(undefined)).not.toThrow();
    expect(() => stopElk({ layout: async () => ({}) } as unknown as ElkRunner)).not.toThrow();
    expect(() => stopElk({ terminateWorker: () => { throw new Error('already terminated'); } } as unknown as ElkRunner)).not.toThrow();
  });
});
