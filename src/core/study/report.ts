/**
 * The design of a study in numbers: its gaps and their shares, Φ for each
 * gap, and what a first-order VAR over consecutive prompts estimates in the
 * limit, beside Φ at the nominal interval; read by `loopfold design` and the
 * app's design panel.
 */
import type { Model, Study, VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { toRows } from '../numeric/dense';
import { driftAtEquilibrium } from '../numeric/index';
import { sampledModel } from '../numeric/sampled';
import { noiseOf, reliabilityOf, studyInterval } from './convert';
import { studyOfModel } from './design';
import { attenuated, scheduleGaps, varLimits } from './gaps';
import { fixedText, labeller, precisionText } from '../../present/index';

/** One distinct gap between consecutive prompts. */
export interface DesignGap {
  /** The gap in the model's time unit (the mean of a stratified-random gap). */
  gap: number;
  /** Share of all consecutive answered pairs over the whole study. */
  share: number;
  /** Of that share, the part whose two prompts fall on the same day. */
  sameDayShare: number;
  /** Half-width of a stratified-random gap's triangular spread (0: exact). */
  spread: number;
  /** Φ for the gap, rows and columns in `states` order. */
  phi: number[][];
}

export interface StudyDesignReport {
  /** The study as read (a model without one: the default study). */
  study: Study;
  timeUnit: Model['timeUnit'];
  /** The nominal interval in the model's time unit. */
  interval: number;
  states: VariableId[];
  /** Φ at the nominal interval. */
  nominal: number[][];
  gaps: DesignGap[];
  /** The VAR(1) limit over all consecutive pairs: Σ_k w_k Φ(Δ_k). */
  pooled: number[][];
  /** The limit over same-day pairs only; null when no two prompts share a day. */
  sameDay: number[][] | null;
  /** The pooled limit as measured with the variables' reliabilities (null when every reliability is 1 or Σ does not exist). */
  pooledMeasured: number[][] | null;
  /** The effect of the long gaps in words, one sentence per state whose autoregression they shrink. */
  shrinkage: string[];
  warnings: string[];
}

/**
 * The design report of a model's study (or of `study`).
 * Example: `studyDesign(model)` → { gaps: [{ gap: 3, share: 0.81, … }, { gap: 12, … }], pooled, sameDay, … }.
 */
export function studyDesign(model: Model, study: Study = studyOfModel(model)): { ok: true; report: StudyDesignReport } | { ok: false; reason: string } {
  const unit = model.timeUnit;
  const interval = studyInterval(study, unit);
  if (interval === undefined) return { ok: false, reason: `study.interval "${String(study.interval)}" is not a duration` };
  const d = driftAtEquilibrium(model);
  if (!d.ok) return { ok: false, reason: d.reason };
  if (d.states.length === 0) return { ok: false, reason: 'the model has no states: there is no lagged effect to estimate' };
  let classes;
  try {
    classes = scheduleGaps(study, unit);
  } catch (e) {
    return { ok: false, reason: (e as Error).message };
  }
  if (classes.length === 0) return { ok: false, reason: 'the study has fewer than two prompts: there is no gap between prompts' };
  const lim = varLimits(d.drift, d.states, classes, interval);
  // merge the classes that share a gap (same day or across midnight, after a missed prompt or not)
  const merged = new Map<string, DesignGap>();
  for (const g of lim.gaps) {
    const key = `${precisionText(g.gap, 12, { ascii: true })}|${g.spread}`;
    const m = merged.get(key);
    if (m) {
      m.share += g.share;
      m.sameDayShare += g.sameDay ? g.share : 0;
    } else merged.set(key, { gap: g.gap, share: g.share, sameDayShare: g.sameDay ? g.share : 0, spread: g.spread, phi: toRows(g.phi) });
  }
  const gaps = [...merged.values()].sort((a, b) => a.gap - b.gap);
  const warnings = [...d.warnings];
  let pooledMeasured: number[][] | null = null;
  const reliability = d.states.map((s) => reliabilityOf(model, s));
  if (reliability.some((r) => r < 1)) {
    const sm = sampledModel(d.drift, d.states, interval, d.states.map((s) => noiseOf(model, s)));
    if (sm.stationary) pooledMeasured = toRows(attenuated(lim.pooled, sm.stationary, reliability));
    else warnings.push(`the measured limit needs a stationary covariance: ${sm.stationaryReason ?? 'there is none'}`);
  }
  const nominal = toRows(lim.nominal);
  const pooled = toRows(lim.pooled);
  const sameDay = lim.sameDay ? toRows(lim.sameDay) : null;
  return {
    ok: true,
    report: { study, timeUnit: unit, interval, states: d.states, nominal, gaps, pooled, sameDay, pooledMeasured, shrinkage: shrinkageText(model, study.schedule.kind === 'daily-window', d.states, interval, gaps, nominal, pooled, sameDay), warnings },
  };
}

const fmt = (x: number) => (Math.abs(x) >= 0.01 || x === 0 ? fixedText(x, 2, { ascii: true }) : precisionText(x, 2, { ascii: true }));

/**
 * The night-gap (long-gap) shrinkage in words. Only a daily window has nights between its prompts; in other
 * schedules the longer gaps come from missed prompts, whatever clock time they span.
 */
function shrinkageText(model: Model, window: boolean, states: VariableId[], interval: number, gaps: DesignGap[], nominal: number[][], pooled: number[][], sameDay: number[][] | null): string[] {
  const u = model.timeUnit;
  const long = gaps.filter((g) => g.gap > interval * 1.01);
  if (long.length === 0) return [];
  const longShare = long.reduce((s, g) => s + g.share, 0);
  const longest = long[long.length - 1];
  const label = labeller(model);
  const out: string[] = [];
  const nights = window && longest.sameDayShare < longest.share * 0.5;
  const what = nights ? 'night gaps' : 'longer gaps after missed prompts';
  out.push(
    `${Math.round(longShare * 100)} % of consecutive prompts are more than one interval (${formatDuration(interval, u)}) apart, up to ${formatDuration(longest.gap, u)}: a VAR over consecutive prompts mixes Φ over these ${what} with Φ over the intended interval (${nights ? 'night-gap' : 'long-gap'} shrinkage).`,
  );
  states.forEach((s, i) => {
    const a = nominal[i][i];
    const b = pooled[i][i];
    if (Math.abs(a) < 1e-3 || Math.abs(a - b) < 0.005) return;
    out.push(
      `The autoregression of ${label(s)} is ${fmt(a)} at ${formatDuration(interval, u)}; all consecutive pairs estimate ${fmt(b)}${sameDay ? `, same-day pairs only ${fmt(sameDay[i][i])}` : ''}.`,
    );
  });
  return out;
}
