"""numpy.linalg.matrix_rank (SVD, default tolerance) for each matrix on stdin."""
import json
import sys

import numpy as np

data = json.load(sys.stdin)
json.dump([int(np.linalg.matrix_rank(np.array(m, dtype=float))) for m in data["matrices"]], sys.stdout)
