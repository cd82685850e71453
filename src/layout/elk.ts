/**
 * ELK layered layout of a view model: blocks become compound nodes, the
 * previous positions seed the order inside layers (so the picture stays put
 * when the interval moves), and the unrolled view lays out one instant and
 * repeats it. Works with any ELK instance (worker in the browser, bundled in Node).
 */
import type { ViewModel } from '../core/view/types';
import { center, finishLayout } from './geometry';
import { GROUP_MIN_WIDTH, GROUP_PAD, SLICE_GAP, SLICE_PAD, type Box, type Layout, type Point } from './types';

/** The part of elkjs's API used here. */
export interface ElkRunner {
  layout(graph: ElkGraph): Promise<ElkGraph>;
}
export interface ElkGraph {
  id: string;
  x?: number;
  y?: number;
  width?: number;
  height?: number;
  layoutOptions?: Record<string, string>;
  children?: ElkGraph[];
  edges?: ElkEdge[];
}
interface ElkEdge {
  id: string;
  sources: string[];
  targets: string[];
  container?: string;
  sections?: { startPoint: Point; endPoint: Point; bendPoints?: Point[] }[];
}

/**
 * Options measured to halve ELK's time on graphs with cycles (see STACK-NOTES):
 * one pass of thoroughness, no greedy switch, polyline routing.
 */
export const TUNED_OPTIONS: Record<string, string> = {
  'elk.algorithm': 'layered',
  'elk.layered.cycleBreaking.strategy': 'GREEDY',
  'elk.layered.thoroughness': '1',
  'elk.layered.crossingMinimization.greedySwitch.type': 'OFF',
  'elk.edgeRouting': 'POLYLINE',
};
export const DEFAULT_OPTIONS: Record<string, string> = { 'elk.algorithm': 'layered' };

const COMMON: Record<string, string> = {
  'elk.hierarchyHandling': 'SEPARATE_CHILDREN',
  'elk.spacing.nodeNode': '26',
  'elk.layered.spacing.nodeNodeBetweenLayers': '64',
  'elk.spacing.componentComponent': '40',
};

export interface ElkLayoutOptions {
  /** Previous layout: its positions seed the order within layers. */
  previous?: Layout;
  tuned?: boolean;
}

