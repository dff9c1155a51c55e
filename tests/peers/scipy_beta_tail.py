"""Exact membership of fields bounded by one line of constant pole, from SciPy.

For a field {x_i >= level} (or {x_i <= level}) in a ternary diagram, the probability that the
true composition lies in it, given pole counts k of n points, is a tail of the pole's marginal
under the Jeffreys posterior Dirichlet(k + 1/2): Beta(k_i + 1/2, n - k_i + 1). Computed once
with scipy.stats.beta; sandprov's membership must agree. The counts are invented.
"""
import json
import platform

import numpy as np
import scipy
from scipy.stats import beta

FIELDS = [
    ("Q >= 60", 0, "above", 0.60, [(170, 80, 50), (180, 70, 50), (190, 60, 50), (55, 25, 20), (620, 200, 180), (30, 10, 0), (0, 200, 100), (285, 10, 5)]),
    ("L <= 5", 2, "below", 0.05, [(200, 190, 2), (150, 150, 0), (60, 38, 2), (100, 95, 5), (300, 80, 20), (40, 10, 1)]),
    ("Q <= 2", 0, "below", 0.02, [(0, 200, 100), (1, 150, 149), (3, 100, 97), (2, 40, 58), (6, 150, 144)]),
]

out = {
    "source": "scipy.stats.beta.sf / cdf at the level, with shapes k_i + 0.5 and n - k_i + 1; computed once by scipy_beta_tail.py",
    "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__},
    "fields": [],
}
for name, pole, side, level, cases in FIELDS:
    rows = []
    for k in cases:
        n = sum(k)
        a, b = k[pole] + 0.5, n - k[pole] + 1.0
        p = beta.sf(level, a, b) if side == "above" else beta.cdf(level, a, b)
        rows.append({"counts": list(k), "p_inside": float(p)})
    out["fields"].append({"name": name, "pole": pole, "side": side, "level": level, "cases": rows})
json.dump(out, open("scipy_beta_tail.json", "w"), indent=1)
for f in out["fields"]:
    print(f["name"], [round(c["p_inside"], 6) for c in f["cases"]])
