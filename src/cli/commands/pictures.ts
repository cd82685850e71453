/**
 * `factor`, `rank` and the uncertain part of `order`: the pictures a study
 * of a model would see (src/core/pictures/).
 */
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { LEVELS, laggedRank, orderingProbabilities, picturesAt, type Level, type OrderingProbabilities } from '../../core/pictures/index';
import type { StudyDesign } from '../../core/ordering/types';
import { rankCurveCaption, rankCurveFigure } from '../../export/pictures';
import { fitToOf, svgTarget, tableWanted, writeSvg } from '../figure';
import { PRINT_OPTIONS } from '../output/write';
import { durationOption, loadModel } from '../load';
import { studyInterval } from '../../core/study/convert';
import { CliError, type CliArgs, type CliCommand } from './types';
import { fixedText, significant } from '../../present/index';

function num(x: number | null): string {
  if (x === null) return '—';
  if (!Number.isFinite(x)) return String(x);
  return Math.abs(x) >= 1e-3 || x === 0 ? String(significant(x, 4)) : x.toExponential(3);
}

function wholeOption(args: CliArgs, name: string, min: number, fallback?: number): number | undefined {
  const v = args.options[name];
  if (v === undefined) return fallback;
  const n = Number(v);
  if (v === true || !Number.isInteger(n) || n < min) throw new CliError(`--${name} must be a whole number of at least ${min}, not "${v === true ? '' : v}"`, 2);
  return n;
}

/** `--observed a,b,c`: the states to analyse (each must exist). */
function observedOption(args: CliArgs, model: Model): string[] | undefined {
  const v = args.options.observed;
  if (v === undefined) return undefined;
  if (v === true || v.trim() === '') throw new CliError('--observed needs states, e.g. --observed tension,worry,restless', 2);
  const ids = v.split(',').map((s) => s.trim());
  for (const id of ids) {
    const found = model.variables.find((x) => x.id === id);
    if (!found) throw new CliError(`--observed: the model has no variable "${id}"`, 2);
    if (found.kind !== 'state') throw new CliError(`--observed: ${id} is ${found.kind === 'input' ? 'an input' : 'a derived variable'}; only states are analysed`, 2);
  }
  return ids;
}

/** `--person-sd load=1,mood=0.5`: SDs across persons of inputs, instead of the model's own. */
function personSdOption(args: CliArgs, model: Model): Record<string, number> | undefined {
  const v = args.options['person-sd'];
  if (v === undefined) return undefined;
  if (v === true) throw new CliError('--person-sd needs INPUT=SD, e.g. --person-sd workload=1', 2);
  const out: Record<string, number> = {};
  for (const part of v.split(',')) {
    const m = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=\s*(\S+)\s*$/.exec(part);
    if (!m) throw new CliError(`--person-sd: "${part}" is not INPUT=SD`, 2);
    const found = model.variables.find((x) => x.id === m[1]);
    if (!found) throw new CliError(`--person-sd: the model has no variable "${m[1]}"`, 2);
    if (found.kind !== 'input') throw new CliError(`--person-sd: ${m[1]} is not an input (person differences apply to inputs)`, 2);
    const sd = Number(m[2]);
    if (!(sd >= 0) || !Number.isFinite(sd)) throw new CliError(`--person-sd: the SD of ${m[1]} must be a non-negative number, not "${m[2]}"`, 2);
    out[m[1]] = sd;
  }
  return out;
}

/** The study interval: --interval, else the file's study, else one model time unit (said so in the output). */
function intervalOf(args: CliArgs, model: Model): { interval: number; given: boolean } {
  const d = durationOption(args, 'interval', model) ?? (model.study ? studyInterval(model.study, model.timeUnit) : undefined);
  return d === undefined ? { interval: 1, given: false } : { interval: d, given: true };
}

