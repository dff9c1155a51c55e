"""Deterministic invented benchmark data, generated identically by the Rust benches
(provenance-core/benches/common/mod.rs): SplitMix64 uniforms and only +, *, / and floor, so
both languages produce the same numbers bit for bit."""
import math

M = (1 << 64) - 1


def splitmix(z):
    z = (z + 0x9E3779B97F4A7C15) & M
    z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & M
    z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & M
    return z ^ (z >> 31)


def uniform(i, j):
    return (splitmix((i * 16 + j) & M) >> 11) * (1.0 / 9007199254740992.0)


def membership_framework(i):
    """Counts Qm, Qp, C, P, K, Lv, Ls, Lm of benchmark sample i (300 to 600 points)."""
    n = 300 + math.floor(uniform(i, 0) * 301)
    w = []
    for j in range(8):
        u = uniform(i, 1 + j)
        u2 = u * u
        w.append(u2 * u2)
    s = 0.0
    for v in w:
        s += v
    return [math.floor(n * v / s) for v in w]


CENTRES = [
    [60, 4, 2, 8, 12, 3, 6, 5],
    [30, 3, 1, 25, 8, 22, 6, 5],
    [40, 10, 8, 8, 5, 6, 15, 8],
    [45, 5, 2, 15, 15, 8, 6, 4],
]


def classifier_sample(i):
    """(label, counts Qm, Qp, C, P, K, Lv, Ls, Lm) of classifier benchmark sample i."""
    k = i % 4
    w = [CENTRES[k][j] * (0.25 + 1.5 * uniform(i + 1_000_000, j)) for j in range(8)]
    s = 0.0
    for v in w:
        s += v
    return f"class-{k}", [math.floor(400.0 * v / s) + 1 for v in w]


def qfl(f):
    return [f[0] + f[1] + f[2], f[3] + f[4], f[5] + f[6] + f[7]]


def qmflt(f):
    return [f[0], f[3] + f[4], f[1] + f[2] + f[5] + f[6] + f[7]]


def framework7(f):
    return [f[0], f[1] + f[2], f[3], f[4], f[5], f[6], f[7]]
