/**
 * Orderings when timescales are only roughly known. A state's timescale may
 * be a range `{ low, high }`; its role at an interval Δ (settled, dynamic or
 * frozen: see ordering/timescales.ts) is then uncertain, and so is the
 * ordering. Timescales are drawn log-uniform in their ranges (independently;
 * log-uniform because timescales are compared by ratios — the usual
 * uninformative choice for a positive scale quantity, Jeffreys 1961, "Theory
 * of Probability", §3.1), seeded, and each distinct set of roles is ordered
 * once. Each state's own role probabilities are also given exactly: under a
 * log-uniform τ on [a, b], P(τ ≤ c) = ln(c/a)/ln(b/a) for a ≤ c ≤ b.
 */
import type { Model, VariableId } from '../model/types';
import { DEFAULT_SAMPLES, DEFAULT_SEPARATION } from '../model/types';
import { readTimescale } from '../model/timescale';
import { formatDuration } from '../model/units';
import { orderingAt } from '../ordering/index';
import type { OrderingBlock, Role, StudyDesign } from '../ordering/types';
import { compareIds } from '../ordering/structure';

export interface UncertainOptions {
  /** Number of Monte Carlo draws (default 2000). */
  draws?: number;
  /** Seed of the draws (default 1). */
  seed?: number;
}

export interface OrderingShare {
  /** Roles of every variable in this ordering. */
  roles: Record<VariableId, Role>;
  blocks: OrderingBlock[];
  /** Share of the draws that give this ordering. */
  share: number;
  /** The roles of the uncertain states that tell this ordering apart. */
  deciding: Record<VariableId, Role>;
}

export interface StateUncertainty {
  id: VariableId;
  /** Range of the timescale (model time unit). */
  low: number;
  high: number;
  /** Exact probabilities of each role at Δ under a log-uniform timescale. */
  exact: { settled: number; state: number; frozen: number };
  /** Shares among the draws. */
  drawn: { settled: number; state: number; frozen: number };
  /** Whether the state's role at Δ depends on where its timescale lies in its range. */
  decides: boolean;
}

export interface OrderingProbabilities {
  interval: number;
  draws: number;
  seed: number;
  probabilities: OrderingShare[];
  states: StateUncertainty[];
  /** Sentences: which variable's uncertainty decides the ordering, and how. */
  readings: string[];
}

/** A small seeded generator (mulberry32; common practice), uniform in [0, 1). */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** P(τ ≤ c) for τ log-uniform on [low, high] (a point mass when low = high). */
export function logUniformBelow(c: number, low: number, high: number): number {
  if (high <= low) return low <= c ? 1 : 0;
  if (c <= low) return 0;
  if (c >= high) return 1;
  return Math.log(c / low) / Math.log(high / low);
}

interface RoleRule {
  k: number;
  interval: number;
  window?: number;
  samples: number;
}

/** The role rule of ordering/timescales.ts (`stateRole`), with the same comparisons. */
function roleOf(tau: number, r: RoleRule): 'settled' | 'state' | 'frozen' {
  if (r.interval >= r.k * tau) return 'settled';
  const frozen = r.window !== undefined ? tau >= r.k * r.window : r.interval <= tau / (r.k * r.samples);
  return frozen ? 'frozen' : 'state';
}

/**
 * The probability of each ordering at `design.interval` when some timescales are ranges.
 * Example: `orderingProbabilities(model, { interval: 3, samples: 70 }, { draws: 2000, seed: 7 })`.
 */
