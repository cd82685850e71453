/**
 * Fit on the mechanism canvas: the whole drawing in view, clear of the
 * legend strip and the overview map, but never zoomed out so far that its
 * smallest text (a variable's kind line) reads below `MIN_CANVAS_TEXT_PX` on
 * screen. A drawing too big for that is fitted at the floor, centred, and the
 * rest is reached by panning (wheel, drag, the overview map); the zoom buttons
 * and the wheel still zoom out further on request.
 */
import type { FitViewOptions } from '@xyflow/react';

/** The smallest text drawn on the canvas, in canvas units: the kind line under a variable's name. */
export const CANVAS_CAPTION_PX = 11;
/** The smallest text on screen after Fit, in CSS pixels (a 1024 × 768 projector read from the room). */
export const MIN_CANVAS_TEXT_PX = 11;
/** The smallest zoom Fit chooses. */
export const MIN_FIT_ZOOM = MIN_CANVAS_TEXT_PX / CANVAS_CAPTION_PX;
/** Fit does not blow a small drawing up beyond this. */
const MAX_FIT_ZOOM = 1.2;

/** The options of every Fit of the canvas (on load, on resize, the F key, the fit button). */
export function canvasFitOptions(legendOpen: boolean, duration?: number): FitViewOptions {
  return {
    padding: { top: legendOpen ? '84px' : '44px', bottom: '112px', left: '36px', right: '36px' },
    minZoom: MIN_FIT_ZOOM,
    maxZoom: Math.max(MAX_FIT_ZOOM, MIN_FIT_ZOOM),
    ...(duration ? { duration } : {}),
  };
}
