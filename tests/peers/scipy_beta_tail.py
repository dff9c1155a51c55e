"""Exact membership of a field bounded by one line of constant Q, from SciPy.

For the field {Q >= 60%} in QFL, the probability that the true composition lies in it, given
pole counts (kQ, kF, kL) of n points, is the upper tail of the Q marginal of the Jeffreys
posterior Dirichlet(k + 1/2): Beta(kQ + 1/2, n - kQ + 1), at 0.6. Computed once with
scipy.stats.beta.sf; sandprov's sampled membership must agree within its Monte Carlo error.
The counts are invented.
"""
import json
import platform

import numpy as np
import scipy
from scipy.stats import beta

cases = []
for kq, kf, kl in [(170, 80, 50), (180, 70, 50), (190, 60, 50), (55, 25, 20), (620, 200, 180), (30, 10, 0), (0, 200, 100), (285, 10, 5)]:
    n = kq + kf + kl
    a, b = kq + 0.5, n - kq + 1.0
    cases.append({"counts": [kq, kf, kl], "alpha": a, "beta": b, "p_inside": float(beta.sf(0.6, a, b))})
out = {
    "source": "scipy.stats.beta.sf(0.6, kQ + 0.5, n - kQ + 1), computed once by scipy_beta_tail.py",
    "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__},
    "field": "Q >= 60 percent in QFL",
    "cases": cases,
}
json.dump(out, open("scipy_beta_tail.json", "w"), indent=1)
for c in cases:
    print(c)
