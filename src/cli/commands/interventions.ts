/**
 * Commands about interventions and reports: `commute` (does holding a
 * variable commute with the settling at this interval?), `adaptation`
 * (which variables perfectly adapt to which inputs) and `report` (the
 * self-contained HTML report of the interval axis).
 */
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import type { Ordering, StudyDesign } from '../../core/ordering/types';
import { commutationAt, confirmAdaptation, hasFormulas, interventionEffect, InterventionError, perfectAdaptation, type Commutation, type InterventionEffect } from '../../core/interventions/index';
import { buildReport } from '../../report/html';
import { bandsCsv, breakpointsCsv, trajectoriesCsv } from '../../report/tables';
import { durationOption, loadModel } from '../load';
import { CliError, type CliArgs, type CliCommand } from './types';
import { designAxis } from '../../core/study/convert';
import { formatNumber, labeller, significant } from '../../present/index';

/** `x=3,y=0.5` → { x: 3, y: 0.5 }, checking each variable and value. */
export function parseHoldOption(text: string | true | undefined, model: Model): Record<string, number> {
  if (text === undefined || text === true) throw new CliError('--hold needs VARIABLE=VALUE, e.g. --hold x=3', 2);
  const out: Record<string, number> = {};
  for (const part of text.split(',')) {
    const m = /^\s*([^=\s]+)\s*=\s*(\S*)\s*$/.exec(part);
    if (!m) throw new CliError(`--hold: "${part}" is not VARIABLE=VALUE`, 2);
    const [, id, raw] = m;
    if (!model.variables.some((v) => v.id === id)) throw new CliError(`--hold: the model has no variable "${id}" (variables: ${model.variables.map((v) => v.id).join(', ')})`, 2);
    const value = raw === '' ? NaN : Number(raw);
    if (!Number.isFinite(value)) throw new CliError(`--hold: "${raw}" is not a number (for ${id})`, 2);
    out[id] = value;
  }
  return out;
}

function studyOptions(args: CliArgs, model: Model): { window?: number; samples?: number } {
  const window = durationOption(args, 'window', model);
  const s = args.options.samples;
  if (s !== undefined && window !== undefined) throw new CliError('give either --window or --samples, not both', 2);
  if (s === undefined) return window !== undefined ? { window } : {};
  const n = Number(s);
  if (s === true || !Number.isInteger(n) || n < 2) throw new CliError(`--samples must be a whole number of at least 2, not "${String(s)}"`, 2);
  return { samples: n };
}

function orderingLines(model: Model, o: Ordering): string[] {
  const label = labeller(model);
  const lines: string[] = [];
  for (const b of o.blocks) {
    if (b.equations.length === 0) continue;
    const tag = b.determination === 'well' ? '' : `  ${b.determination.toUpperCase()}-DETERMINED`;
    lines.push(`    ${b.variables.map(label).join(', ') || '(no unknown)'}  by ${b.equations.join(', ')}${tag}`);
  }
  for (const e of o.edges) lines.push(`    ${label(e.from)} ${e.kind === 'integrating' ? '=>' : e.simultaneous ? '<->' : '->'} ${label(e.to)}`);
  return lines;
}

function effectLines(model: Model, effect: InterventionEffect): string[] {
  const label = labeller(model);
  const r = (x: number) => formatNumber(x, { digits: 4, ascii: true });
  const lines = ['', '  with the formulas (the running system, held):'];
  if (effect.equilibrium) {
    const moved = effect.equilibrium.filter((e) => Math.abs(e.change) > 1e-9 * (1 + Math.abs(e.before)));
    lines.push(moved.length ? '    equilibrium, without → with the hold:' : '    the equilibrium values do not change');
    for (const e of moved) lines.push(`      ${label(e.variable)}: ${r(e.before)} → ${r(e.after)} (${e.change > 0 ? '+' : ''}${r(e.change)})`);
  }
  for (const d of effect.drifting) lines.push(`    ${label(d.variable)} keeps moving at ${r(d.slope)} per ${model.timeUnit} at the end of the held run: no equilibrium`);
  for (const m of effect.messages) lines.push(`    ${m}`);
  return lines;
}

