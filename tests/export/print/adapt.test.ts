/**
 * Wrapped rows for print: with `stagger`, the lines a wide row is broken into alternate between the left and the
 * right side of the room, so edges between rows may pass beside the nodes in between instead of arcing round the
 * figure; `printView` tries both and keeps the narrower drawing. The warehouse ordering in its first band at one
 * column (measured from the SVG by Python's XML parser): 6.9 pt with the staggered lines tried, 6.2 pt without.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import { bands } from '../../../src/core/ordering/index';
import { EXAMPLES } from '../../../src/examples/index';
import { wrapRows } from '../../../src/export/print/adapt';
import { printView, viewOf } from '../../../src/export/print/figure';
import { MARGIN } from '../../../src/layout/types';
import { svgDocument } from '../../../src/export/svg';
import { layoutInNode } from '../../../src/layout/node';
import { bandInterval } from '../../../src/report/html';
import { runPython } from '../../helpers/python';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const warehouse = (() => { const r = parseModel(EXAMPLES.find((e) => e.id === 'warehouse')!.model); if (!r.ok) throw new Error('warehouse'); return r.model; })();
const interval = bandInterval(bands(warehouse)[0]);

describe('wrapped rows for print', () => {
  it('staggered: every other line of one node sits at the right side of the room, the others at the left', async () => {
    const vm = viewOf({ model: warehouse, view: 'ordering', design: { interval } });
    const layout = await layoutInNode(vm);
    const room = 250;
    const plain = wrapRows(vm, layout, room), staggered = wrapRows(vm, layout, room, undefined, true);
    // lines by height; a line narrower than the room is at the left without stagger
    const lines = (l: typeof plain) => [...new Set(Object.values(l.nodes).map((b) => b.y))].sort((a, b) => a - b).map((y) => Object.values(l.nodes).filter((b) => b.y === y));
    for (const line of lines(plain)) expect(Math.min(...line.map((b) => b.x))).toBe(MARGIN);
    const lefts = lines(staggered).map((line) => Math.min(...line.map((b) => b.x)));
    expect(lefts.some((x) => x > MARGIN)).toBe(true);
    expect(lefts.some((x) => x === MARGIN)).toBe(true);
    // every node stays within the room
    for (const b of Object.values(staggered.nodes)) expect(b.x + b.width).toBeLessThanOrEqual(room - MARGIN + 1e-9);
    expect(Object.keys(staggered.nodes).sort()).toEqual(Object.keys(layout.nodes).sort());
  }, 120_000);

  it('the warehouse ordering at one column: above 6.8 pt with the staggered lines tried (6.2 pt without)', async () => {
    const f = await printView({ model: warehouse, view: 'ordering', design: { interval } }, { width: { mm: 85 } }, layoutInNode);
    const [m] = runPython<{ smallestPt: number }[]>(MEASURE, [svgDocument(f.root)]);
    expect(m.smallestPt).toBeGreaterThan(6.8);
  }, 120_000);
});
