import { describe, expect, it } from 'vitest';
import { contains, grown, type Area } from '../../../src/ui/views/inView';
import { serialize } from '../../../src/export/svg';
import { buildScene, type El } from '../../../src/export/scene';
import { instantLayout } from '../../../src/layout/instant';
import { orderingView } from '../../../src/core/view/derive';
import { breakpoints, orderingAt } from '../../../src/core/ordering/index';
import { generatedSketch } from '../../helpers/sketches';

/** A generated sketch's figure at a band inside the control, in either view, with its title line (the figure starts below it), only the parts meeting `area` when given. */
function sceneOf(mode: 'ordering' | 'unrolled', area?: Area): El {
  const model = generatedSketch(160);
  const cuts = breakpoints(model, { samples: 50 }).map((b) => b.interval).sort((a, b) => a - b);
  const interval = Math.sqrt(cuts[5] * cuts[6]);
  const vm = orderingView(model, orderingAt(model, { samples: 50, interval }), { mode, interval, samples: 50 });
  return buildScene(vm, instantLayout(vm, undefined), { legend: true, title: true, ...(area ? { area: [area.x0, area.y0, area.x1, area.y1] } : {}) });
}

const figureOf = (s: El) => (s.children ?? []).find((c): c is El => typeof c !== 'string' && c.attrs['data-part'] === 'figure')!;
const partsOf = (s: El) => (figureOf(s).children ?? []).filter((c): c is El => typeof c !== 'string');
const meets = (b: readonly number[], a: Area) => b[0] <= a.x1 && b[2] >= a.x0 && b[1] <= a.y1 && b[3] >= a.y0;

/** Every point an element of `e` is drawn at: x/y, cx/cy, a rectangle's far corner, the pairs of an edge's path (M, L, Q). */
function pointsOf(e: El): [number, number][] {
  const out: [number, number][] = [];
  const n = (k: string) => (e.attrs[k] === undefined ? undefined : Number(e.attrs[k]));
  const x = n('x'), y = n('y');
  if (x !== undefined && y !== undefined) {
    out.push([x, y]);
    const w = n('width'), h = n('height');
    if (w !== undefined && h !== undefined) out.push([x + w, y + h]);
  }
  const cx = n('cx'), cy = n('cy');
  if (cx !== undefined && cy !== undefined) out.push([cx, cy]);
  const d = e.attrs.d;
  if (e.tag === 'path' && typeof d === 'string' && /^[MLQ\d\s,.-]+$/.test(d)) {
    const v = d.match(/-?\d+(\.\d+)?/g)!.map(Number);
    for (let i = 0; i + 1 < v.length; i += 2) out.push([v[i], v[i + 1]]);
  }
  for (const c of e.children ?? []) if (typeof c !== 'string') out.push(...pointsOf(c));
  return out;
}

describe('drawing only the parts of a big figure near the view', () => {
  for (const mode of ['ordering', 'unrolled'] as const) {
    it(`${mode}: every part of the figure has a box, and everything it draws lies inside it`, () => {
      const parts = partsOf(sceneOf(mode));
      expect(parts.length).toBeGreaterThan(200);
      let points = 0;
      for (const p of parts) {
        expect(p.box, String(p.attrs['data-node'] ?? p.attrs['data-edge'] ?? p.attrs['data-group'])).toBeDefined();
        const [x0, y0, x1, y1] = p.box!;
        for (const [x, y] of pointsOf(p)) {
          points++;
          expect(x).toBeGreaterThanOrEqual(x0);
          expect(x).toBeLessThanOrEqual(x1);
          expect(y).toBeGreaterThanOrEqual(y0);
          expect(y).toBeLessThanOrEqual(y1);
        }
      }
      expect(points).toBeGreaterThan(parts.length);
    });
  }

  for (const mode of ['ordering', 'unrolled'] as const) {
    it(`${mode}: built for an area, the figure holds exactly the parts of the whole figure whose box meets it, and all else as it is`, () => {
      const whole = sceneOf(mode);
      const top = figureOf(whole).box![1];
      const W = Number(whole.attrs.width), H = Number(whole.attrs.height);
      for (const area of [{ x0: 0, y0: 0, x1: W / 3, y1: H / 4 }, { x0: W / 2, y0: H / 2, x1: W / 2 + 300, y1: H / 2 + 200 }, { x0: -50, y0: top + 10, x1: 120, y1: top + 90 }]) {
        const part = sceneOf(mode, area);
        // the area is in the svg's coordinates, the parts' boxes in the figure's (below the room above it)
        const local = { x0: area.x0, y0: area.y0 - top, x1: area.x1, y1: area.y1 - top };
        const expected = partsOf(whole).filter((p) => meets(p.box!, local));
        expect(expected.length).toBeGreaterThan(0);
        expect(expected.length).toBeLessThan(partsOf(whole).length);
        expect(partsOf(part).map((p) => serialize(p))).toEqual(expected.map((p) => serialize(p)));
        // the svg's size, the figure's place and everything outside it (markers, paper, legend) do not change
        expect(part.attrs).toEqual(whole.attrs);
        expect(figureOf(part).attrs).toEqual(figureOf(whole).attrs);
        const others = (s: El) => (s.children ?? []).filter((c) => typeof c === 'string' || c.attrs['data-part'] !== 'figure').map((c) => serialize(c));
        expect(others(part)).toEqual(others(whole));
      }
      // an area over the whole figure builds all of it
      expect(serialize(sceneOf(mode, { x0: -1e6, y0: -1e6, x1: 1e6, y1: 1e6 }))).toBe(serialize(whole));
    });
  }

  it('grows an area on every side and tells whether one holds another', () => {
    const a = { x0: 10, y0: 20, x1: 110, y1: 70 };
    expect(grown(a, 0.5)).toEqual({ x0: -40, y0: -5, x1: 160, y1: 95 });
    expect(contains(grown(a, 0.5), a)).toBe(true);
    expect(contains(a, grown(a, 0.5))).toBe(false);
    expect(contains(a, { ...a, x1: 111 })).toBe(false);
  });
});
