"""Reference for the commutation check with formulas, by SciPy alone.

Reads {"inputs": {u: value}, "states": {x: [initial, rate]}, "derived": [[y, formula], ...] (dependency order),
"hold": {v: c}, "dropped": [equation ids the equilibrium model's hold replaces], "T": horizon}.

- running: the running system held (a held derived variable keeps its value, a held state its value and zero
  rate), integrated with solve_ivp (Radau) to T and to 2T: its values and how much the states still move.
- predicted: the equilibrium model held as the settle-then-hold structure says: every formula, every balance
  g = 0, minus the dropped equations, plus v = c; solved with scipy.optimize.root from the running values."""
import json
import math
import sys
import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import root

req = json.load(sys.stdin)
# A held input is simply set; the other holds replace an equation.
hold = {}
for v, c in req["hold"].items():
    if v in req["inputs"]:
        req["inputs"][v] = c
    else:
        hold[v] = c
states = list(req["states"].keys())
derived = [d[0] for d in req["derived"]]
formulas = dict((d[0], d[1]) for d in req["derived"])
fns = {"abs": abs, "exp": math.exp, "sqrt": math.sqrt, "min": min, "max": max}


def ev(expr, env):
    e = dict(fns)
    e.update(env)
    return eval(expr, {"__builtins__": {}}, e)


def running_env(y):
    env = dict(req["inputs"])
    env.update({x: (hold[x] if x in hold else y[i]) for i, x in enumerate(states)})
    for name in derived:
        env[name] = hold[name] if name in hold else ev(formulas[name], env)
    return env


def rhs(t, y):
    env = running_env(y)
    return [0.0 if x in hold else ev(req["states"][x][1], env) for x in states]


y0 = [hold.get(x, req["states"][x][0]) for x in states]
T = req["T"]
sol = solve_ivp(rhs, (0, 2 * T), y0, method="Radau", rtol=1e-10, atol=1e-10, t_eval=[T, 2 * T])
at_T = running_env(sol.y[:, 0])
at_2T = running_env(sol.y[:, 1])
moving = {x: abs(at_2T[x] - at_T[x]) for x in states}

# The equilibrium model held: unknowns are all non-input variables.
unknowns = states + derived
dropped = set(req["dropped"])


def residuals(z):
    env = dict(req["inputs"])
    env.update(dict(zip(unknowns, z)))
    out = []
    for name in derived:
        if f"formula({name})" not in dropped:
            out.append(env[name] - ev(formulas[name], env))
    for x in states:
        if f"rate({x})" not in dropped:
            out.append(ev(req["states"][x][1], env))
    for v, c in hold.items():
        out.append(env[v] - c)
    return out


guess = np.array([at_2T[v] for v in unknowns], dtype=float)
n_eq = len(residuals(guess))
predicted = None
if n_eq == len(unknowns):
    r = root(residuals, guess, method="hybr", tol=1e-12)
    if r.success:
        predicted = dict(zip(unknowns, [float(v) for v in r.x]))
json.dump({"running": {k: float(v) for k, v in at_2T.items()}, "moving": moving, "predicted": predicted, "equations": n_eq, "unknowns": len(unknowns)}, sys.stdout)
