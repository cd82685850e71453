/**
 * `--svg FILE` for the commands that draw a chart or a network (`simulate`,
 * `sampled`, `curves`): the file the app's Numbers pane exports for the same
 * inputs, from the same builders in `src/export/charts.ts`.
 */
import type { Model } from '../core/model/types';
import { studyCaption, type StudyAt } from '../export/caption';
import type { FigureOptions } from '../export/charts';
import type { El } from '../export/scene';
import { svgDocument } from '../export/svg';
import { CliError, type CliArgs, type CliIO } from './commands/types';

/** The options every figure-drawing command takes. */
export const figureOptions = { svg: true, caption: false } as const;

/** Where --svg goes ('-' prints it), or undefined without --svg; options that only shape the figure need --svg. */
export function svgTarget(args: CliArgs, figureOnly: string[]): string | undefined {
  const v = args.options.svg;
  if (v === true || v === '') throw new CliError('--svg needs a file name, e.g. --svg figure.svg (--svg - prints the SVG)', 2);
  if (v === undefined) {
    const stray = ['caption', ...figureOnly].find((o) => args.options[o] !== undefined);
    if (stray) throw new CliError(`--${stray} shapes the figure: give --svg FILE too`, 2);
  }
  return v;
}

/** Heading always; the caption (interval and study length) with --caption. */
export function figureOptionsOf(args: CliArgs, model: Model, study: StudyAt): FigureOptions {
  if (args.options.caption !== true) return { heading: true };
  const caption = studyCaption(model, study);
  if (caption === undefined) throw new CliError('--caption states the sampling interval and the study length: give --interval too', 2);
  return { heading: true, caption };
}

/** Write the figure to `target` (or print it for '-'); reports the file on stderr. */
export function writeSvg(target: string, figure: El, io: CliIO): void {
  const svg = svgDocument(figure);
  if (target === '-') { io.out(svg); return; }
  try {
    io.writeFile(target, svg);
  } catch (e) {
    throw new CliError(`cannot write ${target}: ${(e as Error).message}`);
  }
  io.err(`wrote ${target} (${new TextEncoder().encode(svg).length} bytes)`);
}
