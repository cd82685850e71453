/**
 * The data at a glance, as plain numbers for the overview's figures: each
 * person's series, the intervals between consecutive occasions by kind
 * (within a day, across a skipped prompt, overnight) as a histogram on a log
 * axis, and the missing cells per variable.
 */
import type { VariableId } from '../model/types';
import type { Panel } from './panel';

export type IntervalKind = 'within a day' | 'skipped prompt' | 'overnight';
export const INTERVAL_KINDS: readonly IntervalKind[] = ['within a day', 'skipped prompt', 'overnight'];

/**
 * The kind of the interval before occasion k of a person: overnight when the
 * day changes; a skipped prompt when the prompt number within the day jumps
 * by more than one (or, without prompt numbers, when the interval is longer
 * than 1.5 times the median interval within days); else within a day.
 * Without day numbers, an interval over three times the median counts as overnight.
 */
export function classifyIntervals(panel: Panel): { interval: number; kind: IntervalKind }[] {
  const all: number[] = [];
  const within: number[] = [];
  for (const p of panel.persons)
    for (let k = 1; k < p.time.length; k++) {
      const d = p.time[k] - p.time[k - 1];
      all.push(d);
      if (!p.day || p.day[k] === p.day[k - 1]) within.push(d);
    }
  const med = (xs: number[]) => { const s = xs.slice().sort((a, b) => a - b); return s.length ? s[s.length >> 1] : NaN; };
  const mAll = med(all), mWithin = med(within);
  const out: { interval: number; kind: IntervalKind }[] = [];
  for (const p of panel.persons)
    for (let k = 1; k < p.time.length; k++) {
      const d = p.time[k] - p.time[k - 1];
      let kind: IntervalKind;
      if (p.day) kind = p.day[k] !== p.day[k - 1] ? 'overnight' : p.prompt ? (p.prompt[k] - p.prompt[k - 1] > 1 ? 'skipped prompt' : 'within a day') : d > 1.5 * mWithin ? 'skipped prompt' : 'within a day';
      else kind = d > 3 * mAll ? 'overnight' : 'within a day';
      out.push({ interval: d, kind });
    }
  return out;
}

export interface IntervalHistogram {
  /** Bin edges (log-spaced), one more than the bins. */
  edges: number[];
  counts: Record<IntervalKind, number[]>;
  totals: Record<IntervalKind, number>;
  median: number;
  /** How the kinds were told apart, in words. */
  rule: string;
}

/** Example: `intervalHistogram(panel, 24).counts.overnight`. Intervals ≤ 0 cannot occur in a panel (times strictly increase). */
export function intervalHistogram(panel: Panel, bins = 24): IntervalHistogram {
  const xs = classifyIntervals(panel);
  const empty = () => Object.fromEntries(INTERVAL_KINDS.map((k) => [k, [] as number[]])) as unknown as Record<IntervalKind, number[]>;
  const totals = Object.fromEntries(INTERVAL_KINDS.map((k) => [k, 0])) as Record<IntervalKind, number>;
  const hasDays = panel.persons.some((p) => p.day), hasPrompts = panel.persons.some((p) => p.prompt);
  const rule = hasDays ? (hasPrompts ? 'nights from the day numbers, skipped prompts from the prompt numbers' : 'nights from the day numbers; skipped prompts: longer than 1.5 × the median interval within days') : 'no day numbers: intervals over 3 × the median count as nights';
  if (xs.length === 0) return { edges: [], counts: empty(), totals, median: NaN, rule };
  let lo = Infinity, hi = -Infinity;
  for (const x of xs) { lo = Math.min(lo, x.interval); hi = Math.max(hi, x.interval); }
  if (hi <= lo) { hi = lo * 1.1; lo = lo / 1.1; }
  const a = Math.log(lo), b = Math.log(hi);
  const edges = Array.from({ length: bins + 1 }, (_, i) => Math.exp(a + ((b - a) * i) / bins));
  edges[0] = lo; edges[bins] = hi;
  const counts = Object.fromEntries(INTERVAL_KINDS.map((k) => [k, new Array<number>(bins).fill(0)])) as Record<IntervalKind, number[]>;
  for (const x of xs) {
    const i = Math.min(bins - 1, Math.max(0, Math.floor(((Math.log(x.interval) - a) / (b - a)) * bins)));
    counts[x.kind][i]++;
    totals[x.kind]++;
  }
  const sorted = xs.map((x) => x.interval).sort((p, q) => p - q);
  return { edges, counts, totals, median: sorted[sorted.length >> 1], rule };
}

export interface Missingness {
  variable: VariableId;
  missing: number;
  total: number;
  /** Persons with no value at all for this variable. */
  personsWithout: number;
}

/** Missing cells per variable over every occasion kept. */
export function missingness(panel: Panel): Missingness[] {
  const nv = panel.variables.length;
  return panel.variables.map((variable, j) => {
    let missing = 0, total = 0, personsWithout = 0;
    for (const p of panel.persons) {
      let seen = 0;
      for (let k = 0; k < p.time.length; k++) { total++; if (Number.isFinite(p.values[k * nv + j])) seen++; else missing++; }
      if (seen === 0) personsWithout++;
    }
    return { variable, missing, total, personsWithout };
  });
}

export interface PersonSeriesData {
  id: string;
  /** Times since the person's first occasion. */
  times: number[];
  values: Record<VariableId, number[]>;
  /** Indices k where a night lies between occasions k − 1 and k. */
  nights: number[];
}

/** One person's series (by index), times from the first occasion. */
export function personSeries(panel: Panel, index: number): PersonSeriesData {
  const p = panel.persons[index];
  if (!p) throw new Error(`there is no person ${index + 1} (the data have ${panel.persons.length})`);
  const nv = panel.variables.length;
  const t0 = p.time[0] ?? 0;
  const values: Record<VariableId, number[]> = {};
  panel.variables.forEach((v, j) => { values[v] = Array.from({ length: p.time.length }, (_, k) => p.values[k * nv + j]); });
  const nights: number[] = [];
  for (let k = 1; k < p.time.length; k++) if (p.day && p.day[k] !== p.day[k - 1]) nights.push(k);
  return { id: p.id, times: Array.from(p.time, (t) => t - t0), values, nights };
}
