/**
 * Small multiples: the ordering of one model at several sampling intervals
 * (e.g. 10 min, 3 h, 1 day, 4 weeks) side by side in a row or a grid, each
 * panel headed by its interval, one title above and one legend below shared
 * by all panels (the roles, link kinds and blocks of any panel). Built from
 * the same scene as the single figure, so each panel is drawn exactly as the
 * ordering at that interval is drawn alone.
 */
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { StudyDesign } from '../../core/ordering/types';
import { studyText } from '../../core/view/derive';
import type { ViewModel } from '../../core/view/types';
import type { Layout } from '../../layout/types';
import { viewCaption } from '../caption';
import { buildScene, wrapText, type El } from '../scene';
import { adaptedView, finish, targetScale, type PrintedFigure } from './figure';
import { DEFAULT_FONT_PT, MIN_TEXT_PT, widthPt, widthText, type PrintOptions } from './options';
import { smallestTextPt } from './transform';
import { FONT_STACK, INK, PAPER } from '../../theme/visual';
import { fixedText } from '../../present/index';

const GAP = 16, HEAD = 26;
/** The narrowest panel worth drawing (drawing units): about two variables side by side. */
const MIN_CELL = 300;

export interface MultiplesRequest {
  model: Model;
  intervals: number[];
  /** The study length: a window, or a number of samples (per interval). */
  design: Omit<StudyDesign, 'interval'>;
  view?: 'ordering' | 'unrolled';
  /** Columns of the grid (default: all in one row when they fit the width, else as many as fit). */
  columns?: number;
  caption?: boolean;
}

const r1 = (x: number) => Math.round(x * 10) / 10;

