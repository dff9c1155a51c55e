#!/usr/bin/env python3
"""Regenerate demo/kessra-basin-counts.csv: an INVENTED point-count data set.

The Kessra Basin, its formations and its samples do not exist. The three formations are
given framework compositions that pass up-section from arc-derived sand (Tarn Hollow Fm.),
through dissected-arc sand (Velmor Fm.), into recycled-orogen sand (Askel Fm.), so that
sandprov's figures, setting look-up and change-point detection have something to find.
Counts are multinomial draws (standard library only, fixed seed) around those compositions.

Run: python3 demo/make_demo.py > demo/kessra-basin-counts.csv
"""
import random

random.seed(20261201)

CATS = ["Qm", "Qp", "C", "P", "K", "Lv", "Ls", "Lm"]
# formation, number of samples, base height (m), top height (m), mean framework proportions
FORMATIONS = [
    ("Tarn Hollow Formation", 14, 0.0, 380.0,
     [0.10, 0.01, 0.01, 0.30, 0.02, 0.50, 0.04, 0.02]),
    ("Velmor Formation", 12, 400.0, 760.0,
     [0.30, 0.02, 0.01, 0.32, 0.10, 0.20, 0.03, 0.02]),
    ("Askel Formation", 14, 780.0, 1180.0,
     [0.50, 0.06, 0.10, 0.06, 0.03, 0.04, 0.13, 0.08]),
]
CONCENTRATION = 150.0  # spread of sample compositions about the formation mean


def dirichlet(alpha):
    g = [random.gammavariate(a, 1.0) for a in alpha]
    s = sum(g)
    return [x / s for x in g]


def multinomial(n, p):
    counts = [0] * len(p)
    for i in random.choices(range(len(p)), weights=p, k=n):
        counts[i] += 1
    return counts


print("sample,formation,height_m,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix,cement,pores,mica,dense,other,notes")
k = 0
for name, count, base, top, mean in FORMATIONS:
    step = (top - base) / (count - 1)
    for j in range(count):
        k += 1
        height = round(max(0.0, base + j * step + random.uniform(-6, 6)), 1)
        p = dirichlet([CONCENTRATION * m for m in mean])
        framework = multinomial(random.randint(330, 460), p)
        # Non-framework points counted on the same traverse (whole-rock count).
        matrix = random.randint(8, 60) if name != "Askel Formation" else random.randint(4, 30)
        extra = [matrix, random.randint(10, 45), random.randint(0, 25),
                 random.randint(0, 8), random.randint(0, 5), random.randint(0, 3)]
        note = "invented sample"
        row = [f"KB-{k:03d}", name, f"{height:.1f}"] + [str(c) for c in framework + extra] + [note]
        print(",".join(row))
