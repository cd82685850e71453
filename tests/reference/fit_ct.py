"""Independent −2 log-likelihood of the continuous-time model (SciPy/NumPy), and its minimum.

The model (the same as src/core/fit/ct.ts describes, written again from that
description): states eta with d eta = A eta dt + G dW; over an interval D,
eta(t+D) = expm(A D) eta(t) + w, w ~ N(0, Q(D)) with Q from Van Loan's block
exponential (Van Loan 1978, Theorem 1) by scipy.linalg.expm; measured y_j =
eta_s(j) + mu_j + tau_j + eps_j, tau ~ N(0, Psi) per person (random
intercepts, as extra constant states), eps ~ N(0, r_j); Kalman filter over
observed cells (Harvey 1989, §3.4); initial state stationary
(scipy.linalg.solve_continuous_lyapunov) or free (m0, P0).

stdin: {"persons": [{"time": [...], "values": [[...] or null per measured var]}],
        "n": states, "reads": [state of each measured var], "free": [[bool]],
        "initial": "free"|"stationary", "intercepts": "random"|"common",
        "error": bool, "diffusion": "full"|"diagonal", "start": [...], "optimize": bool}
stdout: {"start": -2LL at start, "min": -2LL at the optimum, "x": optimum}
"""
import json
import sys

import numpy as np
from scipy.linalg import expm, solve_continuous_lyapunov
from scipy.optimize import minimize

d = json.load(sys.stdin)
n = d["n"]
reads = d["reads"]
m = len(reads)
free = np.array(d["free"], dtype=bool)
measured_state = [i in reads for i in range(n)]


def unpack(th):
    th = list(th)
    k = 0
    A = np.zeros((n, n))
    for i in range(n):
        for j in range(n):
            if free[i, j]:
                A[i, j] = th[k]; k += 1
    L = np.zeros((n, n))
    for i in range(n):
        if not measured_state[i]:
            L[i, i] = 1.0
            continue
        for j in range(i + 1):
            if not measured_state[j] or (j < i and d["diffusion"] == "diagonal"):
                continue
            L[i, j] = np.exp(th[k]) if i == j else th[k]; k += 1
    mu = np.array(th[k:k + m]); k += m
    r = np.zeros(m)
    if d["error"]:
        r = np.exp(2 * np.array(th[k:k + m])); k += m
    psi = None
    if d["intercepts"] == "random":
        Lp = np.zeros((m, m))
        for i in range(m):
            for j in range(i + 1):
                Lp[i, j] = np.exp(th[k]) if i == j else th[k]; k += 1
        psi = Lp @ Lp.T
    m0 = P0 = None
    if d["initial"] == "free":
        m0 = np.array(th[k:k + n]); k += n
        Lq = np.zeros((n, n))
        for i in range(n):
            for j in range(i + 1):
                Lq[i, j] = np.exp(th[k]) if i == j else th[k]; k += 1
        P0 = Lq @ Lq.T
    return A, L @ L.T, mu, r, psi, m0, P0


def van_loan(A, GG, D):
    M = np.zeros((2 * n, 2 * n))
    M[:n, :n] = -A; M[:n, n:] = GG; M[n:, n:] = A.T
    E = expm(M * D)
    phi = E[n:, n:].T
    q = phi @ E[:n, n:]
    return phi, 0.5 * (q + q.T)


def m2ll(th):
    A, GG, mu, r, psi, m0, P0 = unpack(th)
    if d["initial"] == "stationary":
        if np.any(np.linalg.eigvals(A).real >= 0):
            return np.inf
        S = solve_continuous_lyapunov(A, -GG)
    dim = n + (m if psi is not None else 0)
    Z = np.zeros((m, dim))
    for j, s in enumerate(reads):
        Z[j, s] = 1.0
        if psi is not None:
            Z[j, n + j] = 1.0
    total = 0.0
    for p in d["persons"]:
        a = np.zeros(dim); P = np.zeros((dim, dim))
        if d["initial"] == "free":
            a[:n] = m0; P[:n, :n] = P0
        else:
            P[:n, :n] = S
        if psi is not None:
            P[n:, n:] = psi
        t = p["time"]
        for k in range(len(t)):
            if k > 0:
                phi, q = van_loan(A, GG, t[k] - t[k - 1])
                T = np.eye(dim); T[:n, :n] = phi
                Qa = np.zeros((dim, dim)); Qa[:n, :n] = q
                a = T @ a; P = T @ P @ T.T + Qa
            y = p["values"][k]
            o = [j for j in range(m) if y[j] is not None]
            if not o:
                continue
            Zo = Z[o]
            v = np.array([y[j] for j in o]) - Zo @ a - mu[o]
            F = Zo @ P @ Zo.T + np.diag(r[o])
            try:
                c = np.linalg.cholesky(F)
            except np.linalg.LinAlgError:
                return np.inf
            Fi = np.linalg.inv(F)
            total += len(o) * np.log(2 * np.pi) + 2 * np.sum(np.log(np.diag(c))) + v @ Fi @ v
            K = P @ Zo.T @ Fi
            a = a + K @ v
            P = P - K @ Zo @ P
            P = 0.5 * (P + P.T)
    return total


start = np.array(d["start"], dtype=float)
out = {"start": m2ll(start)}
if d.get("optimize", True) and "target" in d:
    # Benchmark mode: BFGS from the start until -2LL first reaches the target (seconds in "reached"),
    # or until "budget" seconds have passed (best value in "best").
    import time

    class Stop(Exception):
        pass

    t0 = time.perf_counter()
    best = [np.inf]

    def timed(th):
        v = m2ll(th)
        best[0] = min(best[0], v)
        if v <= d["target"]:
            out["reached"] = time.perf_counter() - t0
            raise Stop()
        if time.perf_counter() - t0 > d["budget"]:
            raise Stop()
        return v

    try:
        minimize(timed, start, method="BFGS", options={"gtol": 1e-6, "maxiter": 2000})
    except Stop:
        pass
    out["best"] = float(best[0])
    out["elapsed"] = time.perf_counter() - t0
elif d.get("optimize", True):
    res = minimize(m2ll, start, method="BFGS", options={"gtol": 1e-6, "maxiter": 2000})
    out["min"] = float(res.fun)
    out["x"] = res.x.tolist()
json.dump(out, sys.stdout)
