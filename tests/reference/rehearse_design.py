"""Reference values for `loopfold power` and `loopfold plan`: SciPy/NumPy only, JSON in and out.

A linear process dx = A x dt + G dW (G Gᵀ = diag(noise)) sampled every Δ with no measurement
error is a VAR(1) with Φ = expm(AΔ) and Σu = Σ − ΦΣΦᵀ, Σ the stationary covariance
(solve_continuous_lyapunov). The textbook asymptotic SE of φ_ij from T pairs is
√(Σu_ii (Σ⁻¹)_jj / T) (Lütkepohl 2005, New Introduction to Multiple Time Series Analysis,
Prop. 3.1); N persons pooled divide the variance by N. Power of the two-sided Wald test at α:
Φ(|b|/se − z) + Φ(−|b|/se − z), z = Φ⁻¹(1 − α/2).

stdin: {"drift", "noise", "delta", "pairs", "persons", "target", "source", "alpha", "bounds": [lo, hi]}
stdout: {"phi", "se", "power", "peak": Δ maximising |Φ_ij(Δ)|,
         "best": Δ maximising power at a fixed number of pairs}
"""
import json
import sys

import numpy as np
import scipy.linalg as sl
from scipy.optimize import minimize_scalar
from scipy.stats import norm

d = json.load(sys.stdin)
A = np.array(d["drift"], dtype=float)
W = np.diag(d["noise"])
S = sl.solve_continuous_lyapunov(A, -W)
i, j = d["target"], d["source"]
z = norm.ppf(1 - d["alpha"] / 2)


def at(delta):
    P = sl.expm(A * delta)
    Su = S - P @ S @ P.T
    se = np.sqrt(Su[i, i] * np.linalg.inv(S)[j, j] / d["pairs"] / d["persons"])
    b = P[i, j]
    return P, se, norm.cdf(abs(b) / se - z) + norm.cdf(-abs(b) / se - z)


P, se, power = at(d["delta"])
lo, hi = d["bounds"]
peak = minimize_scalar(lambda x: -abs(sl.expm(A * np.exp(x))[i, j]), bounds=(np.log(lo), np.log(hi)), method="bounded", options={"xatol": 1e-8})
best = minimize_scalar(lambda x: -at(np.exp(x))[2], bounds=(np.log(lo), np.log(hi)), method="bounded", options={"xatol": 1e-8})
print(json.dumps({"phi": P.tolist(), "se": float(se), "power": float(power), "peak": float(np.exp(peak.x)), "best": float(np.exp(best.x))}))
