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

export interface AdvisedLink {
  from: VariableId;
  to: VariableId;
  peak: { interval: number; effect: number } | null;
  range: [number, number] | null;
  /** No chain of links leads from `from` to `to`: the lagged effect is zero at every interval. */
  noPath?: boolean;
  /** Φ_{to,from} at the recommended interval (absolute size, per unit of `from`). */
  atBest?: number;
}

export interface IntervalAdvice {
  links: AdvisedLink[];
  /** The interval at which the weakest of the chosen links is strongest relative to its own peak. */
  best: number | null;
  /** min over links of |effect(best)| / |peak| */
  score: number;
  explanation: string;
}

/**
 * reach[i][j]: whether state j reaches state i through the drift (a chain of
 * non-zero entries A_ij, j → i), i.e. whether Φ_ij(Δ) = (e^{AΔ})_ij can differ
 * from zero for i ≠ j (the exponential's pattern is the transitive closure of
 * A's: common practice).
 */
export function lagReach(drift: Mat): boolean[][] {
  const n = drift.rows;
  let scale = 0;
  for (const v of drift.data) scale = Math.max(scale, Math.abs(v));
  const tol = 1e-14 * scale;
  const reach = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => i === j || Math.abs(drift.data[i * n + j]) > tol));
  for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) if (reach[i][k]) for (let j = 0; j < n; j++) if (reach[k][j]) reach[i][j] = true;
  return reach;
}

/**
 * For chosen links, the range of Δ where each lagged effect is at least
 * `fraction` of its peak, and one Δ that serves them all best (maximising the
 * smallest share of peak), explained in words with the modeller's labels and
 * each effect's absolute size. Links with no path between their states are
 * left out of the choice.
 * Example: `adviseInterval(A, ['a', 'b'], [{ from: 'a', to: 'b' }], logGrid(0.1, 100, 121), 0.5, 'h', { a: 'Stress', b: 'Mood' })`.
 */
export function adviseInterval(drift: Mat, states: VariableId[], links: { from: VariableId; to: VariableId }[], intervals: number[], fraction = 0.5, unit = '', labels: Record<VariableId, string> = {}): IntervalAdvice {
  const name = (id: VariableId) => labels[id] || id;
  const reach = lagReach(drift);
  const connected = links.map((l) => reach[states.indexOf(l.to)]?.[states.indexOf(l.from)] === true);
  const curves = links.map((l, li) => (connected[li] ? linkCurve(drift, states, l.from, l.to, intervals) : null));
  const out: AdvisedLink[] = curves.map((c, li) => {
    const { from, to } = links[li];
    if (!c) return { from, to, peak: null, range: null, noPath: true };
    if (c.peaks.length === 0) return { from, to, peak: null, range: null };
    const peak = c.peaks.reduce((a, b) => (Math.abs(b.effect) > Math.abs(a.effect) ? b : a));
    const ok = c.intervals.filter((_, k) => Math.abs(c.effect[k]) >= fraction * Math.abs(peak.effect));
    return { from, to, peak, range: ok.length > 0 ? [ok[0], ok[ok.length - 1]] : null };
  });
  const used = out.map((_, li) => li).filter((li) => !out[li].noPath);
  let best: number | null = null, score = 0, bestK = -1;
  if (used.length > 0 && used.every((li) => out[li].peak)) {
    intervals.forEach((d, k) => {
      const s = Math.min(...used.map((li) => Math.abs(curves[li]!.effect[k]) / Math.abs(out[li].peak!.effect)));
      if (s > score) { score = s; best = d; bestK = k; }
    });
  }
  if (bestK >= 0) for (const li of used) out[li].atBest = curves[li]!.effect[bestK];
  const u = unit ? ` ${unit}` : '';
  const pct = Math.round(fraction * 100);
  const parts = out.map((l) =>
    l.noPath
      ? `${name(l.from)} → ${name(l.to)} is left out: no chain of links leads from ${name(l.from)} to ${name(l.to)}, so no interval shows an effect`
      : l.peak
        ? `${name(l.from)} → ${name(l.to)} peaks at Δ ≈ ${fmt(l.peak.interval)}${u} with an effect of ${fmt(l.peak.effect)} (the change in ${name(l.to)} one interval later per unit of ${name(l.from)}) and stays above ${pct}% of that (${fmt(Math.abs(l.peak.effect) * fraction)} in size) from ${fmt(l.range![0])} to ${fmt(l.range![1])}${u}`
        : `${name(l.from)} → ${name(l.to)} has no peak in the range examined (it only grows or only fades there)`,
  );
  const sizes = used.filter((li) => out[li].atBest !== undefined).map((li) => `${name(out[li].from)} → ${name(out[li].to)} ${fmt(out[li].atBest!)}`);
  const explanation =
    best !== null
      ? `${parts.join('; ')}. Sampling every ${fmt(best)}${u} keeps every chosen link at ${Math.round(score * 100)}% or more of its own peak (effects there: ${sizes.join(', ')}).`
      : used.length === 0
        ? `${parts.join('; ')}. None of the chosen links can be seen at any interval.`
        : `${parts.join('; ')}. No single interval can be recommended for these links.`;
  return { links: out, best, score, explanation };
}

const fmt = (x: number) => formatNumber(x, { digits: 3 });
