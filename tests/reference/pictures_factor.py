"""Reference maximum-likelihood factor analysis for tests/core/pictures: statsmodels'
Factor(method='ml') on the same correlation matrix (Debian's /usr/bin/python3 only).

Input (stdin JSON): { "cases": [ { "cov": [[...]], "k": 1, "n": 200 } ] }.
Output per case: loadings (p x k, each column's sum made positive), uniqueness,
fitted = LL' + Psi, and the fit statistics computed here from the fitted model:
  F_ML = log|Sigma_hat| - log|R| + tr(R Sigma_hat^-1) - p      (Joreskog 1969, Psychometrika 34)
  chi2 = (N - 1) F_ML, df = ((p - k)^2 - (p + k)) / 2            (Lawley & Maxwell 1971, ch. 4)
  RMSEA = sqrt(max(chi2 - df, 0) / (df (N - 1)))                  (Steiger 1990; Browne & Cudeck 1993)
  p-value = scipy.stats.chi2.sf(chi2, df)
and numpy's eigenvalues of R, largest first.
"""
import json
import sys
import warnings

import numpy as np
from scipy import stats
from statsmodels.multivariate.factor import Factor

warnings.simplefilter("ignore")
out = []
for case in json.load(sys.stdin)["cases"]:
    S = np.array(case["cov"], dtype=float)
    sd = np.sqrt(np.diag(S))
    R = S / np.outer(sd, sd)
    k = int(case["k"])
    n = case.get("n")
    p = R.shape[0]
    res = Factor(corr=R, n_factor=k, method="ml", nobs=n).fit(opt={"gtol": 1e-12, "maxiter": 10000})
    L = np.array(res.loadings).reshape(p, k)
    for c in range(k):
        if L[:, c].sum() < 0:
            L[:, c] = -L[:, c]
    psi = np.array(res.uniqueness)
    fitted = L @ L.T + np.diag(psi)
    f = np.linalg.slogdet(fitted)[1] - np.linalg.slogdet(R)[1] + np.trace(R @ np.linalg.inv(fitted)) - p
    df = ((p - k) ** 2 - (p + k)) / 2
    row = {
        "loadings": L.tolist(),
        "uniqueness": psi.tolist(),
        "common": (L @ L.T).tolist(),
        "discrepancy": float(f),
        "df": df,
        "eigenvalues": sorted(np.linalg.eigvalsh(R).tolist(), reverse=True),
    }
    if n is not None:
        chi2 = (n - 1) * f
        row["chi2"] = float(chi2)
        row["rmsea"] = float(np.sqrt(max(chi2 - df, 0) / (df * (n - 1)))) if df > 0 else None
        row["pValue"] = float(stats.chi2.sf(chi2, df)) if df > 0 else None
    out.append(row)
print(json.dumps(out))
