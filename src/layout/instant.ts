/**
 * Placement at once, from the previous positions, while the tuned layout is
 * computed: nodes keep their place; the members of a new block gather round
 * their centre; a folded block sits at its members' centre; a new node sits
 * beside its placed neighbours. Then `separate` pushes apart whatever overlaps
 * (nodes, and blocks as a whole), keeping causal levels top to bottom, so the
 * figure on screen before the tuned layout arrives, and the mechanism at its
 * drawn positions, never hides a node or a link.
 */
import type { ViewModel, ViewNode } from '../core/view/types';
import { causalLevels } from './elk';
import { center, finishLayout, union } from './geometry';
import { GROUP_MIN_WIDTH, GROUP_PAD, SLICE_PAD, type Box, type Layout } from './types';

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
  return finishLayout(vm, separate(vm, nodes), 'instant');
}

/** Least room between two nodes, or between a node and a block it is not in (px): a link between them keeps this much line. */
export const NODE_GAP = 24;
/** Least room between the frames of two instants (px). */
const SLICE_ROOM = 40;

interface Unit { id: string; members: string[]; level: number }

/** The frame `finishLayout` draws round a block's members. */
function frameOf(boxes: readonly Box[]): Box {
  const u = union(boxes)!;
  const w = Math.max(GROUP_MIN_WIDTH, u.width + GROUP_PAD.left + GROUP_PAD.right);
  return { x: u.x + u.width / 2 - w / 2, y: u.y - GROUP_PAD.top, width: w, height: u.height + GROUP_PAD.top + GROUP_PAD.bottom };
}

const shiftBox = (b: Box, dx: number, dy: number): Box => ({ ...b, x: b.x + dx, y: b.y + dy });

/** How far a must move right (+) or left (−) and down (+) or up (−) to be `gap` apart from b; 0 when they are apart. */
function overlapOf(a: Box, b: Box, gap: number): { x: number; y: number } | undefined {
  const ox = Math.min(a.x + a.width, b.x + b.width) + gap - Math.max(a.x, b.x);
  const oy = Math.min(a.y + a.height, b.y + b.height) + gap - Math.max(a.y, b.y);
  if (ox <= 0 || oy <= 0) return undefined;
  const ca = center(a), cb = center(b);
  return { x: ca.x < cb.x || (ca.x === cb.x && a.x <= b.x) ? -ox : ox, y: ca.y <= cb.y ? -oy : oy };
}

/**
 * Pushes apart boxes that overlap or come closer than `gap`, moving each unit (a node, or a block with
 * all its members) as a whole; a unit never rises above one it depends on within the instant (`below`
 * pairs: the second stays at least `gap` under the first). Returns the offset of each unit.
 */
function pushApart(units: readonly Unit[], boxOf: (u: Unit) => Box, below: readonly (readonly [number, number])[], gap: number): { x: number; y: number }[] {
  const off = units.map(() => ({ x: 0, y: 0 }));
  const box = (i: number) => shiftBox(boxOf(units[i]), off[i].x, off[i].y);
  const clean = () => {
    for (const [a, b] of below) if (box(b).y < box(a).y + box(a).height + gap - 0.01) return false;
    for (let i = 0; i < units.length; i++) for (let j = i + 1; j < units.length; j++) if (overlapOf(box(i), box(j), gap - 0.01)) return false;
    return true;
  };
  for (let round = 0; round < 60 && !clean(); round++) {
    // levels first: push a unit down below what drives it
    for (const [a, b] of below) {
      const need = box(a).y + box(a).height + gap - box(b).y;
      if (need > 0) off[b].y += need;
    }
    for (let i = 0; i < units.length; i++) for (let j = i + 1; j < units.length; j++) {
      const o = overlapOf(box(i), box(j), gap);
      if (!o) continue;
      if (units[i].level !== units[j].level) {
        // different levels: the deeper one goes down
        const [up, down] = units[i].level < units[j].level ? [i, j] : [j, i];
        off[down].y += box(up).y + box(up).height + gap - box(down).y;
      } else if (Math.abs(o.x) <= Math.abs(o.y)) {
        off[i].x += o.x / 2; off[j].x -= o.x / 2;
      } else {
        off[i].y += o.y / 2; off[j].y -= o.y / 2;
      }
    }
  }
  if (clean()) return off;
  // did not settle: rows by level, in the order the units stand, left to right
  const order = units.map((_, i) => i).sort((a, b) => units[a].level - units[b].level || box(a).x - box(b).x);
  const levels = [...new Set(units.map((u) => u.level))].sort((a, b) => a - b);
  const origin = union(units.map((_, i) => box(i)))!;
  let y = origin.y;
  for (const lv of levels) {
    let x = origin.x, h = 0;
    for (const i of order.filter((k) => units[k].level === lv)) {
      const b = boxOf(units[i]);
      off[i] = { x: x - b.x, y: y - b.y };
      x += b.width + gap;
      h = Math.max(h, b.height);
    }
    y += h + gap;
  }
  return off;
}

