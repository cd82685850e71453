/**
 * Geometric checks on the element tree a figure's builder returns (the tree
 * the screen, the files and the command line all draw): it reads back what is
 * drawn — node boxes, lines, marks (sign glyphs, weights), block headers — in
 * the figure's coordinates, and lists every rule broken, in words.
 *
 * It measures independently of the builders: text widths from DejaVu Sans'
 * advance widths (from memory: digits 1303/2048 em, full stop and space
 * 651/2048, the minus sign and plus 1716/2048; letters taken as 0.62 em),
 * lines from the path data as an SVG reader would interpret them.
 */
import type { El } from '../../src/export/scene';

export interface P { x: number; y: number }
/** [x0, y0, x1, y1] */
export type R = [number, number, number, number];

export interface Drawn {
  /** Node boxes by node id. */
  nodes: Map<string, R>;
  /** Block boxes (unfolded simultaneous blocks) and their headers (the fold button and name). */
  groups: Map<string, { box: R; header: R; members: string[] }>;
  edges: { id: string; from: string; to: string; kind?: string; points: P[]; marks: { text: string; box: R }[]; lagged: boolean; dashed: boolean; hasHead: boolean }[];
}

const EM: Record<string, number> = { '.': 651 / 2048, ' ': 651 / 2048, ',': 651 / 2048, '−': 1716 / 2048, '+': 1716 / 2048 };
export function textWidthOf(s: string, size: number): number {
  let em = 0;
  for (const ch of s) em += /[0-9]/.test(ch) ? 1303 / 2048 : EM[ch] ?? 0.62;
  return em * size;
}

function textBox(e: El, dx: number, dy: number): R {
  const size = Number(e.attrs['font-size'] ?? 13);
  const s = (e.children ?? []).filter((c): c is string => typeof c === 'string').join('');
  const w = textWidthOf(s, size);
  const x = Number(e.attrs.x ?? 0) + dx, y = Number(e.attrs.y ?? 0) + dy;
  const anchor = e.attrs['text-anchor'] ?? 'start';
  const x0 = anchor === 'middle' ? x - w / 2 : anchor === 'end' ? x - w : x;
  // glyphs of digits and signs: from the baseline up to about 0.73 em (cap height), a little below
  return [x0, y - 0.73 * size, x0 + w, y + 0.05 * size];
}

/** Points of an SVG path (M, L, Q, C, Z; absolute), curves sampled in 24 steps. */
export function pathPoints(d: string, dx = 0, dy = 0): P[] {
  const toks = d.match(/[MLQCZmlqcz]|-?\d*\.?\d+(?:e-?\d+)?/g) ?? [];
  const out: P[] = [];
  let i = 0, cmd = '';
  const num = () => Number(toks[i++]);
  let cur: P = { x: 0, y: 0 };
  while (i < toks.length) {
    if (/[A-Za-z]/.test(toks[i])) cmd = toks[i++];
    if (cmd === 'M' || cmd === 'L') { cur = { x: num() + dx, y: num() + dy }; out.push(cur); }
    else if (cmd === 'Q') {
      const c = { x: num() + dx, y: num() + dy }, e = { x: num() + dx, y: num() + dy };
      for (let k = 1; k <= 24; k++) { const t = k / 24, u = 1 - t; out.push({ x: u * u * cur.x + 2 * u * t * c.x + t * t * e.x, y: u * u * cur.y + 2 * u * t * c.y + t * t * e.y }); }
      cur = e;
    } else if (cmd === 'C') {
      const c1 = { x: num() + dx, y: num() + dy }, c2 = { x: num() + dx, y: num() + dy }, e = { x: num() + dx, y: num() + dy };
      for (let k = 1; k <= 24; k++) { const t = k / 24, u = 1 - t; out.push({ x: u * u * u * cur.x + 3 * u * u * t * c1.x + 3 * u * t * t * c2.x + t * t * t * e.x, y: u * u * u * cur.y + 3 * u * u * t * c1.y + 3 * u * t * t * c2.y + t * t * t * e.y }); }
      cur = e;
    } else if (cmd === 'Z' || cmd === 'z') { if (out.length) out.push(out[0]); }
    else throw new Error(`path command ${cmd} not read by the check`);
  }
  return out;
}

function boundsOf(ps: readonly P[]): R {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const p of ps) { x0 = Math.min(x0, p.x); y0 = Math.min(y0, p.y); x1 = Math.max(x1, p.x); y1 = Math.max(y1, p.y); }
  return [x0, y0, x1, y1];
}

function translate(e: El): P {
  const m = /translate\(\s*(-?[\d.e-]+)[ ,]+(-?[\d.e-]+)\s*\)/.exec(String(e.attrs.transform ?? ''));
  return m ? { x: Number(m[1]), y: Number(m[2]) } : { x: 0, y: 0 };
}
const kids = (e: El): El[] => (e.children ?? []).filter((c): c is El => typeof c !== 'string');

