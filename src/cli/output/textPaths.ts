/**
 * Text as outlines: every `<text>` of a figure replaced by one `<path>` of
 * its glyphs in DejaVu Sans (shaped by fontkit), keeping its fill, stroke,
 * halo (`paint-order`) and transform, so the SVG looks the same where the
 * font is not installed. The text stays readable to software as the path's
 * `aria-label`. Node only (reads the font files).
 */
import type { El } from '../../export/scene';
import { faceOf, fontOf } from './fonts';

const TEXT_ONLY = new Set(['x', 'y', 'dx', 'dy', 'text-anchor', 'font-size', 'font-weight', 'font-style', 'font-family', 'dominant-baseline']);

/** Glyph outlines of one line starting at (x, y) on the baseline, and its advance width (drawing units). */
export function lineOutline(text: string, x: number, y: number, size: number, face: ReturnType<typeof faceOf>, anchor: string): { d: string; width: number } {
  const font = fontOf(face);
  const run = font.layout(text);
  const k = size / font.unitsPerEm;
  const width = run.advanceWidth * k;
  let pen = x - (anchor === 'middle' ? width / 2 : anchor === 'end' ? width : 0);
  let d = '';
  run.glyphs.forEach((g, i) => {
    const p = run.positions[i];
    d += g.path.transform(k, 0, 0, -k, pen + p.xOffset * k, y - p.yOffset * k).toSVG();
    pen += p.xAdvance * k;
  });
  return { d, width };
}

/** Measured width of a text line in DejaVu Sans (drawing units). */
export function textWidth(text: string, size: number, weight?: unknown): number {
  const font = fontOf(faceOf(weight, undefined));
  return (font.layout(text).advanceWidth * size) / font.unitsPerEm;
}

function textToPath(e: El, inherited: Record<string, unknown>): El {
  const a = { ...inherited, ...e.attrs } as Record<string, string | number | undefined>;
  const size = Number(a['font-size'] ?? 16);
  const face = faceOf(a['font-weight'], a['font-style']);
  const anchor = String(a['text-anchor'] ?? 'start');
  let x = Number(a.x ?? 0), y = Number(a.y ?? 0);
  let d = '';
  const words: string[] = [];
  for (const c of e.children ?? []) {
    if (typeof c === 'string') {
      d += lineOutline(c, x, y, size, face, anchor).d;
      words.push(c);
    } else if (c.tag === 'tspan') {
      if (c.attrs.x !== undefined) x = Number(c.attrs.x);
      if (c.attrs.dy !== undefined) y += Number(c.attrs.dy);
      const t = (c.children ?? []).filter((s): s is string => typeof s === 'string').join('');
      d += lineOutline(t, x, y, size, face, String(c.attrs['text-anchor'] ?? anchor)).d;
      words.push(t);
    }
  }
  const attrs: Record<string, string | number | undefined> = {};
  for (const [k, v] of Object.entries(e.attrs)) if (!TEXT_ONLY.has(k)) attrs[k] = v;
  return { tag: 'path', attrs: { ...attrs, d: d || 'M0,0', 'aria-label': words.join(' ') } };
}

/** The figure with every text drawn as glyph outlines. */
export function textAsPaths(root: El): El {
  const walk = (e: El, inherited: Record<string, unknown>): El => {
    const inh = { ...inherited };
    for (const k of ['font-size', 'font-weight', 'font-style', 'text-anchor']) if (e.attrs[k] !== undefined) inh[k] = e.attrs[k];
    if (e.tag === 'text') return textToPath(e, inherited);
    if (!e.children) return e;
    return { ...e, children: e.children.map((c) => (typeof c === 'string' ? c : walk(c, inh))) };
  };
  return walk(root, {});
}
