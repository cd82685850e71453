import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { memoryIo } from '../../helpers/cli';
import { decimals, expectClose } from '../../helpers/tolerance';
import { runPython } from '../../helpers/python';
import { chainMatrices, chainModel } from '../../core/pictures/fixtures';

const FILE = 'chain.json';
// The file carries no person differences (file version 1); --person-sd gives them.
const files = () => ({ [FILE]: JSON.stringify(chainModel(0.3, 0)), 'ranged.json': JSON.stringify({ ...chainModel(0.3, 0), variables: chainModel(0.3, 0).variables.map((v) => (v.id === 's4' ? { ...v, timescale: { low: 1, high: 6 } } : v)) }) });

async function run(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const m = memoryIo(files(), { disk: true });
  const code = await runCli(argv, m.io);
  return { code, out: m.out.join('\n'), err: m.err.join('\n') };
}

describe('factor, rank and order --uncertain', () => {
  it('factor --json: the covariance printed, fitted again by statsmodels, gives the same loadings, χ² and RMSEA', async () => {
    const r = await run(['factor', FILE, '--interval', '3h', '--samples', '70', '--persons', '150', '--level', 'cross', '--person-sd', 'load=0.5', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { level: string; covariance: number[][]; loadings: number[][]; uniqueness: number[]; chi2: number; df: number; rmsea: number; eigenvalues: number[]; n: number };
    expect(j.level).toBe('cross');
    expect(j.n).toBe(150);
    expect(j.df).toBe(2);
    const ref = spawnSync('/usr/bin/python3', ['tests/reference/pictures_factor.py'], { input: JSON.stringify({ cases: [{ cov: j.covariance, k: 1, n: 150 }] }), encoding: 'utf8' });
    expect(ref.status, ref.stderr).toBe(0);
    const s = (JSON.parse(ref.stdout) as { loadings: number[][]; chi2: number; rmsea: number; eigenvalues: number[] }[])[0];
    expectClose(j.loadings, s.loadings, { relTol: 0, absTol: 1e-4 }, 'loadings');
    expectClose(j.chi2, s.chi2, { relTol: 1e-4, absTol: 1e-4 }, 'χ²');
    expectClose(j.rmsea, s.rmsea, { relTol: 0, absTol: 1e-4 }, 'RMSEA');
    expectClose(j.eigenvalues, s.eigenvalues, { relTol: 1e-10 }, 'eigenvalues');
  });

  it('factor --level within|between --factors 1 --json: the fields of the answer, and statsmodels on the printed covariance agrees', async () => {
    for (const level of ['within', 'between'] as const) {
      const r = await run(['factor', FILE, '--interval', '3h', '--samples', '70', '--persons', '150', '--level', level, '--factors', '1', '--person-sd', 'load=0.5', '--json']);
      expect(r.code, r.err).toBe(0);
      const j = JSON.parse(r.out) as { level: string; covariance: number[][]; loadings: number[][]; uniqueness: number[]; chi2: number; df: number; rmsea: number; eigenvalues: number[]; n: number; factors: number };
      for (const k of ['level', 'covariance', 'loadings', 'uniqueness', 'chi2', 'df', 'rmsea', 'eigenvalues']) expect(j, k).toHaveProperty(k);
      expect(j.level).toBe(level);
      expect(j.factors).toBe(1);
      expect(j.loadings.every((row) => row.length === 1)).toBe(true);
      // N per level (docs/dev/pictures.md): persons × (prompts − 1) within, persons between.
      expect(j.n).toBe(level === 'within' ? 150 * 69 : 150);
      const ref = spawnSync('/usr/bin/python3', ['tests/reference/pictures_factor.py'], { input: JSON.stringify({ cases: [{ cov: j.covariance, k: 1, n: j.n }] }), encoding: 'utf8' });
      expect(ref.status, ref.stderr).toBe(0);
      const s = (JSON.parse(ref.stdout) as { loadings: number[][]; uniqueness: number[]; chi2: number; rmsea: number }[])[0];
      expectClose(j.loadings, s.loadings, { relTol: 0, absTol: 1e-4 }, `${level} loadings`);
      expectClose(j.uniqueness, s.uniqueness, { relTol: 0, absTol: 1e-4 }, `${level} uniqueness`);
      expectClose(j.chi2, s.chi2, { relTol: 1e-4, absTol: 1e-4 }, `${level} χ²`);
      expectClose(j.rmsea, s.rmsea, { relTol: 0, absTol: 1e-4 }, `${level} RMSEA`);
    }
    // Without --samples the prompts come from the file's study through the core (studyPrompts): a daily window of
    // 5 prompts for 14 days plans 70 prompts (counted by hand), not 14 days / 2.4 h = 140.
    const study = { interval: '2.4 h', length: '14 days', schedule: { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'stratified-random' }, persons: 40 };
    const m = memoryIo({ 'study.json': JSON.stringify({ ...chainModel(0.3, 0), version: 2, study }) }, { disk: true });
    expect(await runCli(['factor', 'study.json', '--level', 'within', '--person-sd', 'load=0.5', '--json'], m.io), m.err.join('\n')).toBe(0);
    const own = JSON.parse(m.out.join('\n')) as { samples: number; persons: number; n: number };
    expect([own.samples, own.persons, own.n]).toEqual([70, 40, 40 * 69]);
    // Two factors for four variables leave no degrees of freedom: refused, naming the option.
    const two = await run(['factor', FILE, '--interval', '3h', '--factors', '2', '--person-sd', 'load=0.5', '--json']);
    expect(two.code).not.toBe(0);
    expect(two.err).toMatch(/2 factors for 4 variables are not identified/);
  });

  it('rank --json: singular values of SciPy expm(A·Δ) over the states', async () => {
    const r = await run(['rank', FILE, '--interval', '2h', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { singularValues: number[]; ratio: number };
    const { A, B, noise } = chainMatrices(0.3);
    const ref = runPython<{ singular: number[][] }>('tests/reference/pictures_levels.py', { A, B, V: [0], noise, interval: 1, samples: 2, observed: [0, 1, 2, 3], grid: [2] });
    expectClose(j.singularValues, ref.singular[0], { relTol: 1e-9, absTol: 1e-14 }, 'singular values');
  });

  it('order --uncertain --json adds the probability of each ordering', async () => {
    const r = await run(['order', 'ranged.json', '--interval', '10h', '--uncertain', '--draws', '500', '--seed', '4', '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out) as { probabilities: { roles: Record<string, string>; blocks: unknown[]; share: number }[] };
    expect(j.probabilities.length).toBe(2);
    expectClose(j.probabilities.reduce((a, p) => a + p.share, 0), 1, decimals(12));
    expect(Object.keys(j.probabilities[0]).sort()).toEqual(['blocks', 'roles', 'share']);
  });

  it('bad options get a one-line reason naming the option', async () => {
    expect((await run(['factor', FILE, '--level', 'middle'])).err).toMatch(/--level must be between, within or cross/);
    expect((await run(['factor', FILE, '--person-sd', 's1=1'])).err).toMatch(/s1 is not an input/);
    expect((await run(['rank', FILE])).err).toMatch(/rank needs --interval/);
    expect((await run(['order', FILE, '--uncertain'])).err).toMatch(/--uncertain needs --interval/);
  });
});
