import { describe, expect, it } from 'vitest';
import type { Model } from '../../../src/core/model/types';
import { fromRows } from '../../../src/core/numeric/dense';
import { factorAnalysis, laggedRank, levelCovariances, picturesAt } from '../../../src/core/pictures/index';
import { logGrid } from '../../../src/core/numeric/sampled';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';
import { chainMatrices, chainModel, SYMPTOMS } from './fixtures';
import { readFileSync } from 'node:fs';
import { parseModel } from '../../../src/core/model/schema';

interface Ref { equilibria: number[][]; stationary: number[][]; meanError: number[][]; within: number[][]; between: number[][]; cross: number[][]; singular: number[][] }

describe('covariances within, between and across persons', () => {
  for (const slow of [false, true]) {
    it(`match SciPy's Lyapunov solution and the mean of a stationary series term by term (${slow ? 'slow driver state' : 'driver input'})`, () => {
      const chain = 0.8, sd = 1.3, interval = 3, samples = 70;
      const lv = levelCovariances(chainModel(chain, sd, slow), { interval, samples, persons: 150, observed: SYMPTOMS });
      expect(lv.ok).toBe(true);
      if (!lv.ok) return;
      const { A, B, noise } = chainMatrices(chain, slow);
      const ref = runPython<Ref>('tests/reference/pictures_levels.py', { A, B, V: [sd * sd], noise, interval, samples, observed: [0, 1, 2, 3], grid: [] });
      for (const key of ['equilibria', 'stationary', 'meanError', 'within', 'between', 'cross'] as const) expectClose(lv[key], ref[key], { relTol: 1e-8, absTol: 1e-11 }, key);
      expect(lv.n).toEqual({ within: 150 * 69, between: 150, cross: 150 });
    });
  }
});

describe('fast chained symptoms and a slow common driver', () => {
  it('without the chain one factor fits the cross-section exactly, whatever the driver\'s variance', () => {
    for (const sd of [0.2, 1, 5]) {
      const lv = levelCovariances(chainModel(0, sd), { interval: 3, samples: 70, persons: 150 });
      if (!lv.ok) throw new Error(lv.reason);
      const fit = factorAnalysis(fromRows(lv.cross), 1, { n: 150 });
      // Cross-section = b bᵀ Var(u) + diagonal Σ: exactly one factor plus uniquenesses.
      expect(fit.chi2!).toBeLessThan(1e-8);
      expect(fit.rmsea).toBe(0);
    }
  });

  it('with the chain the one-factor fit of the cross-section is off (the check can fail)', () => {
    const lv = levelCovariances(chainModel(0.8, 1), { interval: 3, samples: 70, persons: 150 });
    if (!lv.ok) throw new Error(lv.reason);
    expect(factorAnalysis(fromRows(lv.cross), 1, { n: 150 }).rmsea!).toBeGreaterThan(0.05);
  });

  it('the smallest-to-largest singular value ratio of Φ(Δ) falls towards 0 past the fast timescales (SciPy expm + SVD)', () => {
    const { A, B, noise } = chainMatrices(0.8, true);
    const grid = logGrid(0.05, 40, 25);
    const ref = runPython<Ref>('tests/reference/pictures_levels.py', { A, B, V: [1], noise, interval: 1, samples: 2, observed: [0, 1, 2, 3, 4], grid });
    const lv = levelCovariances(chainModel(0.8, 1, true), { interval: 1, samples: 2, observed: [...SYMPTOMS, 'strain'] });
    if (!lv.ok) throw new Error(lv.reason);
    const ratios = grid.map((d, g) => {
      const r = laggedRank(lv.drift, lv.states, [...SYMPTOMS, 'strain'], d);
      expectClose(r.singularValues, ref.singular[g], { relTol: 1e-8, absTol: 1e-13 }, `singular values at Δ = ${d}`);
      const want = ref.singular[g][4] / ref.singular[g][0];
      expectClose(r.ratio, want, { relTol: 1e-6, absTol: 1e-14 }, `ratio at Δ = ${d}`);
      return want;
    });
    // Monotone while the ratio is above what an SVD resolves: singular values below about ε·σ_max (ε = 2.2e-16,
    // NumPy's float64) are rounding, so ratios under 1e-13 are noise in SciPy's answer as in ours (common practice).
    for (let g = 1; g < grid.length; g++) if (ratios[g - 1] > 1e-13) expect(ratios[g]).toBeLessThanOrEqual(ratios[g - 1] * (1 + 1e-9));
    expect(ratios[0]).toBeGreaterThan(0.5);
    // Past 5× the slowest symptom's 2 h the fast modes are gone: Φ is nearly rank one (the slow strain mode).
    expect(ratios[grid.length - 1]).toBeLessThan(1e-6);
  });

  it('reads the pictures in words', () => {
    const r = picturesAt(chainModel(0, 3), { interval: 3, samples: 70, persons: 150, observed: SYMPTOMS });
    if (!r.ok) throw new Error(r.reason);
    expect(r.pictures.byLevel.cross.reading).toMatch(/one factor fits \(RMSEA \.00\)/);
    expect(r.pictures.byLevel.within.reading).toMatch(/barely correlate/);
    const c = picturesAt(chainModel(0.8, 1), { interval: 3, samples: 70, persons: 150, observed: SYMPTOMS });
    if (!c.ok) throw new Error(c.reason);
    expect(c.pictures.byLevel.within.reading).toMatch(/does not fit .* loops between the variables dominate/);
    // a ratio under .005 is not written ".00" (which reads as exactly zero)
    const unrest = parseModel(JSON.parse(readFileSync('src/examples/evening-unrest.json', 'utf8')));
    if (!unrest.ok) throw new Error('the example does not open');
    const e = picturesAt(unrest.model, { interval: 3 });
    if (!e.ok) throw new Error(e.reason);
    expect(e.pictures.rankLong.secondRatio).toBeLessThan(0.005);
    expect(e.pictures.longReading).toContain('nearly rank one (second/first singular value below .01)');
    for (const p of [r.pictures, c.pictures, e.pictures]) expect(p.longReading).not.toMatch(/\.00\)/);
    const sleep = parseModel(JSON.parse(readFileSync('src/examples/sleep-stress.json', 'utf8')));
    if (!sleep.ok) throw new Error('the example does not open');
    const ss = picturesAt(sleep.model, { interval: 2.4 });
    if (!ss.ok) throw new Error(ss.reason);
    expect(ss.pictures.byLevel.between.oneFactor!.rmsea!).toBeGreaterThan(0.1);
    expect(ss.pictures.byLevel.between.reading).toMatch(/one factor dominates .* yet the exact fit rejects a single factor/);
    // a dominant factor whose exact fit is far off (RMSEA above .10, 'poor' by Browne & Cudeck 1993) is not called a trace
    for (const p of [r.pictures, c.pictures, e.pictures, ss.pictures])
      for (const level of ['between', 'cross'] as const) {
        const fit = p.byLevel[level].oneFactor;
        if (fit?.rmsea != null && /one factor dominates/.test(p.byLevel[level].reading))
          expect(p.byLevel[level].reading).toContain(fit.rmsea > 0.1 ? 'rejects a single factor' : 'leave a trace');
      }
  });

  it('names a missing variable and a non-input person difference', () => {
    const a = levelCovariances(chainModel(0, 1), { interval: 3, observed: ['s1', 'nope'] });
    expect(a.ok).toBe(false);
    if (!a.ok) expect(a.reason).toMatch(/"nope"/);
    const b = levelCovariances(chainModel(0, 1), { interval: 3, personSD: { s1: 1 } });
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.reason).toMatch(/"s1" is not an input/);
  });
});

