/**
 * The instant placement (what the timescale views show at once, before the tuned layout arrives, and the
 * mechanism at its drawn positions) checked on the element tree the renderer builds (`buildScene`, which
 * the screen, the files and `loopfold render` draw): nodes never overlap or touch, no block frame covers
 * a node outside the block, no sign sits under a node, a header or another sign, every link keeps a
 * visible stretch of line, causal levels read top to bottom and the three instants stand side by side.
 * Over every example at every band, seeded by the band before (tuned or instant) and by nothing, and over
 * generated models of 3–30 variables with scrambled seeds.
 */
import { describe, expect, it } from 'vitest';
import type { Model } from '../../src/core/model/types';
import { orderingAt } from '../../src/core/ordering/index';
import { seededRandom } from '../../src/core/stats/random';
import { orderingView } from '../../src/core/view/derive';
import type { ViewModel } from '../../src/core/view/types';
import { buildScene } from '../../src/export/scene';
import { EXAMPLES } from '../../src/examples/index';
import { figureLayout } from '../../src/layout/figure';
import { drawnPositions, instantLayout, NODE_GAP, separate } from '../../src/layout/instant';
import { nodeElk } from '../../src/layout/node';
import type { Box, Layout } from '../../src/layout/types';
import { problems, readFigure, type Drawn, type R } from '../helpers/figureGeometry';
import { generatedSketch } from '../helpers/sketches';
import { bandIntervals, exampleModel } from '../helpers/examples';

// the rules of the brief; a straight link through a third node is the tuned layout's to route (tests/export/scene.test.ts)
const RULES = { nodeGap: 12, minVisible: 12, marksOffLines: false };
const routing = (p: string) => / runs through node | runs across the header of /.test(p);



const viewAt = (m: Model, interval: number, mode: ViewModel['mode']): ViewModel => orderingView(m, orderingAt(m, { interval, samples: 50 }), { mode, interval, samples: 50 });

const meets = (a: R, b: R) => a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3];

/** A block's frame over a node that is not one of its members. */
function frameProblems(vm: ViewModel, d: Drawn): string[] {
  const out: string[] = [];
  for (const g of vm.groups) {
    const frame = d.groups.get(g.id)?.box;
    if (!frame) continue;
    for (const [id, b] of d.nodes) if (!g.members.includes(id) && meets(frame, b)) out.push(`the frame of ${g.id} covers node ${id}`);
  }
  return out;
}

/** Within the instant, each link between two units (nodes or blocks) runs downwards. */
function levelProblems(vm: ViewModel, d: Drawn): string[] {
  const unitOf = new Map<string, string>();
  for (const g of vm.groups) for (const m of g.members) unitOf.set(m, g.id);
  const boxOf = (id: string) => (unitOf.has(id) ? d.groups.get(unitOf.get(id)!)?.box : d.nodes.get(id));
  const out: string[] = [];
  for (const e of vm.edges) {
    if (e.kind !== 'instantaneous') continue;
    if (unitOf.get(e.from) !== undefined && unitOf.get(e.from) === unitOf.get(e.to)) continue;
    const a = boxOf(e.from), b = boxOf(e.to);
    if (a && b && a[3] > b[1] + 0.5) out.push(`${e.from} is drawn at or below ${e.to}, which depends on it within the instant`);
  }
  return out;
}

/** The three instants in time order, their frames apart. */
function sliceProblems(l: Layout): string[] {
  if (!l.slices) return [];
  const [a, b, c] = ['-1', '0', '1'].map((s) => l.slices![s]);
  const out: string[] = [];
  if (a && b && a.x + a.width >= b.x) out.push('the instants t−1 and t overlap');
  if (b && c && b.x + b.width >= c.x) out.push('the instants t and t+1 overlap');
  return out;
}

function check(vm: ViewModel, l: Layout): string[] {
  const d = readFigure(buildScene(vm, l, {}));
  return [
    ...problems({ ...d, edges: d.edges.filter((e) => e.points.length) }, RULES).filter((p) => !routing(p)),
    ...frameProblems(vm, d),
    ...(vm.mode === 'mechanism' ? [] : levelProblems(vm, d)),
    ...sliceProblems(l),
  ];
}

