/**
 * The lagged effect against the interval, from a fitted drift and from the
 * sketch's, on one grid, with the data's own intervals to mark where the
 * data sit. Φ(Δ) = exp(AΔ); the effect of `from` on `to` one interval Δ
 * later is Φ(Δ)[to][from]. A VAR fit adds one point: its estimate at the
 * data's (median) interval with a 95 % interval.
 */
import type { VariableId } from '../model/types';
import type { Panel } from '../data/panel';
import { expm } from '../numeric/expm';
import { fromRows } from '../numeric/dense';
import { logGrid } from '../numeric/sampled';

/** exp(AΔ)[to][from] for each Δ. Example: `laggedEffect([[-1]], 0, 0, [1])` → [e^{-1}]. */
export function laggedEffect(drift: readonly (readonly number[])[], from: number, to: number, intervals: readonly number[]): number[] {
  const a = fromRows(drift);
  const n = a.rows;
  return intervals.map((d) => {
    const phi = expm({ rows: n, cols: n, data: a.data.map((v) => v * d) });
    return phi.data[to * n + from];
  });
}

/** Intervals between consecutive occasions of every person (same-day pairs only when `sameDay` and days are known). */
export function dataIntervals(panel: Panel, sameDay = false): number[] {
  const out: number[] = [];
  for (const p of panel.persons)
    for (let k = 1; k < p.time.length; k++) {
      if (sameDay && p.day && p.day[k] !== p.day[k - 1]) continue;
      out.push(p.time[k] - p.time[k - 1]);
    }
  return out;
}

/** The median interval between consecutive occasions: the data's interval for a VAR (NaN with no pairs). */
export function dataInterval(panel: Panel, sameDay = false): number {
  const g = dataIntervals(panel, sameDay).sort((x, y) => x - y);
  return g.length ? g[g.length >> 1] : NaN;
}

export interface LagCurves {
  from: VariableId;
  to: VariableId;
  intervals: number[];
  /** From the sketch's drift. */
  sketch: number[];
  /** From the fitted drift (continuous-time fit), or null. */
  fitted: number[] | null;
  /** The VAR estimate at the data's interval with its 95 % interval, or null. */
  point: { interval: number; estimate: number; low: number; high: number } | null;
  /** Quartiles and median of the data's intervals. */
  data: { q1: number; median: number; q3: number; count: number };
}

/**
 * Curves over a log grid from a tenth of the shortest quartile to ten times
 * the longest; `states` orders the rows and columns of both drifts.
 * Example: `lagCurves(['x','y'], sketchA, fitA, 'x', 'y', intervals, null)`.
 */
export function lagCurves(
  states: readonly VariableId[],
  sketch: readonly (readonly number[])[],
  fitted: readonly (readonly number[])[] | null,
  from: VariableId,
  to: VariableId,
  intervals: readonly number[],
  point: LagCurves['point'],
  count = 80,
): LagCurves {
  const j = states.indexOf(from), i = states.indexOf(to);
  if (i < 0 || j < 0) throw new Error(`"${i < 0 ? to : from}" is not among the fitted states (${states.join(', ')})`);
  const sorted = intervals.filter((x) => x > 0 && Number.isFinite(x)).sort((a, b) => a - b);
  if (sorted.length === 0) throw new Error('the data have no positive interval between occasions');
  const q = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(p * (sorted.length - 1)))];
  const data = { q1: q(0.25), median: q(0.5), q3: q(0.75), count: sorted.length };
  const grid = logGrid(data.q1 / 10, Math.max(data.q3 * 10, (point?.interval ?? 0) * 2), count);
  return { from, to, intervals: grid, sketch: laggedEffect(sketch, j, i, grid), fitted: fitted ? laggedEffect(fitted, j, i, grid) : null, point, data };
}
