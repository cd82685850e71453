/**
 * Where a big figure is in view: the area whose parts the timescale view
 * builds and puts on the page (`buildScene`'s `area`). A figure of 2,000
 * variables has some 6,000 parts (nodes, links, blocks); on the page each
 * change of band or layout cost the browser time for all of them (style,
 * layout, paint), most of a second per change, although a pane shows a few
 * dozen at a time.
 */

/** A rectangle in the figure's root coordinates (the svg's user units). */
export interface Area {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export const contains = (outer: Area, inner: Area): boolean =>
  inner.x0 >= outer.x0 && inner.y0 >= outer.y0 && inner.x1 <= outer.x1 && inner.y1 <= outer.y1;

/** `a` grown by `f` times its width and height on every side. */
export function grown(a: Area, f: number): Area {
  const dx = (a.x1 - a.x0) * f, dy = (a.y1 - a.y0) * f;
  return { x0: a.x0 - dx, y0: a.y0 - dy, x1: a.x1 + dx, y1: a.y1 + dy };
}

/**
 * The part of `el` the page shows, in its own CSS pixels from its top-left corner: its box cut by
 * every ancestor that clips (scrolls) and by the window. Empty (x1 ≤ x0) when nothing of it shows.
 */
export function visibleRect(el: Element): Area {
  const r = el.getBoundingClientRect();
  const doc = el.ownerDocument;
  const win = doc.defaultView;
  let left = 0, top = 0, right = win?.innerWidth ?? r.right, bottom = win?.innerHeight ?? r.bottom;
  for (let a = el.parentElement; a && a !== doc.documentElement; a = a.parentElement) {
    const st = win?.getComputedStyle(a);
    if (!st || (st.overflowX === 'visible' && st.overflowY === 'visible')) continue;
    const b = a.getBoundingClientRect();
    left = Math.max(left, b.left); top = Math.max(top, b.top); right = Math.min(right, b.right); bottom = Math.min(bottom, b.bottom);
  }
  return { x0: left - r.left, y0: top - r.top, x1: right - r.left, y1: bottom - r.top };
}
