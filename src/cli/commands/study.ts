/**
 * `loopfold design MODEL.json [--json]`: the study as read (version-1 files
 * migrated), the gaps between its prompts, Φ for each gap, and what a VAR(1)
 * over consecutive prompts estimates in the limit.
 * `loopfold migrate MODEL.json --out NEW.json`: the file written as version 2.
 */
import { modelFileText } from '../../core/model/migrate';
import { parseModelText } from '../../core/model/schema';
import type { Study, TimeUnit } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { intervalLabel } from '../../core/study/convert';
import { studyOfModel } from '../../core/study/design';
import { studyDesign, type StudyDesignReport } from '../../core/study/report';
import { loadModel, readInput } from '../load';
import { CliError, type CliCommand } from './types';
import { fixedText } from '../../present/index';

function scheduleText(study: Study): string {
  const s = study.schedule;
  switch (s.kind) {
    case 'fixed':
      return 'one prompt every interval, day and night';
    case 'daily':
      return 'one prompt a day';
    case 'weekly':
      return 'one prompt a week';
    case 'daily-window':
      return `${s.promptsPerDay} prompts a day between ${s.from} and ${s.to}, ${s.timing === 'fixed' ? 'evenly spaced' : 'one at a random time in each equal part of the window'}`;
  }
}

function matrixLines(states: string[], m: number[][], indent = '    '): string[] {
  const w = Math.max(6, ...states.map((s) => s.length));
  const lines = [`${indent}${''.padEnd(w)}  ${states.map((s) => s.padStart(10)).join(' ')}`];
  m.forEach((row, i) => lines.push(`${indent}${states[i].padEnd(w)}  ${row.map((x) => fixedText(x, 4, { ascii: true }).padStart(10)).join(' ')}`));
  return lines;
}

/** Readable text for `design` without --json. */
export function designText(name: string, r: StudyDesignReport): string {
  const u: TimeUnit = r.timeUnit;
  const st = r.study;
  const lines = [
    `${name}: study design`,
    `  interval  ${intervalLabel(r.interval, u)} (${st.interval})`,
    `  length    ${typeof st.length === 'number' ? `${st.length} prompts` : st.length}`,
    `  schedule  ${scheduleText(st)}`,
    `  persons   ${st.persons ?? 1}${st.missedPrompts ? `, ${Math.round(st.missedPrompts * 1000) / 10} % of prompts missed` : ''}`,
  ];
  if (st.holds && Object.keys(st.holds).length > 0) lines.push(`  holds     ${Object.entries(st.holds).map(([k, v]) => `${k}=${v}`).join(', ')}`);
  lines.push('', 'gaps between consecutive prompts:');
  for (const g of r.gaps)
    lines.push(`  ${formatDuration(g.gap, u).padStart(10)}${g.spread > 0 ? ` ± ${formatDuration(g.spread, u)}` : ''}  ${fixedText(g.share * 100, 1, { ascii: true }).padStart(5)} % of pairs${g.sameDayShare > 0 && g.sameDayShare < g.share - 1e-12 ? ` (${fixedText(g.sameDayShare * 100, 1, { ascii: true })} % on the same day)` : g.sameDayShare === 0 ? ' (across days)' : ''}`);
  lines.push('', `Φ at the nominal interval (${formatDuration(r.interval, u)}), row = to, column = from:`, ...matrixLines(r.states, r.nominal));
  lines.push('', 'what a VAR(1) over consecutive prompts estimates, all pairs:', ...matrixLines(r.states, r.pooled));
  if (r.sameDay) lines.push('', 'same-day pairs only:', ...matrixLines(r.states, r.sameDay));
  else lines.push('', 'same-day pairs only: none (no two prompts fall on the same day)');
  if (r.pooledMeasured) lines.push('', 'all pairs, as measured with the variables\' reliabilities:', ...matrixLines(r.states, r.pooledMeasured));
  if (r.shrinkage.length > 0) lines.push('', ...r.shrinkage);
  if (r.warnings.length > 0) lines.push('', 'warnings:', ...r.warnings.map((w) => `  ${w}`));
  lines.push('', 'Model-based hypotheses about what such a study can show, not findings.');
  return lines.join('\n');
}

export const studyCommands: CliCommand[] = [
  {
    name: 'design',
    summary: 'the study of the file: gaps between prompts, Φ per gap, and what a VAR over consecutive prompts estimates',
    usage: 'MODEL.json [--json]',
    options: { json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const study = studyOfModel(model);
      const r = studyDesign(model, study);
      if (!r.ok) throw new CliError(r.reason);
      const rep = r.report;
      if (args.options.json)
        io.out(JSON.stringify({ study: rep.study, timeUnit: rep.timeUnit, interval: rep.interval, states: rep.states, gaps: rep.gaps, nominal: rep.nominal, pooled: rep.pooled, sameDay: rep.sameDay, pooledMeasured: rep.pooledMeasured, shrinkage: rep.shrinkage, warnings: rep.warnings }, null, 2));
      else io.out(designText(model.name, rep));
      return 0;
    },
  },
  {
    name: 'migrate',
    summary: 'write a model file of an older version as the current version (2)',
    usage: 'MODEL.json --out NEW.json',
    options: { out: true },
    run(args, io) {
      const path = args.positional[0];
      const out = args.options.out;
      if (out === undefined || out === true) throw new CliError('name the new file, e.g. loopfold migrate old.json --out new.json', 2);
      if (!path) throw new CliError('name a model file, e.g. loopfold migrate old.json --out new.json', 2);
      const text = readInput(path, io);
      const r = parseModelText(text);
      if (!r.ok) throw new CliError(`${path} is not a valid model: ${r.issues.map((i) => `${i.path} ${i.message}`).join('; ')}`);
      try {
        io.writeFile(out, modelFileText(r.model));
      } catch (e) {
        throw new CliError(`cannot write ${out}: ${(e as Error).message}`);
      }
      io.out(r.migratedFrom !== undefined ? `wrote ${out}: version ${r.migratedFrom} → 2` : `wrote ${out}: already version 2, written again`);
      return 0;
    },
  },
];
