/**
 * Pure helpers of the Numbers pane's charts: tick positions, scales, the
 * sample times a study would take, the simulated values at those times, and
 * the CSV table of a run. No DOM, so they are tested in Node.
 */
import type { VariableId } from '../../core/model/types';
import { toCsv, type CsvValue } from '../../report/csv';

/**
 * Round tick values within [lo, hi]: the smallest step of 1, 2 or 5 × 10ᵏ
 * that cuts the range into at most `count` intervals (common practice).
 */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [];
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) return [lo];
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const f = raw / mag;
  const step = (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * mag;
  const out: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/** Powers of ten within [lo, hi] (at least the two around the range). */
export function logTicks(lo: number, hi: number): number[] {
  const a = Math.floor(Math.log10(lo)), b = Math.ceil(Math.log10(hi));
  const out: number[] = [];
  for (let k = a; k <= b; k++) {
    const v = 10 ** k;
    if (v >= lo * 0.999 && v <= hi * 1.001) out.push(v);
  }
  return out.length > 0 ? out : [lo, hi];
}

/** A linear map from [d0, d1] to [r0, r1]; a flat domain maps to the middle. */
export function linear(d0: number, d1: number, r0: number, r1: number): (x: number) => number {
  if (d1 === d0) return () => (r0 + r1) / 2;
  return (x) => r0 + ((x - d0) / (d1 - d0)) * (r1 - r0);
}

export function logScale(d0: number, d1: number, r0: number, r1: number): (x: number) => number {
  const f = linear(Math.log(d0), Math.log(d1), r0, r1);
  return (x) => f(Math.log(x));
}

/** Range of the finite values, padded by 5% (a flat series gets ±1 around its value). */
export function extent(values: Iterable<number>): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) if (Number.isFinite(v)) { if (v < lo) lo = v; if (v > hi) hi = v; }
  if (lo === Infinity) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  const pad = (hi - lo) * 0.05;
  return [lo - pad, hi + pad];
}

/** Dash patterns that tell series apart without colour (they survive grayscale printing). */
export const DASHES = ['', '6 3', '2 3', '10 3 2 3', '1 2', '8 2 2 2 2 2', '12 4'];

/** Tick label: short, no floating-point noise. */
export function tickText(x: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e5 || a < 1e-3) return x.toExponential(0).replace('e+', 'e');
  return String(Number(x.toPrecision(4)));
}

/**
 * The times a study would take its samples: 0, Δ, 2Δ, … up to the study
 * length (default `samples` × Δ) and the end of the run, at most `max` of
 * them (null when there would be more: too dense to draw).
 */
export function sampleTimes(interval: number, until: number, studyLength: number, max = 400): number[] | null {
  if (!(interval > 0)) return [];
  const end = Math.min(until, studyLength);
  const count = Math.floor(end / interval + 1e-9) + 1;
  if (count > max) return null;
  return Array.from({ length: count }, (_, k) => k * interval);
}

/** The value of a series at time t by linear interpolation between output points. */
export function valueAt(times: readonly number[], values: readonly number[], t: number): number {
  if (times.length === 0) return NaN;
  if (t <= times[0]) return values[0];
  if (t >= times[times.length - 1]) return values[values.length - 1];
  let lo = 0, hi = times.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid] <= t) lo = mid;
    else hi = mid;
  }
  const w = (t - times[lo]) / (times[hi] - times[lo]);
  return values[lo] + w * (values[hi] - values[lo]);
}

/** The run as a table: a header `time (unit)` and one column per chosen variable, named by its label. */
export function simulationCsv(times: readonly number[], series: Record<VariableId, readonly number[]>, columns: { id: VariableId; name: string }[], unit: string): string {
  const rows: CsvValue[][] = [[`time (${unit})`, ...columns.map((c) => c.name)]];
  times.forEach((t, k) => rows.push([t, ...columns.map((c) => series[c.id]?.[k])]));
  return toCsv(rows);
}

/** Lay n nodes on a circle in a w×h box, the first at the top, clockwise. */
export function circleLayout(n: number, w: number, h: number, margin: number): { x: number; y: number }[] {
  const r = Math.max(10, Math.min(w, h) / 2 - margin);
  if (n === 1) return [{ x: w / 2, y: h / 2 }];
  return Array.from({ length: n }, (_, i) => {
    const a = -Math.PI / 2 + (2 * Math.PI * i) / n;
    return { x: w / 2 + r * Math.cos(a), y: h / 2 + r * Math.sin(a) };
  });
}

/** Edge weights of a network shown as lines: |w| at least `share` of the largest off-diagonal |w|. */
export function strongEdges(m: readonly (readonly number[])[], share = 0.02, symmetric = false): { from: number; to: number; weight: number }[] {
  const n = m.length;
  let max = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j) max = Math.max(max, Math.abs(m[i][j]));
  const out: { from: number; to: number; weight: number }[] = [];
  if (max === 0) return out;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j || (symmetric && j < i)) continue;
      // Row i, column j: the effect of j on i.
      if (Math.abs(m[i][j]) >= share * max) out.push({ from: j, to: i, weight: m[i][j] });
    }
  return out;
}
