"""Reference: scipy.stats.chi2.sf for [x, df] pairs on stdin."""
import json
import sys

from scipy.stats import chi2

json.dump([float(chi2.sf(x, df)) for x, df in json.load(sys.stdin)], sys.stdout)
