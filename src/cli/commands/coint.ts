/** Command `coint`: unit roots per series, Engle–Granger, Johansen, and which series tracks which. */
import { readColumns } from '../../core/data/columns';
import { cointegrationReport, pooledCointegration, type CointegrationReport } from '../../core/fit/coint';
import { CliError, type CliArgs, type CliCommand } from './types';
import { readInput } from '../load';
import { significant } from '../../present/index';

function num(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const v = significant(x, 4);
  return v < 0 ? `−${-v}` : String(v);
}

function pText(p: number): string {
  return p < 0.001 ? '< 0.001' : num(p);
}

function str(args: CliArgs, name: string): string | undefined {
  const v = args.options[name];
  if (v === undefined) return undefined;
  if (v === true || v.trim() === '') throw new CliError(`--${name} needs a value`, 2);
  return v.trim();
}

/** The report without the long arrays (residuals), for --json. */
function reportJson(r: CointegrationReport): unknown {
  const { residuals: _r, ...eg } = r.engleGranger;
  return {
    nobs: r.nobs,
    adf: r.adf.map((a) => ({ series: a.series, statistic: a.statistic, pValue: a.pValue, critical: a.critical, usedLag: a.usedLag, nobs: a.nobs, unitRoot: a.unitRoot })),
    engleGranger: { ...eg, dependent: r.names[0] },
    johansen: r.johansen,
    errorCorrection: r.errorCorrection,
    sentence: r.sentence,
    notes: r.notes,
  };
}

function reportLines(r: CointegrationReport, indent = ''): string[] {
  const lines: string[] = [];
  lines.push(`${indent}Unit root (augmented Dickey–Fuller, ${r.adf[0].regression === 'c' ? 'constant' : 'constant and trend'}, lag by AIC):`);
  for (const a of r.adf) lines.push(`${indent}  ${a.series.padEnd(14)} τ ${num(a.statistic)}  p ${pText(a.pValue)}  (5 % critical ${num(a.critical!['5%'])}; lag ${a.usedLag}, ${a.nobs} obs.) — ${a.unitRoot ? 'a unit root is not rejected' : 'no unit root at 5 %'}`);
  const eg = r.engleGranger;
  lines.push(`${indent}Engle–Granger (${r.names[0]} on ${r.names.slice(1).join(', ')}): τ ${num(eg.statistic)}  p ${pText(eg.pValue)}  critical 1 % ${num(eg.critical['1%'])}, 5 % ${num(eg.critical['5%'])}, 10 % ${num(eg.critical['10%'])} — ${eg.cointegrated ? 'cointegrated at 5 %' : 'no cointegration at 5 %'}`);
  const j = r.johansen;
  lines.push(`${indent}Johansen (${j.lagDiff} lagged difference${j.lagDiff === 1 ? '' : 's'}, ${j.nobs} obs.): rank at 5 % — trace ${j.rank.trace}, maximum eigenvalue ${j.rank.maxEig}`);
  j.trace.forEach((t, i) => lines.push(`${indent}  r ≤ ${i}: trace ${num(t)} (5 % ${num(j.traceCritical[i][1])}), max-eig ${num(j.maxEig[i])} (5 % ${num(j.maxEigCritical[i][1])})`));
  if (r.errorCorrection) {
    lines.push(`${indent}Error-correction loadings (pull toward the balance; negative pulls back):`);
    for (const l of r.errorCorrection.loadings) lines.push(`${indent}  ${l.series.padEnd(14)} α ${num(l.alpha)} (SE ${num(l.se)}, p ${pText(l.pValue)}) — ${l.corrects ? 'corrects' : 'does not correct distinguishably'}`);
  }
  lines.push(`${indent}${r.sentence}`);
  for (const n of r.notes) lines.push(`${indent}note: ${n}`);
  return lines;
}

