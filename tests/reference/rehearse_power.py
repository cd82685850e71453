"""Reference values for the rehearsal of studies: SciPy/NumPy only, JSON in and out.

case "discrete": a VAR(1) given by Φ and Σu -> the continuous drift A = logm(Φ) and noise
G Gᵀ with Q(1) = Σu (solving the linear Van Loan relation), the stationary Γ0 and the
textbook asymptotic SE of φ_ij, Σu_ii (Γ0⁻¹)_jj / T (Lütkepohl 2005, Prop. 3.1), and power.
case "continuous": Φ(Δ) = expm(AΔ), Σ from the continuous Lyapunov equation.
"""
import json, sys
import numpy as np
import scipy.linalg as sl
from scipy.stats import norm

req = json.load(sys.stdin)
out = {}
if req["case"] == "discrete":
    P = np.array(req["phi"]); S = np.array(req["sigma_u"]); T = req["T"]; n = len(P)
    A = np.real(sl.logm(P))
    # Q(1) = ∫0^1 e^{As} W e^{Aᵀs} ds is linear in W: build the n²×n² map column by column.
    def q_of(W):
        M = np.block([[-A, W], [np.zeros((n, n)), A.T]])
        F = sl.expm(M)
        return F[n:, n:].T @ F[:n, n:]
    cols = []
    for k in range(n * n):
        E = np.zeros(n * n); E[k] = 1
        cols.append(q_of(E.reshape(n, n)).ravel())
    W = np.linalg.solve(np.array(cols).T, S.ravel()).reshape(n, n)
    G0 = sl.solve_discrete_lyapunov(P, S)
    Gi = np.linalg.inv(G0)
    i, j = req["target"], req["source"]
    se = float(np.sqrt(S[i, i] * Gi[j, j] / T))
    z = norm.ppf(1 - req["alpha"] / 2)
    d = abs(P[i, j]) / se
    out = {"drift": A.tolist(), "diffusion": W.tolist(), "gamma0": G0.tolist(), "se": se,
           "power": float(norm.cdf(d - z) + norm.cdf(-d - z))}
elif req["case"] == "continuous":
    A = np.array(req["drift"]); W = np.diag(req["noise"])
    Sig = sl.solve_continuous_lyapunov(A, -W)
    out = {"sigma": Sig.tolist(), "phi": [sl.expm(A * d).tolist() for d in req["gaps"]]}
json.dump(out, sys.stdout)
