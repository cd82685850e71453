/**
 * The standard normal distribution: cumulative probability and quantile.
 */
import { erf } from 'mathjs';

/** P(Z ≤ z) for a standard normal Z. Example: `normalCdf(1.959963984540054)` ≈ 0.975. */
export function normalCdf(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z === Infinity) return 1;
  if (z === -Infinity) return 0;
  // Φ(z) = erfc(−z/√2)/2; the lower tail by erfc directly keeps its relative accuracy (1 + erf loses it).
  const t = -z / Math.SQRT2;
  return t > 0 ? 0.5 * erfcPositive(t) : 0.5 * (1 + (erf(-t) as number));
}

/** erfc(t) for t > 0: 1 − erf(t) near zero, the continued fraction beyond 2. */
function erfcPositive(t: number): number {
  return t < 2 ? 1 - (erf(t) as number) : erfcLarge(t);
}

/** erfc(t) for t ≥ 2 by Lentz's continued fraction (common practice: Abramowitz & Stegun 7.1.14). */
function erfcLarge(t: number): number {
  // erfc(t) = exp(−t²)/√π · 1/(t + 1/2/(t + 1/(t + 3/2/(t + 2/(t + …)))))
  const tiny = 1e-300;
  let f = t, c = t, d = 0;
  for (let k = 1; k < 200; k++) {
    const a = k / 2;
    d = t + a * d;
    d = Math.abs(d) < tiny ? tiny : d;
    c = t + a / c;
    c = Math.abs(c) < tiny ? tiny : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-t * t) / Math.sqrt(Math.PI) / f;
}

/**
 * The z with P(Z ≤ z) = p. Acklam's rational approximation (relative error below 1.2e-9),
 * refined by one Halley step on `normalCdf` to full double precision.
 * Example: `normalQuantile(0.975)` ≈ 1.959963984540054.
 */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  // The upper half by symmetry: 1 − p is exact there (Sterbenz), and the lower tail keeps its relative accuracy.
  if (p > 0.5) return -normalQuantile(1 - p);
  const a = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
  const b = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
  const c = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
  const d = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];
  const lo = 0.02425;
  let x: number;
  if (p < lo) {
    const q = Math.sqrt(-2 * Math.log(p));
    x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  } else if (p <= 1 - lo) {
    const q = p - 0.5, r = q * q;
    x = ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
  } else {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  // Halley step: e = Φ(x) − p; u = e·√(2π)·exp(x²/2); x ← x − u/(1 + x·u/2).
  const e = normalCdf(x) - p;
  const u = e * Math.sqrt(2 * Math.PI) * Math.exp((x * x) / 2);
  return x - u / (1 + (x * u) / 2);
}
