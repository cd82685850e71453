/**
 * PDF files of figures, drawn from the figure's element tree (the `El` of
 * `scene.ts` / `charts.ts`, a small known set of SVG elements) with PDFKit:
 * vector shapes, arrowheads from the figure's markers, and text set in
 * DejaVu Sans embedded as font subsets. One page the size of the figure.
 * Node only.
 */
import { SVG_DEFAULT_FILL } from '../../theme/tokens';
import PDFDocument from 'pdfkit';
import type { El } from '../../export/scene';
import { viewSize } from '../../export/print/transform';
import { ALL_FACES, faceOf, fontFile } from './fonts';

type Attrs = Record<string, string | number | undefined>;
type Doc = PDFKit.PDFDocument;
interface Pt { x: number; y: number }

const num = (v: unknown, d = 0): number => (v === undefined || v === '' ? d : Number(v));

/** The points of a path's data (absolute M/L/H/V/Q/C/A/Z, as the figures write them) and its end direction. */
export function pathEnd(d: string): { end: Pt; from: Pt } | undefined {
  const tokens = d.match(/[MLHVQCAZmlhvqcaz]|-?\d*\.?\d+(?:e-?\d+)?/g) ?? [];
  let cmd = '';
  let cur: Pt = { x: 0, y: 0 }, start: Pt = cur, prev: Pt = cur;
  let i = 0;
  const n = () => Number(tokens[i++]);
  while (i < tokens.length) {
    if (/[A-Za-z]/.test(tokens[i])) cmd = tokens[i++].toUpperCase();
    switch (cmd) {
      case 'M': cur = { x: n(), y: n() }; start = cur; prev = cur; cmd = 'L'; break;
      case 'L': prev = cur; cur = { x: n(), y: n() }; break;
      case 'H': prev = cur; cur = { x: n(), y: cur.y }; break;
      case 'V': prev = cur; cur = { x: cur.x, y: n() }; break;
      case 'Q': { const c = { x: n(), y: n() }; cur = { x: n(), y: n() }; prev = c; break; }
      case 'C': { n(); n(); const c = { x: n(), y: n() }; cur = { x: n(), y: n() }; prev = c; break; }
      case 'A': { n(); n(); n(); n(); n(); prev = cur; cur = { x: n(), y: n() }; break; }
      case 'Z': prev = cur; cur = start; break;
      default: i++;
    }
  }
  return { end: cur, from: prev };
}

function applyTransform(doc: Doc, t: string | number | undefined): void {
  if (t === undefined) return;
  for (const m of String(t).matchAll(/(translate|rotate|scale)\(([^)]*)\)/g)) {
    const a = m[2].split(/[\s,]+/).filter(Boolean).map(Number);
    if (m[1] === 'translate') doc.translate(a[0] ?? 0, a[1] ?? 0);
    else if (m[1] === 'scale') doc.scale(a[0] ?? 1, a[1] ?? a[0] ?? 1);
    else doc.rotate(a[0] ?? 0, { origin: [a[1] ?? 0, a[2] ?? 0] });
  }
}

interface Ctx { doc: Doc; markers: Map<string, El>; width: number; height: number }

/** Fill and/or stroke the current path with the element's paint (SVG defaults: fill black, no stroke). */
function paint(ctx: Ctx, a: Attrs, defaultFill = SVG_DEFAULT_FILL): void {
  const { doc } = ctx;
  const fill = a.fill === undefined ? defaultFill : String(a.fill);
  const stroke = a.stroke === undefined ? 'none' : String(a.stroke);
  const hasFill = fill !== 'none', hasStroke = stroke !== 'none' && num(a['stroke-width'], 1) > 0;
  const opacity = num(a.opacity, 1);
  if (hasFill) doc.fillColor(fill, num(a['fill-opacity'], 1) * opacity);
  if (hasStroke) {
    doc.strokeColor(stroke, num(a['stroke-opacity'], 1) * opacity).lineWidth(num(a['stroke-width'], 1));
    doc.lineJoin((a['stroke-linejoin'] as 'round' | 'miter' | 'bevel') ?? 'miter');
    const dash = a['stroke-dasharray'];
    if (dash !== undefined && dash !== 'none') doc.dash(String(dash).split(/[\s,]+/).map(Number) as unknown as number, {});
    else doc.undash();
  }
  if (hasFill && hasStroke) doc.fillAndStroke();
  else if (hasFill) doc.fill();
  else if (hasStroke) doc.stroke();
}

