/**
 * Placement of a network figure (the lagged and same-interval networks of
 * the sampled model): nodes on an ellipse in an order fixed by the states'
 * ids (never by their order in the file), each link a straight or bent line
 * that misses every other node, each weight in a free spot on its line. The
 * ellipse grows until every rule holds:
 * - no two nodes overlap or come closer than `NODE_GAP`;
 * - every link has at least `MIN_VISIBLE` px of line outside both its nodes;
 * - a link passes through no node but its own two;
 * - no weight covers a node, another weight, or another link's line.
 */
import { Occupancy, placeMark, polylineLength, polylineMeetsRect, quadPoints, rectsMeet, type Rect } from './space';
import type { Point } from './types';

/** A node's box: the name on one line, the self-effect (directed networks) on a second. */
export const NET_NODE = { width: 112, height: 22, heightWithSelf: 34 };
/** The shortest stretch of a link's line drawn outside both its nodes. */
export const MIN_VISIBLE = 24;
/** The least space between two nodes. */
export const NODE_GAP = 30;
/** The tallest compact placement, in widths (a column figure of 8.5 cm stays within 21 cm). */
export const COMPACT_ASPECT = 2.5;
/** Gap between a node's border and the end of a line. */
const CUT = 3;
/** Weight labels: font size and the gap kept round them. */
export const WEIGHT_FONT = 9.5;

/**
 * Advance widths of DejaVu Sans (the figures' first font), in em: digits
 * 0.636, full stop and space 0.318, the minus sign and plus 0.838; other
 * characters are taken as 0.65 (an upper estimate for lower-case letters).
 */
export function textWidth(s: string, size: number): number {
  let em = 0;
  for (const ch of s) em += /[0-9]/.test(ch) ? 0.636 : ch === '.' || ch === ' ' || ch === ',' ? 0.318 : ch === '−' || ch === '+' ? 0.838 : 0.65;
  return em * size;
}

/**
 * Advance widths of DejaVu Sans in em for the printable ASCII characters (32 to 126), read from the
 * font file the command line embeds (dejavu-fonts-ttf, DejaVuSans.ttf, by fontkit: advance / units per em).
 */
const DEJAVU_ASCII = [
  0.318, 0.401, 0.46, 0.838, 0.636, 0.95, 0.78, 0.275, 0.39, 0.39, 0.5, 0.838, 0.318, 0.361, 0.318, 0.337, 0.636, 0.636, 0.636,
  0.636, 0.636, 0.636, 0.636, 0.636, 0.636, 0.636, 0.337, 0.337, 0.838, 0.838, 0.838, 0.531, 1, 0.684, 0.686, 0.698, 0.77, 0.632,
  0.575, 0.775, 0.752, 0.295, 0.295, 0.656, 0.557, 0.863, 0.748, 0.787, 0.603, 0.787, 0.695, 0.635, 0.611, 0.732, 0.684, 0.989, 0.685,
  0.611, 0.685, 0.39, 0.337, 0.39, 0.838, 0.5, 0.5, 0.613, 0.635, 0.55, 0.635, 0.615, 0.352, 0.635, 0.634, 0.278, 0.278, 0.579,
  0.278, 0.974, 0.634, 0.612, 0.635, 0.635, 0.411, 0.521, 0.392, 0.634, 0.592, 0.818, 0.592, 0.592, 0.525, 0.636, 0.337, 0.636, 0.838,
];

/** The width of a name at `size` by DejaVu Sans' own advances (others than ASCII taken as 0.65 em, as `textWidth`). */
export function nameWidth(s: string, size: number): number {
  let em = 0;
  for (const ch of s) {
    const c = ch.codePointAt(0)!;
    em += c >= 32 && c < 127 ? DEJAVU_ASCII[c - 32] : ch === '…' ? 1 : 0.65;
  }
  return em * size;
}

export interface NetLink { from: number; to: number; weight: number; label: string }

export interface NetworkPlacement {
  /** Node centres, by state index. */
  centers: Point[];
  nodeWidth: number;
  nodeHeight: number;
  /** Each link: its line (start, control point, end of a quadratic curve; control = midpoint when straight) and its label's centre. */
  links: { link: NetLink; start: Point; control: Point; end: Point; label: Point }[];
  width: number;
  height: number;
}

/** Indices of the states in drawing order: sorted by id, so the file's order does not matter. */
export function drawingOrder(ids: readonly string[]): number[] {
  return ids.map((_, i) => i).sort((a, b) => (ids[a] < ids[b] ? -1 : ids[a] > ids[b] ? 1 : a - b));
}