/** Read what a figure draws: a network of the Numbers pane, or a timescale view (ordering, three instants). */
export function readFigure(root: El): Drawn {
  const out: Drawn = { nodes: new Map(), groups: new Map(), edges: [] };
  const walk = (e: El, dx: number, dy: number) => {
    const t = translate(e);
    const x = dx + t.x, y = dy + t.y;
    const a = e.attrs;
    if (a['data-edge'] !== undefined) {
      const line = kids(e).find((k) => k.tag === 'path' && k.attrs.class !== 'lf-net-hit');
      const [from, to] = a['data-from'] !== undefined ? [String(a['data-from']), String(a['data-to'])] : String(a['data-edge']).split('>');
      const marks = kids(e).filter((k) => k.tag === 'text').map((k) => ({ text: (k.children ?? []).join(''), box: textBox(k, x, y) }));
      out.edges.push({
        id: String(a['data-edge']), from, to, kind: a['data-kind'] === undefined ? undefined : String(a['data-kind']),
        points: line ? pathPoints(String(line.attrs.d), x, y) : [], marks,
        lagged: a['data-kind'] === 'integrating', dashed: !!line?.attrs['stroke-dasharray'], hasHead: !!line?.attrs['marker-end'],
      });
      return;
    }
    if (a['data-node'] !== undefined || (a['data-variable'] !== undefined && a['data-node'] === undefined && !a['data-legend'])) {
      const id = String(a['data-node'] ?? a['data-variable']);
      const shapes = kids(e).filter((k) => k.tag === 'path' || k.tag === 'rect');
      const boxes = shapes.map((k) => (k.tag === 'rect'
        ? [Number(k.attrs.x ?? 0) + x, Number(k.attrs.y ?? 0) + y, Number(k.attrs.x ?? 0) + x + Number(k.attrs.width), Number(k.attrs.y ?? 0) + y + Number(k.attrs.height)] as R
        : boundsOf(pathPoints(String(k.attrs.d), x, y))));
      out.nodes.set(id, boundsOf(boxes.flatMap((b) => [{ x: b[0], y: b[1] }, { x: b[2], y: b[3] }])));
      return;
    }
    if (a['data-group'] !== undefined) {
      const r = kids(e).find((k) => k.tag === 'rect')!;
      const box: R = [Number(r.attrs.x) + x, Number(r.attrs.y) + y, Number(r.attrs.x) + x + Number(r.attrs.width), Number(r.attrs.y) + y + Number(r.attrs.height)];
      const g = out.groups.get(String(a['data-group']));
      out.groups.set(String(a['data-group']), { box, header: g?.header ?? box, members: String(a['data-members'] ?? '').split(' ') });
      return;
    }
    if (a['data-block-label'] !== undefined) {
      const parts = kids(e).flatMap((k) => (k.tag === 'rect' ? [[Number(k.attrs.x) + x, Number(k.attrs.y) + y, Number(k.attrs.x) + x + Number(k.attrs.width), Number(k.attrs.y) + y + Number(k.attrs.height)] as R] : k.tag === 'text' ? [textBox(k, x, y)] : []));
      const header = boundsOf(parts.flatMap((b) => [{ x: b[0], y: b[1] }, { x: b[2], y: b[3] }]));
      const id = String(a['data-block-label']);
      const g = out.groups.get(id);
      out.groups.set(id, { box: g?.box ?? header, header, members: g?.members ?? [] });
      return;
    }
    for (const k of kids(e)) walk(k, x, y);
  };
  walk(root, 0, 0);
  return out;
}

// ——— rules ———

const meet = (a: R, b: R, pad = 0) => a[0] < b[2] + pad && b[0] < a[2] + pad && a[1] < b[3] + pad && b[1] < a[3] + pad;
const insideR = (p: P, r: R) => p.x > r[0] && p.x < r[2] && p.y > r[1] && p.y < r[3];

/** The polyline as points every `step` px. */
export function densify(ps: readonly P[], step = 1): P[] {
  const out: P[] = [];
  for (let i = 1; i < ps.length; i++) {
    const a = ps[i - 1], b = ps[i];
    const n = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / step));
    for (let k = i === 1 ? 0 : 1; k <= n; k++) out.push({ x: a.x + ((b.x - a.x) * k) / n, y: a.y + ((b.y - a.y) * k) / n });
  }
  return out;
}

/** Length of the line drawn outside every box in `boxes` (to 1 px). */
export function lengthOutside(ps: readonly P[], boxes: readonly R[]): number {
  const d = densify(ps, 0.5);
  let s = 0;
  for (let k = 1; k < d.length; k++) {
    const m = { x: (d[k].x + d[k - 1].x) / 2, y: (d[k].y + d[k - 1].y) / 2 };
    if (!boxes.some((b) => insideR(m, b))) s += Math.hypot(d[k].x - d[k - 1].x, d[k].y - d[k - 1].y);
  }
  return s;
}

