/**
 * Fit on the mechanism canvas: the whole drawing in view, clear of the
 * canvas's overlays (the notation key, the zoom buttons, the overview map and
 * any other panel over the canvas, measured when Fit runs), but never zoomed
 * out so far that its smallest text (a variable's kind line) reads below
 * `MIN_CANVAS_TEXT_PX` on screen. A drawing too big for that is fitted at the
 * floor and placed where no overlay covers a node (the nearest such placement
 * to the centred one); the rest is reached by panning (wheel, drag, the
 * overview map); the zoom buttons and the wheel still zoom out further on request.
 */
import type { FitViewOptions, ReactFlowInstance, Viewport } from '@xyflow/react';

/** The smallest text drawn on the canvas, in canvas units: the kind line under a variable's name. */
export const CANVAS_CAPTION_PX = 11;
/** The smallest text on screen after Fit, in CSS pixels (a 1024 × 768 projector read from the room). */
export const MIN_CANVAS_TEXT_PX = 11;
/** The smallest zoom Fit chooses. */
export const MIN_FIT_ZOOM = MIN_CANVAS_TEXT_PX / CANVAS_CAPTION_PX;
/** Fit does not blow a small drawing up beyond this. */
const MAX_FIT_ZOOM = 1.2;
/** Clear space kept between the drawing and the pane's edge or an overlay, in CSS pixels. */
export const FIT_MARGIN = 16;
/** Below this pane width the notation key starts folded (open, it would wrap over a third of the canvas). */
export const NARROW_CANVAS_PX = 760;
/** Above this many nodes Fit does not search for a shift clear of the overlays. */
const MAX_SEARCHED_NODES = 200;

/** An axis-aligned box: in canvas units for a node, in pane pixels (from the pane's top-left) for an overlay. */
export interface Box { x: number; y: number; width: number; height: number }

/** The options of a Fit through the library (used before the overlays can be measured). */
export function canvasFitOptions(legendOpen: boolean, duration?: number): FitViewOptions {
  return {
    padding: { top: legendOpen ? '84px' : '44px', bottom: '112px', left: '36px', right: '36px' },
    minZoom: MIN_FIT_ZOOM,
    maxZoom: Math.max(MAX_FIT_ZOOM, MIN_FIT_ZOOM),
    ...(duration ? { duration } : {}),
  };
}

const hits = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

/** The space each side of the pane loses to the overlays that hug it (an overlay is charged to the side where it costs least). */
export function reservedSides(pane: { width: number; height: number }, overlays: readonly Box[]): { top: number; bottom: number; left: number; right: number } {
  const r = { top: 0, bottom: 0, left: 0, right: 0 };
  for (const o of overlays) {
    // the depth the overlay reaches into the pane from each side, weighted by the area that side's strip would cost
    const depth = { top: o.y + o.height, bottom: pane.height - o.y, left: o.x + o.width, right: pane.width - o.x };
    const cost = { top: depth.top * pane.width, bottom: depth.bottom * pane.width, left: depth.left * pane.height, right: depth.right * pane.height };
    const side = (Object.keys(cost) as (keyof typeof cost)[]).reduce((best, s) => (cost[s] < cost[best] ? s : best));
    r[side] = Math.max(r[side], depth[side]);
  }
  return r;
}

/**
 * How a viewport shows the nodes: `covered` counts nodes whose box an overlay covers (nodes wholly
 * off the pane do not count), `cut` the nodes not wholly inside the pane.
 */
export function viewScore(nodes: readonly Box[], overlays: readonly Box[], pane: { width: number; height: number }, vp: Viewport): { covered: number; cut: number } {
  let covered = 0, cut = 0;
  const paneBox = { x: 0, y: 0, width: pane.width, height: pane.height };
  for (const b of nodes) {
    const s = { x: b.x * vp.zoom + vp.x, y: b.y * vp.zoom + vp.y, width: b.width * vp.zoom, height: b.height * vp.zoom };
    if (s.x < 0 || s.y < 0 || s.x + s.width > pane.width || s.y + s.height > pane.height) cut++;
    if (!hits(s, paneBox)) continue;
    if (overlays.some((o) => hits(s, o))) covered++;
  }
  return { covered, cut };
}

/**
 * The viewport of a Fit: the nodes' bounds in the pane less the overlays' strips and a margin,
 * zoom between the legibility floor and `MAX_FIT_ZOOM`; when the overlays still cover a node
 * (a drawing wider or taller than the free space at the floor), the nearest shift of the view
 * that covers none (or, failing that, the fewest).
 */
