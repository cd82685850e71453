/** Commands `data` (what the importer keeps and refuses) and `fit` (VAR or continuous-time fit, held against the sketch). */
import type { Model, TimeUnit } from '../../core/model/types';
import { isTimeUnit } from '../../core/model/units';
import { importText, readHeader, type ColumnMapping, type ImportResult } from '../../core/data/import';
import { suggestMapping } from '../../core/data/importMapping';
import { fitVar } from '../../core/fit/var';
import { ctSpec, ctStartFrom, fitCt } from '../../core/fit/ct';
import { compareDrift, compareLagged, likelihoodRatio, medianInterval, sketchFreePattern, sketchStates } from '../../core/fit/compare';
import { fittedOrdering, type FittedOrdering } from '../../core/fit/fittedOrdering';
import { medianSpan } from '../../core/fit/roles';
import { loadModel, readInput } from '../load';
import { CliError, type CliArgs, type CliCommand, type CliIO } from './types';
import { significant } from '../../present/index';

const IMPORT_OPTIONS = { waves: true, format: true, person: true, time: true, 'time-unit': true, day: true, prompt: true, map: true, missing: true, delimiter: true, json: false } as const;

function str(args: CliArgs, name: string): string | undefined {
  const v = args.options[name];
  if (v === undefined) return undefined;
  if (v === true || v.trim() === '') throw new CliError(`--${name} needs a value`, 2);
  return v.trim();
}


/** The column mapping: a first guess from the header and the model's variables, overridden by the options. */
export function mappingFromArgs(args: CliArgs, header: string[], variables: Model['variables'], unit: TimeUnit): ColumnMapping {
  const guess = suggestMapping(header, variables, unit);
  const format = str(args, 'format');
  if (format !== undefined && format !== 'long' && format !== 'wide') throw new CliError(`--format must be long or wide, not "${format}"`, 2);
  const tu = str(args, 'time-unit');
  if (tu !== undefined && !isTimeUnit(tu)) throw new CliError(`--time-unit must be one of s, min, h, day, week, month, year, not "${tu}"`, 2);
  const map = str(args, 'map');
  let cols = guess.variables;
  if (map !== undefined) {
    cols = map.split(',').map((part) => {
      const m = /^\s*([^=]+?)\s*=\s*(\S+)\s*$/.exec(part);
      if (!m) throw new CliError(`--map: "${part}" is not COLUMN=VARIABLE`, 2);
      if (!variables.some((v) => v.id === m[2])) throw new CliError(`--map: "${m[2]}" is not a variable of the model (${variables.map((v) => v.id).join(', ')})`, 2);
      return { column: m[1], variable: m[2] };
    });
  }
  const mapping: ColumnMapping = {
    ...guess,
    ...(format === 'long' && guess.format === 'wide' ? { format: 'long', variables: [] } : {}),
    ...(str(args, 'person') ? { person: str(args, 'person')! } : {}),
    ...(str(args, 'time') ? { time: str(args, 'time')! } : {}),
    ...(str(args, 'day') ? { day: str(args, 'day')! } : {}),
    ...(str(args, 'prompt') ? { prompt: str(args, 'prompt')! } : {}),
    ...(tu ? { timeInputUnit: tu as TimeUnit } : {}),
    ...(str(args, 'missing') ? { missing: str(args, 'missing')!.split(',') } : {}),
  };
  if (mapping.format === 'long') mapping.variables = cols;
  if (format === 'wide' && mapping.format !== 'wide') throw new CliError('--format wide: no columns like name_1, name_2 for model variables were found', 2);
  const waves = str(args, 'waves');
  if (waves !== undefined) {
    if (mapping.format !== 'wide' || !mapping.waves) throw new CliError('--waves is for wide files (one row per person, columns per wave such as stress_1, stress_2); this file reads as long', 2);
    mapping.waves = wavesFromArgs(waves, mapping.waves);
    mapping.timeFormat = 'number';
  }
  return mapping;
}

