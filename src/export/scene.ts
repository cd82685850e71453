/**
 * The one drawing of a view: a small tree of SVG elements built from the
 * view model and its layout. `svg.ts` writes it as a self-contained SVG
 * string (export, command line); the app turns the same tree into React
 * elements, so the screen and the exported figure are one picture.
 */
import type { ViewEdge, ViewModel, ViewNode } from '../core/view/types';
import type { Box, Layout } from '../layout/types';
import { ACCUMULATOR_FLOOR, BLOCK_STYLE, FONT_STACK, INK, KIND_SHAPE, LINK_STYLE, MUTED, PAPER, ROLE_STYLE, shapePath } from '../theme/visual';
import { WHITE } from '../theme/tokens';

export type Attr = string | number | undefined;
export interface El {
  tag: string;
  attrs: Record<string, Attr>;
  children?: (El | string)[];
  /**
   * Not written to files: for a part of the figure, the box [x0, y0, x1, y1] it is drawn in (in the
   * figure's coordinates); for the figure itself, where its coordinates start ([x, y], the first two).
   * The app draws only the parts near what is in view of a big figure.
   */
  box?: readonly number[];
}

export interface SceneOptions {
  /** A caption under the figure stating the interval and the study length. */
  caption?: boolean;
  /** Draw the legend of the roles and link kinds present (default true). */
  legend?: boolean;
  /** Draw the title line (default true). */
  title?: boolean;
  /** The caption text (the caller words the interval and study; default: the view's title). */
  captionText?: string;
  /**
   * Build only the figure's parts whose box meets this area ([x0, y0, x1, y1] in the svg's coordinates):
   * the app's view of a big figure. The svg's size and everything outside the figure stay as without it.
   */
  area?: readonly number[];
}

const HEADER = 40;
const SLICE_NAMES: Record<string, string> = { '-1': 't − 1', '0': 't', '1': 't + 1' };

const r1 = (x: number) => Math.round(x * 10) / 10;

/** Break text into lines of at most `width` px, at an average glyph width of `em` px (estimate). */
export function wrapText(text: string, width: number, em: number): string[] {
  const max = Math.max(12, Math.floor(width / em));
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line && (line + ' ' + word).length > max) { lines.push(line); line = word; }
    else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}
const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
/** The box around points, grown by `pad` (a sign glyph, an arrowhead). */
function around(ps: readonly { x: number; y: number }[], pad: number): [number, number, number, number] {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const p of ps) { x0 = Math.min(x0, p.x); y0 = Math.min(y0, p.y); x1 = Math.max(x1, p.x); y1 = Math.max(y1, p.y); }
  return [x0 - pad, y0 - pad, x1 + pad, y1 + pad];
}
/** A layout box as [x0, y0, x1, y1], grown by `pad`. */
const outline = (b: Box, pad: number) => around([b, { x: b.x + b.width, y: b.y + b.height }], pad);

function markerDefs(): El {
  const head = (id: string, color: string, hollow: boolean) =>
    el('marker', { id, viewBox: '0 0 12 12', refX: 11, refY: 6, markerWidth: 11, markerHeight: 11, markerUnits: 'userSpaceOnUse', orient: 'auto-start-reverse' }, [
      el('path', { d: 'M1,1.5 L11,6 L1,10.5 Z', fill: hollow ? PAPER : color, stroke: color, 'stroke-width': 1.4, 'stroke-linejoin': 'round' }),
    ]);
  return el('defs', {}, [
    head('lf-head-instantaneous', LINK_STYLE.instantaneous.stroke, false),
    head('lf-head-integrating', LINK_STYLE.integrating.stroke, true),
    head('lf-head-simultaneous', BLOCK_STYLE.stroke, false),
  ]);
}

/** Where the segment from the centre of `b` towards (tx, ty) leaves the box. */
function exitPoint(b: Box, tx: number, ty: number, pad = 2): { x: number; y: number } {
  const cx = b.x + b.width / 2, cy = b.y + b.height / 2;
  const dx = tx - cx, dy = ty - cy;
  if (dx === 0 && dy === 0) return { x: cx, y: cy };
  const sx = dx === 0 ? Infinity : (b.width / 2 + pad) / Math.abs(dx);
  const sy = dy === 0 ? Infinity : (b.height / 2 + pad) / Math.abs(dy);
  const s = Math.min(sx, sy);
  return { x: cx + dx * s, y: cy + dy * s };
}

