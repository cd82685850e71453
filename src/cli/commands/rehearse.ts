/**
 * Rehearse a study before running it:
 * `loopfold simulate-study MODEL.json [--persons N] [--seed S] --out FILE.csv`: one synthetic study
 *   of the file's study, as a long CSV (person, day, prompt, time, one column per state).
 * `loopfold power MODEL.json --link from->to[,..] [--persons N] [--method analytic|montecarlo]
 *   [--replications K] [--seed S] [--json]`: effect, SE and power per link.
 * `loopfold plan MODEL.json --link from->to [--budget prompts=70 | span="14 days"] [--persons N] [--json]`:
 *   power against the interval under the budget and the design to recommend;
 *   `--over persons|prompts-per-day [--values 10,20,40]`: against the persons or the prompts a day instead.
 */
import type { Model } from '../../core/model/types';
import { formatDuration, parseDuration } from '../../core/model/units';
import { linksOfText, rehearsalOf, simulateStudy, type Rehearsal } from '../../core/rehearse/setup';
import { analyticPower, monteCarloPower, trustSentence, type PowerResult } from '../../core/rehearse/power';
import { simulatorText } from '../../core/rehearse/nonlinear';
import { planPersons, planPromptsPerDay, planStudy, type AxisPlan, type Budget } from '../../core/rehearse/plan';
import { formatNumber, studyCsv } from '../../present/index';
import { loadModel } from '../load';
import { CliError, type CliArgs, type CliCommand } from './types';

const CAUTION = 'Model-based hypotheses about what such a study can show, not findings; no clinical advice.';

function wholeOption(args: CliArgs, name: string, min: number): number | undefined {
  const v = args.options[name];
  if (v === undefined) return undefined;
  if (v === true) throw new CliError(`--${name} needs a value`, 2);
  const n = Number(v);
  if (!Number.isInteger(n) || n < min) throw new CliError(`--${name}: a whole number of at least ${min} is needed, not "${v}"`, 2);
  return n;
}

function seedOption(args: CliArgs): number | undefined {
  const v = args.options.seed;
  if (v === undefined) return undefined;
  const n = Number(v);
  if (v === true || !Number.isInteger(n)) throw new CliError(`--seed: a whole number is needed, not "${v === true ? '' : v}"`, 2);
  return n;
}

function rehearsal(model: Model, args: CliArgs, withLinks: boolean): Rehearsal {
  try {
    const linkText = args.options.link;
    const analysis = args.options.analysis ?? 'var';
    if (analysis !== 'var' && analysis !== 'ct') throw new CliError(`--analysis: var or ct, not "${analysis === true ? '' : analysis}"`, 2);
    if (withLinks && (linkText === undefined || linkText === true)) throw new CliError('--link: name the link(s) to detect, e.g. --link stress->mood', 2);
    return rehearsalOf(model, {
      persons: wholeOption(args, 'persons', 1),
      seed: seedOption(args),
      links: withLinks && typeof linkText === 'string' ? linksOfText(model, linkText) : [],
      method: analysis,
    });
  } catch (e) {
    if (e instanceof CliError) throw e;
    throw new CliError((e as Error).message, 2);
  }
}

const num = (x: number) => formatNumber(x, { digits: 3, ascii: true });
const dur = (model: Model) => (x: number) => formatDuration(x, model.timeUnit);

function designOf(r: Rehearsal) {
  const s = r.study;
  return { persons: r.persons, interval: s.interval, length: s.length, schedule: s.schedule, missedPrompts: s.missedPrompts ?? 0, seed: r.seed, timeUnit: r.timeUnit, plannedPerPerson: r.plannedPerPerson, answeredPerPerson: r.answeredPerPerson };
}

function powerText(model: Model, r: Rehearsal, res: PowerResult): string {
  const lines = [
    `${model.name}: power of the planned study (${res.method === 'analytic' ? 'analytic, pooled VAR(1) limit with sandwich variance' : `Monte Carlo, ${res.replications} simulated studies analysed by ${res.analysis === 'ct' ? 'the continuous-time fit (effects are drift entries, per unit of time)' : 'the VAR fit'}`})`,
    `  ${r.persons} persons, about ${Math.round(r.answeredPerPerson)} answered prompts each, α = ${r.alpha}`,
    '',
    `  ${'link'.padEnd(28)} ${'effect'.padStart(9)} ${'SE'.padStart(9)} ${'power'.padStart(7)}${res.method === 'montecarlo' ? ' ± MC error' : ` ${'centring'.padStart(9)} ${'expected'.padStart(9)}`}`,
  ];
  for (const l of res.links)
    lines.push(`  ${`${l.from} -> ${l.to}`.padEnd(28)} ${num(l.effect).padStart(9)} ${num(l.se).padStart(9)} ${num(l.power).padStart(7)}${l.mcError !== undefined ? ` ± ${num(l.mcError)}` : ''}${l.centringBias !== undefined ? ` ${num(l.centringBias).padStart(9)} ${num(l.expectedEstimate ?? NaN).padStart(9)}` : ''}`);
  if (res.method === 'analytic')
    lines.push('  (centring: the small-sample bias of person-mean centring at this many occasions, about −(1+φ)/(T−1) for an autoregression;', '   expected: the within-person estimate the analysis is expected to give, effect + centring)');
  lines.push('', trustSentence(r.answeredPerPerson));
  if (r.integrator) lines.push('The mechanism is nonlinear: power uses its linearization at equilibrium; simulate-study integrates its own rates (Euler–Maruyama).');
  if (res.note && res.method === 'montecarlo') lines.push('', res.note);
  lines.push('', CAUTION);
  return lines.join('\n');
}

