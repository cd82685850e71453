import { describe, expect, it } from 'vitest';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { dataInterval, dataIntervals, lagCurves, laggedEffect } from '../../../src/core/fit/lagCurve';
import type { Panel } from '../../../src/core/data/panel';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

const A = [[-0.5, 0.2, 0], [0.3, -0.8, 0.1], [0, -0.4, -0.2]];

describe('lagged effect against interval', () => {
  it('matches scipy.linalg.expm(A Δ)[to, from] on a grid of intervals', () => {
    const grid = [0.1, 0.5, 1, 3, 10, 40];
    const dir = mkdtempSync(join(tmpdir(), 'lagcurve-'));
    const script = join(dir, 'expm.py');
    writeFileSync(script, 'import json,sys\nimport numpy as np\nfrom scipy.linalg import expm\nd=json.load(sys.stdin)\nA=np.array(d["A"])\nprint(json.dumps([[float(expm(A*t)[i,j]) for t in d["grid"]] for (i,j) in d["pairs"]]))\n');
    const pairs: [number, number][] = [[1, 0], [2, 0], [0, 2], [1, 1]];
    const ref = runPython<number[][]>(script, { A, grid, pairs });
    pairs.forEach(([to, from], k) => expectClose(laggedEffect(A, from, to, grid), ref[k], { relTol: 1e-10, absTol: 1e-14 }, `Φ[${to}][${from}]`));
  });

  it('one state: exp(−λΔ) (closed form, common practice)', () => {
    expectClose(laggedEffect([[-0.25]], 0, 0, [0, 2, 8]), [1, Math.exp(-0.5), Math.exp(-2)], { relTol: 1e-14, absTol: 0 });
  });

  it('curves from sketch and fit share the grid around the data\'s intervals', () => {
    const panel: Panel = {
      variables: ['x', 'y'], timeUnit: 'h',
      persons: [
        { id: 'a', time: Float64Array.from([0, 2, 4, 16, 18]), day: Int32Array.from([0, 0, 0, 1, 1]), values: new Float64Array(10) },
        { id: 'b', time: Float64Array.from([0, 3, 6]), values: new Float64Array(6) },
      ],
    };
    // Intervals 2, 2, 12, 2, 3, 3; with same-day pairs only the 12-hour night drops out (hand count).
    expect(dataIntervals(panel).sort((p, q) => p - q)).toEqual([2, 2, 2, 3, 3, 12]);
    expect(dataIntervals(panel, true).sort((p, q) => p - q)).toEqual([2, 2, 2, 3, 3]);
    expect(dataInterval(panel)).toBe(3);
    const c = lagCurves(['x', 'y'], [[-1, 0], [0.5, -1]], [[-0.9, 0], [0.4, -1.1]], 'x', 'y', dataIntervals(panel), { interval: 3, estimate: 0.1, low: 0, high: 0.2 });
    // From a tenth of the first quartile (2) to ten times the third (3).
    expectClose([c.intervals[0], c.intervals.at(-1)!], [0.2, 30], { relTol: 1e-12, absTol: 0 }, 'grid ends');
    // x → y under A = [[−1,0],[0.5,−1]]: Φ_yx(Δ) = 0.5 Δ e^{−Δ} (closed form of a repeated eigenvalue, common practice).
    c.intervals.forEach((d, k) => expectClose(c.sketch[k], 0.5 * d * Math.exp(-d), { relTol: 1e-9, absTol: 1e-15 }, `sketch at ${d}`));
    expect(c.fitted).toHaveLength(c.intervals.length);
    expect(c.data).toEqual({ q1: 2, median: 2, q3: 3, count: 6 });
    expect(() => lagCurves(['x'], [[-1]], null, 'x', 'z', [1], null)).toThrow(/"z" is not among the fitted states/);
  });
});