/** An edge along a routed polyline (ELK's route, border to border). */
function routedEdgeEl(e: ViewEdge, ps: readonly { x: number; y: number }[]): El {
  const style = LINK_STYLE[e.kind];
  const sim = e.simultaneous;
  const color = sim ? BLOCK_STYLE.stroke : style.stroke;
  const width = 1.3 + 1.5 * Math.min(1, Math.abs(e.weight ?? 0.5));
  const d = ps.map((p, i) => `${i ? 'L' : 'M'}${r1(p.x)},${r1(p.y)}`).join(' ');
  const kids: (El | string)[] = [
    el('title', {}, [`${e.pairs.map((p) => `${p.from} → ${p.to}`).join(', ')}: ${style.label}${sim ? ', within a simultaneous block' : ''}`]),
    el('path', { d, fill: 'none', stroke: color, 'stroke-width': r1(width), 'stroke-dasharray': style.dash, 'stroke-linejoin': 'round', 'marker-end': `url(#lf-head-${sim ? 'simultaneous' : e.kind})` }),
  ];
  if (e.sign && ps.length >= 2) {
    const p0 = ps[ps.length - 2], p1 = ps[ps.length - 1];
    const len = Math.hypot(p1.x - p0.x, p1.y - p0.y) || 1;
    const t = Math.max(0.3, 1 - 22 / len);
    const nx = -(p1.y - p0.y) / len, ny = (p1.x - p0.x) / len;
    kids.push(el('text', { x: r1(p0.x + (p1.x - p0.x) * t + nx * 9), y: r1(p0.y + (p1.y - p0.y) * t + ny * 9 + 4), 'text-anchor': 'middle', 'font-size': 13, 'font-weight': 700, fill: color, stroke: PAPER, 'stroke-width': 3, 'paint-order': 'stroke' }, [e.sign === '-' ? '−' : '+']));
  }
  return el('g', { 'data-edge': e.id, 'data-kind': e.kind, 'data-from': e.from, 'data-to': e.to, ...(sim ? { 'data-simultaneous': 'true' } : {}), ...(e.carry ? { 'data-carry': 'true' } : {}) }, kids);
}

/** A part of the figure: the box it is drawn in, and its elements, made only when they are drawn. */
interface Part {
  box: readonly number[];
  make(): El;
}

/**
 * The geometry of an edge now, its elements when asked for. `reach.top`: the highest point the edge's
 * line or sign reaches (arcs over a row rise above it); it counts for the figure's size, drawn or not.
 */