function levelOption(args: CliArgs): Level {
  const v = args.options.level ?? 'between';
  if (v === true || !(LEVELS as readonly string[]).includes(v)) throw new CliError(`--level must be between, within or cross, not "${v === true ? '' : v}"`, 2);
  return v as Level;
}

/** The `probabilities` part of `order --uncertain`. */
export function uncertainOrdering(args: CliArgs, model: Model, design: StudyDesign): OrderingProbabilities {
  if (design.interval === undefined) throw new CliError('--uncertain needs --interval: the probabilities are those of the ordering at one interval', 2);
  const draws = wholeOption(args, 'draws', 1, 2000)!;
  const seed = wholeOption(args, 'seed', 0, 1)!;
  if (draws > 1e6) throw new CliError('--draws must be at most 1,000,000', 2);
  return orderingProbabilities(model, { ...design, interval: design.interval }, { draws, seed });
}

export function uncertainText(p: OrderingProbabilities): string[] {
  const lines = ['', `under uncertain timescales (${p.draws} log-uniform draws, seed ${p.seed}):`];
  for (const r of p.readings) lines.push(`  ${r}`);
  for (const s of p.probabilities) {
    const d = Object.entries(s.deciding).map(([id, role]) => `${id} ${role === 'state' ? 'dynamic' : role}`).join(', ');
    lines.push(`  ${fixedText(s.share * 100, 1, { ascii: true }).padStart(5)} %  ${d || '(every draw)'}  ${s.blocks.filter((b) => b.variables.length > 1).length} simultaneous block(s)`);
  }
  return lines;
}

