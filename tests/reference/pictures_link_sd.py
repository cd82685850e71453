"""Monte Carlo over persons (NumPy): each person draws its link strengths from
normal distributions and settles at its own equilibrium of the chain
u -> a -> b (a = w1 u, b = w2 a: the sketch reading dx/dt = (w src - x)/tau
at rest). Returns the sample covariance of (a, b) over the persons."""
import json, sys
import numpy as np

d = json.load(sys.stdin)
rng = np.random.default_rng(d["seed"])
n = d["persons"]
w1 = rng.normal(d["w1"], d["s1"], n)
w2 = rng.normal(d["w2"], d["s2"], n)
a = w1 * d["u"]
b = w2 * a
cov = np.cov(np.vstack([a, b]))
json.dump({"cov": cov.tolist()}, sys.stdout)
