/**
 * `loopfold render MODEL.json [--interval D [--window W | --samples N]] [--view …] [--caption] --out fig.svg`:
 * the figure the app exports, from the same view model, the same layout
 * function and the same SVG renderer.
 */
import type { Model } from '../../core/model/types';
import { orderingAt } from '../../core/ordering/index';
import type { StudyDesign } from '../../core/ordering/types';
import { mechanismView, orderingView } from '../../core/view/derive';
import type { ViewMode, ViewModel } from '../../core/view/types';
import { studyCaption } from '../../export/caption';
import { renderSvg } from '../../export/svg';
import { drawnPositions } from '../../layout/instant';
import { durationOption, loadModel, variableByIdOrLabel } from '../load';
import { printView } from '../../export/print/figure';
import { printMultiples } from '../../export/print/multiples';
import { parseDuration } from '../../core/model/units';
import { outTarget, printOptionsOf, PRINT_OPTIONS, writeFigure } from '../output/write';
import { parseHoldOption } from './interventions';
import { CliError, type CliArgs, type CliCommand } from './types';

const VIEWS: readonly ViewMode[] = ['ordering', 'mechanism', 'unrolled'];

export interface RenderRequest {
  model: Model;
  view: ViewMode;
  design: StudyDesign;
  caption: boolean;
  /** Keys of simultaneous blocks to fold. */
  folded?: string[];
}

/** The caption the app and the command line put under a figure at an interval. */
export function figureCaption(model: Model, design: StudyDesign): string | undefined {
  return studyCaption(model, design);
}

/** The view model of a render request. */
export function renderView(req: RenderRequest): ViewModel {
  if (req.view === 'mechanism') return mechanismView(req.model);
  const ordering = orderingAt(req.model, req.design);
  return orderingView(req.model, ordering, { mode: req.view, folded: req.folded, interval: req.design.interval, window: req.design.window, samples: req.design.samples });
}

/** The SVG text of a render request. */
export async function renderFigure(req: RenderRequest): Promise<string> {
  const [{ figureLayout }, { nodeElk }] = await Promise.all([import('../../layout/figure'), import('../../layout/node')]);
  const vm = renderView(req);
  const layout = await figureLayout(nodeElk(), vm, vm.mode === 'mechanism' ? drawnPositions(req.model.variables) : undefined);
  return renderSvg(vm, layout, { caption: req.caption, captionText: figureCaption(req.model, req.design) });
}

/** A comma-separated list option. */
function listOption(args: CliArgs, name: string, example: string): string[] {
  const v = args.options[name];
  if (v === true || v === undefined || v.trim() === '') throw new CliError(`--${name} needs a list, e.g. --${name} ${example}`, 2);
  return v.split(',').map((x) => x.trim()).filter(Boolean);
}

function requestFromArgs(args: CliArgs, model: Model): RenderRequest {
  const view = (args.options.view ?? 'ordering') as string;
  if (!VIEWS.includes(view as ViewMode)) throw new CliError(`--view must be ordering, mechanism or unrolled, not "${view}"`, 2);
  const design: StudyDesign = {};
  const interval = durationOption(args, 'interval', model);
  if (interval === undefined && view !== 'mechanism') throw new CliError('--interval is needed for the ordering and unrolled views, e.g. --interval 3h', 2);
  if (interval !== undefined) design.interval = interval;
  const window = durationOption(args, 'window', model);
  const samples = args.options.samples;
  if (window !== undefined && samples !== undefined) throw new CliError('give either --window or --samples, not both', 2);
  if (window !== undefined) design.window = window;
  if (samples !== undefined) {
    const n = Number(samples);
    if (samples === true || !Number.isInteger(n) || n < 2) throw new CliError(`--samples must be a whole number of at least 2, not "${samples}"`, 2);
    design.samples = n;
  }
  if (args.options.hold !== undefined) {
    if (view === 'mechanism') throw new CliError('--hold applies to the ordering and unrolled views (the mechanism is drawn as sketched)', 2);
    design.hold = parseHoldOption(args.options.hold, model);
  }
  const fold = args.options.fold;
  if (fold === true) throw new CliError('--fold needs block keys, e.g. --fold a+b (see loopfold order --json for the blocks)', 2);
  // members by id or label; a name that is neither is kept, and the check below lists the blocks there are
  const member = (v: string) => { try { return variableByIdOrLabel(model, v, 'fold'); } catch { return v.trim(); } };
  const folded = typeof fold === 'string' ? fold.split(',').map((k) => k.split('+').map(member).sort().join('+')) : undefined;
  if (folded && view !== 'mechanism') checkFoldKeys(folded, model, design);
  return { model, view: view as ViewMode, design, caption: args.options.caption === true, folded };
}