/** The ELK graph for a view model (the instant t only, for the unrolled view). */
export function elkGraphOf(vm: ViewModel, opts: ElkLayoutOptions = {}): ElkGraph {
  const unrolled = vm.mode === 'unrolled';
  const nodes = unrolled ? vm.nodes.filter((n) => n.slice === 0) : vm.nodes;
  const groups = unrolled ? vm.groups.filter((g) => g.slice === 0) : vm.groups;
  const inGroup = new Map<string, string>();
  for (const g of groups) for (const m of g.members) inGroup.set(m, g.id);
  const seed = (id: string): { x?: number; y?: number } => {
    const b = opts.previous?.nodes[id] ?? opts.previous?.nodes[id.replace(/@0$/, '')];
    return b ? { x: b.x, y: b.y } : {};
  };
  const leaf = (id: string, w: number, h: number): ElkGraph => ({ id, width: w, height: h, ...seed(id) });
  const children: ElkGraph[] = [];
  const byId = new Map(nodes.map((n) => [n.id, n]));
  for (const g of groups) {
    children.push({
      id: g.id,
      layoutOptions: {
        'elk.padding': `[top=${GROUP_PAD.top},left=${GROUP_PAD.left},bottom=${GROUP_PAD.bottom},right=${GROUP_PAD.right}]`,
        'elk.nodeSize.constraints': 'MINIMUM_SIZE',
        'elk.nodeSize.minimum': `(${GROUP_MIN_WIDTH},60)`,
      },
      children: g.members.map((m) => { const n = byId.get(m)!; return leaf(n.id, n.width, n.height); }),
      edges: [],
    });
  }
  for (const n of nodes) if (!inGroup.has(n.id)) children.push(leaf(n.id, n.width, n.height));
  // causal levels within the instant: nothing is placed above what it depends on within the instant
  // (ELK's partitions run in the layout's direction; lagged links may then run upwards)
  const level = causalLevels(children.map((c) => c.id), vm.edges.filter((e) => e.kind === 'instantaneous' && byId.has(e.from) && byId.has(e.to))
    .map((e) => [inGroup.get(e.from) ?? e.from, inGroup.get(e.to) ?? e.to] as const));
  for (const c of children) c.layoutOptions = { ...c.layoutOptions, 'elk.partitioning.partition': String(level.get(c.id) ?? 0) };
  if (opts.previous) {
    // model order = previous order within layers (left to right, the layers running down): ELK keeps it where crossings allow
    const x = (c: ElkGraph) => c.x ?? (c.children?.length ? Math.min(...c.children.map((k) => k.x ?? Infinity)) : Infinity);
    children.sort((a, b) => x(a) - x(b));
    for (const c of children) c.children?.sort((a, b) => (a.x ?? Infinity) - (b.x ?? Infinity));
  }
  // Each block is laid out on its own (inside: its members and their edges); outside, an edge to or
  // from a member stands in as an edge to the block. Laying out across levels at once costs ELK
  // about ten times as much (measured: 200 nodes, one block, 2.9 s vs 0.3 s).
  const edges: ElkEdge[] = [];
  const groupNode = new Map(children.filter((c) => c.edges).map((c) => [c.id, c]));
  const proxies = new Set<string>();
  for (const e of vm.edges) {
    if (!byId.has(e.from) || !byId.has(e.to)) continue;
    const a = inGroup.get(e.from), b = inGroup.get(e.to);
    if (a && a === b) { groupNode.get(a)!.edges!.push({ id: e.id, sources: [e.from], targets: [e.to] }); continue; }
    if (!a && !b) { edges.push({ id: e.id, sources: [e.from], targets: [e.to] }); continue; }
    const id = `proxy:${a ?? e.from}->${b ?? e.to}`;
    if ((a ?? e.from) === (b ?? e.to) || proxies.has(id)) continue;
    proxies.add(id);
    edges.push({ id, sources: [a ?? e.from], targets: [b ?? e.to] });
  }
  return {
    id: 'root',
    layoutOptions: {
      ...(opts.tuned === false ? DEFAULT_OPTIONS : TUNED_OPTIONS),
      ...COMMON,
      'elk.direction': 'DOWN',
      'elk.partitioning.activate': 'true',
      // seeded: keep the previous left-to-right order within layers instead of minimising crossings
      // afresh (measured: 200 nodes 0.3 s, against 0.7–2 s for ELK's semi-interactive or model-order modes)
      ...(opts.previous ? { 'elk.layered.crossingMinimization.strategy': 'INTERACTIVE' } : {}),
    },
    children,
    edges,
  };
}

/**
 * The causal level of each unit (a node, or a block as a whole) from the links within the instant:
 * 0 for a unit nothing within the instant drives, else one more than the highest of its drivers
 * (longest path; a link inside a cycle, which the ordering never gives between units, is ignored).
 */
export function causalLevels(units: readonly string[], links: readonly (readonly [string, string])[]): Map<string, number> {
  const out = new Map<string, string[]>();
  const indeg = new Map<string, number>(units.map((u) => [u, 0]));
  const seen = new Set<string>();
  for (const [a, b] of links) {
    if (a === b || !indeg.has(a) || !indeg.has(b) || seen.has(`${a}>${b}`)) continue;
    seen.add(`${a}>${b}`);
    (out.get(a) ?? out.set(a, []).get(a)!).push(b);
    indeg.set(b, indeg.get(b)! + 1);
  }
  const level = new Map<string, number>(units.map((u) => [u, 0]));
  const queue = units.filter((u) => indeg.get(u) === 0);
  for (let k = 0; k < queue.length; k++) {
    const u = queue[k];
    for (const v of out.get(u) ?? []) {
      level.set(v, Math.max(level.get(v)!, level.get(u)! + 1));
      indeg.set(v, indeg.get(v)! - 1);
      if (indeg.get(v) === 0) queue.push(v);
    }
  }
  return level;
}

/** Absolute boxes from ELK's result (children are relative to their parent). */
function readBoxes(g: ElkGraph, dx: number, dy: number, out: Record<string, Box>): void {
  for (const c of g.children ?? []) {
    const x = dx + (c.x ?? 0);
    const y = dy + (c.y ?? 0);
    out[c.id] = { x, y, width: c.width ?? 0, height: c.height ?? 0 };
    if (c.children?.length) readBoxes(c, x, y, out);
  }
}

/**
 * Lay out a view model with ELK. `await elkLayout(elk, vm)` → positions of every node and block.
 * The unrolled view: the instant t is laid out, the instants t−1 and t+1 are copies beside it.
 */
