/**
 * The files of the export dialog, made by the same code as the command line:
 * a view through `printView` (the layout function of `loopfold render`), a
 * chart of the Numbers pane through `printChart` (as `--out` of `simulate`,
 * `sampled`, `curves`), written by the one SVG renderer. No DOM here: the
 * dialog draws PNGs on a canvas; the tests call these functions in Node and
 * compare them with the command line's files byte for byte.
 */
import type { Model } from '../../core/model/types';
import type { StudyAt } from '../../export/caption';
import type { FigureOptions } from '../../export/charts';
import { printChart, printView, type PrintedFigure, type ViewRequest } from '../../export/print/figure';
import { widthPt, type PrintOptions, type PrintWidth, type WidthPreset } from '../../export/print/options';
import { viewSize } from '../../export/print/transform';
import type { El } from '../../export/scene';
import { svgDocument } from '../../export/svg';
import { figureLayout } from '../../layout/figure';
import { drawnPositions } from '../../layout/instant';
import type { ElkRunner } from '../../layout/elk';
import { rounded } from '../../present/index';

/** What a figure is: a view (ordering, three instants, mechanism) or a chart built by `charts.ts`. */
export type FigureSource =
  | { kind: 'view'; request: ViewRequest }
  | {
      kind: 'chart';
      /** The chart's builder with its title and caption (the same call as the command line's). */
      build: (o: FigureOptions) => El | null;
      /** The caption the chart carries unless the dialog gives one. */
      caption?: string;
      /** The command line that draws this chart, without the print options and `--out` (for PDF); none when there is no such command. */
      cli?: string[];
    };

/** The dialog's choices: the print options, the format and the PNG's resolution. */
export interface ExportChoice extends PrintOptions {
  format: 'svg' | 'png' | 'pdf';
  dpi: number;
}

/** The figure with the print options applied, by the command line's own functions; null when the chart cannot be drawn. */
export async function printedFigure(source: FigureSource, opts: PrintOptions, elk: () => Promise<ElkRunner>): Promise<PrintedFigure | null> {
  if (source.kind === 'chart') {
    const el = source.build({ heading: opts.title !== false, caption: opts.caption ?? source.caption, ...fitTo(opts) });
    return el ? printChart(el, opts) : null;
  }
  const runner = await elk();
  const model = source.request.model;
  const layoutOf = (vm: Parameters<typeof figureLayout>[1]) => figureLayout(runner, vm, vm.mode === 'mechanism' ? drawnPositions(model.variables) : undefined);
  return printView(source.request, opts, layoutOf);
}

/** The print width and font size a chart builder may fit its drawing to (as the command line passes them). */
export function fitTo(opts: PrintOptions): Pick<FigureOptions, 'fitTo'> {
  return opts.width ? { fitTo: { widthPt: widthPt(opts.width), ...(opts.fontSize !== undefined ? { fontPt: opts.fontSize } : {}) } } : {};
}

/** The SVG file of a printed figure (what `--out fig.svg` writes). */
export function printedSvg(fig: PrintedFigure): string {
  return svgDocument(fig.root);
}

/** The PNG's size in pixels: the print width at `dpi` (as `--out fig.png --dpi N`), or the drawing's own size in CSS px. */
export function pngPixels(fig: PrintedFigure, opts: PrintOptions, dpi: number): { width: number; height: number } {
  const { width, height } = viewSize(fig.root);
  const wPt = opts.width ? widthPt(opts.width) : width * 0.75;
  const w = Math.max(1, Math.round((wPt / 72) * dpi));
  return { width: w, height: Math.max(1, Math.round((w * height) / width)) };
}

const PRESET_ARG: Record<WidthPreset, string> = { column: 'column', 'column-and-half': '1.5-column', 'two-columns': 'two-columns' };

function widthArg(w: PrintWidth): string {
  if ('px' in w) return `${w.px}px`;
  return w.preset ? PRESET_ARG[w.preset] : `${rounded(w.mm, 2)}mm`;
}

/** The print options as command-line arguments (the same parsers read them back). */
export function printArgs(opts: PrintOptions, dpi?: number): string[] {
  const a: string[] = [];
  if (opts.width) a.push('--width', widthArg(opts.width));
  if (opts.fontSize !== undefined) a.push('--font-size', String(opts.fontSize));
  if (opts.palette && opts.palette !== 'default') a.push('--palette', opts.palette);
  if (opts.background) a.push('--background', opts.background);
  if (opts.title === false) a.push('--no-title');
  if (opts.caption !== undefined) a.push('--caption-text', opts.caption);
  if (dpi !== undefined) a.push('--dpi', String(dpi));
  return a;
}

/** The command-line arguments of a view request (after `render MODEL.json`). */
export function viewArgs(req: ViewRequest): string[] {
  const a: string[] = [];
  const d = req.design;
  if (req.view !== 'mechanism' && d.interval !== undefined) a.push('--interval', String(d.interval));
  if (req.view !== 'ordering') a.push('--view', req.view);
  if (req.view !== 'mechanism') {
    if (d.window !== undefined) a.push('--window', String(d.window));
    if (d.samples !== undefined) a.push('--samples', String(d.samples));
    const holds = Object.entries(d.hold ?? {});
    if (holds.length) a.push('--hold', holds.map(([k, v]) => `${k}=${v}`).join(','));
    if (req.folded?.length) a.push('--fold', req.folded.join(','));
  }
  if (req.caption) a.push('--caption');
  return a;
}

/** The study's arguments of a chart command: the interval, the study length and `--caption` (as the pane's caption says them). */
export function studyArgs(study: StudyAt): string[] {
  if (study.interval === undefined) return [];
  const a = ['--interval', String(study.interval)];
  if (study.window !== undefined) a.push('--window', String(study.window));
  else if (study.samples !== undefined) a.push('--samples', String(study.samples));
  return [...a, '--caption'];
}

/** The whole argument list for the command line (after `loopfold`), or null when no command draws this figure. */
export function cliArgs(source: FigureSource, modelFile: string, opts: PrintOptions, out: string): string[] | null {
  if (source.kind === 'view') return ['render', modelFile, ...viewArgs(source.request), ...printArgs(opts), '--out', out];
  if (!source.cli) return null;
  const [command, ...rest] = source.cli;
  return [command, modelFile, ...rest, ...printArgs(opts), '--out', out];
}

/** An argument quoted for a POSIX shell when it needs it. */
export function shellWord(s: string): string {
  return /^[A-Za-z0-9_./,:+=@%-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

/** The command line to copy (in the project's folder), every argument quoted for the shell. */
export function commandText(args: readonly string[]): string {
  return ['npm', 'run', '-s', 'loopfold', '--', ...args.map(shellWord)].join(' ');
}

/** A model file name for the command line: the model saved under its own name. */
export function modelFileName(model: Model, stem: (name: string) => string): string {
  return `${stem(model.name)}.json`;
}
