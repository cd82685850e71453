/**
 * The timescale views (the ordering and the three instants; the screen, the
 * exported files and `loopfold render` all draw this tree) checked
 * geometrically on the element tree, laid out as a file is (`figureLayout`),
 * for every example at every band and for generated models of up to 60 variables.
 */
import { describe, expect, it } from 'vitest';
import type { Model } from '../../src/core/model/types';
import { orderingAt } from '../../src/core/ordering/index';
import { orderingView } from '../../src/core/view/derive';
import type { ViewModel } from '../../src/core/view/types';
import { buildScene } from '../../src/export/scene';
import { EXAMPLES } from '../../src/examples/index';
import { figureLayout } from '../../src/layout/figure';
import { nodeElk } from '../../src/layout/node';
import { problems, readFigure, sharedBends, type Drawn } from '../helpers/figureGeometry';
import { generatedSketch } from '../helpers/sketches';
import { bandIntervals, exampleModel } from '../helpers/examples';

// signs are kept off other lines where a free spot exists; in a crowded block one may still sit on a line (see docs/dev/figures-geometry.md)
const RULES = { nodeGap: 0, minVisible: 12, marksOffLines: false };



function viewAt(m: Model, interval: number, mode: 'ordering' | 'unrolled'): ViewModel {
  return orderingView(m, orderingAt(m, { interval, samples: 50 }), { mode, interval, samples: 50 });
}

/** Within the instant, nothing is drawn above what it depends on: each within-instant link between two units (nodes or blocks) runs downwards. */
function levelProblems(vm: ViewModel, d: Drawn): string[] {
  const unitOf = new Map<string, string>();
  for (const g of vm.groups) for (const m of g.members) unitOf.set(m, g.id);
  const boxOf = (id: string) => (unitOf.has(id) ? d.groups.get(unitOf.get(id)!)?.box : d.nodes.get(id));
  const out: string[] = [];
  for (const e of vm.edges) {
    if (e.kind !== 'instantaneous') continue;
    if (unitOf.get(e.from) !== undefined && unitOf.get(e.from) === unitOf.get(e.to)) continue;
    const a = boxOf(e.from), b = boxOf(e.to);
    if (!a || !b) continue;
    if (a[3] > b[1] + 0.5) out.push(`${e.from} is drawn at or below ${e.to}, which depends on it within the instant`);
  }
  return out;
}

/** Lagged links are told apart from within-instant ones: dashed with a hollow head. */
function laggedProblems(d: Drawn): string[] {
  return d.edges.filter((e) => e.points.length && e.lagged !== e.dashed).map((e) => `${e.id}: ${e.lagged ? 'lagged but solid' : 'within the instant but dashed'}`);
}

async function check(vm: ViewModel, what: string, known: string[] = []): Promise<void> {
  const layout = await figureLayout(nodeElk(), vm);
  const d = readFigure(buildScene(vm, layout, { caption: true }));
  // every edge of the view is drawn: a line of its own, or the line of an edge from the same source into the same block
  const drawnIds = new Set(d.edges.map((e) => e.id));
  for (const e of vm.edges) expect(drawnIds.has(e.id), `${what}: ${e.id} drawn`).toBe(true);
  const lined = d.edges.filter((e) => e.points.length > 0);
  const along = readAlong(buildScene(vm, layout, {}));
  for (const [id, lead] of along) {
    const a = vm.edges.find((e) => e.id === id)!, b = vm.edges.find((e) => e.id === lead)!;
    expect(a.from === b.from || a.to === b.to, `${what}: ${id} drawn along ${lead}, which shares an end`).toBe(true);
  }
  const drawn = { ...d, edges: lined };
  expect([...problems(drawn, RULES), ...sharedBends(drawn), ...(vm.mode === 'ordering' ? levelProblems(vm, d) : []), ...laggedProblems(drawn)], what).toEqual(known);
}

function readAlong(root: ReturnType<typeof buildScene>): Map<string, string> {
  const out = new Map<string, string>();
  const walk = (e: ReturnType<typeof buildScene>) => {
    if (e.attrs['data-along']) out.set(String(e.attrs['data-edge']), String(e.attrs['data-along']));
    for (const c of e.children ?? []) if (typeof c !== 'string') walk(c);
  };
  walk(root);
  return out;
}

describe('timescale figures: nodes apart, every edge visible and traceable, signs readable, levels top to bottom', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.id}: the ordering and the three instants at every band`, async () => {
      const m = exampleModel(ex.id);
      for (const interval of bandIntervals(m)) for (const mode of ['ordering', 'unrolled'] as const) await check(viewAt(m, interval, mode), `${ex.id} ${mode} at ${interval}`);
    }, 120_000);
  }

  // a sign with no free spot beside its line goes to the nearest free spot round it (it used to fall under a node)
  const KNOWN: Record<string, string[]> = {};
  it('generated models of 10 to 60 variables, at three bands each (seeded)', async () => {
    for (const [n, seed] of [[10, 3], [25, 5], [40, 11], [60, 7]] as const) {
      const m = generatedSketch(n, seed);
      const xs = bandIntervals(m);
      for (const interval of [xs[0], xs[Math.floor(xs.length / 2)], xs[xs.length - 1]]) {
        const what = `generated ${n} at ${interval}`;
        await check(viewAt(m, interval, 'ordering'), what, KNOWN[what]);
      }
    }
  }, 300_000);

  it('an input that drives a simultaneous block is one line into the block, not one line to each member', async () => {
    const m = exampleModel('sleep-stress');
    // at 1 day stress (settled) and rumination form a block driven by workload (src/examples/sleep-stress.json)
    const vm = viewAt(m, 24, 'ordering');
    const block = vm.groups.find((g) => g.variables.includes('stress') && g.variables.includes('rumination'));
    expect(block).toBeDefined();
    const layout = await figureLayout(nodeElk(), vm);
    const d = readFigure(buildScene(vm, layout, {}));
    const fromWorkload = d.edges.filter((e) => e.from === 'workload' && e.points.length);
    expect(fromWorkload).toHaveLength(1);
    const end = fromWorkload[0].points[fromWorkload[0].points.length - 1];
    const g = d.groups.get(block!.id)!.box;
    // it ends at the block's border, outside its header
    expect(end.y).toBeLessThanOrEqual(g[1] + 1);
    // and both directions of the loop inside the block are drawn, apart
    const inside = d.edges.filter((e) => [e.from, e.to].every((v) => v === 'stress' || v === 'rumination'));
    expect(inside.map((e) => `${e.from}>${e.to}`).sort()).toEqual(['rumination>stress', 'stress>rumination']);
    const [p, q] = inside.map((e) => e.points);
    const gap = Math.min(...p.map((a) => Math.min(...q.map((b) => Math.hypot(a.x - b.x, a.y - b.y)))));
    expect(gap).toBeGreaterThanOrEqual(4);
  });
});
