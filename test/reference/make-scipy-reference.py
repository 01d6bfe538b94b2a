"""Reference values from SciPy (Debian's python3-scipy) on the open datasets in datasets.json.

Run once:  /usr/bin/python3 test/reference/make-scipy-reference.py
Writes test/reference/scipy-reference.json. The tests read that file; they never call Python.

- scipy.stats.kendalltau(method="asymptotic"): tau-b and a two-sided p without continuity correction.
- scipy.stats.theilslopes: Sen's slope, Conover intercept ("separate"), and SciPy's interval, which
  uses ROUNDED ranks (we interpolate Gilbert's M1, M2 + 1); the ranks SciPy used are written too.
- scipy.stats.mstats.kendalltau_seasonal on years x months tables (nottem, co2).
"""
import json
import sys

import numpy as np
import scipy
from scipy import stats
from scipy.stats import mstats

with open("test/reference/datasets.json") as handle:
    data = json.load(handle)

out = {"_source": f"SciPy {scipy.__version__}, Python {sys.version.split()[0]}"}
for name in ["Nile", "LakeHuron", "nottem", "co2", "NileHundreds"]:
    t = np.array(data[name]["t"], dtype=float)
    y = np.array(data[name]["y"], dtype=float)
    tau = stats.kendalltau(t, y, method="asymptotic")
    slope, intercept, low, high = stats.theilslopes(y, t, 0.95)
    # the rank arithmetic inside SciPy 1.10 theilslopes, repeated to record the ranks it used
    deltax = t[:, np.newaxis] - t
    deltay = y[:, np.newaxis] - y
    slopes = deltay[deltax > 0] / deltax[deltax > 0]
    slopes.sort()
    nt = len(slopes)
    ny = len(y)
    z = stats.norm.ppf(0.025)
    _, nxreps = np.unique(t, return_counts=True)
    _, nyreps = np.unique(y, return_counts=True)
    sigsq = 1 / 18.0 * (ny * (ny - 1) * (2 * ny + 5)
                        - np.sum(nxreps * (nxreps - 1) * (2 * nxreps + 5))
                        - np.sum(nyreps * (nyreps - 1) * (2 * nyreps + 5)))
    sigma = np.sqrt(sigsq)
    upper_index = min(int(np.round((nt - z * sigma) / 2.0)), nt - 1)
    lower_index = max(int(np.round((nt + z * sigma) / 2.0)) - 1, 0)
    assert slopes[lower_index] == low and slopes[upper_index] == high
    out[name] = {
        "kendalltau": {"tau": tau.correlation, "p": tau.pvalue},
        "theilslopes": {"slope": slope, "intercept": intercept, "low": low, "high": high,
                        "lowRank": lower_index + 1, "highRank": upper_index + 1, "nSlopes": nt, "sigsq": sigsq},
    }

for name in ["nottem", "co2"]:
    y = np.array(data[name]["y"], dtype=float)
    table = y.reshape(-1, 12)  # years x months (both series start in January)
    result = mstats.kendalltau_seasonal(table)
    out[name]["kendalltau_seasonal"] = {
        key: (np.asarray(value).tolist()) for key, value in result.items()
    }

with open("test/reference/scipy-reference.json", "w") as handle:
    json.dump(out, handle, indent=1)
    handle.write("\n")