function budgetOption(args: CliArgs, model: Model, r: Rehearsal): Budget {
  const v = args.options.budget;
  if (v === undefined) return { kind: 'prompts', prompts: r.plannedPerPerson };
  if (v === true) throw new CliError('--budget needs a value: prompts=70 or span="14 days"', 2);
  const m = /^\s*(prompts|span)\s*=\s*"?([^"]*)"?\s*$/.exec(v);
  if (!m) throw new CliError(`--budget "${v}": write prompts=70 or span="14 days"`, 2);
  if (m[1] === 'prompts') {
    const n = Number(m[2]);
    if (!Number.isInteger(n) || n < 3) throw new CliError(`--budget prompts: a whole number of at least 3 prompts per person is needed, not "${m[2]}"`, 2);
    return { kind: 'prompts', prompts: n };
  }
  const d = parseDuration(m[2], model.timeUnit);
  if (!d.ok) throw new CliError(`--budget span: ${d.message}`, 2);
  return { kind: 'span', span: d.value };
}

function valuesOption(args: CliArgs): number[] | undefined {
  const v = args.options.values;
  if (v === undefined) return undefined;
  if (v === true) throw new CliError('--values needs a list of whole numbers, e.g. --values 10,20,40', 2);
  return v.split(',').map((t) => {
    const n = Number(t.trim());
    if (t.trim() === '' || !Number.isInteger(n) || n < 1) throw new CliError(`--values: "${t.trim()}" is not a whole number of at least 1`, 2);
    return n;
  });
}

function planOtherAxis(model: Model, r: Rehearsal, over: 'persons' | 'prompts-per-day', values: number[] | undefined, json: boolean, out: (s: string) => void): number {
  let plan: AxisPlan;
  try {
    plan = over === 'persons' ? planPersons(r, { values, format: dur(model) }) : planPromptsPerDay(r, { values, format: dur(model) });
  } catch (e) {
    throw new CliError((e as Error).message, 2);
  }
  if (json) {
    out(JSON.stringify({ design: designOf(r), timeUnit: model.timeUnit, over, ...plan, method: 'analytic', note: 'analytic power (pooled VAR(1) limit): optimistic below about 100 answered occasions per person; check the chosen design with loopfold power --method montecarlo' }, null, 2));
    return 0;
  }
  const head = over === 'persons' ? 'persons' : 'a day';
  const lines = [`${model.name}: power against ${over === 'persons' ? 'the persons' : 'the prompts per day'} (analytic)`, ''];
  lines.push(`  ${head.padStart(8)} ${'prompts'.padStart(8)} ${'interval'.padStart(12)} ${r.links.map((l) => `${l.from}->${l.to}`.padStart(18)).join(' ')}`);
  for (const p of plan.points)
    lines.push(`  ${String(p.value).padStart(8)} ${String(p.prompts).padStart(8)} ${dur(model)(p.interval).padStart(12)} ${p.links.map((l) => `${num(l.power)} (${num(l.effect)})`.padStart(18)).join(' ')}${p === plan.recommended ? '  <- recommended' : ''}`);
  lines.push('  (power, with the lagged effect the analysis estimates in brackets; prompts planned per person)', '', plan.statement, 'Analytic power is optimistic below about 100 answered occasions per person: check the design with loopfold power --method montecarlo.', CAUTION);
  out(lines.join('\n'));
  return 0;
}

