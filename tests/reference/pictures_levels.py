"""Reference covariances and lagged-matrix singular values for tests/core/pictures (SciPy/NumPy).

Input (stdin JSON): { "A": drift, "B": input gains, "V": input variances (list),
"noise": per-state noise intensity, "interval": D, "samples": T, "observed": [indices],
"grid": [intervals] }.
Output: equilibria = A^-1 B V B' A^-T; stationary Sigma from scipy.linalg.solve_continuous_lyapunov
(A S + S A' = -G G'); meanError = (1/T^2) sum_{s,t} Gamma(t - s) with Gamma(h) = Phi^h Sigma
(the variance of a mean of a stationary series: Hamilton 1994, eq. 7.2.6), summed term by term
over all T^2 pairs; within = Sigma - meanError; between = equilibria + meanError;
cross = equilibria + Sigma, over the observed indices; and for each grid interval the singular
values of expm(A D)[observed][:, observed] from numpy.linalg.svd.
"""
import json
import sys

import numpy as np
from scipy.linalg import expm, solve_continuous_lyapunov

d = json.load(sys.stdin)
A = np.array(d["A"], dtype=float)
B = np.array(d["B"], dtype=float)
V = np.diag(d["V"])
n = A.shape[0]
Ainv = np.linalg.inv(A)
eq = Ainv @ B @ V @ B.T @ Ainv.T
S = solve_continuous_lyapunov(A, -np.diag(d["noise"]))
Phi = expm(A * d["interval"])
T = int(d["samples"])
gam = [S]
for h in range(1, T):
    gam.append(Phi @ gam[-1])
C = np.zeros((n, n))
for s in range(T):
    for t in range(T):
        C += gam[t - s] if t >= s else gam[s - t].T
C /= T * T
o = d["observed"]
sub = lambda M: M[np.ix_(o, o)].tolist()
sv = [np.linalg.svd(expm(A * D)[np.ix_(o, o)], compute_uv=False).tolist() for D in d["grid"]]
print(json.dumps({
    "equilibria": sub(eq), "stationary": sub(S), "meanError": sub(C),
    "within": sub(S - C), "between": sub(eq + C), "cross": sub(eq + S), "singular": sv,
}))