/**
 * Nodes moved apart so that no two overlap or touch (at least NODE_GAP between them), no block's frame
 * covers a node that is not in it, nothing stands above what drives it within the instant (views with
 * an instant), and in the three-instant view the instants stay side by side in time order.
 */
export function separate(vm: ViewModel, nodesIn: Record<string, Box>): Record<string, Box> {
  const nodes = { ...nodesIn };
  const slices = vm.mode === 'unrolled' ? [-1, 0, 1] : [undefined];
  const levelled = vm.mode !== 'mechanism';
  for (const s of slices) {
    const inSlice = vm.nodes.filter((n) => n.slice === s && nodes[n.id]);
    const groups = vm.groups.filter((g) => g.slice === s);
    // members of each block apart from each other
    for (const g of groups) {
      const ms = g.members.filter((m) => nodes[m]);
      const off = pushApart(ms.map((m) => ({ id: m, members: [m], level: 0 })), (u) => nodes[u.id], [], NODE_GAP);
      ms.forEach((m, i) => { nodes[m] = shiftBox(nodes[m], off[i].x, off[i].y); });
    }
    // then the units: each block as a whole (its frame), each node outside blocks
    const grouped = new Set(groups.flatMap((g) => g.members));
    const units: Unit[] = [
      ...groups.map((g) => ({ id: g.id, members: g.members.filter((m) => nodes[m]), level: 0 })).filter((u) => u.members.length),
      ...inSlice.filter((n) => !grouped.has(n.id)).map((n) => ({ id: n.id, members: [n.id], level: 0 })),
    ];
    const unitOf = new Map<string, number>();
    units.forEach((u, i) => u.members.forEach((m) => unitOf.set(m, i)));
    const links = levelled ? vm.edges.filter((e) => e.kind === 'instantaneous' && unitOf.has(e.from) && unitOf.has(e.to))
      .map((e) => [unitOf.get(e.from)!, unitOf.get(e.to)!] as const).filter(([a, b]) => a !== b) : [];
    const level = causalLevels(units.map((_, i) => String(i)), links.map(([a, b]) => [String(a), String(b)] as const));
    units.forEach((u, i) => { u.level = level.get(String(i)) ?? 0; });
    // a link inside a cycle of units (which the ordering never gives) sets no order
    const below = links.filter(([a, b]) => units[a].level < units[b].level);
    const boxOf = (u: Unit) => (u.id.startsWith('block:') && groups.some((g) => g.id === u.id) ? frameOf(u.members.map((m) => nodes[m])) : nodes[u.id]);
    const off = pushApart(units, boxOf, below, NODE_GAP);
    units.forEach((u, i) => u.members.forEach((m) => { nodes[m] = shiftBox(nodes[m], off[i].x, off[i].y); }));
  }
  if (vm.mode === 'unrolled') {
    // the instants side by side in time order, their frames apart
    let right = -Infinity;
    for (const s of slices) {
      const ids = vm.nodes.filter((n) => n.slice === s && nodes[n.id]).map((n) => n.id);
      const gs = vm.groups.filter((g) => g.slice === s && g.members.some((m) => nodes[m]));
      const u = union([...ids.map((i) => nodes[i]), ...gs.map((g) => frameOf(g.members.filter((m) => nodes[m]).map((m) => nodes[m])))]);
      if (!u) continue;
      const dx = Math.max(0, right + SLICE_ROOM + SLICE_PAD.right + SLICE_PAD.left - u.x);
      for (const i of ids) nodes[i] = shiftBox(nodes[i], dx, 0);
      right = u.x + dx + u.width;
    }
  }
  return nodes;
}

/** The modeller's drawn positions by variable id, when every variable has one. */
export function drawnPositions(variables: readonly { id: string; position?: Point }[]): Record<string, Point> | undefined {
  if (!variables.length || variables.some((v) => !v.position)) return undefined;
  return Object.fromEntries(variables.map((v) => [v.id, v.position!]));
}

function avg(xs: number[]): number {
  return xs.reduce((a, b) => a + b, 0) / xs.length;
}
