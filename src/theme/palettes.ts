/**
 * Palettes for figures in print: each maps the colour tokens of the default
 * drawing (`visual.ts`: roles, links, blocks, charts) to the colour it takes
 * in that palette. A figure is drawn once in the default colours and then
 * recoloured token by token (`src/export/print/transform.ts`), so every kind
 * of figure gets every palette without a second drawing code path.
 *
 * - `default`: the app's colours.
 * - `colour-blind`: the eight colours of Okabe & Ito (2008), "Color Universal
 *   Design (CUD): how to make figures and presentations that are friendly to
 *   colorblind people" (orange #E69F00, sky blue #56B4E9, bluish green
 *   #009E73, blue #0072B2, vermillion #D55E00, reddish purple #CC79A7),
 *   with light tints of them as fills.
 * - `greyscale`: greys only. A settled state differs from a dynamic one by a
 *   fill some 25 % darker (relative luminance), not only by its `≈` glyph;
 *   frozen keeps its dashed outline, held its heavy outline.
 */
import { BLOCK_STYLE, CHART_STYLE, INK, LINK_STYLE, MUTED, PAPER, ROLE_STYLE } from './visual';
import { BIDIRECTED } from './tokens';

export type PaletteName = 'default' | 'colour-blind' | 'greyscale';
export const PALETTES: readonly PaletteName[] = ['default', 'colour-blind', 'greyscale'];

/** The colour tokens a figure is drawn with, by name. */
export interface ColourTokens {
  ink: string; paper: string; muted: string; white: string;
  inputFill: string; inputStroke: string;
  stateFill: string; stateStroke: string;
  derivedStroke: string;
  settledFill: string; settledStroke: string;
  frozenFill: string; frozenStroke: string;
  heldFill: string; heldStroke: string;
  blockFill: string;
  chartFrame: string; chartGrid: string; chartAccent: string;
}

/** The default palette's tokens: read from the visual language, so the two never drift apart. */
export const DEFAULT_TOKENS: ColourTokens = {
  ink: INK, paper: PAPER, muted: MUTED, white: '#ffffff',
  inputFill: ROLE_STYLE.input.fill, inputStroke: ROLE_STYLE.input.stroke,
  stateFill: ROLE_STYLE.state.fill, stateStroke: ROLE_STYLE.state.stroke,
  derivedStroke: ROLE_STYLE.derived.stroke,
  settledFill: ROLE_STYLE.settled.fill, settledStroke: ROLE_STYLE.settled.stroke,
  frozenFill: ROLE_STYLE.frozen.fill, frozenStroke: ROLE_STYLE.frozen.stroke,
  heldFill: ROLE_STYLE.held.fill, heldStroke: ROLE_STYLE.held.stroke,
  blockFill: BLOCK_STYLE.fill,
  chartFrame: CHART_STYLE.frame, chartGrid: CHART_STYLE.grid, chartAccent: CHART_STYLE.accent,
};

const COLOUR_BLIND: ColourTokens = {
  ink: '#000000', paper: PAPER, muted: '#555555', white: '#ffffff',
  inputFill: '#d6ecf8', inputStroke: '#0072b2',
  stateFill: '#ffffff', stateStroke: '#0072b2',
  derivedStroke: '#555555',
  settledFill: '#f5d699', settledStroke: '#a36f00',
  frozenFill: '#e6e6e6', frozenStroke: '#555555',
  heldFill: '#f4c9ad', heldStroke: '#d55e00',
  blockFill: '#fdf3dc',
  chartFrame: '#cccccc', chartGrid: '#eeeeee', chartAccent: '#009e73',
};

const GREYSCALE: ColourTokens = {
  ink: '#000000', paper: '#ffffff', muted: '#555555', white: '#ffffff',
  inputFill: '#ececec', inputStroke: '#333333',
  stateFill: '#ffffff', stateStroke: '#222222',
  derivedStroke: '#444444',
  settledFill: '#a8a8a8', settledStroke: '#000000',
  frozenFill: '#e0e0e0', frozenStroke: '#444444',
  heldFill: '#d0d0d0', heldStroke: '#000000',
  blockFill: '#f2f2f2',
  chartFrame: '#bbbbbb', chartGrid: '#e8e8e8', chartAccent: '#000000',
};

export const PALETTE_TOKENS: Record<PaletteName, ColourTokens> = { default: DEFAULT_TOKENS, 'colour-blind': COLOUR_BLIND, greyscale: GREYSCALE };

/** Colours of the default drawing that no token above names, with the token they follow. */
const ALIASES: Record<string, keyof ColourTokens> = {
  [LINK_STYLE.integrating.stroke]: 'stateStroke',
  [BLOCK_STYLE.stroke]: 'settledStroke',
  [CHART_STYLE.breakpoint]: 'settledStroke',
  // the measured graph's bidirected edges (dashed, two heads): a tone apart from the directed ones' ink
  [BIDIRECTED]: 'muted',
};

/**
 * Default colour (lower case) → the palette's colour. Where the default drawing uses one colour for
 * two tokens, the first token named wins (both then stay one colour in the palette too).
 */
export function recolourMap(name: PaletteName): Map<string, string> {
  const to = PALETTE_TOKENS[name];
  const map = new Map<string, string>();
  for (const k of Object.keys(DEFAULT_TOKENS) as (keyof ColourTokens)[]) {
    const from = DEFAULT_TOKENS[k].toLowerCase();
    if (!map.has(from)) map.set(from, to[k]);
  }
  for (const [from, k] of Object.entries(ALIASES)) if (!map.has(from.toLowerCase())) map.set(from.toLowerCase(), to[k]);
  return map;
}

/** Relative luminance of an sRGB colour `#rrggbb` (WCAG 2.1, definition of relative luminance). */
export function luminance(hex: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) return NaN;
  const lin = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
  const [r, g, b] = [m[1], m[2], m[3]].map((h) => lin(parseInt(h, 16) / 255));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
