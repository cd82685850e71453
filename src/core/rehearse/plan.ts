/**
 * The design advisor: analytic power for the links of interest against the interval between
 * prompts, under a budget, and the design to recommend.
 *
 * - Budget of prompts (M per person): every interval costs the same; the recommended design is
 *   the interval of greatest power. It is shorter than the interval where the lagged effect
 *   peaks, because the innovation variance Q(Δ) grows with the interval and the SE with it.
 * - Budget of span (S): an interval Δ gives ⌊S/Δ⌋ prompts; the recommended design is the longest
 *   interval (fewest prompts: least burden) whose power reaches the target for every link.
 * Designs use one prompt every interval (schedule `fixed`) with the study's missed prompts.
 * When no design reaches the target, the result says so and names the link that fails.
 */
import type { Study } from '../model/types';
import { nominalSpacing, plannedSlots, studyRange } from '../study/index';
import { studyInterval } from '../study/convert';
import { analyticPower, type LinkPower } from './power';
import type { Rehearsal } from './setup';
import { precisionText } from '../../present/index';

export type Budget = { kind: 'prompts'; prompts: number } | { kind: 'span'; span: number };

export interface PlanPoint {
  interval: number;
  prompts: number;
  links: LinkPower[];
  /** The smallest power over the links (every link must be detected). */
  minPower: number;
}

export interface PlanResult {
  budget: Budget;
  persons: number;
  target: number;
  curve: PlanPoint[];
  /** Per link: the interval on the grid where the lagged effect the analysis estimates is largest. */
  peaks: { from: string; to: string; interval: number; effect: number }[];
  recommended: PlanPoint | null;
  /** One plain sentence: the design to use, or that none affordable reaches the target and which link fails. */
  statement: string;
}

function designStudy(base: Study, interval: number, prompts: number): Study {
  return { ...base, interval, length: prompts, schedule: { kind: 'fixed' } };
}

/** Log-spaced intervals over the range the interval control offers for the budget. */
export function planGrid(r: Rehearsal, budget: Budget, points = 60): number[] {
  const range = studyRange(r.model, budget.kind === 'span' ? { window: budget.span } : { samples: budget.prompts });
  const lo = range.min, hi = budget.kind === 'span' ? Math.min(range.max, budget.span / 3) : range.max;
  if (!(hi > lo)) throw new Error('the budget leaves no interval to compare: the span is too short for the model\'s timescales');
  return Array.from({ length: points }, (_, k) => lo * (hi / lo) ** (k / (points - 1)));
}

/**
 * Example: `planStudy(rehearsalOf(model, { persons: 50, links }), { kind: 'prompts', prompts: 70 })`.
 * The format option writes an interval for the statement (the CLI passes its duration text).
 */
