// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest';
import { patchSvg, sameEl, sameShape, type SvgHost } from '../../../src/ui/views/svgPatch';
import { buildScene, type El } from '../../../src/export/scene';
import { instantLayout } from '../../../src/layout/instant';
import { interpolateLayout } from '../../../src/layout/geometry';
import { orderingView } from '../../../src/core/view/derive';
import { breakpoints, orderingAt } from '../../../src/core/ordering/index';
import { parseModel } from '../../../src/core/model/schema';
import { EXAMPLES } from '../../../src/examples/index';
import type { Layout } from '../../../src/layout/types';
import type { Model } from '../../../src/core/model/types';
import { generatedSketch } from '../../helpers/sketches';

const modelOf = (id: string): Model => {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(`example ${id} does not parse`);
  return r.model;
};

/**
 * The figures of a model at the middle of every band, in order, as the timescale pane builds them:
 * each band placed at once from the layout of the band before (so nodes keep their places).
 */
function scenesAcrossBands(model: Model, mode: 'ordering' | 'unrolled' = 'ordering'): El[] {
  const cuts = breakpoints(model, { samples: 50 }).map((b) => b.interval).sort((a, b) => a - b);
  const inside = [cuts[0] / 2, ...cuts.map((x, i) => (i + 1 < cuts.length ? Math.sqrt(x * cuts[i + 1]) : x * 2))];
  let prev: Layout | undefined;
  return inside.map((interval) => {
    const vm = orderingView(model, orderingAt(model, { samples: 50, interval }), { mode, interval, samples: 50 });
    prev = instantLayout(vm, prev);
    return buildScene(vm, prev, { legend: true, title: false });
  });
}

/**
 * The markup of what is drawn, without the white space between elements (the file's indentation,
 * which the patcher drops where it keeps parts by key; outside text elements it draws nothing).
 */
function drawn(c: Element): string {
  const copy = c.cloneNode(true) as Element;
  const walk = (n: Node) => {
    for (const k of [...n.childNodes]) {
      if (k.nodeType === 3 && /^\s*$/.test(k.textContent ?? '') && (n as Element).tagName !== 'text' && (n as Element).tagName !== 'tspan') k.remove();
      else walk(k);
    }
  };
  walk(copy);
  return copy.innerHTML;
}

/** What a fresh page would show for a scene: the patcher's first drawing into an empty container. */
function fresh(scene: El): string {
  const c = document.createElement('div');
  patchSvg(c, { root: null }, scene);
  return drawn(c);
}