/** The figure of the ordering at each interval, in a grid sharing one legend. */
export async function printMultiples(req: MultiplesRequest, opts: PrintOptions, layoutOf: (vm: ViewModel) => Promise<Layout>): Promise<PrintedFigure> {
  if (req.intervals.length < 2) throw new Error('give at least two intervals for small multiples');
  const room = opts.width ? widthPt(opts.width) / targetScale(opts.fontSize ?? DEFAULT_FONT_PT, 13, 11) : undefined;
  const n = req.intervals.length;
  // columns: as asked, else all in one row if the panels fit, else fewer
  const natural = await Promise.all(req.intervals.map((interval) => adaptedView({ model: req.model, view: req.view ?? 'ordering', design: { ...req.design, interval } }, undefined, layoutOf, '')));
  const widest = Math.max(...natural.map((p) => p.layout.width));
  let cols = req.columns ?? n;
  if (req.columns === undefined && room !== undefined && n * widest + (n - 1) * GAP > room) {
    // as many columns as panels of at least MIN_CELL units fit; each panel then adapts to its cell
    cols = Math.floor((room + GAP) / (MIN_CELL + GAP));
  }
  cols = Math.max(1, Math.min(n, cols));
  const cell = room !== undefined ? (room - (cols - 1) * GAP) / cols : widest;
  const at = opts.width ? `${widthText(opts.width)} in ${cols} column${cols > 1 ? 's' : ''}` : '';
  const panels = room !== undefined
    ? await Promise.all(req.intervals.map((interval) => adaptedView({ model: req.model, view: req.view ?? 'ordering', design: { ...req.design, interval } }, cell, layoutOf, at)))
    : natural;
  const notes = [...new Set(panels.flatMap((p) => p.notes))];
  const cellW = Math.max(cell, ...panels.map((p) => p.layout.width));
  const width = cols * cellW + (cols - 1) * GAP;
  const u = req.model.timeUnit;
  const title = `${req.model.name} — the ordering at ${req.intervals.map((d) => formatDuration(d, u)).join(', ')}`;
  const titleLines = opts.title !== false ? wrapText(title, width - 48, 9.6) : [];
  const children: (El | string)[] = [];
  let y = titleLines.length ? 16 + titleLines.length * 21 : 8;
  if (titleLines.length) children.push({ tag: 'text', attrs: { x: 24, y: 27, 'font-size': 16, 'font-weight': 700, fill: INK, 'data-part': 'title' }, children: titleLines.map((t, i) => ({ tag: 'tspan', attrs: { x: 24, dy: i ? 21 : 0 }, children: [t] })) });
  let defs: El | undefined;
  for (let r = 0; r * cols < n; r++) {
    const row = panels.slice(r * cols, r * cols + cols);
    const tops: number[] = [];
    row.forEach((p, c) => {
      const k = r * cols + c;
      const scene = buildScene(p.vm, p.layout, { title: false, legend: false, caption: false, width: cellW });
      const kids = (scene.children ?? []).filter((x): x is El => typeof x !== 'string');
      defs ??= kids.find((x) => x.tag === 'defs');
      const figure = kids.find((x) => x.attrs['data-part'] === 'figure');
      const head = `Δ = ${formatDuration(req.intervals[k], u)}`;
      const x = c * (cellW + GAP);
      children.push({ tag: 'g', attrs: { transform: `translate(${r1(x)},${r1(y)})`, 'data-panel': String(req.intervals[k]) }, children: [
        { tag: 'text', attrs: { x: 24, y: 18, 'font-size': 14, 'font-weight': 700, fill: INK }, children: [head] },
        { tag: 'g', attrs: { transform: `translate(0,${HEAD})` }, children: figure ? [figure] : [] },
      ] });
      // where the scene's figure ends: the layout, and the room made above and below it for arcs over or under a row
      tops.push(figure?.box?.[3] ?? (figure?.box?.[1] ?? 0) + p.layout.height);
    });
    y += HEAD + Math.max(...tops) + GAP;
  }
  // one legend for all panels: the roles, link kinds and blocks of any of them
  const all: ViewModel = {
    ...panels[0].vm,
    rolesShown: [...new Set(panels.flatMap((p) => p.vm.rolesShown))],
    kindsShown: [...new Set(panels.flatMap((p) => p.vm.kindsShown))],
    groups: panels.flatMap((p) => p.vm.groups),
    folded: panels.flatMap((p) => p.vm.folded),
  };
  const legendScene = buildScene(all, { nodes: {}, groups: {}, width, height: 0, source: 'elk' }, { title: false, caption: false, width });
  const legend = (legendScene.children ?? []).find((x): x is El => typeof x !== 'string' && x.attrs['data-part'] === 'legend');
  if (legend) {
    children.push({ ...legend, attrs: { ...legend.attrs, transform: `translate(24,${r1(y)})` } });
    y += Number(legendScene.attrs.height) - 12;
  }
  if (req.caption || opts.caption !== undefined) {
    const text = opts.caption ?? `${studyText(req.model, req.intervals[0], req.design.window, req.design.samples).replace(/ \(.*\)$/, '')} at each interval. ${panels.map((p, i) => `${formatDuration(req.intervals[i], u)}: ${viewCaption(p.vm)}`).join(' ')}`;
    const lines = wrapText(text, width - 48, 7.4);
    children.push({ tag: 'g', attrs: { 'data-part': 'caption' }, children: lines.map((t, i) => ({ tag: 'text', attrs: { x: 24, y: r1(y + 16 + i * 18), 'font-size': 13, fill: INK }, children: [t] })) });
    y += 16 + lines.length * 18;
  }
  const height = Math.ceil(y + 12);
  const w = Math.ceil(width);
  const root: El = {
    tag: 'svg',
    attrs: { xmlns: 'http://www.w3.org/2000/svg', width: w, height, viewBox: `0 0 ${w} ${height}`, 'font-family': FONT_STACK, role: 'img', 'aria-label': title, 'data-view': 'multiples' },
    children: [...(defs ? [defs] : []), { tag: 'rect', attrs: { x: 0, y: 0, width: '100%', height: '100%', fill: PAPER } }, ...children],
  };
  const printed = finish(root, opts);
  const smallestPt = smallestTextPt(printed, opts.width);
  if (opts.width && smallestPt < MIN_TEXT_PT - 1e-9) notes.push(`the panels do not fit ${widthText(opts.width)} legibly: the smallest text is ${fixedText(smallestPt, 1, { ascii: true })} pt; choose fewer columns (--columns) or a wider preset`);
  return { root: printed, notes, smallestPt };
}
