"""Reference solutions of stiff test problems by scipy.integrate.solve_ivp(method="Radau").

stdin: {"problem": "robertson" | "vanderpol", "mu": float, "times": [...], "rtol": float, "atol": float}
stdout: {"values": [[y at each time]], "nfev": int, "njev": int, "seconds": float}
Robertson (1966) and Van der Pol are problems of the test set in Hairer & Wanner,
Solving ODEs II, Sec. IV.1 and IV.10. The analytic Jacobian is supplied.
"""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp

d = json.load(sys.stdin)
mu = float(d.get("mu", 1000.0))


def rob(t, y):
    return [-0.04 * y[0] + 1e4 * y[1] * y[2], 0.04 * y[0] - 1e4 * y[1] * y[2] - 3e7 * y[1] ** 2, 3e7 * y[1] ** 2]


def rob_j(t, y):
    return [[-0.04, 1e4 * y[2], 1e4 * y[1]], [0.04, -1e4 * y[2] - 6e7 * y[1], -1e4 * y[1]], [0.0, 6e7 * y[1], 0.0]]


def vdp(t, y):
    return [y[1], mu * (1 - y[0] ** 2) * y[1] - y[0]]


def vdp_j(t, y):
    return [[0.0, 1.0], [-2 * mu * y[0] * y[1] - 1, mu * (1 - y[0] ** 2)]]


if d["problem"] == "robertson":
    f, j, y0 = rob, rob_j, [1.0, 0.0, 0.0]
else:
    f, j, y0 = vdp, vdp_j, [2.0, 0.0]
times = d["times"]
start = time.perf_counter()
r = solve_ivp(f, (0.0, times[-1]), y0, method="Radau", t_eval=times, rtol=d["rtol"], atol=d["atol"], jac=j)
seconds = time.perf_counter() - start
json.dump({"values": np.asarray(r.y).T.tolist(), "nfev": int(r.nfev), "njev": int(r.njev), "seconds": seconds, "success": bool(r.success)}, sys.stdout)
