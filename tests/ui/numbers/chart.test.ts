import { describe, expect, it } from 'vitest';
import { circleLayout, niceTicks, logTicks, sampleTimes, simulationCsv, strongEdges, valueAt } from '../../../src/ui/numbers/chart';
import { runPython } from '../../helpers/python';

describe('chart helpers', () => {
  it('ticks: the smallest step of 1, 2 or 5 × 10^k giving at most `count` intervals (common practice)', () => {
    expect(niceTicks(0, 1440, 5)).toEqual([0, 500, 1000]);
    expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(-0.3, 0.7, 5)).toEqual([-0.2, 0, 0.2, 0.4, 0.6]);
    expect(niceTicks(7.2, 9.4, 4)).toEqual([8, 9]);
    expect(niceTicks(7.2, 9.4, 5)).toEqual([7.5, 8, 8.5, 9]);
    expect(logTicks(0.6, 3000)).toEqual([1, 10, 100, 1000]);
  });

  it('interpolates between output times exactly as numpy.interp does', () => {
    const times = [0, 1, 2.5, 4, 10];
    const values = [3, -1, 2, 2, 8];
    const at = [-1, 0, 0.3, 1, 2, 3.99, 4, 7.7, 10, 12];
    const ref = runPython<{ y: number[] }>('tests/reference/interp.py', { x: times, y: values, at });
    at.forEach((t, k) => expect(valueAt(times, values, t)).toBeCloseTo(ref.y[k], 12));
  });

  it('a study of N samples every Δ: times 0, Δ, …, up to the study length and the end of the run (common practice)', () => {
    expect(sampleTimes(30, 100, 1500)).toEqual([0, 30, 60, 90]);
    expect(sampleTimes(30, 2880, 90)).toEqual([0, 30, 60, 90]);
    expect(sampleTimes(0.1, 1000, Infinity, 400)).toBeNull();
  });

  it('CSV of a run reads back with Python\'s csv module (RFC 4180), labels with commas quoted', () => {
    const csv = simulationCsv([0, 0.5, 1], { a: [1, 2, 3], b: [0.1, 0.2, 1e-20] }, [{ id: 'a', name: 'Soil water, top' }, { id: 'b', name: 'Say "hi"' }], 'min');
    const { rows } = runPython<{ rows: string[][] }>('tests/reference/numeric_cli.py', { csv });
    expect(rows[0]).toEqual(['time (min)', 'Soil water, top', 'Say "hi"']);
    expect(rows.slice(1).map((r) => r.map(Number))).toEqual([[0, 1, 0.1], [0.5, 2, 0.2], [1, 3, 1e-20]]);
  });

  it('network edges: row i, column j is the effect of j on i; weak ones are left out', () => {
    const m = [[0.9, 0.5, 0.001], [-0.2, 0.8, 0], [0, 0.3, 0.7]];
    expect(strongEdges(m, 0.02)).toEqual([
      { from: 1, to: 0, weight: 0.5 },
      { from: 0, to: 1, weight: -0.2 },
      { from: 1, to: 2, weight: 0.3 },
    ]);
    const sym = [[1, -0.4], [-0.4, 1]];
    expect(strongEdges(sym, 0.02, true)).toEqual([{ from: 1, to: 0, weight: -0.4 }]);
    const p = circleLayout(4, 200, 200, 20);
    expect(p[0].x).toBeCloseTo(100, 9);
    expect(p[0].y).toBeCloseTo(20, 9);
    expect(p[1].x).toBeCloseTo(180, 9);
  });
});
