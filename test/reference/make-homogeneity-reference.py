"""Reference values for the van Belle & Hughes (1984) chi-square test for homogeneity of trends
across sites, as used with the Regional Kendall test (USGS practice; van Belle & Hughes 1984,
"Nonparametric tests for trend in water quality", Water Resour. Res. 20(1):127-136: chi2_homog =
sum_k Z_k^2 - K * mean(Z)^2 with Z_k = S_k / sqrt(Var(S_k)), no continuity correction, df = K - 1).

Run once:  /usr/bin/python3 test/reference/make-homogeneity-reference.py
Writes test/reference/scipy-homogeneity.json (the sites and the values). The tests read that file;
they never call Python.

Z_k comes from SciPy alone: scipy.stats.kendalltau(method="asymptotic") gives a two-sided p without
continuity correction from the tie-corrected variance, so |Z_k| = isf(p/2) with the sign of tau.
The upper tail of the chi-square is scipy.stats.chi2.sf.
"""
import json
import sys

import numpy as np
import scipy
from scipy import stats

rng = np.random.default_rng(15)
years = np.arange(2015, 2027, dtype=float)
# Seven invented sites: three rising, three falling, one flat; values rounded to whole items,
# so ties occur. Mixed directions make the trends heterogeneous.
drifts = [3.0, 2.5, 4.0, -3.0, -2.0, -3.5, 0.0]
sites = []
for k, drift in enumerate(drifts):
    y = np.round(60 + drift * (years - years[0]) + rng.normal(0, 4, years.size))
    sites.append({"site": f"site-{k + 1}", "t": years.tolist(), "y": y.tolist()})

zs = []
for s in sites:
    tau = stats.kendalltau(s["t"], s["y"], method="asymptotic")
    z = np.sign(tau.statistic) * stats.norm.isf(tau.pvalue / 2)
    zs.append(float(z))
zs = np.array(zs)
chi2 = float(np.sum(zs**2) - zs.size * np.mean(zs) ** 2)
df = zs.size - 1
out = {
    "_source": f"SciPy {scipy.__version__}, Python {sys.version.split()[0]}; van Belle & Hughes 1984 homogeneity chi-square",
    "sites": sites,
    "z": zs.tolist(),
    "chi2": chi2,
    "df": df,
    "p": float(stats.chi2.sf(chi2, df)),
}
with open("test/reference/scipy-homogeneity.json", "w") as handle:
    json.dump(out, handle, indent=1)
    handle.write("\n")
print(json.dumps({k: out[k] for k in ("z", "chi2", "df", "p")}))