export const cointCommands: CliCommand[] = [
  {
    name: 'coint',
    summary: 'unit-root tests per series, Engle–Granger and Johansen cointegration, and which series tracks which',
    usage: 'FILE.csv --columns a,b[,c] [--person COL] [--trend c|ct] [--lags N] [--missing CODE,...] [--delimiter D] [--json]',
    options: { columns: true, person: true, trend: true, lags: true, missing: true, delimiter: true, json: false },
    run(args, io) {
      const path = args.positional[0];
      if (!path) throw new CliError('name a data file, e.g. loopfold coint levels.csv --columns stock,inflow', 2);
      const colText = str(args, 'columns');
      if (!colText) throw new CliError('--columns a,b[,c] is required: the series to test, the first regressed on the others', 2);
      const columns = colText.split(',').map((c) => c.trim()).filter((c) => c !== '');
      if (columns.length < 2 || columns.length > 6) throw new CliError(`--columns needs 2 to 6 columns, not ${columns.length}`, 2);
      const trend = str(args, 'trend') ?? 'c';
      if (trend !== 'c' && trend !== 'ct') throw new CliError(`--trend must be c (constant) or ct (constant and trend), not "${trend}"`, 2);
      const lagsText = str(args, 'lags') ?? '1';
      const lags = Number(lagsText);
      if (!Number.isInteger(lags) || lags < 0 || lags > 24) throw new CliError(`--lags must be a whole number from 0 to 24, not "${lagsText}"`, 2);
      const text = readInput(path, io);
      const d = str(args, 'delimiter');
      const delimiter = d === 'tab' || d === '\\t' ? '\t' : d ?? (/\.tsv$/i.test(path) ? '\t' : undefined);
      const person = str(args, 'person');
      let read;
      try {
        read = readColumns(text, columns, { ...(person ? { person } : {}), ...(delimiter ? { delimiter } : {}), ...(str(args, 'missing') ? { missing: str(args, 'missing')!.split(',') } : {}) });
      } catch (e) {
        throw new CliError(`${path}: ${(e as Error).message}`);
      }
      if (read.problems.length) {
        const list = read.problems.slice(0, 10).map((p) => `row ${p.row}, column ${p.column}: ${p.message}`);
        const more = read.problems.length - list.length + read.moreProblems;
        throw new CliError(`${path}: the tests need complete numeric series; ${list.join('; ')}${more > 0 ? `; and ${more} more` : ''}. Nothing was tested.`);
      }
      const options = { trend: trend as 'c' | 'ct', lags };
      if (!person) {
        const g = read.groups[0];
        if (!g) throw new CliError(`${path}: no data rows`);
        let report: CointegrationReport;
        try { report = cointegrationReport(g.series, columns, options); } catch (e) { throw new CliError(`${path}: ${(e as Error).message}`); }
        if (args.options.json) io.out(JSON.stringify({ file: path, columns, trend, lags, order: 'rows in file order, equally spaced', ...(reportJson(report) as object) }, null, 2));
        else io.out([`${path}: ${columns.join(', ')} — ${report.nobs} occasions in file order, read as equally spaced; model-based tests, not findings`, '', ...reportLines(report)].join('\n'));
        return 0;
      }
      const pooled = pooledCointegration(read.groups, columns, options);
      if (pooled.tested === 0) throw new CliError(`${path}: no person could be tested (${pooled.skipped.slice(0, 3).map((s) => `${s.id}: ${s.reason}`).join('; ')})`);
      if (args.options.json) {
        io.out(JSON.stringify({
          file: path, columns, trend, lags, person, order: 'rows of each person in file order, equally spaced',
          pooled: { persons: pooled.persons, tested: pooled.tested, skipped: pooled.skipped, adf: pooled.adf, engleGranger: pooled.engleGranger, johansenRank: pooled.johansenRank, trackers: pooled.trackers },
          perPerson: pooled.perPerson.map((p) => ({ id: p.id, ...(reportJson(p.report) as object) })),
        }, null, 2));
        return 0;
      }
      const lines = [`${path}: ${columns.join(', ')} per ${person} (${pooled.tested} of ${pooled.persons} tested; rows of each ${person} in file order, read as equally spaced); model-based tests, not findings`, ''];
      for (const a of pooled.adf) lines.push(`  unit root rejected at 5 % for ${a.series} in ${a.rejected} of ${pooled.tested} (combined p ${pText(a.fisherP)})`);
      lines.push(`  Engle–Granger: cointegrated at 5 % in ${pooled.engleGranger.rejected} of ${pooled.tested} (combined p ${pText(pooled.engleGranger.fisherP)})`);
      lines.push(`  Johansen trace rank at 5 %: ${pooled.johansenRank.map((c, r) => `rank ${r} in ${c}`).join(', ')}`);
      for (const t of pooled.trackers) if (t.persons) lines.push(`  ${t.series} tracks the others in ${t.persons} of ${pooled.tested}`);
      for (const s of pooled.skipped) lines.push(`  skipped ${s.id}: ${s.reason}`);
      for (const p of pooled.perPerson) lines.push('', `${person} ${p.id} (${p.report.nobs} occasions):`, ...reportLines(p.report, '  '));
      io.out(lines.join('\n'));
      return 0;
    },
  },
];
