/**
 * Labels drawn as SVG text: SVG has no ellipsis, so a label too wide for its
 * variable is shortened here to the longest start that fits, with "…".
 */

/** Width of a string in pixels at a given font. */
export type Measure = (text: string) => number;

/** `text` if it fits in `max` pixels, else its longest start that fits followed by "…" (at least one character). */
export function fitText(text: string, max: number, measure: Measure): string {
  if (measure(text) <= max) return text;
  const chars = [...text];
  let lo = 1;
  let hi = chars.length - 1;
  // the longest n with measure(first n + "…") <= max, by bisection (the width grows with n)
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (measure(chars.slice(0, mid).join('').trimEnd() + '…') <= max) lo = mid;
    else hi = mid - 1;
  }
  return chars.slice(0, lo).join('').trimEnd() + '…';
}

/**
 * A measure for a CSS font, from a 2D canvas where the page has one, with a
 * cache per string; elsewhere (tests, the command line) an estimate of
 * `fallbackEm` × font size per character.
 */
export function fontMeasure(font: string, sizePx: number, fallbackEm = 0.62): Measure {
  const cache = new Map<string, number>();
  let ctx: CanvasRenderingContext2D | null | undefined;
  return (text: string) => {
    const hit = cache.get(text);
    if (hit !== undefined) return hit;
    if (ctx === undefined) {
      ctx = typeof document !== 'undefined' ? document.createElement('canvas').getContext('2d') : null;
      if (ctx) ctx.font = font;
    }
    const w = ctx ? ctx.measureText(text).width : [...text].length * sizePx * fallbackEm;
    if (cache.size > 5000) cache.clear();
    cache.set(text, w);
    return w;
  };
}
