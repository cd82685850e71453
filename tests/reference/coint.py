"""Reference unit-root and cointegration tests by statsmodels (Debian's /usr/bin/python3 only).

Data: statsmodels.datasets.macrodata (US quarterly macro series 1959Q1–2009Q3,
shipped with statsmodels); the natural logs of realgdp, realcons, realinv
and the level of the 3-month rate tbilrate.

stdout (JSON):
- data: the series, by name
- adf: statsmodels.tsa.stattools.adfuller (autolag="aic", and a fixed maxlag) per series and regression
- coint: statsmodels.tsa.stattools.coint (Engle–Granger, autolag "aic") for pairs and a triple, trends c and ct
- johansen: statsmodels.tsa.vector_ar.vecm.coint_johansen for det_order -1, 0, 1 and k_ar_diff 1, 2
- ecm: statsmodels OLS of each series' difference on a constant, the lagged
  Engle–Granger residual and one lag of every difference (coefficient, SE)
- crit: statsmodels.tsa.adfvalues.mackinnoncrit for N = 1..12, c and ct, at T = inf, 50, 200
- pvalues: statsmodels.tsa.adfvalues.mackinnonp on a grid of statistics
"""
import json
import sys

import numpy as np
import statsmodels.api as sm
from statsmodels.tsa.stattools import adfuller, coint
from statsmodels.tsa.vector_ar.vecm import coint_johansen
from statsmodels.tsa.adfvalues import mackinnoncrit, mackinnonp

d = sm.datasets.macrodata.load_pandas().data
series = {
    "gdp": np.log(d["realgdp"].to_numpy()),
    "cons": np.log(d["realcons"].to_numpy()),
    "inv": np.log(d["realinv"].to_numpy()),
    "tbill": d["tbilrate"].to_numpy(),
}
out = {"data": {k: v.tolist() for k, v in series.items()}}

adf = []
for name, x in series.items():
    for reg in ("c", "ct"):
        s, p, lag, nobs, crit, ic = adfuller(x, regression=reg, autolag="AIC")
        adf.append({"series": name, "regression": reg, "autolag": True, "stat": s, "p": p, "lag": lag, "nobs": nobs, "crit": [crit["1%"], crit["5%"], crit["10%"]], "icbest": ic})
        s, p, lag, nobs, crit = adfuller(x, regression=reg, maxlag=4, autolag=None)
        adf.append({"series": name, "regression": reg, "autolag": False, "maxlag": 4, "stat": s, "p": p, "lag": lag, "nobs": nobs, "crit": [crit["1%"], crit["5%"], crit["10%"]]})
out["adf"] = adf

co = []
for names in (["cons", "gdp"], ["gdp", "cons"], ["inv", "gdp"], ["cons", "gdp", "inv"]):
    for trend in ("c", "ct"):
        y0 = series[names[0]]
        y1 = np.column_stack([series[n] for n in names[1:]])
        s, p, crit = coint(y0, y1, trend=trend, autolag="aic")
        co.append({"names": names, "trend": trend, "stat": s, "p": p, "crit": list(crit)})
out["coint"] = co

jo = []
for names in (["cons", "gdp"], ["cons", "gdp", "inv"]):
    x = np.column_stack([series[n] for n in names])
    for det in (-1, 0, 1):
        for k in (1, 2):
            r = coint_johansen(x, det, k)
            jo.append({"names": names, "det": det, "k": k, "eig": r.eig.tolist(), "evec": r.evec.tolist(), "trace": r.lr1.tolist(), "maxeig": r.lr2.tolist(), "cvt": r.cvt.tolist(), "cvm": r.cvm.tolist()})
out["johansen"] = jo

ecm = []
for names in (["cons", "gdp"],):
    y0 = series[names[0]]
    others = np.column_stack([series[n] for n in names[1:]])
    res = sm.OLS(y0, sm.add_constant(others, prepend=False)).fit()
    e = res.resid
    dx = np.diff(np.column_stack([series[n] for n in names]), axis=0)
    X = np.column_stack([np.ones(len(dx) - 1), e[1:-1], dx[:-1]])
    for i, n in enumerate(names):
        f = sm.OLS(dx[1:, i], X).fit()
        ecm.append({"names": names, "series": n, "coef": res.params.tolist(), "alpha": f.params[1], "se": f.bse[1]})
out["ecm"] = ecm

crit = []
for reg in ("c", "ct"):
    for n in range(1, 13):
        for t in (np.inf, 50, 200):
            crit.append({"regression": reg, "N": n, "T": None if t is np.inf else t, "crit": list(mackinnoncrit(N=n, regression=reg, nobs=t))})
out["crit"] = crit

pv = []
for reg in ("c", "ct"):
    for n in range(1, 7):
        for s in (-30.0, -6.0, -4.5, -3.9, -3.3, -2.7, -2.0, -1.0, 0.0, 0.6, 3.0):
            pv.append({"regression": reg, "N": n, "stat": s, "p": mackinnonp(s, regression=reg, N=n)})
out["pvalues"] = pv
json.dump(out, sys.stdout)
