/**
 * What a first-order VAR over consecutive prompts estimates for a schedule.
 *
 * For a stationary linear process dx = A x dt + G dW with stationary
 * covariance Σ, the lag covariance over a gap Δ is Cov(x(t+Δ), x(t)) = Φ(Δ)Σ
 * with Φ(Δ) = e^{AΔ}. A least-squares VAR(1) fitted to consecutive prompts
 * (pairs (y_k, y_{k+1}) whose gaps Δ_k take values Δ_j with shares w_j)
 * converges to
 *   B = (Σ_j w_j Φ(Δ_j) Σ) Σ⁻¹ = Σ_j w_j Φ(Δ_j),
 * whatever Σ is: a mixture of the Φ of every gap, not Φ at the nominal
 * interval. Night gaps are long, their Φ small, so pooling them with the gaps
 * within the day shrinks the autoregressions and cross-lagged effects.
 * With measurement error of variance R the regressor covariance is Σ + R, so
 * B = (Σ_j w_j Φ(Δ_j)) Σ (Σ + R)⁻¹ (regression dilution; Fuller,
 * "Measurement Error Models", 1987, §1.1).
 *
 * Gaps of a stratified-random schedule vary continuously: two prompts in parts
 * k apart are kΔs + (U′ − U)Δs apart with U, U′ uniform, a triangular
 * spread of ±Δs about kΔs; its Φ is the expectation over that spread
 * (Gauss–Legendre quadrature, exact to rounding for this smooth integrand).
 */
import type { Study, TimeUnit, VariableId } from '../model/types';
import { axpby, identity, inverse, mul, scale, zeros, type Mat } from '../numeric/dense';
import { expm } from '../numeric/expm';
import { plannedSlots } from './schedule';
import { precisionText } from '../../present/index';

/** A kind of gap between consecutive answered prompts, with its share of all such pairs over the study. */
export interface GapClass {
  /** The gap (its mean when `spread` > 0), in the model's time unit. */
  gap: number;
  /** Share of all consecutive answered pairs over the whole study (the shares sum to 1). */
  share: number;
  /** Both prompts on the same day. */
  sameDay: boolean;
  /** Half-width of the triangular spread of a stratified-random gap (0: the gap is exact). */
  spread: number;
  /** Planned prompts missed between the two (0: neighbours in the schedule). */
  skipped: number;
}

/** Below this probability, a run of missed prompts is left out of the shares. */
const NEGLIGIBLE = 1e-13;

/**
 * The distinct gaps between consecutive answered prompts of a study and
 * their expected shares (prompts missed independently with probability
 * `missedPrompts`), sorted by gap; the same for every person.
 * Example: 5 prompts 09:00–21:00 (3 h apart), no missed prompts, 14 days →
 * gaps 3 h (share 56/69) and 12 h (the nights, 13/69).
 */
export function scheduleGaps(study: Study, unit: TimeUnit): GapClass[] {
  const slots = plannedSlots(study, unit);
  const m = slots.base.length;
  const p = study.missedPrompts ?? 0;
  const keyed = new Map<string, GapClass>();
  let total = 0;
  for (let a = 0; a < m - 1; a++) {
    let run = (1 - p) * (1 - p);
    for (let j = 1; a + j < m; j++) {
      if (j > 1) run *= p;
      if (run < NEGLIGIBLE) break;
      const b = a + j;
      const gap = slots.base[b] - slots.base[a];
      const sameDay = slots.day[b] === slots.day[a];
      const key = `${precisionText(gap, 12, { ascii: true })}|${sameDay ? 1 : 0}|${j - 1}`;
      const g = keyed.get(key);
      if (g) g.share += run;
      else keyed.set(key, { gap, share: run, sameDay, spread: slots.width, skipped: j - 1 });
      total += run;
    }
  }
  const out = [...keyed.values()];
  for (const g of out) g.share /= total;
  return out.sort((x, y) => x.gap - y.gap || Number(y.sameDay) - Number(x.sameDay));
}

