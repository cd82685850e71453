/**
 * The explanation panel's text: what the ordering at an interval changes
 * with respect to the mechanism as drawn, and why, in words a modeller reads.
 */
import { DEFAULT_SEPARATION, type Model, type VariableId } from '../model/types';
import { formatDuration } from '../model/units';
import { readTimescale } from '../model/timescale';
import { labeller } from '../../present/labels';
import type { Breakpoint, Ordering, Role, StudyDesign } from './contract';
import { simultaneousBlocks } from './derive';
import { designAxis, windowOf } from '../study/convert';

export type ExplanationTopic = 'summary' | 'settled' | 'frozen' | 'held' | 'block' | 'dynamic' | 'diagnostic' | 'nearby';

export interface ExplanationLine {
  topic: ExplanationTopic;
  text: string;
  variables: VariableId[];
}

/** A state's timescale in the model unit (a range's geometric mean), or undefined when it has none (or it is not readable). */
export function timescaleOf(model: Model, id: VariableId): number | undefined {
  const v = model.variables.find((x) => x.id === id);
  if (v?.timescale === undefined) return undefined;
  const d = readTimescale(v.timescale, model.timeUnit);
  return d.ok ? d.point : undefined;
}

/** "A", "A and B", "A, B and C". */
export function listWords(words: readonly string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** The study length in the model unit for a design: the window, or samples × interval. */
export function studyLength(model: Model, design: StudyDesign): number | undefined {
  if (design.interval === undefined) return design.window;
  return windowOf(designAxis(model, design), design.interval);
}

const ROLE_WORD: Record<Role, string> = {
  input: 'is set from outside', state: 'becomes dynamic', derived: 'follows within the instant',
  settled: 'settles', frozen: 'becomes frozen', held: 'is held',
};

/** "1 sample", "50 samples". */
function count(n: number): string {
  return `${n} ${n === 1 ? 'sample' : 'samples'}`;
}

const ROLE_VERB: Record<Role, string> = {
  input: 'be set from outside', state: 'carry over from sample to sample', derived: 'follow within the instant',
  settled: 'settle', frozen: 'be frozen', held: 'be held',
};

/**
 * Sentences for the explanation panel, most important first.
 * `explainOrdering(model, ordering, { interval: 4 })[0].text` → "Every 4 h, over a study of 50 samples (8.33 days): …".
 */
export function explainOrdering(model: Model, ordering: Ordering, design: StudyDesign, breakpoints: readonly Breakpoint[] = []): ExplanationLine[] {
  const u = model.timeUnit;
  const k = model.settings?.separation ?? DEFAULT_SEPARATION;
  const byId = new Map(model.variables.map((v) => [v.id, v]));
  const name = labeller(model);
  const names = (ids: readonly VariableId[]) => listWords(ids.map(name));
  const role = (id: VariableId): Role => ordering.roles[id] ?? byId.get(id)?.kind ?? 'derived';
  const W = studyLength(model, design);
  const lines: ExplanationLine[] = [];
  const states = model.variables.filter((v) => v.kind === 'state').map((v) => v.id);
  const settled = states.filter((s) => role(s) === 'settled');
  const frozen = states.filter((s) => role(s) === 'frozen');
  const dynamic = states.filter((s) => role(s) === 'state');
  const held = model.variables.map((v) => v.id).filter((v) => role(v) === 'held');
  const blocks = simultaneousBlocks(ordering);

  if (design.interval !== undefined) {
    const axis = designAxis(model, design);
    const study = axis.window !== undefined
      ? `a study of ${formatDuration(axis.window, u)} (${count(Math.max(1, Math.round(axis.window / design.interval)))})`
      : `a study of ${count(axis.samples)} (${formatDuration(W!, u)})`;
    const parts: string[] = [];
    if (settled.length) parts.push(`${settled.length} ${settled.length === 1 ? 'state settles' : 'states settle'}`);
    if (frozen.length) parts.push(`${frozen.length} ${frozen.length === 1 ? 'is' : 'are'} frozen`);
    if (dynamic.length) parts.push(`${dynamic.length} ${dynamic.length === 1 ? 'stays' : 'stay'} dynamic`);
    if (held.length) parts.push(`${held.length} held by intervention`);
    const changed = settled.length + frozen.length + held.length > 0;
    lines.push({
      topic: 'summary',
      text: changed
        ? `Every ${formatDuration(design.interval, u)}, over ${study}: of ${states.length} states, ${listWords(parts)}.`
        : `Every ${formatDuration(design.interval, u)}, over ${study}, the ordering keeps the mechanism as drawn: every state moves over time.`,
      variables: [],
    });
  }

  for (const s of settled) {
    const tau = timescaleOf(model, s);
    const why = tau !== undefined && design.interval !== undefined
      ? ` (timescale ${formatDuration(tau, u)} ≤ interval/${k} = ${formatDuration(design.interval / k, u)})`
      : ' (fast against the interval)';
    const sources = [...new Set(ordering.edges.filter((e) => e.to === s && e.from !== s).map((e) => e.from))];
    const from = sources.length ? ` from ${names(sources)}` : '';
    lines.push({ topic: 'settled', text: `${name(s)} settles${why}: it reaches balance between samples, so its rate equation now fixes ${name(s)} within each instant${from}, with no lag.`, variables: [s] });
  }
  for (const s of frozen) {
    const tau = timescaleOf(model, s);
    const why = tau !== undefined && W !== undefined ? ` (timescale ${formatDuration(tau, u)} ≥ ${k} × study = ${formatDuration(k * W, u)})` : ' (slow against the study)';
    const study = W !== undefined ? `the ${formatDuration(W, u)} of the study` : 'the study';
    lines.push({ topic: 'frozen', text: `${name(s)} is frozen, held constant over ${study}${why}: it changes too little to see, so it acts as a fixed background and the links into it drop out.`, variables: [s] });
  }
  for (const v of held) {
    const val = design.hold?.[v];
    lines.push({ topic: 'held', text: `${name(v)} is held${val !== undefined ? ` at ${val}` : ''} by an intervention: the links into it are cut.`, variables: [v] });
  }
  for (const b of blocks) {
    const feedback = b.variables.some((v) => byId.get(v)?.kind === 'state');
    lines.push({
      topic: 'block',
      text: `${names(b.variables)} form one simultaneous block: they are determined together${b.equations.length ? ` by ${listWords(b.equations)}` : ''}, so within the instant none of them comes first${feedback ? ' (a feedback loop that closes faster than the interval)' : ''}.`,
      variables: [...b.variables],
    });
  }
  if (dynamic.length && design.interval !== undefined) {
    lines.push({ topic: 'dynamic', text: `${names(dynamic)} ${dynamic.length === 1 ? 'stays' : 'stay'} dynamic: ${dynamic.length === 1 ? 'it carries' : 'they carry'} over from one sample to the next, and the links into ${dynamic.length === 1 ? 'it' : 'them'} act with a lag of one interval.`, variables: dynamic });
  }
  for (const d of ordering.diagnostics) lines.push({ topic: 'diagnostic', text: `${d.level === 'error' ? 'Problem' : 'Note'}: ${d.message}`, variables: [...d.variables] });

  if (design.interval !== undefined && breakpoints.length) {
    const sorted = [...breakpoints].sort((a, b) => a.interval - b.interval);
    // an exclusive breakpoint's new role holds only above it
    const passed = (b: Breakpoint) => (b.exclusive ? design.interval! > b.interval : design.interval! >= b.interval);
    const above = sorted.find((b) => !passed(b));
    const below = [...sorted].reverse().find(passed);
    if (below) {
      // A held variable keeps its hold on both sides of a breakpoint: the change is what it would do unheld.
      const undo = below.changes.map((c) => (role(c.variable) === 'held' ? `${name(c.variable)} stays held (unheld it would ${ROLE_VERB[c.from]})` : `${name(c.variable)} ${ROLE_WORD[c.from]}`));
      lines.push({ topic: 'nearby', text: `Below ${formatDuration(below.interval, u)}: ${listWords(undo)}.`, variables: below.changes.map((c) => c.variable) });
    }
    if (above) {
      const next = above.changes.map((c) => (role(c.variable) === 'held' ? `${name(c.variable)} stays held (unheld it would ${ROLE_VERB[c.to]})` : `${name(c.variable)} ${ROLE_WORD[c.to]}`));
      lines.push({ topic: 'nearby', text: `${above.exclusive ? 'Above' : 'From'} ${formatDuration(above.interval, u)}${above.exclusive ? '' : ' on'}: ${listWords(next)}.`, variables: above.changes.map((c) => c.variable) });
    }
  }
  return lines;
}
