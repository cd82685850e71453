import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { driftAtEquilibrium, toRows } from '../../src/core/numeric/index';
import { circleLayout, laggedNetwork, linkCurveChart, networkDiagram, sameIntervalNetwork, simulationChart, strongEdges, timeSeriesChart, type FigureOptions } from '../../src/export/charts';
import { weightText } from '../../src/present/index';
import type { El } from '../../src/export/scene';
import { svgDocument } from '../../src/export/svg';
import { curveOf, sampledOf, simulationOf, type CurveAnswer, type SampledAnswer, type SimulationAnswer } from '../../src/core/numeric/answers';
import { runPython } from '../helpers/python';
import { decimals, expectClose } from '../helpers/tolerance';

interface XNode { tag: string; ns: string; attrs: Record<string, string>; text: string; children: XNode[] }
type Parsed = { ok: true; root: XNode } | { ok: false; error: string };
const XML = fileURLToPath(new URL('./xmltree.py', import.meta.url));
/** Parsed by Python's strict XML parser (xml.etree.ElementTree). */
function parse(svgs: string[]): XNode[] {
  return runPython<Parsed[]>(XML, svgs).map((p) => {
    if (!p.ok) throw new Error(`not well-formed XML: ${p.error}`);
    return p.root;
  });
}
const all = (n: XNode): XNode[] => [n, ...n.children.flatMap(all)];
const texts = (n: XNode) => all(n).filter((e) => e.tag === 'text').map((e) => e.text);
const part = (n: XNode, name: string) => all(n).filter((e) => e.attrs['data-part'] === name);

function load(json: unknown): Model {
  const r = parseModel(json);
  if (!r.ok) throw new Error(`test model does not load: ${JSON.stringify(r.issues)}`);
  return r.model;
}

// Three states in a loop, invented for this test; the labels carry every character XML reserves.
const nasty = load({
  format: 'loopfold-model', version: 1, name: 'Tom & Jerry\'s "<loop>"', timeUnit: 'h',
  variables: [
    { id: 'a', kind: 'state', label: 'a<b & "c"', unit: '<u>', initial: 1, timescale: '2 h' },
    { id: 'b', kind: 'state', label: "it's > 3", initial: 0, timescale: '3 h' },
    { id: 'c', kind: 'state', label: ']]> &amp; x', initial: 0.5, timescale: '5 h' },
  ],
  links: [
    { from: 'a', to: 'b', kind: 'integrating', sign: '+' },
    { from: 'b', to: 'c', kind: 'integrating', sign: '-' },
    { from: 'c', to: 'a', kind: 'integrating', sign: '+' },
  ],
});
const labels = nasty.variables.map((v) => v.label!);
const run = simulationOf(nasty, { until: 10, every: 0.1 }) as SimulationAnswer;
const sampled = sampledOf(nasty, 1.5) as SampledAnswer;
const curve = (curveOf(nasty, 'a', 'c') as CurveAnswer).curve;
const caption = 'every 1 h & "more" <study>';

/** Every figure kind, drawn with the given options. */
function figures(opts: FigureOptions): El[] {
  return [
    simulationChart(nasty, run, ['a', 'b', 'c'], { interval: 1, samples: 50 }, opts),
    laggedNetwork(nasty, sampled, false, opts)!,
    sameIntervalNetwork(nasty, sampled, opts)!,
    linkCurveChart({ model: nasty, curve, breakpoints: [10, 20], current: 1.5 }, opts),
  ];
}