export function planStudy(r: Rehearsal, budget: Budget, opt: { target?: number; grid?: number[]; format?: (interval: number) => string } = {}): PlanResult {
  if (r.links.length === 0) throw new Error('--link: name the link(s) the study must detect');
  if (budget.kind === 'prompts' && !(Number.isInteger(budget.prompts) && budget.prompts >= 3)) throw new Error(`--budget prompts: a whole number of at least 3 prompts per person is needed, not ${budget.prompts}`);
  if (budget.kind === 'span' && !(budget.span > 0)) throw new Error(`--budget span: a positive duration is needed, not ${budget.span}`);
  const target = opt.target ?? 0.8;
  const fmt = opt.format ?? ((x: number) => precisionText(x, 3, { ascii: true }));
  const grid = opt.grid ?? planGrid(r, budget);
  const missed = r.study.missedPrompts ?? 0;
  const curve: PlanPoint[] = [];
  for (const interval of grid) {
    const prompts = budget.kind === 'prompts' ? budget.prompts : Math.floor(budget.span / interval + 1e-9);
    if (prompts < 3) continue;
    const study = designStudy(r.study, interval, prompts);
    const res = analyticPower({ ...r, study, plannedPerPerson: prompts, answeredPerPerson: prompts * (1 - missed) }, { withCentring: false });
    curve.push({ interval, prompts, links: res.links, minPower: Math.min(...res.links.map((l) => l.power)) });
  }
  if (curve.length === 0) throw new Error('no interval of the grid leaves at least 3 prompts within the budget');
  const peaks = r.links.map((l, k) => {
    let best = curve[0];
    for (const p of curve) if (Math.abs(p.links[k].effect) > Math.abs(best.links[k].effect)) best = p;
    return { from: l.from, to: l.to, interval: best.interval, effect: best.links[k].effect };
  });
  let recommended: PlanPoint | null = null;
  if (budget.kind === 'prompts') {
    const best = curve.reduce((a, b) => (b.minPower > a.minPower ? b : a));
    if (best.minPower >= target) recommended = best;
  } else {
    const ok = curve.filter((p) => p.minPower >= target);
    if (ok.length > 0) recommended = ok.reduce((a, b) => (b.interval > a.interval ? b : a));
  }
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  const budgetText = budget.kind === 'prompts' ? `${budget.prompts} prompts per person` : `a span of ${fmt(budget.span)}`;
  let statement: string;
  if (recommended) {
    statement = `Recommended: one prompt every ${fmt(recommended.interval)}, ${recommended.prompts} prompts per person, ${r.persons} persons: ${recommended.minPower > 0.995 ? 'power near 100 %' : `power of at least ${pct(recommended.minPower)}`} for every link (target ${pct(target)}, ${budgetText}).`;
  } else {
    const best = curve.reduce((a, b) => (b.minPower > a.minPower ? b : a));
    const k = best.links.findIndex((l) => l.power === best.minPower);
    const fail = best.links[k];
    statement = `No affordable design reaches ${pct(target)} power with ${budgetText} and ${r.persons} persons: ${fail.from}->${fail.to} fails (at best ${pct(fail.power)}, one prompt every ${fmt(best.interval)}). More persons or a larger budget would be needed.`;
  }
  return { budget, persons: r.persons, target, curve, peaks, recommended, statement };
}

// ——— the other axes of the design: persons, prompts per day ———

/** One design on an axis other than the interval: its value (persons, prompts per day) and the power there. */
export interface AxisPoint {
  value: number;
  persons: number;
  /** Planned prompts per person. */
  prompts: number;
  /** The nominal interval between prompts (the study's unit). */
  interval: number;
  links: LinkPower[];
  minPower: number;
}

export type PlanAxis = 'persons' | 'promptsPerDay';

export interface AxisPlan {
  axis: PlanAxis;
  target: number;
  points: AxisPoint[];
  /** The least burden (fewest persons, fewest prompts a day) that reaches the target for every link. */
  recommended: AxisPoint | null;
  statement: string;
}

/** Persons compared when none are given. */
export const PERSON_STEPS = [5, 10, 15, 20, 30, 40, 50, 60, 80, 100, 150, 200, 300, 500];
/** Prompts per day compared when none are given. */
export const PROMPTS_PER_DAY_STEPS = [1, 2, 3, 4, 5, 6, 7, 8, 10, 12];

function checkValues(values: readonly number[], name: string, min: number): void {
  if (values.length === 0) throw new Error(`${name}: give at least one value to compare`);
  for (const v of values) if (!(Number.isInteger(v) && v >= min)) throw new Error(`${name}: every value must be a whole number of at least ${min}, not ${v}`);
}

function axisStatement(r: Rehearsal, axis: PlanAxis, target: number, points: AxisPoint[], recommended: AxisPoint | null, fmt: (x: number) => string): string {
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  if (recommended) {
    const what = axis === 'persons' ? `${recommended.persons} persons` : `${recommended.value} prompts a day (every ${fmt(recommended.interval)} within the day)`;
    return `Recommended: ${what}, ${recommended.prompts} prompts per person, ${recommended.persons} persons: ${recommended.minPower > 0.995 ? 'power near 100 %' : `power of at least ${pct(recommended.minPower)}`} for every link (target ${pct(target)}).`;
  }
  const best = points.reduce((a, b) => (b.minPower > a.minPower ? b : a));
  const fail = best.links.reduce((a, b) => (b.power < a.power ? b : a));
  const tried = axis === 'persons' ? `up to ${Math.max(...points.map((p) => p.value))} persons` : `up to ${Math.max(...points.map((p) => p.value))} prompts a day`;
  return `No design with ${tried} reaches ${pct(target)} power: ${fail.from}->${fail.to} fails (at best ${pct(fail.power)}, with ${axis === 'persons' ? `${best.persons} persons` : `${best.value} prompts a day`}). ${axis === 'persons' ? 'More prompts per person or another interval' : 'More persons or a longer study'} would be needed.`;
}

