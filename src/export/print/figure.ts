/**
 * Figures for print: a view (ordering, three instants, mechanism) or a chart
 * drawn at a chosen width so that no text is smaller than 7 pt. When the
 * view does not fit the width at that size, its layout adapts — the three
 * instants stacked, blocks folded, the rows of the ordering wrapped — and
 * the figure says so in `notes`; the text is never shrunk below 7 pt unless
 * nothing else fits, and then `notes` says that too. Shared by the app's
 * export dialog and the command line; the layout engine is passed in.
 */
import type { Model } from '../../core/model/types';
import { orderingAt } from '../../core/ordering/index';
import type { StudyDesign } from '../../core/ordering/types';
import { mechanismView, nodeSize, orderingView } from '../../core/view/derive';
import type { ViewMode, ViewModel } from '../../core/view/types';
import { MARGIN, type Layout } from '../../layout/types';
import { viewCaption } from '../caption';
import { buildScene, type El } from '../scene';
import { stackInstants, wrapRows } from './adapt';
import { foldedAwayFrom, summaryView } from './summary';
import { DEFAULT_FONT_PT, MIN_TEXT_PT, widthPt, widthText, type PrintOptions } from './options';
import { fontSizes, minusSigns, recolour, sized, smallestTextPt, withBackground } from './transform';
import { fixedText } from '../../present/index';

export interface ViewRequest {
  model: Model;
  view: ViewMode;
  design: StudyDesign;
  /** Keys of simultaneous blocks to fold. */
  folded?: string[];
  /** Put the study caption (interval and study length) under the figure. */
  caption?: boolean;
}

export interface PrintedFigure {
  root: El;
  /** What was changed to fit the width, or why the text is still small. */
  notes: string[];
  /** The smallest text on the page, in points. */
  smallestPt: number;
}

/** The view model of a request. */
export function viewOf(req: ViewRequest, folded = req.folded): ViewModel {
  if (req.view === 'mechanism') return mechanismView(req.model);
  const ordering = orderingAt(req.model, req.design);
  return orderingView(req.model, ordering, { mode: req.view, folded, interval: req.design.interval, window: req.design.window, samples: req.design.samples });
}

/** Scene text sizes (units): variable names 13, the smallest (legend glyphs) 11. */
const SCENE_MAIN = 13, SCENE_MIN = 11;

/** Points per drawing unit that make the main text `fontPt` and keep every text at 7 pt or more. */
export function targetScale(fontPt: number, main: number, min: number): number {
  return Math.max(fontPt / main, MIN_TEXT_PT / min);
}

/**
 * Folded blocks whose card would be wider than the room name fewer members ("4 together: a, b +2"):
 * the badge still gives the count, and the caption of the block lists no more than fits.
 */
export function narrowFoldedCards(vm: ViewModel, room: number): ViewModel {
  const max = room - 2 * MARGIN - 8;
  const nodes = vm.nodes.map((n) => {
    if (n.count === undefined || n.width <= max) return n;
    const m = /^(\d+ together: )(.*)$/.exec(n.label);
    if (!m) return n;
    const names = m[2].replace(/ \+\d+$/, '').split(', ');
    let k = names.length;
    const labelWith = (j: number) => `${m[1]}${names.slice(0, j).join(', ')}${n.count! > j ? ` +${n.count! - j}` : ''}`;
    const widthOf = (label: string) => nodeSize(label, false).width + 24;
    while (k > 1 && widthOf(labelWith(k)) > max) k--;
    const label = labelWith(k);
    return { ...n, label, width: Math.min(n.width, widthOf(label)) };
  });
  return { ...vm, nodes };
}

/** Recolour, ground, minus signs and physical size: the steps every printed figure takes. */
export function finish(root: El, opts: PrintOptions): El {
  let r = minusSigns(root);
  r = recolour(r, opts.palette ?? 'default');
  if (opts.background) r = withBackground(r, opts.background);
  return sized(r, opts.width);
}

/**
 * A view drawn for print. `layoutOf` lays out a view model (ELK in Node or in a worker); `drawn` gives
 * the mechanism's positions as the modeller drew them.
 */
