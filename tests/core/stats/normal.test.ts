import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { normalCdf, normalQuantile } from '../../../src/core/stats/normal';
import { PYTHON } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';

describe('standard normal', () => {
  const zs = [-30, -8, -5, -3, -1.5, -0.3, 0, 0.5, 1.959963984540054, 4, 9];
  const ps = [1e-300, 1e-12, 1e-4, 0.025, 0.3, 0.5, 0.8, 0.975, 1 - 1e-9];
  // Reference: scipy.stats.norm.cdf / norm.ppf
  const ref = JSON.parse(spawnSync(PYTHON, ['-c', `import json,sys; from scipy.stats import norm; d=json.load(sys.stdin); print(json.dumps({"cdf":[float(norm.cdf(z)) for z in d["z"]],"ppf":[float(norm.ppf(p)) for p in d["p"]]}))`], { input: JSON.stringify({ z: zs, p: ps }), encoding: 'utf8' }).stdout) as { cdf: number[]; ppf: number[] };

  it('cumulative probability matches SciPy to 1e-12 relative, deep into the lower tail', () => {
    expectClose(zs.map(normalCdf), ref.cdf, { relTol: 1e-12, absTol: 1e-300 }, 'cdf');
  });
  it('quantile matches SciPy to 1e-12 relative', () => {
    expectClose(ps.map(normalQuantile), ref.ppf, { relTol: 1e-12, absTol: 1e-13 }, 'ppf');
  });
  it('edges: 0 and 1 give infinities, outside [0, 1] gives NaN', () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(1.2)).toBeNaN();
  });
});