export function orderingProbabilities(model: Model, design: StudyDesign & { interval: number }, options: UncertainOptions = {}): OrderingProbabilities {
  const draws = options.draws ?? 2000;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(draws) || draws < 1 || draws > 1e6) throw new Error(`the number of draws must be a whole number from 1 to 1,000,000, not ${draws}`);
  if (!Number.isInteger(seed)) throw new Error(`the seed must be a whole number, not ${seed}`);
  const k = model.settings?.separation ?? DEFAULT_SEPARATION;
  const rule: RoleRule = { k, interval: design.interval, window: design.window, samples: design.samples ?? model.settings?.samples ?? DEFAULT_SAMPLES };
  const uncertain: { id: VariableId; low: number; high: number; index: number }[] = [];
  model.variables.forEach((v, index) => {
    if (v.kind !== 'state' || v.timescale === undefined) return;
    const r = readTimescale(v.timescale, model.timeUnit);
    if (r.ok && r.uncertain) uncertain.push({ id: v.id, low: r.low, high: r.high, index });
  });
  uncertain.sort((a, b) => compareIds(a.id, b.id));
  const states: StateUncertainty[] = uncertain.map((u) => {
    // settled ⇔ τ ≤ Δ/k; frozen ⇔ τ ≥ k·W (or τ ≥ k·N·Δ).
    const settled = logUniformBelow(rule.interval / k, u.low, u.high);
    const frozenAt = rule.window !== undefined ? k * rule.window : k * rule.samples * rule.interval;
    const frozen = Math.max(0, 1 - logUniformBelow(frozenAt, u.low, u.high) - settled);
    const state = Math.max(0, 1 - settled - frozen);
    return { id: u.id, low: u.low, high: u.high, exact: { settled, state, frozen }, drawn: { settled: 0, state: 0, frozen: 0 }, decides: false };
  });

  const rand = seededUniform(seed);
  const groups = new Map<string, { count: number; taus: number[]; roles: Role[] }>();
  for (let d = 0; d < draws; d++) {
    const taus = uncertain.map((u) => (u.high > u.low ? u.low * Math.pow(u.high / u.low, rand()) : u.low));
    const roles = taus.map((t) => roleOf(t, rule));
    roles.forEach((r, i) => (states[i].drawn[r as 'settled'] += 1));
    const key = roles.join('|');
    const g = groups.get(key);
    if (g) g.count += 1;
    else groups.set(key, { count: 1, taus, roles });
  }
  for (const s of states) {
    for (const r of ['settled', 'state', 'frozen'] as const) s.drawn[r] /= draws;
    s.decides = [s.exact.settled, s.exact.state, s.exact.frozen].filter((p) => p > 0).length > 1;
  }
  const probabilities: OrderingShare[] = [...groups.values()]
    .map((g) => {
      // Order the model with this draw's timescales: the roles are the group's.
      const variables = model.variables.map((v, i) => {
        const at = uncertain.findIndex((u) => u.index === i);
        return at >= 0 ? { ...v, timescale: g.taus[at] } : v;
      });
      const o = orderingAt({ ...model, variables }, design);
      const deciding: Record<VariableId, Role> = {};
      uncertain.forEach((u, i) => { if (states[i].decides) deciding[u.id] = g.roles[i]; });
      return { roles: o.roles, blocks: o.blocks, share: g.count / draws, deciding };
    })
    .sort((a, b) => b.share - a.share || compareIds(JSON.stringify(a.deciding), JSON.stringify(b.deciding)));

  const pct = (x: number) => `${Math.round(x * 100)} %`;
  const at = formatDuration(rule.interval, model.timeUnit);
  const readings: string[] = [];
  const deciders = states.filter((s) => s.decides);
  if (uncertain.length === 0) readings.push('Every timescale is a single value: the ordering at this interval is certain.');
  else if (deciders.length === 0) readings.push(`At ${at} the ordering is the same wherever the uncertain timescales lie in their ranges.`);
  for (const s of deciders) {
    const range = `${formatDuration(s.low, model.timeUnit)}..${formatDuration(s.high, model.timeUnit)}`;
    if (s.exact.settled > 0 && s.exact.settled < 1 && s.exact.frozen === 0)
      readings.push(`Whether ${s.id} settles at ${at} depends on its timescale (${range}): settled in ${pct(s.drawn.settled)} of draws (${pct(s.exact.settled)} exactly).`);
    else if (s.exact.frozen > 0 && s.exact.settled === 0)
      readings.push(`Whether ${s.id} stays frozen over the study depends on its timescale (${range}): frozen in ${pct(s.drawn.frozen)} of draws (${pct(s.exact.frozen)} exactly).`);
    else readings.push(`${s.id}'s role at ${at} depends on its timescale (${range}): settled in ${pct(s.drawn.settled)}, dynamic in ${pct(s.drawn.state)}, frozen in ${pct(s.drawn.frozen)} of draws.`);
  }
  if (probabilities.length > 1) readings.push(`${probabilities.length} orderings are possible at ${at}; the most likely holds in ${pct(probabilities[0].share)} of ${draws} draws.`);
  return { interval: rule.interval, draws, seed, probabilities, states, readings };
}

export interface BreakpointRange {
  variable: VariableId;
  from: Role;
  to: Role;
  /** Where the change may happen (model time unit), and where it happens at the point value. */
  low: number;
  high: number;
  point: number;
}

/**
 * Where the breakpoints of uncertain timescales may lie: settling anywhere in
 * [k·low, k·high], thawing (with N samples) in [low/(kN), high/(kN)].
 * Example: `breakpointRanges(model, { samples: 50 })`.
 */
export function breakpointRanges(model: Model, axis: { window?: number; samples?: number } = {}): BreakpointRange[] {
  const k = model.settings?.separation ?? DEFAULT_SEPARATION;
  const samples = axis.samples ?? model.settings?.samples ?? DEFAULT_SAMPLES;
  const out: BreakpointRange[] = [];
  for (const v of model.variables) {
    if (v.kind !== 'state' || v.timescale === undefined) continue;
    const r = readTimescale(v.timescale, model.timeUnit);
    if (!r.ok || !r.uncertain) continue;
    if (axis.window === undefined) out.push({ variable: v.id, from: 'frozen', to: 'state', low: r.low / (k * samples), high: r.high / (k * samples), point: r.point / (k * samples) });
    if (axis.window === undefined || k * r.low <= axis.window) out.push({ variable: v.id, from: 'state', to: 'settled', low: k * r.low, high: k * r.high, point: k * r.point });
  }
  return out.sort((a, b) => a.low - b.low || compareIds(a.variable, b.variable));
}
