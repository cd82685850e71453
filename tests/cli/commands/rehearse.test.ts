import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { importText } from '../../../src/core/data/import';
import { parseModelText } from '../../../src/core/model/schema';
import { rehearsalOf, simulateStudy } from '../../../src/core/rehearse/setup';
import { memoryIo } from '../../helpers/cli';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

// An invented two-state greenhouse sketch (air heat drives leaf damp, damp cools the air), hourly prompts.
const MODEL = 'tests/fixtures/rehearse/greenhouse-air.json';
const REF = 'tests/reference/rehearse_design.py';

async function run(argv: string[], files: Record<string, string> = {}) {
  const m = memoryIo(files);
  const code = await runCli(argv, m.io);
  return { code, out: m.out.join('\n'), err: m.err.join('\n'), files: m.files };
}

function model() {
  const r = parseModelText(readFileSync(MODEL, 'utf8'));
  if (!r.ok) throw new Error('fixture does not load');
  return r.model;
}

type Ref = { phi: number[][]; se: number; power: number; peak: number; best: number };
function reference(persons: number, pairs: number): Ref {
  const r = rehearsalOf(model(), { persons });
  const drift = Array.from({ length: 2 }, (_, i) => Array.from(r.process.base.drift.data.subarray(2 * i, 2 * i + 2)));
  // heat = state 0, damp = state 1: the link heat -> damp is φ[1][0].
  return runPython<Ref>(REF, { drift, noise: Array.from(r.process.base.noise), delta: 1, pairs, persons, target: r.process.states.indexOf('damp'), source: r.process.states.indexOf('heat'), alpha: 0.05, bounds: [0.05, 50] });
}

