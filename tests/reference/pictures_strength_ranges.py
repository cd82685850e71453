"""Reference for the design advice under strength ranges, with SciPy.

stdin: {"drifts": [[[...]], ...] (one drift per draw), "states": [...], "intervals": [...],
        "links": [{"from": ..., "to": ...}], "fraction": float, "pointBest": float}
stdout: per draw, as tests/reference/link_curves.py computes it: the grid interval maximising the
        smallest share of peak (peak of |expm(A d)[to, from]| refined by minimize_scalar), and whether
        pointBest lies in every link's range of grid intervals with |effect| >= fraction * |peak|.
"""
import json
import sys

import numpy as np
from scipy.linalg import expm
from scipy.optimize import minimize_scalar

d = json.load(sys.stdin)
states = d["states"]
grid = np.array(d["intervals"], dtype=float)
frac = float(d["fraction"])
point = d["pointBest"]
out = {"best": [], "holds": []}
for drift in d["drifts"]:
    A = np.array(drift, dtype=float)
    curves = []
    for link in d["links"]:
        i, j = states.index(link["to"]), states.index(link["from"])
        f = lambda x, i=i, j=j: expm(A * x)[i, j]
        eff = np.array([f(x) for x in grid])
        k = int(np.argmax(np.abs(eff)))
        peak = None
        if 0 < k < len(grid) - 1:
            r = minimize_scalar(lambda x: -abs(f(x)), bounds=(grid[k - 1], grid[k + 1]), method="bounded", options={"xatol": 1e-10 * grid[k]})
            peak = float(f(r.x))
        curves.append((eff, peak))
    if all(p is not None for _, p in curves):
        share = np.min(np.array([np.abs(e) / abs(p) for e, p in curves]), axis=0)
        out["best"].append(float(grid[int(np.argmax(share))]))
        ok = True
        for e, p in curves:
            inside = grid[np.abs(e) >= frac * abs(p)]
            if len(inside) == 0 or not (inside[0] <= point <= inside[-1]):
                ok = False
        out["holds"].append(ok)
    else:
        out["best"].append(None)
        out["holds"].append(False)
json.dump(out, sys.stdout)
