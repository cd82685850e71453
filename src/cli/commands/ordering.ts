import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { breakpoints, orderingAt } from '../../core/ordering/index';
import type { Diagnostic, Ordering, StudyDesign } from '../../core/ordering/types';
import { dynamicsDiagnostics } from '../../core/numeric/stability';
import { durationOption, loadModel } from '../load';
import { CliError, type CliArgs, type CliCommand } from './types';
import { designAxis, windowOf } from '../../core/study/convert';
import { uncertainOrdering, uncertainText } from './pictures';
import { labeller, significant } from '../../present/index';

/** Study design from --interval, --window, --samples and --hold; each one absent comes from the file's study (the length through the core). */
export function designFromArgs(args: CliArgs, model: Model): StudyDesign {
  const design: StudyDesign = {};
  const interval = durationOption(args, 'interval', model);
  if (interval !== undefined) design.interval = interval;
  const window = durationOption(args, 'window', model);
  if (window !== undefined) design.window = window;
  const samples = args.options.samples;
  if (samples !== undefined) {
    if (window !== undefined) throw new CliError('give either --window or --samples, not both', 2);
    const n = Number(samples);
    if (samples === true || !Number.isInteger(n) || n < 2) throw new CliError(`--samples must be a whole number of at least 2, not "${samples}"`, 2);
    design.samples = n;
  }
  const hold = args.options.hold;
  if (hold !== undefined) design.hold = parseHold(hold, model);
  else if (model.study?.holds && Object.keys(model.study.holds).length > 0) design.hold = { ...model.study.holds };
  return design;
}

/** `--hold x=3,y=0.5` → { x: 3, y: 0.5 }, checking that each variable exists. */
export function parseHold(text: string | true, model: Model): Record<string, number> {
  if (text === true) throw new CliError('--hold needs VARIABLE=VALUE, e.g. --hold stress=0', 2);
  const out: Record<string, number> = {};
  for (const part of text.split(',')) {
    const m = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(\S+)\s*$/.exec(part);
    if (!m) throw new CliError(`--hold: "${part}" is not VARIABLE=VALUE`, 2);
    if (!model.variables.some((v) => v.id === m[1])) throw new CliError(`--hold: the model has no variable "${m[1]}"`, 2);
    const value = Number(m[2]);
    if (!Number.isFinite(value)) throw new CliError(`--hold: "${m[2]}" is not a number (for ${m[1]})`, 2);
    out[m[1]] = value;
  }
  return out;
}

function describeDesign(model: Model, design: StudyDesign): string {
  if (design.interval === undefined) return 'the mechanism (every state dynamic)';
  const u = model.timeUnit;
  const window = windowOf(designAxis(model, design), design.interval);
  return `sampling every ${formatDuration(design.interval, u)}, over a study of ${formatDuration(window, u)}`;
}

/** Diagnostics as table lines: level, then the message. */
export function diagnosticLines(ds: Diagnostic[]): string[] {
  return ds.map((d) => `  ${d.level === 'error' ? 'error  ' : 'warning'}  ${d.message}`);
}

/** The closing section of a text report: a blank line, "diagnostics:" and their lines; nothing when there are none. */
export function diagnosticsSection(ds: Diagnostic[]): string[] {
  return ds.length > 0 ? ['', 'diagnostics:', ...diagnosticLines(ds)] : [];
}

