/**
 * Placement at once, from the previous positions, while the tuned layout is
 * computed: nodes keep their place; the members of a new block gather round
 * their centre; a folded block sits at its members' centre; a new node sits
 * beside its placed neighbours. No overlap removal: the tuned layout follows.
 */
import type { ViewModel, ViewNode } from '../core/view/types';
import { center, finishLayout } from './geometry';
import type { Box, Layout } from './types';

type Point = { x: number; y: number };

const baseOf = (id: string) => id.replace(/@-?\d+$/, '');
const sliceOf = (id: string) => { const m = /@(-?\d+)$/.exec(id); return m ? Number(m[1]) : undefined; };

/** The previous centre of a node id: itself, the same variable in another view, or its folded block. */
function previousCenter(prev: Layout, n: ViewNode, sliceShift: number): Point | undefined {
  const direct = prev.nodes[n.id];
  if (direct) return center(direct);
  const base = baseOf(n.id);
  const s = n.slice ?? 0;
  const candidates = [base, `${base}@0`, `${base}@${s}`];
  for (const c of candidates) {
    const b = prev.nodes[c];
    if (b) {
      const from = sliceOf(c) ?? 0;
      const p = center(b);
      return { x: p.x + (n.slice !== undefined ? (s - from) * sliceShift : -from * sliceShift), y: p.y };
    }
  }
  // a member of a block that was folded: the folded node's centre
  if (n.block) {
    for (const c of [`block:${n.block}`, `block:${n.block}@${s}`, `block:${n.block}@0`]) {
      const b = prev.nodes[c];
      if (b) return { ...center(b), x: center(b).x + (n.slice !== undefined ? (s - (sliceOf(c) ?? 0)) * sliceShift : 0) };
    }
  }
  return undefined;
}

/**
 * Positions for `vm` seeded by `prev` (any earlier layout, of any view of the same model).
 * Without `prev`, the modeller's drawn positions (`drawn`, by variable id), else a grid.
 */
export function instantLayout(vm: ViewModel, prev: Layout | undefined, drawn: Record<string, Point> = {}): Layout {
  const centers = new Map<string, Point>();
  const sliceShift = prev ? (prev.slices ? (prev.width) / 3 : prev.width + 110) : 400;
  for (const n of vm.nodes) {
    let p = prev ? previousCenter(prev, n, sliceShift) : undefined;
    if (!p && n.variable && drawn[n.variable]) p = { x: drawn[n.variable].x + n.width / 2 + (n.slice ?? 0) * 900, y: drawn[n.variable].y + n.height / 2 };
    if (!p && n.count !== undefined) {
      // a folded block: its members' centre
      const members = n.block!.split('+');
      const pts = members.map((m) => prev?.nodes[n.slice === undefined ? m : `${m}@${n.slice}`] ?? prev?.nodes[m]).filter((b): b is Box => !!b).map(center);
      if (pts.length) p = { x: avg(pts.map((q) => q.x)), y: avg(pts.map((q) => q.y)) };
    }
    if (p) centers.set(n.id, p);
  }
  // members of a block that is new here gather round their centre
  for (const g of vm.groups) {
    if (prev?.groups[g.id]) continue;
    const pts = g.members.map((m) => centers.get(m)).filter((p): p is Point => !!p);
    if (!pts.length) continue;
    const c = { x: avg(pts.map((q) => q.x)), y: avg(pts.map((q) => q.y)) };
    const r = Math.max(50, (g.members.length * 46) / (2 * Math.PI));
    g.members.forEach((m, i) => {
      const a = (2 * Math.PI * i) / g.members.length - Math.PI / 2;
      centers.set(m, { x: c.x + r * 1.6 * Math.cos(a), y: c.y + r * Math.sin(a) });
    });
  }
  // new nodes beside their placed neighbours, else on a row below everything
  const neighbours = new Map<string, string[]>();
  for (const e of vm.edges) {
    (neighbours.get(e.from) ?? neighbours.set(e.from, []).get(e.from)!).push(e.to);
    (neighbours.get(e.to) ?? neighbours.set(e.to, []).get(e.to)!).push(e.from);
  }
  let maxY = centers.size ? Math.max(...[...centers.values()].map((p) => p.y)) + 80 : 40;
  let rowX = 40;
  let placedBeside = 0;
  for (const n of vm.nodes) {
    if (centers.has(n.id)) continue;
    const near = (neighbours.get(n.id) ?? []).map((m) => centers.get(m)).filter((p): p is Point => !!p);
    if (near.length) {
      placedBeside++;
      centers.set(n.id, { x: avg(near.map((q) => q.x)) + 60, y: avg(near.map((q) => q.y)) + 50 + 12 * (placedBeside % 4) });
    } else {
      centers.set(n.id, { x: rowX + n.width / 2, y: maxY });
      rowX += n.width + 30;
      if (rowX > 1400) { rowX = 40; maxY += 70; }
    }
  }
  const nodes: Record<string, Box> = {};
  for (const n of vm.nodes) {
    const c = centers.get(n.id)!;
    nodes[n.id] = { x: c.x - n.width / 2, y: c.y - n.height / 2, width: n.width, height: n.height };
  }
  return finishLayout(vm, nodes, 'instant');
}

/** The modeller's drawn positions by variable id, when every variable has one. */
export function drawnPositions(variables: readonly { id: string; position?: Point }[]): Record<string, Point> | undefined {
  if (!variables.length || variables.some((v) => !v.position)) return undefined;
  return Object.fromEntries(variables.map((v) => [v.id, v.position!]));
}

function avg(xs: number[]): number {
  return xs.reduce((a, b) => a + b, 0) / xs.length;
}