function edgePart(e: ViewEdge, a: Box, b: Box, bend: number, reach: { top: number }): Part {
  const ac = { x: a.x + a.width / 2, y: a.y + a.height / 2 };
  const bc = { x: b.x + b.width / 2, y: b.y + b.height / 2 };
  const len = Math.hypot(bc.x - ac.x, bc.y - ac.y) || 1;
  const nx = -(bc.y - ac.y) / len, ny = (bc.x - ac.x) / len;
  const mid = { x: (ac.x + bc.x) / 2 + nx * bend, y: (ac.y + bc.y) / 2 + ny * bend };
  const p0 = exitPoint(a, mid.x, mid.y);
  const p1 = exitPoint(b, mid.x, mid.y, 3);
  const ctrl = { x: 2 * mid.x - (p0.x + p1.x) / 2, y: 2 * mid.y - (p0.y + p1.y) / 2 };
  const d = bend === 0 ? `M${r1(p0.x)},${r1(p0.y)} L${r1(p1.x)},${r1(p1.y)}` : `M${r1(p0.x)},${r1(p0.y)} Q${r1(ctrl.x)},${r1(ctrl.y)} ${r1(p1.x)},${r1(p1.y)}`;
  // the curve's lowest y: at its ends or at its turning point B(t*), t* = (p0 − c) / (p0 − 2c + p1)
  const den = p0.y - 2 * ctrl.y + p1.y;
  const ts = bend !== 0 && Math.abs(den) > 1e-9 ? (p0.y - ctrl.y) / den : -1;
  const peak = ts > 0 && ts < 1 ? (1 - ts) * (1 - ts) * p0.y + 2 * (1 - ts) * ts * ctrl.y + ts * ts * p1.y : Infinity;
  reach.top = Math.min(reach.top, p0.y, p1.y, peak);
  // the sign glyph near the head, off the line
  const t = 0.78;
  const q = bend === 0
    ? { x: p0.x + (p1.x - p0.x) * t, y: p0.y + (p1.y - p0.y) * t }
    : { x: (1 - t) * (1 - t) * p0.x + 2 * (1 - t) * t * ctrl.x + t * t * p1.x, y: (1 - t) * (1 - t) * p0.y + 2 * (1 - t) * t * ctrl.y + t * t * p1.y };
  if (e.sign) reach.top = Math.min(reach.top, q.y + ny * 10 - 8);
  // a quadratic curve stays inside the triangle of its ends and control point
  const box = around(bend === 0 ? [p0, p1] : [p0, p1, ctrl], 24);
  return { box, make: () => edgeEl(e, d, q, nx, ny) };
}

function edgeEl(e: ViewEdge, d: string, q: { x: number; y: number }, nx: number, ny: number): El {
  const style = LINK_STYLE[e.kind];
  const sim = e.simultaneous;
  const color = sim ? BLOCK_STYLE.stroke : style.stroke;
  const width = 1.3 + 1.5 * Math.min(1, Math.abs(e.weight ?? 0.5));
  const kids: (El | string)[] = [
    el('title', {}, [`${e.pairs.map((p) => `${p.from} → ${p.to}`).join(', ')}: ${style.label}${sim ? ', within a simultaneous block' : ''}`]),
    // the same attributes as a routed edge's line (round joins draw nothing on a line without corners): a
    // figure whose edges go from straight to routed on screen has its values written in, not its parts parsed again
    el('path', { d, fill: 'none', stroke: color, 'stroke-width': r1(width), 'stroke-dasharray': style.dash, 'stroke-linejoin': 'round', 'marker-end': `url(#lf-head-${sim ? 'simultaneous' : e.kind})` }),
  ];
  if (e.sign) {
    kids.push(el('text', { x: r1(q.x + nx * 10), y: r1(q.y + ny * 10 + 4), 'text-anchor': 'middle', 'font-size': 13, 'font-weight': 700, fill: color, stroke: PAPER, 'stroke-width': 3, 'paint-order': 'stroke' }, [e.sign === '-' ? '−' : '+']));
  }
  return el('g', { 'data-edge': e.id, 'data-kind': e.kind, 'data-from': e.from, 'data-to': e.to, ...(sim ? { 'data-simultaneous': 'true' } : {}), ...(e.carry ? { 'data-carry': 'true' } : {}) }, kids);
}

/**
 * One node, drawn in the figure's own coordinates (no transform per node: a
 * transform per element is a compositing property the browser walks on
 * every frame, which a big figure pays for while the interval is dragged).
 */
