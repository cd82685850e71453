/**
 * Dashes that stay legible, and cheap, when the canvas is zoomed out.
 *
 * A dash pattern is laid out in the link's own units, so at 16 % zoom the
 * integrating links' 7–4 dashes shrink to about one pixel and a long link
 * carries hundreds of them, every one of which the raster computes again on
 * each tile the link crosses while a variable is dragged. Below 70 % zoom the
 * pattern is lengthened in steps of two, so on screen it stays between 0.7 and
 * 1.4 times its size and a link carries a bounded number of dashes.
 */

/** Below this zoom the dash pattern is lengthened. */
export const DASH_MIN_ZOOM = 0.7;

/** The factor a dash pattern is lengthened by at a zoom: 1 from 70 % up, then 2, 4, 8, … */
export function dashScaleAt(zoom: number): number {
  if (!(zoom > 0) || zoom >= DASH_MIN_ZOOM) return 1;
  return 2 ** Math.ceil(Math.log2(DASH_MIN_ZOOM / zoom));
}

/** The custom property the canvas sets to `dashScaleAt(zoom)`. */
export const DASH_SCALE_VAR = '--lf-dash-scale';

/** A dash pattern such as "7 4" as a stroke-dasharray that follows the canvas's dash scale. */
export function scaledDash(dash: string): string {
  return dash
    .trim()
    .split(/[\s,]+/)
    .map((d) => `calc(${d}px * var(${DASH_SCALE_VAR}, 1))`)
    .join(' ');
}