export async function printView(req: ViewRequest, opts: PrintOptions, layoutOf: (vm: ViewModel) => Promise<Layout>, focus?: readonly string[]): Promise<PrintedFigure> {
  const scale = targetScale(opts.fontSize ?? DEFAULT_FONT_PT, SCENE_MAIN, SCENE_MIN);
  const room = opts.width ? widthPt(opts.width) / scale : undefined;
  // one layout per view model (the rooms tried below share them)
  const laid = new Map<string, Promise<Layout>>();
  const layoutOnce = (vm: ViewModel): Promise<Layout> => {
    const key = JSON.stringify([vm.mode, vm.nodes.map((n) => [n.id, n.label, n.width, n.height]), vm.edges.map((e) => e.id), vm.groups.map((g) => g.id), vm.folded]);
    let l = laid.get(key);
    if (!l) { l = layoutOf(vm); laid.set(key, l); }
    return l;
  };
  const draw = async (fit: number | undefined, stagger = false) => {
    const { vm, layout, notes } = await adaptedView(req, fit, layoutOnce, opts.width ? widthText(opts.width) : '', focus, stagger);
    // the caption adds what the title does not say (the title names the interval and the study)
    const captionText = req.caption ? (opts.caption ?? (req.view === 'mechanism' ? undefined : viewCaption(vm))) : opts.caption;
    return { notes, laidOut: layout.width, root: buildScene(vm, layout, { title: opts.title !== false, caption: captionText !== undefined, captionText, width: room, lanesBesideRows: notes.some((n) => n.startsWith('rows of the ordering are wrapped')) }) };
  };
  let fit = room;
  let { root, notes, laidOut } = await draw(fit);
  if (room !== undefined && req.view === 'ordering' && Number(root.attrs.width) > room + 0.5) {
    const staggered = await draw(fit, true);
    if (Number(staggered.root.attrs.width) < Number(root.attrs.width)) ({ root, notes, laidOut } = staggered);
  }
  // lines that arc beside a row widen the drawing past its layout: lay it out again in a room narrower by
  // that much than the layout was (three times at most), so the figure, not its text, gives way
  // (wrapping rows adds lines that arc, so several rooms are tried — narrower by the overflow than the room
  // or than the layout, or by a half or a quarter of it — and the narrowest drawing is kept)
  for (let k = 0; k < 3 && room !== undefined && fit !== undefined; k++) {
    const drawnWidth = Number(root.attrs.width);
    if (!(drawnWidth > room + 0.5)) break;
    const from = Math.min(fit, laidOut), over = drawnWidth - room;
    // (at least one unit: then every row is wrapped to one variable a line)
    const rooms = [...new Set([fit - over, from - over, from - over / 2, from - over / 4].map((r) => Math.max(1, r)))];
    let best: { fit: number; drawn: Awaited<ReturnType<typeof draw>> } | undefined;
    for (const r of rooms) for (const stagger of req.view === 'ordering' ? [false, true] : [false]) {
      // (an ordering's wrapped lines also tried alternating between the left and the right side)
      const tried = await draw(r, stagger);
      if (Number(tried.root.attrs.width) < Number((best?.drawn ?? { root }).root.attrs.width)) best = { fit: r, drawn: tried };
    }
    if (!best) break;
    fit = best.fit;
    ({ root, notes, laidOut } = best.drawn);
  }
  root = finish(root, opts);
  const smallestPt = smallestTextPt(root, opts.width);
  if (opts.width && smallestPt < MIN_TEXT_PT - 1e-9) notes.push(`the figure does not fit ${widthText(opts.width)} legibly: its smallest text is ${fixedText(smallestPt, 1, { ascii: true })} pt (under ${MIN_TEXT_PT} pt); choose a wider preset or fold blocks`);
  return { root, notes, smallestPt };
}

/**
 * The view of a request laid out to fit `room` drawing units where it can: the three instants stacked,
 * then every block folded, then the rows wrapped. `focus`: the summary of a big model (see summaryView).
 */
export async function adaptedView(req: ViewRequest, room: number | undefined, layoutOf: (vm: ViewModel) => Promise<Layout>, at: string, focus?: readonly string[], stagger = false): Promise<{ vm: ViewModel; layout: Layout; notes: string[] }> {
  const notes: string[] = [];
  const view = (folded?: string[]) => {
    const v = viewOf(req, folded);
    return focus ? summaryView(v, focus) : v;
  };
  let vm = focus ? view(foldedAwayFrom(viewOf(req), focus)) : view();
  if (focus) notes.push(`summary: ${focus.join(', ')} and their neighbours; the other blocks folded, the rest left out`);
  let layout = await layoutOf(vm);
  if (room !== undefined && layout.width > room) {
    if (vm.mode === 'unrolled') {
      layout = stackInstants(vm, layout, room);
      notes.push(`the three instants are stacked top to bottom to fit ${at}`);
    }
    if (layout.width > room && vm.groups.length > 0) {
      const all = [...new Set([...(req.folded ?? []), ...vm.folded, ...vm.groups.map((g) => g.key)])];
      vm = narrowFoldedCards(view(all), room);
      layout = await layoutOf(vm);
      if (vm.mode === 'unrolled') layout = stackInstants(vm, layout, room);
      notes.push(`${vm.groups.length + vm.folded.length === 1 ? 'the simultaneous block is' : 'the simultaneous blocks are'} folded to fit ${at}`);
    }
    if (layout.width > room && vm.mode !== 'unrolled') {
      const wrapped = wrapRows(vm, layout, room, undefined, stagger);
      if (wrapped !== layout) {
        layout = wrapped;
        notes.push(`rows of the ordering are wrapped onto several lines to fit ${at}`);
      }
    }
  }
  return { vm, layout, notes };
}

/**
 * A chart or network (built at its own size by `charts.ts`) for print: sized, recoloured, measured.
 * A chart drawn for the width (`FigureOptions.fitTo`) that changed its drawing names the change in
 * `notes`; at a width where its text would still fall under 7 pt the notes say so.
 */
export function printChart(root: El, opts: PrintOptions): PrintedFigure {
  const r = finish(root, opts);
  const smallestPt = smallestTextPt(r, opts.width);
  const notes: string[] = [];
  // a builder that changed its drawing to fit the width says how (`data-adapted` on its root)
  const adapted = root.attrs['data-adapted'];
  if (typeof adapted === 'string' && adapted) notes.push(opts.width ? `${adapted} to fit ${widthText(opts.width)}` : adapted);
  if (opts.width && smallestPt < MIN_TEXT_PT - 1e-9) notes.push(`the chart does not fit ${widthText(opts.width)} legibly: its smallest text is ${fixedText(smallestPt, 1, { ascii: true })} pt (under ${MIN_TEXT_PT} pt); choose a wider preset`);
  return { root: r, notes, smallestPt };
}

/** The width in drawing units a chart should be built at for `opts` (its main and smallest text given). */
export function chartRoom(opts: PrintOptions, main: number, min: number): number | undefined {
  if (!opts.width) return undefined;
  return widthPt(opts.width) / targetScale(opts.fontSize ?? DEFAULT_FONT_PT, main, min);
}

export { fontSizes };
