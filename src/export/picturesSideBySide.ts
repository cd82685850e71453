/**
 * The pictures of one study side by side in one figure: each panel's title
 * and one-line reading above its own figure (the figures of pictures.ts and
 * charts.ts, placed unchanged as nested `<svg>` elements), a heading and a
 * caption around them. The app's side-by-side view exports this; no DOM.
 */
import { CHART_STYLE as C } from '../theme/visual';
import { figure, type FigureOptions } from './charts';
import { wrapText, type Attr, type El } from './scene';

export interface SideBySidePanel {
  key: string;
  title: string;
  reading: string;
  figure: El | null;
}

const PAD = 10;
const GAP = 18;
const el = (tag: string, attrs: Record<string, Attr>, children?: (El | string)[]): El => ({ tag, attrs, ...(children ? { children } : {}) });
const num = (a: Attr | undefined, dflt: number) => (typeof a === 'number' ? a : typeof a === 'string' && Number.isFinite(Number(a)) ? Number(a) : dflt);

/**
 * @example svgDocument(sideBySideFigure('Evening unrest: three pictures at 3 h', panels, { heading: true, caption }))
 */
export function sideBySideFigure(label: string, panels: readonly SideBySidePanel[], opts: FigureOptions = {}): El {
  const widths = panels.map((p) => Math.max(240, p.figure ? num(p.figure.attrs.width, 320) : 240));
  const tops = panels.map((p, i) => {
    const title = wrapText(p.title, widths[i], 6.8);
    const reading = wrapText(p.reading, widths[i], 5.9);
    return { title, reading, height: 6 + title.length * 15 + reading.length * 13 + 8 };
  });
  const head = Math.max(...tops.map((t) => t.height));
  const height = head + Math.max(...panels.map((p) => (p.figure ? num(p.figure.attrs.height, 200) : 20))) + PAD;
  const body: El[] = [];
  let x = PAD;
  panels.forEach((p, i) => {
    const t = tops[i];
    const kids: El[] = [];
    kids.push(el('text', { x: 0, y: 14, 'font-size': 12, 'font-weight': 700, fill: C.text }, t.title.map((s, k) => el('tspan', { x: 0, dy: k ? 15 : 0 }, [s]))));
    kids.push(el('text', { x: 0, y: 14 + t.title.length * 15, 'font-size': 10.5, fill: C.text, 'data-part': 'reading' }, t.reading.map((s, k) => el('tspan', { x: 0, dy: k ? 13 : 0 }, [s]))));
    if (p.figure) {
      const { xmlns: _x, role: _r, ...attrs } = p.figure.attrs;
      void _x;
      void _r;
      kids.push({ ...p.figure, attrs: { ...attrs, x: 0, y: head } });
    } else kids.push(el('text', { x: 0, y: head + 14, 'font-size': 10.5, fill: C.label }, ['Not defined here.']));
    body.push(el('g', { transform: `translate(${x},0)`, 'data-panel': p.key }, kids));
    x += widths[i] + GAP;
  });
  return figure('pictures-side-by-side', label, x - GAP + PAD, height, body, opts);
}
