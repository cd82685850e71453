import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { orderingAt, breakpoints } from '../../src/core/ordering/index';
import { orderingView } from '../../src/core/view/derive';
import { cutsOf } from '../../src/core/view/interval';
import type { ViewModel } from '../../src/core/view/types';
import { createLayoutQueue } from '../../src/layout/browser';
import { elkLayout, type ElkGraph, type ElkRunner } from '../../src/layout/elk';
import { center, interpolateLayout } from '../../src/layout/geometry';
import { instantLayout } from '../../src/layout/instant';
import { layoutInNode, nodeElk } from '../../src/layout/node';
import type { Box, Layout } from '../../src/layout/types';
import { EXAMPLES } from '../../src/examples/index';
import { decimals, expectClose } from '../helpers/tolerance';

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error('bad example');
  return r.model;
}
const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
const inside = (a: Box, g: Box) => a.x >= g.x - 0.5 && a.y >= g.y - 0.5 && a.x + a.width <= g.x + g.width + 0.5 && a.y + a.height <= g.y + g.height + 0.5;

function views(m: Model): ViewModel[] {
  const bps = breakpoints(m, { samples: 50 });
  const cuts = cutsOf(bps);
  // one interval inside each band: just above each cut (geometric mean with the next)
  const xs = [cuts[0].at / 2, ...cuts.map((c, i) => Math.sqrt(c.at * (cuts[i + 1]?.at ?? c.at * 4)))];
  return xs.map((interval) => orderingView(m, orderingAt(m, { interval, samples: 50 }), { mode: 'ordering', interval, samples: 50 }));
}