/**
 * `--waves 0,1,3,6`: the waves' times in `--time-unit` (default the model's), one number per wave in
 * the order of the waves found in the header; they replace the waves' own time columns if any.
 * Times may start anywhere (2014,2016,2019,2020 works as 0,2,5,6) but must increase.
 */
export function wavesFromArgs(text: string, waves: NonNullable<ColumnMapping['waves']>): NonNullable<ColumnMapping['waves']> {
  const parts = text.split(',').map((x) => x.trim());
  const times = parts.map((x, k) => {
    const v = x === '' ? NaN : Number(x);
    if (!Number.isFinite(v)) throw new CliError(`--waves: "${x}" (wave ${k + 1}) is not a number; give the waves' times as numbers, e.g. --waves 0,1,3,6 --time-unit year`, 2);
    return v;
  });
  if (times.length !== waves.length) {
    const cols = waves.map((w, k) => `wave ${k + 1}: ${w.cells.map((c) => c.column).join(', ')}`).join('; ');
    throw new CliError(`--waves gives ${times.length} time${times.length === 1 ? '' : 's'} but the file has ${waves.length} waves (${cols})`, 2);
  }
  for (let k = 1; k < times.length; k++)
    if (!(times[k] > times[k - 1])) throw new CliError(`--waves: wave ${k + 1}'s time ${parts[k]} is not after wave ${k}'s ${parts[k - 1]}; the times must increase`, 2);
  return waves.map((w, k) => ({ ...w, time: { value: times[k] - times[0] } }));
}

/** A note when a wide file's waves have neither time columns nor --waves: they are then read as equally spaced. */
function wavesNote(mapping: ColumnMapping, args: CliArgs): string | null {
  if (mapping.format !== 'wide' || !mapping.waves || args.options.waves !== undefined) return null;
  if (mapping.waves.some((w) => 'column' in w.time)) return null;
  return `the waves have no time columns and no --waves was given: they were read as ${mapping.waves.map((_, k) => k).join(', ')} ${mapping.timeInputUnit ?? mapping.timeUnit} apart from the first; give their times, e.g. --waves ${mapping.waves.map((_, k) => [0, 1, 3, 6, 12, 24][k] ?? k * 6).join(',')} --time-unit year`;
}

function delimiterOf(args: CliArgs, path: string): string | undefined {
  const d = str(args, 'delimiter');
  if (d === 'tab' || d === '\\t') return '\t';
  if (d !== undefined) return d;
  return /\.tsv$/i.test(path) ? '\t' : undefined;
}

function importFile(args: CliArgs, io: CliIO, path: string, variables: Model['variables'], unit: TimeUnit): { result: ImportResult; mapping: ColumnMapping } {
  const text = readInput(path, io);
  const delimiter = delimiterOf(args, path);
  const header = readHeader(text, delimiter ? { delimiter } : {});
  const mapping = mappingFromArgs(args, header.fields, variables, unit);
  const result = importText(text, mapping, delimiter ? { delimiter } : {});
  const note = wavesNote(mapping, args);
  if (note) result.summary.notes.push(note);
  return { result, mapping };
}

function summaryLines(r: ImportResult): string[] {
  const s = r.summary;
  const lines = [`rows read ${s.rows}; occasions kept ${s.kept}; refused ${s.refused}; persons ${s.persons}`];
  for (const x of s.reasons) lines.push(`  ${x.action}: ${x.reason}${x.column ? ` (column ${x.column})` : ''} — ${x.count}× (rows ${x.rows.join(', ')}${x.count > x.rows.length ? ', …' : ''})`);
  for (const m of s.missing) lines.push(`  ${m.variable}: ${m.missing} of ${m.total} cells missing`);
  if (s.unsortedPersons) lines.push(`  rows of ${s.unsortedPersons} persons were not in time order: sorted`);
  for (const n of s.notes) lines.push(`  note: ${n}`);
  const fileIssue = r.issues.find((i) => i.action === 'file refused');
  if (fileIssue) lines.push(`file refused: ${fileIssue.message}`);
  return lines;
}

