"""Reference values for tests/core/pictures: numpy.linalg.inv of lambda lambda' + Theta (the
precision matrix a one-factor model implies), scipy.stats.chi2.sf, numpy.linalg.eigh and
numpy.linalg.svd on the given matrices."""
import json
import sys

import numpy as np
from scipy import stats

d = json.load(sys.stdin)
lam = np.array(d["lambda"])
K = np.linalg.inv(np.outer(lam, lam) + np.diag(d["theta"]))
print(json.dumps({
    "precision": K.tolist(),
    "chi2sf": [float(stats.chi2.sf(x, df)) for x, df in d["chi2"]],
    "eigh": [sorted(np.linalg.eigvalsh(np.array(m)).tolist(), reverse=True) for m in d["symmetric"]],
    "svd": [np.linalg.svd(np.array(m), compute_uv=False).tolist() for m in d["general"]],
}))
