"""Reference probabilities of multinomial logistic regression from scikit-learn.

Reads classifier_reference.csv (invented data), computes the ilr coordinates of the QFL and
seven-part framework compositions with sandprov's Helmert-type basis
(z_i = sqrt(i/(i+1)) * (mean(ln x_1..x_i) - ln x_{i+1})), fits
sklearn.linear_model.LogisticRegression(solver="lbfgs") (multinomial for several classes),
and writes sklearn_logistic.json with the fitted probabilities of every row and the library
versions. Run once with numpy, scipy and scikit-learn installed; the JSON is committed.
"""
import csv
import json
import platform

import numpy as np
import scipy
import sklearn
from sklearn.linear_model import LogisticRegression


def ilr(x):
    x = np.asarray(x, float)
    logs = np.log(x)
    out = []
    for i in range(1, x.shape[1]):
        out.append(np.sqrt(i / (i + 1)) * (logs[:, :i].mean(axis=1) - logs[:, i]))
    return np.column_stack(out)


rows = list(csv.DictReader(open("classifier_reference.csv")))
g = lambda r, k: float(r[k])
qfl = [[g(r, "Qm") + g(r, "Qp") + g(r, "C"), g(r, "P") + g(r, "K"), g(r, "Lv") + g(r, "Ls") + g(r, "Lm")] for r in rows]
framework = [[g(r, "Qm"), g(r, "Qp") + g(r, "C"), g(r, "P"), g(r, "K"), g(r, "Lv"), g(r, "Ls"), g(r, "Lm")] for r in rows]
labels = [r["group"] for r in rows]

cases = []
for name, comp, data, C in [
    ("qfl unpenalised", "qfl", qfl, 1e12),
    ("qfl C=1", "qfl", qfl, 1.0),
    ("framework C=1", "framework", framework, 1.0),
    ("framework C=0.1", "framework", framework, 0.1),
]:
    X = ilr(data)
    model = LogisticRegression(C=C, solver="lbfgs", tol=1e-12, max_iter=100000)
    model.fit(X, labels)
    p = model.predict_proba(X)
    cases.append({
        "name": name,
        "composition": comp,
        "C": C,
        "l2": 0.0 if C >= 1e12 else 1.0 / C,
        "classes": list(model.classes_),
        "iterations": int(model.n_iter_[0]),
        "max_abs_coefficient": float(np.abs(model.coef_).max()),
        "probabilities": p.tolist(),
    })

out = {
    "source": "scikit-learn LogisticRegression(solver='lbfgs', tol=1e-12), computed once by sklearn_logistic.py",
    "versions": {"python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__, "scikit-learn": sklearn.__version__},
    "data": "classifier_reference.csv (invented)",
    "cases": cases,
}
json.dump(out, open("sklearn_logistic.json", "w"), indent=1)
for c in cases:
    print(c["name"], c["iterations"], c["max_abs_coefficient"])
