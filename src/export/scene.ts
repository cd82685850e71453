/**
 * The one drawing of a view: a small tree of SVG elements built from the
 * view model and its layout. `svg.ts` writes it as a self-contained SVG
 * string (export, command line); the app turns the same tree into React
 * elements, so the screen and the exported figure are one picture.
 */
import type { ViewEdge, ViewModel, ViewNode } from '../core/view/types';
import { Occupancy, placeMark, pointAlong, polylineLength, quadPoints, rectOf, type Rect } from '../layout/space';
import type { Box, Layout, Point } from '../layout/types';
import { ACCUMULATOR_FLOOR, BLOCK_STYLE, FONT_STACK, INK, KIND_SHAPE, LINK_STYLE, MUTED, PAPER, ROLE_STYLE, shapePath } from '../theme/visual';
import { WHITE } from '../theme/tokens';

export type Attr = string | number | undefined;
export interface El {
  tag: string;
  attrs: Record<string, Attr>;
  children?: (El | string)[];
  /**
   * Not written to files: for a part of the figure, the box [x0, y0, x1, y1] it is drawn in (in the
   * figure's coordinates); for the figure itself, where its coordinates start and where it ends
   * ([x, y, x1, y1] in the svg's coordinates: the layout and every line and sign drawn, arcs included).
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
  /**
   * An ordering whose rows were wrapped for print: links that no line bent by at most 30 px can draw run in
   * narrow lanes beside the rows (as beside stacked instants) instead of arcing round the figure.
   */
  lanesBesideRows?: boolean;
  /** The figure's width in its units when printed (legend and caption wrap to it); default: the layout's, at least 560. */
  width?: number;
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

/** A part of the figure: the box it is drawn in, and its elements, made only when they are drawn. */
interface Part {
  box: readonly number[];
  make(): El;
}

/** The line of an edge: its path data and the points it passes (a curve sampled), from source to head. */
interface EdgeLine {
  d: string;
  ps: Point[];
  /** The control point of a curve (its path data names it; the part's box holds it). */
  hull?: Point[];
}

/** A line between two boxes, straight or bent by `bend` px at its middle (a quadratic curve). */
function edgeLine(a: Box, b: Box, bend: number): EdgeLine {
  const ac = { x: a.x + a.width / 2, y: a.y + a.height / 2 };
  const bc = { x: b.x + b.width / 2, y: b.y + b.height / 2 };
  const len = Math.hypot(bc.x - ac.x, bc.y - ac.y) || 1;
  const nx = -(bc.y - ac.y) / len, ny = (bc.x - ac.x) / len;
  const mid = { x: (ac.x + bc.x) / 2 + nx * bend, y: (ac.y + bc.y) / 2 + ny * bend };
  const p0 = exitPoint(a, mid.x, mid.y);
  const p1 = exitPoint(b, mid.x, mid.y, 3);
  if (bend === 0) return { d: `M${r1(p0.x)},${r1(p0.y)} L${r1(p1.x)},${r1(p1.y)}`, ps: [p0, p1] };
  const ctrl = { x: 2 * mid.x - (p0.x + p1.x) / 2, y: 2 * mid.y - (p0.y + p1.y) / 2 };
  return { d: `M${r1(p0.x)},${r1(p0.y)} Q${r1(ctrl.x)},${r1(ctrl.y)} ${r1(p1.x)},${r1(p1.y)}`, ps: quadPoints(p0, ctrl, p1, 16), hull: [ctrl] };
}

/** A routed polyline (ELK's route, border to border). */
function routedLine(ps: readonly Point[]): EdgeLine {
  return { d: ps.map((p, i) => `${i ? 'L' : 'M'}${r1(p.x)},${r1(p.y)}`).join(' '), ps: [...ps] };
}

/** The same polyline moved `by` px to its left (seen from its start towards its end). */
function shiftedLeft(ps: readonly Point[], by: number): Point[] {
  const a = ps[0], b = ps[ps.length - 1];
  const len = Math.hypot(b.x - a.x, b.y - a.y) || 1;
  const nx = (b.y - a.y) / len, ny = -(b.x - a.x) / len;
  return ps.map((p) => ({ x: p.x + nx * by, y: p.y + ny * by }));
}

/** The sign glyph's box (13 px bold, centred on its spot). */
const SIGN_BOX = { width: 12, height: 12 };

/**
 * An edge's elements: its line, and its sign glyph at `mark` (null: no glyph; an edge whose line another
 * edge draws — several members of one block driven by one source — names that edge in `data-along`).
 */
function edgeEl(e: ViewEdge, line: EdgeLine, sign: string | undefined, mark: Point | null, along?: string): El {
  const style = LINK_STYLE[e.kind];
  const sim = e.simultaneous;
  const color = sim ? BLOCK_STYLE.stroke : style.stroke;
  const width = 1.3 + 1.5 * Math.min(1, Math.abs(e.weight ?? 0.5));
  // every edge has the same elements and attribute names whether it draws its line or another edge draws
  // it (`visibility`): a figure whose bundles change on screen has its values written in, not its parts parsed again
  const shown = along ? 'hidden' : 'visible';
  const kids: (El | string)[] = [
    el('title', {}, [`${e.pairs.map((p) => `${p.from} → ${p.to}`).join(', ')}: ${style.label}${sim ? ', within a simultaneous block' : ''}`]),
    el('path', { d: line.d, fill: 'none', stroke: color, 'stroke-width': r1(width), 'stroke-dasharray': style.dash, 'stroke-linejoin': 'round', 'marker-end': `url(#lf-head-${sim ? 'simultaneous' : e.kind})`, visibility: shown }),
  ];
  if (e.sign || sign) {
    const at = mark ?? besideHead(line.ps);
    kids.push(el('text', { x: r1(at.x), y: r1(at.y + 4.5), 'text-anchor': 'middle', 'font-size': 13, 'font-weight': 700, fill: color, stroke: PAPER, 'stroke-width': 3, 'paint-order': 'stroke', visibility: sign && mark ? 'visible' : 'hidden' }, [sign ?? '+']));
  }
  return el('g', { 'data-edge': e.id, 'data-kind': e.kind, 'data-from': e.from, 'data-to': e.to, ...(sim ? { 'data-simultaneous': 'true' } : {}), ...(e.carry ? { 'data-carry': 'true' } : {}), 'data-along': along ?? '' }, kids);
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

/**
 * Every edge's line and sign, placed together: a link into or out of an unfolded block is drawn to or
 * from the block's border (one line for several members driven by one source: the block's equations are
 * solved together); two links between one pair run apart; each sign goes to the first spot near its head
 * that covers no node, block header, other sign or other line (`placeMark`). `reach`: how far the lines
 * and signs reach (arcs over or under a row leave the laid-out box), drawn or not.
 */
function edgeParts(vm: ViewModel, layout: Layout, reach: Reach, besideRows = false): Part[] {
  const groupOf = new Map<string, string>();
  for (const g of vm.groups) if (layout.groups[g.id]) for (const m of g.members) groupOf.set(m, g.id);
  /** The box an end is drawn at: the node, or its block when the other end lies outside that block. */
  const endBox = (id: string, other: string): Box | undefined => {
    const g = groupOf.get(id);
    return g && groupOf.get(other) !== g ? layout.groups[g] : layout.nodes[id];
  };
  const pairs = new Set(vm.edges.map((e) => `${e.from}>${e.to}`));
  const space = new Occupancy(64);
  for (const n of vm.nodes) { const b = layout.nodes[n.id]; if (b) space.addBox(rectOf(b, 1), n.id); }
  for (const g of vm.groups) { const b = layout.groups[g.id]; if (b) space.addBox(headerRect(b), g.id); }
  const lines: { e: ViewEdge; line: EdgeLine; key: string }[] = [];
  let laneCache: number[] | undefined;
  const lanes = () => (laneCache ??= freeLanes([...Object.values(layout.nodes), ...Object.values(layout.groups)]));
  const laneUse = new Map<number, number>();
  const entries = new Map<Box, number>();
  // the three instants stacked top to bottom (for print): links between instants run in narrow lanes beside the stack
  const endsOf = (e: ViewEdge) => new Set([e.from, e.to, groupOf.get(e.from) ?? e.from, groupOf.get(e.to) ?? e.to]);
  const besideStack = stackLanes(vm, layout, endBox, besideRows, (e, a, b) => [0, 30, -30].some((t) => space.lineClear(edgeLine(a, b, t).ps, endsOf(e))), (e, ps) => space.lineClear(ps, endsOf(e)));
  for (const e of vm.edges) {
    const a = endBox(e.from, e.to), b = endBox(e.to, e.from);
    if (!a || !b || !layout.nodes[e.from] || !layout.nodes[e.to]) continue;
    const route = layout.edges?.[e.id];
    const reverse = pairs.has(`${e.to}>${e.from}`) && e.from !== e.to;
    let line: EdgeLine;
    const beside = besideStack.get(e.id);
    if (route && route.length >= 2) line = routedLine(reverse && groupOf.get(e.from) !== undefined && groupOf.get(e.from) === groupOf.get(e.to) ? shiftedLeft(route, 5) : route);
    else if (beside && space.lineClear(beside.ps, endsOf(e))) line = beside;
    else {
      // across instants: arcs over the row when both ends sit in one row (a straight line would cross the row)
      const across = vm.mode === 'unrolled' && e.kind === 'integrating';
      const sameRow = Math.abs(a.y + a.height / 2 - (b.y + b.height / 2)) < 30;
      const bend = across && sameRow ? -Math.max(40, 0.12 * Math.abs(b.x - a.x)) : reverse ? 16 : 0;
      // the first bend whose line passes through no node but its own ends (nor a block's header)
      const ends = new Set([e.from, e.to, groupOf.get(e.from) ?? e.from, groupOf.get(e.to) ?? e.to]);
      const tries = bend !== 0 ? [1, 1.5, 2, 2.6, 3.3, -1, -1.6].map((k) => bend * k) : [0, 30, -30, 60, -60, 100, -100, 150, -150, 220, -220, 300, -300, 400, -400];
      let found: EdgeLine | null = null;
      for (const t of tries) {
        const l = edgeLine(a, b, t);
        if (space.lineClear(l.ps, ends)) { found = l; break; }
      }
      // else along a free lane between the rows: up or down from the source, across, into the target
      // (in the three instants, the free channel between the target's instant and the one before or after it)
      const frame = layout.slices?.[/@(-?\d+)$/.exec(e.to)?.[1] ?? ''];
      const channel = frame && (b.x > a.x + a.width ? frame.x - 14 : frame.x + frame.width + 14);
      found ??= laneLine(a, b, lanes(), laneUse, entries, space, ends, channel);
      line = found ?? edgeLine(a, b, bend);
    }
    lines.push({ e, line, key: '' });
  }
  // a corner shared with a line of another source: the later line moves aside (lines never merge at a corner)
  for (let i = 0; i < lines.length; i++) {
    for (let shift = 4; shift <= 12 && lines[i].line.ps.length > 2; shift += 4) {
      const li = lines[i];
      if (!lines.some((o, j) => j !== i && o.e.from !== li.e.from && sharesCorner(o.line.ps, li.line.ps))) break;
      const moved = shiftedLeft(li.line.ps, shift);
      if (space.lineClear(moved, new Set([li.e.from, li.e.to, groupOf.get(li.e.from) ?? li.e.from, groupOf.get(li.e.to) ?? li.e.to]))) lines[i] = { ...li, line: routedLine(moved) };
    }
  }
  for (const l of lines) l.key = `${l.e.kind}|${l.e.simultaneous}|${l.line.d}`;
  // one line per bundle (the first edge of it draws); its sign when all the modeller's links in it agree
  const first = new Map<string, number>();
  const signs = new Map<string, Set<string>>();
  lines.forEach((l, k) => {
    if (!first.has(l.key)) first.set(l.key, k);
    if (l.e.sign) (signs.get(l.key) ?? signs.set(l.key, new Set()).get(l.key)!).add(l.e.sign);
  });
  lines.forEach((l, k) => { if (first.get(l.key) === k) space.addLine(l.line.ps, l.key); });
  const parts: Part[] = [];
  lines.forEach((l, k) => {
    const lead = first.get(l.key)!;
    if (lead !== k) {
      const along = lines[lead].e.id;
      parts.push({ box: around([...l.line.ps, ...(l.line.hull ?? [])], 24), make: () => edgeEl(l.e, l.line, undefined, null, along) });
      return;
    }
    const set = signs.get(l.key);
    const sign = set?.size === 1 ? ([...set][0] === '-' ? '−' : '+') : set && set.size > 1 ? '±' : undefined;
    // no free spot beside the line: the nearest spot off every node, header and sign round the line;
    // none within reach: beside the line near its head all the same (a sign is never dropped)
    const mark = sign ? placeMark(space, l.line.ps, l.key, SIGN_BOX.width, SIGN_BOX.height, { from: 12, offset: 3 }) ?? placeRound(space, l.line.ps, l.key) ?? besideHead(l.line.ps) : null;
    reach.top = Math.min(reach.top, ...l.line.ps.map((p) => p.y), mark ? mark.y - 8 : Infinity);
    reach.bottom = Math.max(reach.bottom, ...l.line.ps.map((p) => p.y), mark ? mark.y + 8 : -Infinity);
    reach.left = Math.min(reach.left, ...l.line.ps.map((p) => p.x), mark ? mark.x - 8 : Infinity);
    reach.right = Math.max(reach.right, ...l.line.ps.map((p) => p.x), mark ? mark.x + 8 : -Infinity);
    const box = around([...l.line.ps, ...(l.line.hull ?? []), ...(mark ? [mark] : [])], 24);
    parts.push({ box, make: () => edgeEl(l.e, l.line, sign, mark) });
  });
  return parts;
}

/** Lanes beside a stack of instants: the first is this far from the widest box, the others this far apart. */
const STACK_LANE_OFFSET = 12, STACK_LANE_GAP = 6;

/**
 * When the three instants are stacked top to bottom (print at a narrow width), a link between two instants
 * drawn straight or as an arc would cross the instants between its ends or swing far out to the side (and a
 * figure that widens is printed smaller); so would a link within an instant that no line bent by at most
 * 30 px can draw past the nodes between its ends. Here each such link leaves its source's side horizontally, runs down
 * (or up) a narrow vertical lane just beside the stack, and enters its target's side: lanes on the left and the
 * right of the stack, links spread over both sides so that no side of a node takes more ends than needed, ends
 * on one side of a node spread over its height (ordered by where the other end lies, so stubs do not cross),
 * and the shortest links in the innermost lanes, a lane shared only by links whose vertical spans are apart.
 * Returns the lines by edge id (the caller keeps a line only if it passes through no other box).
 */
function stackLanes(vm: ViewModel, layout: Layout, endBox: (id: string, other: string) => Box | undefined, besideRows: boolean, nearlyStraight: (e: ViewEdge, a: Box, b: Box) => boolean, clear: (e: ViewEdge, ps: Point[]) => boolean): Map<string, EdgeLine> {
  const out = new Map<string, EdgeLine>();
  const frames = Object.values(layout.slices ?? {}).sort((p, q) => p.y - q.y);
  if (!(besideRows && vm.mode === 'ordering')) {
    if (vm.mode !== 'unrolled' || frames.length < 2) return out;
    // stacked: each frame wholly below the one before
    for (let i = 1; i < frames.length; i++) if (frames[i].y < frames[i - 1].y + frames[i - 1].height - 1) return out;
  }
  const sliceOf = new Map(vm.nodes.map((n) => [n.id, n.slice ?? 0]));
  const boxes = [...Object.values(layout.nodes), ...Object.values(layout.groups)];
  if (!boxes.length) return out;
  const left = Math.min(...boxes.map((b) => b.x)) - STACK_LANE_OFFSET;
  const right = Math.max(...boxes.map((b) => b.x + b.width)) + STACK_LANE_OFFSET;
  interface Link { id: string; a: Box; b: Box; side: 0 | 1; ya: number; yb: number; viaA?: number; viaB?: number }
  const gaps = freeLanes(boxes);
  const gapUse = new Map<number, number>();
  /** The free strip between rows next to a box, towards `y` (a stub blocked by a neighbour goes round by it). */
  const gapBeside = (box: Box, y: number): number | undefined => {
    const below = y > box.y + box.height / 2;
    const g = below ? gaps.filter((v) => v > box.y + box.height).sort((p, q) => p - q)[0] : gaps.filter((v) => v < box.y).sort((p, q) => q - p)[0];
    if (g === undefined) return undefined;
    const k = gapUse.get(g) ?? 0;
    gapUse.set(g, k + 1);
    return g + (k % 2 ? 1 : -1) * 5 * Math.ceil(k / 2);
  };
  const links: Link[] = [];
  const ends = new Map<Box, [number, number]>();
  const load = (b: Box) => ends.get(b) ?? ends.set(b, [0, 0]).get(b)!;
  const perSide: [number, number] = [0, 0];
  // longest links first choose their side (they take the most lane length)
  const across = vm.edges.filter((e) => e.from !== e.to && !layout.edges?.[e.id])
    .map((e) => ({ e, a: endBox(e.from, e.to), b: endBox(e.to, e.from) }))
    .filter((x): x is { e: ViewEdge; a: Box; b: Box } => !!x.a && !!x.b && x.a !== x.b && !(sliceOf.get(x.e.from) === sliceOf.get(x.e.to) && nearlyStraight(x.e, x.a, x.b)))
    .sort((p, q) => Math.abs(q.b.y - q.a.y) - Math.abs(p.b.y - p.a.y) || (p.e.id < q.e.id ? -1 : 1));
  for (const { e, a, b } of across) {
    const la = load(a), lb = load(b);
    // a side whose stub (at the middle of either end) would cross a neighbour in the same row is avoided
    const stubClear = (s: 0 | 1) => [a, b].every((box) => {
      const y = box.y + box.height / 2, x0 = s === 0 ? box.x - 2 : box.x + box.width + 2;
      return clear(e, [{ x: x0, y }, { x: s === 0 ? left : right, y }]);
    });
    const cost = (s: 0 | 1) => la[s] + lb[s] + perSide[s] / 1000 + (stubClear(s) ? 0 : 1000);
    const side: 0 | 1 = cost(1) < cost(0) ? 1 : 0;
    la[side]++; lb[side]++; perSide[side]++;
    const blocked = (box: Box) => {
      const y = box.y + box.height / 2;
      return !clear(e, [{ x: side === 0 ? box.x - 2 : box.x + box.width + 2, y }, { x: side === 0 ? left : right, y }]);
    };
    const viaA = blocked(a) ? gapBeside(a, b.y + b.height / 2) : undefined;
    const viaB = blocked(b) ? gapBeside(b, a.y + a.height / 2) : undefined;
    links.push({ id: e.id, a, b, side, ya: 0, yb: 0, viaA, viaB });
  }
  // ends on one side of a box: spread over its height, ordered by the other end's height
  const slots = new Map<string, { link: Link; source: boolean; other: number }[]>();
  for (const l of links) {
    for (const [box, source, other] of [[l.a, true, l.b], [l.b, false, l.a]] as const) {
      const key = `${box.x},${box.y},${l.side}`;
      (slots.get(key) ?? slots.set(key, []).get(key)!).push({ link: l, source, other: other.y + other.height / 2 });
    }
  }
  for (const list of slots.values()) {
    list.sort((p, q) => p.other - q.other || (p.link.id < q.link.id ? -1 : 1));
    const box = list[0].source ? list[0].link.a : list[0].link.b;
    const n = list.length;
    const step = Math.min(8, (box.height - 8) / Math.max(1, n - 1));
    list.forEach((s, k) => {
      const y = box.y + box.height / 2 + (k - (n - 1) / 2) * step;
      if (s.source) s.link.ya = y; else s.link.yb = y;
    });
  }
  // lanes: the shortest spans innermost; a lane holds spans at least 10 px apart
  for (const side of [0, 1] as const) {
    const lanes: [number, number][][] = [];
    const mine = links.filter((l) => l.side === side).sort((p, q) => Math.abs(p.yb - p.ya) - Math.abs(q.yb - q.ya) || (p.id < q.id ? -1 : 1));
    for (const l of mine) {
      const lo = Math.min(l.viaA ?? l.ya, l.viaB ?? l.yb) - 10, hi = Math.max(l.viaA ?? l.ya, l.viaB ?? l.yb) + 10;
      let k = lanes.findIndex((lane) => lane.every(([p, q]) => hi < p || lo > q));
      if (k < 0) { k = lanes.length; lanes.push([]); }
      lanes[k].push([lo, hi]);
      const x = side === 0 ? left - k * STACK_LANE_GAP : right + k * STACK_LANE_GAP;
      const ax = side === 0 ? l.a.x - 2 : l.a.x + l.a.width + 2;
      const bx = side === 0 ? l.b.x - 3 : l.b.x + l.b.width + 3;
      // an end whose side is taken by a neighbour: out of its top or bottom to the strip between rows, then aside
      // (at a quarter of its width from the lane's side: lines within the instant leave and enter at the middle)
      const at = (b: Box) => b.x + b.width * (side === 0 ? 0.25 : 0.75);
      const start = l.viaA === undefined ? [{ x: ax, y: l.ya }] : [{ x: at(l.a), y: l.viaA > l.a.y ? l.a.y + l.a.height + 2 : l.a.y - 2 }, { x: at(l.a), y: l.viaA }];
      const end = l.viaB === undefined ? [{ x: bx, y: l.yb }] : [{ x: at(l.b), y: l.viaB }, { x: at(l.b), y: l.viaB > l.b.y ? l.b.y + l.b.height + 3 : l.b.y - 3 }];
      const y0 = l.viaA ?? l.ya, y1 = l.viaB ?? l.yb;
      out.set(l.id, routedLine([...start, { x, y: y0 }, { x, y: y1 }, ...end]));
    }
  }
  return out;
}

/** The extent of what the lines and signs draw, in the layout's coordinates. */
interface Reach { top: number; bottom: number; left: number; right: number }

/** Whether two polylines have a corner (a point but the ends) within 2 px of each other. */
function sharesCorner(p: readonly Point[], q: readonly Point[]): boolean {
  for (let i = 1; i < p.length - 1; i++) for (let j = 0; j < q.length; j++) if (Math.abs(p[i].x - q[j].x) < 2.5 && Math.abs(p[i].y - q[j].y) < 2.5) return true;
  return false;
}

/** The y of each horizontal strip no box covers (the middle of each gap between rows), and one above and one below everything. */
function freeLanes(boxes: readonly Box[]): number[] {
  const spans = boxes.map((b) => [b.y, b.y + b.height] as const).sort((p, q) => p[0] - q[0]);
  if (!spans.length) return [];
  const out = [spans[0][0] - 14];
  let end = spans[0][1];
  for (const [y0, y1] of spans) {
    if (y0 > end + 10) out.push((end + y0) / 2);
    end = Math.max(end, y1);
  }
  out.push(end + 14);
  return out;
}

/**
 * A line from a to b along a free lane: from a's top or bottom to the lane, along it, then into b's top
 * or bottom; the first (nearest lane first) that passes through no box but its own ends. Lines sharing a
 * lane are set 5 px apart, so they never run on top of each other.
 */
function laneLine(a: Box, b: Box, lanes: readonly number[], use: Map<number, number>, entries: Map<Box, number>, space: Occupancy, ends: ReadonlySet<string>, channel?: number): EdgeLine | null {
  const ay = a.y + a.height / 2, by = b.y + b.height / 2;
  const order = [...lanes].sort((p, q) => Math.abs(p - ay) + Math.abs(p - by) - (Math.abs(q - ay) + Math.abs(q - by)));
  // a second line into the same box enters at another point (lines never share their last stretch)
  const spread = [0.5, 0.3, 0.7, 0.2, 0.8];
  const nth = entries.get(b) ?? 0;
  const fbs = [...spread.slice(nth % spread.length), ...spread.slice(0, nth % spread.length)];
  const right = b.x > a.x + a.width;
  for (const lane of order) {
    const k = use.get(lane) ?? 0;
    const y = lane + (k % 2 ? 1 : -1) * 5 * Math.ceil(k / 2);
    const tries: { x: number; y: number }[][] = [];
    for (const fa of [0.5, 0.3, 0.7]) for (const fb of fbs) {
      const ax = a.x + a.width * fa, bx = b.x + b.width * fb;
      const p0 = { x: ax, y: y < ay ? a.y - 2 : a.y + a.height + 2 };
      const p1 = { x: bx, y: y < by ? b.y - 3 : b.y + b.height + 3 };
      tries.push([p0, { x: ax, y }, { x: bx, y }, p1]);
    }
    // into the target's side, from the free space beside it (the gap between two instants)
    const hy = by + (nth % 2 ? 1 : -1) * 6 * Math.ceil(nth / 2);
    const sides = [right ? b.x - 16 - 4 * nth : b.x + b.width + 16 + 4 * nth];
    if (channel !== undefined) sides.push(channel + (right ? 1 : -1) * 4 * nth);
    for (const side of sides) for (const fa of [0.5, 0.3, 0.7]) {
      const ax = a.x + a.width * fa;
      tries.push([{ x: ax, y: y < ay ? a.y - 2 : a.y + a.height + 2 }, { x: ax, y }, { x: side, y }, { x: side, y: hy }, { x: right ? b.x - 3 : b.x + b.width + 3, y: hy }]);
    }
    for (const ps of tries) {
      if (space.lineClear(ps, ends)) {
        use.set(lane, k + 1);
        entries.set(b, nth + 1);
        return routedLine(ps);
      }
    }
  }
  return null;
}

/** A spot 9 px to the left of a line, 22 px before its head. */
/**
 * The first spot for a sign, in rings 10–40 px round points along the line (from its head), that covers
 * no node, block header or other sign (lines may pass under it): a sign under a node cannot be read, and
 * two signs side by side read as one.
 */
function placeRound(space: Occupancy, ps: readonly Point[], owner: string): Point | null {
  const len = polylineLength(ps);
  if (len === 0) return null;
  const w = SIGN_BOX.width, h = SIGN_BOX.height;
  for (let r = 10; r <= 40; r += 5) {
    for (let d = 12; d < len; d += 8) {
      const { p } = pointAlong(ps, len - d);
      for (let k = 0; k < 16; k++) {
        const a = (2 * Math.PI * k) / 16;
        const c = { x: p.x + r * Math.cos(a), y: p.y + r * Math.sin(a) };
        const box: Rect = [c.x - w / 2, c.y - h / 2, c.x + w / 2, c.y + h / 2];
        if (space.free(box, owner, false)) { space.addBox(box); return c; }
      }
    }
  }
  return null;
}

function besideHead(ps: readonly Point[]): Point {
  const { p, ux, uy } = pointAlong(ps, Math.max(0, polylineLength(ps) - 22));
  return { x: p.x + uy * 9, y: p.y - ux * 9 };
}

/** The header of a block drawn at box b: its fold button and name (drawn over links; nothing may cover it). */
function headerRect(b: Box): Rect {
  return [b.x + 6, b.y + 5, b.x + Math.min(b.width - 6, 200), b.y + 27];
}

/** A figure is at least this wide, so its legend and caption fit. */
const MIN_WIDTH = 560;
/** The width of the svg drawn for a layout (its viewBox's width too). */
export const sceneWidth = (layout: Layout): number => Math.ceil(Math.max(layout.width, MIN_WIDTH));

/** The drawing of a view: a root `<svg>` element tree. */
export function buildScene(vm: ViewModel, layout: Layout, opts: SceneOptions = {}): El {
  const showTitle = opts.title !== false;
  const baseWidth = Math.max(layout.width, opts.width ?? MIN_WIDTH);
  const titleLines = showTitle ? wrapText(vm.title, baseWidth - 48, 9.6) : [];
  const body: Part[] = [];
  const labels: Part[] = [];
  // how far links leave the laid-out box (arcs between instants over or under a row): room is made for them
  const reach: Reach = { top: 0, bottom: layout.height, left: 0, right: layout.width };

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
  body.push(...edgeParts(vm, layout, reach, opts.lanesBesideRows));
  for (const n of vm.nodes) {
    const b = layout.nodes[n.id];
    if (b) body.push({ box: outline(b, 4), make: () => nodeEl(n, b) });
  }
  body.push(...labels);

  // room above, below and to the left for lines that leave the laid-out box (4 px for the stroke and its
  // arrowhead's tip); the figure grows to the right for one that leaves it there
  const rise = reach.top < 0 ? Math.ceil(-reach.top + 4) : 0;
  const drop = reach.bottom > layout.height ? Math.ceil(reach.bottom - layout.height + 4) : 0;
  const aside = reach.left < 0 ? Math.ceil(-reach.left + 4) : 0;
  const width = Math.max(baseWidth, reach.right > layout.width ? aside + Math.ceil(reach.right + 4) : 0, aside ? aside + layout.width : 0);
  const top = (showTitle ? HEADER + (titleLines.length - 1) * 21 : 0) + rise;
  const children: (El | string)[] = [markerDefs(), el('rect', { x: 0, y: 0, width: '100%', height: '100%', fill: PAPER })];
  if (showTitle) children.push(el('text', { x: 24, y: 27, 'font-size': 16, 'font-weight': 700, fill: INK, 'data-part': 'title' }, titleLines.map((t, i) => el('tspan', { x: 24, dy: i ? 21 : 0 }, [t]))));
  // the area in the figure's coordinates (below its title and the arcs' room)
  const area = opts.area && [opts.area[0] - aside, opts.area[1] - top, opts.area[2] - aside, opts.area[3] - top];
  const drawn = area ? body.filter(({ box: b }) => b[0] <= area[2] && b[2] >= area[0] && b[1] <= area[3] && b[3] >= area[1]) : body;
  // each part made carries its box (for the app; files never hold it)
  const figureHeight = layout.height + drop;
  children.push({ ...el('g', { transform: `translate(${aside},${top})`, 'data-part': 'figure' }, drawn.map((p) => ({ ...p.make(), box: p.box }))), box: [aside, top, aside + Math.max(layout.width, reach.right), top + figureHeight] });
  let y = top + figureHeight;
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