/** Where the line from `c` (inside the box of w × h round `box`) towards `toward` leaves the box, plus the gap. */
function cutAt(c: Point, toward: Point, w: number, h: number, box: Point = c): Point {
  const dx = toward.x - c.x, dy = toward.y - c.y;
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len, uy = dy / len;
  const ox = c.x - box.x, oy = c.y - box.y;
  const tx = Math.abs(ux) > 1e-9 ? ((ux > 0 ? w / 2 - ox : w / 2 + ox) / Math.abs(ux)) : Infinity;
  const ty = Math.abs(uy) > 1e-9 ? ((uy > 0 ? h / 2 - oy : h / 2 + oy) / Math.abs(uy)) : Infinity;
  const t = Math.min(tx, ty) + CUT;
  return { x: c.x + ux * t, y: c.y + uy * t };
}

/** One try at a given ellipse; null when some rule fails (the caller grows the ellipse). `maxWidth`: the drawing must also stay within 0…maxWidth. */
function tryPlace(ids: readonly string[], links: readonly NetLink[], directed: boolean, rx: number, ry: number, w: number, h: number, maxWidth = Infinity): NetworkPlacement | null {
  const n = ids.length;
  const order = drawingOrder(ids);
  const centers: Point[] = new Array(n);
  const ladder = maxWidth < Infinity;
  // the ladder (compact): `ry` is the step between two rows of a column
  const right = Math.ceil(n / 2);
  const cx = rx + w / 2 + 12, cy = ladder ? h / 2 + 24 + (Math.max(right - 1, n - right - 0.5) * ry) / 2 : ry + h / 2 + 12;
  order.forEach((i, k) => {
    if (ladder) {
      // down the right column, then up the left one half a step lower: no two nodes at one height
      const half = n > 2 ? 0.5 : 0;
      // (whole units: node borders fall on the same pixels in every renderer)
      const c = n === 1 ? { x: cx, y: h / 2 + 24 } : k < right ? { x: cx + rx, y: h / 2 + 24 + k * ry } : { x: cx - rx, y: h / 2 + 24 + (n - 1 - k + half) * ry };
      centers[i] = { x: Math.round(c.x), y: Math.round(c.y) };
      return;
    }
    // two nodes side by side; more round the ellipse from the top, clockwise
    const a = (n === 2 ? Math.PI : -Math.PI / 2) + (2 * Math.PI * k) / Math.max(1, n);
    centers[i] = n === 1 ? { x: cx, y: cy } : { x: cx + rx * Math.cos(a), y: cy + ry * Math.sin(a) };
  });
  const boxes: Rect[] = centers.map((c) => [c.x - w / 2, c.y - h / 2, c.x + w / 2, c.y + h / 2]);
  const grown = (r: Rect, p: number): Rect => [r[0] - p, r[1] - p, r[2] + p, r[3] + p];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (rectsMeet(grown(boxes[i], NODE_GAP / 2), grown(boxes[j], NODE_GAP / 2))) return null;
  const space = new Occupancy(48);
  for (const b of boxes) space.addBox(grown(b, 2));
  const center = { x: cx, y: cy };
  const out: NetworkPlacement['links'] = [];
  const lines: Point[][] = [];
  for (const l of links) {
    const both = directed && links.some((m) => m.from === l.to && m.to === l.from);
    const dx = centers[l.to].x - centers[l.from].x, dy = centers[l.to].y - centers[l.from].y, len = Math.hypot(dx, dy) || 1;
    const nx = -dy / len, ny = dx / len;
    // two links between one pair run side by side, each shifted to its own left (the other's right)
    const shift = both ? 7 : 0;
    const a = { x: centers[l.from].x + nx * shift, y: centers[l.from].y + ny * shift };
    const b = { x: centers[l.to].x + nx * shift, y: centers[l.to].y + ny * shift };
    // bend towards the middle of the figure first (links round the ellipse stay inside it)
    const mid = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
    const inward = (center.x - mid.x) * nx + (center.y - mid.y) * ny >= 0 ? 1 : -1;
    const bends = both ? [0, 20, 40, 70] : [0, 24 * inward, 48 * inward, 80 * inward, -24 * inward, -48 * inward];
    let found: { start: Point; control: Point; end: Point; ps: Point[] } | null = null;
    for (const bend of bends) {
      const ctrl = { x: mid.x + nx * bend, y: mid.y + ny * bend };
      const start = cutAt(a, ctrl, w, h, centers[l.from]), end = cutAt(b, ctrl, w, h, centers[l.to]);
      // the control point of the curve through `ctrl` at its middle
      const control = { x: 2 * ctrl.x - (start.x + end.x) / 2, y: 2 * ctrl.y - (start.y + end.y) / 2 };
      const ps = bend === 0 ? [start, end] : quadPoints(start, control, end, 16);
      if (polylineLength(ps) < MIN_VISIBLE) continue;
      // the line must not enter its own nodes again, nor pass through any other
      if (polylineMeetsRect(ps, boxes[l.from]) || polylineMeetsRect(ps, boxes[l.to])) continue;
      if (boxes.some((r, k) => k !== l.from && k !== l.to && polylineMeetsRect(ps, grown(r, 4)))) continue;
      found = { start, control: bend === 0 ? { x: (start.x + end.x) / 2, y: (start.y + end.y) / 2 } : control, end, ps };
      break;
    }
    if (!found) return null;
    out.push({ link: l, start: found.start, control: found.control, end: found.end, label: { x: 0, y: 0 } });
    lines.push(found.ps);
  }
  lines.forEach((ps, k) => space.addLine(ps, String(k)));
  // weights: on their own line (with a halo), off nodes, other weights and other lines; strongest first
  const byStrength = out.map((_, k) => k).sort((p, q) => Math.abs(out[q].link.weight) - Math.abs(out[p].link.weight) || p - q);
  for (const k of byStrength) {
    const lw = textWidth(out[k].link.label, WEIGHT_FONT) + 4, lh = WEIGHT_FONT + 3;
    const ps = lines[k];
    const len = polylineLength(ps);
    // from 60 % of the way (labels of crossing lines do not meet in the middle) towards the source
    const spot = placeMark(space, ps, String(k), lw, lh, { from: Math.max(directed ? 16 : 6, len * 0.6), offset: 0, onLine: true, strict: true })
      ?? placeMark(space, ps, String(k), lw, lh, { from: directed ? 16 : 6, offset: 0, onLine: true, strict: true });
    if (!spot) return null;
    out[k].label = spot;
  }
  let x0 = Infinity, x1 = 0, y1 = 0;
  for (const b of boxes) { x0 = Math.min(x0, b[0]); x1 = Math.max(x1, b[2]); y1 = Math.max(y1, b[3]); }
  for (const ps of lines) for (const p of ps) { x0 = Math.min(x0, p.x); x1 = Math.max(x1, p.x); y1 = Math.max(y1, p.y); }
  let y0 = Infinity;
  for (const ps of lines) for (const p of ps) y0 = Math.min(y0, p.y);
  if (maxWidth < Infinity && (x0 < 2 || x1 + 12 > maxWidth || y0 < 2)) return null;
  for (const k of out.keys()) if (maxWidth < Infinity && (out[k].label.x - textWidth(out[k].link.label, WEIGHT_FONT) / 2 < 2 || out[k].label.x + textWidth(out[k].link.label, WEIGHT_FONT) / 2 > maxWidth - 2)) return null;
  if (ladder) {
    // the ladder starts 12 units under the highest node, line or weight
    let top = Infinity;
    for (const b of boxes) top = Math.min(top, b[1]);
    for (const l of out) top = Math.min(top, l.label.y - (WEIGHT_FONT + 3) / 2);
    const dy = Math.max(0, Math.floor(Math.min(top, y0) - 12));
    const up = (p: Point): Point => ({ x: p.x, y: p.y - dy });
    return { centers: centers.map(up), nodeWidth: w, nodeHeight: h, links: out.map((l) => ({ ...l, start: up(l.start), control: up(l.control), end: up(l.end), label: up(l.label) })), width: x1 + 12, height: y1 + 12 - dy };
  }
  return { centers, nodeWidth: w, nodeHeight: h, links: out, width: x1 + 12, height: y1 + 12 };
}

