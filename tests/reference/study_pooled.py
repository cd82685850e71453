"""Sum of shares times expm(A * gap) (SciPy): the VAR(1) limit over consecutive prompts.

stdin: {"a": [[...]], "gaps": [[gap, share], ...]}; stdout: {"pooled": [[...]], "phi": [[[...]], ...]}.
"""
import json
import sys

import numpy as np
from scipy.linalg import expm

d = json.load(sys.stdin)
a = np.array(d["a"], dtype=float)
phis = [expm(a * g) for g, _ in d["gaps"]]
pooled = sum(w * p for (_, w), p in zip(d["gaps"], phis))
json.dump({"pooled": pooled.tolist(), "phi": [p.tolist() for p in phis]}, sys.stdout)
