/** Commands `curves` (one lagged link against the interval) and `advise` (an interval for chosen links). */
import { formatDuration } from '../../core/model/units';
import { breakpoints } from '../../core/ordering/index';
import { linkCurveChart } from '../../export/charts';
import { adviceOf, curveOf } from '../../core/numeric/answers';
import { figureOptions, figureOptionsOf, svgTarget, tableWanted, writeSvg } from '../figure';
import { variableByIdOrLabel } from '../load';
import { loadModel } from '../load';
import { designFromArgs } from './ordering';
import { CliError, type CliArgs, type CliCommand } from './types';
import { tableText } from '../../present/index';
import { adviceUnderStrengthRanges } from '../../core/pictures/strengthRanges';

/** Six significant digits, exponent form outside [0.001, 10⁶), ASCII: scripts read these tables. */
const num = tableText;

function stringOption(args: CliArgs, name: string, example: string): string {
  const v = args.options[name];
  if (v === undefined) throw new CliError(`--${name} is required, e.g. --${name} ${example}`, 2);
  if (v === true || v.trim() === '') throw new CliError(`--${name} needs a value, e.g. --${name} ${example}`, 2);
  return v.trim();
}

function pointsOption(args: CliArgs): number {
  const v = args.options.points;
  if (v === undefined) return 121;
  const n = Number(v);
  if (v === true || !Number.isInteger(n) || n < 3 || n > 5000) throw new CliError('--points must be a whole number from 3 to 5000', 2);
  return n;
}

export const curveCommands: CliCommand[] = [
  {
    name: 'curves',
    summary: 'the lagged effect of one state on another against the sampling interval, with its peak; --out draws the chart the app exports (.svg, .png, .pdf)',
    usage: 'MODEL.json --from X --to Y [--points N] [--json] [--out FILE [--table] [--interval D] [--window W | --samples N] [--caption]]',
    options: { from: true, to: true, points: true, json: false, ...figureOptions, interval: true, window: true, samples: true },
    async run(args, io) {
      const model = loadModel(args, io);
      const from = variableByIdOrLabel(model, stringOption(args, 'from', 'sleep'), 'from');
      const to = variableByIdOrLabel(model, stringOption(args, 'to', 'mood'), 'to');
      const svg = svgTarget(args, ['interval', 'window', 'samples']);
      if (svg === '-' && args.options.json) throw new CliError('--svg - prints the SVG instead of the curve: leave out --json, or write the SVG to a file', 2);
      const design = designFromArgs(args, model);
      const figure = svg === undefined ? undefined : figureOptionsOf(args, model, design);
      const r = curveOf(model, from, to, pointsOption(args));
      if (!r.ok) throw new CliError(r.reason);
      const c = r.curve;
      if (svg !== undefined) {
        // The intervals where the ordering changes over the study (as the app's analysis gives them), and the current Δ.
        const axis = design.window !== undefined ? { window: design.window } : { samples: design.samples };
        const marks = breakpoints(model, axis).map((b) => b.interval);
        await writeSvg(svg, linkCurveChart({ model, curve: c, breakpoints: marks, current: design.interval }, figure), io, args);
        if (svg === '-' || !tableWanted(args)) return 0;
      }
      const peak = c.peaks.length > 0 ? c.peaks.reduce((a, b) => (Math.abs(b.effect) > Math.abs(a.effect) ? b : a)) : null;
      if (args.options.json) io.out(JSON.stringify({ from, to, timeUnit: model.timeUnit, intervals: c.intervals, effect: c.effect, peak, peaks: c.peaks }, null, 2));
      else {
        const u = model.timeUnit;
        const lines = [`${model.name}: lagged effect of ${from} on ${to} one interval later, against the interval (model-based)`, ''];
        lines.push(`  ${'interval'.padStart(14)}  ${'effect'.padStart(12)}`);
        const step = Math.max(1, Math.ceil(c.intervals.length / 25));
        for (let k = 0; k < c.intervals.length; k += step) lines.push(`  ${formatDuration(c.intervals[k], u).padStart(14)}  ${num(c.effect[k]).padStart(12)}`);
        lines.push('', peak ? `strongest at Δ ≈ ${formatDuration(peak.interval, u)} (${num(peak.interval)} ${u}): effect ${num(peak.effect)}` : 'no peak in the range examined (the effect only grows or only fades there)');
        io.out(lines.join('\n'));
      }
      return 0;
    },
  },
  {
    name: 'advise',
    summary: 'for chosen lagged links, the intervals where each is strong, and one interval for all',
    usage: 'MODEL.json --links X>Y,U>V [--fraction 0.5] [--points N] [--uncertain [--draws K] [--seed S]] [--json]',
    options: { links: true, fraction: true, points: true, json: false, uncertain: false, draws: true, seed: true },
    run(args, io) {
      const model = loadModel(args, io);
      const text = stringOption(args, 'links', 'sleep>mood,mood>sleep');
      const links = text.split(',').map((part) => {
        const m = /^\s*([^>\s]+)\s*>\s*([^>\s]+)\s*$/.exec(part);
        if (!m) throw new CliError(`--links: "${part}" is not a link; write FROM>TO, e.g. sleep>mood`, 2);
        return { from: m[1], to: m[2] };
      });
      const fv = args.options.fraction;
      const fraction = fv === undefined ? 0.5 : Number(fv);
      if (fv === true || !(fraction > 0 && fraction < 1)) throw new CliError('--fraction must be a number between 0 and 1, e.g. --fraction 0.5', 2);
      const r = adviceOf(model, links, fraction, pointsOption(args));
      if (!r.ok) throw new CliError(r.reason);
      const a = r.advice;
      // Strength ranges (a link's strengthRange): the advice over seeded draws of the strengths.
      let u = null;
      if (args.options.uncertain) {
        const whole = (name: string, dflt: number, lo: number, hi: number) => {
          const v = args.options[name];
          if (v === undefined) return dflt;
          const x = Number(v);
          if (v === true || !Number.isInteger(x) || x < lo || x > hi) throw new CliError(`--${name} must be a whole number from ${lo} to ${hi}`, 2);
          return x;
        };
        const res = adviceUnderStrengthRanges(model, links, { draws: whole('draws', 200, 1, 100000), seed: whole('seed', 1, 0, 2 ** 32 - 1), fraction, points: pointsOption(args) });
        if (!res.ok) throw new CliError(res.reason);
        u = res;
      }
      const uncertain = u && { draws: u.draws, seed: u.seed, ranged: u.ranged.map(({ from, to, low, high, point, decides }) => ({ from, to, low, high, point, decides })), holds: u.holds, best: u.best, noAdvice: u.noAdvice, links: u.links, readings: u.readings };
      if (args.options.json) io.out(JSON.stringify({ timeUnit: model.timeUnit, fraction, links: a.links, best: a.best, score: a.score, explanation: a.explanation, ...(uncertain ? { uncertain } : {}) }, null, 2));
      else io.out([`${model.name}: interval advice (model-based)`, '', a.explanation, ...(u ? ['', 'Under the strength ranges:', ...u.readings.map((x) => `  ${x}`)] : [])].join('\n'));
      return a.best === null ? 1 : 0;
    },
  },
];
