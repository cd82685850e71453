/**
 * The three instants (unrolled view) and the ordering at print size: every example at every band, at one column
 * (8.5 cm) and two columns (17.8 cm), the smallest text measured from the written SVG by Python's XML parser
 * (print_measure.py). The instants are stacked top to bottom whenever side by side would not fit; the links
 * beside the stack run in narrow lanes next to the nodes (scene.ts, `stackLanes`) instead of arcs that widen the
 * figure, so the figure, not its text, gives way. 7 pt is the least size (common practice for journal figures);
 * every figure under it says so in its notes, and the cases still under it are listed below with the reason.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import { bands } from '../../../src/core/ordering/index';
import { EXAMPLES } from '../../../src/examples/index';
import { printView } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, WIDTH_PRESETS } from '../../../src/export/print/options';
import { svgDocument } from '../../../src/export/svg';
import { bandInterval } from '../../../src/report/html';
import { problems, readFigure } from '../../helpers/figureGeometry';
import { runPython } from '../../helpers/python';
import { cachedLayouts } from '../../helpers/examples';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const layoutOf = cachedLayouts();

/**
 * Figures still under 7 pt (example, band number from 1, view, width): none. Measured 2026-12-05 before the lanes
 * beside the stack and beside wrapped rows: the three instants at one column 3.3–6.7 pt in 19 of 25, greenhouse's
 * third band at two columns 6.8 pt; the orderings at one column greenhouse's bands 2–4 at 5.9, 5.3, 5.7 pt and
 * warehouse's first at 6.9 pt. Now 7.0–8.0 pt everywhere.
 */
const STILL_SMALL = new Set<string>();

describe('three instants and orderings at print size', () => {
  it('every example at every band, one and two columns: 7 pt or more but for the listed cases, each figure under 7 pt saying so; the stacked instants keep the drawing rules', async () => {
    const cases: { name: string; key: string; svg: string; notes: string[]; preset: 'column' | 'two-columns'; view: 'unrolled' | 'ordering' }[] = [];
    const broken: string[] = [];
    for (const ex of EXAMPLES) {
      const r = parseModel(ex.model);
      if (!r.ok) throw new Error(ex.id);
      for (const [bi, interval] of bands(r.model).map(bandInterval).entries()) {
        for (const view of ['unrolled', 'ordering'] as const) for (const preset of ['column', 'two-columns'] as const) {
          const f = await printView({ model: r.model, view, design: { interval } }, { width: { mm: WIDTH_PRESETS[preset] } }, layoutOf);
          const name = `${ex.id} at ${interval}, ${view}, ${preset}`;
          cases.push({ name, key: `${ex.id} ${bi + 1} ${view} ${preset}`, svg: svgDocument(f.root), notes: f.notes, preset, view });
          // stacked (or, for an ordering, its rows wrapped), the lanes beside the stack pass through no node and no block's header, each line visible outside
          // its ends (an edge drawn along another's line — one source into one block — has no line of its own).
          // (Side by side, at two columns, some arcs between instants still cross nodes — greenhouse's first two
          // bands, sleep-stress's second — as before the lanes; that drawing is not the one changed here.)
          const d = readFigure(f.root);
          if (f.notes.some((n) => /stacked top to bottom|rows of the ordering are wrapped/.test(n))) broken.push(...problems({ ...d, edges: d.edges.filter((e) => e.points.length > 0) }, { nodeGap: 0, minVisible: 12, marksOffLines: false }).map((p) => `${name}: ${p}`));
        }
      }
    }
    const measured = runPython<{ smallestPt: number }[]>(MEASURE, cases.map((c) => c.svg));
    const small: string[] = [];
    const sizes: string[] = [];
    cases.forEach((c, i) => {
      const pt = measured[i].smallestPt;
      sizes.push(`${c.name}: ${pt.toFixed(2)} pt`);
      const says = c.notes.some((n) => /does not fit .* legibly/.test(n));
      expect(says, `${c.name}: ${pt.toFixed(2)} pt; ${c.notes.join('; ')}`).toBe(pt < MIN_TEXT_PT - 1e-6);
      // side by side, three instants never fit one column: they are stacked, and the notes say so
      if (c.preset === 'column' && c.view === 'unrolled') expect(c.notes.join(' '), c.name).toMatch(/stacked top to bottom/);
      if (pt < MIN_TEXT_PT - 1e-6) small.push(c.key);
    });
    expect(broken).toEqual([]);
    // every case under 7 pt is a listed one (a listed case that became legible is only reported)
    expect(small.filter((k) => !STILL_SMALL.has(k)), sizes.join('\n')).toEqual([]);
    expect(cases.filter((c) => c.view === 'unrolled').length).toBe(50);
  }, 900_000);
});
