#!/usr/bin/env python3
"""Reference values for sandprov's petrofacies statistics, computed once with NumPy, SciPy and
statsmodels.

Run in a virtualenv with numpy, scipy and statsmodels installed:
    python3 tests/peers/petrofacies.py > tests/reference/petrofacies.json

The count groups below are INVENTED test data (three made-up groups of QFL point counts, some
with zero cells); they are not from any rock. Everything is computed here independently of
sandprov's code, from the published formulas:
- regularized incomplete gamma: scipy.special.gammainc / gammaincc;
- chi-square tail: scipy.stats.chi2.sf; homogeneity test: scipy.stats.chi2_contingency
  (correction=False);
- F quantiles and tails: scipy.stats.f.ppf / f.sf;
- zero replacement: multiplicative, delta = 0.65/n (Martin-Fernandez et al. 2003), in NumPy;
- ilr: Helmert-type basis z1 = ln(x1/x2)/sqrt(2), z2 = sqrt(2/3) ln(sqrt(x1 x2)/x3);
- closed geometric mean: scipy.stats.gmean, closed;
- regions (Weltje 2002): bound p(n-1)/(n(n-p)) F_{p,n-p}(0.95) from scipy.stats.f.ppf, ellipse
  point at theta = 0 through numpy.linalg.cholesky;
- Hotelling two-sample T^2: statsmodels.stats.multivariate.test_mvmean_2indep;
- permutation test of T^2: scipy.stats.permutation_test (independent, exact, greater).
"""
import json
import platform

import numpy as np
import scipy
import statsmodels
from scipy import special, stats
from statsmodels.stats.multivariate import test_mvmean_2indep

GROUPS = {
    # Invented QFL counts, one row per thin section: [Q, F, L].
    "A": [[120, 110, 170], [135, 95, 160], [110, 125, 180], [128, 102, 150], [140, 118, 165],
          [115, 100, 190]],
    "B": [[250, 90, 3], [270, 80, 0], [240, 100, 5], [260, 85, 2], [255, 95, 1]],
    "C": [[125, 105, 168], [118, 112, 172], [131, 99, 158], [122, 108, 175]],
}


def replace(counts):
    x = np.asarray(counts, float)
    n = x.sum()
    delta = 0.65 / n
    p = x / n
    zeros = p == 0
    return np.where(zeros, delta, p * (1 - zeros.sum() * delta))


def ilr(p):
    return np.array([np.log(p[0] / p[1]) / np.sqrt(2),
                     np.sqrt(2 / 3) * np.log(np.sqrt(p[0] * p[1]) / p[2])])


def ilr_inv(z):
    # Solve the Helmert-type basis back: clr = V z, x = C(exp(clr)).
    v = np.array([[1 / np.sqrt(2), 1 / np.sqrt(6)],
                  [-1 / np.sqrt(2), 1 / np.sqrt(6)],
                  [0.0, -2 / np.sqrt(6)]])
    e = np.exp(v @ z)
    return e / e.sum()


def coords(name):
    return np.array([ilr(replace(c)) for c in GROUPS[name]])


def t2_by_index(rows):
    # permutation_test permutes 1-D samples; permute row indices into the pooled rows instead.
    def stat(i, j):
        return test_mvmean_2indep(rows[i.astype(int)], rows[j.astype(int)]).t2
    return stat


out = {
    "versions": {"python": platform.python_version(), "numpy": np.__version__,
                 "scipy": scipy.__version__, "statsmodels": statsmodels.__version__},
    "note": "count groups are invented test data",
    "gamma": [],
    "chi2_sf": [],
    "f_ppf": [],
    "f_sf": [],
    "contingency": [],
    "groups": GROUPS,
    "summaries": {},
    "hotelling": [],
    "permutation": [],
}
for a, x in [(0.5, 0.2), (0.5, 3.0), (1.0, 0.7), (2.5, 1.0), (3.0, 7.5), (10.0, 4.0),
             (10.0, 25.0), (13.0, 56.0), (26.0, 112.0 / 2), (50.0, 80.0), (0.3, 12.0),
             (100.0, 95.0)]:
    out["gamma"].append({"a": a, "x": x, "p": float(special.gammainc(a, x)),
                         "q": float(special.gammaincc(a, x))})
