"""NumPy side of `npm run bench -- power`: the same design simulated by the exact discrete model
(Φ = expm(AΔ), Q = Σ − ΦΣΦᵀ, stationary start) and analysed per replication by least squares
on person-mean-centred pairs (all persons pooled), with cluster-robust (by person) SEs.
stdin: {"drift", "noise", "persons", "prompts", "replications", "links": [[target, source], ...]}
stdout: {"seconds", "power": [...], "mean": [...]}
"""
import json
import sys
import time

import numpy as np
import scipy.linalg as sl
from scipy.stats import norm

d = json.load(sys.stdin)
A = np.array(d["drift"]); n = len(A)
S = sl.solve_continuous_lyapunov(A, -np.diag(d["noise"]))
P = sl.expm(A)
Lq = np.linalg.cholesky(S - P @ S @ P.T)
Ls = np.linalg.cholesky(S)
N, T, K = d["persons"], d["prompts"], d["replications"]
z = norm.ppf(0.975)
rng = np.random.default_rng(1)
rej = np.zeros(len(d["links"])); tot = np.zeros(len(d["links"]))
t0 = time.perf_counter()
for _ in range(K):
    x = np.empty((N, T, n))
    x[:, 0] = rng.standard_normal((N, n)) @ Ls.T
    e = rng.standard_normal((N, T, n)) @ Lq.T
    for k in range(1, T):
        x[:, k] = x[:, k - 1] @ P.T + e[:, k]
    xc = x - x.mean(axis=1, keepdims=True)
    X = xc[:, :-1].reshape(-1, n); Y = xc[:, 1:].reshape(-1, n)
    XtXi = np.linalg.inv(X.T @ X)
    B = XtXi @ X.T @ Y  # column i: equation of target i
    U = Y - X @ B
    for li, (i, j) in enumerate(d["links"]):
        g = (X * U[:, [i]]).reshape(N, T - 1, n).sum(axis=1)
        V = XtXi @ (g.T @ g) @ XtXi
        b = B[j, i]; se = np.sqrt(V[j, j])
        tot[li] += b; rej[li] += abs(b) > z * se
secs = time.perf_counter() - t0
print(json.dumps({"seconds": secs, "power": (rej / K).tolist(), "mean": (tot / K).tolist()}))
