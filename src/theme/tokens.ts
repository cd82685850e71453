/**
 * Colour tokens beside the visual language (visual.ts): every hex colour of
 * the TypeScript code is written in src/theme/ and named for what it does
 * (a lint rule keeps hex colours out of the other folders).
 */

/** Fill of hollow heads, sign discs, connectors and card faces. */
export const WHITE = '#ffffff';
/** The halo round a selected link or relation. */
export const SELECTION = '#c77d0a';
/** The invisible wide stroke that makes a thin link easy to hit (drawn transparent by CSS). */
export const HIT_STROKE = '#000';
/** A link end whose variable is missing. */
export const UNKNOWN_STROKE = '#888';
/** The dots of the canvas background. */
export const GRID_DOT = '#c9c4b8';
/** The interval track's notch. */
export const TRACK_NOTCH = '#ece9e1';
/** A breakpoint tick on the interval track: the colour of a simultaneous block's outline. */
export const BREAKPOINT = '#8a5a12';

/** The HTML report: body text and rules, secondary text, table lines. */
export const REPORT_INK = '#1d1d1f';
export const REPORT_MUTED = '#555';
export const REPORT_LINE = '#999';

/** Default ink of a shape with no fill given (as SVG paints it), for the PDF writer. */
export const SVG_DEFAULT_FILL = '#000000';
/** Bidirected (confounded) edges of a measured graph. */
export const BIDIRECTED = '#6b3f8f';
/** The canvas overview map: its ground and the outline of the part in view. */
export const OVERVIEW_GROUND = '#fffdf8';
export const OVERVIEW_VIEW = '#1f6f80';
/** The report's box round the held variables named at its top. */
export const REPORT_HELD = '#8f2d2d';
