"""Reference simulation for the adaptation tests: SciPy's solve_ivp (Radau)
on a small model given as Python-readable rate and formula texts (test
fixtures of our own, never user files). Reads JSON on stdin:
{"inputs": {u: value}, "states": {x: [initial, rate]}, "derived": [[y, formula], ...] (in dependency order),
 "step": {"input": u, "to": value}, "settle": T, "after": T}.
Runs to equilibrium at the old input, steps the input, runs on; reports each
variable's value before the step, at the end, and its largest deviation."""
import json
import sys
import math
import numpy as np
from scipy.integrate import solve_ivp

req = json.load(sys.stdin)
states = list(req["states"].keys())
env_fns = {"abs": abs, "exp": math.exp, "sqrt": math.sqrt, "min": min, "max": max}


def values(t, y, inputs):
    env = dict(env_fns)
    env.update(inputs)
    env.update({x: y[i] for i, x in enumerate(states)})
    for name, f in req["derived"]:
        env[name] = eval(f, {"__builtins__": {}}, env)
    return env


def rhs(inputs):
    def f(t, y):
        env = values(t, y, inputs)
        return [eval(req["states"][x][1], {"__builtins__": {}}, env) for x in states]
    return f


inputs = dict(req["inputs"])
y0 = [req["states"][x][0] for x in states]
pre = solve_ivp(rhs(inputs), (0, req["settle"]), y0, method="Radau", rtol=1e-10, atol=1e-10)
y1 = pre.y[:, -1]
before = values(0, y1, inputs)
inputs[req["step"]["input"]] = req["step"]["to"]
ts = np.linspace(0, req["after"], 2001)
post = solve_ivp(rhs(inputs), (0, req["after"]), y1, method="Radau", rtol=1e-10, atol=1e-10, t_eval=ts)
names = states + [d[0] for d in req["derived"]]
series = {n: [] for n in names}
for k in range(post.y.shape[1]):
    env = values(0, post.y[:, k], inputs)
    for n in names:
        series[n].append(env[n])
out = {n: {"before": before[n], "end": series[n][-1], "maxDeviation": max(abs(v - before[n]) for v in series[n])} for n in names}
json.dump(out, sys.stdout)
