/**
 * The exact sampled model of dX = A X dt + G dW at interval Δ:
 * X(t+Δ) = Φ(Δ) X(t) + w, w ~ N(0, Q(Δ)), with Φ = e^{AΔ} and Q from Van
 * Loan's method, the stationary covariance Σ (Lyapunov), the lagged network
 * (Φ raw, and standardised Φ_ij·sd_j/sd_i), the same-interval network
 * (partial correlations of the innovations, −P_ij/√(P_ii P_jj), P = Q⁻¹),
 * the interval dependence of single links, and an interval advisor.
 */
import type { VariableId } from '../model/types';
import { diagonalNoise, expm, vanLoan } from './expm';
import { inverse, scale, type Mat } from './dense';
import { lyapunov } from './lyapunov';
import { eigenvalues } from './dense';
import { formatNumber } from '../../present/numbers';

export interface SampledModel {
  states: VariableId[];
  interval: number;
  drift: Mat;
  phi: Mat;
  innovation: Mat;
  stationary: Mat | null;
  /** Why there is no stationary covariance, when there is none. */
  stationaryReason?: string;
  /** Φ_ij · sd_j / sd_i with stationary standard deviations (null without Σ). */
  phiStandardized: Mat | null;
  /** Partial correlations of the innovations (null when Q is singular). */
  innovationPartial: Mat | null;
  /** Oscillating modes sampled too slowly to follow: Δ > π/|Im λ|. */
  aliasing: { re: number; im: number; limit: number }[];
  warnings: string[];
}

/**
 * Example: `sampledModel(A, ['mood', 'sleep'], 24, [1, 1]).phi`.
 * `noise` is the diagonal of G Gᵀ: the variance each state gains per unit time.
 */
export function sampledModel(drift: Mat, states: VariableId[], interval: number, noise: ArrayLike<number>): SampledModel {
  const n = states.length;
  const gg = diagonalNoise(Array.from(noise, (x) => Math.sqrt(x)));
  const { phi, q } = vanLoan(drift, gg, interval);
  const warnings: string[] = [];
  const ly = lyapunov(drift, gg);
  let stationary: Mat | null = null;
  let phiStandardized: Mat | null = null;
  let stationaryReason: string | undefined;
  if (ly.ok) {
    stationary = ly.sigma;
    const sd = Array.from({ length: n }, (_, i) => Math.sqrt(Math.max(0, stationary!.data[i * n + i])));
    phiStandardized = scale(phi, 1);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) phiStandardized.data[i * n + j] = sd[i] > 0 ? (phi.data[i * n + j] * sd[j]) / sd[i] : NaN;
    if (!phiStandardized.data.every(Number.isFinite)) { phiStandardized = null; warnings.push('some states have no stationary spread (zero noise reaches them): standardized effects are not shown'); }
  } else {
    stationaryReason = ly.reason;
    warnings.push(ly.reason);
  }
  let innovationPartial: Mat | null = null;
  const P = inverse(q);
  if (P.data.every(Number.isFinite)) {
    innovationPartial = scale(P, 1);
    let ok = true;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const d = P.data[i * n + i] * P.data[j * n + j];
        if (!(d > 0)) ok = false;
        innovationPartial.data[i * n + j] = i === j ? 1 : -P.data[i * n + j] / Math.sqrt(d);
      }
    if (!ok || !innovationPartial.data.every(Number.isFinite)) innovationPartial = null;
  }
  if (!innovationPartial) warnings.push('the innovation covariance is singular (some states receive no noise): the same-interval network is not defined');
  const ev = eigenvalues(drift);
  const aliasing: SampledModel['aliasing'] = [];
  for (let k = 0; k < n; k++) {
    if (ev.im[k] <= 0) continue;
    const limit = Math.PI / ev.im[k];
    if (interval > limit) aliasing.push({ re: ev.re[k], im: ev.im[k], limit });
  }
  for (const a of aliasing)
    warnings.push(`an oscillating mode (period ${fmt((2 * Math.PI) / a.im)}) is sampled more slowly than every ${fmt(a.limit)}: sampled effects can change sign with the interval (aliasing); sample at most every ${fmt(a.limit)}`);
  return { states, interval, drift, phi, innovation: q, stationary, ...(stationaryReason ? { stationaryReason } : {}), phiStandardized, innovationPartial, aliasing, warnings };
}

/** `count` points from `from` to `to`, evenly spaced in log scale. */
export function logGrid(from: number, to: number, count: number): number[] {
  const a = Math.log(from), b = Math.log(to);
  return Array.from({ length: count }, (_, k) => Math.exp(a + ((b - a) * k) / Math.max(1, count - 1)));
}