describe('the figure on screen, updated in place', () => {
  for (const id of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
    it(`${id}: after each band patched over the one before, the page is the same drawing as that band drawn afresh`, () => {
      const scenes = scenesAcrossBands(modelOf(id));
      expect(scenes.length).toBeGreaterThan(2);
      const c = document.createElement('div');
      const host: SvgHost = { root: null };
      for (const s of scenes) {
        patchSvg(c, host, s);
        expect(drawn(c)).toBe(fresh(s));
      }
      // and back down through the bands
      for (const s of [...scenes].reverse()) {
        patchSvg(c, host, s);
        expect(drawn(c)).toBe(fresh(s));
      }
    });
  }

  it('keeps the elements of the parts that did not change, and replaces only the changed ones', () => {
    const scenes = scenesAcrossBands(generatedSketch(120));
    const c = document.createElement('div');
    const host: SvgHost = { root: null };
    let kept = 0;
    let replaced = 0;
    let checked = 0;
    for (let i = 0; i + 1 < scenes.length && checked < 6; i++) {
      patchSvg(c, host, scenes[i]);
      const before = new Map([...c.querySelectorAll('[data-node]')].map((e) => [e.getAttribute('data-node')!, e]));
      const parts = (s: El) => new Map(((s.children ?? []).find((k) => typeof k !== 'string' && k.attrs['data-part'] === 'figure') as El | undefined)?.children?.filter((k): k is El => typeof k !== 'string' && k.attrs['data-node'] !== undefined).map((k) => [String(k.attrs['data-node']), k]) ?? []);
      const a = parts(scenes[i]);
      const b = parts(scenes[i + 1]);
      patchSvg(c, host, scenes[i + 1]);
      for (const [key, el] of b) {
        const old = a.get(key);
        const dom = c.querySelector(`[data-node="${CSS.escape(key)}"]`);
        if (!old || !before.has(key)) continue;
        checked++;
        if (sameShape(old, el)) {
          // same tree, or the same elements with other values: the very element stays on the page
          expect(dom).toBe(before.get(key));
          if (sameEl(old, el)) kept++;
        } else {
          expect(dom).not.toBe(before.get(key));
          replaced++;
        }
      }
    }
    expect(checked).toBeGreaterThan(0);
    expect(kept).toBeGreaterThan(0);
    // a role that changes changes a node's elements (a glyph more or less): that node is drawn afresh
    expect(replaced).toBeGreaterThan(0);
  }, 180_000);

  it('a new layout (every node moved) keeps every element and writes the new coordinates in', () => {
    const model = generatedSketch(120);
    const cuts = breakpoints(model, { samples: 50 }).map((b) => b.interval).sort((a, b) => a - b);
    const interval = Math.sqrt(cuts[2] * cuts[3]);
    const vm = orderingView(model, orderingAt(model, { samples: 50, interval }), { mode: 'ordering', interval, samples: 50 });
    const a = instantLayout(vm, undefined);
    // every node and block elsewhere, each by its own amount
    const shift = (r: Record<string, { x: number; y: number; width: number; height: number }>) =>
      Object.fromEntries(Object.entries(r).map(([k, b], i) => [k, { ...b, x: b.x + 13 + (i % 7) * 5, y: b.y + 29 + (i % 3) * 11 }]));
    const b: Layout = { ...a, nodes: shift(a.nodes), groups: shift(a.groups), width: a.width + 60, height: a.height + 70 };
    const c = document.createElement('div');
    const host: SvgHost = { root: null };
    patchSvg(c, host, buildScene(vm, a, { legend: true, title: false }));
    const before = new Map([...c.querySelectorAll('[data-node], [data-edge]')].map((e) => [`${e.getAttribute('data-node') ?? ''}|${e.getAttribute('data-edge') ?? ''}`, e]));
    expect(before.size).toBeGreaterThan(100);
    for (const l of [interpolateLayout(a, b, 0.5), b]) {
      const scene = buildScene(vm, l, { legend: true, title: false });
      patchSvg(c, host, scene);
      expect(drawn(c)).toBe(fresh(scene));
      for (const e of c.querySelectorAll('[data-node], [data-edge]')) expect(e).toBe(before.get(`${e.getAttribute('data-node') ?? ''}|${e.getAttribute('data-edge') ?? ''}`));
    }
  });

  it('changing the view (ordering to three instants and back) redraws what differs and matches a fresh drawing', () => {
    const m = modelOf('sleep-stress');
    const a = scenesAcrossBands(m, 'ordering');
    const b = scenesAcrossBands(m, 'unrolled');
    const c = document.createElement('div');
    const host: SvgHost = { root: null };
    for (let i = 0; i < a.length; i++) {
      patchSvg(c, host, a[i]);
      patchSvg(c, host, b[i]);
      expect(drawn(c)).toBe(fresh(b[i]));
      patchSvg(c, host, a[i]);
      expect(drawn(c)).toBe(fresh(a[i]));
    }
  });

  it('tells element trees apart by tag, attribute value, a missing attribute and child order', () => {
    const t = (tag: string, attrs: El['attrs'], children: (El | string)[] = []): El => ({ tag, attrs, children });
    expect(sameEl(t('g', { a: 1 }), t('g', { a: '1' }))).toBe(true);
    expect(sameEl(t('g', { a: 1, b: undefined }), t('g', { a: 1 }))).toBe(true);
    expect(sameEl(t('g', { a: 1 }), t('g', { a: 2 }))).toBe(false);
    expect(sameEl(t('g', { a: 1 }), t('g', { a: 1, b: 0 }))).toBe(false);
    expect(sameEl(t('g', {}), t('path', {}))).toBe(false);
    expect(sameEl(t('g', {}, [t('a', {}), t('b', {})]), t('g', {}, [t('b', {}), t('a', {})]))).toBe(false);
    expect(sameEl(t('text', {}, ['x']), t('text', {}, ['y']))).toBe(false);
  });

  it('tells apart trees that can be written into each other (other values only) from those that cannot', () => {
    const t = (tag: string, attrs: El['attrs'], children: (El | string)[] = []): El => ({ tag, attrs, children });
    expect(sameShape(t('g', { x: 1 }, [t('text', { y: 2 }, ['a'])]), t('g', { x: 5 }, [t('text', { y: 9 }, ['b'])]))).toBe(true);
    expect(sameShape(t('g', { x: 1, y: undefined }), t('g', { x: 2 }))).toBe(true);
    // another attribute, attributes in another order, another element, one child more
    expect(sameShape(t('g', { x: 1 }), t('g', { x: 1, y: 2 }))).toBe(false);
    expect(sameShape(t('g', { x: 1, y: 2 }), t('g', { y: 2, x: 1 }))).toBe(false);
    expect(sameShape(t('g', {}, [t('path', {})]), t('g', {}, [t('circle', {})]))).toBe(false);
    expect(sameShape(t('g', {}, [t('path', {})]), t('g', {}, [t('path', {}), t('path', {})]))).toBe(false);
    // text beside elements is drawn afresh
    expect(sameShape(t('text', {}, ['a', t('tspan', {})]), t('text', {}, ['b', t('tspan', {})]))).toBe(false);
  });
});
