"""NumPy peer of the membership benchmark (provenance-core/benches/membership.rs).

The same work: 5,000 invented samples x 4,000 posterior draws x 2 region sets
(membership_regions.json), plain sampling. Each sample's Dirichlet(counts + 1/2) posterior is
drawn as three standard-gamma variates normalised by their sum; each draw is located by the
same crossing-number rule as sandprov (ray toward +c, half-open in a, first region in set order
wins); the fraction of draws per region is the membership. Vectorised over chunks of samples.
Prints the best of three wall-clock times.

Usage: python membership_numpy.py [samples] [draws] [regions.json]
(regions: membership_regions.json, a geometric tiling, or membership_regions_shipped.json.)
"""
import json
import sys
import time

import numpy as np

from bench_data import membership_framework, qfl, qmflt

SAMPLES = int(sys.argv[1]) if len(sys.argv) > 1 else 5000
DRAWS = int(sys.argv[2]) if len(sys.argv) > 2 else 4000
REGIONS = sys.argv[3] if len(sys.argv) > 3 else "membership_regions.json"
CHUNK = 50


def edges(vertices):
    """Edges in (c, a) coordinates, each in canonical order (lower a first), horizontal ones dropped."""
    v = [(p[2], p[0]) for p in vertices]
    out = []
    for k in range(len(v)):
        u, w = v[k], v[(k + 1) % len(v)]
        if (u[1], u[0]) > (w[1], w[0]):
            u, w = w, u
        if u[1] != w[1]:
            out.append((u[0], u[1], w[0], w[1]))
    return out


def memberships(alpha, regions, rng):
    """alpha: (S, 3). Returns (S, R + 1) fractions, 'outside' last."""
    s = alpha.shape[0]
    g = rng.standard_gamma(np.broadcast_to(alpha[:, None, :], (s, DRAWS, 3)))
    total = g.sum(axis=2)
    a = (100.0 * g[:, :, 0] / total).ravel()
    c = (100.0 * g[:, :, 2] / total).ravel()
    label = np.full(a.shape, len(regions), dtype=np.int64)
    free = np.ones(a.shape, dtype=bool)
    for r, poly in enumerate(regions):
        inside = np.zeros(a.shape, dtype=bool)
        for uc, ua, wc, wa in poly:
            cond = (ua <= a) & (a < wa)
            x = uc + (a - ua) * ((wc - uc) / (wa - ua))
            inside ^= cond & (c < x)
        hit = inside & free
        label[hit] = r
        free &= ~inside
    idx = np.repeat(np.arange(s), DRAWS) * (len(regions) + 1) + label
    counts = np.bincount(idx, minlength=s * (len(regions) + 1)).reshape(s, len(regions) + 1)
    return counts / DRAWS


def run(sets, alphas, seed=0):
    rng = np.random.default_rng(seed)
    out = []
    for d, regions in enumerate(sets):
        al = alphas[d]
        for start in range(0, SAMPLES, CHUNK):
            out.append(memberships(al[start:start + CHUNK], regions, rng))
    return out


def main():
    spec = json.load(open(REGIONS))
    sets = [[edges(r["vertices"]) for r in d["regions"]] for d in spec["diagrams"]]
    frameworks = [membership_framework(i) for i in range(SAMPLES)]
    alphas = [np.array([qfl(f) for f in frameworks], float) + 0.5,
              np.array([qmflt(f) for f in frameworks], float) + 0.5]
    print(f"bench data: {SAMPLES} samples, {sum(sum(f) for f in frameworks)} points in all")
    times = []
    for rep in range(3):
        t = time.perf_counter()
        res = run(sets, alphas, seed=rep)
        times.append(time.perf_counter() - t)
    qfl_mean = np.vstack(res[: len(res) // 2]).mean(axis=0)
    print(f"numpy {np.__version__}: {SAMPLES} samples x {DRAWS} draws x 2 region sets ({REGIONS})")
    print("times (s):", " ".join(f"{t:.3f}" for t in times), f"best {min(times):.3f}")
    print("mean membership, first set:", " ".join(f"{v:.4f}" for v in qfl_mean))


if __name__ == "__main__":
    main()
