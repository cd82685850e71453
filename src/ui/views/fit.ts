/**
 * Fit: the scale at which a figure shows whole in its pane, width and height
 * both, never below the scale that keeps its text legible (the pane scrolls
 * then) nor blown up past a comfortable size.
 */

export interface Size {
  width: number;
  height: number;
}

/** A fitted figure is not drawn more than this many times its natural size. */
export const MAX_FIT_SCALE = 1.5;
/** Below this the pane is too small to fit into: the box is taken as at least this tall. */
const MIN_BOX_HEIGHT = 160;
/** Kept free under the box inside its pane, so its lower edge shows. */
const BOTTOM_GAP = 8;

/**
 * The largest scale at which `natural` fits inside `box` (both sides), kept
 * between `min` and `max`. A box or figure without a size gives `min`.
 */
export function fitScaleFor(natural: Size, box: Size, min: number, max = MAX_FIT_SCALE): number {
  if (!(natural.width > 0) || !(natural.height > 0) || !(box.width > 0) || !(box.height > 0)) return min;
  const s = Math.min(box.width / natural.width, box.height / natural.height);
  return Math.min(Math.max(s, min), Math.max(min, max));
}

/** The nearest ancestor of `el` that scrolls vertically (the pane it sits in), or null for the window. */
export function scrollport(el: Element): HTMLElement | null {
  const win = el.ownerDocument.defaultView;
  for (let a = el.parentElement; a && a !== el.ownerDocument.documentElement; a = a.parentElement) {
    const oy = win?.getComputedStyle(a).overflowY;
    if (oy === 'auto' || oy === 'scroll') return a;
  }
  return null;
}

/**
 * The room a figure has in `view` (the bordered box it scrolls in): the box's inner width, and the
 * height from where the figure starts (`reserved` px below the box's top: its zoom buttons) to the
 * lower of the box's own height limit and the bottom of the pane it sits in, as if the pane were
 * scrolled to its top (the room does not change while the pane scrolls).
 */
/**
 * What, besides the box itself, moves the box's top within its pane: everything laid out before it
 * (the toolbars, the tab row, a notice that appears). A change in their size changes the room.
 */
export function aboveInPane(view: HTMLElement): HTMLElement[] {
  const port = scrollport(view);
  const out: HTMLElement[] = [];
  for (let a: HTMLElement | null = view; a && a !== port && a !== a.ownerDocument.body; a = a.parentElement) {
    for (let s = a.previousElementSibling; s; s = s.previousElementSibling) if (s instanceof HTMLElement) out.push(s);
  }
  if (port) out.push(port);
  return out;
}

export function roomIn(view: HTMLElement, reserved: number): Size {
  const win = view.ownerDocument.defaultView;
  const st = win?.getComputedStyle(view);
  const port = scrollport(view);
  const vr = view.getBoundingClientRect();
  let below: number;
  if (port) {
    const pr = port.getBoundingClientRect();
    const top = vr.top - pr.top + port.scrollTop;
    below = port.clientHeight - top - BOTTOM_GAP;
  } else {
    below = (win?.innerHeight ?? 800) - (vr.top + (win?.scrollY ?? 0)) - BOTTOM_GAP;
  }
  const limit = st ? parseFloat(st.maxHeight) : NaN;
  const borders = st ? (parseFloat(st.borderTopWidth) || 0) + (parseFloat(st.borderBottomWidth) || 0) : 0;
  const outer = Number.isFinite(limit) ? Math.min(limit, below) : below;
  return { width: view.clientWidth, height: Math.max(MIN_BOX_HEIGHT, outer - borders - reserved) };
}