export function fitViewport(nodes: readonly Box[], pane: { width: number; height: number }, overlays: readonly Box[]): Viewport {
  if (nodes.length === 0) return { x: 0, y: 0, zoom: 1 };
  const minX = Math.min(...nodes.map((b) => b.x)), minY = Math.min(...nodes.map((b) => b.y));
  const maxX = Math.max(...nodes.map((b) => b.x + b.width)), maxY = Math.max(...nodes.map((b) => b.y + b.height));
  const side = reservedSides(pane, overlays);
  const free = { x: side.left + FIT_MARGIN, y: side.top + FIT_MARGIN, width: pane.width - side.left - side.right - 2 * FIT_MARGIN, height: pane.height - side.top - side.bottom - 2 * FIT_MARGIN };
  const raw = Math.min(Math.max(free.width, 1) / Math.max(maxX - minX, 1), Math.max(free.height, 1) / Math.max(maxY - minY, 1));
  const zoom = Math.min(Math.max(raw, MIN_FIT_ZOOM), Math.max(MAX_FIT_ZOOM, MIN_FIT_ZOOM));
  const base = {
    x: free.x + (free.width - (maxX - minX) * zoom) / 2 - minX * zoom,
    y: free.y + (free.height - (maxY - minY) * zoom) / 2 - minY * zoom,
    zoom,
  };
  // the overlays' boxes grown by a margin, so the nearest clear shift does not leave a node touching one
  const grown = overlays.map((o) => ({ x: o.x - FIT_MARGIN / 2, y: o.y - FIT_MARGIN / 2, width: o.width + FIT_MARGIN, height: o.height + FIT_MARGIN }));
  const score = (vp: Viewport) => {
    const v = viewScore(nodes, grown, pane, vp);
    return v.covered * (nodes.length + 1) + v.cut;
  };
  let best = base, bestScore = score(base);
  // a drawing of hundreds of variables is panned by hand; the search is for the sizes a room reads
  if (viewScore(nodes, grown, pane, base).covered === 0 || nodes.length > MAX_SEARCHED_NODES) return base;
  // shifts of the view nearest first: the first with no node covered and the most nodes whole wins
  const step = 8;
  const reach = Math.ceil(Math.max(pane.width, pane.height) / 2 / step);
  const shifts: [number, number][] = [];
  for (let i = -reach; i <= reach; i++) for (let j = -reach; j <= reach; j++) shifts.push([i, j]);
  shifts.sort((a, b) => Math.hypot(a[0], a[1]) - Math.hypot(b[0], b[1]));
  for (const [i, j] of shifts) {
    const vp = { x: base.x + i * step, y: base.y + j * step, zoom };
    const c = score(vp);
    if (c < bestScore) {
      best = vp;
      bestScore = c;
      if (c === 0) break;
    }
  }
  return best;
}

/** The boxes of the panels over the canvas, in pane pixels. */
export function overlayBoxes(pane: HTMLElement): Box[] {
  const p = pane.getBoundingClientRect();
  return [...pane.querySelectorAll('.react-flow__panel')]
    .map((el) => el.getBoundingClientRect())
    .filter((r) => r.width > 0 && r.height > 0)
    .map((r) => ({ x: r.left - p.left, y: r.top - p.top, width: r.width, height: r.height }));
}

/**
 * Fit the canvas (on load, on resize, the F key, the fit button): measured node boxes and
 * overlays; falls back to the library's Fit while the nodes are not measured yet.
 */
export function fitCanvas(flow: Pick<ReactFlowInstance, 'getNodes' | 'setViewport' | 'fitView'>, pane: HTMLElement | null, legendOpen: boolean, duration?: number): void {
  const nodes = flow.getNodes();
  const boxes = nodes.map((n) => ({ x: n.position.x, y: n.position.y, width: n.measured?.width ?? 0, height: n.measured?.height ?? 0 }));
  const flowPane = pane?.querySelector('.react-flow') ?? pane;
  if (!flowPane || boxes.length === 0 || boxes.some((b) => b.width === 0)) {
    void flow.fitView(canvasFitOptions(legendOpen, duration));
    return;
  }
  const r = flowPane.getBoundingClientRect();
  const vp = fitViewport(boxes, { width: r.width, height: r.height }, overlayBoxes(flowPane as HTMLElement));
  void flow.setViewport(vp, duration ? { duration } : undefined);
}