/** Gauss–Legendre nodes and weights on [0, 1] (Newton's method on the Legendre polynomial; Golub & Welsch 1969 give the same nodes). */
function gaussLegendre01(n: number): { x: number[]; w: number[] } {
  const x: number[] = [];
  const w: number[] = [];
  for (let i = 1; i <= n; i++) {
    let z = Math.cos((Math.PI * (i - 0.25)) / (n + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = z;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (z * p1 - p0)) / (z * z - 1);
      const dz = p1 / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-15) break;
    }
    x.push((1 - z) / 2);
    w.push(1 / ((1 - z * z) * dp * dp));
  }
  return { x, w };
}
const GL = gaussLegendre01(16);

/**
 * Φ over a gap: e^{AΔ}, or with a triangular spread s the expectation
 * E[e^{A(Δ + sT)}], T with density 1 − |t| on (−1, 1).
 * Example: `phiOverGap(A, 3, 0)` = expm(3A).
 */
export function phiOverGap(drift: Mat, gap: number, spread = 0): Mat {
  if (!(spread > 0)) return expm(scale(drift, gap));
  // ∫_{-1}^{1} (1 − |t|) f(t) dt = ∫_0^1 (1 − t) (f(t) + f(−t)) dt
  let acc = zeros(drift.rows);
  for (let k = 0; k < GL.x.length; k++) {
    const t = GL.x[k];
    const wt = GL.w[k] * (1 - t);
    acc = axpby(1, acc, wt, axpby(1, expm(scale(drift, gap + spread * t)), 1, expm(scale(drift, gap - spread * t))));
  }
  return acc;
}

/** One gap class with its Φ. */
export interface GapPhi extends GapClass {
  phi: Mat;
}

/** What a VAR(1) over consecutive prompts estimates in the limit, beside Φ at the nominal interval. */
export interface VarLimits {
  states: VariableId[];
  /** Φ at the nominal interval. */
  nominal: Mat;
  gaps: GapPhi[];
  /** Σ_j w_j Φ(Δ_j) over all consecutive pairs. */
  pooled: Mat;
  /** The same over pairs on the same day only (renormalised); null when no two prompts share a day. */
  sameDay: Mat | null;
  /** Share of the consecutive pairs that fall on the same day. */
  sameDayShare: number;
}

/**
 * The VAR limits of a drift matrix for a list of gap classes.
 * Example: `varLimits(A, ["stress", "mood"], scheduleGaps(study, "h"), 3).pooled`.
 */
export function varLimits(drift: Mat, states: VariableId[], gaps: GapClass[], interval: number): VarLimits {
  const n = drift.rows;
  const withPhi: GapPhi[] = gaps.map((g) => ({ ...g, phi: phiOverGap(drift, g.gap, g.spread) }));
  let pooled = zeros(n);
  let same = zeros(n);
  let sameShare = 0;
  for (const g of withPhi) {
    pooled = axpby(1, pooled, g.share, g.phi);
    if (g.sameDay) {
      same = axpby(1, same, g.share, g.phi);
      sameShare += g.share;
    }
  }
  return {
    states,
    nominal: expm(scale(drift, interval)),
    gaps: withPhi,
    pooled,
    sameDay: sameShare > 0 ? scale(same, 1 / sameShare) : null,
    sameDayShare: sameShare,
  };
}

/**
 * A VAR limit as estimated from measurements with error: B Σ (Σ + R)⁻¹,
 * R diagonal with R_ii = Σ_ii (1 − r_i)/r_i for reliabilities r_i.
 * Example: `attenuated(pooled, sigma, [1, 0.7])`.
 */
export function attenuated(limit: Mat, stationary: Mat, reliability: ArrayLike<number>): Mat {
  const n = limit.rows;
  const noisy = axpby(1, stationary, 0, identity(n));
  for (let i = 0; i < n; i++) {
    const r = reliability[i];
    noisy.data[i * n + i] += (stationary.data[i * n + i] * (1 - r)) / r;
  }
  return mul(mul(limit, stationary), inverse(noisy));
}