describe('layout', () => {
  it.each(EXAMPLES.map((e) => e.id))('%s: ELK places nodes without overlap, members inside their block, at every band', async (id) => {
    let prev: Layout | undefined;
    for (const vm of views(example(id))) for (const seeded of [false, true]) {
      const l = await layoutInNode(vm, { previous: seeded ? prev : undefined });
      if (seeded) prev = l;
      const boxes = vm.nodes.map((n) => l.nodes[n.id]);
      expect(boxes.every(Boolean)).toBe(true);
      for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(overlap(boxes[i], boxes[j]), `${vm.nodes[i].id} / ${vm.nodes[j].id}`).toBe(false);
      for (const g of vm.groups) for (const m of g.members) expect(inside(l.nodes[m], l.groups[g.id]), `${m} in ${g.id}`).toBe(true);
    }
  });

  it('the unrolled view: three copies of the instant, side by side in time order', async () => {
    const m = example('sleep-stress');
    const vm = orderingView(m, orderingAt(m, { interval: 10, samples: 50 }), { mode: 'unrolled', interval: 10, samples: 50 });
    const l = await layoutInNode(vm);
    const s = l.slices!;
    expect(s['-1'].x + s['-1'].width).toBeLessThan(s['0'].x);
    expect(s['0'].x + s['0'].width).toBeLessThan(s['1'].x);
    for (const n of vm.nodes) expect(inside(l.nodes[n.id], s[String(n.slice)])).toBe(true);
    const a = l.nodes['mood@-1'], b = l.nodes['mood@0'];
    expectClose(b.y, a.y, decimals(6));
  });

  it('instant placement keeps every node that was already there in place, and gathers a new block round its centre, below what drives it', () => {
    const m = example('sleep-stress');
    const before = orderingView(m, orderingAt(m, { interval: 2, samples: 50 }), { mode: 'ordering', interval: 2, samples: 50 });
    const after = orderingView(m, orderingAt(m, { interval: 10, samples: 50 }), { mode: 'ordering', interval: 10, samples: 50 });
    expect(before.groups.length).toBe(0);
    expect(after.groups.length).toBeGreaterThan(0);
    const prev = instantLayout(before, undefined, Object.fromEntries(m.variables.map((v) => [v.id, v.position!])));
    const next = instantLayout(after, prev);
    const g = after.groups[0];
    const members = new Set(g.members);
    const shift = (k: string) => ({ x: center(next.nodes[k]).x - center(prev.nodes[k]).x, y: center(next.nodes[k]).y - center(prev.nodes[k]).y });
    // what the block drives within the instant goes below it (levels top to bottom); every other node keeps its place
    const driven = new Set(after.edges.filter((e) => e.kind === 'instantaneous' && members.has(e.from) && !members.has(e.to)).map((e) => e.to));
    const others = after.nodes.filter((n) => !members.has(n.id) && !driven.has(n.id)).map((n) => shift(n.id));
    expect(others.length).toBeGreaterThan(2);
    // positions are normalised to the figure's corner: every node that keeps its place moves by one common offset
    for (const d of others) { expectClose(d.x, others[0].x, decimals(6)); expectClose(d.y, others[0].y, decimals(6)); }
    // the block stays about where its members were (across), and below every node that drives it
    const c0 = avg(g.members.map((k) => center(prev.nodes[k])));
    const c1 = avg(g.members.map((k) => center(next.nodes[k])));
    expect(Math.abs(c1.x - c0.x - others[0].x)).toBeLessThan(40);
    const top = Math.min(...g.members.map((k) => next.nodes[k].y));
    for (const e of after.edges) if (e.kind === 'instantaneous' && members.has(e.to) && !members.has(e.from)) expect(next.nodes[e.from].y + next.nodes[e.from].height, e.from).toBeLessThan(top);
  });

  it('seeded with the previous positions, the layout keeps more orders of nodes within layers across band changes than a fresh layout', async () => {
    const orderKept = async (seeded: boolean, m: Model) => {
      let prev: Layout | undefined;
      let kept = 0, total = 0;
      for (const vm of views(m)) {
        const l = await elkLayout(nodeElk(), vm, { previous: seeded ? prev : undefined });
        if (prev) {
          const shared = vm.nodes.map((n) => n.id).filter((k) => prev!.nodes[k]);
          for (let i = 0; i < shared.length; i++) for (let j = i + 1; j < shared.length; j++) {
            const [a, b] = [shared[i], shared[j]];
            // layers run top to bottom (direction DOWN): one layer = one row, order = left to right
            if (Math.abs(prev.nodes[a].y - prev.nodes[b].y) > 1) continue;
            total++;
            if (Math.sign(l.nodes[a].x - l.nodes[b].x) === Math.sign(prev.nodes[a].x - prev.nodes[b].x)) kept++;
          }
        }
        prev = l;
      }
      return { kept, total };
    };
    let seededKept = 0, freshKept = 0, total = 0;
    for (const e of EXAMPLES) {
      const s1 = await orderKept(true, example(e.id));
      const s2 = await orderKept(false, example(e.id));
      seededKept += s1.kept; freshKept += s2.kept; total += s1.total;
    }
    console.log(`order kept: seeded ${seededKept}/${total}, fresh ${freshKept}/${total}`);
    expect(total).toBeGreaterThan(10);
    expect(seededKept / total).toBeGreaterThan(0.8);
    expect(seededKept).toBeGreaterThan(freshKept);
  });

  it.each(EXAMPLES.map((e) => e.id))('%s: every edge into or out of a block is routed to or from the block\'s border (the block\'s equations are solved together; one source drives it by one line)', async (id) => {
    const onBorder = (p: { x: number; y: number }, b: Box) => {
      const inX = p.x >= b.x - 0.6 && p.x <= b.x + b.width + 0.6, inY = p.y >= b.y - 0.6 && p.y <= b.y + b.height + 0.6;
      const edgeX = Math.abs(p.x - b.x) < 0.6 || Math.abs(p.x - b.x - b.width) < 0.6, edgeY = Math.abs(p.y - b.y) < 0.6 || Math.abs(p.y - b.y - b.height) < 0.6;
      return inX && inY && (edgeX || edgeY);
    };
    let checked = 0;
    for (const vm of views(example(id))) {
      const l = await layoutInNode(vm, {});
      const groupOf = new Map<string, string>();
      for (const g of vm.groups) for (const m of g.members) groupOf.set(m, g.id);
      for (const e of vm.edges) {
        const a = groupOf.get(e.from), b = groupOf.get(e.to);
        if ((!a && !b) || a === b) continue;
        const route = l.edges?.[e.id];
        expect(route, `${e.id} has a route`).toBeDefined();
        const first = route![0], last = route![route!.length - 1];
        if (a) expect(onBorder(first, l.groups[a]), `${e.id} leaves its block`).toBe(true);
        if (b) expect(onBorder(last, l.groups[b]), `${e.id} ends at its block`).toBe(true);
        checked++;
      }
    }
    if (id === 'sleep-stress') expect(checked).toBeGreaterThan(0);
  });

  it('a layout made obsolete by a newer request is dropped', async () => {
    const m = example('sleep-stress');
    const [v1, v2] = views(m);
    let calls = 0;
    const slow: ElkRunner = {
      async layout(g: ElkGraph) {
        const mine = ++calls;
        const done = await nodeElk().layout(g);
        await new Promise((r) => setTimeout(r, mine === 1 ? 60 : 1));
        return done;
      },
    };
    let abandoned = 0;
    let started = 0;
    const q = createLayoutQueue(async () => { started++; return Object.assign(Object.create(slow) as ElkRunner, { layout: slow.layout, terminateWorker: () => { abandoned++; } }); });
    const first = q.request(v1, {});
    await new Promise((r) => setTimeout(r, 5)); // the first is under way
    const second = q.request(v2, {});
    expect(await first).toBeNull();
    expect(await second).not.toBeNull();
    expect(abandoned).toBe(1); // the running layout was stopped, not waited for
    expect(started).toBe(2); // and a fresh worker took the new one
  });

  it('a cancelled layout finishes in its worker; a later request after it is done reuses that worker', async () => {
    const m = example('sleep-stress');
    const [v1, v2] = views(m);
    let terminated = 0;
    let started = 0;
    const q = createLayoutQueue(async () => { started++; return { layout: (g: ElkGraph) => nodeElk().layout(g), terminateWorker: () => { terminated++; } } as ElkRunner; });
    const first = q.request(v1, {});
    await new Promise((r) => setTimeout(r, 1));
    q.cancel(); // the view moved on while the interval is dragged: nobody waits for this layout
    expect(await first).toBeNull();
    // the worker is idle again: the next request must not stop it and start another
    expect(await q.request(v2, {})).not.toBeNull();
    expect(terminated).toBe(0);
    expect(started).toBe(1);
  });

  it('animation frames run from the old place to the new one', () => {
    const a: Layout = { nodes: { x: { x: 0, y: 0, width: 10, height: 10 } }, groups: {}, width: 10, height: 10, source: 'instant' };
    const b: Layout = { nodes: { x: { x: 100, y: 50, width: 10, height: 10 }, y: { x: 5, y: 5, width: 4, height: 4 } }, groups: {}, width: 110, height: 60, source: 'elk' };
    expect(interpolateLayout(a, b, 0).nodes.x).toEqual(a.nodes.x);
    expect(interpolateLayout(a, b, 0.5).nodes.x).toEqual({ x: 50, y: 25, width: 10, height: 10 });
    expect(interpolateLayout(a, b, 1).nodes).toEqual(b.nodes);
  });
});

function avg(ps: { x: number; y: number }[]) {
  return { x: ps.reduce((s, p) => s + p.x, 0) / ps.length, y: ps.reduce((s, p) => s + p.y, 0) / ps.length };
}
