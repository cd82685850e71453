/**
 * Every line and sign of a timescale view is drawn inside the figure: inside the svg's viewBox and inside the
 * figure's own box (the part above the legend), for every example at every band, in the ordering and the
 * three instants, laid out as a file is (`figureLayout`) and as the app lays out while the interval moves
 * (ELK seeded by the band before). Lagged links between instants arc over or under their row; the figure
 * makes room for them instead of letting them run under the legend or out of the picture.
 */
import { describe, expect, it } from 'vitest';
import type { Model } from '../../src/core/model/types';
import { orderingAt } from '../../src/core/ordering/index';
import { orderingView } from '../../src/core/view/derive';
import type { ViewModel } from '../../src/core/view/types';
import { buildScene, type El } from '../../src/export/scene';
import { EXAMPLES } from '../../src/examples/index';
import { elkLayout } from '../../src/layout/elk';
import { figureLayout } from '../../src/layout/figure';
import { nodeElk } from '../../src/layout/node';
import type { Layout } from '../../src/layout/types';
import { readFigure, type R } from '../helpers/figureGeometry';
import { generatedSketch } from '../helpers/sketches';
import { bandIntervals, exampleModel } from '../helpers/examples';



const viewAt = (m: Model, interval: number, mode: 'ordering' | 'unrolled'): ViewModel =>
  orderingView(m, orderingAt(m, { interval, samples: 50 }), { mode, interval, samples: 50 });

/**
 * The figure's room in the tree as drawn: below the title (its last line's baseline and a descender, 0.3 em of
 * 16 px) or the svg's top, above the legend (or the svg's end), left of the svg's right side, right of the figure's left edge.
 */
function figureBox(root: El): R {
  const kids = (root.children ?? []).filter((c): c is El => typeof c !== 'string');
  const fig = kids.find((k) => k.attrs['data-part'] === 'figure')!;
  const m = /translate\(([-\d.]+),([-\d.]+)\)/.exec(String(fig.attrs.transform))!;
  const title = kids.find((k) => k.attrs['data-part'] === 'title');
  const titleBottom = title ? Number(title.attrs.y) + (title.children ?? []).slice(1).reduce((s, t) => s + Number((t as El).attrs.dy ?? 0), 0) + 0.3 * 16 : 0;
  const legend = kids.find((k) => k.attrs['data-part'] === 'legend');
  const below = legend ? Number(/translate\([-\d.]+,([-\d.]+)\)/.exec(String(legend.attrs.transform))![1]) : Number(root.attrs.height);
  return [Number(m[1]), titleBottom, Number(root.attrs.width), below];
}

/** Lines (every sampled point, 2 px for the stroke) and signs that leave `box`, in words. */
function outside(root: El, box: R, what: string): string[] {
  const out: string[] = [];
  const [vx, vy, vw, vh] = String(root.attrs.viewBox).split(' ').map(Number);
  for (const e of readFigure(root).edges) {
    const pts = [...e.points.flatMap((p) => [{ x: p.x - 1.5, y: p.y - 1.5 }, { x: p.x + 1.5, y: p.y + 1.5 }]), ...e.marks.flatMap((k) => [{ x: k.box[0], y: k.box[1] }, { x: k.box[2], y: k.box[3] }])];
    for (const p of pts) {
      if (p.x < vx || p.y < vy || p.x > vx + vw || p.y > vy + vh) { out.push(`${what}: ${e.id} leaves the viewBox at (${p.x.toFixed(1)}, ${p.y.toFixed(1)})`); break; }
      if (p.x < box[0] - 2 || p.y < box[1] || p.x > box[2] || p.y > box[3]) { out.push(`${what}: ${e.id} leaves the figure's box [${box.map((v) => v.toFixed(0)).join(', ')}] at (${p.x.toFixed(1)}, ${p.y.toFixed(1)})`); break; }
    }
  }
  return out;
}

async function checkAll(m: Model, name: string, intervals: number[], modes: readonly ('ordering' | 'unrolled')[]): Promise<string[]> {
  const problems: string[] = [];
  for (const mode of modes) {
    let previous: Layout | undefined;
    for (const interval of intervals) {
      const vm = viewAt(m, interval, mode);
      const fresh = await figureLayout(nodeElk(), vm);
      const seeded = previous ? await elkLayout(nodeElk(), vm, { previous }) : fresh;
      previous = seeded;
      for (const [how, layout] of [['fresh', fresh], ['seeded', seeded]] as const) {
        for (const opts of [{ caption: true }, { title: false, legend: true }]) {
          const root = buildScene(vm, layout, opts);
          problems.push(...outside(root, figureBox(root), `${name} ${mode} at ${interval.toPrecision(3)} (${how}${opts.caption ? ', file' : ', screen'})`));
        }
      }
    }
  }
  return problems;
}

describe('timescale figures: every line and sign inside the figure', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.id}: the ordering and the three instants at every band`, async () => {
      const m = exampleModel(ex.id);
      expect(await checkAll(m, ex.id, bandIntervals(m), ['ordering', 'unrolled'])).toEqual([]);
    }, 180_000);
  }

  it('generated models of 10 and 25 variables, the three instants at three bands (seeded)', async () => {
    for (const [n, seed] of [[10, 3], [25, 5]] as const) {
      const m = generatedSketch(n, seed);
      const xs = bandIntervals(m);
      expect(await checkAll(m, `generated ${n}`, [xs[0], xs[Math.floor(xs.length / 2)], xs[xs.length - 1]], ['unrolled'])).toEqual([]);
    }
  }, 300_000);

  it('the arcs of the three instants that go under their row in the evening-unrest example get room below (they did not)', async () => {
    // at this interval (5.5, the example's time unit) lagged links between instants arc under the row of nodes
    const m = exampleModel('evening-unrest');
    const vm = viewAt(m, 5.53, 'unrolled');
    const layout = await figureLayout(nodeElk(), vm);
    const root = buildScene(vm, layout, { caption: true });
    const lowest = Math.max(...readFigure(root).edges.flatMap((e) => e.points.map((p) => p.y)));
    const box = figureBox(root);
    // the figure reaches below the laid-out box, and the legend starts below the lowest line
    expect(box[3]).toBeGreaterThan(box[1] + layout.height);
    expect(lowest).toBeLessThan(box[3]);
  });
});
