"""Reference for the stability checks: the linear drift of a sketch built
independently from the documented sketch reading, and its eigenvalues and
participation factors from NumPy (LAPACK dgeev).

Sketch reading (DEVELOPERS.md, src/core/numeric/system.ts): a derived variable
is v = sum(sign * strength * source) over its instantaneous links; a state is
dx/dt = (sum(sign * strength * source) - x) / tau over its integrating links
(without the "- x" when marked not self-regulating). A link without a strength
gets 0.8 / n, n the number of links that count for its target.
Participation factors: p_ki = |v_ki w_ik| with W = V^-1, normalised per mode
(Perez-Arriaga, Verghese & Schweppe 1982).

stdin: {"cases": [model, ...]} or {"matrices": [[[...]]]}
stdout: per case {"drift", "re", "im", "participation" (per mode, per state)}
"""
import json
import sys

import numpy as np

UNIT = {"s": 1, "min": 60, "h": 3600, "day": 86400, "week": 604800}


def tau_of(v, unit):
    t = v.get("timescale")
    if t is None:
        return 1.0
    if isinstance(t, (int, float)):
        return float(t)
    num, name = t.split()
    name = {"days": "day", "weeks": "week", "hours": "h"}.get(name, name)
    return float(num) * UNIT[name] / UNIT[unit]


def drift(model):
    vs = model["variables"]
    kind = {v["id"]: v["kind"] for v in vs}
    states = [v["id"] for v in vs if v["kind"] == "state"]
    derived = [v["id"] for v in vs if v["kind"] == "derived"]
    counts = lambda l: l["from"] != l["to"] and ((kind[l["to"]] == "derived" and l["kind"] == "instantaneous") or (kind[l["to"]] == "state" and l["kind"] == "integrating"))
    n_in = {}
    for l in model["links"]:
        if counts(l):
            n_in[l["to"]] = n_in.get(l["to"], 0) + 1
    ix = {s: i for i, s in enumerate(states)}
    iz = {d: i for i, d in enumerate(derived)}
    n, m = len(states), len(derived)
    cxx, cxz, czx, czz = np.zeros((n, n)), np.zeros((n, m)), np.zeros((m, n)), np.zeros((m, m))
    for l in model["links"]:
        if not counts(l):
            continue
        w = l.get("weight", 0.8 / n_in[l["to"]]) * (-1 if l.get("sign") == "-" else 1)
        f, t = l["from"], l["to"]
        if kind[f] == "input":
            continue
        if t in ix:
            (cxx if f in ix else cxz)[ix[t], ix[f] if f in ix else iz[f]] += w
        else:
            (czx if f in ix else czz)[iz[t], ix[f] if f in ix else iz[f]] += w
    k = cxx + (cxz @ np.linalg.solve(np.eye(m) - czz, czx) if m else 0)
    a = np.zeros((n, n))
    for v in vs:
        if v["kind"] != "state":
            continue
        i = ix[v["id"]]
        a[i] = k[i] - (np.eye(n)[i] if v.get("selfRegulating", True) else 0)
        a[i] /= tau_of(v, model["timeUnit"])
    return a


def modes(a):
    ev, V = np.linalg.eig(a)
    W = np.linalg.inv(V)
    p = np.abs(V * W.T)
    p = p / p.sum(axis=0, keepdims=True)
    return {"re": ev.real.tolist(), "im": ev.imag.tolist(), "participation": p.T.tolist()}


data = json.load(sys.stdin)
out = []
for model in data.get("cases", []):
    a = drift(model)
    out.append({"drift": a.tolist(), **modes(a)})
for a in data.get("matrices", []):
    out.append({"drift": a, **modes(np.array(a, dtype=float))})
print(json.dumps(out))
