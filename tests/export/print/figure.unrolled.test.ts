/**
 * The three instants (unrolled view) at print size: every example at every band, at one column (8.5 cm) and two
 * columns (17.8 cm), measured from the written SVG by Python's XML parser (print_measure.py). The instants are
 * stacked top to bottom whenever side by side would not fit, blocks folded after that, and when lines that arc
 * beside the stack still widen the drawing, the rows are laid out again in a narrower room (a full, half or
 * quarter step) — the figure gives way, not its text. A figure still under 7 pt says so in its notes.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import { bands } from '../../../src/core/ordering/index';
import type { ViewModel } from '../../../src/core/view/types';
import { EXAMPLES } from '../../../src/examples/index';
import { printView } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, WIDTH_PRESETS } from '../../../src/export/print/options';
import { svgDocument } from '../../../src/export/svg';
import { layoutInNode } from '../../../src/layout/node';
import type { Layout } from '../../../src/layout/types';
import { bandInterval } from '../../../src/report/html';
import { runPython } from '../../helpers/python';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const layouts = new Map<string, Promise<Layout>>();
const layoutOf = (vm: ViewModel): Promise<Layout> => {
  const key = JSON.stringify([vm.mode, vm.nodes.map((n) => [n.id, n.width]), vm.edges.map((e) => e.id)]);
  let l = layouts.get(key);
  if (!l) { l = layoutInNode(vm); layouts.set(key, l); }
  return l;
};

describe('three instants at print size', () => {
  it('every example at every band: stacked at one column, 7 pt or more at two columns but for at most one, each figure under 7 pt saying so', async () => {
    const cases: { name: string; svg: string; notes: string[]; preset: 'column' | 'two-columns' }[] = [];
    for (const ex of EXAMPLES) {
      const r = parseModel(ex.model);
      if (!r.ok) throw new Error(ex.id);
      for (const interval of bands(r.model).map(bandInterval)) {
        for (const preset of ['column', 'two-columns'] as const) {
          const f = await printView({ model: r.model, view: 'unrolled', design: { interval } }, { width: { mm: WIDTH_PRESETS[preset] } }, layoutOf);
          cases.push({ name: `${ex.id} at ${interval}, ${preset}`, svg: svgDocument(f.root), notes: f.notes, preset });
        }
      }
    }
    const measured = runPython<{ smallestPt: number }[]>(MEASURE, cases.map((c) => c.svg));
    const small: string[] = [];
    cases.forEach((c, i) => {
      const pt = measured[i].smallestPt;
      const says = c.notes.some((n) => /does not fit .* legibly/.test(n));
      expect(says, `${c.name}: ${pt.toFixed(2)} pt; ${c.notes.join('; ')}`).toBe(pt < MIN_TEXT_PT - 1e-6);
      // side by side, three instants never fit one column: they are stacked, and the notes say so
      if (c.preset === 'column') expect(c.notes.join(' '), c.name).toMatch(/stacked top to bottom/);
      else if (pt < MIN_TEXT_PT - 1e-6) small.push(`${c.name} ${pt.toFixed(2)} pt`);
    });
    // measured 2026-12-05: greenhouse's third band at 6.8 pt (lines arcing beside the stack); all others 7.6–8.0 pt
    // (before the narrower rooms were tried: lake 6.6 pt and greenhouse 6.8 pt in two bands)
    expect(small.length, small.join('\n')).toBeLessThanOrEqual(1);
  }, 600_000);
});
