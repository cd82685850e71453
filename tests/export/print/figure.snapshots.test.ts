/**
 * Snapshots of each kind of figure in each palette, as normalised SVG (ids
 * re-indexed, numbers rounded to whole units): a change to the drawing or a
 * palette shows as a diff of the file under __snapshots__/ (vitest writes the
 * new one beside it with -u). Every figure also uses one minus sign (U+2212)
 * in its text, never a hyphen before a digit.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { EXAMPLES } from '../../../src/examples/index';
import { linkCurveChart, networkDiagram, timeSeriesChart } from '../../../src/export/charts';
import { printChart, printView } from '../../../src/export/print/figure';
import { printMultiples } from '../../../src/export/print/multiples';
import { textRuns } from '../../../src/export/print/transform';
import type { El } from '../../../src/export/scene';
import { svgDocument } from '../../../src/export/svg';
import { layoutInNode } from '../../../src/layout/node';
import { PALETTES } from '../../../src/theme/palettes';

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(id);
  return r.model;
}

/** ids numbered in order of appearance, numbers rounded to whole units. */
export function normalise(svg: string): string {
  const ids = new Map<string, string>();
  const idOf = (id: string) => { if (!ids.has(id)) ids.set(id, `id${ids.size}`); return ids.get(id)!; };
  return svg
    .replace(/\bid="([^"]+)"/g, (_m, id: string) => `id="${idOf(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_m, id: string) => `url(#${idOf(id)})`)
    .replace(/-?\d+\.\d+/g, (n) => String(Math.round(Number(n))));
}

const model = example('sleep-stress');
const greenhouse = example('greenhouse');

/** Each kind of figure, built in the default colours (synthetic data for the charts: invented for the test). */
const KINDS: Record<string, () => Promise<El>> = {
  ordering: async () => (await printView({ model, view: 'ordering', design: { interval: 24 }, caption: true }, { width: { mm: 178 } }, (vm) => layoutInNode(vm))).root,
  unrolled: async () => (await printView({ model, view: 'unrolled', design: { interval: 24 } }, { width: { mm: 178 } }, (vm) => layoutInNode(vm))).root,
  multiples: async () => (await printMultiples({ model, intervals: [3, 28 * 24], design: { samples: 50 } }, { width: { mm: 178 } }, (vm) => layoutInNode(vm))).root,
  'time-series': async () => timeSeriesChart({ times: [0, 1, 2, 3, 4], series: [{ id: 'a', name: 'Stress', values: [0, -0.5, -1, -0.5, 0] }], samples: [0, 2, 4], timeUnit: 'h' }, { heading: true }),
  network: async () => networkDiagram({ model: greenhouse, states: ['airTemp', 'humidity', 'soilWater'], matrix: [[0.5, -0.2, 0], [0.1, 0.6, 0.3], [0, -0.4, 0.9]], directed: true, label: 'Lagged network' }, { heading: true }),
  // the compact drawing for one column (8.5 cm = 240.9 pt), names on two lines
  'network-compact': async () => networkDiagram({ model: greenhouse, states: ['airTemp', 'humidity', 'soilWater', 'dust'], matrix: [[0.5, -0.2, 0, -0.05], [0.1, 0.6, 0.3, 0], [0, -0.4, 0.9, 0], [0, 0, 0, 0.99]], directed: true, label: 'Lagged network' }, { heading: true, fitTo: { widthPt: (85 * 72) / 25.4 } }),
  'link-curve': async () => linkCurveChart({ model: greenhouse, curve: { from: 'soilWater', to: 'humidity', intervals: [1, 10, 100, 1000], effect: [0.01, -0.2, 0.3, 0.05], peaks: [{ interval: 100, effect: 0.3 }] } as never, breakpoints: [30], current: 10 }, { heading: true }),
};

describe('figures per kind and palette (normalised SVG snapshots)', () => {
  for (const [kind, build] of Object.entries(KINDS)) {
    it(`${kind}: one file per palette; minus signs are U+2212`, async () => {
      const root = await build();
      for (const palette of PALETTES) {
        const fig = kind === 'ordering' || kind === 'unrolled' || kind === 'multiples'
          ? root
          : printChart(root, { palette, width: { mm: 114 } }).root;
        const printed = kind === 'ordering' || kind === 'unrolled' || kind === 'multiples' ? printChart(fig, { palette }).root : fig;
        await expect(normalise(svgDocument(printed))).toMatchFileSnapshot(`__snapshots__/${kind}-${palette}.svg`);
        for (const r of textRuns(printed)) expect(r.text, `${kind}: "${r.text}"`).not.toMatch(/(^|[\s(=])-\d/);
      }
    }, 300_000);
  }
});