function nodeEl(n: ViewNode, b: Box): El {
  const ox = r1(b.x), oy = r1(b.y);
  const X = (v: number) => r1(ox + v), Y = (v: number) => r1(oy + v);
  if (n.count !== undefined) {
    const s = BLOCK_STYLE;
    const card = (o: number) => el('rect', { x: X(o), y: Y(o), width: r1(b.width - 8), height: r1(b.height - 8), rx: 8, fill: s.fill, stroke: s.stroke, 'stroke-width': 1.5 });
    return el('g', { 'data-block': n.block, 'data-folded': 'true', 'data-node': n.id, class: 'lf-toggle' }, [
      el('title', {}, [`${n.label} — a simultaneous block, folded; click to show its members`]),
      card(8), card(4), card(0),
      el('circle', { cx: X(20), cy: Y((b.height - 8) / 2), r: 12, fill: s.stroke }),
      el('text', { x: X(20), y: Y((b.height - 8) / 2 + 4.5), 'text-anchor': 'middle', 'font-size': 13, 'font-weight': 700, fill: WHITE }, [String(n.count)]),
      el('text', { x: X(38), y: Y((b.height - 8) / 2 + 4.5), 'font-size': 13, fill: INK }, [n.label.replace(/^\d+ together: /, '')]),
    ]);
  }
  const style = ROLE_STYLE[n.role];
  const shape = KIND_SHAPE[n.kind];
  const kids: (El | string)[] = [
    el('title', {}, [`${n.label} (${n.variable}): ${style.label}`]),
    el('path', { d: shapePath(shape, b.width, b.height, ox, oy), fill: style.fill, stroke: style.stroke, 'stroke-width': style.strokeWidth, 'stroke-dasharray': style.dash }),
  ];
  if (shape === 'accumulator') kids.push(el('rect', { x: ox, y: Y(b.height - ACCUMULATOR_FLOOR), width: r1(b.width), height: ACCUMULATOR_FLOOR, fill: style.stroke }));
  const glyph = style.glyph;
  const textY = Y((shape === 'accumulator' ? b.height - ACCUMULATOR_FLOOR : b.height) / 2 + 4.5);
  if (glyph) kids.push(el('text', { x: X(14), y: textY, 'text-anchor': 'middle', 'font-size': 15, 'font-weight': 700, fill: style.stroke }, [glyph]));
  const textX = X(glyph ? 22 + (b.width - 22 - (shape === 'tag' ? 10 : 0)) / 2 : (b.width - (shape === 'tag' ? 10 : 0)) / 2);
  kids.push(el('text', { x: textX, y: textY, 'text-anchor': 'middle', 'font-size': 13, fill: INK }, [n.label]));
  return el('g', { 'data-variable': n.variable, 'data-node': n.id, 'data-role': n.role, 'data-kind': n.kind, ...(n.slice !== undefined ? { 'data-slice': n.slice } : {}) }, kids);
}

function legendEl(vm: ViewModel, y: number, width: number): { el: El; height: number } {
  const items: El[] = [];
  let x = 0;
  let row = 0;
  const place = (w: number) => { if (x + w > width - 24 && x > 0) { x = 0; row++; } const p = { x, y: row * 30 }; x += w; return p; };
  for (const role of vm.rolesShown) {
    const s = ROLE_STYLE[role];
    const kind = role === 'input' ? 'input' : role === 'derived' ? 'derived' : 'state';
    const shape = KIND_SHAPE[kind];
    const w = 26 + s.label.length * 6.6 + 22;
    const p = place(w);
    const kids: El[] = [el('path', { d: shapePath(shape, 22, 16), fill: s.fill, stroke: s.stroke, 'stroke-width': Math.min(2.2, s.strokeWidth), 'stroke-dasharray': s.dash ? '3 2' : undefined })];
    if (shape === 'accumulator') kids.push(el('rect', { x: 0, y: 13, width: 22, height: 3, fill: s.stroke }));
    if (s.glyph) kids.push(el('text', { x: 11, y: 12.5, 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 700, fill: s.stroke }, [s.glyph]));
    kids.push(el('text', { x: 28, y: 12.5, 'font-size': 11.5, fill: INK }, [s.label]));
    items.push(el('g', { transform: `translate(${r1(p.x)},${p.y})`, 'data-legend': role }, kids));
  }
  for (const kind of vm.kindsShown) {
    const s = LINK_STYLE[kind];
    const w = 44 + s.label.length * 6.6 + 22;
    const p = place(w);
    items.push(el('g', { transform: `translate(${r1(p.x)},${p.y})`, 'data-legend': kind }, [
      el('path', { d: 'M0,8 L32,8', stroke: s.stroke, 'stroke-width': 1.8, 'stroke-dasharray': s.dash, 'marker-end': `url(#lf-head-${kind})`, fill: 'none' }),
      el('text', { x: 40, y: 12.5, 'font-size': 11.5, fill: INK }, [s.label]),
    ]));
  }
  if (vm.groups.length || vm.folded.length) {
    const w = 30 + BLOCK_STYLE.label.length * 6.6 + 22;
    const p = place(w);
    items.push(el('g', { transform: `translate(${r1(p.x)},${p.y})`, 'data-legend': 'block' }, [
      el('rect', { x: 0, y: 0, width: 24, height: 16, rx: 5, fill: BLOCK_STYLE.fill, stroke: BLOCK_STYLE.stroke, 'stroke-width': 1.2 }),
      el('rect', { x: 3, y: 3, width: 18, height: 10, rx: 3, fill: 'none', stroke: BLOCK_STYLE.stroke, 'stroke-width': 1 }),
      el('text', { x: 30, y: 12.5, 'font-size': 11.5, fill: INK }, [BLOCK_STYLE.label]),
    ]));
  }
  return { el: el('g', { transform: `translate(24,${r1(y)})`, 'data-part': 'legend' }, items), height: items.length ? (row + 1) * 30 + 10 : 0 };
}

