"""Timings and reference results for bench/numeric.ts, measured inside Python.

stdin: {"a": [[...]] (100x100), "c": [[...]], "interval": float, "robertson": {"rtol", "atol", "times"}}
stdout: expm / Van Loan (block exponential) results and median times, Robertson
solved by scipy.integrate.solve_ivp Radau at the bench tolerance (nfev, time,
values) and at a tight tolerance (values), all with the analytic Jacobian.
"""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.linalg import expm

d = json.load(sys.stdin)
a = np.array(d["a"], dtype=float)
c = np.array(d["c"], dtype=float)
dt = float(d["interval"])
n = a.shape[0]


def median_time(fn, repeat=15):
    ts = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        r = fn()
        ts.append(time.perf_counter() - t0)
    return float(np.median(ts)), r


t_expm, e = median_time(lambda: expm(a))


def vanloan():
    block = np.zeros((2 * n, 2 * n))
    block[:n, :n] = -a
    block[:n, n:] = c
    block[n:, n:] = a.T
    f = expm(block * dt)
    phi = f[n:, n:].T
    return phi, phi @ f[:n, n:]


t_vl, (phi, q) = median_time(vanloan)


def rob(t, y):
    return [-0.04 * y[0] + 1e4 * y[1] * y[2], 0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] ** 2, 3e7 * y[1] ** 2]


def rob_j(t, y):
    return [[-0.04, 1e4 * y[2], 1e4 * y[1]], [0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]], [0.0, 6e7 * y[1], 0.0]]


rb = d["robertson"]
times = rb["times"]
t0 = time.perf_counter()
r = solve_ivp(rob, (0.0, times[-1]), [1.0, 0.0, 0.0], method="Radau", t_eval=times, rtol=rb["rtol"], atol=rb["atol"], jac=rob_j)
t_rob = time.perf_counter() - t0
tight = solve_ivp(rob, (0.0, times[-1]), [1.0, 0.0, 0.0], method="Radau", t_eval=times, rtol=1e-12, atol=1e-18, jac=rob_j)
json.dump(
    {
        "expm": e.tolist(),
        "expm_s": t_expm,
        "phi": phi.tolist(),
        "q": (0.5 * (q + q.T)).tolist(),
        "vanloan_s": t_vl,
        "rob_values": r.y.T.tolist(),
        "rob_nfev": int(r.nfev),
        "rob_s": t_rob,
        "rob_tight": tight.y.T.tolist(),
    },
    sys.stdout,
)
