import { describe, expect, it } from 'vitest';
import { logTicks, niceTicks } from '../../src/export/axes';

describe('chart axes', () => {
  it('ticks: the smallest step of 1, 2 or 5 × 10^k giving at most `count` intervals (common practice)', () => {
    expect(niceTicks(0, 1440, 5)).toEqual([0, 500, 1000]);
    expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(-0.3, 0.7, 5)).toEqual([-0.2, 0, 0.2, 0.4, 0.6]);
    expect(niceTicks(7.2, 9.4, 4)).toEqual([8, 9]);
    expect(niceTicks(7.2, 9.4, 5)).toEqual([7.5, 8, 8.5, 9]);
    expect(logTicks(0.6, 3000)).toEqual([1, 10, 100, 1000]);
  });
});
