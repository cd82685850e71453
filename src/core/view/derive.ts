/**
 * From a model and its ordering at one interval to the view drawn on screen
 * and in exported figures: nodes with roles, simultaneous blocks (folded or
 * not), edges within the instant and across time.
 */
import type { Link, Model, VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { labelOf } from '../../present/labels';
import type { EdgeKind, Ordering, OrderingBlock, Role } from './contract';
import { SLICES, type Slice, type ViewEdge, type ViewGroup, type ViewMode, type ViewModel, type ViewNode, type ViewNodeId } from './types';
import { designAxis } from '../study/convert';

/** Approximate text width of the node font (13 px DejaVu Sans averages about 7.4 px a glyph: measured in Chromium). */
export const CHAR_WIDTH = 7.4;
export const NODE_HEIGHT = 38;

/** The stable key of a simultaneous block: its variables, sorted, joined. Survives changes of band. */
export function blockKey(variables: readonly VariableId[]): string {
  return [...variables].sort().join('+');
}

/** Blocks drawn as a group: more than one variable determined together. */
export function simultaneousBlocks(ordering: Ordering): OrderingBlock[] {
  return ordering.blocks.filter((b) => b.variables.length > 1);
}

export function nodeSize(label: string, glyph: boolean): { width: number; height: number } {
  return { width: Math.max(64, Math.round(label.length * CHAR_WIDTH + 30 + (glyph ? 16 : 0))), height: NODE_HEIGHT };
}

const GLYPH_ROLES: ReadonlySet<Role> = new Set(['settled', 'frozen', 'held']);

export interface ViewOptions {
  mode: ViewMode;
  /** Keys of blocks shown folded into one node. */
  folded?: ReadonlySet<string> | readonly string[];
  interval?: number;
  window?: number;
  samples?: number;
}

function linkIndex(model: Model): Map<string, Link> {
  const m = new Map<string, Link>();
  for (const l of model.links) m.set(`${l.from}>${l.to}`, l);
  return m;
}


/** A title naming the view and the timescale: "Ordering every 3 h · study 50 samples (6.25 days)". */
export function viewTitle(model: Model, opts: Pick<ViewOptions, 'mode' | 'interval' | 'window' | 'samples'>): string {
  if (opts.mode === 'mechanism' || opts.interval === undefined) return `${model.name} — mechanism as drawn`;
  const u = model.timeUnit;
  const every = `every ${formatDuration(opts.interval, u)}`;
  const study = studyText(model, opts.interval, opts.window, opts.samples);
  return `${model.name} — ${opts.mode === 'unrolled' ? 'three instants' : 'ordering'} ${every} · ${study}`;
}

/** "study 2 weeks (112 samples)" or "study 50 samples (6.25 days)". */
export function studyText(model: Model, interval: number, window?: number, samples?: number): string {
  const u = model.timeUnit;
  const axis = designAxis(model, { window, samples });
  if (axis.window !== undefined) return `study ${formatDuration(axis.window, u)} (${Math.max(1, Math.round(axis.window / interval))} samples)`;
  return `study ${axis.samples} samples (${formatDuration(axis.samples * interval, u)})`;
}

/**
 * The mechanism as drawn: every variable with its kind as its role, every link with its kind.
 * `mechanismView(model).edges.length === model.links.length`.
 */
export function mechanismView(model: Model): ViewModel {
  const nodes: ViewNode[] = model.variables.map((v) => {
    const label = v.label ?? v.id;
    return { id: v.id, variable: v.id, label, kind: v.kind, role: v.kind, ...nodeSize(label, false) };
  });
  const seen = new Map<string, number>();
  const edges: ViewEdge[] = model.links.map((l) => {
    const base = `${l.from}->${l.to}:${l.kind}`;
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    return { id: n ? `${base}#${n}` : base, from: l.from, to: l.to, kind: l.kind, simultaneous: false, sign: l.sign, weight: l.weight, pairs: [{ from: l.from, to: l.to }] };
  });
  return finish(model, { mode: 'mechanism' }, nodes, [], edges, []);
}

/**
 * The ordering at one interval, as a view: roles from the ordering, one group
 * per simultaneous block (or one node when folded), the ordering's edges.
 * In the 'unrolled' mode the same picture is repeated for the instants t−1, t, t+1,
 * with within-instant edges inside each and integrating edges from one to the next.
 */
export function orderingView(model: Model, ordering: Ordering, opts: ViewOptions): ViewModel {
  if (opts.mode === 'mechanism') return mechanismView(model);
  const folded = new Set(opts.folded ?? []);
  const links = linkIndex(model);
  const blocks = simultaneousBlocks(ordering);
  const blockOf = new Map<VariableId, OrderingBlock>();
  for (const b of blocks) for (const v of b.variables) blockOf.set(v, b);
  // one key per block (sorting its variables for every member would cost O(m² log m) in a big block)
  const keyOf = new Map<OrderingBlock, string>(blocks.map((b) => [b, blockKey(b.variables)]));
  const slices: (Slice | undefined)[] = opts.mode === 'unrolled' ? [...SLICES] : [undefined];
  const at = (id: string, s: Slice | undefined) => (s === undefined ? id : `${id}@${s}`);
  const shownFolded = blocks.map((b) => keyOf.get(b)!).filter((k) => folded.has(k));

  /** The node a variable is drawn in at a slice (itself, or its folded block). */
  const nodeOf = (v: VariableId, s: Slice | undefined): ViewNodeId => {
    const b = blockOf.get(v);
    if (b) {
      const k = keyOf.get(b)!;
      if (folded.has(k)) return at(`block:${k}`, s);
    }
    return at(v, s);
  };

  const nodes: ViewNode[] = [];
  const groups: ViewGroup[] = [];
  for (const s of slices) {
    for (const v of model.variables) {
      const b = blockOf.get(v.id);
      const k = b ? keyOf.get(b) : undefined;
      if (k && folded.has(k)) continue;
      const role: Role = ordering.roles[v.id] ?? v.kind;
      const label = v.label ?? v.id;
      nodes.push({ id: at(v.id, s), variable: v.id, label, kind: v.kind, role, block: k, slice: s, ...nodeSize(label, GLYPH_ROLES.has(role)) });
    }
    for (const b of blocks) {
      const k = keyOf.get(b)!;
      const id = at(`block:${k}`, s);
      if (folded.has(k)) {
        const label = foldedLabel(model, b.variables);
        const size = nodeSize(label, false);
        nodes.push({ id, label, kind: 'derived', role: 'derived', block: k, count: b.variables.length, slice: s, width: size.width + 24, height: NODE_HEIGHT + 8 });
      } else {
        groups.push({ id, key: k, members: b.variables.map((v) => at(v, s)), variables: [...b.variables], equations: [...b.equations], level: b.level, slice: s });
      }
    }
  }

  const byKey = new Map<string, ViewEdge>();
  const add = (from: ViewNodeId, to: ViewNodeId, kind: EdgeKind, simultaneous: boolean, pair: { from: VariableId; to: VariableId }, carry = false) => {
    if (from === to) return; // inside a folded block
    const id = `${from}->${to}:${kind}`;
    const old = byKey.get(id);
    if (old) {
      old.pairs.push(pair);
      old.simultaneous = old.simultaneous && simultaneous;
      return;
    }
    const link = links.get(`${pair.from}>${pair.to}`);
    byKey.set(id, { id, from, to, kind, simultaneous, sign: link?.sign, weight: link?.weight, pairs: [pair], ...(carry ? { carry } : {}) });
  };
  for (const e of ordering.edges) {
    const pair = { from: e.from, to: e.to };
    if (opts.mode === 'ordering' || e.kind === 'instantaneous') {
      for (const s of slices) add(nodeOf(e.from, s), nodeOf(e.to, s), e.kind, !!e.simultaneous, pair);
    } else {
      add(nodeOf(e.from, -1), nodeOf(e.to, 0), e.kind, false, pair);
      add(nodeOf(e.from, 0), nodeOf(e.to, 1), e.kind, false, pair);
    }
  }
  // Inside a block every link the modeller drew between two members acts within the instant (the
  // block's equations are solved together): both directions of a loop are drawn, not only the
  // dependencies the ordering's pairing of equations to variables happens to name.
  for (const b of blocks) {
    const members = new Set(b.variables);
    for (const l of model.links) {
      if (l.from === l.to || !members.has(l.from) || !members.has(l.to)) continue;
      for (const s of slices) add(nodeOf(l.from, s), nodeOf(l.to, s), 'instantaneous', true, { from: l.from, to: l.to });
    }
  }
  if (opts.mode === 'unrolled') {
    // A dynamic state carries its own value to the next instant.
    for (const v of model.variables) {
      if ((ordering.roles[v.id] ?? v.kind) !== 'state') continue;
      const pair = { from: v.id, to: v.id };
      add(nodeOf(v.id, -1), nodeOf(v.id, 0), 'integrating', false, pair, true);
      add(nodeOf(v.id, 0), nodeOf(v.id, 1), 'integrating', false, pair, true);
    }
  }
  return finish(model, opts, nodes, groups, [...byKey.values()], shownFolded);
}

/** "3 together: Mood, Rumination, Sleep debt" (at most three names, then "+n"). */
export function foldedLabel(model: Model, variables: readonly VariableId[]): string {
  const names = variables.map((v) => labelOf(model, v));
  const shown = names.slice(0, 3).join(', ');
  return `${variables.length} together: ${shown}${names.length > 3 ? ` +${names.length - 3}` : ''}`;
}

function finish(model: Model, opts: Pick<ViewOptions, 'mode' | 'interval' | 'window' | 'samples'>, nodes: ViewNode[], groups: ViewGroup[], edges: ViewEdge[], folded: string[]): ViewModel {
  const ROLE_ORDER: Role[] = ['input', 'state', 'derived', 'settled', 'frozen', 'held'];
  const roles = new Set(nodes.filter((n) => n.count === undefined).map((n) => n.role));
  const kinds = new Set(edges.map((e) => e.kind));
  return {
    mode: opts.mode,
    title: viewTitle(model, opts),
    timeUnit: model.timeUnit,
    interval: opts.mode === 'mechanism' ? undefined : opts.interval,
    window: opts.mode === 'mechanism' ? undefined : opts.window,
    samples: opts.mode === 'mechanism' ? undefined : opts.samples,
    nodes,
    groups,
    edges,
    folded,
    rolesShown: ROLE_ORDER.filter((r) => roles.has(r)),
    kindsShown: (['instantaneous', 'integrating'] as EdgeKind[]).filter((k) => kinds.has(k)),
    caution: model.caution,
  };
}