/**
 * Analytic power against the number of persons, the rest of the study as planned; the
 * recommended design is the fewest persons that reach the target for every link.
 * Example: `planPersons(rehearsalOf(model, { links }), { values: [10, 20, 40] })`.
 */
export function planPersons(r: Rehearsal, opt: { values?: readonly number[]; target?: number; format?: (interval: number) => string } = {}): AxisPlan {
  if (r.links.length === 0) throw new Error('--link: name the link(s) the study must detect');
  const values = [...(opt.values ?? PERSON_STEPS)].sort((a, b) => a - b);
  checkValues(values, 'persons', 1);
  const target = opt.target ?? 0.8;
  const interval = studyInterval(r.study, r.timeUnit) ?? NaN;
  const points = values.map((persons): AxisPoint => {
    const res = analyticPower({ ...r, persons }, { withCentring: false });
    return { value: persons, persons, prompts: r.plannedPerPerson, interval, links: res.links, minPower: Math.min(...res.links.map((l) => l.power)) };
  });
  const recommended = points.find((p) => p.minPower >= target) ?? null;
  return { axis: 'persons', target, points, recommended, statement: axisStatement(r, 'persons', target, points, recommended, opt.format ?? ((x) => precisionText(x, 3, { ascii: true }))) };
}

/**
 * Analytic power against the prompts per day of a daily-window schedule, with the study's span
 * (a length given as prompts is held as the days it takes) and persons; prompts spread over the
 * same window. The recommended design is the fewest prompts a day that reach the target.
 * Example: `planPromptsPerDay(rehearsalOf(model, { links }), { values: [2, 4, 6] })`.
 */
export function planPromptsPerDay(r: Rehearsal, opt: { values?: readonly number[]; target?: number; format?: (interval: number) => string } = {}): AxisPlan {
  if (r.links.length === 0) throw new Error('--link: name the link(s) the study must detect');
  const sch = r.study.schedule;
  if (sch.kind !== 'daily-window') throw new Error(`prompts per day: the study's schedule is "${sch.kind}"; prompts per day can be compared only for a schedule with prompts in a daily window`);
  const values = [...(opt.values ?? PROMPTS_PER_DAY_STEPS)].sort((a, b) => a - b);
  checkValues(values, 'prompts per day', 1);
  const target = opt.target ?? 0.8;
  const missed = r.study.missedPrompts ?? 0;
  const length = typeof r.study.length === 'number' ? `${Math.ceil(r.study.length / sch.promptsPerDay)} day` : r.study.length;
  const points: AxisPoint[] = [];
  for (const k of values) {
    const schedule = { ...sch, promptsPerDay: k };
    const interval = nominalSpacing(schedule, r.timeUnit);
    const study: Study = { ...r.study, schedule, interval, length };
    const planned = plannedSlots(study, r.timeUnit).base.length;
    if (planned < 3) continue;
    const res = analyticPower({ ...r, study, plannedPerPerson: planned, answeredPerPerson: planned * (1 - missed) }, { withCentring: false });
    points.push({ value: k, persons: r.persons, prompts: planned, interval, links: res.links, minPower: Math.min(...res.links.map((l) => l.power)) });
  }
  if (points.length === 0) throw new Error('prompts per day: no value leaves at least 3 prompts per person in the study\'s span');
  const recommended = points.find((p) => p.minPower >= target) ?? null;
  return { axis: 'promptsPerDay', target, points, recommended, statement: axisStatement(r, 'promptsPerDay', target, points, recommended, opt.format ?? ((x) => precisionText(x, 3, { ascii: true }))) };
}