export async function elkLayout(elk: ElkRunner, vm: ViewModel, opts: ElkLayoutOptions = {}): Promise<Layout> {
  const graph = elkGraphOf(vm, opts);
  const done = await elk.layout(graph);
  const boxes: Record<string, Box> = {};
  readBoxes(done, 0, 0, boxes);
  const nodes: Record<string, Box> = {};
  const groups: Record<string, Box> = {};
  const groupIds = new Set(vm.groups.map((g) => g.id));
  // routes of the edges laid out (edges into and out of blocks: their stand-in's route, then straight to the member);
  // sections are relative to the node whose edge list holds them
  const routes: Record<string, Point[]> = {};
  const proxyRoutes: Record<string, Point[]> = {};
  const take = (list: ElkEdge[] | undefined, dx: number, dy: number) => {
    for (const e of list ?? []) {
      const sec = e.sections?.[0];
      if (!sec || (e.sections?.length ?? 0) > 1) continue;
      const ps = [sec.startPoint, ...(sec.bendPoints ?? []), sec.endPoint].map((p) => ({ x: p.x + dx, y: p.y + dy }));
      if (e.id.startsWith('proxy:')) proxyRoutes[e.id] = ps;
      else routes[e.id] = ps;
    }
  };
  take(done.edges, 0, 0);
  for (const c of done.children ?? []) if (c.edges?.length) take(c.edges, boxes[c.id]?.x ?? 0, boxes[c.id]?.y ?? 0);
  // an edge into or out of a block is its stand-in's route, from or to the block's border (edges
  // from one source to several members of one block are one line)
  const memberOf = new Map<string, string>();
  for (const c of graph.children ?? []) if (c.edges) for (const k of c.children ?? []) memberOf.set(k.id, c.id);
  for (const e of vm.edges) {
    const a = memberOf.get(e.from), b = memberOf.get(e.to);
    if (!a && !b) continue;
    const route = proxyRoutes[`proxy:${a ?? e.from}->${b ?? e.to}`];
    if (!route || !boxes[e.from] || !boxes[e.to]) continue;
    // the stand-in's route from border to border: a link into a block is drawn into the block (it
    // drives the block's equations, solved together), a link out of one leaves from the block
    routes[e.id] = [...route];
  }
  if (vm.mode !== 'unrolled') {
    for (const n of vm.nodes) if (boxes[n.id]) nodes[n.id] = boxes[n.id];
    for (const g of vm.groups) if (boxes[g.id]) groups[g.id] = boxes[g.id];
    return finishLayout(vm, nodes, 'elk', groups, routes);
  }
  const sliceRoutes: Record<string, Point[]> = {};
  const width = Math.max(0, ...Object.values(boxes).map((b) => b.x + b.width)) + SLICE_PAD.left + SLICE_PAD.right;
  for (const [id, b] of Object.entries(boxes)) {
    const base = id.replace(/@0$/, '');
    for (const s of [-1, 0, 1]) {
      const target = `${base}@${s}`;
      const box = { ...b, x: b.x + (s + 1) * (width + SLICE_GAP) };
      if (groupIds.has(target)) groups[target] = box;
      else nodes[target] = box;
    }
  }
  // within-instant edges: the route at t, repeated in each instant
  for (const [id, ps] of Object.entries(routes)) {
    for (const s of [-1, 0, 1]) sliceRoutes[id.replace(/@0(?=->|:)/g, `@${s}`)] = ps.map((p) => ({ x: p.x + (s + 1) * (width + SLICE_GAP), y: p.y }));
  }
  return finishLayout(vm, nodes, 'elk', groups, sliceRoutes);
}

/** Where the line from the centre of `b` towards `p` crosses the border of `b`. */
export function borderPoint(b: Box, p: Point): Point {
  const c = center(b);
  const dx = p.x - c.x, dy = p.y - c.y;
  if (dx === 0 && dy === 0) return c;
  const t = Math.min(dx !== 0 ? b.width / 2 / Math.abs(dx) : Infinity, dy !== 0 ? b.height / 2 / Math.abs(dy) : Infinity);
  return { x: c.x + dx * Math.min(1, t), y: c.y + dy * Math.min(1, t) };
}

/** Whether two layouts put every shared node within `tol` px of each other (after their own normalisation). */
export function sameCenters(a: Layout, b: Layout, tol = 0.5): boolean {
  for (const [k, box] of Object.entries(a.nodes)) {
    const o = b.nodes[k];
    if (!o) continue;
    const p = center(box), q = center(o);
    if (Math.abs(p.x - q.x) > tol || Math.abs(p.y - q.y) > tol) return false;
  }
  return true;
}
