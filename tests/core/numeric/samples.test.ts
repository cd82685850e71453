import { describe, expect, it } from 'vitest';
import { sampleTimes, valueAt } from '../../../src/core/numeric/samples';
import { runPython } from '../../helpers/python';
import { decimals, expectClose } from '../../helpers/tolerance';

describe('the samples a study takes of a run', () => {
  it('interpolates between output times exactly as numpy.interp does', () => {
    const times = [0, 1, 2.5, 4, 10];
    const values = [3, -1, 2, 2, 8];
    const at = [-1, 0, 0.3, 1, 2, 3.99, 4, 7.7, 10, 12];
    const ref = runPython<{ y: number[] }>('tests/reference/interp.py', { x: times, y: values, at });
    at.forEach((t, k) => expectClose(valueAt(times, values, t), ref.y[k], decimals(12)));
  });

  it('a study of N samples every Δ: times 0, Δ, …, up to the study length and the end of the run (common practice)', () => {
    expect(sampleTimes(30, 100, 1500)).toEqual([0, 30, 60, 90]);
    expect(sampleTimes(30, 2880, 90)).toEqual([0, 30, 60, 90]);
    expect(sampleTimes(0.1, 1000, Infinity, 400)).toBeNull();
  });
});
