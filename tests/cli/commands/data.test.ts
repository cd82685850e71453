import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';
import { simulateCt } from '../../../src/core/fit/simulate';
import { seededRandom } from '../../../src/core/stats/random';
import { expectClose } from '../../helpers/tolerance';

const MODEL = 'src/examples/sleep-stress.json';

async function run(argv: string[], files: Record<string, string> = {}): Promise<{ code: number; out: string; err: string }> {
  const m = memoryIo(files);
  const code = await runCli(argv, m.io);
  return { code, out: m.out.join('\n'), err: m.err.join('\n') };
}

function diary(): string {
  const g = seededRandom(4);
  const r = (): number => g.uniform();
  const times = Array.from({ length: 12 }, () => { let t = 0; return Array.from({ length: 30 }, () => (t += 1 + r() * 2)); });
  const panel = simulateCt({ states: ['stress', 'mood'], drift: [[-1.2, -0.3], [-0.2, -0.4]], diffusion: [[1, 0], [0, 0.5]], levels: [3, 5], between: [[0.3, 0], [0, 0.3]] }, times, { seed: 9, missing: 0.05 });
  const lines = ['pid,hours,stress,mood'];
  panel.persons.forEach((p) => p.time.forEach((t, k) => lines.push([p.id, t.toFixed(4), p.values[k * 2].toFixed(4), Number.isFinite(p.values[k * 2 + 1]) ? p.values[k * 2 + 1].toFixed(4) : 'NA'].join(','))));
  return lines.join('\n');
}

