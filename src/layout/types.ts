import type { ViewNodeId } from '../core/view/types';

export interface Point {
  x: number;
  y: number;
}

/** A box in world coordinates (the figure's own pixels, before any zoom): top-left corner and size. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Where everything of one view model goes. Edges are drawn between node boxes by the renderer. */
export interface Layout {
  nodes: Record<ViewNodeId, Box>;
  /** Simultaneous blocks (unfolded), by group id. */
  groups: Record<string, Box>;
  /** The unrolled view: one column per instant, by slice ("-1", "0", "1"). */
  slices?: Record<string, Box>;
  /** Routed edges (ELK's polylines, node border to node border), by edge id; others are drawn straight. */
  edges?: Record<string, Point[]>;
  width: number;
  height: number;
  /** 'instant': placed at once from the previous positions; 'elk': the tuned layout. */
  source: 'instant' | 'elk' | 'drawn';
}

export const GROUP_PAD = { top: 30, left: 14, bottom: 14, right: 14 };
export const SLICE_PAD = { top: 70, left: 20, bottom: 40, right: 20 };
/** A block is at least this wide, so its header fits. */
export const GROUP_MIN_WIDTH = 200;
export const SLICE_GAP = 110;
export const MARGIN = 24;