describe('person differences in link strengths (delta method)', () => {
  const u = 2, w1 = 0.7, w2 = 0.5, s1 = 0.1, s2 = 0.08;
  const model: Model = {
    format: 'loopfold-model', version: 2, name: 'two-step chain', timeUnit: 'h',
    variables: [{ id: 'u', kind: 'input', value: u }, { id: 'a', kind: 'state', timescale: 1 }, { id: 'b', kind: 'state', timescale: 2 }],
    links: [{ from: 'u', to: 'a', kind: 'integrating', weight: w1, personSD: s1 }, { from: 'a', to: 'b', kind: 'integrating', weight: w2, personSD: s2 }],
  };
  it('the covariance of the persons\' equilibria matches a NumPy Monte Carlo over 400,000 persons (within 3 %)', () => {
    const lv = levelCovariances(model, { interval: 1, samples: 50, persons: 100, observed: ['a', 'b'] });
    if (!lv.ok) throw new Error(lv.reason);
    expect(lv.personLinks.map((l) => [l.from, l.to])).toEqual([['u', 'a'], ['a', 'b']]);
    // Delta method by hand (a = w1 u, b = w1 w2 u): ∂(a, b)/∂w1 = (u, w2 u), ∂(a, b)/∂w2 = (0, w1 u).
    const hand = [[s1 ** 2 * u ** 2, s1 ** 2 * u * w2 * u], [s1 ** 2 * u * w2 * u, s1 ** 2 * (w2 * u) ** 2 + s2 ** 2 * (w1 * u) ** 2]];
    expectClose(lv.equilibria, hand, { relTol: 1e-6 }, 'delta method by hand');
    const mc = runPython<{ cov: number[][] }>('tests/reference/pictures_link_sd.py', { seed: 20261205, persons: 400_000, u, w1, w2, s1, s2 });
    // The delta method leaves out the s1²s2²u² term of Var(b) (about 1 % here) and the Monte Carlo has about 0.3 % error.
    expectClose(lv.equilibria, mc.cov, { relTol: 0.03 }, 'Monte Carlo over persons');
    // Between persons = equilibria + the mean's sampling error; with no link SD the persons share one equilibrium.
    const none = levelCovariances({ ...model, links: model.links.map(({ personSD: _sd, ...l }) => l) }, { interval: 1, samples: 50, persons: 100, observed: ['a', 'b'] });
    if (!none.ok) throw new Error(none.reason);
    expectClose(none.equilibria, [[0, 0], [0, 0]], { absTol: 1e-15 });
    expectClose(lv.between, lv.equilibria.map((r, i) => r.map((x, j) => x + lv.meanError[i][j])), { relTol: 1e-12, absTol: 1e-15 });
  });
  it('a link whose strength does not enter the equations is named in a warning', () => {
    const own: Model = { ...model, variables: model.variables.map((v) => (v.id === 'b' ? { ...v, rate: '(0.5 * a - b) / 2' } : v)) };
    const lv = levelCovariances(own, { interval: 1, samples: 50, persons: 100, observed: ['a', 'b'] });
    if (!lv.ok) throw new Error(lv.reason);
    expect(lv.warnings.some((w) => w.includes('a → b does not enter the equations'))).toBe(true);
    expect(lv.personLinks.map((l) => l.to)).toEqual(['a']);
  });
});
