import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { nestedResidualSums, ols } from '../../../src/core/stats/ols';
import { expectClose } from '../../helpers/tolerance';

describe('ols', () => {
  it('matches statsmodels OLS on the Longley (1967) data shipped with statsmodels (an ill-conditioned design): β, SE, SSR, log-likelihood, AIC, R²', () => {
    // Reference: statsmodels.api.OLS on statsmodels.datasets.longley with a constant (Debian's /usr/bin/python3).
    const r = spawnSync('/usr/bin/python3', ['-c', `
import json, statsmodels.api as sm
d = sm.datasets.longley.load_pandas()
X = sm.add_constant(d.exog, prepend=False)
f = sm.OLS(d.endog, X).fit()
print(json.dumps({"y": d.endog.tolist(), "X": X.to_numpy().T.tolist(), "beta": f.params.tolist(), "se": f.bse.tolist(), "ssr": f.ssr, "llf": f.llf, "aic": f.aic, "r2": f.rsquared, "nested": [sm.OLS(d.endog, X.iloc[:, :m]).fit().ssr for m in range(1, X.shape[1] + 1)]}))
`], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const ref = JSON.parse(r.stdout) as { y: number[]; X: number[][]; beta: number[]; se: number[]; ssr: number; llf: number; aic: number; r2: number; nested: number[] };
    const fit = ols(ref.y, ref.X);
    expectClose(Array.from(fit.beta), ref.beta, { relTol: 1e-8 }, 'beta');
    expectClose(Array.from(fit.se), ref.se, { relTol: 1e-8 }, 'se');
    expectClose(fit.ssr, ref.ssr, { relTol: 1e-8 }, 'ssr');
    expectClose(fit.logLik, ref.llf, { relTol: 1e-10 }, 'llf');
    expectClose(fit.aic, ref.aic, { relTol: 1e-10 }, 'aic');
    expectClose(fit.rSquared, ref.r2, { relTol: 1e-10 }, 'r2');
    // The SSR of every column prefix from one QR equals statsmodels' separate fits.
    expectClose(Array.from(nestedResidualSums(ref.y, ref.X)), ref.nested, { relTol: 1e-8 }, 'nested SSR');
    // NIST StRD certified value for Longley, from memory: constant −3482258.63459582 (checked here against statsmodels above).
    expectClose(fit.beta[6], -3482258.63459582, { relTol: 1e-8 }, 'NIST constant');
  });

  it('names the problem with a dependent column or too few rows', () => {
    expect(() => ols([1, 2, 3], [[1, 1, 1], [2, 2, 2]])).toThrow(/linearly dependent \(column 2/);
    expect(() => ols([1, 2], [[1, 1], [0, 1]])).toThrow(/more rows \(2\) than columns \(2\)/);
  });
});
