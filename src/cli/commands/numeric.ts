import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { sampledAt, simulate, solveEquilibrium, timescalesAt, toRows, type Mat } from '../../core/numeric/index';
import { laggedNetwork, sameIntervalNetwork, simulationChart } from '../../export/charts';
import { sampledOf } from '../../core/numeric/answers';
import { figureOptions, figureOptionsOf, svgTarget, tableWanted, writeSvg } from '../figure';
import { durationOption, loadModel } from '../load';
import { designFromArgs, diagnosticsSection } from './ordering';
import { CliError, type CliArgs, type CliCommand } from './types';
import { labelOf, simulationCsv, tableText } from '../../present/index';

/** Six significant digits, exponent form outside [0.001, 10⁶), ASCII: scripts read these tables. */
const num = tableText;

function matrixText(m: Mat, names: string[]): string[] {
  const rows = toRows(m);
  const w = Math.max(...names.map((n) => n.length), 4);
  const head = `  ${''.padEnd(w)}  ${names.map((n) => n.padStart(12)).join(' ')}`;
  return [head, ...rows.map((r, i) => `  ${names[i].padEnd(w)}  ${r.map((x) => num(x).padStart(12)).join(' ')}`)];
}



/** `--plot stress,mood`: the variables of the chart (default: the first three states, as the app shows). */
function plotOption(args: CliArgs, model: Model): string[] {
  const v = args.options.plot;
  if (v === undefined) {
    const states = model.variables.filter((x) => x.kind === 'state').map((x) => x.id).slice(0, 3);
    if (states.length === 0) throw new CliError('the model has no states: choose the variables to draw with --plot x,y', 2);
    return states;
  }
  if (v === true || v.trim() === '') throw new CliError('--plot needs variables, e.g. --plot stress,mood', 2);
  const ids = v.split(',').map((p) => p.trim());
  for (const id of ids) {
    const found = model.variables.find((x) => x.id === id);
    if (!found) throw new CliError(`--plot: the model has no variable "${id}" (variables: ${model.variables.map((x) => x.id).join(', ')})`, 2);
    if (found.kind === 'input') throw new CliError(`--plot: ${id} is an input (set from outside, not simulated); plot states or derived variables`, 2);
  }
  if (new Set(ids).size !== ids.length) throw new CliError('--plot names a variable twice', 2);
  return ids;
}

/** `--network lagged|same`: which network of the sampled model --svg draws (default lagged). */
function networkOption(args: CliArgs): 'lagged' | 'same' {
  const v = args.options.network ?? 'lagged';
  if (v !== 'lagged' && v !== 'same') throw new CliError(`--network must be lagged or same (the same-interval network), not "${v === true ? '' : v}"`, 2);
  if (v === 'same' && args.options.standardized) throw new CliError('--standardized applies to the lagged network only', 2);
  return v;
}