describe('loopfold simulate-study', () => {
  it('writes a long CSV that the importer reads back to the same numbers', async () => {
    const r = await run(['simulate-study', MODEL, '--persons', '4', '--seed', '12', '--out', 's.csv']);
    expect(r.code).toBe(0);
    const csv = r.files['s.csv'];
    expect(csv.split('\r\n')[0]).toBe('person,day,prompt,time,heat,damp');
    const imp = importText(csv, { format: 'long', person: 'person', time: 'time', day: 'day', prompt: 'prompt', timeFormat: 'number', timeUnit: 'h', variables: [{ column: 'heat', variable: 'heat' }, { column: 'damp', variable: 'damp' }] });
    expect(imp.summary.refused).toBe(0);
    const truth = simulateStudy(rehearsalOf(model(), { persons: 4, seed: 12 }));
    expect(imp.panel!.persons.map((p) => p.id)).toEqual(truth.persons.map((p) => p.id));
    imp.panel!.persons.forEach((p, k) => {
      expect(Array.from(p.time)).toEqual(Array.from(truth.persons[k].time));
      expect(Array.from(p.values)).toEqual(Array.from(truth.persons[k].values));
      expect(Array.from(p.day ?? [])).toEqual(Array.from(truth.persons[k].day ?? []));
    });
    expect((await run(['simulate-study', MODEL])).err).toMatch(/--out FILE.csv/);
    expect(r.out).toMatch(/exact discrete model/);
  });

  it('a nonlinear model (the warehouse example) is integrated by Euler–Maruyama, says so, and reads back unchanged', async () => {
    const r = await run(['simulate-study', 'src/examples/warehouse.json', '--persons', '2', '--out', 'w.csv']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Euler–Maruyama .* steps of at most .* \(1\/20 of the fastest timescale/);
    const imp = importText(r.files['w.csv'], { format: 'long', person: 'person', time: 'time', day: 'day', prompt: 'prompt', timeFormat: 'number', timeUnit: 'day', variables: [{ column: 'pipeline', variable: 'pipeline' }, { column: 'inventory', variable: 'inventory' }] });
    expect(imp.summary.refused).toBe(0);
    const m = parseModelText(readFileSync('src/examples/warehouse.json', 'utf8'));
    if (!m.ok) throw new Error('example does not load');
    const truth = simulateStudy(rehearsalOf(m.model, { persons: 2 }));
    imp.panel!.persons.forEach((p, k) => expect(Array.from(p.values)).toEqual(Array.from(truth.persons[k].values)));
  });
});

describe('loopfold power', () => {
  it('analytic: effect Φ(Δ) and the textbook SE √(Σu,ii (Σ⁻¹)jj / (T N)) computed by SciPy (Lütkepohl 2005, Prop. 3.1)', async () => {
    const ref = reference(3, 119);
    const r = await run(['power', MODEL, '--link', 'Air heat->damp', '--persons', '3', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { design: { persons: number }; links: { from: string; to: string; effect: number; se: number; power: number }[] };
    expect(j.design.persons).toBe(3);
    expect(j.links[0].from).toBe('heat');
    expectClose(j.links[0].effect, ref.phi[1][0], { relTol: 1e-8 }, 'effect');
    expectClose(j.links[0].se, ref.se, { relTol: 1e-8 }, 'se');
    expectClose(j.links[0].power, ref.power, { relTol: 1e-8 }, 'power');
    expect(ref.power).toBeGreaterThan(0.3);
    expect(ref.power).toBeLessThan(0.95);
  });

  it('Monte Carlo agrees with the SciPy figure within its Monte Carlo error, and reports that error as √(p(1−p)/K) (common practice)', async () => {
    const ref = reference(3, 119);
    const K = 300;
    const r = await run(['power', MODEL, '--link', 'heat->damp', '--persons', '3', '--method', 'montecarlo', '--replications', String(K), '--seed', '5', '--json']);
    expect(r.code).toBe(0);
    const l = (JSON.parse(r.out) as { links: { effect: number; se: number; power: number; mcError: number }[] }).links[0];
    expectClose(l.mcError, Math.sqrt((l.power * (1 - l.power)) / K), { relTol: 1e-12 }, 'mcError');
    // Progress goes to stderr, about every tenth of the run; stdout holds the JSON alone.
    expect(r.err).toMatch(/loopfold power: \d+ of 300 replications/);
    // 3 Monte Carlo errors, plus 0.04 for the small-sample bias of person-mean centring at T = 119 (Nickell 1981: O(1/T)).
    expect(Math.abs(l.power - ref.power)).toBeLessThan(3 * Math.sqrt((ref.power * (1 - ref.power)) / K) + 0.04);
    expect(Math.abs(l.se - ref.se)).toBeLessThan(0.15 * ref.se);
    // The mean estimate against the analytic expected within-person estimate (the pooled limit plus the bias of centring).
    const an = JSON.parse((await run(['power', MODEL, '--link', 'heat->damp,damp->damp', '--persons', '3', '--json'])).out) as { trust: string; links: { effect: number; centringBias: number; expectedEstimate: number }[] };
    expectClose(an.links[0].expectedEstimate, an.links[0].effect + an.links[0].centringBias, { relTol: 1e-12 }, 'expected = effect + bias');
    expect(Math.abs(l.effect - an.links[0].expectedEstimate)).toBeLessThan(3 * l.se / Math.sqrt(K));
    // The autoregression's bias is about Nickell's −(1+φ)/(T−1) at T = 120 occasions (large-T form; common result).
    const phiDD = an.links[1].effect;
    expect(Math.abs(an.links[1].centringBias / (-(1 + phiDD) / 119) - 1)).toBeLessThan(0.15);
    expect(an.trust).toMatch(/Which to trust/);
  }, 120_000);

  it('Monte Carlo with the continuous-time analysis: the mean drift estimate recovers the drift the studies were simulated from', async () => {
    const K = 8;
    const r = await run(['power', MODEL, '--link', 'heat->damp', '--persons', '5', '--method', 'montecarlo', '--analysis', 'ct', '--replications', String(K), '--seed', '2', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { design: { analysis: string }; links: { effect: number; se: number; power: number }[] };
    expect(j.design.analysis).toBe('ct');
    const truth = rehearsalOf(model(), { persons: 5 }).process.base.drift;
    const a = truth.data[1 * 2 + 0]; // effect of heat on the rate of damp
    // Maximum likelihood is consistent, not unbiased at this size: 4 Monte Carlo errors plus 0.03.
    expect(Math.abs(j.links[0].effect - a)).toBeLessThan(4 * j.links[0].se / Math.sqrt(K) + 0.03);
    expect((await run(['power', MODEL, '--link', 'heat->damp', '--analysis', 'ct'])).err).toMatch(/--analysis ct: .* Monte Carlo only/);
    expect((await run(['power', MODEL, '--link', 'heat->damp', '--method', 'montecarlo', '--analysis', 'sem'])).err).toMatch(/--analysis: var or ct/);
  }, 120_000);

  it('names what is wrong with the flags', async () => {
    expect((await run(['power', MODEL, '--link', 'heat->sun'])).err).toMatch(/"sun" is not a variable of the model/);
    expect((await run(['power', MODEL])).err).toMatch(/--link/);
    expect((await run(['power', MODEL, '--link', 'heat->damp', '--method', 'guess'])).err).toMatch(/--method/);
    expect((await run(['power', MODEL, '--link', 'heat->damp', '--persons', '0'])).err).toMatch(/--persons/);
    expect((await run(['plan', MODEL, '--link', 'heat->damp', '--budget', 'coins=3'])).err).toMatch(/--budget "coins=3"/);
  });
});

describe('loopfold plan', () => {
  it('recommends an interval shorter than the peak of the lagged effect under a budget of prompts (peak and optimum by SciPy)', async () => {
    const ref = reference(20, 39);
    const r = await run(['plan', MODEL, '--link', 'heat->damp', '--budget', 'prompts=40', '--persons', '20', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { recommended: { interval: number; prompts: number } | null; peaks: { interval: number }[]; curve: { interval: number }[] };
    expect(j.recommended).not.toBeNull();
    expect(j.recommended!.prompts).toBe(40);
    expect(j.recommended!.interval).toBeLessThan(ref.peak);
    const step = j.curve[1].interval / j.curve[0].interval;
    expect(Math.abs(Math.log(j.recommended!.interval / ref.best))).toBeLessThan(Math.log(step));
    expect(Math.abs(Math.log(j.peaks[0].interval / ref.peak))).toBeLessThan(Math.log(step));
    const text = await run(['plan', MODEL, '--link', 'heat->damp', '--budget', 'span="2 days"', '--persons', '1']);
    expect(text.out).toMatch(/No affordable design reaches 80 % power .* heat->damp fails/);
  });
});

describe('loopfold plan --over', () => {
  it('over persons: the power at each number of persons is the textbook figure (SciPy) and the fewest that reach 80 % are recommended', async () => {
    const r = await run(['plan', MODEL, '--link', 'heat->damp', '--over', 'persons', '--values', '3,6,12', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { over: string; points: { value: number; minPower: number }[]; recommended: { value: number } | null };
    expect(j.over).toBe('persons');
    const ref = [3, 6, 12].map((n) => reference(n, 119).power);
    j.points.forEach((p, k) => expect(Math.abs(p.minPower - ref[k])).toBeLessThan(1e-8));
    const first = [3, 6, 12][ref.findIndex((p) => p >= 0.8)];
    expect(j.recommended?.value ?? null).toBe(first ?? null);
    const text = await run(['plan', MODEL, '--link', 'heat->damp', '--over', 'persons', '--values', '3,6,12']);
    expect(text.out).toContain('<- recommended');
  });

  it('names the flag when --over or --values is wrong, and a fixed schedule has no prompts per day', async () => {
    expect((await run(['plan', MODEL, '--link', 'heat->damp', '--over', 'weeks'])).err).toMatch(/--over: interval, persons or prompts-per-day, not "weeks"/);
    expect((await run(['plan', MODEL, '--link', 'heat->damp', '--over', 'persons', '--values', '3,x'])).err).toMatch(/--values: "x" is not a whole number/);
    expect((await run(['plan', MODEL, '--link', 'heat->damp', '--values', '3'])).err).toMatch(/--values: only with --over/);
    const ppd = await run(['plan', MODEL, '--link', 'heat->damp', '--over', 'prompts-per-day']);
    expect(ppd.code).toBe(2);
    expect(ppd.err).toMatch(/schedule is "fixed"; prompts per day can be compared only/);
  });

  it('over prompts per day on the sleep–stress study: more prompts a day, more prompts per person over the same 14 days', async () => {
    const r = await run(['plan', 'src/examples/sleep-stress.json', '--link', 'sleepDebt->mood', '--over', 'prompts-per-day', '--values', '2,5,8', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { points: { value: number; prompts: number }[]; statement: string };
    expect(j.points.map((p) => p.prompts)).toEqual([28, 70, 112]); // 14 days × k
    expect(j.statement).toMatch(/^(Recommended|No design)/);
  });
});