/** Readable text for `order` without --json. */
export function orderingText(model: Model, design: StudyDesign, o: Ordering): string {
  const label = labeller(model);
  const lines = [`${model.name}: causal ordering at ${describeDesign(model, design)}`, '', 'blocks, in causal order:'];
  for (const b of o.blocks) {
    const vars = b.variables.map((v) => `${label(v)} [${o.roles[v]}]`).join(', ');
    const eqs = b.equations.length > 0 ? `  by ${b.equations.join(', ')}` : '  (given)';
    const tag = b.determination === 'well' ? '' : `  ${b.determination.toUpperCase()}-DETERMINED`;
    lines.push(`  level ${b.level}  ${b.variables.length > 1 ? `simultaneous: ${vars}` : vars}${eqs}${tag}`);
  }
  const within = o.edges.filter((e) => e.kind === 'instantaneous');
  const across = o.edges.filter((e) => e.kind === 'integrating');
  lines.push('', `within the instant (${within.length}):`);
  for (const e of within) lines.push(`  ${label(e.from)} ${e.simultaneous ? '<->' : '->'} ${label(e.to)}`);
  lines.push('', `across time, lagged (${across.length}):`);
  for (const e of across) lines.push(`  ${label(e.from)} => ${label(e.to)}`);
  return [...lines, ...diagnosticsSection(o.diagnostics)].join('\n');
}

const designOptions = { interval: true, window: true, samples: true, hold: true, json: false };

export const orderingCommands: CliCommand[] = [
  {
    name: 'check',
    summary: 'validate a model and list its diagnostics (exit 1 when it has errors)',
    usage: 'MODEL.json [--json]',
    options: { json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const o = orderingAt(model, {});
      if (!o.diagnostics.some((d) => d.level === 'error')) o.diagnostics = [...o.diagnostics, ...dynamicsDiagnostics(model)];
      const errors = o.diagnostics.filter((d) => d.level === 'error').length;
      if (args.options.json) io.out(JSON.stringify({ ok: errors === 0, diagnostics: o.diagnostics }, null, 2));
      else if (o.diagnostics.length === 0) io.out(`${model.name}: no problems found`);
      else io.out([`${model.name}: ${errors} error(s), ${o.diagnostics.length - errors} warning(s)`, ...diagnosticLines(o.diagnostics)].join('\n'));
      return errors > 0 ? 1 : 0;
    },
  },
  {
    name: 'order',
    summary: 'the causal ordering seen at a sampling interval',
    usage: 'MODEL.json [--interval D] [--window W | --samples N] [--hold x=v,...] [--uncertain [--draws K] [--seed S]] [--json]',
    options: { ...designOptions, uncertain: false, draws: true, seed: true },
    run(args, io) {
      const model = loadModel(args, io);
      const design = designFromArgs(args, model);
      const o = orderingAt(model, design);
      // Timescale ranges: the probability of each ordering (src/cli/commands/pictures.ts).
      const u = args.options.uncertain ? uncertainOrdering(args, model, design) : null;
      if (args.options.json) io.out(JSON.stringify(u ? { ...o, probabilities: u.probabilities.map(({ roles, blocks, share }) => ({ roles, blocks, share })), uncertainty: { draws: u.draws, seed: u.seed, states: u.states, readings: u.readings } } : o, null, 2));
      else io.out([orderingText(model, design, o), ...(u ? uncertainText(u) : [])].join('\n'));
      return 0;
    },
  },
  {
    name: 'breakpoints',
    summary: 'the sampling intervals at which the ordering changes',
    usage: 'MODEL.json [--window W | --samples N] [--json]',
    options: { window: true, samples: true, json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const design = designFromArgs(args, model);
      const bps = breakpoints(model, { window: design.window, samples: design.samples });
      if (args.options.json) {
        io.out(JSON.stringify({ timeUnit: model.timeUnit, breakpoints: bps }, null, 2));
        return 0;
      }
      if (bps.length === 0) {
        io.out(`${model.name}: the ordering is the same at every interval`);
        return 0;
      }
      const lines = [`${model.name}: the ordering changes at ${bps.length} interval(s)`];
      for (const b of bps) {
        lines.push(`  every ${formatDuration(b.interval, model.timeUnit)} (${significant(b.interval, 6)} ${model.timeUnit}):`);
        for (const c of b.changes) lines.push(`    ${c.reason}`);
      }
      io.out(lines.join('\n'));
      return 0;
    },
  },
];
