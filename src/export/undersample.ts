/**
 * The integer-step mode's figure: the graph seen when a process that moves in
 * whole steps is measured every u-th step. Directed edges (an effect across
 * one measurement interval) are solid with a filled head; bidirected edges (a
 * cause shared between two measurements) are dotted with a head at each end
 * and bend away from any directed edge between the same pair; a self-loop is
 * a small loop on the outside of the variable. Built as an `El` tree with every
 * presentation attribute inline, like the Numbers pane's charts: `svgDocument`
 * writes it as a file and the app shows the same tree.
 */
import { BIDIRECTED } from '../theme/tokens';
import { bitsOf, has, type EdgeReason, type StepGraph } from '../core/undersample/graph';
import { measuredGraph } from '../core/undersample/graph';
import { CHART_STYLE as C, FONT_STACK, INK, MUTED } from '../theme/visual';
import { wrapText, type Attr, type El } from './scene';

export interface MeasuredFigureInput {
  /** The causal-step graph (rows of bit masks). */
  causal: StepGraph;
  rate: number;
  /** Reasons per edge (from `explainMeasured`), written as each edge's tooltip. */
  reasons?: readonly EdgeReason[];
  /** Draw a given measured graph instead of the one `causal` gives (a graph from a file). */
  measured?: { directed: readonly number[]; bidirected: readonly number[] };
}

export interface MeasuredFigureOptions {
  heading?: boolean;
  caption?: string;
  /** Heading text (default "Measured every u-th step (u = …)"). */
  label?: string;
  /** Give each edge a wide invisible hit path (the app makes edges focusable). */
  pickable?: boolean;
}

const PAD = 10;
const BW = 140, BH = 24;
const r1 = (x: number) => Math.round(x * 10) / 10;
const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
const BIDIRECTED_DASH = '2 3';
const BI = BIDIRECTED;

/** 2 → "2nd", 3 → "3rd", 11 → "11th", 21 → "21st". */
export function ordinal(u: number): string {
  if (u % 100 >= 11 && u % 100 <= 13) return `${u}th`;
  const k = u % 10;
  return `${u}${k === 1 ? 'st' : k === 2 ? 'nd' : k === 3 ? 'rd' : 'th'}`;
}

/** "Measured every step (u = 1)", "Measured every 3rd step (u = 3)". */
export function measuredLabel(u: number): string {
  return u === 1 ? 'Measured every step (u = 1): the causal-step graph' : `Measured every ${ordinal(u)} step (u = ${u})`;
}

function shorten(s: string): string {
  return s.length > 21 ? `${s.slice(0, 20)}…` : s;
}

/** Where the segment from a box's centre in direction (ux, uy) leaves the box (plus a gap). */
function cutOf(ux: number, uy: number, gap: number): number {
  return Math.min(Math.abs(ux) > 1e-9 ? BW / 2 / Math.abs(ux) : Infinity, Math.abs(uy) > 1e-9 ? BH / 2 / Math.abs(uy) : Infinity) + gap;
}

function head(x: number, y: number, dx: number, dy: number, color: string): El {
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len, uy = dy / len;
  const s = 8, w = 4;
  const bx = x - ux * s, by = y - uy * s;
  return el('path', { d: `M${r1(x)},${r1(y)} L${r1(bx - uy * w)},${r1(by + ux * w)} L${r1(bx + uy * w)},${r1(by - ux * w)} Z`, fill: color, stroke: color, 'stroke-width': 1, 'stroke-linejoin': 'round' });
}

/**
 * The measured graph at rate u as a figure.
 * @example svgDocument(measuredGraphFigure({ causal, rate: 2 }, { heading: true }))
 */
