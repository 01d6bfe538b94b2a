"""One SciPy benchmark run in its own process: python3 scipy-child.py (theilslopes|kendalltau) FILE.bin
FILE.bin holds n times then n values as little-endian float64. Prints one JSON line."""
import json
import resource
import sys
import time

import numpy as np
from scipy import stats

mode, path = sys.argv[1], sys.argv[2]
data = np.fromfile(path, dtype="<f8")
n = data.size // 2
t, y = data[:n], data[n:]
start = time.perf_counter()
cpu_start = time.process_time()
if mode == "theilslopes":
    slope, intercept, low, high = stats.theilslopes(y, t, 0.95)
    result = {"slope": slope, "low": low, "high": high}
else:
    tau = stats.kendalltau(t, y)
    result = {"tau": tau.correlation, "p": tau.pvalue}
elapsed = time.perf_counter() - start
cpu = time.process_time() - cpu_start
peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
print(json.dumps({"n": int(n), "computeMs": elapsed * 1000, "cpuMs": cpu * 1000, "peakRssMB": peak, **result}))
