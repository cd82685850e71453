import { describe, expect, it } from 'vitest';
import { timesFromIntervals, typedNumber, wavesProblem, yearsInNames } from '../../../src/ui/data/WaveMapper';
import type { ColumnMapping } from '../../../src/core/data/import';

const wide = (times: number[], cells = times.map((_, k) => [{ column: `fish_${k + 1}`, variable: 'fish' }])): ColumnMapping => ({
  format: 'wide', person: 'lake', timeUnit: 'day', timeInputUnit: 'year', variables: [],
  waves: times.map((t, k) => ({ time: { value: t }, cells: cells[k] })),
});

describe('wide waves in the column mapper', () => {
  it('reads typed numbers (a typed minus sign U+2212 too) and refuses other text', () => {
    expect(typedNumber(' 2.5 ')).toBe(2.5);
    expect(typedNumber('\u22121')).toBe(-1);
    expect(typedNumber('1e1')).toBe(10);
    expect(typedNumber('three')).toBeNull();
    expect(typedNumber('')).toBeNull();
  });

  it('sums intervals into times from the first wave (hand calculation: 2, 3, 1 years apart give 0, 2, 5, 6)', () => {
    expect(timesFromIntervals(['', '2', '3', '1'])).toEqual([0, 2, 5, 6]);
    expect(timesFromIntervals(['', '2', 'x', '1'])).toEqual([0, 2, null, null]);
  });

  it('takes times from years at the end of column names only when every wave has one and they increase', () => {
    expect(yearsInNames(wide([0, 1, 2], [[{ column: 'fish_2014', variable: 'fish' }], [{ column: 'fish_2016', variable: 'fish' }], [{ column: 'fish_2019', variable: 'fish' }]]).waves!)).toEqual([2014, 2016, 2019]);
    expect(yearsInNames(wide([0, 1]).waves!)).toBeNull();
    expect(yearsInNames(wide([0, 1], [[{ column: 'fish_2016', variable: 'fish' }], [{ column: 'fish_2014', variable: 'fish' }]]).waves!)).toBeNull();
  });

  it('names the wave and field of each problem', () => {
    expect(wavesProblem(wide([0, 2, 5]))).toBeNull();
    expect(wavesProblem(wide([0]))).toMatch(/at least two waves/);
    expect(wavesProblem(wide([0, NaN, 5]))).toBe('Wave 2: its time is not a number; type it as a number in year.');
    expect(wavesProblem(wide([0, 5, 5]))).toBe("Wave 3: its time (5) is not after wave 2's (5); waves go in time order.");
    expect(wavesProblem(wide([0, 2], [[{ column: 'fish_1', variable: 'fish' }], []]))).toBe('Wave 2: no column is chosen for any variable.');
    expect(wavesProblem(wide([0, 2], [[{ column: 'fish_1', variable: 'fish' }], [{ column: 'fish_1', variable: 'fish' }]]))).toMatch(/Column “fish_1” is chosen twice \(Wave 1 fish and Wave 2 fish\)/);
    expect(wavesProblem(wide([0, 2], [[{ column: 'lake', variable: 'fish' }], [{ column: 'fish_2', variable: 'fish' }]]))).toMatch(/Wave 1, fish: column “lake” names the person/);
  });
});
