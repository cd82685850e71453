/**
 * Charts at print size: drawn for the width (`FigureOptions.fitTo`, as the app's dialog and every chart
 * command's `--out` pass it), the time series, the link curve and the rank curve keep every text at 7 pt or
 * more at each column preset, measured from the written SVG by Python's XML parser (print_measure.py). A
 * chart drawn at its screen size would not: the same charts without `fitTo` are under 7 pt at one column.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { readFileSync } from 'node:fs';
import type { Model } from '../../../src/core/model/types';
import { picturesAt } from '../../../src/core/pictures/index';
import { linkCurveChart, timeSeriesChart, type FigureOptions } from '../../../src/export/charts';
import { rankCurveFigure } from '../../../src/export/pictures';
import { printChart } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, WIDTH_PRESETS, widthPt } from '../../../src/export/print/options';
import type { El } from '../../../src/export/scene';
import { svgDocument } from '../../../src/export/svg';
import { runPython } from '../../helpers/python';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const model = JSON.parse(readFileSync('src/examples/sleep-stress.json', 'utf8')) as Model;
const greenhouse = JSON.parse(readFileSync('src/examples/greenhouse.json', 'utf8')) as Model;
const pictures = (() => { const r = picturesAt(model, { interval: 2.4, samples: 70 }); if (!r.ok) throw new Error(r.reason); return r.pictures; })();

/** Each chart that narrows for print, by its builder (synthetic series invented for the test; the rank curve of the example). */
const CHARTS: Record<string, (o: FigureOptions) => El> = {
  'time series': (o) => timeSeriesChart({ times: [0, 1, 2, 3, 4], series: [{ id: 'a', name: 'Stress', values: [0, -0.5, -1, -0.5, 0] }, { id: 'b', name: 'Mood', values: [1, 2, 3, 2, 1] }], samples: [0, 2, 4], timeUnit: 'h' }, o),
  'link curve': (o) => linkCurveChart({ model: greenhouse, curve: { from: 'soilWater', to: 'humidity', intervals: [1, 10, 100, 1000], effect: [0.01, -0.2, 0.3, 0.05], peaks: [{ interval: 100, effect: 0.3 }] } as never, breakpoints: [30], current: 10 }, o),
  'rank curve': (o) => rankCurveFigure(model, pictures, o),
};

describe('charts at print size', () => {
  it('drawn for the width, every text is 7 pt or more at each column preset', () => {
    const cases: { name: string; svg: string; mm: number }[] = [];
    for (const [name, build] of Object.entries(CHARTS)) {
      for (const [preset, mm] of Object.entries(WIDTH_PRESETS)) {
        const width = { mm };
        const fig = printChart(build({ heading: true, caption: 'A caption', fitTo: { widthPt: widthPt(width) } }), { width });
        expect(fig.notes, `${name} at ${preset}`).toEqual([]);
        cases.push({ name: `${name} ${preset}`, svg: svgDocument(fig.root), mm });
      }
      const screen = printChart(build({ heading: true }), { width: { mm: WIDTH_PRESETS.column } });
      cases.push({ name: `${name} at screen size, one column`, svg: svgDocument(screen.root), mm: WIDTH_PRESETS.column });
    }
    const measured = runPython<{ smallestPt: number; widthPt: number }[]>(MEASURE, cases.map((c) => c.svg));
    cases.forEach((c, i) => {
      if (c.name.includes('screen size')) expect(measured[i].smallestPt, c.name).toBeLessThan(MIN_TEXT_PT);
      else expect(measured[i].smallestPt, c.name).toBeGreaterThanOrEqual(MIN_TEXT_PT - 1e-6);
    });
  }, 120_000);
});