export const pictureCommands: CliCommand[] = [
  {
    name: 'factor',
    summary: 'factor analysis of the covariance a study would see within, between or across persons',
    usage: 'MODEL.json [--interval D] [--samples T] [--persons N] [--factors k] [--level between|within|cross] [--observed x,y,z] [--person-sd input=SD] [--json]',
    options: { interval: true, samples: true, persons: true, factors: true, level: true, observed: true, 'person-sd': true, json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const { interval, given } = intervalOf(args, model);
      const factors = wholeOption(args, 'factors', 1, 1)!;
      const level = levelOption(args);
      const r = picturesAt(model, {
        interval,
        samples: wholeOption(args, 'samples', 2),
        persons: wholeOption(args, 'persons', 2),
        factors,
        observed: observedOption(args, model),
        personSD: personSdOption(args, model),
      });
      if (!r.ok) throw new CliError(r.reason);
      const P = r.pictures;
      const pic = P.byLevel[level];
      const fit = factors === 1 ? pic.oneFactor : pic.kFactor;
      if (!fit) throw new CliError(pic.problem ?? `${factors} factors for ${P.levels.observed.length} variables are not identified`);
      if (args.options.json) {
        io.out(JSON.stringify({
          level,
          variables: P.levels.observed,
          interval,
          samples: P.levels.samples,
          persons: P.levels.persons,
          n: pic.n,
          factors,
          covariance: pic.covariance,
          correlation: fit.correlation,
          loadings: fit.loadings,
          uniqueness: fit.uniqueness,
          chi2: fit.chi2,
          df: fit.df,
          pValue: fit.pValue,
          rmsea: fit.rmsea,
          eigenvalues: fit.eigenvalues,
          heywood: fit.heywood.map((i) => P.levels.observed[i]),
          reading: pic.reading,
          summary: P.summary,
          warnings: [...(given ? [] : [`no --interval and no study in the file: the study is taken to sample every 1 ${model.timeUnit}`]), ...fit.warnings],
        }, null, 2));
        return 0;
      }
      const names = P.levels.observed;
      const w = Math.max(...names.map((n) => n.length), 8);
      const lines = [
        `${model.name}: ${factors}-factor analysis ${level === 'within' ? 'within persons' : level === 'between' ? 'of the person means' : 'of a one-time survey'} (model-based, not a finding)`,
        `  study: every ${formatDuration(interval, model.timeUnit)}${given ? '' : ' (default; give --interval or a study in the file)'}, ${P.levels.samples} prompts, ${P.levels.persons} persons; N = ${pic.n}`,
        '',
        `  ${'variable'.padEnd(w)}  ${Array.from({ length: factors }, (_, c) => `loading ${c + 1}`.padStart(10)).join(' ')}  uniqueness`,
        ...names.map((n, i) => `  ${n.padEnd(w)}  ${fit.loadings[i].map((x) => num(x).padStart(10)).join(' ')}  ${num(fit.uniqueness[i]).padStart(10)}`),
        '',
        `  χ² = ${num(fit.chi2)}, df = ${fit.df}, p = ${num(fit.pValue)}, RMSEA = ${num(fit.rmsea)}`,
        `  eigenvalues of the correlation matrix: ${fit.eigenvalues.map(num).join(', ')}`,
        '',
        ...P.summary.map((s) => `  ${s}`),
      ];
      if (fit.warnings.length > 0) lines.push('', ...fit.warnings.map((x) => `  warning  ${x}`));
      io.out(lines.join('\n'));
      return 0;
    },
  },
  {
    name: 'rank',
    summary: 'singular values of the lagged matrix Φ(Δ) over the analysed states; --out draws their ratios over the interval (the rank curve)',
    usage: 'MODEL.json --interval D [--observed x,y,z] [--json] [--out FILE.svg|.png|.pdf [--caption] [print options] [--table]]',
    options: { interval: true, observed: true, json: false, caption: false, ...PRINT_OPTIONS },
    async run(args, io) {
      const model = loadModel(args, io);
      const target = svgTarget(args, []);
      const interval = durationOption(args, 'interval', model);
      if (interval === undefined) throw new CliError('rank needs --interval, e.g. --interval 3h', 2);
      const r = picturesAt(model, { interval, observed: observedOption(args, model), samples: 2 });
      if (!r.ok) throw new CliError(r.reason);
      if (target !== undefined) {
        // the rank curve of the app's Pictures pane: the same builder, caption and print path
        const text = args.options['caption-text'];
        const caption = typeof text === 'string' ? text : args.options.caption === true ? rankCurveCaption(model, r.pictures) : undefined;
        await writeSvg(target, rankCurveFigure(model, r.pictures, { heading: args.options['no-title'] !== true, ...(caption !== undefined ? { caption } : {}), ...fitToOf(args) }), io, args);
        if (target === '-' || !tableWanted(args)) return 0;
      }
      const L = r.pictures.levels;
      const rank = laggedRank(L.drift, L.states, L.observed, interval);
      const near = rank.singularValues[0] >= 0.01 && rank.secondRatio <= 0.1;
      const reading = rank.singularValues[0] < 0.01
        ? `almost nothing carries over from one prompt to the next at this interval (largest singular value ${num(rank.singularValues[0])})`
        : near
          ? `the lagged matrix is nearly rank one (second/first ${num(rank.secondRatio)}): one pattern carries over, spread over ${Math.round(rank.spread)} of ${L.observed.length} variables`
          : `${rank.singularValues.filter((s) => s >= 0.1 * rank.singularValues[0]).length} patterns carry over (second/first ${num(rank.secondRatio)})`;
      if (args.options.json) {
        io.out(JSON.stringify({ interval, variables: L.observed, singularValues: rank.singularValues, ratio: rank.ratio, secondRatio: rank.secondRatio, pattern: rank.pattern, spread: rank.spread, phi: rank.phi, reading }, null, 2));
        return 0;
      }
      io.out([
        `${model.name}: the lagged matrix Φ(${formatDuration(interval, model.timeUnit)}) over ${L.observed.join(', ')}`,
        `  singular values: ${rank.singularValues.map(num).join(', ')}`,
        `  smallest/largest ${num(rank.ratio)}, second/largest ${num(rank.secondRatio)}`,
        `  ${reading}`,
      ].join('\n'));
      return 0;
    },
  },
];
