/**
 * A drawn figure (the `El` tree of `scene.ts` or `charts.ts`) made ready for
 * print: recoloured to a palette, its ground set, its size given in physical
 * units, and measured (the smallest text on the page in points). Pure: no
 * DOM, no fonts; the app and the command line both call it.
 */
import { WHITE } from '../../theme/tokens';
import { recolourMap, type PaletteName } from '../../theme/palettes';
import { PAPER } from '../../theme/visual';
import type { El } from '../scene';
import { PT_PER_MM, PT_PER_PX, widthPt, type Background, type PrintWidth } from './options';
import { rounded } from '../../present/index';

const COLOUR_ATTRS = ['fill', 'stroke', 'stop-color', 'color'];

function mapTree(node: El, f: (e: El) => El): El {
  const out = f(node);
  if (!out.children) return out;
  return { ...out, children: out.children.map((c) => (typeof c === 'string' ? c : mapTree(c, f))) };
}

/** The figure in another palette: every colour token of the default drawing replaced by the palette's. */
export function recolour(root: El, palette: PaletteName): El {
  if (palette === 'default') return root;
  const map = recolourMap(palette);
  return mapTree(root, (e) => {
    let attrs = e.attrs;
    for (const k of COLOUR_ATTRS) {
      const v = attrs[k];
      if (typeof v !== 'string') continue;
      const to = map.get(v.toLowerCase());
      if (to !== undefined) attrs = { ...attrs, [k]: to };
    }
    return attrs === e.attrs ? e : { ...e, attrs };
  });
}

/** Is this element the figure's ground (the full-size rect drawn first)? */
function isGround(e: El | string, root: El): boolean {
  if (typeof e === 'string' || e.tag !== 'rect') return false;
  const a = e.attrs;
  return Number(a.x ?? 0) === 0 && Number(a.y ?? 0) === 0 && (a.width === '100%' || Number(a.width) === Number(root.attrs.width)) && a.fill !== 'none';
}

/** The figure on a white, transparent or paper-toned ground. */
export function withBackground(root: El, background: Background): El {
  const kids = root.children ?? [];
  const i = kids.findIndex((c) => isGround(c, root));
  if (i < 0) return root;
  const ground = kids[i] as El;
  const next = [...kids];
  if (background === 'transparent') next.splice(i, 1);
  else next[i] = { ...ground, attrs: { ...ground.attrs, fill: background === 'white' ? WHITE : PAPER } };
  return { ...root, children: next };
}

/** Width and height of the figure's drawing in its own units (the viewBox). */
export function viewSize(root: El): { width: number; height: number } {
  const vb = String(root.attrs.viewBox ?? '').split(/[\s,]+/).map(Number);
  if (vb.length === 4 && vb.every(Number.isFinite)) return { width: vb[2], height: vb[3] };
  return { width: Number(root.attrs.width), height: Number(root.attrs.height) };
}

/** Points per unit of the drawing when it is printed at `width` (1 unit = 1 CSS px without a width). */
export function printScale(root: El, width: PrintWidth | undefined): number {
  return width ? widthPt(width) / viewSize(root).width : PT_PER_PX;
}

/** The figure sized for print: width and height in millimetres (the viewBox unchanged). */
export function sized(root: El, width: PrintWidth | undefined): El {
  if (!width) return root;
  const s = printScale(root, width);
  const { width: w, height: h } = viewSize(root);
  const mm = (pt: number) => `${rounded(pt / PT_PER_MM, 2)}mm`;
  return { ...root, attrs: { ...root.attrs, width: mm(w * s), height: mm(h * s) } };
}

export interface TextRun {
  /** The text as drawn. */
  text: string;
  /** Font size in the drawing's units. */
  size: number;
}

/** Every piece of text in the figure with its font size (inherited from the nearest element that sets one). */
export function textRuns(root: El): TextRun[] {
  const out: TextRun[] = [];
  const walk = (e: El, size: number, inText: boolean) => {
    const own = e.attrs['font-size'];
    const s = own !== undefined ? Number(own) : size;
    if (e.tag === 'title' || e.tag === 'desc') return;
    for (const c of e.children ?? []) {
      if (typeof c === 'string') { if ((e.tag === 'text' || e.tag === 'tspan' || inText) && c.trim()) out.push({ text: c, size: s }); }
      else walk(c, s, inText || e.tag === 'text');
    }
  };
  walk(root, 16, false);
  return out;
}

/** The smallest and the most used font size of the figure (drawing units). */
export function fontSizes(root: El): { min: number; main: number } {
  const runs = textRuns(root);
  if (runs.length === 0) return { min: Infinity, main: 13 };
  const weight = new Map<number, number>();
  for (const r of runs) weight.set(r.size, (weight.get(r.size) ?? 0) + r.text.length);
  const main = [...weight.entries()].sort((a, b) => b[1] - a[1] || b[0] - a[0])[0][0];
  return { min: Math.min(...runs.map((r) => r.size)), main };
}

/** The smallest text of the figure in points when printed at `width`. */
export function smallestTextPt(root: El, width: PrintWidth | undefined): number {
  return fontSizes(root).min * printScale(root, width);
}

/** Hyphen-minus used as a minus sign (before a digit, at the start or after a space, bracket, = or e) → U+2212. */
export function minusSigns(root: El): El {
  const fix = (s: string) => s.replace(/(^|[\s([=≈e])-(?=[\d.∞])/g, '$1−');
  return mapTree(root, (e) => {
    if (e.tag !== 'text' && e.tag !== 'tspan') return e;
    if (!e.children?.some((c) => typeof c === 'string')) return e;
    return { ...e, children: e.children.map((c) => (typeof c === 'string' ? fix(c) : c)) };
  });
}