function num(x: number): string {
  return Number.isFinite(x) ? String(significant(x, 4)) : String(x);
}

export const dataCommands: CliCommand[] = [
  {
    name: 'data',
    summary: 'import a CSV/TSV data file and report what was kept and refused, by row and column',
    usage: 'FILE.csv [MODEL.json] [--format long|wide] [--waves T1,T2,...] [--person COL] [--time COL] [--time-unit U] [--day COL] [--prompt COL] [--map col=variable,...] [--missing CODE,...] [--json]',
    options: { ...IMPORT_OPTIONS, model: true },
    run(args, io) {
      const path = args.positional[0];
      if (!path) throw new CliError('name a data file, e.g. loopfold data diary.csv --person pid --time when', 2);
      let variables: Model['variables'] = [];
      let unit: TimeUnit = 'h';
      if (args.positional[1]) { const model = loadModel({ ...args, positional: [args.positional[1]] }, io); variables = model.variables; unit = model.timeUnit; }
      const text = readInput(path, io);
      const delimiter = delimiterOf(args, path);
      const header = readHeader(text, delimiter ? { delimiter } : {});
      if (variables.length === 0) variables = header.fields.map((f) => ({ id: f, kind: 'state' as const }));
      const mapping = mappingFromArgs(args, header.fields, variables, unit);
      if (variables.length > 0 && args.positional[1] === undefined && str(args, 'map') === undefined && mapping.format === 'long')
        mapping.variables = mapping.variables.filter((v) => ![mapping.person, mapping.time, mapping.day, mapping.prompt].includes(v.column));
      const r = importText(text, mapping, delimiter ? { delimiter } : {});
      const note = wavesNote(mapping, args);
      if (note) r.summary.notes.push(note);
      if (args.options.json) {
        io.out(JSON.stringify({ file: path, mapping, kept: r.summary.kept, refused: r.summary.refused, summary: r.summary, issues: r.issues, moreIssues: r.moreIssues }, null, 2));
      } else io.out(summaryLines(r).join('\n'));
      return r.panel ? 0 : 1;
    },
  },
  {
    name: 'fit',
    summary: 'fit a VAR(1) within persons or a continuous-time model to data, and hold the sketch against it link by link',
    usage: 'MODEL.json --data FILE.csv [--format long|wide] [--waves T1,T2,...] [--person COL] [--time COL] [--time-unit U] [--map col=variable,...] [--method var|ct] [--same-day] [--skip-rule prompt|MAXGAP] [--person-fits [--min-pairs N]] [--initial free|stationary] [--open] [--json]',
    options: { ...IMPORT_OPTIONS, data: true, method: true, 'same-day': false, 'skip-rule': true, initial: true, open: false, intercepts: true, 'measurement-error': false, 'person-fits': false, 'min-pairs': true },
    run(args, io) {
      const model = loadModel(args, io);
      const file = str(args, 'data');
      if (!file) throw new CliError('--data FILE.csv is required', 2);
      const method = str(args, 'method') ?? 'var';
      if (method !== 'var' && method !== 'ct') throw new CliError(`--method must be var or ct, not "${method}"`, 2);
      const { result } = importFile(args, io, file, model.variables, model.timeUnit);
      if (!result.panel) throw new CliError(`the data file was refused: ${result.issues.find((i) => i.action === 'file refused')?.message ?? 'no rows'}`);
      const panel = result.panel;
      const states = sketchStates(model);
      const notStates = panel.variables.filter((v) => !states.includes(v));
      if (notStates.length) throw new CliError(`${notStates.join(', ')} ${notStates.length > 1 ? 'are' : 'is'} mapped to data but ${notStates.length > 1 ? 'are not states' : 'is not a state'} of the sketch; map data columns to states (${states.join(', ')})`);
      const refusedNote = result.summary.refused ? `${result.summary.refused} rows refused on import (run loopfold data for the list)` : null;
      if (method === 'var') {
        const skip = str(args, 'skip-rule');
        const skipRule = skip === undefined ? 'none' as const : skip === 'prompt' ? 'prompt' as const : { maxInterval: Number(skip) };
        if (typeof skipRule === 'object' && !(skipRule.maxInterval > 0)) throw new CliError('--skip-rule must be prompt or a positive maximum interval', 2);
        const minPairsText = str(args, 'min-pairs');
        const minPairs = minPairsText === undefined ? 20 : Number(minPairsText);
        if (!(Number.isInteger(minPairs) && minPairs >= 3)) throw new CliError(`--min-pairs must be a whole number of at least 3, not "${minPairsText}"`, 2);
        const personFits = !!args.options['person-fits'];
        let fit;
        try { fit = fitVar(panel, { sameDay: !!args.options['same-day'], skipRule, perPerson: { minPairs } }); } catch (e) { throw new CliError((e as Error).message); }
        // N = 1 fits: each person with at least minPairs usable lag pairs, a VAR(1) with a constant on that person's series alone.
        const fitted = new Set(fit.perPerson.map((p) => p.person));
        const tooShort = panel.persons.filter((p) => !fitted.has(p.id)).map((p) => p.id);
        const persons = personFits ? { minPairs, fits: fit.perPerson, notFitted: tooShort } : undefined;
        const withinDay = panel.persons.map((p) => (args.options['same-day'] && p.day ? Float64Array.from(Array.from(p.time).filter((_, k) => k === 0 || p.day![k] === p.day![k - 1])) : p.time));
        const interval = medianInterval(withinDay);
        const comparison = compareLagged(model, fit, interval).map(({ words: _w, sketchSign: _s, ...rest }) => rest);
        if (args.options.json) {
          io.out(JSON.stringify({ method: 'var', states: fit.variables, phi: fit.phi, residualCov: fit.residualCov, se: { phi: fit.se.phiCluster ?? fit.se.phi, phiConventional: fit.se.phi }, interval, n: { persons: fit.n.persons, occasions: fit.n.occasions, pairs: fit.n.pairs }, excluded: fit.excluded, between: fit.between.cov, comparison, ...(persons ? { perPerson: persons } : {}), warnings: [...fit.warnings, ...(refusedNote ? [refusedNote] : [])] }, null, 2));
        } else {
          const lines = [`${model.name}: VAR(1) within persons at the data's interval (median ${num(interval)} ${model.timeUnit}); model-based comparison, not a finding`, ''];
          fit.variables.forEach((to, i) => lines.push(`  ${to.padEnd(14)} ← ${fit.variables.map((from, j) => `${from} ${num(fit.phi[i][j])} (${num((fit.se.phiCluster ?? fit.se.phi)[i][j])})`).join(', ')}`));
          lines.push('', ...compareLagged(model, fit, interval).map((c) => `  ${c.words}: ${c.verdict}`));
          if (persons) {
            lines.push('', `each person alone (N = 1, VAR(1) with a constant; persons with at least ${minPairs} lag pairs): ${persons.fits.length} of ${panel.persons.length}`);
            for (const p of persons.fits) lines.push(`  ${p.person} (${p.pairs} pairs): ${fit.variables.map((to, i) => `${to} ← ${fit.variables.map((from, j) => `${from} ${num(p.phi[i][j])} (${num(p.se[i][j])})`).join(', ')}`).join('; ')}`);
            if (persons.notFitted.length) lines.push(`  too few lag pairs: ${persons.notFitted.join(', ')}`);
          }
          io.out(lines.join('\n'));
        }
        return 0;
      }
      const initial = str(args, 'initial') ?? 'free';
      if (initial !== 'free' && initial !== 'stationary') throw new CliError(`--initial must be free or stationary, not "${initial}"`, 2);
      const intercepts = str(args, 'intercepts') ?? 'random';
      if (intercepts !== 'random' && intercepts !== 'common') throw new CliError(`--intercepts must be random or common, not "${intercepts}"`, 2);
      const fitStates = panel.variables;
      const base = { states: fitStates, initial, intercepts, measurementError: !!args.options['measurement-error'] } as const;
      let open, confirmatory = null;
      try {
        open = fitCt(panel, base);
        if (!args.options.open) {
          const free = sketchFreePattern(model, fitStates);
          confirmatory = fitCt(panel, { ...base, free, start: ctStartFrom(panel, ctSpec(panel, { ...base, free }), open) });
        }
      } catch (e) { throw new CliError((e as Error).message); }
      const shown = confirmatory ?? open;
      const lr = confirmatory ? likelihoodRatio(confirmatory, open) : null;
      const comparison = compareDrift(model, open).map(({ words: _w, sketchSign: _s, ...rest }) => rest);
      // The whole ordering at the data's interval and span: the sketch's, and the one the open fit's links give.
      let ordering: FittedOrdering | null;
      const design = { interval: medianInterval(panel.persons.map((p) => p.time)), window: medianSpan(panel.persons) };
      try { ordering = fittedOrdering(model, open, design); } catch { ordering = null; }
      const orderingJson = ordering ? { interval: design.interval, window: design.window, sketch: ordering.sketch, fitted: ordering.fitted, links: ordering.links } : null;
      if (args.options.json) {
        io.out(JSON.stringify({
          method: 'ct', fit: confirmatory ? 'confirmatory' : 'open', states: shown.states, drift: shown.drift, diffusion: shown.diffusion, intercepts: shown.intercepts, between: shown.between,
          se: { drift: shown.se.drift, intercepts: shown.se.intercepts }, minus2LL: shown.minus2LL, aic: shown.aic, bic: shown.bic, parameters: shown.parameters,
          n: { persons: shown.n.persons, occasions: shown.n.occasions }, timescales: shown.timescales, lr, comparison, ordering: orderingJson, warnings: [...shown.warnings, ...(refusedNote ? [refusedNote] : [])],
        }, null, 2));
      } else {
        const lines = [`${model.name}: continuous-time fit (${confirmatory ? 'confirmatory: drift entries the sketch has' : 'open: every drift entry'}), ${shown.n.persons} persons, ${shown.n.occasions} occasions; model-based, not a finding`, ''];
        shown.states.forEach((to, i) => lines.push(`  d${to}/dt ← ${shown.states.map((from, j) => `${from} ${num(shown.drift[i][j])}${shown.spec.free[i][j] ? ` (${num(shown.se.drift[i][j])})` : ' fixed'}`).join(', ')}`));
        lines.push('', `−2LL ${num(shown.minus2LL)}, AIC ${num(shown.aic)}, BIC ${num(shown.bic)}`);
        if (lr) lines.push(`likelihood ratio, sketch against open: χ² ${num(lr.chi2)} on ${lr.df} df, p = ${num(lr.p)}`);
        lines.push('', ...compareDrift(model, open).map((c) => `  ${c.words}: ${c.verdict}`));
        if (ordering) {
          const roleText = (o: FittedOrdering['sketch']) => Object.entries(o.roles).filter(([id]) => shown.states.includes(id)).map(([id, r]) => `${id} ${r}`).join(', ');
          lines.push('', `ordering at the data's interval (${num(design.interval)} ${model.timeUnit}, span ${num(design.window)} ${model.timeUnit}): sketch ${roleText(ordering.sketch)}; fitted ${roleText(ordering.fitted)}`);
        }
        io.out(lines.join('\n'));
      }
      return 0;
    },
  },
];
