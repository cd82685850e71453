"""Reference values for the sampled model, timescales and link curves (SciPy/NumPy).

stdin: {"phi1": [[...]] (optional: the drift is then scipy.linalg.logm(phi1)),
        "a": [[...]] (used when phi1 is absent), "interval": float, "noise": [...],
        "link": [i, j], "bounds": [lo, hi]}
stdout: drift, phi = expm(A*interval), q by quad_vec of the defining integral,
sigma by solve_continuous_lyapunov, partial correlations of q, the interval in
`bounds` where |expm(A d)[i, j]| peaks (scipy.optimize.minimize_scalar, bounded),
and participation factors |V * inv(V).T| normalised per mode (numpy.linalg.eig).
"""
import json
import sys

import numpy as np
from scipy.integrate import quad_vec
from scipy.linalg import expm, logm, solve_continuous_lyapunov
from scipy.optimize import minimize_scalar

d = json.load(sys.stdin)
a = np.real(logm(np.array(d["phi1"], dtype=float))) if "phi1" in d else np.array(d["a"], dtype=float)
n = a.shape[0]
dt = float(d["interval"])
c = np.diag(np.array(d["noise"], dtype=float))
q = quad_vec(lambda s: (expm(a * s) @ c @ expm(a * s).T).ravel(), 0.0, dt, epsabs=0.0, epsrel=1e-13)[0].reshape(n, n)
q = 0.5 * (q + q.T)
p = np.linalg.inv(q)
partial = -p / np.sqrt(np.outer(np.diag(p), np.diag(p)))
np.fill_diagonal(partial, 1.0)
out = {"drift": a.tolist(), "phi": expm(a * dt).tolist(), "q": q.tolist(), "partial": partial.tolist()}
if np.all(np.linalg.eigvals(a).real < 0):
    out["sigma"] = solve_continuous_lyapunov(a, -c).tolist()
if "link" in d:
    i, j = d["link"]
    r = minimize_scalar(lambda s: -abs(expm(a * s)[i, j]), bounds=tuple(d["bounds"]), method="bounded", options={"xatol": 1e-10})
    out["peak"] = [float(r.x), float(expm(a * r.x)[i, j])]
w, v = np.linalg.eig(a)
pf = np.abs(v * np.linalg.inv(v).T)
pf = pf / pf.sum(axis=0, keepdims=True)
out["eig_re"] = w.real.tolist()
out["eig_im"] = w.imag.tolist()
out["participation"] = pf.tolist()  # rows: states, columns: modes
json.dump(out, sys.stdout)
