/**
 * Loopfold's visual language, as data shared by the canvas and the SVG
 * exporter. Every distinction is carried by shape, line style or a glyph
 * first and by colour second, so it survives print and grayscale.
 * DEVELOPERS.md ("Visual language") describes it in words.
 */
import type { VariableKind, LinkKind } from '../core/model/types';
import type { Role } from '../core/ordering/types';

export const INK = '#1d2b36';
export const PAPER = '#f7f5f0';
export const MUTED = '#5f6b73';

/** Shape of a variable by its kind in the mechanism. */
export type NodeShape = 'tag' | 'accumulator' | 'pill';
export const KIND_SHAPE: Record<VariableKind, NodeShape> = { input: 'tag', state: 'accumulator', derived: 'pill' };

export const ROLE_STYLE: Record<Role, { fill: string; stroke: string; dash?: string; glyph: string; label: string; strokeWidth: number }> = {
  input: { fill: '#e3f1f4', stroke: '#1f6f80', glyph: '', label: 'input (set from outside)', strokeWidth: 1.5 },
  state: { fill: '#e7e9f6', stroke: '#34428f', glyph: '', label: 'state (moves over time)', strokeWidth: 1.5 },
  derived: { fill: '#ffffff', stroke: '#4f5a63', glyph: '', label: 'derived (follows at once)', strokeWidth: 1.5 },
  settled: { fill: '#fbf0dc', stroke: '#8a5a12', glyph: '≈', label: 'settled (fast: at balance)', strokeWidth: 1.5 },
  frozen: { fill: '#e9edf0', stroke: '#56697a', dash: '5 3', glyph: '‖', label: 'frozen (slow: constant in the study)', strokeWidth: 1.5 },
  held: { fill: '#f6e3e3', stroke: '#8f2d2d', glyph: '⊥', label: 'held (intervention)', strokeWidth: 3 },
};

/** Link styles: instantaneous = solid with a filled head; integrating = dashed with a hollow head. */
export const LINK_STYLE: Record<LinkKind, { dash?: string; head: 'filled' | 'hollow'; label: string; stroke: string }> = {
  instantaneous: { head: 'filled', label: 'acts within the instant', stroke: INK },
  integrating: { dash: '7 4', head: 'hollow', label: 'accumulates over time (lagged)', stroke: '#34428f' },
};

/** A simultaneous block: a container with a doubled outline; folded, a stacked card with a count. */
export const BLOCK_STYLE = { fill: '#fdf8ee', stroke: '#8a5a12', gap: 3, radius: 14, label: 'simultaneous block (determined together)' };

export const FONT_STACK = "'DejaVu Sans', 'Inter', 'Segoe UI', Arial, sans-serif";

/**
 * SVG path of a node outline of the given shape in a w×h box at the origin.
 * tag: a label tag pointing right; accumulator: a rectangle (its floor bar is drawn separately); pill: fully rounded ends.
 */
export function shapePath(shape: NodeShape, w: number, h: number, x = 0, y = 0): string {
  // coordinates rounded to 0.1 px (the figure's grid), relative to the box's corner (x, y)
  const X = (v: number) => Math.round((x + v) * 10) / 10, Y = (v: number) => Math.round((y + v) * 10) / 10;
  switch (shape) {
    case 'tag': {
      const p = Math.min(14, h / 2);
      return `M${X(0)},${Y(0)} H${X(w - p)} L${X(w)},${Y(h / 2)} L${X(w - p)},${Y(h)} H${X(0)} Z`;
    }
    case 'accumulator':
      return `M${X(0)},${Y(0)} H${X(w)} V${Y(h)} H${X(0)} Z`;
    case 'pill': {
      const r = h / 2;
      return `M${X(r)},${Y(0)} H${X(w - r)} A${r},${r} 0 0 1 ${X(w - r)},${Y(h)} H${X(r)} A${r},${r} 0 0 1 ${X(r)},${Y(0)} Z`;
    }
  }
}

/** Height of the accumulator's floor bar (the part that "fills"). */
export const ACCUMULATOR_FLOOR = 6;

/**
 * The Numbers pane's charts and networks (drawn by `src/export/charts.ts` for
 * screen and file alike) on a white ground. Series differ by dash pattern and
 * sit in panels of their own; signs of network links by solid (positive) and
 * dashed (negative) lines and by the sign of the weight written on them.
 */
export const CHART_STYLE = {
  paper: '#ffffff',
  frame: '#d8d2c4',
  grid: '#ece8de',
  axis: INK,
  text: INK,
  label: MUTED,
  line: INK,
  /** Samples, the current interval and the peak. */
  accent: '#1f6f80',
  /** The intervals where the causal ordering changes. */
  breakpoint: '#8a5a12',
  breakpointDash: '3 2',
  negativeDash: '5 3',
};

/** Dash patterns that tell series apart without colour, in order (the first is solid). */
export const SERIES_DASHES = ['', '6 3', '2 3', '10 3 2 3', '1 2', '8 2 2 2 2 2', '12 4'];