/**
 * Place a network: `placeNetwork(ids, links, directed)`. Starts from a small
 * ellipse and grows it by 12 % until every rule holds (at most 40 tries; the
 * last is used as it is).
 */
export function placeNetwork(ids: readonly string[], links: readonly NetLink[], directed: boolean): NetworkPlacement {
  const w = NET_NODE.width, h = directed ? NET_NODE.heightWithSelf : NET_NODE.height;
  const n = ids.length;
  // the smallest ellipse whose perimeter gives every node its width and a gap
  let rx = Math.max(n <= 2 ? (w + NODE_GAP + 40) / 2 : 120, (n * (w + NODE_GAP)) / (2 * Math.PI) * 0.75);
  let ry = n <= 2 ? 0 : Math.max(70, rx * 0.62);
  for (let k = 0; k < 40; k++) {
    const placed = tryPlace(ids, links, directed, rx, ry, w, h);
    if (placed) return placed;
    rx *= 1.12; ry = n <= 2 ? ry : ry * 1.12;
  }
  // cannot happen for the sizes drawn (a larger ellipse always separates); keep a drawing anyway
  return tryPlaceLoose(ids, links, directed, rx, ry, w, h);
}

/**
 * A compact placement for a narrow print width (`maxWidth` drawing units): nodes of the given size
 * (smaller: their names on two lines) in a tight ring of two columns as far apart as the width allows —
 * down the right column, up the left one half a step lower, so no two nodes are at one height — whose
 * rows move apart by 12 % a try until every rule above holds. Null when no ladder up to `COMPACT_ASPECT`
 * widths tall does.
 */
