import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';
import { expectClose } from '../../helpers/tolerance';

async function run(argv: string[], files: Record<string, string> = {}): Promise<{ code: number; out: string; err: string }> {
  const m = memoryIo(files);
  const code = await runCli(argv, m.io);
  return { code, out: m.out.join('\n'), err: m.err.join('\n') };
}

interface Reference {
  data: Record<string, number[]>;
  adf: { series: string; regression: string; autolag: boolean; stat: number; p: number; lag: number }[];
  coint: { names: string[]; trend: string; stat: number; p: number; crit: number[] }[];
  johansen: { names: string[]; det: number; k: number; eig: number[]; trace: number[]; maxeig: number[] }[];
}

/** Reference: Debian's statsmodels on statsmodels.datasets.macrodata (tests/reference/coint.py). */
let ref: Reference;
let csv: string;
beforeAll(() => {
  const r = spawnSync('/usr/bin/python3', ['tests/reference/coint.py'], { input: '{}', encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(r.stderr);
  ref = JSON.parse(r.stdout) as Reference;
  csv = ['quarter,gdp,cons,inv', ...ref.data.gdp.map((g, i) => `${i + 1},${g},${ref.data.cons[i]},${ref.data.inv[i]}`)].join('\n');
}, 60_000);

describe('loopfold coint', () => {
  it('--json: ADF per series, Engle–Granger and Johansen equal statsmodels to 1e-6 on the macro data', async () => {
    const r = await run(['coint', 'm.csv', '--columns', 'cons,gdp', '--json'], { 'm.csv': csv });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { columns: string[]; adf: { series: string; statistic: number; pValue: number; usedLag: number }[]; engleGranger: { statistic: number; pValue: number; critical: Record<string, number>; dependent: string }; johansen: { eigenvalues: number[]; trace: number[]; maxEig: number[] }; errorCorrection: { trackers: string[]; leaders: string[] } | null; sentence: string };
    for (const a of j.adf) {
      const e = ref.adf.find((x) => x.series === a.series && x.regression === 'c' && x.autolag)!;
      expect(a.usedLag).toBe(e.lag);
      expectClose(a.statistic, e.stat, { relTol: 1e-6 }, `${a.series} τ`);
      expectClose(a.pValue, e.p, { relTol: 1e-6 }, `${a.series} p`);
    }
    const eg = ref.coint.find((c) => c.names.join() === 'cons,gdp' && c.trend === 'c')!;
    expect(j.engleGranger.dependent).toBe('cons');
    expectClose(j.engleGranger.statistic, eg.stat, { relTol: 1e-6 }, 'EG τ');
    expectClose(j.engleGranger.pValue, eg.p, { relTol: 1e-6 }, 'EG p');
    // 5 % and 10 % agree with statsmodels; at 1 % statsmodels uses the copy's β₂ = −33.527 (MacKinnon 2010 prints −22.527).
    expectClose([j.engleGranger.critical['5%'], j.engleGranger.critical['10%']], eg.crit.slice(1), { relTol: 1e-9 }, 'EG critical');
    expectClose(j.engleGranger.critical['1%'], -3.89644 - 10.9519 / 202 - 22.527 / 202 ** 2, { relTol: 1e-12 }, 'EG 1 % (paper)');
    const jo = ref.johansen.find((x) => x.names.join() === 'cons,gdp' && x.det === 0 && x.k === 1)!;
    expectClose(j.johansen.eigenvalues, jo.eig, { relTol: 1e-6 }, 'eig');
    expectClose(j.johansen.trace, jo.trace, { relTol: 1e-6 }, 'trace');
    expectClose(j.johansen.maxEig, jo.maxeig, { relTol: 1e-6 }, 'maxeig');
    // The statistic (−3.535) is below the 5 % value (−3.367): the loadings are reported with the sentence.
    expect(j.errorCorrection).not.toBeNull();
    expect(j.sentence).toMatch(/settled balance is determined by/);
  });

  it('text output names each test and ends with the tracking sentence', async () => {
    const r = await run(['coint', 'm.csv', '--columns', 'cons,gdp'], { 'm.csv': csv });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/Unit root \(augmented Dickey–Fuller/);
    expect(r.out).toMatch(/Engle–Granger \(cons on gdp\): τ −3\.535/);
    expect(r.out).toMatch(/Johansen \(1 lagged difference/);
    expect(r.out).toMatch(/(gdp tracks cons|cons tracks gdp): .*settled balance is determined by/);
  });

  it('three columns with --trend ct: Engle–Granger and Johansen (det_order 1) equal statsmodels; without cointegration the sentence says no balance is determined', async () => {
    const r = await run(['coint', 'm.csv', '--columns', 'cons,gdp,inv', '--trend', 'ct', '--json'], { 'm.csv': csv });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { engleGranger: { statistic: number; pValue: number; critical: Record<string, number>; cointegrated: boolean }; johansen: { trace: number[] }; errorCorrection: unknown; sentence: string };
    const eg = ref.coint.find((c) => c.names.join() === 'cons,gdp,inv' && c.trend === 'ct')!;
    expectClose(j.engleGranger.statistic, eg.stat, { relTol: 1e-6 }, 'EG τ');
    expectClose(j.engleGranger.pValue, eg.p, { relTol: 1e-6 }, 'EG p');
    expectClose([j.engleGranger.critical['1%'], j.engleGranger.critical['5%'], j.engleGranger.critical['10%']], eg.crit, { relTol: 1e-9 }, 'EG critical (Table 3 agrees with the copy)');
    const jo = ref.johansen.find((x) => x.names.join() === 'cons,gdp,inv' && x.det === 1 && x.k === 1)!;
    expectClose(j.johansen.trace, jo.trace, { relTol: 1e-6 }, 'trace');
    // statsmodels' τ lies above its 5 % value here: not cointegrated.
    expect(eg.stat).toBeGreaterThan(eg.crit[1]);
    expect(j.engleGranger.cointegrated).toBe(false);
    expect(j.errorCorrection).toBeNull();
    expect(j.sentence).toMatch(/^No cointegration at 5 % \(Engle–Granger τ = −\d.*cons, gdp and inv may drift apart/);
  });

  it('names a missing column, a non-numeric cell by row and column, and a bad option', async () => {
    let r = await run(['coint', 'm.csv', '--columns', 'cons,income'], { 'm.csv': csv });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/column "income" is not in the file's header \(columns: quarter, gdp, cons, inv\)/);
    r = await run(['coint', 'm.csv', '--columns', 'cons,gdp', '--person', 'firm'], { 'm.csv': csv });
    expect(r.err).toMatch(/person column "firm" is not in the file's header/);
    const bad = csv.split('\n');
    bad[5] = bad[5].replace(/,[^,]*$/, ',NA').replace(/^(\d+),[^,]*/, '$1,x1');
    r = await run(['coint', 'b.csv', '--columns', 'gdp,inv'], { 'b.csv': bad.join('\n') });
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/row 6, column gdp: "x1" is not a number; row 6, column inv: missing value/);
    expect(r.err).toMatch(/Nothing was tested/);
    r = await run(['coint', 'm.csv', '--columns', 'cons'], { 'm.csv': csv });
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--columns needs 2 to 6 columns/);
    r = await run(['coint', 'm.csv', '--columns', 'cons,gdp', '--trend', 'quadratic'], { 'm.csv': csv });
    expect(r.err).toMatch(/--trend must be c .* or ct/);
    r = await run(['coint', 'm.csv'], { 'm.csv': csv });
    expect(r.err).toMatch(/--columns a,b\[,c\] is required/);
  });

  it('--person: each person tested on its own rows (equal to statsmodels on the same slices) and summarised', async () => {
    const rows = csv.split('\n');
    const person = ['who,' + rows[0], ...rows.slice(1, 101).map((l) => `early,${l}`), ...rows.slice(101).map((l) => `late,${l}`), 'tiny,1,1,1,1', 'tiny,2,2,2,2'];
    const r = await run(['coint', 'p.csv', '--columns', 'cons,gdp', '--person', 'who', '--json'], { 'p.csv': person.join('\n') });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { pooled: { persons: number; tested: number; skipped: { id: string; reason: string }[]; engleGranger: { rejected: number; fisherP: number }; adf: { series: string; rejected: number }[] }; perPerson: { id: string; engleGranger: { statistic: number; pValue: number } }[] };
    expect(j.pooled.persons).toBe(3);
    expect(j.pooled.tested).toBe(2);
    expect(j.pooled.skipped[0].id).toBe('tiny');
    expect(j.pooled.skipped[0].reason).toMatch(/too few/);
    // Reference: statsmodels coint on rows 1–100 and 101–203 (Debian's python).
    const py = spawnSync('/usr/bin/python3', ['-c', `
import json, sys, numpy as np
from statsmodels.tsa.stattools import coint
from scipy.stats import chi2
d = json.load(sys.stdin)
c, g = np.array(d['cons']), np.array(d['gdp'])
out = [coint(c[a:b], g[a:b], trend='c', autolag='aic')[:2] for a, b in ((0, 100), (100, len(c)))]
fisher = chi2.sf(-2 * sum(np.log(p) for _, p in out), 4)
print(json.dumps({'eg': [list(map(float, o)) for o in out], 'fisher': float(fisher)}))
`], { input: JSON.stringify(ref.data), encoding: 'utf8' });
    expect(py.status, py.stderr).toBe(0);
    const e = JSON.parse(py.stdout) as { eg: number[][]; fisher: number };
    j.perPerson.forEach((p, i) => {
      expectClose(p.engleGranger.statistic, e.eg[i][0], { relTol: 1e-6 }, `${p.id} τ`);
      expectClose(p.engleGranger.pValue, e.eg[i][1], { relTol: 1e-6 }, `${p.id} p`);
    });
    // Fisher's combination −2 Σ ln p ~ χ²(4) against scipy.stats.chi2.sf.
    expectClose(j.pooled.engleGranger.fisherP, e.fisher, { relTol: 1e-8 }, 'Fisher');
  });

  it('the warehouse demo (scripts/demo-coint.ts: stock generated to close a quarter of its gap to 1.5 × orders + 20 each week, orders a random walk) shows stock tracking orders', async () => {
    const r = await run(['coint', 'public/demo/warehouse-weeks.csv', '--columns', 'stock,orders', '--person', 'warehouse', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { pooled: { tested: number; trackers: { series: string; persons: number }[] }; perPerson: { id: string; engleGranger: { coefficients: number[] } }[] };
    expect(j.pooled.tested).toBe(3);
    expect(j.pooled.trackers).toEqual([{ series: 'stock', persons: 3 }, { series: 'orders', persons: 0 }]);
    // The generator's balance is stock = 1.5·orders + 20; over 200 weeks the static slope is biased toward zero
    // (stock lags orders), so only its sign is checked here.
    for (const p of j.perPerson) expect(p.engleGranger.coefficients[0], p.id).toBeGreaterThan(0);
    const text = await run(['coint', 'public/demo/warehouse-weeks.csv', '--columns', 'stock,orders', '--person', 'warehouse']);
    expect(text.out).toMatch(/stock, orders per warehouse \(3 of 3 tested/);
    expect(text.out).toMatch(/warehouse north \(200 occasions\)/);
  });
});
