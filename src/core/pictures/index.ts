/**
 * One mechanism, two pictures: what a study of a model sees within persons
 * (a network of lagged and same-interval links), across persons (perhaps one
 * common factor), and over long intervals (a lagged matrix of nearly rank
 * one), each with a reading in words. Everything is model-based: what a
 * study *would* see if the mechanism were true, not a finding.
 */
import type { Model, VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { readTimescale } from '../model/timescale';
import { DEFAULT_SEPARATION } from '../model/types';
import { fromRows } from '../numeric/dense';
import { sampledModel } from '../numeric/sampled';
import { factorAnalysis, oneFactorPrecision, type FactorFit } from './factor';
import { LEVELS, levelCovariances, type Level, type LevelCovariances, type LevelOptions } from './levels';
import { labeller } from '../../present/labels';
import { laggedRank, laggedRankCurve, type LaggedRank } from './rank';
import { fixedText } from '../../present/index';

export { factorAnalysis, oneFactorPrecision, chiSquareSurvival, UNIQUENESS_FLOOR } from './factor';
export type { FactorFit, FactorOptions } from './factor';
export { levelCovariances, defaultObserved, DEFAULT_PERSONS, LEVELS } from './levels';
export type { Level, LevelCovariances, LevelOptions, LevelResult } from './levels';
export { laggedRank, laggedRankCurve } from './rank';
export type { LaggedRank } from './rank';
export { symmetricEigen, singularValues } from './symmetric';

/** RMSEA cut-offs: ≤ .05 close fit, ≤ .08 reasonable (Browne & Cudeck 1993). */
export const RMSEA_CLOSE = 0.05;
export const RMSEA_REASONABLE = 0.08;

export interface LevelPicture {
  level: Level;
  covariance: number[][];
  n: number;
  oneFactor: FactorFit | null;
  /** The k-factor fit when k > 1 was asked for. */
  kFactor: FactorFit | null;
  /** The network a one-factor model implies (partial correlations, Sherman–Morrison): fully connected. */
  impliedNetwork: number[][] | null;
  problem?: string;
  reading: string;
}

export interface WithinNetwork {
  interval: number;
  variables: VariableId[];
  /** Standardized lagged effects Φ_ij·sd_j/sd_i over the variables (null without a stationary spread). */
  lagged: number[][] | null;
  /** Same-interval partial correlations of the innovations (null when singular). */
  sameInterval: number[][] | null;
  reading: string;
}

export interface Pictures {
  model: string;
  timeUnit: string;
  levels: LevelCovariances;
  within: WithinNetwork;
  byLevel: Record<Level, LevelPicture>;
  /** Φ(Δ) at the study's interval and at a long interval, with their singular values. */
  rankNow: LaggedRank;
  rankLong: LaggedRank;
  longReading: string;
  /** Singular-value ratios over a log grid of intervals (for the figure). */
  rankCurve: { interval: number; secondRatio: number; ratio: number; largest: number }[];
  /** Which picture each kind of study would see, in a few sentences. */
  summary: string[];
  warnings: string[];
}

export interface PictureOptions extends LevelOptions {
  /** Factors for the second fit (default 2 when the variables allow it). */
  factors?: number;
}

const f2 = (x: number) => (Math.abs(x) < 1 ? fixedText(x, 2, { ascii: true }).replace(/^(-?)0\./, '$1.') : fixedText(x, 2, { ascii: true }));
/** A singular value ratio in words: two decimals, or "below .01" rather than a ".00" that reads as zero. */
const ratioText = (x: number) => (x > 0 && x < 0.005 ? 'below .01' : f2(x));

function fitWords(fit: FactorFit): string {
  if (fit.rmsea === null) return fit.df === 0 ? 'one factor reproduces any covariance of three variables (no degrees of freedom)' : 'the fit could not be judged';
  const verdict = fit.rmsea <= RMSEA_CLOSE ? 'fits' : fit.rmsea <= RMSEA_REASONABLE ? 'fits reasonably' : 'does not fit';
  return `one factor ${verdict} (RMSEA ${f2(fit.rmsea)})`;
}

function levelWords(level: Level, fit: FactorFit | null, lv: LevelCovariances, unit: string, names: (id: VariableId) => string, driverText: string): string {
  if (!fit) return '';
  const at = formatDuration(lv.interval, unit as Model['timeUnit']);
  let largest = 0;
  fit.correlation.forEach((row, i) => row.forEach((r, j) => { if (i !== j) largest = Math.max(largest, Math.abs(r)); }));
  const where = level === 'within' ? `Within persons at ${at}` : level === 'between' ? 'Across persons' : `In a one-time survey of ${lv.persons} persons`;
  if (largest < 0.1) return `${where}, the variables barely correlate (largest correlation ${f2(largest)}): there is little for any factor or network to explain.`;
  if (fit.rmsea === null) return `${where}, ${fitWords(fit)}: analyse at least four variables to tell a common factor from a network.`;
  const fits = fit.rmsea !== null && fit.rmsea <= RMSEA_REASONABLE;
  // A first eigenvalue carrying most of the variance: one factor dominates even where the exact fit detects the loops.
  const p = fit.eigenvalues.length;
  const share = fit.eigenvalues[0] / p;
  if (!fits && share >= 0.75 && level !== 'within')
    return `${where}, one factor dominates (first eigenvalue ${fixedText(fit.eigenvalues[0], 1, { ascii: true })} of ${p}, ${Math.round(share * 100)} % of the variance): ${driverText}; ${fit.rmsea! <= 0.1 ? 'the loops still leave a trace the exact fit detects' : 'yet the exact fit rejects a single factor: the small rest of the variance follows the loops'} (RMSEA ${f2(fit.rmsea!)}).`;
  const strongest = fit.loadings.map((l, i) => ({ i, l: Math.abs(l[0]) })).sort((a, b) => b.l - a.l)[0];
  if (level === 'between')
    return fits
      ? `Across persons (person means over ${lv.samples} prompts), ${fitWords(fit)}: ${driverText}.`
      : `Across persons, ${fitWords(fit)}: the person means differ in more than one direction.`;
  if (level === 'cross')
    return fits
      ? `In a one-time survey of ${lv.persons} persons, ${fitWords(fit)}: person differences and momentary states mix, and the person differences dominate (${driverText}).`
      : `In a one-time survey of ${lv.persons} persons, ${fitWords(fit)}: the momentary links between the variables show through the person differences.`;
  return fits
    ? `Within persons at ${at}, ${fitWords(fit)}: the fluctuations move together, as if one common cause drove them${strongest ? ` (strongest loading: ${names(lv.observed[strongest.i])})` : ''}.`
    : `Within persons at ${at}, ${fitWords(fit)}: the loops between the variables dominate.`;
}

/**
 * The three pictures of a model at a study design.
 * Example: `picturesAt(model, { interval: 3, samples: 70, persons: 150 }).summary`.
 */
export function picturesAt(model: Model, options: PictureOptions): { ok: true; pictures: Pictures } | { ok: false; reason: string } {
  const lv = levelCovariances(model, options);
  if (!lv.ok) return lv;
  const warnings = [...lv.warnings];
  const label = labeller(model);
  const p = lv.observed.length;
  const idx = lv.observed.map((id) => lv.states.indexOf(id));

  // Within-person network at the study's interval.
  const sm = sampledModel(lv.drift, lv.states, lv.interval, lv.noise);
  const pick = (m: { data: Float64Array; cols: number } | null) => (m ? idx.map((i) => idx.map((j) => m.data[i * m.cols + j])) : null);
  const lagged = pick(sm.phiStandardized);
  const same = pick(sm.innovationPartial);
  let strongest: { from: number; to: number; w: number; kind: string } | null = null;
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      if (i === j) continue;
      const cands = [{ w: lagged?.[i][j] ?? 0, kind: 'lagged' }, ...(i < j ? [{ w: same?.[i][j] ?? 0, kind: 'same-interval' }] : [])];
      for (const c of cands) if (!strongest || Math.abs(c.w) > Math.abs(strongest.w)) strongest = { from: j, to: i, w: c.w, kind: c.kind };
    }
  const at = formatDuration(lv.interval, model.timeUnit);
  const withinReading =
    strongest && Math.abs(strongest.w) >= 0.05
      ? `Within persons every ${at}: strongest link ${label(lv.observed[strongest.from])} ${strongest.kind === 'lagged' ? '→' : '—'} ${label(lv.observed[strongest.to])} (${strongest.kind}, ${f2(strongest.w)}).`
      : `Within persons every ${at}: no link between the variables reaches .05; each mostly follows its own noise.`;

  // Factor fits per level.
  const k = options.factors ?? 2;
  const driverText =
    lv.personInputs.length > 0
      ? `the person-level ${lv.personInputs.length > 1 ? 'inputs' : 'input'} ${lv.personInputs.map((x) => label(x.id)).join(', ')} ${lv.personInputs.length > 1 ? 'move' : 'moves'} every variable together`
      : 'slow fluctuations move every variable together';
  const byLevel = {} as Record<Level, LevelPicture>;
  for (const level of LEVELS) {
    const cov = lv[level];
    const n = lv.n[level];
    const pic: LevelPicture = { level, covariance: cov, n, oneFactor: null, kFactor: null, impliedNetwork: null, reading: '' };
    try {
      if (p < 3) throw new Error(`a factor analysis needs at least 3 variables; ${p} ${p === 1 ? 'is' : 'are'} analysed`);
      pic.oneFactor = factorAnalysis(fromRows(cov), 1, { n, names: lv.observed.map(label) });
      pic.impliedNetwork = oneFactorPrecision(pic.oneFactor.loadings.map((l) => l[0]), pic.oneFactor.uniqueness).partial;
      if (k > 1 && ((p - k) ** 2 - (p + k)) / 2 >= 0) pic.kFactor = factorAnalysis(fromRows(cov), k, { n, names: lv.observed.map(label) });
      pic.reading = levelWords(level, pic.oneFactor, lv, model.timeUnit, label, driverText);
    } catch (e) {
      pic.problem = (e as Error).message;
      pic.reading = `${level === 'within' ? 'Within persons' : level === 'between' ? 'Across persons' : 'In a one-time survey'}: no factor analysis (${pic.problem}).`;
    }
    byLevel[level] = pic;
  }

  // Φ(Δ) now and at a long interval.
  const rankNow = laggedRank(lv.drift, lv.states, lv.observed, lv.interval);
  const k5 = model.settings?.separation ?? DEFAULT_SEPARATION;
  const taus = lv.observed.map((id) => {
    const v = model.variables.find((x) => x.id === id);
    const r = v?.timescale !== undefined ? readTimescale(v.timescale, model.timeUnit) : null;
    return r && r.ok ? r.point : 1;
  });
  const lo = Math.min(...taus) / 10, hi = Math.max(Math.max(...taus) * k5 * 4, lv.interval * 40);
  const curve = laggedRankCurve(lv.drift, lv.states, lv.observed, Math.min(lo, lv.interval), Math.max(hi, lv.interval * 2), 60);
  // "Long": at least four study intervals and k times the middle timescale of the analysed states, then
  // the first interval on the grid where Φ is nearly rank one (else that minimum).
  const sortedTaus = [...taus].sort((a, b) => a - b);
  const minLong = Math.max(4 * lv.interval, k5 * sortedTaus[Math.floor((sortedTaus.length - 1) / 2)]);
  const longAt = curve.find((c) => c.interval >= minLong && c.secondRatio <= 0.1)?.interval ?? minLong;
  const rankLong = laggedRank(lv.drift, lv.states, lv.observed, longAt);
  const longWords = formatDuration(longAt, model.timeUnit);
  let longReading: string;
  if (rankLong.singularValues[0] < 0.01) longReading = `Every ${longWords}: almost nothing carries over from one prompt to the next (largest singular value ${rankLong.singularValues[0].toExponential(1)}).`;
  else if (rankLong.secondRatio <= 0.1)
    longReading =
      rankLong.spread >= Math.max(2, p / 2)
        ? `Every ${longWords}: the lagged matrix is nearly rank one (second/first singular value ${ratioText(rankLong.secondRatio)}): one pattern over ${Math.round(rankLong.spread)} of ${p} variables carries over, as a common cause would.`
        : `Every ${longWords}: the lagged matrix is nearly rank one (second/first ${ratioText(rankLong.secondRatio)}), but the pattern sits on ${label(lv.observed[rankLong.pattern.map(Math.abs).indexOf(Math.max(...rankLong.pattern.map(Math.abs)))])}: one slow variable's persistence, not a common cause.`;
  else longReading = `Every ${longWords}: the lagged matrix keeps ${rankLong.singularValues.filter((s) => s >= 0.1 * rankLong.singularValues[0]).length} patterns (second/first singular value ${ratioText(rankLong.secondRatio)}).`;

  const summary = [withinReading, byLevel.within.reading, byLevel.between.reading, byLevel.cross.reading, longReading].filter((s) => s !== '');
  if (lv.personInputs.length === 0) summary.push('No input differs across persons: give a person-level input a person SD to see differences between persons.');
  warnings.push(...sm.warnings.filter((w) => !warnings.includes(w)));
  for (const level of LEVELS) for (const w of [...(byLevel[level].oneFactor?.warnings ?? [])]) warnings.push(`${level}: ${w}`);
  const { ok: _ok, ...levels } = lv;
  void _ok;
  return {
    ok: true,
    pictures: {
      model: model.name,
      timeUnit: model.timeUnit,
      levels,
      within: { interval: lv.interval, variables: lv.observed, lagged, sameInterval: same, reading: withinReading },
      byLevel,
      rankNow,
      rankLong,
      longReading,
      rankCurve: curve.map((c) => ({ interval: c.interval, secondRatio: c.secondRatio, ratio: c.ratio, largest: c.singularValues[0] })),
      summary,
      warnings,
    },
  };
}
export { orderingProbabilities, breakpointRanges, logUniformBelow, seededUniform } from './uncertain';
export type { OrderingProbabilities, OrderingShare, StateUncertainty, BreakpointRange, UncertainOptions } from './uncertain';
export { adviceUnderStrengthRanges } from './strengthRanges';
export type { StrengthRangeAdvice, StrengthRangeOptions, StrengthRangeResult, Spread } from './strengthRanges';
