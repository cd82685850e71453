"""Reference VAR(1) fits by statsmodels (Debian's /usr/bin/python3 only).

stdin: {"case": "e1"} or {"case": "grunfeld"}
- e1: Lütkepohl (2005), New Introduction to Multiple Time Series Analysis,
  data set E1 (West German investment, income, consumption, 1960Q1–1982Q4) as
  shipped with statsmodels (tsa/vector_ar/tests/results/e1.dat); log first
  differences of 1960Q2–1978Q4 (Lütkepohl's estimation sample, §3.2.3),
  VAR(1) with a constant by statsmodels.tsa.api.VAR.
- grunfeld: the Grunfeld (1958) investment panel as shipped with statsmodels
  (statsmodels.datasets.grunfeld): 11 firms, 1935–1954; log invest, value,
  capital; each variable centred by its firm mean over all years, regressed on
  its first lag within firm by statsmodels OLS per equation, no constant,
  conventional and cluster-robust (groups = firms) standard errors.
stdout: the data (so the test builds the same panel) and the fitted values.
"""
import json
import os
import sys

import numpy as np
import statsmodels
from statsmodels.tsa.api import VAR
import statsmodels.api as sm

d = json.load(sys.stdin)
if d["case"] == "e1":
    path = os.path.join(os.path.dirname(statsmodels.__file__), "tsa/vector_ar/tests/results/e1.dat")
    rows = []
    with open(path) as f:
        for line in f:
            parts = line.split()
            try:
                rows.append([float(x) for x in parts])
            except ValueError:
                continue
    levels = np.array([r for r in rows if len(r) == 3])
    y = np.diff(np.log(levels), axis=0)[:75]
    res = VAR(y).fit(1, trend="c")
    k = y.shape[1]
    # params rows: const, lag-1 of each variable; columns: equations
    phi = res.params[1:, :].T
    se = np.asarray(res.stderr)[1:, :].T
    out = {"data": y.tolist(), "phi": phi.tolist(), "se": se.tolist(), "sigma_u": np.asarray(res.sigma_u).tolist(),
           "intercept": res.params[0, :].tolist(), "nobs": int(res.nobs)}
else:
    from statsmodels.datasets import grunfeld
    df = grunfeld.load_pandas().data
    firms = list(dict.fromkeys(df["firm"]))
    cols = ["invest", "value", "capital"]
    data = []
    X, Y, G = [], [], []
    for gi, firm in enumerate(firms):
        sub = df[df["firm"] == firm].sort_values("year")
        v = np.log(sub[cols].to_numpy(dtype=float))
        data.append({"firm": firm, "year": sub["year"].tolist(), "values": v.tolist()})
        c = v - v.mean(axis=0)
        X.append(c[:-1]); Y.append(c[1:]); G += [gi] * (len(c) - 1)
    X = np.vstack(X); Y = np.vstack(Y); G = np.array(G)
    phi, se, sec = [], [], []
    for i in range(3):
        ols = sm.OLS(Y[:, i], X)
        phi.append(ols.fit().params.tolist())
        se.append(ols.fit().bse.tolist())
        sec.append(ols.fit(cov_type="cluster", cov_kwds={"groups": G}).bse.tolist())
    r = Y - X @ np.array(phi).T
    out = {"data": data, "phi": phi, "se": se, "se_cluster": sec, "resid_cov": (r.T @ r / (len(Y) - 3)).tolist()}
json.dump(out, sys.stdout)
