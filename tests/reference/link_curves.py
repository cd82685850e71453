"""Reference for the link-strength curve and the interval advice, with SciPy.

stdin: {"drift": [[...]], "states": [...], "intervals": [...],
        "links": [{"from": ..., "to": ...}], "fraction": float}
stdout: per link: effect = scipy.linalg.expm(A*d)[to, from] on the grid, the
        peak of |effect| refined by scipy.optimize.minimize_scalar (bounded,
        between the grid neighbours of the grid maximum), the range of grid
        intervals where |effect| >= fraction * |peak|; and the grid interval
        maximising the smallest share of peak over the links.
"""
import json
import sys

import numpy as np
from scipy.linalg import expm
from scipy.optimize import minimize_scalar

d = json.load(sys.stdin)
A = np.array(d["drift"], dtype=float)
states = d["states"]
grid = np.array(d["intervals"], dtype=float)
frac = float(d["fraction"])
out = {"links": []}
curves = []
for link in d["links"]:
    i, j = states.index(link["to"]), states.index(link["from"])
    f = lambda x: expm(A * x)[i, j]
    eff = np.array([f(x) for x in grid])
    k = int(np.argmax(np.abs(eff)))
    peak = None
    if 0 < k < len(grid) - 1:
        r = minimize_scalar(lambda x: -abs(f(x)), bounds=(grid[k - 1], grid[k + 1]), method="bounded", options={"xatol": 1e-10 * grid[k]})
        peak = {"interval": float(r.x), "effect": float(f(r.x))}
    rng = None
    if peak is not None:
        ok = grid[np.abs(eff) >= frac * abs(peak["effect"])]
        rng = [float(ok[0]), float(ok[-1])] if len(ok) else None
    curves.append((eff, peak))
    out["links"].append({"effect": eff.tolist(), "peak": peak, "range": rng})
if all(p is not None for _, p in curves):
    share = np.min(np.array([np.abs(e) / abs(p["effect"]) for e, p in curves]), axis=0)
    out["best"] = float(grid[int(np.argmax(share))])
    out["score"] = float(np.max(share))
else:
    out["best"] = None
json.dump(out, sys.stdout)
