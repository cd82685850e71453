import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { sampledAt, simulate, solveEquilibrium, timescalesAt, toRows, type Mat } from '../../core/numeric/index';
import type { Diagnostic } from '../../core/ordering/types';
import { durationOption, loadModel } from '../load';
import { CliError, type CliCommand } from './types';

function num(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  return Math.abs(x) >= 1e-3 && Math.abs(x) < 1e6 ? String(Number(x.toPrecision(6))) : x.toExponential(4);
}

function diagnosticLines(ds: Diagnostic[]): string[] {
  return ds.map((d) => `  ${d.level === 'error' ? 'error  ' : 'warning'}  ${d.message}`);
}

function matrixText(m: Mat, names: string[]): string[] {
  const rows = toRows(m);
  const w = Math.max(...names.map((n) => n.length), 4);
  const head = `  ${''.padEnd(w)}  ${names.map((n) => n.padStart(12)).join(' ')}`;
  return [head, ...rows.map((r, i) => `  ${names[i].padEnd(w)}  ${r.map((x) => num(x).padStart(12)).join(' ')}`)];
}

/** RFC 4180: quote a field that holds a comma, a quote or a line break. */
function csvField(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function label(model: Model, id: string): string {
  return model.variables.find((v) => v.id === id)?.label ?? id;
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
        for (const v of model.variables) lines.push(`  ${label(model, v.id).padEnd(24)} ${num(r.values[v.id]).padStart(14)}   ${v.kind}`);
        if (r.diagnostics.length > 0) lines.push('', 'diagnostics:', ...diagnosticLines(r.diagnostics));
        io.out(lines.join('\n'));
      }
      return r.ok ? 0 : 1;
    },
  },
  {
    name: 'simulate',
    summary: 'simulate the mechanism from the initial values with a stiff integrator',
    usage: 'MODEL.json --until T [--every D] [--json | --csv]',
    options: { until: true, every: true, json: false, csv: false },
    run(args, io) {
      const model = loadModel(args, io);
      const until = durationOption(args, 'until', model);
      if (until === undefined) throw new CliError('--until is required, e.g. --until 3days', 2);
      const every = durationOption(args, 'every', model);
      if (args.options.json && args.options.csv) throw new CliError('give either --json or --csv, not both', 2);
      const r = simulate(model, { until, every });
      if (!r.ok && r.times.length === 0) throw new CliError(r.diagnostics.find((d) => d.level === 'error')?.message ?? 'the simulation failed');
      const ids = model.variables.map((v) => v.id);
      if (args.options.csv) {
        const lines = [['time', ...ids].map(csvField).join(',')];
        r.times.forEach((t, k) => lines.push([t, ...ids.map((id) => r.series[id][k])].map((x) => String(x)).join(',')));
        io.out(lines.join('\r\n'));
      } else if (args.options.json) io.out(JSON.stringify({ times: r.times, series: r.series }));
      else {
        const lines = [`${model.name}: simulation to ${formatDuration(until, model.timeUnit)} (times in ${model.timeUnit})`, ''];
        const w = 12;
        lines.push(`  ${'time'.padStart(w)} ${ids.map((id) => id.padStart(w)).join(' ')}`);
        const step = Math.max(1, Math.ceil(r.times.length / 25));
        for (let k = 0; k < r.times.length; k += step) lines.push(`  ${num(r.times[k]).padStart(w)} ${ids.map((id) => num(r.series[id][k]).padStart(w)).join(' ')}`);
        if (step > 1) lines.push(`  (every ${step}th of ${r.times.length} rows; use --csv or --json for all)`);
        if (r.diagnostics.length > 0) lines.push('', 'diagnostics:', ...diagnosticLines(r.diagnostics));
        io.out(lines.join('\n'));
      }
      return r.ok ? 0 : 1;
    },
  },
  {
    name: 'sampled',
    summary: 'the exact sampled model at an interval: lagged effects, innovations, stationary covariance',
    usage: 'MODEL.json --interval D [--json]',
    options: { interval: true, json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const interval = durationOption(args, 'interval', model);
      if (interval === undefined) throw new CliError('--interval is required, e.g. --interval 1day', 2);
      const r = sampledAt(model, interval);
      if (!r.ok) throw new CliError(r.reason);
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
          lines.push(`  ${label(model, p.state).padEnd(24)} given ${p.given !== undefined ? dur(p.given) : '—'}   derived ${dur(p.derived)} (share ${Math.round(p.share * 100)}%)`);
        if (r.warnings.length > 0) lines.push('', 'warnings:', ...r.warnings.map((w) => `  ${w}`));
        io.out(lines.join('\n'));
      }
      return 0;
    },
  },
];