export function measuredGraphFigure(input: MeasuredFigureInput, opts: MeasuredFigureOptions = {}): El {
  const { causal, rate } = input;
  const n = causal.names.length;
  const h = input.measured ?? measuredGraph(causal, rate);
  const label = opts.label ?? measuredLabel(rate);
  const radius = Math.max(125, (n * (BW + 24)) / (2 * Math.PI));
  const W = Math.max(440, Math.ceil(2 * radius + BW + 80));
  const H = Math.ceil(2 * radius + BH + 110);
  const cy0 = (H - 34) / 2;
  const cx = W / 2, cy = cy0;
  const pos = causal.names.map((_, i) => {
    const a = -Math.PI / 2 + (2 * Math.PI * i) / Math.max(1, n);
    return n === 1 ? { x: cx, y: cy } : { x: cx + radius * Math.cos(a), y: cy + radius * Math.sin(a) };
  });
  const reasonOf = new Map<string, string>();
  for (const r of input.reasons ?? []) reasonOf.set(r.kind === 'directed' ? `${r.from}>${r.to}` : `${r.a}<>${r.b}`, r.text);
  const name = (i: number) => causal.names[i];
  const body: El[] = [];

  const edgeGroup = (key: string, title: string, d: string, stroke: Attr, dash: Attr, heads: El[], kind: string): El => {
    const kids: El[] = [el('title', {}, [title])];
    if (opts.pickable) kids.push(el('path', { d, class: 'lf-us-hit', fill: 'none', stroke: C.paper, 'stroke-opacity': 0, 'stroke-width': 12 }));
    kids.push(el('path', { d, class: 'lf-us-edge', fill: 'none', stroke, 'stroke-width': 1.6, 'stroke-dasharray': dash, 'stroke-linecap': kind === 'bidirected' ? 'round' : undefined }), ...heads);
    return el('g', { 'data-edge': key, 'data-kind': kind }, kids);
  };

  // directed edges, self-loops first
  for (let i = 0; i < n; i++)
    for (const j of bitsOf(h.directed[i])) {
      const key = `${name(i)}>${name(j)}`;
      const title = reasonOf.get(`${i}>${j}`) ?? `${name(i)} → ${name(j)}`;
      if (i === j) {
        // a loop on the top or bottom edge, on the side away from the centre
        const p = pos[i];
        const up = p.y <= cy + 1e-6;
        const sy0 = up ? -1 : 1;
        const side = p.x - cx > 1 ? 1 : p.x - cx < -1 ? -1 : 0;
        const ax = p.x + side * BW * 0.3;
        const y0 = p.y + sy0 * (BH / 2 + 1);
        const sx = ax - 9, ex = ax + 9, sy = y0, ey = y0;
        const c1x = sx - 12 + side * 6, c1y = y0 + sy0 * 30, c2x = ex + 12 + side * 6, c2y = y0 + sy0 * 30;
        const d = `M${r1(sx)},${r1(sy)} C${r1(c1x)},${r1(c1y)} ${r1(c2x)},${r1(c2y)} ${r1(ex)},${r1(ey)}`;
        body.push(edgeGroup(key, title, d, INK, undefined, [head(ex, ey, ex - c2x, ey - c2y, INK)], 'directed'));
        continue;
      }
      const a = pos[i], b = pos[j];
      const both = has(h.directed[j], i);
      const dx = b.x - a.x, dy = b.y - a.y, len = Math.hypot(dx, dy) || 1;
      const ux = dx / len, uy = dy / len;
      const cut = cutOf(ux, uy, 3);
      const sx = a.x + ux * cut, sy = a.y + uy * cut, ex = b.x - ux * (cut + 1), ey = b.y - uy * (cut + 1);
      const bend = both ? 12 : 0;
      const mx = (sx + ex) / 2 - uy * bend, my = (sy + ey) / 2 + ux * bend;
      const d = `M${r1(sx)},${r1(sy)} Q${r1(mx)},${r1(my)} ${r1(ex)},${r1(ey)}`;
      body.push(edgeGroup(key, title, d, INK, undefined, [head(ex, ey, ex - mx, ey - my, INK)], 'directed'));
    }
  // bidirected edges bend the other way, more when a directed edge joins the pair
  for (let i = 0; i < n; i++)
    for (const j of bitsOf(h.bidirected[i])) {
      if (j < i) continue;
      const a = pos[i], b = pos[j];
      const dx = b.x - a.x, dy = b.y - a.y, len = Math.hypot(dx, dy) || 1;
      const ux = dx / len, uy = dy / len;
      const cut = cutOf(ux, uy, 4);
      const joined = has(h.directed[i], j) || has(h.directed[j], i);
      const bend = joined ? -30 : -14;
      // ends moved off the directed edge's ends, towards the side the arc bends to
      const off = joined ? -6 : 0;
      const sx = a.x + ux * cut - uy * off, sy = a.y + uy * cut + ux * off, ex = b.x - ux * cut - uy * off, ey = b.y - uy * cut + ux * off;
      const mx = (sx + ex) / 2 - uy * bend, my = (sy + ey) / 2 + ux * bend;
      const d = `M${r1(sx)},${r1(sy)} Q${r1(mx)},${r1(my)} ${r1(ex)},${r1(ey)}`;
      const title = reasonOf.get(`${i}<>${j}`) ?? `${name(i)} ↔ ${name(j)}`;
      body.push(edgeGroup(`${name(i)}<>${name(j)}`, title, d, BI, BIDIRECTED_DASH, [head(ex, ey, ex - mx, ey - my, BI), head(sx, sy, sx - mx, sy - my, BI)], 'bidirected'));
    }
  causal.names.forEach((nm, i) => {
    const p = pos[i];
    body.push(el('g', { 'data-variable': nm, transform: `translate(${r1(p.x)},${r1(p.y)})` }, [
      el('title', {}, [nm]),
      el('rect', { x: -BW / 2, y: -BH / 2, width: BW, height: BH, rx: 5, fill: C.paper, stroke: INK, 'stroke-width': 1.3 }),
      el('text', { y: 4, 'text-anchor': 'middle', 'font-size': 11, fill: INK }, [shorten(nm)]),
    ]));
  });
  // the key
  const ky = H - 26, ky2 = H - 10;
  const key: El[] = [
    el('path', { d: `M${PAD + 4},${ky} H${PAD + 34}`, stroke: INK, 'stroke-width': 1.6, fill: 'none' }),
    head(PAD + 38, ky, 1, 0, INK),
    el('text', { x: PAD + 46, y: ky + 4, 'font-size': 10, fill: MUTED }, ['directed: an effect across one measurement interval (u steps)']),
    el('path', { d: `M${PAD + 8},${ky2} H${PAD + 34}`, stroke: BI, 'stroke-width': 1.6, 'stroke-dasharray': BIDIRECTED_DASH, 'stroke-linecap': 'round', fill: 'none' }),
    head(PAD + 38, ky2, 1, 0, BI), head(PAD + 4, ky2, -1, 0, BI),
    el('text', { x: PAD + 46, y: ky2 + 4, 'font-size': 10, fill: MUTED }, ['bidirected: a cause shared between two measurements']),
  ];
  body.push(el('g', { 'data-part': 'key' }, key));
  const empty = h.directed.every((r) => r === 0) && h.bidirected.every((r) => r === 0);
  if (empty) body.push(el('text', { x: cx, y: cy + (n === 1 ? 40 : 4), 'text-anchor': 'middle', 'font-size': 11, fill: MUTED, 'data-part': 'empty' }, [`no edge at u = ${rate}`]));

  const headLines = opts.heading ? wrapText(label, W - 2 * PAD, 6.8) : [];
  const top = headLines.length ? 10 + headLines.length * 16 : 0;
  const cap = opts.caption ? wrapText(opts.caption, W - 2 * PAD, 5.9) : [];
  const total = Math.ceil(top + H + (cap.length ? 6 + cap.length * 14 : 0));
  const children: El[] = [el('rect', { x: 0, y: 0, width: W, height: total, fill: C.paper })];
  if (headLines.length) children.push(el('text', { x: PAD, y: 18, 'font-size': 12, 'font-weight': 700, fill: C.text, 'data-part': 'title' }, headLines.map((t, i) => el('tspan', { x: PAD, dy: i ? 16 : 0 }, [t]))));
  children.push(el('g', top ? { transform: `translate(0,${top})`, 'data-part': 'figure' } : { 'data-part': 'figure' }, body));
  if (cap.length) children.push(el('g', { 'data-part': 'caption' }, cap.map((t, i) => el('text', { x: PAD, y: r1(top + H + 14 + i * 14), 'font-size': 10.5, fill: C.text }, [t]))));
  return el('svg', { xmlns: 'http://www.w3.org/2000/svg', width: W, height: total, viewBox: `0 0 ${W} ${total}`, 'font-family': FONT_STACK, role: 'img', 'aria-label': label, 'data-chart': 'measured-graph', 'data-rate': rate }, children);
}
