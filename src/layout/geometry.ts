/** Small pure helpers over layouts: bounding boxes, group boxes, normalising, interpolation. */
import type { ViewModel } from '../core/view/types';
import { GROUP_MIN_WIDTH, GROUP_PAD, MARGIN, SLICE_PAD, type Box, type Layout, type Point } from './types';

export function center(b: Box): { x: number; y: number } {
  return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
}

export function union(boxes: readonly Box[]): Box | undefined {
  if (!boxes.length) return undefined;
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const b of boxes) {
    x0 = Math.min(x0, b.x); y0 = Math.min(y0, b.y);
    x1 = Math.max(x1, b.x + b.width); y1 = Math.max(y1, b.y + b.height);
  }
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** Group and slice boxes from their members, then shift everything so the figure starts at MARGIN. */
export function finishLayout(vm: ViewModel, nodes: Record<string, Box>, source: Layout['source'], groupsIn?: Record<string, Box>, edgesIn?: Record<string, Point[]>): Layout {
  const groups: Record<string, Box> = {};
  for (const g of vm.groups) {
    const given = groupsIn?.[g.id];
    const u = given ?? union(g.members.map((m) => nodes[m]).filter(Boolean));
    if (!u) continue;
    const w = Math.max(GROUP_MIN_WIDTH, u.width + GROUP_PAD.left + GROUP_PAD.right);
    groups[g.id] = given ?? { x: u.x + u.width / 2 - w / 2, y: u.y - GROUP_PAD.top, width: w, height: u.height + GROUP_PAD.top + GROUP_PAD.bottom };
  }
  let slices: Record<string, Box> | undefined;
  if (vm.mode === 'unrolled') {
    slices = {};
    const all = [...vm.nodes.map((n) => nodes[n.id]), ...Object.values(groups)].filter(Boolean);
    const whole = union(all);
    for (const s of [-1, 0, 1]) {
      const ids = vm.nodes.filter((n) => n.slice === s).map((n) => n.id);
      const gs = vm.groups.filter((g) => g.slice === s).map((g) => groups[g.id]);
      const u = union([...ids.map((i) => nodes[i]).filter(Boolean), ...gs.filter(Boolean)]);
      if (!u || !whole) continue;
      slices[String(s)] = { x: u.x - SLICE_PAD.left, y: whole.y - SLICE_PAD.top, width: u.width + SLICE_PAD.left + SLICE_PAD.right, height: whole.height + SLICE_PAD.top + SLICE_PAD.bottom };
    }
  }
  const everything = union([...Object.values(nodes), ...Object.values(groups), ...Object.values(slices ?? {})]) ?? { x: 0, y: 0, width: 0, height: 0 };
  const dx = MARGIN - everything.x;
  const dy = MARGIN - everything.y;
  const shift = (b: Box): Box => ({ x: b.x + dx, y: b.y + dy, width: b.width, height: b.height });
  const map = (r: Record<string, Box>) => Object.fromEntries(Object.entries(r).map(([k, b]) => [k, shift(b)]));
  const edges = edgesIn ? Object.fromEntries(Object.entries(edgesIn).map(([k, ps]) => [k, ps.map((p) => ({ x: p.x + dx, y: p.y + dy }))])) : undefined;
  return {
    nodes: map(nodes),
    groups: map(groups),
    ...(slices ? { slices: map(slices) } : {}),
    ...(edges ? { edges } : {}),
    width: everything.width + 2 * MARGIN,
    height: everything.height + 2 * MARGIN,
    source,
  };
}

function lerpBox(a: Box, b: Box, t: number): Box {
  return { x: a.x + (b.x - a.x) * t, y: a.y + (b.y - a.y) * t, width: a.width + (b.width - a.width) * t, height: a.height + (b.height - a.height) * t };
}

/** Cubic ease in-out on 0…1. */
export function ease(t: number): number {
  return t < 0.5 ? 4 * t * t * t : 1 - Math.pow(-2 * t + 2, 3) / 2;
}

/** Layout part way (t in 0…1) from `a` to `b`; things only in `b` are at their place in `b`. */
export function interpolateLayout(a: Layout, b: Layout, t: number): Layout {
  const mix = (ra: Record<string, Box>, rb: Record<string, Box>) => {
    const out: Record<string, Box> = {};
    for (const [k, box] of Object.entries(rb)) out[k] = ra[k] ? lerpBox(ra[k], box, t) : box;
    return out;
  };
  return {
    nodes: mix(a.nodes, b.nodes),
    groups: mix(a.groups, b.groups),
    ...(b.slices ? { slices: mix(a.slices ?? {}, b.slices) } : {}),
    width: a.width + (b.width - a.width) * t,
    height: a.height + (b.height - a.height) * t,
    source: b.source,
  };
}
