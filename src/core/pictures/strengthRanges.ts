/**
 * The design advisor's figures when strengths are only roughly known: each
 * link with a `strengthRange { low, high }` draws its strength (a size, the
 * link's sign kept) uniformly in the range, seeded; every draw gets the
 * interval advice of `adviceOf` on the grid of the model as written, and the
 * answer gives the share of draws:
 * - in which the advised interval of the model as written still keeps every
 *   chosen link at `fraction` or more of its own peak ("holds");
 * - per chosen link, in which that interval lies in the link's own range;
 * and the spread (10 %, 50 %, 90 % of draws) of each draw's advised interval
 * and of each link's peak. Which ranged strength decides most is read from
 * the rank correlation of its draws with the advised interval.
 */
import type { Model, VariableId } from '../model/types';
import { fixedText, formatNumber, labeller } from '../../present/index';
import { adviceOf } from '../numeric/answers';
import type { IntervalAdvice } from '../numeric/sampled';
import { linkStrengths } from '../model/strength';
import { seededUniform } from './uncertain';

export interface StrengthRangeOptions {
  draws?: number;
  seed?: number;
  /** Share of each link's peak the advice keeps (default 0.5). */
  fraction?: number;
  /** Grid points (default 121). */
  points?: number;
}

export type Spread = { q10: number; median: number; q90: number };

export interface StrengthRangeAdvice {
  ok: true;
  draws: number;
  seed: number;
  fraction: number;
  /** The links whose strength carries a range (index into model.links). */
  ranged: { index: number; from: VariableId; to: VariableId; low: number; high: number; point: number; decides: number }[];
  /** The advice for the model as written. */
  point: IntervalAdvice;
  intervals: number[];
  /** Share of draws in which the point's advised interval keeps every chosen link at ≥ fraction of its peak. */
  holds: number;
  /** Spread of each draw's advised interval (over the draws that have one); null when none has. */
  best: Spread | null;
  /** Share of draws with no single interval to advise. */
  noAdvice: number;
  links: { from: VariableId; to: VariableId; peak: Spread | null; inRange: number }[];
  /** Each draw: the strengths drawn (in `ranged` order) and its advised interval. */
  samples: { strengths: number[]; best: number | null }[];
  readings: string[];
}

export type StrengthRangeResult = StrengthRangeAdvice | { ok: false; reason: string };

function quantile(sorted: number[], p: number): number {
  const x = p * (sorted.length - 1);
  const i = Math.floor(x), f = x - i;
  return i + 1 < sorted.length ? sorted[i] * (1 - f) + sorted[i + 1] * f : sorted[i];
}
const spread = (xs: number[]): Spread | null => {
  if (xs.length === 0) return null;
  const s = [...xs].sort((a, b) => a - b);
  return { q10: quantile(s, 0.1), median: quantile(s, 0.5), q90: quantile(s, 0.9) };
};

function ranks(xs: number[]): number[] {
  const order = xs.map((x, i) => [x, i] as const).sort((a, b) => a[0] - b[0]);
  const r = new Array<number>(xs.length);
  for (let k = 0; k < order.length; ) {
    let m = k;
    while (m + 1 < order.length && order[m + 1][0] === order[k][0]) m++;
    for (let t = k; t <= m; t++) r[order[t][1]] = (k + m) / 2;
    k = m + 1;
  }
  return r;
}
/** Spearman's rank correlation (ties share their mean rank; common practice). */
function spearman(a: number[], b: number[]): number {
  const ra = ranks(a), rb = ranks(b);
  const n = a.length;
  const ma = ra.reduce((s, x) => s + x, 0) / n, mb = rb.reduce((s, x) => s + x, 0) / n;
  let sab = 0, saa = 0, sbb = 0;
  for (let i = 0; i < n; i++) { sab += (ra[i] - ma) * (rb[i] - mb); saa += (ra[i] - ma) ** 2; sbb += (rb[i] - mb) ** 2; }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : 0;
}

/**
 * Example: `adviceUnderStrengthRanges(model, [{ from: 'worry', to: 'tension' }], { draws: 200, seed: 1 })`.
 */