/** Readable text for `commute` without --json. */
export function commutationText(model: Model, design: StudyDesign, c: Commutation, effect?: InterventionEffect): string {
  const held = Object.entries(c.hold).map(([k, v]) => `${k} = ${v}`).join(', ');
  const at = design.interval !== undefined ? `sampling every ${formatDuration(design.interval, model.timeUnit)}` : 'the mechanism';
  const lines = [`${model.name}: holding ${held} at ${at}`, '', c.agree ? 'AGREE: hold then settle = settle then hold' : 'DIFFER: hold then settle ≠ settle then hold', ''];
  for (const l of c.explanation) lines.push(`  ${l}`);
  lines.push('', '  hold then settle (the running system, held):', ...orderingLines(model, c.holdThenSettle));
  lines.push('', '  settle then hold (the equilibrium model, held):', ...orderingLines(model, c.settleThenHold));
  if (c.differences.length > 0) {
    lines.push('', `  differences (${c.differences.length}):`);
    for (const d of c.differences) {
      const what = d.edge ? `${d.edge.from} ${d.edge.kind === 'integrating' ? '=>' : '->'} ${d.edge.to} (${d.edge.equation})` : d.equation ?? (d.variables ?? []).join(', ');
      lines.push(`    only in ${d.only === 'holdThenSettle' ? 'hold-then-settle' : 'settle-then-hold'}: ${d.kind} ${what}`);
    }
  }
  if (effect) lines.push(...effectLines(model, effect));
  return lines.join('\n');
}

function intervention<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof InterventionError) throw new CliError(e.message, 2);
    throw e;
  }
}

