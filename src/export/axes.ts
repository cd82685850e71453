/**
 * Scales and ticks of the charts: pure arithmetic shared by the drawing of
 * the Numbers pane's charts and their export.
 */
import { formatNumber, significant } from '../present/index';

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
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) out.push(significant(k * step, 12));
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

/** Tick label: short, no floating-point noise, minus as U+2212 (the one minus sign of every figure). */
export function tickText(x: number): string {
  return formatNumber(x, { digits: 4, exponentDigits: 0, large: 1e5, exponentPlus: false });
}
