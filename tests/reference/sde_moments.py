"""Exact moments of a linear stochastic differential equation dX = A X dt + G dW (SciPy only, JSON in and out).

mean(t) = expm(A t) x0; covariance Q(t) = ∫0^t e^{As} G Gᵀ e^{Aᵀs} ds by Van Loan's block exponential
(Van Loan 1978, IEEE Trans. Automatic Control 23, 395–404).
"""
import json, sys
import numpy as np
import scipy.linalg as sl

req = json.load(sys.stdin)
A = np.array(req["drift"]); g = np.array(req["diffusion"]); x0 = np.array(req["x0"]); t = req["t"]
n = len(A)
W = np.diag(g ** 2)
M = np.block([[-A, W], [np.zeros((n, n)), A.T]]) * t
F = sl.expm(M)
Phi = F[n:, n:].T
Q = Phi @ F[:n, n:]
json.dump({"mean": (Phi @ x0).tolist(), "cov": ((Q + Q.T) / 2).tolist()}, sys.stdout)
