/**
 * Checks that read the linearized dynamics: a growing mode (an eigenvalue of
 * the drift with positive real part) makes the model unstable, so settling,
 * rest points and timescales are not valid while it grows (Lyapunov's
 * indirect method; Khalil, Nonlinear Systems, 3rd ed., 2002, Thm. 4.7); and
 * a state whose dynamics respond on a very different timescale from the one
 * typed for it is named, with the link that makes the difference.
 */
import type { Diagnostic } from '../ordering/types';
import type { Link, Model, VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { linkCounts, linkStrengths, signedStrength } from '../model/strength';
import type { Mat } from './dense';
import { timescalesOf, type Mode, type TimescaleReport } from './timescales';
import { driftAtEquilibrium } from './index';
import { significant } from '../../present/numbers';
import { labeller } from '../../present/labels';

export interface GrowingMode {
  /** Re λ > 0, per model time unit. */
  rate: number;
  /** |Im λ| (0 when the mode does not oscillate). */
  im: number;
  /** ln 2 / rate, in model time units. */
  doubling: number;
  /** States carrying the mode, largest share first (shares of at least 5 %). */
  carriers: { state: VariableId; share: number }[];
}

/** Real parts above this share of the largest |λ| count as growing (rounding of a neutral mode stays below). */
const GROWTH_TOLERANCE = 1e-9;

/**
 * The growing modes of drift A over `states` (a complex pair counted once).
 * Example: `growingModes(fromRows([[0.1, 0], [0, -1]]), ['a', 'b'])` → one mode, rate 0.1, carried by a.
 */
export function growingModes(a: Mat, states: VariableId[], report?: TimescaleReport): GrowingMode[] {
  const r = report ?? timescalesOf(a, states);
  const scale = Math.max(1e-300, ...r.modes.map((m) => Math.hypot(m.re, m.im)));
  const out: GrowingMode[] = [];
  for (const m of r.modes) {
    if (!(m.re > GROWTH_TOLERANCE * scale) || m.im < 0) continue;
    const carriers = states
      .map((state, k) => ({ state, share: m.participation[k] }))
      .filter((c) => c.share >= 0.05)
      .sort((x, y) => y.share - x.share || (x.state < y.state ? -1 : 1));
    out.push({ rate: m.re, im: Math.abs(m.im), doubling: Math.LN2 / m.re, carriers });
  }
  return out.sort((x, y) => y.rate - x.rate);
}

function fmt(x: number): string {
  return String(significant(x, 3));
}

/** A loop of the sketch and the product of its strengths. */
export interface Loop {
  nodes: VariableId[];
  gain: number;
}

/**
 * Simple loops of the sketch through any of `through` (links that enter their
 * target's equation only), with their gain: the product of sign × strength.
 * Bounded search (loops of at most `maxLength` variables, `maxLoops` loops).
 */
export function loopsThrough(model: Model, through: readonly VariableId[], maxLength = 10, maxLoops = 200): Loop[] {
  const strengths = linkStrengths(model);
  const kinds = new Map(model.variables.map((v) => [v.id, v.kind]));
  const sketched = new Set(model.variables.filter((v) => (v.kind === 'state' ? v.rate === undefined : v.kind === 'derived' && v.formula === undefined)).map((v) => v.id));
  const out = new Map<VariableId, { to: VariableId; coef: number }[]>();
  model.links.forEach((l, k) => {
    if (!linkCounts(model, l, kinds) || !sketched.has(l.to)) return;
    const list = out.get(l.from) ?? [];
    list.push({ to: l.to, coef: signedStrength(l, strengths[k]) });
    out.set(l.from, list);
  });
  const order = new Map(model.variables.map((v, i) => [v.id, i]));
  const loops: Loop[] = [];
  const starts = [...new Set(through)].sort((x, y) => (order.get(x) ?? 0) - (order.get(y) ?? 0));
  let steps = 0;
  for (const s of starts) {
    const s0 = order.get(s) ?? 0;
    const path: VariableId[] = [s];
    const onPath = new Set([s]);
    const walk = (v: VariableId, gain: number): void => {
      for (const e of out.get(v) ?? []) {
        if (loops.length >= maxLoops || ++steps > 20000) return;
        if (e.to === s) { loops.push({ nodes: [...path], gain: gain * e.coef }); continue; }
        // Each loop is found once: from its earliest variable among the starts.
        if (onPath.has(e.to) || path.length >= maxLength || (starts.includes(e.to) && (order.get(e.to) ?? 0) < s0)) continue;
        path.push(e.to); onPath.add(e.to);
        walk(e.to, gain * e.coef);
        path.pop(); onPath.delete(e.to);
      }
    };
    walk(s, 1);
  }
  return loops;
}


function list(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** The warning for one growing mode: its rate, the states that carry it and what usually fixes it. */
/** Whether a state's own rate pulls it back: a sketch unless marked not self-regulating; a rate formula that reads the state. */
function selfRegulated(model: Model, state: VariableId): boolean {
  const v = model.variables.find((x) => x.id === state);
  if (!v) return true;
  if (v.rate === undefined) return v.selfRegulating !== false;
  return new RegExp(`(^|[^A-Za-z0-9_])${state.replace(/[^A-Za-z0-9_]/g, '')}($|[^A-Za-z0-9_])`).test(v.rate);
}

export function growingModeMessage(model: Model, mode: GrowingMode): string {
  const label = labeller(model);
  const u = model.timeUnit;
  const carriers = mode.carriers.map((c) => `${label(c.state)} (${Math.round(c.share * 100)} %)`);
  const osc = mode.im > 0 ? `, swinging with a period of ${formatDuration((2 * Math.PI) / mode.im, u)}` : '';
  const head =
    `The model is unstable: a growing mode (rate +${fmt(mode.rate)} per ${u}: it doubles every ${formatDuration(mode.doubling, u)}${osc}) ` +
    `is carried by ${list(carriers)}. These states move away from their balance instead of settling, so settling, the rest point and the timescales are not valid while it grows.`;
  const fixes: string[] = [];
  const unregulated = mode.carriers.filter((c) => !selfRegulated(model, c.state)).map((c) => label(c.state));
  if (unregulated.length > 0)
    fixes.push(`${list(unregulated)} ${unregulated.length > 1 ? 'have' : 'has'} no self-regulation (nothing pulls ${unregulated.length > 1 ? 'them' : 'it'} back toward balance): make ${unregulated.length > 1 ? 'them' : 'it'} self-regulating or add a damping link`);
  const loops = loopsThrough(model, mode.carriers.map((c) => c.state)).filter((l) => l.gain >= 1 - 1e-12).sort((x, y) => y.gain - x.gain);
  if (loops.length > 0) {
    const l = loops[0];
    fixes.push(`the loop ${[...l.nodes, l.nodes[0]].map(label).join(' → ')} has a gain of ${fmt(l.gain)} (the product of its strengths and signs), one or more, so it sustains or amplifies itself: weaken one of its links or make one negative`);
  } else if (unregulated.length === 0)
    fixes.push(`the loops through ${list(mode.carriers.map((c) => label(c.state)))} together amplify more than the states damp: a loop gain above one; weaken the positive links among them`);
  return `${head} What usually fixes it: ${fixes.join('; ')}.`;
}

/** Typed and derived timescales further apart than this factor are named. */
export const TIMESCALE_MISMATCH_FACTOR = 4;

function stateTimescaleAfter(model: Model, state: VariableId): number | null {
  const d = driftAtEquilibrium(model);
  if (!d.ok) return null;
  const r = timescalesOf(d.drift, d.states, d.equilibrium.system.timescales);
  const s = r.perState.find((p) => p.state === state);
  return s && r.modes[s.mode].stable ? s.derived : null;
}

/**
 * States whose linearized dynamics respond on a timescale more than
 * TIMESCALE_MISMATCH_FACTOR away from the one typed, each with the link whose
 * removal brings the response closest to the typed timescale.
 */
export function timescaleMismatches(model: Model, report: TimescaleReport, maxProbes = 40): { state: VariableId; typed: number; derived: number; link?: Link }[] {
  const out: { state: VariableId; typed: number; derived: number; link?: Link }[] = [];
  let probes = 0;
  const all = linkStrengths(model);
  const strengths = new Map(model.links.map((l, k) => [l, all[k].value]));
  for (const p of report.perState) {
    if (p.given === undefined || !report.modes[p.mode].stable) continue;
    const ratio = p.derived / p.given;
    if (ratio <= TIMESCALE_MISMATCH_FACTOR && ratio >= 1 / TIMESCALE_MISMATCH_FACTOR) continue;
    const miss = Math.abs(Math.log(ratio));
    let best: { link: Link; miss: number } | undefined;
    // Links that carry a sketched equation and touch the state; removing one at a time shows which one moves it.
    const byId = new Map(model.variables.map((x) => [x.id, x]));
    const sketched = (id: VariableId) => { const x = byId.get(id); return x !== undefined && x.rate === undefined && x.formula === undefined; };
    // Links into the state first (they write its equation), strongest first; a later link must do clearly better.
    const candidates = model.links
      .filter((l) => (l.to === p.state || l.from === p.state) && linkCounts(model, l) && sketched(l.to))
      .sort((x, y) => Number(y.to === p.state) - Number(x.to === p.state) || Math.abs(strengths.get(y)!) - Math.abs(strengths.get(x)!));
    for (const l of candidates) {
      if (probes++ >= maxProbes) break;
      const without = { ...model, links: model.links.filter((x) => x !== l) };
      const t = stateTimescaleAfter(without, p.state);
      if (t === null) continue;
      const m = Math.abs(Math.log(t / p.given));
      if (m < miss * 0.75 && (!best || m < best.miss - 0.1)) best = { link: l, miss: m };
    }
    out.push({ state: p.state, typed: p.given, derived: p.derived, ...(best ? { link: best.link } : {}) });
  }
  return out;
}

/** The checks of this module as diagnostics of the model (empty when it cannot be linearized). */
export function dynamicsDiagnostics(model: Model): Diagnostic[] {
  try {
    return dynamicsChecks(model);
  } catch {
    return []; // a model the numerics cannot read is reported by the checks that read it
  }
}

function dynamicsChecks(model: Model): Diagnostic[] {
  const d = driftAtEquilibrium(model);
  if (!d.ok || d.states.length === 0) return [];
  const report = timescalesOf(d.drift, d.states, d.equilibrium.system.timescales);
  const out: Diagnostic[] = [];
  for (const m of growingModes(d.drift, d.states, report))
    out.push({ level: 'warning', code: 'growing-mode', message: growingModeMessage(model, m), variables: m.carriers.map((c) => c.state), equations: [] });
  const label = labeller(model);
  const u = model.timeUnit;
  for (const x of timescaleMismatches(model, report)) {
    const faster = x.derived < x.typed;
    const link = x.link ? ` The link ${label(x.link.from)} → ${label(x.link.to)} makes the difference: without it ${label(x.state)} responds close to the typed timescale.` : '';
    out.push({
      level: 'warning',
      code: 'timescale-mismatch',
      message: `${label(x.state)} responds on a timescale of ${formatDuration(x.derived, u)}, not the ${formatDuration(x.typed, u)} typed for it: its links make it ${faster ? 'faster' : 'slower'}.${link} The ordering uses the typed timescale; check the strengths or type the timescale you mean.`,
      variables: x.link ? [...new Set([x.state, x.link.from, x.link.to])] : [x.state],
      equations: [],
    });
  }
  return out;
}

export type { Mode };