export const numericCommands: CliCommand[] = [
  {
    name: 'equilibrium',
    summary: 'solve for the equilibrium (every state settled), block by block in causal order',
    usage: 'MODEL.json [--json]',
    options: { json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const r = solveEquilibrium(model);
      if (args.options.json) io.out(JSON.stringify({ values: r.values, diagnostics: r.diagnostics }, null, 2));
      else {
        const lines = [`${model.name}: equilibrium${r.ok ? '' : ' (not found for every block)'}`, ''];
        for (const v of model.variables) lines.push(`  ${labelOf(model, v.id).padEnd(24)} ${num(r.values[v.id]).padStart(14)}   ${v.kind}`);
        io.out([...lines, ...diagnosticsSection(r.diagnostics)].join('\n'));
      }
      return r.ok ? 0 : 1;
    },
  },
  {
    name: 'simulate',
    summary: 'simulate the mechanism from the initial values with a stiff integrator; --out draws the chart the app exports (.svg, .png, .pdf)',
    usage: 'MODEL.json --until T [--every D] [--hold x=v,...] [--json | --csv] [--out FILE [--table] [--plot x,y,...] [--interval D [--window W | --samples N]] [--caption]]',
    options: { until: true, every: true, hold: true, json: false, csv: false, ...figureOptions, plot: true, interval: true, window: true, samples: true },
    async run(args, io) {
      const model = loadModel(args, io);
      const until = durationOption(args, 'until', model);
      if (until === undefined) throw new CliError('--until is required, e.g. --until 3days', 2);
      const every = durationOption(args, 'every', model);
      if (args.options.json && args.options.csv) throw new CliError('give either --json or --csv, not both', 2);
      const svg = svgTarget(args, ['plot', 'interval', 'window', 'samples']);
      if (svg === '-' && (args.options.json || args.options.csv)) throw new CliError('--svg - prints the SVG instead of the table: leave out --json and --csv, or write the SVG to a file', 2);
      const design = designFromArgs(args, model);
      if ((design.window !== undefined || design.samples !== undefined) && design.interval === undefined) throw new CliError('--window and --samples give the study length at a sampling interval: give --interval too', 2);
      const plot = svg === undefined ? [] : plotOption(args, model);
      const figure = svg === undefined ? undefined : figureOptionsOf(args, model, design);
      const r = simulate(model, { until, every, hold: design.hold });
      if (!r.ok && r.times.length === 0) throw new CliError(r.diagnostics.find((d) => d.level === 'error')?.message ?? 'the simulation failed');
      if (svg !== undefined) await writeSvg(svg, simulationChart(model, r, plot, design, figure), io, args);
      if (svg === '-' || (svg !== undefined && !tableWanted(args))) {
        if (!r.ok) io.err(`loopfold simulate: ${r.diagnostics.find((d) => d.level === 'error')?.message ?? 'the simulation stopped early'}; the chart shows the part computed`);
        return r.ok ? 0 : 1;
      }
      const ids = model.variables.map((v) => v.id);
      if (args.options.csv) {
        // the table the app saves: `time (unit)`, then one column per variable named by its label
        io.out(simulationCsv(r.times, r.series, model.variables.map((v) => ({ id: v.id, name: labelOf(model, v.id) })), model.timeUnit).replace(/\r\n$/, ''));
      } else if (args.options.json) io.out(JSON.stringify({ times: r.times, series: r.series }));
      else {
        const lines = [`${model.name}: simulation to ${formatDuration(until, model.timeUnit)} (times in ${model.timeUnit})`, ''];
        const w = 12;
        lines.push(`  ${'time'.padStart(w)} ${ids.map((id) => id.padStart(w)).join(' ')}`);
        const step = Math.max(1, Math.ceil(r.times.length / 25));
        for (let k = 0; k < r.times.length; k += step) lines.push(`  ${num(r.times[k]).padStart(w)} ${ids.map((id) => num(r.series[id][k]).padStart(w)).join(' ')}`);
        if (step > 1) lines.push(`  (every ${step}th of ${r.times.length} rows; use --csv or --json for all)`);
        io.out([...lines, ...diagnosticsSection(r.diagnostics)].join('\n'));
      }
      return r.ok ? 0 : 1;
    },
  },
  {
    name: 'sampled',
    summary: 'the exact sampled model at an interval: lagged effects, innovations, stationary covariance; --out draws a network (.svg, .png, .pdf)',
    usage: 'MODEL.json [--interval D] [--json] [--out FILE [--table] [--network lagged|same] [--standardized] [--window W | --samples N] [--caption]]',
    options: { interval: true, json: false, ...figureOptions, network: true, standardized: false, window: true, samples: true },
    async run(args, io) {
      const model = loadModel(args, io);
      const interval = durationOption(args, 'interval', model);
      if (interval === undefined) throw new CliError('--interval is required, e.g. --interval 1day', 2);
      const svg = svgTarget(args, ['network', 'standardized', 'window', 'samples']);
      if (svg === '-' && args.options.json) throw new CliError('--svg - prints the SVG instead of the matrices: leave out --json, or write the SVG to a file', 2);
      const network = networkOption(args);
      const design = designFromArgs(args, model);
      const r = sampledAt(model, interval);
      if (!r.ok) throw new CliError(r.reason);
      if (svg !== undefined) {
        const opts = figureOptionsOf(args, model, design);
        // The same plain data the app's numeric worker answers with.
        const answer = sampledOf(model, interval);
        if (!answer.ok) throw new CliError(answer.reason);
        const fig = network === 'same' ? sameIntervalNetwork(model, answer, opts) : laggedNetwork(model, answer, args.options.standardized === true, opts);
        if (!fig) {
          throw new CliError(network === 'same'
            ? 'the same-interval network is not defined here: some states receive no noise'
            : 'the standardized lagged network is not defined here: some states have no stationary spread (zero noise reaches them); leave out --standardized');
        }
        await writeSvg(svg, fig, io, args);
        if (svg === '-' || !tableWanted(args)) return 0;
      }
      const s = r.sampled;
      if (args.options.json) {
        io.out(
          JSON.stringify(
            {
              states: s.states,
              interval: s.interval,
              drift: toRows(s.drift),
              phi: toRows(s.phi),
              innovation: toRows(s.innovation),
              stationary: s.stationary ? toRows(s.stationary) : null,
              phiStandardized: s.phiStandardized ? toRows(s.phiStandardized) : null,
              innovationPartialCorrelation: s.innovationPartial ? toRows(s.innovationPartial) : null,
              aliasing: s.aliasing,
              warnings: r.warnings,
            },
            null,
            2,
          ),
        );
      } else {
        const lines = [`${model.name}: exact sampled model, sampling every ${formatDuration(interval, model.timeUnit)}`, ''];
        lines.push('lagged effects Φ (row: effect on, column: from, one interval later):', ...matrixText(s.phi, s.states));
        if (s.phiStandardized) lines.push('', 'standardized lagged effects:', ...matrixText(s.phiStandardized, s.states));
        lines.push('', 'innovation covariance Q over one interval:', ...matrixText(s.innovation, s.states));
        if (s.innovationPartial) lines.push('', 'same-interval network (partial correlations of the innovations):', ...matrixText(s.innovationPartial, s.states));
        if (s.stationary) lines.push('', 'stationary covariance Σ:', ...matrixText(s.stationary, s.states));
        if (r.warnings.length > 0) lines.push('', 'warnings:', ...r.warnings.map((w) => `  ${w}`));
        io.out(lines.join('\n'));
      }
      return 0;
    },
  },
  {
    name: 'timescales',
    summary: 'eigenvalues at equilibrium and each state\'s timescale, given and derived',
    usage: 'MODEL.json [--interval D] [--json]',
    options: { interval: true, json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const interval = durationOption(args, 'interval', model);
      const r = timescalesAt(model, interval);
      if (!r.ok) throw new CliError(r.reason);
      const t = r.report;
      if (args.options.json) {
        io.out(
          JSON.stringify(
            {
              states: t.states,
              eigenvalues: t.modes.map((m) => ({ re: m.re, im: m.im, time: Number.isFinite(m.time) ? m.time : null, ...(m.period !== undefined ? { period: m.period } : {}), stable: m.stable, participation: m.participation })),
              timescales: t.perState.map((p) => ({ state: p.state, given: p.given ?? null, derived: Number.isFinite(p.derived) ? p.derived : null, share: p.share })),
              ...(interval !== undefined ? { interval, settled: r.settled } : {}),
              warnings: r.warnings,
            },
            null,
            2,
          ),
        );
      } else {
        const u = model.timeUnit;
        const dur = (x: number) => (Number.isFinite(x) ? formatDuration(x, u) : 'never settles');
        const lines = [`${model.name}: timescales at equilibrium`, '', 'modes (eigenvalues of the drift, per ' + u + '):'];
        for (const m of t.modes) lines.push(`  ${num(m.re)}${m.im !== 0 ? ` ${m.im > 0 ? '+' : '-'} ${num(Math.abs(m.im))}i` : ''}   time ${dur(m.time)}${m.period !== undefined ? `, period ${dur(m.period)}` : ''}${m.stable ? '' : '   UNSTABLE'}`);
        lines.push('', 'per state (derived = the mode it takes most part in, by participation factors):');
        for (const p of t.perState)
          lines.push(`  ${labelOf(model, p.state).padEnd(24)} given ${p.given !== undefined ? dur(p.given) : '—'}   derived ${dur(p.derived)} (share ${Math.round(p.share * 100)}%)`);
        if (r.warnings.length > 0) lines.push('', 'warnings:', ...r.warnings.map((w) => `  ${w}`));
        io.out(lines.join('\n'));
      }
      return 0;
    },
  },
];