export interface LinkCurve {
  from: VariableId;
  to: VariableId;
  intervals: number[];
  /** Φ_{to,from}(Δ): the effect of `from` now on `to` one interval later. */
  effect: number[];
  /** Local extremes of |effect| on the grid (refined by golden-section search). */
  peaks: { interval: number; effect: number }[];
}

function entry(a: Mat, i: number, j: number, d: number): number {
  return expm(scale(a, d)).data[i * a.cols + j];
}

/** The lagged effect of state j on state i as a function of the interval. */
export function linkCurve(drift: Mat, states: VariableId[], from: VariableId, to: VariableId, intervals: number[]): LinkCurve {
  const j = states.indexOf(from), i = states.indexOf(to);
  if (i < 0 || j < 0) throw new Error(`${i < 0 ? to : from} is not a state of the sampled model`);
  const effect = intervals.map((d) => entry(drift, i, j, d));
  const peaks: LinkCurve['peaks'] = [];
  for (let k = 1; k + 1 < intervals.length; k++) {
    const m = Math.abs(effect[k]);
    if (m > Math.abs(effect[k - 1]) && m >= Math.abs(effect[k + 1])) {
      // Golden-section refinement of |Φ_ij| on [Δ_{k−1}, Δ_{k+1}] (common practice).
      let lo = intervals[k - 1], hi = intervals[k + 1];
      const g = (Math.sqrt(5) - 1) / 2;
      let x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
      let f1 = Math.abs(entry(drift, i, j, x1)), f2 = Math.abs(entry(drift, i, j, x2));
      for (let it = 0; it < 80 && hi - lo > 1e-12 * hi; it++) {
        if (f1 > f2) { hi = x2; x2 = x1; f2 = f1; x1 = hi - g * (hi - lo); f1 = Math.abs(entry(drift, i, j, x1)); }
        else { lo = x1; x1 = x2; f1 = f2; x2 = lo + g * (hi - lo); f2 = Math.abs(entry(drift, i, j, x2)); }
      }
      const at = (lo + hi) / 2;
      peaks.push({ interval: at, effect: entry(drift, i, j, at) });
    }
  }
  return { from, to, intervals, effect, peaks };
}

export interface IntervalAdvice {
  links: { from: VariableId; to: VariableId; peak: { interval: number; effect: number } | null; range: [number, number] | null }[];
  /** The interval at which the weakest of the chosen links is strongest relative to its own peak. */
  best: number | null;
  /** min over links of |effect(best)| / |peak| */
  score: number;
  explanation: string;
}

/**
 * For chosen links, the range of Δ where each lagged effect is at least
 * `fraction` of its peak, and one Δ that serves them all best (maximising the
 * smallest share of peak), explained in words.
 */
export function adviseInterval(drift: Mat, states: VariableId[], links: { from: VariableId; to: VariableId }[], intervals: number[], fraction = 0.5, unit = ''): IntervalAdvice {
  const curves = links.map((l) => linkCurve(drift, states, l.from, l.to, intervals));
  const out: IntervalAdvice['links'] = curves.map((c) => {
    if (c.peaks.length === 0) return { from: c.from, to: c.to, peak: null, range: null };
    const peak = c.peaks.reduce((a, b) => (Math.abs(b.effect) > Math.abs(a.effect) ? b : a));
    const ok = c.intervals.filter((_, k) => Math.abs(c.effect[k]) >= fraction * Math.abs(peak.effect));
    return { from: c.from, to: c.to, peak, range: ok.length > 0 ? [ok[0], ok[ok.length - 1]] : null };
  });
  let best: number | null = null, score = 0;
  if (out.every((l) => l.peak)) {
    intervals.forEach((d, k) => {
      const s = Math.min(...curves.map((c, li) => Math.abs(c.effect[k]) / Math.abs(out[li].peak!.effect)));
      if (s > score) { score = s; best = d; }
    });
  }
  const u = unit ? ` ${unit}` : '';
  const parts = out.map((l) =>
    l.peak
      ? `${l.from} → ${l.to} peaks at Δ ≈ ${fmt(l.peak.interval)}${u} (effect ${fmt(l.peak.effect)}) and stays above ${Math.round(fraction * 100)}% of that from ${fmt(l.range![0])} to ${fmt(l.range![1])}${u}`
      : `${l.from} → ${l.to} has no peak in the range examined (it only grows or only fades there)`,
  );
  const explanation =
    best !== null
      ? `${parts.join('; ')}. Sampling every ${fmt(best)}${u} keeps every chosen link at ${Math.round(score * 100)}% or more of its own peak.`
      : `${parts.join('; ')}. No single interval can be recommended for these links.`;
  return { links: out, best, score, explanation };
}

const fmt = (x: number) => formatNumber(x, { digits: 3 });