export const rehearseCommands: CliCommand[] = [
  {
    name: 'simulate-study',
    summary: 'one synthetic study of the file\'s study as a long CSV (person, day, prompt, time, states)',
    usage: 'MODEL.json [--persons N] [--seed S] --out FILE.csv',
    options: { persons: true, seed: true, out: true },
    run(args, io) {
      const model = loadModel(args, io);
      const out = args.options.out;
      if (out === undefined || out === true) throw new CliError('--out FILE.csv: name the file to write', 2);
      const r = rehearsal(model, args, false);
      let panel;
      try {
        panel = simulateStudy(r);
      } catch (e) {
        throw new CliError((e as Error).message);
      }
      io.writeFile(out, studyCsv(panel));
      const answered = panel.persons.reduce((a, p) => a + p.time.length, 0);
      io.out(`wrote ${out}: ${panel.persons.length} persons, ${answered} answered prompts, states ${panel.variables.join(', ')} (time in ${model.timeUnit}, seed ${r.seed}), simulated by ${simulatorText(r.integrator, dur(model))}. Synthetic data from the model, not observations.`);
      return 0;
    },
  },
  {
    name: 'power',
    summary: 'effect, standard error and power of each link for the file\'s study (analytic or Monte Carlo)',
    usage: 'MODEL.json --link from->to[,from->to] [--persons N] [--method analytic|montecarlo] [--analysis var|ct] [--replications K] [--seed S] [--json]',
    options: { link: true, persons: true, method: true, analysis: true, replications: true, seed: true, json: false },
    run(args, io) {
      const model = loadModel(args, io);
      const method = args.options.method ?? 'analytic';
      if (method !== 'analytic' && method !== 'montecarlo') throw new CliError(`--method: analytic or montecarlo, not "${method === true ? '' : method}"`, 2);
      if (args.options.analysis === 'ct' && method !== 'montecarlo') throw new CliError('--analysis ct: the continuous-time analysis is rehearsed by Monte Carlo only (add --method montecarlo); the analytic figure is for the VAR', 2);
      const r = rehearsal(model, args, true);
      let res: PowerResult;
      try {
        const k = wholeOption(args, 'replications', 1) ?? 200;
        // Progress on stderr about every tenth of a long run (stdout keeps the answer alone); Ctrl-C stops it.
        let told = 0;
        const progress = (done: number) => {
          if (k >= 100 && done - told >= k / 10 && done < k) {
            told = done;
            io.err(`loopfold power: ${done} of ${k} replications`);
          }
        };
        res = method === 'analytic' ? analyticPower(r) : monteCarloPower(r, k, { onProgress: progress });
      } catch (e) {
        if (e instanceof CliError) throw e;
        throw new CliError((e as Error).message);
      }
      if (args.options.json)
        io.out(JSON.stringify({ design: { ...designOf(r), method: res.method, ...(res.analysis ? { analysis: res.analysis } : {}), ...(res.replications !== undefined ? { replications: res.replications, failed: res.failed } : {}) }, links: res.links, trust: trustSentence(r.answeredPerPerson), ...(res.note ? { note: res.note } : {}) }, null, 2));
      else io.out(powerText(model, r, res));
      return 0;
    },
  },
  {
    name: 'plan',
    summary: 'power against the interval under a budget of prompts or span, and the design to recommend',
    usage: 'MODEL.json --link from->to [--budget prompts=70 | span="14 days"] [--over interval|persons|prompts-per-day] [--values 10,20,40] [--persons N] [--json]',
    options: { link: true, budget: true, persons: true, json: false, over: true, values: true },
    run(args, io) {
      const model = loadModel(args, io);
      const r = rehearsal(model, args, true);
      const over = args.options.over ?? 'interval';
      if (over !== 'interval' && over !== 'persons' && over !== 'prompts-per-day') throw new CliError(`--over: interval, persons or prompts-per-day, not "${over === true ? '' : over}"`, 2);
      if (over !== 'interval') return planOtherAxis(model, r, over, valuesOption(args), args.options.json === true, io.out);
      if (args.options.values !== undefined) throw new CliError('--values: only with --over persons or --over prompts-per-day (the intervals are a grid over the budget)', 2);
      const budget = budgetOption(args, model, r);
      let plan;
      try {
        plan = planStudy(r, budget, { format: dur(model) });
      } catch (e) {
        throw new CliError((e as Error).message);
      }
      if (args.options.json) {
        io.out(JSON.stringify({ design: designOf(r), timeUnit: model.timeUnit, ...plan, method: 'analytic', note: 'analytic power (pooled VAR(1) limit): optimistic below about 100 answered occasions per person; check the chosen design with loopfold power --method montecarlo' }, null, 2));
        return 0;
      }
      const lines = [`${model.name}: power against the interval, ${budget.kind === 'prompts' ? `${budget.prompts} prompts per person` : `a span of ${dur(model)(budget.span)}`}, ${r.persons} persons (analytic)`, ''];
      lines.push(`  ${'interval'.padStart(12)} ${'prompts'.padStart(8)} ${r.links.map((l) => `${l.from}->${l.to}`.padStart(18)).join(' ')}`);
      const step = Math.max(1, Math.floor(plan.curve.length / 15));
      plan.curve.forEach((p, k) => {
        if (k % step !== 0 && p !== plan.recommended) return;
        lines.push(`  ${dur(model)(p.interval).padStart(12)} ${String(p.prompts).padStart(8)} ${p.links.map((l) => `${num(l.power)} (${num(l.effect)})`.padStart(18)).join(' ')}${p === plan.recommended ? '  <- recommended' : ''}`);
      });
      lines.push('  (power, with the lagged effect the analysis estimates in brackets)', '');
      for (const pk of plan.peaks) lines.push(`  the lagged effect ${pk.from} -> ${pk.to} peaks near ${dur(model)(pk.interval)} (${num(pk.effect)})`);
      lines.push('', plan.statement, 'Analytic power is optimistic below about 100 answered occasions per person: check the design with loopfold power --method montecarlo.', CAUTION);
      io.out(lines.join('\n'));
      return 0;
    },
  },
];