/** Every key of --fold must name a simultaneous block at this interval; the message lists the blocks there are. */
function checkFoldKeys(keys: string[], model: Model, design: StudyDesign): void {
  const o = orderingAt(model, design);
  const blocks = o.blocks.filter((b) => b.variables.length > 1).map((b) => [...b.variables].sort().join('+'));
  for (const k of keys) {
    if (blocks.includes(k)) continue;
    const there = blocks.length ? `the blocks at this interval are ${blocks.join(', ')}` : 'there is no simultaneous block at this interval';
    throw new CliError(`--fold: "${k}" is not a simultaneous block; ${there}`, 2);
  }
}

export const renderCommand: CliCommand = {
  name: 'render',
  summary: 'write the figure of a view at a sampling interval as SVG, PNG or PDF (the same as the app exports)',
  usage: 'MODEL.json [--interval D [--window W | --samples N]] [--view ordering|mechanism|unrolled] [--at D1,D2,… [--columns N]] [--focus x,y] [--hold x=v] [--fold a+b,…] [--caption] [--width column|1.5-column|two-columns|120mm|800px] [--font-size PT] [--palette default|colour-blind|greyscale] [--background white|transparent|paper] [--no-title] [--caption-text TEXT] [--dpi N] [--text paths] --out fig.svg|fig.png|fig.pdf',
  options: { interval: true, window: true, samples: true, view: true, caption: false, fold: true, hold: true, at: true, columns: true, focus: true, ...PRINT_OPTIONS },
  async run(args, io) {
    const model = loadModel(args, io);
    const out = outTarget(args);
    if (out === undefined) throw new CliError('--out FILE is needed: .svg, .png or .pdf (use --out - to print the SVG)', 2);
    const multiples = args.options.at !== undefined;
    if (multiples && args.options.interval !== undefined) throw new CliError('give either --interval (one figure) or --at (one panel per interval), not both', 2);
    const req = requestFromArgs(multiples ? { ...args, options: { ...args.options, interval: '1' } } : args, model);
    const opts = printOptionsOf(args);
    const focus = args.options.focus === undefined ? undefined : listOption(args, 'focus', 'stress,mood').map((v) => variableByIdOrLabel(model, v, 'focus'));
    if (focus && req.view === 'mechanism') throw new CliError('--focus summarises an ordering: use it with --view ordering or unrolled', 2);
    // ELK is loaded only by the commands that lay out a figure (a quicker start for the others)
    const [{ figureLayout }, { nodeElk }] = await Promise.all([import('../../layout/figure'), import('../../layout/node')]);
    const layoutOf = (vm: ViewModel) => figureLayout(nodeElk(), vm, vm.mode === 'mechanism' ? drawnPositions(req.model.variables) : undefined);
    let fig;
    if (multiples) {
      if (req.view === 'mechanism') throw new CliError('--at draws the ordering (or --view unrolled) at each interval; the mechanism has no interval', 2);
      if (focus) throw new CliError('--focus and --at cannot be combined; draw the summary at one --interval', 2);
      const intervals = listOption(args, 'at', '"10 min,3h,1 day,4 weeks"').map((t) => {
        const d = parseDuration(t, model.timeUnit);
        if (!d.ok) throw new CliError(`--at: ${d.message}`, 2);
        return d.value;
      });
      if (intervals.length < 2) throw new CliError('--at needs two intervals or more, e.g. --at "10 min,3h,1 day,4 weeks"', 2);
      const c = args.options.columns;
      const columns = c === undefined ? undefined : Number(c);
      if (columns !== undefined && !(Number.isInteger(columns) && columns >= 1)) throw new CliError(`--columns must be a whole number of at least 1, not "${String(c)}"`, 2);
      const { interval: _ignored, ...rest } = req.design;
      void _ignored;
      fig = await printMultiples({ model, intervals, design: rest, view: req.view === 'unrolled' ? 'unrolled' : 'ordering', columns, caption: req.caption }, opts, layoutOf);
    } else {
      if (args.options.columns !== undefined) throw new CliError('--columns lays out the panels of --at', 2);
      fig = await printView(req, opts, layoutOf, focus);
    }
    await writeFigure(out, fig, opts, io, String(fig.root.attrs['aria-label'] ?? 'Loopfold figure'));
    return 0;
  },
};