function drawMarker(ctx: Ctx, e: El, a: Attrs): void {
  const ref = /url\(#([^)]+)\)/.exec(String(a['marker-end'] ?? ''));
  const marker = ref && ctx.markers.get(ref[1]);
  if (!marker) return;
  let ends: { end: Pt; from: Pt } | undefined;
  if (e.tag === 'path') ends = pathEnd(String(a.d ?? ''));
  else if (e.tag === 'line') ends = { from: { x: num(a.x1), y: num(a.y1) }, end: { x: num(a.x2), y: num(a.y2) } };
  else if (e.tag === 'polyline') {
    const p = String(a.points ?? '').trim().split(/[\s,]+/).map(Number);
    if (p.length >= 4) ends = { from: { x: p[p.length - 4], y: p[p.length - 3] }, end: { x: p[p.length - 2], y: p[p.length - 1] } };
  }
  if (!ends) return;
  const m = marker.attrs;
  const vb = String(m.viewBox ?? '0 0 10 10').split(/[\s,]+/).map(Number);
  const k = num(m.markerWidth, 3) / vb[2];
  const angle = (Math.atan2(ends.end.y - ends.from.y, ends.end.x - ends.from.x) * 180) / Math.PI;
  const { doc } = ctx;
  doc.save();
  doc.translate(ends.end.x, ends.end.y).rotate(angle).scale(k).translate(-num(m.refX), -num(m.refY));
  for (const c of marker.children ?? []) if (typeof c !== 'string') draw(ctx, c, {});
  doc.restore();
}

function drawText(ctx: Ctx, e: El, a: Attrs): void {
  const { doc } = ctx;
  const size = num(a['font-size'], 16);
  const face = faceOf(a['font-weight'], a['font-style']);
  doc.font(face).fontSize(size);
  let x = num(a.x), y = num(a.y);
  const lines: { text: string; x: number; y: number; anchor: string }[] = [];
  for (const c of e.children ?? []) {
    if (typeof c === 'string') lines.push({ text: c, x, y, anchor: String(a['text-anchor'] ?? 'start') });
    else if (c.tag === 'tspan') {
      if (c.attrs.x !== undefined) x = num(c.attrs.x);
      if (c.attrs.dy !== undefined) y += num(c.attrs.dy);
      lines.push({ text: (c.children ?? []).filter((s): s is string => typeof s === 'string').join(''), x, y, anchor: String(c.attrs['text-anchor'] ?? a['text-anchor'] ?? 'start') });
    }
  }
  const fill = a.fill === undefined ? SVG_DEFAULT_FILL : String(a.fill);
  const halo = a.stroke !== undefined && a.stroke !== 'none' && a['paint-order'] === 'stroke';
  for (const l of lines) {
    const w = doc.widthOfString(l.text);
    const lx = l.anchor === 'middle' ? l.x - w / 2 : l.anchor === 'end' ? l.x - w : l.x;
    const opts = { lineBreak: false, baseline: 'alphabetic' as const };
    if (halo) {
      doc.save();
      doc.strokeColor(String(a.stroke)).lineWidth(num(a['stroke-width'], 1)).lineJoin('round').undash();
      doc.text(l.text, lx, l.y, { ...opts, stroke: true, fill: false });
      doc.restore();
    }
    if (fill !== 'none') {
      doc.fillColor(fill, num(a['fill-opacity'], 1));
      doc.text(l.text, lx, l.y, { ...opts, fill: true, stroke: !halo && a.stroke !== undefined && a.stroke !== 'none' });
    }
  }
}

function draw(ctx: Ctx, e: El, inherited: Attrs): void {
  if (e.tag === 'title' || e.tag === 'desc' || e.tag === 'defs' || e.tag === 'marker') return;
  const a: Attrs = { ...inherited, ...e.attrs };
  // presentation attributes inherit; geometry and transforms do not
  const inherit: Attrs = {};
  for (const k of ['fill', 'stroke', 'stroke-width', 'font-size', 'font-weight', 'font-style', 'text-anchor', 'stroke-dasharray', 'opacity']) if (a[k] !== undefined) inherit[k] = a[k];
  const { doc } = ctx;
  doc.save();
  applyTransform(doc, e.attrs.transform);
  const haloFirst = e.attrs['paint-order'] === 'stroke';
  switch (e.tag) {
    case 'svg':
    case 'g':
      for (const c of e.children ?? []) if (typeof c !== 'string') draw(ctx, c, inherit);
      break;
    case 'rect': {
      const w = a.width === '100%' ? ctx.width : num(a.width), h = a.height === '100%' ? ctx.height : num(a.height);
      const rx = num(a.rx, 0);
      if (rx > 0) doc.roundedRect(num(a.x), num(a.y), w, h, rx); else doc.rect(num(a.x), num(a.y), w, h);
      paint(ctx, a);
      break;
    }
    case 'circle': doc.circle(num(a.cx), num(a.cy), num(a.r)); paint(ctx, a); break;
    case 'line': doc.moveTo(num(a.x1), num(a.y1)).lineTo(num(a.x2), num(a.y2)); paint(ctx, { ...a, fill: 'none' }); drawMarker(ctx, e, a); break;
    case 'polyline': {
      const p = String(a.points ?? '').trim().split(/[\s,]+/).filter(Boolean).map(Number);
      if (p.length >= 4) {
        doc.moveTo(p[0], p[1]);
        for (let i = 2; i + 1 < p.length; i += 2) doc.lineTo(p[i], p[i + 1]);
        paint(ctx, a);
      }
      drawMarker(ctx, e, a);
      break;
    }
    case 'path':
      if (haloFirst && a.stroke !== undefined) {
        doc.path(String(a.d)); paint(ctx, { ...a, fill: 'none' });
        doc.path(String(a.d)); paint(ctx, { ...a, stroke: 'none' });
      } else { doc.path(String(a.d ?? '')); paint(ctx, a); }
      drawMarker(ctx, e, a);
      break;
    case 'text': drawText(ctx, e, a); break;
    default: break;
  }
  doc.restore();
}

/** The figure as a one-page PDF, `widthPt` × (its height at that scale) points, fonts embedded. */
export function figureToPdf(root: El, widthPt: number, title: string): Promise<Uint8Array> {
  const { width, height } = viewSize(root);
  const s = widthPt / width;
  const doc = new PDFDocument({ size: [widthPt, height * s], margin: 0, autoFirstPage: true, compress: true, info: { Title: title, Creator: 'Loopfold', Producer: 'Loopfold', CreationDate: new Date(0) } });
  for (const f of ALL_FACES) doc.registerFont(f, fontFile(f));
  const markers = new Map<string, El>();
  const collect = (e: El) => {
    if (e.tag === 'marker' && typeof e.attrs.id === 'string') markers.set(e.attrs.id, e);
    for (const c of e.children ?? []) if (typeof c !== 'string') collect(c);
  };
  collect(root);
  doc.scale(s);
  draw({ doc, markers, width, height }, { ...root, attrs: { ...root.attrs, transform: undefined } }, {});
  const chunks: Buffer[] = [];
  return new Promise((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => { const b = Buffer.concat(chunks); resolve(new Uint8Array(b.buffer, b.byteOffset, b.byteLength)); });
    doc.on('error', reject);
    doc.end();
  });
}
