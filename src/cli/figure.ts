/**
 * `--out FILE` for the commands that draw a chart or a network (`simulate`,
 * `sampled`, `curves`): the figure the app's Numbers pane exports for the
 * same inputs, from the same builders in `src/export/charts.ts`, made ready
 * for print (`src/export/print/`) and written as SVG, PNG or PDF by the
 * file's extension. `--svg FILE` is the older name of `--out FILE`.
 */
import type { Model } from '../core/model/types';
import { studyCaption, type StudyAt } from '../export/caption';
import type { FigureOptions } from '../export/charts';
import { printChart } from '../export/print/figure';
import type { El } from '../export/scene';
import { outTarget, printOptionsOf, PRINT_OPTIONS, writeFigure } from './output/write';
import { widthPt } from '../export/print/options';
import { CliError, type CliArgs, type CliIO } from './commands/types';

/** The options every chart-drawing command takes. */
export const figureOptions = { svg: true, caption: false, ...PRINT_OPTIONS } as const;

/** Where the figure goes ('-' prints the SVG), or undefined without --out; options that only shape the figure need --out. */
export function svgTarget(args: CliArgs, figureOnly: string[]): string | undefined {
  return outTarget(args, ['caption', ...figureOnly]);
}

/** Title (unless --no-title); the caption: --caption-text, or with --caption the interval and study length. */
export function figureOptionsOf(args: CliArgs, model: Model, study: StudyAt): FigureOptions {
  const heading = args.options['no-title'] !== true;
  const fit = fitToOf(args);
  const text = args.options['caption-text'];
  if (typeof text === 'string') return { heading, caption: text, ...fit };
  if (args.options.caption !== true) return { heading, ...fit };
  const caption = studyCaption(model, study);
  if (caption === undefined) throw new CliError('--caption states the sampling interval and the study length: give --interval too', 2);
  return { heading, caption, ...fit };
}

/** The print width and font size a chart may narrow its drawing to (`FigureOptions.fitTo`; the app's dialog passes the same). */
export function fitToOf(args: CliArgs): Pick<FigureOptions, 'fitTo'> {
  const o = printOptionsOf(args);
  return o.width ? { fitTo: { widthPt: widthPt(o.width), ...(o.fontSize !== undefined ? { fontPt: o.fontSize } : {}) } } : {};
}

/** Did the command line ask for the table too (it goes to stdout only on request when a figure is written)? */
export function tableWanted(args: CliArgs): boolean {
  return args.options.table === true || args.options.json === true || args.options.csv === true;
}

/** Write a chart or network to `target` in the format its extension names; notes and the size go to stderr. */
export async function writeSvg(target: string, figure: El, io: CliIO, args?: CliArgs): Promise<void> {
  const opts = args ? printOptionsOf(args) : { dpi: 300, textAsPaths: false };
  await writeFigure(target, printChart(figure, opts), opts, io, String(figure.attrs['aria-label'] ?? 'Loopfold figure'));
}
