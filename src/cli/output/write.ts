/**
 * Writing a figure to the file named by `--out`: the format by the file's
 * extension (.svg, .png, .pdf), anything else refused with a message; the
 * size reported in bytes as written. The print options every figure command
 * takes (`--width`, `--font-size`, `--palette`, `--background`, `--no-title`,
 * `--caption-text`, `--dpi`, `--text paths`) are parsed here.
 */
import { parseBackground, parseFontSize, parsePalette, parseWidth, widthPt, type Parsed, type PrintOptions } from '../../export/print/options';
import type { PrintedFigure } from '../../export/print/figure';
import { viewSize } from '../../export/print/transform';
import type { El } from '../../export/scene';
import { svgDocument } from '../../export/svg';
import { CliError, type CliArgs, type CliIO } from '../commands/types';

export type FigureFormat = 'svg' | 'png' | 'pdf';

/** Options of every figure command, for the commands' option tables. */
export const PRINT_OPTIONS = { out: true, width: true, 'font-size': true, palette: true, background: true, 'no-title': false, 'caption-text': true, dpi: true, text: true, table: false } as const;
/** The print options that shape a figure (need --out). */
export const PRINT_SHAPING = ['width', 'font-size', 'palette', 'background', 'no-title', 'caption-text', 'dpi', 'text'];

function ok<T>(p: Parsed<T>): T {
  if (!p.ok) throw new CliError(p.message, 2);
  return p.value;
}

/** The format of an output file by its extension, or a message naming the ones there are. */
export function formatOf(path: string): FigureFormat {
  if (path === '-') return 'svg';
  const m = /\.([A-Za-z]+)$/.exec(path);
  const ext = m?.[1].toLowerCase();
  if (ext === 'svg' || ext === 'png' || ext === 'pdf') return ext;
  throw new CliError(`--out ${path}: the file's extension names its format; use .svg, .png or .pdf${ext ? ` (not .${ext})` : ''}`, 2);
}

/** The print options given on the command line. */
export function printOptionsOf(args: CliArgs): PrintOptions & { dpi: number; textAsPaths: boolean } {
  const o = args.options;
  const str = (name: string): string | undefined => {
    const v = o[name];
    if (v === undefined) return undefined;
    if (v === true) throw new CliError(`--${name} needs a value`, 2);
    return v;
  };
  const w = str('width'), f = str('font-size'), p = str('palette'), b = str('background'), d = str('dpi'), t = str('text');
  const dpi = d === undefined ? 300 : Number(d);
  if (!(Number.isFinite(dpi) && dpi >= 36 && dpi <= 2400)) throw new CliError(`--dpi: "${d}" must be a number from 36 to 2400, e.g. --dpi 300`, 2);
  if (t !== undefined && t !== 'paths' && t !== 'text') throw new CliError(`--text: "${t}" must be paths (glyph outlines: renders the same without the font) or text`, 2);
  return {
    width: w === undefined ? undefined : ok(parseWidth(w)),
    fontSize: f === undefined ? undefined : ok(parseFontSize(f)),
    palette: p === undefined ? undefined : ok(parsePalette(p)),
    background: b === undefined ? undefined : ok(parseBackground(b)),
    title: o['no-title'] !== true,
    caption: str('caption-text'),
    dpi,
    textAsPaths: t === 'paths',
  };
}

/** Where --out goes, checked before any work; undefined without --out. Options that shape the figure need --out. */
export function outTarget(args: CliArgs, extraShaping: string[] = []): string | undefined {
  const svgAlias = args.options.svg;
  if (svgAlias !== undefined && args.options.out !== undefined) throw new CliError('give --out FILE (the older --svg FILE means the same), not both', 2);
  const v = args.options.out ?? svgAlias;
  if (v === true || v === '') throw new CliError('--out needs a file name, e.g. --out figure.svg, .png or .pdf (--out - prints the SVG)', 2);
  if (v === undefined) {
    const stray = [...PRINT_SHAPING, ...extraShaping].find((x) => args.options[x] !== undefined);
    if (stray) throw new CliError(`--${stray} shapes the figure: give --out FILE too`, 2);
    return undefined;
  }
  formatOf(v);
  return v;
}

function writeOut(io: CliIO, path: string, content: string | Uint8Array): number {
  const bytes = typeof content === 'string' ? new TextEncoder().encode(content) : content;
  try {
    if (typeof content === 'string') io.writeFile(path, content);
    else if (io.writeBytes) io.writeBytes(path, content);
    else throw new Error('this terminal cannot write binary files');
  } catch (e) {
    throw new CliError(`cannot write ${path}: ${(e as Error).message}`);
  }
  return bytes.length;
}

/** Write a printed figure in the format of `target`'s extension ('-' prints the SVG); notes and the size go to stderr. */
export async function writeFigure(target: string, fig: PrintedFigure, opts: PrintOptions & { dpi: number; textAsPaths: boolean }, io: CliIO, title = 'Loopfold figure'): Promise<void> {
  const format = formatOf(target);
  for (const n of fig.notes) io.err(`note: ${n}`);
  let root: El = fig.root;
  if (format === 'svg' && opts.textAsPaths) root = (await import('./textPaths')).textAsPaths(root);
  const svg = svgDocument(root);
  if (target === '-') { io.out(svg); return; }
  const { width } = viewSize(fig.root);
  const wPt = opts.width ? widthPt(opts.width) : width * 0.75;
  let n: number;
  if (format === 'svg') n = writeOut(io, target, svg);
  else if (format === 'png') {
    const { svgToPng, pixelsFor } = await import('./raster');
    n = writeOut(io, target, svgToPng(svg, pixelsFor(wPt / 72, opts.dpi), opts.dpi));
  } else {
    const { figureToPdf } = await import('./pdf');
    n = writeOut(io, target, await figureToPdf(fig.root, wPt, title));
  }
  io.err(`wrote ${target} (${n} bytes)`);
}