for x, df in [(0.5, 1), (3.84, 1), (5.99, 2), (20.0, 2), (112.0, 26), (58.0, 22),
              (200.0, 10), (1.0, 30)]:
    out["chi2_sf"].append({"x": x, "df": df, "sf": float(stats.chi2.sf(x, df))})
for q in [0.5, 0.9, 0.95, 0.99]:
    for m in [1, 2, 3, 5, 12, 40, 200]:
        out["f_ppf"].append({"q": q, "d1": 2, "d2": m, "ppf": float(stats.f.ppf(q, 2, m))})
    for d1, d2 in [(3, 17), (4, 9), (6, 60)]:
        out["f_ppf"].append({"q": q, "d1": d1, "d2": d2, "ppf": float(stats.f.ppf(q, d1, d2))})
for x, d1, d2 in [(0.5, 2, 5), (3.0, 2, 9), (12.0, 2, 23), (50.0, 2, 25), (2.2, 3, 17),
                  (7.0, 5, 4)]:
    out["f_sf"].append({"x": x, "d1": d1, "d2": d2, "sf": float(stats.f.sf(x, d1, d2))})
for name in ["A", "B", "C"]:
    table = np.array(GROUPS[name], float)
    keep = table.sum(0) > 0
    chi2, p, dof, _ = stats.chi2_contingency(table[:, keep], correction=False)
    out["contingency"].append({"group": name, "chi2": float(chi2), "p": float(p), "dof": int(dof)})
for name in ["A", "B", "C"]:
    z = coords(name)
    comps = np.array([replace(c) for c in GROUPS[name]])
    g = stats.gmean(comps, axis=0)
    g = 100 * g / g.sum()
    n = len(z)
    mean = z.mean(0)
    cov = np.cov(z, rowvar=False, ddof=1)
    chol = np.linalg.cholesky(cov)
    fq = stats.f.ppf(0.95, 2, n - 2)
    bound = 2 * (n - 1) / (n * (n - 2)) * fq
    pred = bound * (n + 1)
    conf0 = 100 * ilr_inv(mean + np.sqrt(bound) * chol @ np.array([1.0, 0.0]))
    pred0 = 100 * ilr_inv(mean + np.sqrt(pred) * chol @ np.array([1.0, 0.0]))
    pooled = np.array(GROUPS[name], float).sum(0)
    out["summaries"][name] = {
        "gmean_percent": g.tolist(), "ilr_mean": mean.tolist(), "ilr_cov": cov.tolist(),
        "confidence_bound": float(bound), "prediction_bound": float(pred),
        "confidence_vertex0": conf0.tolist(), "prediction_vertex0": pred0.tolist(),
        "pooled_percent": (100 * pooled / pooled.sum()).tolist(),
    }
for a, b in [("A", "B"), ("A", "C"), ("B", "C")]:
    r = test_mvmean_2indep(coords(a), coords(b))
    out["hotelling"].append({"a": a, "b": b, "t2": float(r.t2), "f": float(r.statistic),
                             "df1": float(r.df[0]), "df2": float(r.df[1]),
                             "p": float(r.pvalue)})
    rows = np.vstack([coords(a), coords(b)])
    na = len(GROUPS[a])
    idx = (np.arange(na, dtype=float), np.arange(na, len(rows), dtype=float))
    perm = stats.permutation_test(idx, t2_by_index(rows), permutation_type="independent",
                                  vectorized=False, n_resamples=np.inf, alternative="greater")
    out["permutation"].append({"a": a, "b": b, "p_exact": float(perm.pvalue),
                               "splits": int(len(perm.null_distribution))})
print(json.dumps(out, indent=1))
