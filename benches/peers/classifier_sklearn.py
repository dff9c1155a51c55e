"""scikit-learn peer of the classifier benchmark (provenance-core/benches/classifier.rs).

The same work: 10,000 invented labelled samples (bench_data.classifier_sample), the seven-part
framework composition (Qm, Qp+C, P, K, Lv, Ls, Lm) as ilr coordinates in sandprov's basis,
multinomial LogisticRegression(solver="lbfgs", C=1) (C = 1/alpha, alpha = 1 in sandprov).
For several tolerances, prints the best of five fit times and the mean penalised log-loss
mean(-ln p_true) + ||W||^2 / (2 C n) (intercepts unpenalised), the objective sandprov reports,
so the two can be compared at equal log-loss.
"""
import time

import numpy as np
import sklearn
from sklearn.linear_model import LogisticRegression

from bench_data import classifier_sample, framework7

N = 10_000


def ilr(x):
    logs = np.log(np.asarray(x, float))
    cols = [np.sqrt(i / (i + 1)) * (logs[:, :i].mean(axis=1) - logs[:, i]) for i in range(1, logs.shape[1])]
    return np.column_stack(cols)


def objective(model, X, y, C):
    p = model.predict_proba(X)
    idx = np.searchsorted(model.classes_, y)
    ll = -np.log(p[np.arange(len(y)), idx]).mean()
    return ll + (model.coef_ ** 2).sum() / (2 * C * len(y)), ll


data = [classifier_sample(i) for i in range(N)]
y = np.array([d[0] for d in data])
X = ilr([framework7(d[1]) for d in data])
print(f"scikit-learn {sklearn.__version__}, numpy {np.__version__}: {N} samples, {X.shape[1]} features, 4 classes, C = 1")
for tol in [1e-4, 1e-6, 1e-8, 1e-10]:
    times = []
    for _ in range(5):
        m = LogisticRegression(C=1.0, solver="lbfgs", tol=tol, max_iter=10000)
        t = time.perf_counter()
        m.fit(X, y)
        times.append(time.perf_counter() - t)
    obj, ll = objective(m, X, y, 1.0)
    print(f"tol {tol:.0e}: best {min(times) * 1000:.1f} ms (median {sorted(times)[2] * 1000:.1f} ms), iterations {m.n_iter_[0]}, "
          f"mean penalised log-loss {obj:.10f}, training log-loss {ll:.10f}")
