"""Least-squares VAR(1) over consecutive prompts of a simulated study (statsmodels).

Run with Debian's /usr/bin/python3 (statsmodels lives there). stdin:
{"a": [[...]] drift, "noise": [...] diagonal of G G', "replicates": [
  {"time": [...] answered prompt times, "day": [...] their days, "seed": int}, ...],
 "expect_a": [[...]] (optional), "gap": float, "spread": float}
For each replicate: a stationary start x0 ~ N(0, Sigma) (Sigma from
scipy.linalg.solve_continuous_lyapunov), then over each gap d the exact
discrete step x' = expm(A d) x + e, e ~ N(0, Sigma - Phi Sigma Phi') (the
stationary process observed at the prompt times, no measurement error).
stdout: per replicate the VAR(1) coefficient matrix statsmodels fits to the
series (no trend: the process has mean zero) and the least-squares matrix
over same-day pairs only (statsmodels OLS per equation, no constant); and
E[expm(A (gap + spread T))], T triangular on (-1, 1), by scipy quad_vec.
"""
import json
import sys

import numpy as np
import statsmodels.api as sm
from scipy.integrate import quad_vec
from scipy.linalg import cholesky, expm, solve_continuous_lyapunov
from statsmodels.tsa.api import VAR

d = json.load(sys.stdin)
a = np.array(d["a"], dtype=float)
n = a.shape[0]
gg = np.diag(np.array(d["noise"], dtype=float))
sigma = solve_continuous_lyapunov(a, -gg)
out = {"pooled": [], "sameDay": []}
for rep in d["replicates"]:
    rng = np.random.default_rng(rep["seed"])
    t = np.array(rep["time"], dtype=float)
    day = np.array(rep["day"])
    x = np.zeros((len(t), n))
    x[0] = cholesky(sigma, lower=True) @ rng.standard_normal(n)
    for k in range(1, len(t)):
        phi = expm(a * (t[k] - t[k - 1]))
        q = sigma - phi @ sigma @ phi.T
        q = 0.5 * (q + q.T)
        x[k] = phi @ x[k - 1] + cholesky(q, lower=True) @ rng.standard_normal(n)
    fit = VAR(x).fit(1, trend="n")
    out["pooled"].append(fit.coefs[0].tolist())
    same = day[1:] == day[:-1]
    xs, ys = x[:-1][same], x[1:][same]
    out["sameDay"].append([sm.OLS(ys[:, i], xs).fit().params.tolist() for i in range(n)])
s = float(d["spread"])
g = float(d["gap"])
tri = quad_vec(lambda u: ((1 - abs(u)) * expm(a * (g + s * u))).ravel(), -1.0, 1.0, epsabs=0.0, epsrel=1e-12, points=[0.0])[0]
out["triangular"] = tri.reshape(n, n).tolist()
json.dump(out, sys.stdout)
