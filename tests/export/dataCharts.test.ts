import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import type { Panel } from '../../src/core/data/panel';
import { intervalHistogram, missingness, personSeries } from '../../src/core/data/overview';
import { lagCurves } from '../../src/core/fit/lagCurve';
import { intervalHistogramChart, lagCurveChart, missingnessChart, personSeriesChart } from '../../src/export/dataCharts';
import type { El } from '../../src/export/scene';
import { svgDocument } from '../../src/export/svg';
import { runPython } from '../helpers/python';

interface XNode { tag: string; ns: string; attrs: Record<string, string>; text: string; children: XNode[] }
type Parsed = { ok: true; root: XNode } | { ok: false; error: string };
const XML = fileURLToPath(new URL('./xmltree.py', import.meta.url));
/** Parsed by Python's strict XML parser (xml.etree.ElementTree). */
function parse(els: El[]): XNode[] {
  return runPython<Parsed[]>(XML, els.map(svgDocument)).map((p) => {
    if (!p.ok) throw new Error(`not well-formed XML: ${p.error}`);
    return p.root;
  });
}
const all = (n: XNode): XNode[] => [n, ...n.children.flatMap(all)];

const model = { variables: [{ id: 'stress', kind: 'state' as const, label: 'Stress' }, { id: 'mood', kind: 'state' as const, label: 'Mood' }] };
// Hand-made diary (the same as tests/core/data/overview.test.ts): hand counts below (common practice).
const panel: Panel = {
  variables: ['stress', 'mood'],
  timeUnit: 'h',
  persons: [
    { id: 'a', time: Float64Array.from([0, 3, 9, 24, 27]), day: Int32Array.from([0, 0, 0, 1, 1]), prompt: Int32Array.from([0, 1, 3, 0, 1]), values: Float64Array.from([1, 2, NaN, 3, 4, NaN, 5, 6, 7, NaN]) },
    { id: 'b', time: Float64Array.from([0, 3, 6]), day: Int32Array.from([0, 0, 0]), values: Float64Array.from([1, NaN, 2, NaN, 3, NaN]) },
  ],
};

describe('data figures', () => {
  const figs = [
    personSeriesChart(model, personSeries(panel, 0), 'h', { heading: true, caption: 'Invented data.' }),
    intervalHistogramChart(intervalHistogram(panel, 4), 'h'),
    missingnessChart(model, missingness(panel)),
    lagCurveChart(model, lagCurves(['stress', 'mood'], [[-1, 0], [0.5, -1]], [[-0.9, 0], [0.4, -1.1]], 'stress', 'mood', [3, 6, 15, 3, 3, 3], { interval: 3, estimate: 0.2, low: 0.1, high: 0.3 }), 'h'),
  ];
  const [series, hist, miss, lag] = parse(figs);

  it('are well-formed SVG with a name for assistive technology', () => {
    for (const f of [series, hist, miss, lag]) {
      expect(f.tag).toBe('svg');
      expect(f.attrs.role).toBe('img');
      expect(f.attrs['aria-label']).toBeTruthy();
    }
    expect(series.attrs['aria-label']).toBe('Person a: Stress, Mood at each occasion');
  });

  it('the series draws a dot per value and breaks the line at the night and at missing cells', () => {
    const stress = all(series).find((n) => n.attrs['data-panel'] === 'stress')!;
    expect(all(stress).filter((n) => n.tag === 'circle')).toHaveLength(4); // stress has 4 values
    // stress 1, NaN, 4 | night | 5, 7: runs [4] alone and [5, 7] — one line of two points (lines need two points).
    expect(all(stress).filter((n) => n.tag === 'polyline').map((n) => n.attrs.points.split(' ').length)).toEqual([2]);
    expect(all(stress).filter((n) => n.attrs['data-night'] === '3')).toHaveLength(1);
  });

  it('the histogram stacks every interval once, by kind', () => {
    const bars = all(hist).filter((n) => n.attrs['data-kind']);
    const byKind = (k: string) => bars.filter((b) => b.attrs['data-kind'] === k).reduce((s, b) => s + Number(b.attrs['data-count']), 0);
    expect([byKind('within a day'), byKind('skipped prompt'), byKind('overnight')]).toEqual([4, 1, 1]);
    expect(all(hist).some((n) => n.attrs['data-median'] === '3')).toBe(true);
  });

  it('the missingness bars hold the share of occasions without a value', () => {
    expect(all(miss).filter((n) => n.attrs['data-share']).map((n) => Number(n.attrs['data-share']))).toEqual([1 / 8, 5 / 8]);
  });

  it('the lag chart has the sketch, the fitted curve, the VAR estimate and the data\'s intervals', () => {
    expect(all(lag).filter((n) => n.attrs['data-curve']).map((n) => n.attrs['data-curve'])).toEqual(['sketch', 'fitted']);
    expect(all(lag).some((n) => n.attrs['data-part'] === 'estimate')).toBe(true);
    expect(all(lag).some((n) => n.attrs['data-part'] === 'data-intervals')).toBe(true);
  });
});
