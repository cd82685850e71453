"""Reference values from SciPy/NumPy for the dense numerics tests.

stdin: {"cases": [{"a": [[...]], "c": [[...]], "interval": float}]}
stdout: per case: expm(a), expm(a*interval), Van Loan Q(interval) from the
integral itself, int_0^dt e^{As} C e^{A^T s} ds, by scipy.integrate.quad_vec
(adaptive Gauss-Kronrod) with scipy.linalg.expm in the integrand,
the Lyapunov solution of A X + X A^T + C = 0 by
scipy.linalg.solve_continuous_lyapunov (Bartels-Stewart), and the eigenvalues
from numpy.linalg.eigvals (LAPACK dgeev).
"""
import json
import sys

import numpy as np
from scipy.integrate import quad_vec
from scipy.linalg import expm, solve_continuous_lyapunov

data = json.load(sys.stdin)
out = []
for case in data["cases"]:
    a = np.array(case["a"], dtype=float)
    c = np.array(case["c"], dtype=float)
    dt = float(case["interval"])
    n = a.shape[0]
    def integrand(s):
        e = expm(a * s)
        return (e @ c @ e.T).ravel()

    q = quad_vec(integrand, 0.0, dt, epsabs=0.0, epsrel=1e-13, limit=2000)[0].reshape(n, n)
    res = {
        "expm": expm(a).tolist(),
        "phi": expm(a * dt).tolist(),
        "q": (0.5 * (q + q.T)).tolist(),
        "eig_re": [],
        "eig_im": [],
    }
    ev = np.linalg.eigvals(a)
    res["eig_re"] = ev.real.tolist()
    res["eig_im"] = ev.imag.tolist()
    if np.all(ev.real < 0):
        # solve_continuous_lyapunov(A, Q) solves A X + X A^H = Q.
        res["lyap"] = solve_continuous_lyapunov(a, -c).tolist()
    out.append(res)
json.dump(out, sys.stdout)