export function placeNetworkCompact(ids: readonly string[], links: readonly NetLink[], directed: boolean, node: { width: number; height: number }, maxWidth: number): NetworkPlacement | null {
  const { width: w, height: h } = node;
  const n = ids.length;
  const least = (w + NODE_GAP) / 2, most = Math.max(least, (maxWidth - w - 24) / 2);
  // the columns as far apart as the width allows, or closer so that lines bending outwards stay inside it
  const widths = n <= 1 ? [0] : [most, most - 12, most - 24, most - 40].filter((r) => r >= least);
  if (!widths.length) widths.push(least);
  let step = h + NODE_GAP;
  for (let k = 0; k < 40; k++) {
    // no taller than a printed page allows (two and a half times the width: 21 cm at one column)
    if (Math.max(0, Math.ceil(n / 2) - 1, Math.floor(n / 2) - 0.5) * step + h + 48 > COMPACT_ASPECT * maxWidth) return null;
    for (const rx of widths) {
      const placed = tryPlace(ids, links, directed, rx, step, w, h, maxWidth);
      if (placed) return placed;
    }
    step *= 1.12;
  }
  return null;
}

/**
 * A name on at most `lines` lines of at most `max` units at `size` (DejaVu Sans widths, `nameWidth`),
 * broken between words; a word or the last line that is still too long ends in "…".
 */
export function nameLines(name: string, max: number, size: number, lines = 2): string[] {
  const fit = (s: string) => nameWidth(s, size) <= max;
  const cut = (s: string) => { let t = s; while (t.length > 1 && !fit(`${t}…`)) t = t.slice(0, -1); return `${t.trimEnd()}…`; };
  const words = name.split(/\s+/).filter(Boolean);
  const out: string[] = [];
  let line = '';
  let i = 0;
  while (i < words.length) {
    if (out.length === lines - 1) {
      // the last line takes the rest
      const rest = words.slice(i).join(' ');
      out.push(fit(rest) ? rest : cut(rest));
      return out;
    }
    const next = line ? `${line} ${words[i]}` : words[i];
    if (fit(next)) { line = next; i++; continue; }
    if (line) { out.push(line); line = ''; continue; }
    out.push(cut(words[i])); i++;
  }
  if (line) out.push(line);
  return out;
}

function tryPlaceLoose(ids: readonly string[], links: readonly NetLink[], directed: boolean, rx: number, ry: number, w: number, h: number): NetworkPlacement {
  const order = drawingOrder(ids);
  const centers: Point[] = new Array(ids.length);
  order.forEach((i, k) => { const a = -Math.PI / 2 + (2 * Math.PI * k) / ids.length; centers[i] = { x: rx + w / 2 + 12 + rx * Math.cos(a), y: ry + h / 2 + 12 + ry * Math.sin(a) }; });
  const out = links.map((link) => {
    const start = cutAt(centers[link.from], centers[link.to], w, h), end = cutAt(centers[link.to], centers[link.from], w, h);
    const control = { x: (start.x + end.x) / 2, y: (start.y + end.y) / 2 };
    return { link, start, control, end, label: control };
  });
  return { centers, nodeWidth: w, nodeHeight: h, links: out, width: 2 * rx + w + 24, height: 2 * ry + h + 24 };
}