describe('the charts and networks as SVG', () => {
  it('are well-formed XML (Python\'s parser) that keep every label as text, with <, & and quotes escaped', () => {
    const svgs = figures({ heading: true, caption }).map(svgDocument);
    const [sim, lagged, same, link] = parse(svgs);
    for (const root of [sim, lagged, same, link]) {
      expect(root.tag).toBe('svg');
      expect(root.ns).toBe('http://www.w3.org/2000/svg');
      expect(texts(root)).toContain(caption);
    }
    for (const l of labels) {
      expect(texts(sim)).toContain(l + (l === 'a<b & "c"' ? ' (<u>)' : ''));
      // networks: each state's label on its node and in its tooltip
      for (const net of [lagged, same]) {
        expect(texts(net)).toContain(l);
        expect(all(net).some((e) => e.tag === 'title' && e.text === l)).toBe(true);
      }
    }
    expect(link.attrs['aria-label']).toBe('Lagged effect of a<b & "c" on ]]> &amp; x against the sampling interval');
    expect(texts(link).join(' ')).toContain('Lagged effect of a<b & "c" on ]]> &amp; x');
  });

  it('are self-contained: no external references, no stylesheet; every url(#…) names an element of the file', () => {
    const svgs = figures({ heading: true, caption }).map(svgDocument);
    parse(svgs).forEach((root, i) => {
      const nodes = all(root);
      expect(nodes.flatMap((e) => Object.keys(e.attrs).filter((a) => a.endsWith('href')))).toEqual([]);
      expect(nodes.some((e) => e.tag === 'style' || e.tag === 'link' || e.tag === 'image' || e.tag === 'foreignObject')).toBe(false);
      expect(svgs[i]).not.toMatch(/@import|url\((?!#)/);
      const ids = new Set(nodes.map((e) => e.attrs.id).filter(Boolean));
      for (const m of svgs[i].matchAll(/url\(#([^)]+)\)/g)) expect(ids.has(m[1])).toBe(true);
    });
  });

  it('have width and height, the viewBox of that size, and a white ground under everything', () => {
    for (const root of parse(figures({ heading: true, caption }).map(svgDocument))) {
      const w = Number(root.attrs.width), h = Number(root.attrs.height);
      expect(Number.isInteger(w) && Number.isInteger(h) && w > 0 && h > 0).toBe(true);
      expect(root.attrs.viewBox).toBe(`0 0 ${w} ${h}`);
      const ground = root.children.find((c) => c.tag === 'rect')!;
      expect(ground.attrs).toMatchObject({ x: '0', y: '0', width: String(w), height: String(h), fill: '#ffffff' });
      // the ground comes before every drawn element (only definitions may precede it)
      expect(root.children.slice(0, root.children.indexOf(ground)).every((c) => c.tag === 'defs')).toBe(true);
    }
  });

  it('carry a caption and a heading only when asked, and grow by their height', () => {
    const bare = parse(figures({}).map(svgDocument));
    const full = parse(figures({ heading: true, caption }).map(svgDocument));
    bare.forEach((root, i) => {
      expect(part(root, 'caption')).toEqual([]);
      expect(part(root, 'title')).toEqual([]);
      expect(texts(root)).not.toContain(caption);
      expect(part(full[i], 'caption')).toHaveLength(1);
      expect(part(full[i], 'caption')[0].children.map((t) => t.text).join(' ')).toBe(caption);
      expect(part(full[i], 'title')[0].children.map((t) => t.text).join(' ')).toBe(root.attrs['aria-label']);
      expect(Number(full[i].attrs.height)).toBeGreaterThan(Number(root.attrs.height));
    });
  });

  it('tell series apart in grayscale: one dash pattern per series, all in the same ink', () => {
    const times = Array.from({ length: 21 }, (_, k) => k);
    const series = Array.from({ length: 7 }, (_, i) => ({ id: `s${i}`, name: `series ${i}`, values: times.map((t) => Math.sin(t + i)) }));
    const [root] = parse([svgDocument(timeSeriesChart({ times, series, samples: [], timeUnit: 'day' }))]);
    const lines = all(root).filter((e) => e.tag === 'polyline');
    expect(lines.map((l) => l.attrs['data-series'])).toEqual(series.map((s) => s.id));
    expect(new Set(lines.map((l) => l.attrs['stroke-dasharray'] ?? 'solid')).size).toBe(7);
    expect(new Set(lines.map((l) => l.attrs.stroke)).size).toBe(1);
    for (const s of series) expect(texts(root)).toContain(s.name);
  });

  it('tell the signs of network links apart in grayscale: dashed negative, solid positive, the weight written with its sign', () => {
    const m = [[0.9, 0.5, -0.3], [-0.2, 0.8, 0], [0, 0.4, 0.7]];
    const [root] = parse([svgDocument(networkDiagram({ model: nasty, states: ['a', 'b', 'c'], matrix: m, directed: true, label: 'signs' }))]);
    const edges = all(root).filter((e) => e.attrs['data-edge']);
    expect(edges.map((e) => e.attrs['data-edge']).sort()).toEqual(['a>b', 'b>a', 'b>c', 'c>a']);
    for (const e of edges) {
      const path = e.children.find((c) => c.tag === 'path')!;
      const label = e.children.find((c) => c.tag === 'text')!.text;
      const negative = label.startsWith('−');
      expect(e.attrs['data-sign']).toBe(negative ? 'negative' : 'positive');
      if (negative) expect(path.attrs['stroke-dasharray']).toBeTruthy();
      else expect(path.attrs['stroke-dasharray']).toBeUndefined();
    }
    expect(new Set(edges.map((e) => e.children.find((c) => c.tag === 'path')!.attrs.stroke)).size).toBe(1);
  });

  it('tell the ordering\'s breakpoints (thin, dashed) from the current interval (heavy, solid) in grayscale', () => {
    const [root] = parse([svgDocument(linkCurveChart({ model: nasty, curve, breakpoints: [10, 20, 1e9], current: 1.5 }))]);
    const bps = all(root).filter((e) => e.attrs['data-breakpoint']);
    // breakpoints outside the curve's interval range are left out
    expect(bps.map((b) => Number(b.attrs['data-breakpoint']))).toEqual([10, 20]);
    const current = all(root).find((e) => e.attrs['data-current'])!.children[0];
    for (const b of bps) {
      expect(b.attrs['stroke-dasharray']).toBeTruthy();
      expect(Number(b.attrs['stroke-width'])).toBeLessThan(Number(current.attrs['stroke-width']));
    }
    expect(current.attrs['stroke-dasharray']).toBeUndefined();
  });

  it('the lagged network writes Φ(Δ) = expm(A·Δ) as SciPy computes it, row "to", column "from"; self-effects beside the nodes', () => {
    const d = driftAtEquilibrium(nasty);
    if (!d.ok) throw new Error(d.reason);
    const ref = runPython<{ phi: number[][] }>('tests/reference/numeric_cli.py', { drift: toRows(d.drift), interval: 1.5 });
    const [root] = parse([svgDocument(laggedNetwork(nasty, sampled, false)!)]);
    const at = (id: string) => d.states.indexOf(id);
    const edges = all(root).filter((e) => e.attrs['data-edge']);
    expect(edges.length).toBeGreaterThan(0);
    for (const e of edges) {
      const [from, to] = e.attrs['data-edge'].split('>');
      expect(e.children.find((c) => c.tag === 'text')!.text).toBe(weightText(ref.phi[at(to)][at(from)]));
    }
    for (const s of d.states) {
      const node = all(root).find((e) => e.attrs['data-variable'] === s)!;
      expect(texts(node)).toContain(`self ${weightText(ref.phi[at(s)][at(s)])}`);
    }
  });

  it('draws a study\'s samples: 0, Δ, 2Δ, … up to the study length or the end of the run, on every panel (common practice)', () => {
    const count = (study: { interval?: number; window?: number; samples?: number }) =>
      all(parse([svgDocument(simulationChart(nasty, run, ['a', 'c'], study))])[0]).filter((e) => e.tag === 'circle' && e.attrs.class === 'lf-chart-sample').length;
    // 10 h run, every 1 h, 50 samples: times 0…10 (11 per panel, 2 panels)
    expect(count({ interval: 1, samples: 50 })).toBe(22);
    // a 4 h window: times 0…4
    expect(count({ interval: 1, window: 4 })).toBe(10);
    // 3 samples every 2 h: a 6 h study, times 0, 2, 4, 6
    expect(count({ interval: 2, samples: 3 })).toBe(8);
    expect(count({})).toBe(0);
  });

  it('network helpers: row i, column j is the effect of j on i; weak links are left out; the circle starts at the top', () => {
    const m = [[0.9, 0.5, 0.001], [-0.2, 0.8, 0], [0, 0.3, 0.7]];
    expect(strongEdges(m, 0.02)).toEqual([
      { from: 1, to: 0, weight: 0.5 },
      { from: 0, to: 1, weight: -0.2 },
      { from: 1, to: 2, weight: 0.3 },
    ]);
    const sym = [[1, -0.4], [-0.4, 1]];
    expect(strongEdges(sym, 0.02, true)).toEqual([{ from: 1, to: 0, weight: -0.4 }]);
    const p = circleLayout(4, 200, 200, 20);
    expectClose(p[0].x, 100, decimals(9));
    expectClose(p[0].y, 20, decimals(9));
    expectClose(p[1].x, 180, decimals(9));
  });
});