export const interventionCommands: CliCommand[] = [
  {
    name: 'commute',
    summary: 'does holding a variable commute with the settling at this interval?',
    usage: 'MODEL.json --hold x=v[,y=w] [--interval D [--window W | --samples N]] [--json] [--until T] [--trajectory runs.csv]',
    options: { hold: true, interval: true, window: true, samples: true, json: false, until: true, trajectory: true },
    run(args, io) {
      const model = loadModel(args, io);
      const hold = args.options.hold === undefined && model.study?.holds && Object.keys(model.study.holds).length > 0 ? { ...model.study.holds } : parseHoldOption(args.options.hold, model);
      const interval = durationOption(args, 'interval', model);
      if (interval === undefined) throw new CliError('name the sampling interval, e.g. --interval 1h', 2);
      if (!(interval > 0)) throw new CliError(`--interval must be positive, not ${interval}`, 2);
      const design: StudyDesign = { interval, ...studyOptions(args, model), hold };
      const c = intervention(() => commutationAt(model, design));
      // With formulas: the numbers of the running system held (equilibrium shift, states that keep moving).
      const until = durationOption(args, 'until', model);
      if (until !== undefined && !(until > 0)) throw new CliError(`--until must be positive, not ${until}`, 2);
      const numeric = hasFormulas(model) ? interventionEffect(model, hold, { until }) : undefined;
      const trajectoryPath = args.options.trajectory;
      if (trajectoryPath !== undefined) {
        if (trajectoryPath === true) throw new CliError('--trajectory needs a file name, e.g. --trajectory runs.csv', 2);
        if (!numeric) throw new CliError('--trajectory needs a model with formulas (rates and formulas to simulate)', 2);
        if (!numeric.trajectories) throw new CliError(`cannot write the runs: ${numeric.messages.join('; ')}`);
        try {
          io.writeFile(trajectoryPath, trajectoriesCsv(numeric.trajectories, model.variables.map((v) => v.id)));
        } catch (e) {
          throw new CliError(`cannot write ${trajectoryPath}: ${(e as Error).message}`);
        }
      }
      const effect = numeric ? { equilibrium: numeric.equilibrium, drifting: numeric.drifting, messages: numeric.messages } : undefined;
      if (args.options.json) io.out(JSON.stringify({ agree: c.agree, interval, hold: c.hold, holdThenSettle: c.holdThenSettle, settleThenHold: c.settleThenHold, differences: c.differences, ambiguous: c.ambiguous, drift: c.drift, explanation: c.explanation, ...(effect ? { effect } : {}) }, null, 2));
      else io.out(commutationText(model, design, c, numeric));
      return 0;
    },
  },
  {
    name: 'adaptation',
    summary: 'variables that return to the same equilibrium after a persistent change of an input',
    usage: 'MODEL.json [--json]',
    options: { json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const r = perfectAdaptation(model);
      // With formulas: each pair confirmed by a simulated step of the input, from rest.
      const checks = hasFormulas(model) ? r.adapted.map((a) => confirmAdaptation(model, a)) : null;
      if (args.options.json) {
        const adapted = checks ? checks.map((c) => ({ variable: c.variable, input: c.input, confirmed: c.confirmed, before: c.before, end: c.end, maxDeviation: c.maxDeviation, ...(c.message ? { message: c.message } : {}) })) : r.adapted;
        io.out(JSON.stringify({ adapted, unjudged: r.unjudged }, null, 2));
        return 0;
      }
      const label = labeller(model);
      const note = (i: number) => {
        if (!checks) return '';
        const c = checks[i];
        if (c.message) return ` (not confirmed by simulation: ${c.message})`;
        return c.confirmed ? ` (simulated step: moves by up to ${significant(c.maxDeviation, 3)}, returns to ${significant(c.before, 4)})` : ' (the simulated step did NOT confirm it)';
      };
      if (r.adapted.length === 0) io.out(`${model.name}: no variable perfectly adapts to an input`);
      else io.out([`${model.name}: perfect adaptation (the variable answers a lasting change of the input for a while, then returns):`, ...r.adapted.map((a, i) => `  ${label(a.variable)} adapts to ${label(a.input)}${note(i)}`)].join('\n'));
      if (r.unjudged.length) io.out(`  not judged (no well-determined equilibrium): ${r.unjudged.join(', ')}`);
      return 0;
    },
  },
  {
    name: 'report',
    summary: 'a self-contained, printable HTML report of the interval axis, band by band',
    usage: 'MODEL.json --out report.html [--window W | --samples N] [--hold x=v] [--no-figures] [--bands-csv bands.csv] [--breakpoints-csv breakpoints.csv] [--date YYYY-MM-DD]',
    options: { out: true, window: true, samples: true, hold: true, 'no-figures': false, 'bands-csv': true, 'breakpoints-csv': true, date: true },
    async run(args, io) {
      const model = loadModel(args, io);
      const out = args.options.out;
      if (out === undefined || out === true) throw new CliError('name the output file, e.g. --out report.html', 2);
      const hold = args.options.hold !== undefined ? parseHoldOption(args.options.hold, model) : model.study?.holds && Object.keys(model.study.holds).length > 0 ? { ...model.study.holds } : undefined;
      const study = studyOptions(args, model);
      const { layoutInNode } = await import('../../layout/node');
      const date = args.options.date;
      if (date === true || (date !== undefined && !/^\d{4}-\d{2}-\d{2}$/.test(date))) throw new CliError('--date must be a day as YYYY-MM-DD (it is printed under the title)', 2);
      const generated = `generated ${date ?? new Date().toISOString().slice(0, 10)}`;
      const html = await buildReport(model, { ...study, hold, generated, layout: args.options['no-figures'] ? undefined : (vm) => layoutInNode(vm) });
      const write = (path: string, text: string) => {
        try {
          io.writeFile(path, text);
        } catch (e) {
          throw new CliError(`cannot write ${path}: ${(e as Error).message}`);
        }
        io.err(`wrote ${path} (${new TextEncoder().encode(text).length} bytes)`);
      };
      write(out, html);
      const axis = designAxis(model, study);
      for (const [opt, table] of [['bands-csv', bandsCsv], ['breakpoints-csv', breakpointsCsv]] as const) {
        const path = args.options[opt];
        if (path === undefined) continue;
        if (path === true) throw new CliError(`--${opt} needs a file name`, 2);
        write(path, table(model, axis));
      }
      return 0;
    },
  },
];