/** A figure is at least this wide, so its legend and caption fit. */
const MIN_WIDTH = 560;
/** The width of the svg drawn for a layout (its viewBox's width too). */
export const sceneWidth = (layout: Layout): number => Math.ceil(Math.max(layout.width, MIN_WIDTH));

/** The drawing of a view: a root `<svg>` element tree. */
export function buildScene(vm: ViewModel, layout: Layout, opts: SceneOptions = {}): El {
  const showTitle = opts.title !== false;
  const width = Math.max(layout.width, MIN_WIDTH);
  const titleLines = showTitle ? wrapText(vm.title, width - 48, 9.6) : [];
  const body: Part[] = [];
  const labels: Part[] = [];
  // how far links rise above the laid-out box (arcs between instants on one row): room is made for them
  const reach = { top: 0 };

  for (const [s, box] of Object.entries(layout.slices ?? {})) {
    body.push({ box: outline(box, 2), make: () => el('g', { 'data-slice-frame': s }, [
      el('rect', { x: r1(box.x), y: r1(box.y), width: r1(box.width), height: r1(box.height), rx: 6, fill: WHITE, 'fill-opacity': 0.55, stroke: MUTED, 'stroke-width': 1, 'stroke-dasharray': '2 3' }),
      el('text', { x: r1(box.x + box.width / 2), y: r1(box.y + box.height - 12), 'text-anchor': 'middle', 'font-size': 15, 'font-weight': 700, fill: MUTED }, [`instant ${SLICE_NAMES[s]}`]),
    ]) });
  }
  for (const g of vm.groups) {
    const b = layout.groups[g.id];
    if (!b) continue;
    const s = BLOCK_STYLE;
    body.push({ box: outline(b, 2), make: () => el('g', { 'data-group': g.id, 'data-block': g.key, 'data-folded': 'false', 'data-members': g.variables.join(' ') }, [
      el('rect', { x: r1(b.x), y: r1(b.y), width: r1(b.width), height: r1(b.height), rx: s.radius, fill: s.fill, stroke: s.stroke, 'stroke-width': 1.5 }),
      el('rect', { x: r1(b.x + s.gap), y: r1(b.y + s.gap), width: r1(b.width - 2 * s.gap), height: r1(b.height - 2 * s.gap), rx: s.radius - s.gap, fill: 'none', stroke: s.stroke, 'stroke-width': 1 }),
    ]) });
    // the block's name and fold button are drawn over the links (a link entering the block must not hide them)
    labels.push({ box: [b.x, b.y, b.x + Math.max(b.width, 200), b.y + 30], make: () => el('g', { class: 'lf-toggle', 'data-block': g.key, 'data-block-label': g.id }, [
      el('title', {}, [`${g.variables.length} variables determined together; click to fold into one node`]),
      el('rect', { x: r1(b.x + 8), y: r1(b.y + 7), width: 18, height: 18, rx: 4, fill: WHITE, stroke: s.stroke, 'stroke-width': 1 }),
      el('text', { x: r1(b.x + 17), y: r1(b.y + 21), 'text-anchor': 'middle', 'font-size': 15, 'font-weight': 700, fill: s.stroke }, ['−']),
      el('text', { x: r1(b.x + 32), y: r1(b.y + 21), 'font-size': 12, 'font-weight': 700, fill: s.stroke, stroke: s.fill, 'stroke-width': 4, 'paint-order': 'stroke' }, [b.width >= 190 ? `${g.variables.length} determined together` : `${g.variables.length} together`]),
    ]) });
  }
  const pairs = new Set(vm.edges.map((e) => `${e.from}>${e.to}`));
  for (const e of vm.edges) {
    const a = layout.nodes[e.from], b = layout.nodes[e.to];
    if (!a || !b) continue;
    const route = layout.edges?.[e.id];
    if (route && route.length >= 2) { body.push({ box: around(route, 16), make: () => routedEdgeEl(e, route) }); continue; }
    // across instants: arcs over the row when both ends sit in one row (a straight line would cross the row)
    const across = vm.mode === 'unrolled' && e.kind === 'integrating';
    const sameRow = Math.abs(a.y + a.height / 2 - (b.y + b.height / 2)) < 30;
    const bend = across && sameRow ? -Math.max(40, 0.12 * Math.abs(b.x - a.x)) : pairs.has(`${e.to}>${e.from}`) ? 16 : 0;
    body.push(edgePart(e, a, b, bend, reach));
  }
  for (const n of vm.nodes) {
    const b = layout.nodes[n.id];
    if (b) body.push({ box: outline(b, 4), make: () => nodeEl(n, b) });
  }
  body.push(...labels);

  const rise = reach.top < 0 ? Math.ceil(-reach.top + 4) : 0;
  const top = (showTitle ? HEADER + (titleLines.length - 1) * 21 : 0) + rise;
  const children: (El | string)[] = [markerDefs(), el('rect', { x: 0, y: 0, width: '100%', height: '100%', fill: PAPER })];
  if (showTitle) children.push(el('text', { x: 24, y: 27, 'font-size': 16, 'font-weight': 700, fill: INK, 'data-part': 'title' }, titleLines.map((t, i) => el('tspan', { x: 24, dy: i ? 21 : 0 }, [t]))));
  // the area in the figure's coordinates (below its title and the arcs' room)
  const area = opts.area && [opts.area[0], opts.area[1] - top, opts.area[2], opts.area[3] - top];
  const drawn = area ? body.filter(({ box: b }) => b[0] <= area[2] && b[2] >= area[0] && b[1] <= area[3] && b[3] >= area[1]) : body;
  // each part made carries its box (for the app; files never hold it)
  children.push({ ...el('g', { transform: `translate(0,${top})`, 'data-part': 'figure' }, drawn.map((p) => ({ ...p.make(), box: p.box }))), box: [0, top] });
  let y = top + layout.height;
  if (opts.legend !== false) {
    const lg = legendEl(vm, y, width);
    children.push(lg.el);
    y += lg.height;
  }
  if (opts.caption) {
    const main = wrapText(opts.captionText ?? vm.title, width - 48, 7.4);
    const caution = vm.caution ? wrapText(vm.caution, width - 48, 6.4) : [];
    const texts: El[] = [];
    main.forEach((t, i) => texts.push(el('text', { x: 24, y: r1(y + 16 + i * 18), 'font-size': 13, fill: INK }, [t])));
    caution.forEach((t, i) => texts.push(el('text', { x: 24, y: r1(y + 16 + (main.length + i) * 17), 'font-size': 11.5, fill: MUTED, 'font-style': 'italic' }, [t])));
    children.push(el('g', { 'data-part': 'caption' }, texts));
    y += 16 + main.length * 18 + caution.length * 17;
  }
  const height = Math.ceil(y + 12);
  return el('svg', {
    xmlns: 'http://www.w3.org/2000/svg', width: Math.ceil(width), height, viewBox: `0 0 ${Math.ceil(width)} ${height}`,
    'font-family': FONT_STACK, role: 'img', 'aria-label': vm.title, 'data-view': vm.mode,
  }, children);
}
