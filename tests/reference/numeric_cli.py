"""Checks of command-line output with Python's own tools.

stdin: {"csv": str} -> rows parsed by the csv module (RFC 4180 dialect);
       {"drift": [[...]], "interval": float} -> scipy.linalg.expm(drift * interval) and numpy eigenvalues.
"""
import csv
import io
import json
import sys

import numpy as np
from scipy.linalg import expm

d = json.load(sys.stdin)
out = {}
if "csv" in d:
    out["rows"] = list(csv.reader(io.StringIO(d["csv"], newline="")))
if "drift" in d:
    a = np.array(d["drift"], dtype=float)
    out["phi"] = expm(a * float(d["interval"])).tolist()
    ev = np.linalg.eigvals(a)
    out["eig_re"] = sorted(ev.real.tolist())
json.dump(out, sys.stdout)