describe('data and fit commands', () => {
  it('data --json lists refused rows by row and column', async () => {
    const csv = 'pid,hours,stress\na,1,2\na,1,3\nb,x,1\nb,2,oops\nc,3\n';
    const r = await run(['data', 'd.csv', '--person', 'pid', '--time', 'hours', '--json'], { 'd.csv': csv });
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { kept: number; refused: number; issues: { row: number; column?: string; action: string }[] };
    expect(j.kept).toBe(2);
    expect(j.refused).toBe(3);
    expect(j.issues.map((i) => [i.row, i.column ?? null, i.action])).toEqual(expect.arrayContaining([[4, 'hours', 'row refused'], [5, 'stress', 'cell set missing'], [6, null, 'row refused'], [3, 'hours', 'row refused']]));
  });

  it('fit --method var --json has the documented shape, and its φ equals statsmodels OLS on the same person-mean-centred pairs', async () => {
    const csv = diary();
    const r = await run(['fit', MODEL, '--data', 'd.csv', '--person', 'pid', '--time', 'hours', '--map', 'stress=stress,mood=mood', '--json'], { 'd.csv': csv });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { method: string; states: string[]; phi: number[][]; residualCov: number[][]; se: { phi: number[][] }; n: { persons: number; occasions: number }; comparison: { from: string; to: string; sketch: number; estimate: number; low: number; high: number; verdict: string }[] };
    expect(j.method).toBe('var');
    expect(j.states).toEqual(['stress', 'mood']);
    expect(j.n).toMatchObject({ persons: 12, occasions: 360 });
    expect(j.comparison).toHaveLength(4);
    for (const c of j.comparison) expect(Object.keys(c).sort()).toEqual(['estimate', 'from', 'high', 'low', 'sketch', 'to', 'verdict']);
    // Reference: statsmodels OLS with cluster-robust SEs (Debian's python).
    const ref = spawnSync('/usr/bin/python3', ['-c', `
import sys, json, io
import numpy as np, pandas as pd, statsmodels.api as sm
d = pd.read_csv(io.StringIO(sys.stdin.read()))
X, Y, G = [], [], []
for g, (pid, s) in enumerate(d.groupby('pid', sort=False)):
    v = s.sort_values('hours')[['stress', 'mood']].to_numpy()
    c = v - np.nanmean(v, axis=0)
    ok = ~np.isnan(c[:-1]).any(axis=1) & ~np.isnan(c[1:]).any(axis=1)
    X.append(c[:-1][ok]); Y.append(c[1:][ok]); G += [g] * int(ok.sum())
X = np.vstack(X); Y = np.vstack(Y)
out = [[list(sm.OLS(Y[:, i], X).fit().params), list(sm.OLS(Y[:, i], X).fit(cov_type='cluster', cov_kwds={'groups': np.array(G)}).bse)] for i in range(2)]
print(json.dumps(out))
`], { input: csv, encoding: 'utf8' });
    expect(ref.status, ref.stderr).toBe(0);
    const o = JSON.parse(ref.stdout) as [number[], number[]][];
    expectClose(j.phi, o.map((x) => x[0]), { relTol: 1e-9, absTol: 1e-12 }, 'phi');
    expectClose(j.se.phi, o.map((x) => x[1]), { relTol: 1e-9 }, 'cluster se');
  });

  it('fit --method ct --json gives drift, diffusion, intercepts, SEs, −2LL, AIC/BIC, a likelihood-ratio test and the comparison', async () => {
    const r = await run(['fit', MODEL, '--data', 'd.csv', '--person', 'pid', '--time', 'hours', '--map', 'stress=stress,mood=mood', '--method', 'ct', '--initial', 'stationary', '--json'], { 'd.csv': diary() });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as Record<string, unknown> & { drift: number[][]; se: { drift: number[][] }; minus2LL: number; aic: number; bic: number; lr: { df: number } };
    for (const k of ['method', 'states', 'drift', 'diffusion', 'intercepts', 'se', 'minus2LL', 'aic', 'bic', 'n', 'comparison']) expect(j).toHaveProperty(k);
    expect(j.aic).toBeGreaterThan(j.minus2LL);
    // The sketch's stress–mood block is full (mood → stress through rumination, stress → mood directly): nothing to restrict.
    expect(j.lr.df).toBe(0);
    // The whole ordering at the data's interval: the sketch's and the fitted model's, from the same ordering core.
    const o = j.ordering as { interval: number; window: number; sketch: { roles: Record<string, string> }; fitted: { roles: Record<string, string> }; links: { from: string; to: string; low: number; high: number }[] };
    expect(o.interval).toBeGreaterThan(1);
    expect(o.interval).toBeLessThan(3);
    expect(Object.keys(o.fitted.roles).sort()).toEqual(['mood', 'stress']);
    expect(o.sketch.roles).toHaveProperty('stress');
    for (const l of o.links) expect(l.low > 0 || l.high < 0).toBe(true);
  }, 600_000);

  it('fit --method var --person-fits gives each person their own VAR(1) with a constant, equal to statsmodels VAR on the series of that person', async () => {
    // A diary without missing cells, so that each person's lag pairs are the consecutive rows statsmodels uses.
    const g = seededRandom(14);
    const r0 = (): number => g.uniform();
    const times = [40, 40, 8].map((T) => { let t = 0; return Array.from({ length: T }, () => (t += 1 + r0())); });
    const panel = simulateCt({ states: ['stress', 'mood'], drift: [[-1.2, -0.3], [-0.2, -0.4]], diffusion: [[1, 0], [0, 0.5]], levels: [3, 5] }, times, { seed: 15 });
    const lines = ['pid,hours,stress,mood'];
    panel.persons.forEach((p) => p.time.forEach((t, k) => lines.push([p.id, t.toFixed(4), p.values[k * 2].toFixed(6), p.values[k * 2 + 1].toFixed(6)].join(','))));
    const csv = lines.join('\n');
    const r = await run(['fit', MODEL, '--data', 'd.csv', '--person', 'pid', '--time', 'hours', '--map', 'stress=stress,mood=mood', '--person-fits', '--min-pairs', '20', '--json'], { 'd.csv': csv });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { perPerson: { minPairs: number; fits: { person: string; pairs: number; phi: number[][]; intercept: number[]; se: number[][]; residualCov: number[][] }[]; notFitted: string[] } };
    expect(j.perPerson.fits.map((f) => [f.person, f.pairs])).toEqual([[panel.persons[0].id, 39], [panel.persons[1].id, 39]]);
    expect(j.perPerson.notFitted).toEqual([panel.persons[2].id]);
    // Reference: statsmodels.tsa.api.VAR(...).fit(1) (trend 'c') on the first person's series (Debian's python).
    const ref = spawnSync('/usr/bin/python3', ['-c', `
import sys, json, io
import pandas as pd
from statsmodels.tsa.api import VAR
d = pd.read_csv(io.StringIO(sys.stdin.read()))
s = d[d.pid == d.pid.iloc[0]].sort_values('hours')[['stress', 'mood']].to_numpy()
f = VAR(s).fit(1)
print(json.dumps({'phi': f.coefs[0].tolist(), 'const': f.intercept.tolist(), 'se': f.stderr[1:].T.tolist(), 'sigma_u': f.sigma_u.tolist()}))
`], { input: csv, encoding: 'utf8' });
    expect(ref.status, ref.stderr).toBe(0);
    const o = JSON.parse(ref.stdout) as { phi: number[][]; const: number[]; se: number[][]; sigma_u: number[][] };
    const mine = j.perPerson.fits[0];
    expectClose(mine.phi, o.phi, { relTol: 1e-8, absTol: 1e-12 }, 'phi');
    expectClose(mine.intercept, o.const, { relTol: 1e-8, absTol: 1e-12 }, 'intercept');
    expectClose(mine.se, o.se, { relTol: 1e-8 }, 'se');
    expectClose(mine.residualCov, o.sigma_u, { relTol: 1e-8 }, 'sigma_u');
  });

  it('wide files take the waves\' times from --waves in a unit: the fit equals the same data written long with those times', async () => {
    // 30 lakes visited 2014, 2015, 2017, 2020 (unequal years apart); the lake model counts time in days.
    const years = [2014, 2015, 2017, 2020];
    const perDay = (y: number) => (y - years[0]) * 365.25;
    const panel = simulateCt({ states: ['fish', 'sediment'], drift: [[-0.002, 0], [0.0008, -0.0015]], diffusion: [[0.004, 0], [0, 0.003]], levels: [12, 5], between: [[0.5, 0], [0, 0.3]] }, Array.from({ length: 30 }, () => years.map(perDay)), { seed: 5, missing: 0.05 });
    const cell = (v: number) => (Number.isFinite(v) ? v.toFixed(4) : '');
    const wide = [['lake', ...years.flatMap((_, k) => [`fish_${k + 1}`, `sediment_${k + 1}`])].join(',')];
    const long = ['lake,years,fish,sediment'];
    panel.persons.forEach((p) => {
      wide.push([p.id, ...years.flatMap((_, k) => [cell(p.values[k * 2]), cell(p.values[k * 2 + 1])])].join(','));
      years.forEach((y, k) => long.push([p.id, String(y - years[0]), cell(p.values[k * 2]), cell(p.values[k * 2 + 1])].join(',')));
    });
    const files = { 'w.csv': wide.join('\n'), 'l.csv': long.join('\n') };
    const d = await run(['data', 'w.csv', 'src/examples/lake.json', '--waves', '2014,2015,2017,2020', '--time-unit', 'year', '--json'], files);
    expect(d.code, d.err).toBe(0);
    const dj = JSON.parse(d.out) as { kept: number; mapping: { waves: { time: { value: number } }[] }; summary: { notes: string[] } };
    expect(dj.kept).toBe(120);
    expect(dj.mapping.waves.map((w) => w.time.value)).toEqual([0, 1, 3, 6]);
    expect(dj.summary.notes.join(' ')).not.toMatch(/no time columns/);
    const fit = async (argv: string[]) => {
      const r = await run(['fit', 'src/examples/lake.json', ...argv, '--method', 'ct', '--open', '--initial', 'stationary', '--json'], files);
      expect(r.code, r.err).toBe(0);
      return JSON.parse(r.out) as { minus2LL: number; drift: number[][]; n: { occasions: number }; ordering: { interval: number } };
    };
    const w = await fit(['--data', 'w.csv', '--waves', '0,1,3,6', '--time-unit', 'year']);
    const l = await fit(['--data', 'l.csv', '--person', 'lake', '--time', 'years', '--time-unit', 'year']);
    expect(w.n.occasions).toBe(l.n.occasions);
    expectClose(w.minus2LL, l.minus2LL, { relTol: 1e-9 }, '−2LL wide against long');
    expectClose(w.drift, l.drift, { relTol: 1e-6, absTol: 1e-9 }, 'drift wide against long');
    // Intervals of 1, 2 and 3 years, 30 of each: the median is 2 years in days (365.25 days a year: the Julian year, common practice for a year as a unit).
    expectClose(w.ordering.interval, 2 * 365.25, {}, 'interval');
    // Without --waves the waves would be read as equally spaced: the command says so.
    const bare = await run(['data', 'w.csv', 'src/examples/lake.json'], files);
    expect(bare.out).toMatch(/no time columns and no --waves.*read as 0, 1, 2, 3 day apart/);
    // Bad --waves are named: a count that does not match, a non-number, times that do not increase, a long file.
    expect((await run(['data', 'w.csv', 'src/examples/lake.json', '--waves', '0,1,3'], files)).err).toMatch(/gives 3 times but the file has 4 waves \(wave 1: fish_1, sediment_1;/);
    expect((await run(['data', 'w.csv', 'src/examples/lake.json', '--waves', '0,1,x,6'], files)).err).toMatch(/"x" \(wave 3\) is not a number/);
    expect((await run(['data', 'w.csv', 'src/examples/lake.json', '--waves', '0,3,3,6'], files)).err).toMatch(/wave 3's time 3 is not after wave 2's 3/);
    expect((await run(['data', 'l.csv', 'src/examples/lake.json', '--waves', '0,1,3,6'], files)).err).toMatch(/--waves is for wide files/);
  }, 600_000);

  it('refuses --min-pairs below 3 naming the option', async () => {
    const r = await run(['fit', MODEL, '--data', 'd.csv', '--person', 'pid', '--time', 'hours', '--map', 'stress=stress,mood=mood', '--person-fits', '--min-pairs', '1'], { 'd.csv': diary() });
    expect(r.code).not.toBe(0);
    expect(r.err).toMatch(/--min-pairs must be a whole number of at least 3/);
  });

  it('refuses a bad option with a one-line reason', async () => {
    const r = await run(['fit', MODEL, '--data', 'd.csv', '--method', 'xyz'], { 'd.csv': 'pid,hours,stress\n' });
    expect(r.code).not.toBe(0);
    expect(r.err).toMatch(/--method must be var or ct/);
  });
});
