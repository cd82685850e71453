/**
 * Options of a figure for print, the same in the app's export dialog and on
 * the command line: width (a column preset or a length), base font size,
 * palette, background, title and caption. Pure: parses and checks text as a
 * user types it, with messages that name the option.
 */
import { PALETTES, type PaletteName } from '../../theme/palettes';
import { rounded } from '../../present/index';

/** Column widths of journal pages in millimetres (common practice: 85–90, 114, 174–180 mm). */
export const WIDTH_PRESETS = { column: 85, 'column-and-half': 114, 'two-columns': 178 } as const;
export type WidthPreset = keyof typeof WIDTH_PRESETS;

export type Background = 'white' | 'transparent' | 'paper';
export const BACKGROUNDS: readonly Background[] = ['white', 'transparent', 'paper'];

/** A print width: in millimetres (presets, mm, cm) or in CSS pixels (96 per inch). */
export type PrintWidth = { mm: number; preset?: WidthPreset } | { px: number };

export interface PrintOptions {
  /** Width of the figure on the page; undefined keeps the figure's own size (1 unit = 1 CSS px). */
  width?: PrintWidth;
  /** Size in points of the figure's main text (variable names, chart labels); default 9. */
  fontSize?: number;
  palette?: PaletteName;
  background?: Background;
  /** Draw the title line (default true). */
  title?: boolean;
  /** The caption under the figure; undefined keeps the figure's own (none, or the study caption). */
  caption?: string;
}

/** The smallest text a printed figure may carry, in points (common practice for journal figures). */
export const MIN_TEXT_PT = 7;
export const DEFAULT_FONT_PT = 9;
export const PT_PER_MM = 72 / 25.4;
export const PT_PER_PX = 72 / 96;

/** Width in points. */
export function widthPt(w: PrintWidth): number {
  return 'mm' in w ? w.mm * PT_PER_MM : w.px * PT_PER_PX;
}

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/** `column`, `1.5-column`, `two-columns`, `85mm`, `11.4cm`, `800px` → a width. */
export function parseWidth(text: string): Parsed<PrintWidth> {
  const t = text.trim().toLowerCase();
  const alias: Record<string, WidthPreset> = {
    column: 'column', 'one-column': 'column', '1': 'column', '1-column': 'column', single: 'column',
    'column-and-half': 'column-and-half', '1.5': 'column-and-half', '1.5-column': 'column-and-half', 'one-and-half': 'column-and-half',
    'two-columns': 'two-columns', '2': 'two-columns', '2-columns': 'two-columns', double: 'two-columns', 'two-column': 'two-columns',
  };
  if (t in alias) return { ok: true, value: { mm: WIDTH_PRESETS[alias[t]], preset: alias[t] } };
  const m = /^(\d+(?:\.\d+)?)\s*(mm|cm|px|in)$/.exec(t);
  if (!m) return { ok: false, message: `--width: "${text}" is not a width; give column (8.5 cm), 1.5-column (11.4 cm), two-columns (17.8 cm), or a length such as 120mm, 12cm or 800px` };
  const v = Number(m[1]);
  const value: PrintWidth = m[2] === 'px' ? { px: v } : { mm: m[2] === 'cm' ? v * 10 : m[2] === 'in' ? v * 25.4 : v };
  const pt = widthPt(value);
  if (!(pt >= 72 && pt <= 72 * 40)) return { ok: false, message: `--width: ${text} is outside 1 in to 40 in (25.4 mm to 1 m)` };
  return { ok: true, value };
}

export function parseFontSize(text: string): Parsed<number> {
  const m = /^(\d+(?:\.\d+)?)\s*(pt)?$/.exec(text.trim());
  const v = m ? Number(m[1]) : NaN;
  if (!(v >= MIN_TEXT_PT && v <= 24)) return { ok: false, message: `--font-size: "${text}" must be a size in points from ${MIN_TEXT_PT} to 24, e.g. 9 or 9pt` };
  return { ok: true, value: v };
}

export function parsePalette(text: string): Parsed<PaletteName> {
  const t = text.trim().toLowerCase().replace('color', 'colour').replace('grayscale', 'greyscale');
  const alias: Record<string, PaletteName> = { 'colour-blind-safe': 'colour-blind', colourblind: 'colour-blind', cb: 'colour-blind', grey: 'greyscale', gray: 'greyscale' };
  const name = (alias[t] ?? t) as PaletteName;
  if (!PALETTES.includes(name)) return { ok: false, message: `--palette: "${text}" is not a palette; choose ${PALETTES.join(', ')}` };
  return { ok: true, value: name };
}

export function parseBackground(text: string): Parsed<Background> {
  const t = text.trim().toLowerCase() as Background;
  if (!BACKGROUNDS.includes(t)) return { ok: false, message: `--background: "${text}" is not a background; choose white, transparent or paper (the app's paper tone)` };
  return { ok: true, value: t };
}

/** A short description of the width for messages: "8.5 cm (one column)". */
export function widthText(w: PrintWidth): string {
  if ('px' in w) return `${w.px} px`;
  const names: Record<WidthPreset, string> = { column: 'one column', 'column-and-half': 'one and a half columns', 'two-columns': 'two columns' };
  return `${rounded(w.mm / 10, 2)} cm${w.preset ? ` (${names[w.preset]})` : ''}`;
}
