import { describe, expect, it } from 'vitest';
import type { Model } from '../../../src/core/model/types';
import { adviceUnderStrengthRanges } from '../../../src/core/pictures/index';
import { adviceOf } from '../../../src/core/numeric/answers';
import { runPython } from '../../helpers/python';

// An invented two-state loop: a (τ 1 h) raises b (τ 4 h), b damps a.
const TA = 1, TB = 4;
function loop(ab: { low: number; high: number } | null, ba: { low: number; high: number } | null): Model {
  return {
    format: 'loopfold-model', version: 2, name: 'loop', timeUnit: 'h',
    variables: [{ id: 'a', kind: 'state', timescale: TA }, { id: 'b', kind: 'state', timescale: TB }],
    links: [
      { from: 'a', to: 'b', kind: 'integrating', weight: 0.6, ...(ab ? { strengthRange: ab } : {}) },
      { from: 'b', to: 'a', kind: 'integrating', sign: '-', weight: 0.5, ...(ba ? { strengthRange: ba } : {}) },
    ],
  };
}
const chosen = [{ from: 'a', to: 'b' }, { from: 'b', to: 'a' }];

describe('the design advice under strength ranges', () => {
  it('with degenerate ranges every draw gives the point advice', () => {
    const r = adviceUnderStrengthRanges(loop({ low: 0.6, high: 0.6 }, { low: 0.5, high: 0.5 }), chosen, { draws: 20, seed: 3, points: 61 });
    if (!r.ok) throw new Error(r.reason);
    const point = adviceOf(loop(null, null), chosen, 0.5, 61);
    if (!point.ok) throw new Error(point.reason);
    expect(r.point.best).toBe(point.advice.best);
    expect(r.samples.every((s) => s.best === point.advice.best)).toBe(true);
    expect(r.best).toEqual({ q10: point.advice.best, median: point.advice.best, q90: point.advice.best });
    // The point advice keeps both links at half their peak or more (its score), so it holds in every draw.
    expect(point.advice.score).toBeGreaterThanOrEqual(0.5);
    expect(r.holds).toBe(1);
    // A spread of nothing is said as such, not as "between x and x" (the wording rule: readings a modeller can use).
    expect(r.readings[1]).toMatch(/^The advised interval itself stays at .* in at least 80 % of draws/);
  });

  it('each draw\'s advised interval and the share of draws the point advice holds in match SciPy on the same draws', () => {
    const r = adviceUnderStrengthRanges(loop({ low: 0.05, high: 3 }, { low: 0.05, high: 8 }), chosen, { draws: 40, seed: 11, points: 61 });
    if (!r.ok) throw new Error(r.reason);
    for (const s of r.samples) {
      expect(s.strengths[0]).toBeGreaterThanOrEqual(0.05);
      expect(s.strengths[0]).toBeLessThanOrEqual(3);
    }
    // The drift of each draw written out by hand from the sketch reading dx/dt = (Σ ± w·source − x)/τ.
    const drifts = r.samples.map(({ strengths: [wab, wba] }) => [[-1 / TA, -wba / TA], [wab / TB, -1 / TB]]);
    const ref = runPython<{ best: (number | null)[]; holds: boolean[] }>('tests/reference/pictures_strength_ranges.py', { drifts, states: ['a', 'b'], intervals: r.intervals, links: chosen, fraction: 0.5, pointBest: r.point.best });
    expect(r.samples.map((s) => s.best)).toEqual(ref.best);
    expect(r.holds).toBe(ref.holds.filter(Boolean).length / ref.holds.length);
    // The ranges are wide enough that the point advice does not hold in every draw (the check can fail).
    expect(r.holds).toBeLessThan(1);
    expect(r.readings[0]).toMatch(/in \d+ % of 40 draws/);
  });

  it('the same seed gives the same draws; a bad draw count is refused', () => {
    const m = loop({ low: 0.2, high: 0.9 }, null);
    const a = adviceUnderStrengthRanges(m, chosen, { draws: 5, seed: 7, points: 31 });
    const b = adviceUnderStrengthRanges(m, chosen, { draws: 5, seed: 7, points: 31 });
    expect(a.ok && a.samples).toEqual(b.ok && b.samples);
    const bad = adviceUnderStrengthRanges(m, chosen, { draws: 0 });
    expect(!bad.ok && bad.reason).toBe('draws must be a whole number from 1 to 100,000, not 0');
  });
});