/** Whether a polyline passes through the inside of r (by points 0.5 px apart, shrunk by `inset`). */
export function crosses(ps: readonly P[], r: R, inset = 0.5): boolean {
  const s: R = [r[0] + inset, r[1] + inset, r[2] - inset, r[3] - inset];
  for (let i = 1; i < ps.length; i++) {
    const a = ps[i - 1], b = ps[i];
    if (Math.max(a.x, b.x) <= s[0] || Math.min(a.x, b.x) >= s[2] || Math.max(a.y, b.y) <= s[1] || Math.min(a.y, b.y) >= s[3]) continue;
    if (densify([a, b], 0.5).some((p) => insideR(p, s))) return true;
  }
  return false;
}

export interface Rules {
  /** Least gap between any two node boxes (0: they may touch but not overlap). */
  nodeGap: number;
  /** Least length of each line outside both its end nodes (and its end blocks). */
  minVisible: number;
  /** Marks must keep off other edges' lines. */
  marksOffLines: boolean;
}

/** Every broken rule, in words (empty when the figure is sound). */
export function problems(d: Drawn, rules: Rules): string[] {
  const out: string[] = [];
  const nodes = [...d.nodes.entries()];
  // 1. nodes apart
  for (let i = 0; i < nodes.length; i++) for (let j = i + 1; j < nodes.length; j++) {
    if (meet(nodes[i][1], nodes[j][1], rules.nodeGap)) out.push(`nodes ${nodes[i][0]} and ${nodes[j][0]} closer than ${rules.nodeGap} px`);
  }
  const memberOf = new Map<string, string>();
  for (const [id, g] of d.groups) for (const m of g.members) memberOf.set(m, id);
  const marks = d.edges.flatMap((e) => e.marks.map((m) => ({ ...m, edge: e.id })));
  for (const e of d.edges) {
    if (e.points.length < 2) { out.push(`edge ${e.id}: no line drawn`); continue; }
    const ends = [d.nodes.get(e.from), d.nodes.get(e.to)].filter((b): b is R => !!b);
    // 2. visible: a stretch of line outside its end nodes
    const vis = lengthOutside(e.points, ends);
    if (vis < rules.minVisible) out.push(`edge ${e.id}: only ${vis.toFixed(1)} px of line outside its nodes`);
    // 3. traceable: through no node but its own ends (nor a node of a block it enters or leaves)
    for (const [id, b] of nodes) {
      if (id === e.from || id === e.to) continue;
      if (crosses(e.points, b, 1)) out.push(`edge ${e.id} runs through node ${id}`);
    }
    // 4. edges that enter or leave a block do not run across its header
    for (const [gid, g] of d.groups) {
      if (crosses(e.points, g.header, 1)) out.push(`edge ${e.id} runs across the header of ${gid}`);
    }
  }
  // 5. marks: not under a node or a header, not over another mark, not over another edge's line
  for (const m of marks) {
    for (const [id, b] of nodes) if (meet(m.box, b)) out.push(`mark "${m.text}" of ${m.edge} under node ${id}`);
    for (const [gid, g] of d.groups) if (meet(m.box, g.header)) out.push(`mark "${m.text}" of ${m.edge} on the header of ${gid}`);
    if (rules.marksOffLines) for (const e of d.edges) if (e.id !== m.edge && crosses(e.points, m.box, 0.5)) out.push(`mark "${m.text}" of ${m.edge} on the line of ${e.id}`);
  }
  for (let i = 0; i < marks.length; i++) for (let j = i + 1; j < marks.length; j++) {
    if (meet(marks[i].box, marks[j].box)) out.push(`marks "${marks[i].text}" (${marks[i].edge}) and "${marks[j].text}" (${marks[j].edge}) overlap`);
  }
  return out;
}

/** Interior bend points shared by lines of different sources (lines that merge there cannot be told apart). */
export function sharedBends(d: Drawn, tol = 2): string[] {
  const out: string[] = [];
  const bends = d.edges.map((e) => e.points.slice(1, -1));
  for (let i = 0; i < d.edges.length; i++) for (let j = i + 1; j < d.edges.length; j++) {
    if (d.edges[i].from === d.edges[j].from) continue;
    const hit = bends[i].find((p) => d.edges[j].points.some((q) => Math.hypot(p.x - q.x, p.y - q.y) < tol));
    if (hit) out.push(`${d.edges[i].id} and ${d.edges[j].id} meet at a bend (${hit.x.toFixed(0)}, ${hit.y.toFixed(0)})`);
  }
  return out;
}
