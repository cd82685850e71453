/**
 * Layouts made narrower for print, so a figure fits a column without
 * shrinking its text: the three instants of the unrolled view stacked top to
 * bottom instead of side by side, and the rows of an ordering (its causal
 * levels) wrapped onto several lines. Both keep the top-to-bottom order of
 * the causal levels; edges whose ends moved are drawn straight (their routes
 * are dropped). Pure functions of a layout.
 */
import type { ViewModel } from '../../core/view/types';
import type { Box, Layout } from '../../layout/types';
import { MARGIN, SLICE_PAD } from '../../layout/types';

const shift = (b: Box, dx: number, dy: number): Box => ({ ...b, x: b.x + dx, y: b.y + dy });

/**
 * The unrolled view with its instants one under the other (t − 1 at the top); with `maxWidth`, the rows
 * inside each instant are wrapped too (see wrapRows).
 */
export function stackInstants(vm: ViewModel, layout: Layout, maxWidth = Infinity): Layout {
  const slices = layout.slices;
  if (!slices) return layout;
  const keys = Object.keys(slices).sort((a, b) => Number(a) - Number(b));
  const nodes: Record<string, Box> = {};
  const groups: Record<string, Box> = {};
  const newSlices: Record<string, Box> = {};
  let y = MARGIN;
  let width = 0;
  for (const k of keys) {
    const frame = slices[k];
    // the instant on its own, its rows wrapped to the room inside its frame
    const part: ViewModel = { ...vm, nodes: vm.nodes.filter((n) => String(n.slice ?? 0) === k), groups: vm.groups.filter((g) => String(g.slice ?? 0) === k) };
    const sub: Layout = {
      nodes: Object.fromEntries(part.nodes.filter((n) => layout.nodes[n.id]).map((n) => [n.id, shift(layout.nodes[n.id], MARGIN - frame.x - SLICE_PAD.left, MARGIN - frame.y - SLICE_PAD.top)])),
      groups: Object.fromEntries(part.groups.filter((g) => layout.groups[g.id]).map((g) => [g.id, shift(layout.groups[g.id], MARGIN - frame.x - SLICE_PAD.left, MARGIN - frame.y - SLICE_PAD.top)])),
      width: frame.width - SLICE_PAD.left - SLICE_PAD.right + 2 * MARGIN,
      height: frame.height - SLICE_PAD.top - SLICE_PAD.bottom + 2 * MARGIN,
      source: layout.source,
    };
    const inner = wrapRows(part, sub, maxWidth - 2 * MARGIN - SLICE_PAD.left - SLICE_PAD.right + 2 * MARGIN);
    // inner content spans [MARGIN, inner.width − MARGIN] × [MARGIN, inner.height − MARGIN]
    const fx = MARGIN, fy = y;
    const dx = fx + SLICE_PAD.left - MARGIN, dy = fy + SLICE_PAD.top - MARGIN;
    for (const [id, b] of Object.entries(inner.nodes)) nodes[id] = shift(b, dx, dy);
    for (const [id, b] of Object.entries(inner.groups)) groups[id] = shift(b, dx, dy);
    const fw = inner.width - 2 * MARGIN + SLICE_PAD.left + SLICE_PAD.right;
    const fh = inner.height - 2 * MARGIN + SLICE_PAD.top + SLICE_PAD.bottom;
    newSlices[k] = { x: fx, y: fy, width: fw, height: fh };
    y += fh + 60;
    width = Math.max(width, fw + 2 * MARGIN);
  }
  return { nodes, groups, slices: newSlices, width, height: y - 60 + MARGIN, source: layout.source };
}

interface Unit { ids: string[]; groupId?: string; box: Box }

/**
 * The layout with each row (the variables and blocks that share a height, a causal level) broken into
 * lines no wider than `maxWidth`, lines of one row kept together in their left-to-right order.
 * Returns the layout unchanged when every row fits.
 */
export function wrapRows(vm: ViewModel, layout: Layout, maxWidth: number, gap = 28, stagger = false): Layout {
  const inGroup = new Map<string, string>();
  for (const g of vm.groups) for (const m of g.members) inGroup.set(m, g.id);
  const units: Unit[] = [];
  for (const g of vm.groups) {
    const b = layout.groups[g.id];
    if (b) units.push({ ids: g.members.filter((m) => layout.nodes[m]), groupId: g.id, box: b });
  }
  for (const [id, b] of Object.entries(layout.nodes)) if (!inGroup.has(id)) units.push({ ids: [id], box: b });
  units.sort((a, b) => a.box.y - b.box.y || a.box.x - b.box.x);
  // rows: units whose vertical extents overlap the row's
  const rows: Unit[][] = [];
  let bottom = -Infinity;
  for (const u of units) {
    if (rows.length && u.box.y < bottom - 4) { rows[rows.length - 1].push(u); bottom = Math.max(bottom, u.box.y + u.box.height); }
    else { rows.push([u]); bottom = u.box.y + u.box.height; }
  }
  const room = maxWidth - 2 * MARGIN;
  if (layout.width <= maxWidth) return layout;
  const nodes: Record<string, Box> = {};
  const groups: Record<string, Box> = {};
  let y = MARGIN;
  let width = 0;
  let previousBottom: number | undefined;
  let lineCount = 0;
  for (const row of rows) {
    row.sort((a, b) => a.box.x - b.box.x);
    const rowTop = Math.min(...row.map((u) => u.box.y));
    // keep the room between rows the layout gave (edges and their signs run there), at least 50
    if (previousBottom !== undefined) y += Math.max(50, rowTop - previousBottom);
    previousBottom = Math.max(...row.map((u) => u.box.y + u.box.height));
    const lines: Unit[][] = [[]];
    let used = 0;
    for (const u of row) {
      const need = (used > 0 ? gap : 0) + u.box.width;
      if (used > 0 && used + need > room) { lines.push([]); used = 0; }
      lines[lines.length - 1].push(u);
      used += used > 0 ? gap + u.box.width : u.box.width;
    }
    lines.forEach((line, li) => {
      if (li > 0) y += 44;
      const lineWidth = line.reduce((s, u) => s + u.box.width, 0) + gap * (line.length - 1);
      // `stagger`: lines narrower than the room alternate between its left and right side, so that edges
      // between rows may pass beside the nodes of the rows between instead of round the figure
      let x = MARGIN + (stagger && lineCount++ % 2 === 1 ? Math.max(0, room - lineWidth) : 0);
      const h = Math.max(...line.map((u) => u.box.height));
      for (const u of line) {
        const dx = x - u.box.x, dy = y + (h - u.box.height) / 2 - u.box.y;
        for (const id of u.ids) nodes[id] = shift(layout.nodes[id], dx, dy);
        if (u.groupId) groups[u.groupId] = shift(u.box, dx, dy);
        x += u.box.width + gap;
      }
      width = Math.max(width, lineWidth + 2 * MARGIN);
      y += h;
    });
  }
  return { nodes, groups, width, height: y + MARGIN, source: layout.source };
}
