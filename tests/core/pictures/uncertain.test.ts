import { describe, expect, it } from 'vitest';
import type { Model } from '../../../src/core/model/types';
import { orderingAt } from '../../../src/core/ordering/index';
import { decimals, expectClose } from '../../helpers/tolerance';
import { breakpointRanges, orderingProbabilities } from '../../../src/core/pictures/index';

/** An invented worry–sleep loop: worry (fast) and tiredness, driven by a workload input. */
function loop(worry: Model['variables'][number]['timescale'], tired: Model['variables'][number]['timescale'] = 8): Model {
  return {
    format: 'loopfold-model', version: 1, name: 'loop', timeUnit: 'h',
    variables: [
      { id: 'workload', kind: 'input', value: 1 },
      { id: 'worry', kind: 'state', timescale: worry },
      { id: 'tired', kind: 'state', timescale: tired },
    ],
    links: [
      { from: 'workload', to: 'worry', kind: 'integrating' },
      { from: 'worry', to: 'tired', kind: 'integrating' },
      { from: 'tired', to: 'worry', kind: 'integrating' },
    ],
  };
}

describe('orderings under uncertain timescales', () => {
  it('degenerate ranges give probability 1 for the ordering the point values give', () => {
    for (const interval of [0.5, 3, 10, 60]) {
      const m = loop({ low: '90 min', high: '90 min' }, { low: 8, high: 8 });
      const r = orderingProbabilities(m, { interval, samples: 50 }, { draws: 200, seed: 3 });
      expect(r.probabilities).toHaveLength(1);
      expect(r.probabilities[0].share).toBe(1);
      const point = orderingAt(loop('90 min', 8), { interval, samples: 50 });
      expect(r.probabilities[0].roles).toEqual(point.roles);
      expect(r.probabilities[0].blocks).toEqual(point.blocks);
      expect(r.states).toEqual([]);
    }
  });

  it('a range straddling one breakpoint gives the analytic log-uniform fraction', () => {
    // worry τ log-uniform on [1, 6] h, separation 5, Δ = 10 h: settled ⇔ 5τ ≤ 10 ⇔ τ ≤ 2, so
    // P = ln(2/1)/ln(6/1) (the log-uniform distribution function; Jeffreys 1961, §3.1).
    const want = Math.log(2) / Math.log(6);
    const draws = 20000;
    const r = orderingProbabilities(loop({ low: 1, high: 6 }), { interval: 10, samples: 50 }, { draws, seed: 11 });
    const worry = r.states.find((s) => s.id === 'worry')!;
    expectClose(worry.exact.settled, want, decimals(14));
    expect(worry.decides).toBe(true);
    expect(r.probabilities).toHaveLength(2);
    const settled = r.probabilities.find((p) => p.roles.worry === 'settled')!;
    const dynamic = r.probabilities.find((p) => p.roles.worry === 'state')!;
    // Monte Carlo: within 4 standard errors √(p(1−p)/K) of the exact share (common practice).
    const se = Math.sqrt((want * (1 - want)) / draws);
    expect(Math.abs(settled.share - want)).toBeLessThan(4 * se);
    expectClose(settled.share + dynamic.share, 1, decimals(12));
    expect(settled.deciding).toEqual({ worry: 'settled' });
    expect(r.readings[0]).toMatch(/^Whether worry settles at 10 h depends on its timescale .* settled in \d+ % of draws \(39 % exactly\)/);
    // The same seed gives the same draws.
    expect(orderingProbabilities(loop({ low: 1, high: 6 }), { interval: 10, samples: 50 }, { draws, seed: 11 })).toEqual(r);
  });

  it('the breakpoints of a range become ranges', () => {
    const b = breakpointRanges(loop({ low: 1, high: 6 }), { samples: 50 });
    expect(b).toEqual([
      { variable: 'worry', from: 'frozen', to: 'state', low: 1 / 250, high: 6 / 250, point: Math.sqrt(6) / 250 },
      { variable: 'worry', from: 'state', to: 'settled', low: 5, high: 30, point: 5 * Math.sqrt(6) },
    ]);
  });

  it('refuses a bad number of draws', () => {
    expect(() => orderingProbabilities(loop({ low: 1, high: 6 }), { interval: 10 }, { draws: 0 })).toThrow(/number of draws/);
  });
});