export function adviceUnderStrengthRanges(model: Model, links: { from: VariableId; to: VariableId }[], options: StrengthRangeOptions = {}): StrengthRangeResult {
  const draws = options.draws ?? 200;
  const seed = options.seed ?? 1;
  const fraction = options.fraction ?? 0.5;
  const points = options.points ?? 121;
  if (!Number.isInteger(draws) || draws < 1 || draws > 100000) return { ok: false, reason: `draws must be a whole number from 1 to 100,000, not ${draws}` };
  const base = adviceOf(model, links, fraction, points);
  if (!base.ok) return base;
  const grid = base.intervals;
  const range: [number, number] = [grid[0], grid[grid.length - 1]];
  const strengths0 = linkStrengths(model);
  const ranged = model.links.flatMap((l, index) => (l.strengthRange ? [{ index, from: l.from, to: l.to, low: l.strengthRange.low, high: l.strengthRange.high, point: strengths0[index].value, decides: 0 }] : []));
  for (const r of ranged) if (!(r.low >= 0 && r.high >= r.low)) return { ok: false, reason: `the strength range of ${r.from} → ${r.to} must have 0 ≤ low ≤ high (it is ${r.low}..${r.high})` };
  const rand = seededUniform(seed);
  const label = labeller(model);
  const name = (id: VariableId) => label(id) || id; // an empty label reads as the id here
  const pointBest = base.advice.best;
  const samples: StrengthRangeAdvice['samples'] = [];
  const peaks: number[][] = links.map(() => []);
  const inRange = links.map(() => 0);
  let holds = 0, none = 0;
  for (let d = 0; d < draws; d++) {
    const strengths = ranged.map((r) => r.low + (r.high - r.low) * rand());
    const drawn = model.links.map((l, i) => {
      const k = ranged.findIndex((r) => r.index === i);
      return k < 0 ? l : { ...l, weight: strengths[k] };
    });
    const a = adviceOf({ ...model, links: drawn }, links, fraction, points, range);
    if (!a.ok) return { ok: false, reason: `with the strengths drawn (${ranged.map((r, k) => `${name(r.from)} → ${name(r.to)} ${formatNumber(strengths[k], { digits: 3 })}`).join(', ')}) ${a.reason}` };
    samples.push({ strengths, best: a.advice.best });
    if (a.advice.best === null) none++;
    let all = pointBest !== null;
    a.advice.links.forEach((l, k) => {
      if (l.peak) peaks[k].push(l.peak.interval);
      const inside = pointBest !== null && l.range !== null && pointBest >= l.range[0] && pointBest <= l.range[1];
      if (inside) inRange[k]++;
      if (!l.noPath && !inside) all = false;
    });
    if (all) holds++;
  }
  const bests = samples.flatMap((s) => (s.best === null ? [] : [s.best]));
  for (const [k, r] of ranged.entries()) {
    const pairs = samples.filter((s) => s.best !== null);
    r.decides = pairs.length > 2 ? spearman(pairs.map((s) => s.strengths[k]), pairs.map((s) => Math.log(s.best!))) : 0;
  }
  const unit = model.timeUnit ? ` ${model.timeUnit}` : '';
  const pct = (x: number) => `${Math.round(100 * x)} %`;
  const fmt = (x: number) => formatNumber(x, { digits: 3 });
  const readings: string[] = [];
  if (ranged.length === 0) readings.push('No link carries a strength range: the advice is the point advice.');
  else {
    const b = spread(bests);
    readings.push(
      pointBest === null
        ? 'The model as written has no single interval to advise.'
        : `Sampling every ${fmt(pointBest)}${unit} keeps every chosen link at ${Math.round(fraction * 100)} % of its peak or more in ${pct(holds / draws)} of ${draws} draws of the strengths.`,
    );
    if (b && fmt(b.q10) === fmt(b.q90)) readings.push(`The advised interval itself stays at ${fmt(b.median)}${unit} in at least 80 % of draws: these ranges barely move it.`);
    else if (b) readings.push(`The advised interval itself lies between ${fmt(b.q10)} and ${fmt(b.q90)}${unit} in 80 % of draws (median ${fmt(b.median)}${unit}).`);
    const lead = [...ranged].sort((x, y) => Math.abs(y.decides) - Math.abs(x.decides))[0];
    if (lead && Math.abs(lead.decides) >= 0.3)
      readings.push(`The strength of ${name(lead.from)} → ${name(lead.to)} (${fmt(lead.low)}..${fmt(lead.high)}) decides most: the stronger it is, the ${lead.decides > 0 ? 'longer' : 'shorter'} the advised interval (rank correlation ${fixedText(lead.decides, 2, { ascii: true })}).`);
    if (none > 0) readings.push(`In ${pct(none / draws)} of draws no single interval can be advised.`);
  }
  return {
    ok: true,
    draws,
    seed,
    fraction,
    ranged,
    point: base.advice,
    intervals: grid,
    holds: holds / draws,
    best: spread(bests),
    noAdvice: none / draws,
    links: links.map((l, k) => ({ from: l.from, to: l.to, peak: spread(peaks[k]), inRange: inRange[k] / draws })),
    samples,
    readings,
  };
}
