import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import type { Model, Study } from '../../../src/core/model/types';
import { toRows } from '../../../src/core/numeric/dense';
import { driftAtEquilibrium } from '../../../src/core/numeric/index';
import { phiOverGap, scheduleGaps } from '../../../src/core/study/gaps';
import { studyDesign } from '../../../src/core/study/report';
import { answeredOccasions, promptPlan } from '../../../src/core/study/schedule';
import { expectClose } from '../../helpers/tolerance';

const window5 = (timing: 'fixed' | 'stratified-random'): Study['schedule'] => ({ kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing });

describe('gaps between consecutive prompts and their shares', () => {
  it('5 prompts 09:00–21:00 for 14 days: 56 gaps of 3 h and 13 nights of 12 h (counted by hand)', () => {
    const g = scheduleGaps({ interval: '3h', length: '14 days', schedule: window5('fixed') }, 'h');
    expect(g.map((x) => [x.gap, x.sameDay])).toEqual([[3, true], [12, false]]);
    expectClose(g.map((x) => x.share), [56 / 69, 13 / 69]);
  });
  it('the same in days as the time unit, and as 70 samples', () => {
    const g = scheduleGaps({ interval: '3h', length: 70, schedule: window5('fixed') }, 'day');
    expectClose(g.map((x) => x.gap), [3 / 24, 12 / 24]);
    expectClose(g.map((x) => x.share), [56 / 69, 13 / 69]);
  });
  it('missed prompts: a pair j steps apart has probability (1−p)²p^(j−1), over N − j starting points (independent misses; common practice)', () => {
    const p = 0.3;
    const N = 40;
    const g = scheduleGaps({ interval: 2, length: N, schedule: { kind: 'fixed' }, missedPrompts: p }, 'day');
    let total = 0;
    const expected = new Map<number, number>();
    for (let j = 1; j < N; j++) {
      const w = (N - j) * (1 - p) ** 2 * p ** (j - 1);
      expected.set(2 * j, w);
      total += w;
    }
    for (const x of g) expectClose(x.share, expected.get(Math.round(x.gap))! / total, { relTol: 1e-9 }, `gap ${x.gap}`);
    expectClose(g.reduce((s, x) => s + x.share, 0), 1);
  });
  it('a daily and a weekly schedule have one gap each; weekly pairs never share a day', () => {
    expect(scheduleGaps({ interval: '1 day', length: '30 days', schedule: { kind: 'daily' } }, 'h').map((x) => [x.gap, x.share, x.sameDay])).toEqual([[24, 1, false]]);
    expect(scheduleGaps({ interval: '1 week', length: 10, schedule: { kind: 'weekly' } }, 'day').map((x) => [x.gap, x.share])).toEqual([[7, 1]]);
  });
  it('the planned prompts of the seeded schedule have the gaps the shares describe (fixed timing)', () => {
    const study: Study = { interval: '3h', length: '5 days', schedule: window5('fixed'), persons: 3, seed: 11 };
    for (const person of promptPlan(study, 'h').persons) {
      const o = answeredOccasions(person);
      const gaps = new Set<number>();
      for (let k = 1; k < o.time.length; k++) gaps.add(o.time[k] - o.time[k - 1]);
      expect([...gaps].sort((a, b) => a - b)).toEqual([3, 12]);
    }
  });
});

// A two-state loop of our own (a kettle's water and element temperatures, in hours): timescales of a few hours,
// so that night gaps matter.
const loop: Model = {
  format: 'loopfold-model', version: 2, name: 'two-state loop', timeUnit: 'h',
  variables: [
    { id: 'u', kind: 'input', value: 0 },
    { id: 'x', kind: 'state', timescale: 3, noise: 1 },
    { id: 'y', kind: 'state', timescale: 5, noise: 0.5 },
  ],
  links: [
    { from: 'u', to: 'x', kind: 'integrating', sign: '+' },
    { from: 'x', to: 'y', kind: 'integrating', sign: '+', weight: 0.8 },
    { from: 'y', to: 'x', kind: 'integrating', sign: '-', weight: 0.5 },
  ],
};

function usrBinPythonHasStatsmodels(): boolean {
  return spawnSync('/usr/bin/python3', ['-c', 'import statsmodels, scipy'], { encoding: 'utf8' }).status === 0;
}

function runUsrBinPython<T>(script: string, input: unknown): T {
  const r = spawnSync('/usr/bin/python3', [script], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 30 });
  if (r.status !== 0) throw new Error(`/usr/bin/python3 ${script} failed (${r.status}): ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}

describe('what a VAR(1) over consecutive prompts estimates (against statsmodels on a long simulation)', () => {
  it.runIf(usrBinPythonHasStatsmodels())('the pooled and same-day limits agree with least-squares fits within Monte Carlo error; Φ at the nominal interval does not', () => {
    // 5 prompts a day, each at a random time in its part of 09:00–21:00, 20 % missed: gaps within the day, nights, skips
    const study: Study = { interval: '2.4h', length: '1200 days', schedule: window5('stratified-random'), missedPrompts: 0.2, persons: 6, seed: 5 };
    const r = studyDesign(loop, study);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const d = driftAtEquilibrium(loop);
    if (!d.ok) throw new Error(d.reason);
    const plan = promptPlan(study, 'h');
    const replicates = plan.persons.map((p, i) => {
      const o = answeredOccasions(p);
      return { time: Array.from(o.time), day: Array.from(o.day), seed: 1000 + i };
    });
    const first = r.report.gaps[0];
    const ref = runUsrBinPython<{ pooled: number[][][]; sameDay: number[][][]; triangular: number[][] }>(new URL('../../reference/study_var.py', import.meta.url).pathname, {
      a: toRows(d.drift), noise: [1, 0.5], replicates, gap: first.gap, spread: first.spread,
    });
    // Φ averaged over a stratified-random gap, against SciPy's adaptive quadrature of the same expectation
    expect(first.spread).toBeGreaterThan(0);
    expectClose(first.phi, ref.triangular, { relTol: 1e-9, absTol: 1e-12 }, 'E[Φ] over the triangular gap');
    expectClose(toRows(phiOverGap(d.drift, first.gap, first.spread)), ref.triangular, { relTol: 1e-9, absTol: 1e-12 });
    const R = replicates.length;
    for (const [name, fits, limit] of [['pooled', ref.pooled, r.report.pooled], ['same-day', ref.sameDay, r.report.sameDay!]] as const) {
      for (let i = 0; i < 2; i++)
        for (let j = 0; j < 2; j++) {
          const est = fits.map((m) => m[i][j]);
          const mean = est.reduce((s, v) => s + v, 0) / R;
          const sd = Math.sqrt(est.reduce((s, v) => s + (v - mean) ** 2, 0) / (R - 1));
          const se = sd / Math.sqrt(R);
          // within 4 Monte Carlo standard errors of the mean over replicates (plus the small-sample bias of LS, O(1/T))
          expect(Math.abs(mean - limit[i][j]), `${name} [${i}][${j}]: mean ${mean}, limit ${limit[i][j]}, se ${se}`).toBeLessThan(4 * se + 2e-3);
        }
    }
    // the test can tell: the pooled autoregressions are far from Φ at the nominal interval
    for (let i = 0; i < 2; i++) {
      const mean = ref.pooled.reduce((s, m) => s + m[i][i], 0) / R;
      expect(Math.abs(mean - r.report.nominal[i][i])).toBeGreaterThan(0.05);
    }
  }, 240_000);
});
