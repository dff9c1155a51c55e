#!/usr/bin/env python3
"""Reference values for sandprov's counting-error intervals, computed once with SciPy.

Run in a virtualenv with scipy installed: python3 tests/peers/counting_intervals.py
Output (committed in tests/reference/counting_intervals.csv) lists, for each (k, n):
95% Wilson score and Clopper-Pearson bounds as proportions, from
scipy.stats.binomtest(k, n).proportion_ci(confidence_level=0.95, method=...),
and the regularized incomplete beta I_x(a, b) from scipy.special.betainc for a few points.
"""
import scipy
from scipy import special, stats

print(f"# scipy {scipy.__version__}")
print("k,n,wilson_lo,wilson_hi,cp_lo,cp_hi")
for k, n in [(0, 10), (1, 10), (5, 10), (10, 10), (0, 300), (3, 300), (150, 300),
             (252, 412), (83, 412), (77, 412), (1, 500), (499, 500), (37, 451)]:
    r = stats.binomtest(k, n)
    w = r.proportion_ci(confidence_level=0.95, method="wilson")
    c = r.proportion_ci(confidence_level=0.95, method="exact")
    print(f"{k},{n},{w.low:.12g},{w.high:.12g},{c.low:.12g},{c.high:.12g}")
print("# betainc")
print("a,b,x,value")
for a, b, x in [(0.5, 0.5, 0.3), (2.0, 3.0, 0.4), (30.5, 70.5, 0.25), (252.5, 160.5, 0.6),
                (1.0, 400.0, 0.001), (100.0, 100.0, 0.55)]:
    print(f"{a},{b},{x},{special.betainc(a, b, x):.15g}")