/** Scrambled seed positions: every node of the view dropped into a small square (all overlapping). */
function scrambled(vm: ViewModel, seed: number, side = 120): Layout {
  const r = seededRandom(seed).uniform;
  const nodes: Record<string, Box> = {};
  for (const n of vm.nodes) nodes[n.id] = { x: r() * side, y: r() * side, width: n.width, height: n.height };
  return { nodes, groups: {}, width: side, height: side, source: 'instant' };
}

describe('instant placement: nodes apart, frames over their own members only, signs readable, levels top to bottom', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.id}: the ordering and the three instants at every band, from the band before and from nothing; the mechanism as drawn`, async () => {
      const m = exampleModel(ex.id);
      const found: string[] = [];
      for (const mode of ['ordering', 'unrolled'] as const) {
        let tuned: Layout | undefined, instant: Layout | undefined;
        for (const interval of bandIntervals(m)) {
          const vm = viewAt(m, interval, mode);
          const seeds: [string, Layout | undefined][] = [['nothing', undefined], ['the tuned band before', tuned], ['the instant band before', instant]];
          for (const [from, prev] of seeds) {
            const l = instantLayout(vm, prev);
            found.push(...check(vm, l).map((p) => `${mode} at ${interval.toPrecision(3)} from ${from}: ${p}`));
            if (from === 'the instant band before') instant = l;
          }
          tuned = await figureLayout(nodeElk(), vm);
        }
      }
      const vm = viewAt(m, bandIntervals(m)[0], 'mechanism');
      found.push(...check(vm, instantLayout(vm, undefined, drawnPositions(m.variables))).map((p) => `mechanism as drawn: ${p}`));
      expect(found).toEqual([]);
    }, 120_000);
  }

  it('generated models of 3 to 30 variables at three bands each, seeded by scrambled positions (seeded)', () => {
    const found: string[] = [];
    for (let k = 0; k < 16; k++) {
      const n = 3 + Math.round((27 * k) / 15);
      const m = generatedSketch(n, 100 + k);
      const xs = bandIntervals(m);
      for (const interval of [xs[0], xs[Math.floor(xs.length / 2)], xs[xs.length - 1]]) {
        for (const mode of ['ordering', 'unrolled', 'mechanism'] as const) {
          const vm = viewAt(m, interval, mode);
          const l = instantLayout(vm, scrambled(vm, k * 7 + 1));
          found.push(...check(vm, l).map((p) => `generated ${n} (seed ${100 + k}) ${mode} at ${interval.toPrecision(3)}: ${p}`));
        }
      }
    }
    expect(found).toEqual([]);
  }, 120_000);

  it('the tuned layout keeps the same rules (node gap and frames) for every example at every band', async () => {
    const found: string[] = [];
    for (const ex of EXAMPLES) {
      const m = exampleModel(ex.id);
      for (const interval of bandIntervals(m)) for (const mode of ['ordering', 'unrolled'] as const) {
        const vm = viewAt(m, interval, mode);
        found.push(...check(vm, await figureLayout(nodeElk(), vm)).map((p) => `${ex.id} ${mode} at ${interval.toPrecision(3)}: ${p}`));
      }
    }
    expect(found).toEqual([]);
  }, 120_000);

  it('separate: two nodes on one spot end at least NODE_GAP apart, side by side on one level', () => {
    const m = exampleModel('greenhouse');
    const vm = viewAt(m, 1, 'mechanism');
    const [a, b] = vm.nodes;
    const nodes = Object.fromEntries(vm.nodes.map((n, i) => [n.id, { x: i * 1000, y: 0, width: n.width, height: n.height }]));
    nodes[b.id] = { ...nodes[a.id], width: b.width, height: b.height };
    const out = separate(vm, nodes);
    const [p, q] = [out[a.id], out[b.id]];
    const gapX = Math.max(q.x - (p.x + p.width), p.x - (q.x + q.width));
    const gapY = Math.max(q.y - (p.y + p.height), p.y - (q.y + q.height));
    expect(Math.max(gapX, gapY)).toBeGreaterThanOrEqual(NODE_GAP - 0.01);
  });
});
