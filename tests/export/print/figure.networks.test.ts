/**
 * Networks at print size: the lagged network (raw and standardized) and the same-interval network of every
 * example, at four intervals, drawn for each column preset (`FigureOptions.fitTo`, as `sampled --out` and the
 * Numbers pane's export dialog pass it) keep every text at 7 pt or more, measured from the written SVG by
 * Python's XML parser (print_measure.py); where the drawing adapts (the compact ring at one column) the notes
 * say so. The same networks drawn at their screen size are under 7 pt at one column, so the test can fail.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { parseModel } from '../../../src/core/model/schema';
import { sampledOf } from '../../../src/core/numeric/answers';
import { laggedNetwork, sameIntervalNetwork, type FigureOptions } from '../../../src/export/charts';
import { printChart } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, WIDTH_PRESETS, widthPt } from '../../../src/export/print/options';
import type { El } from '../../../src/export/scene';
import { svgDocument } from '../../../src/export/svg';
import { EXAMPLES } from '../../../src/examples/index';
import { runPython } from '../../helpers/python';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));

/** Every network figure of every example at 0.1, 1, 10 and 100 time units, built with `opts`. */
function networks(opts: FigureOptions): { name: string; fig: El }[] {
  const out: { name: string; fig: El }[] = [];
  for (const ex of EXAMPLES) {
    const r = parseModel(ex.model);
    if (!r.ok) throw new Error(`${ex.id} does not load`);
    for (const interval of [0.1, 1, 10, 100]) {
      const s = sampledOf(r.model, interval);
      if (!s.ok) continue;
      const figs = { lagged: laggedNetwork(r.model, s, false, opts), standardized: laggedNetwork(r.model, s, true, opts), 'same-interval': sameIntervalNetwork(r.model, s, opts) };
      for (const [kind, fig] of Object.entries(figs)) if (fig) out.push({ name: `${ex.id} ${kind} at ${interval}`, fig });
    }
  }
  return out;
}

describe('networks at print size', () => {
  it('every example network is 7 pt or more at each column preset; the compact drawing is named in the notes', () => {
    const cases: { name: string; svg: string }[] = [];
    for (const [preset, mm] of Object.entries(WIDTH_PRESETS)) {
      const width = { mm };
      for (const { name, fig } of networks({ heading: true, caption: 'A caption', fitTo: { widthPt: widthPt(width) } })) {
        const printed = printChart(fig, { width });
        const label = `${name}, ${preset}`;
        expect(printed.notes.filter((n) => n.includes('does not fit')), label).toEqual([]);
        // adapted exactly when the wide drawing would not fit, and then it says so
        if (fig.attrs['data-adapted']) expect(printed.notes.join(' '), label).toMatch(/drawn compact .* to fit \d/);
        if (preset === 'column') expect(fig.attrs['data-adapted'], `${label}: drawn compact`).toBeTruthy();
        cases.push({ name: label, svg: svgDocument(printed.root) });
      }
    }
    const screen = networks({ heading: true }).map(({ name, fig }) => ({ name: `${name} at screen size, one column`, svg: svgDocument(printChart(fig, { width: { mm: WIDTH_PRESETS.column } }).root) }));
    const all = [...cases, ...screen];
    const measured = runPython<{ smallestPt: number; widthPt: number }[]>(MEASURE, all.map((c) => c.svg));
    expect(cases.length).toBeGreaterThan(3 * EXAMPLES.length);
    all.forEach((c, i) => {
      if (c.name.includes('screen size')) expect(measured[i].smallestPt, c.name).toBeLessThan(MIN_TEXT_PT);
      else expect(measured[i].smallestPt, c.name).toBeGreaterThanOrEqual(MIN_TEXT_PT - 1e-6);
    });
  }, 180_000);
});
