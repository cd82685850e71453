import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { fitVar } from '../../../src/core/fit/var';
import type { Panel } from '../../../src/core/data/panel';
import { expectClose } from '../../helpers/tolerance';

/** statsmodels is installed for Debian's python only (see the reference script). */
function statsmodels<T>(input: unknown): T {
  const r = spawnSync('/usr/bin/python3', ['tests/reference/fit_var.py'], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as T;
}

function onePerson(rows: number[][], vars: string[]): Panel {
  return {
    variables: vars,
    timeUnit: 'month',
    persons: [{ id: 'all', time: Float64Array.from(rows, (_, k) => 3 * k), values: Float64Array.from(rows.flat()) }],
  };
}

describe('fitVar', () => {
  it('matches statsmodels VAR(1) with a constant on Lütkepohl (2005) E1 to 1e-8', () => {
    // Reference: statsmodels.tsa.api.VAR on data set E1 shipped with statsmodels (Lütkepohl 2005, §3.2.3 sample).
    const ref = statsmodels<{ data: number[][]; phi: number[][]; se: number[][]; sigma_u: number[][]; intercept: number[]; nobs: number }>({ case: 'e1' });
    const fit = fitVar(onePerson(ref.data, ['invest', 'income', 'consumption']), { centre: 'fixed-effects' });
    expect(fit.n.pairs).toBe(ref.nobs);
    expectClose(fit.phi, ref.phi, { relTol: 1e-8, absTol: 1e-12 }, 'phi');
    expectClose(fit.se.phi, ref.se, { relTol: 1e-8, absTol: 1e-12 }, 'se');
    expectClose(fit.residualCov, ref.sigma_u, { relTol: 1e-8, absTol: 1e-14 }, 'sigma_u');
    expectClose(fit.intercepts![0].values, ref.intercept, { relTol: 1e-8, absTol: 1e-12 }, 'intercept');
    expect(fit.se.phiCluster).toBeNull();
  });

  it('pooled person-mean-centred VAR with cluster-robust SEs matches statsmodels OLS on the Grunfeld (1958) panel', () => {
    // Reference: statsmodels OLS (conventional and cov_type="cluster") on statsmodels.datasets.grunfeld.
    const ref = statsmodels<{ data: { firm: string; year: number[]; values: number[][] }[]; phi: number[][]; se: number[][]; se_cluster: number[][]; resid_cov: number[][] }>({ case: 'grunfeld' });
    // Rows shuffled within persons would be the importer's job; here they are in order.
    const panel: Panel = {
      variables: ['invest', 'value', 'capital'],
      timeUnit: 'year',
      persons: ref.data.map((f) => ({ id: f.firm, time: Float64Array.from(f.year), values: Float64Array.from(f.values.flat()) })),
    };
    const fit = fitVar(panel, { perPerson: { minPairs: 10 } });
    expectClose(fit.phi, ref.phi, { relTol: 1e-9, absTol: 1e-12 }, 'phi');
    expectClose(fit.se.phi, ref.se, { relTol: 1e-9 }, 'se');
    expectClose(fit.se.phiCluster!, ref.se_cluster, { relTol: 1e-9 }, 'cluster se');
    expectClose(fit.residualCov, ref.resid_cov, { relTol: 1e-9, absTol: 1e-14 }, 'residual covariance');
    expect(fit.n.persons).toBe(11);
    expect(fit.perPerson.length).toBe(11);
    expect(fit.between.cov.length).toBe(3);
  });

  it('same-day and skipped-prompt rules leave out the pairs they should (common practice)', () => {
    // Two days of three prompts each; prompt 1 of day 0 skipped (row absent); a missing cell on day 1.
    const panel: Panel = {
      variables: ['a'],
      timeUnit: 'h',
      persons: [{
        id: 'p', time: Float64Array.from([9, 17, 33, 37, 41]), day: Int32Array.from([0, 0, 1, 1, 1]), prompt: Int32Array.from([0, 2, 0, 1, 2]),
        values: Float64Array.from([1, 2, 3, NaN, 5]),
      }],
    };
    const all = () => fitVar({ ...panel, persons: [{ ...panel.persons[0], values: Float64Array.from([1, 2, 3, 4, 5, 6].slice(0, 5)) }] }, { skipRule: 'none' });
    expect(all().n.pairs).toBe(4);
    expect(() => fitVar(panel, { sameDay: true, skipRule: 'prompt' })).toThrow(/too few usable lag pairs \(0\)/);
    const e = (() => { try { fitVar(panel, { sameDay: true }); } catch (err) { return String(err); } return ''; })();
    expect(e).toMatch(/2 a missing value/);
    expect(e).toMatch(/1 across a night/);
    expect(() => fitVar({ ...panel, persons: [{ ...panel.persons[0], day: undefined }] }, { sameDay: true })).toThrow(/day numbers/);
  });
});
