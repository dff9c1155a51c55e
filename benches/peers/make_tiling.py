"""Write membership_regions.json: the two region sets timed by the membership benchmark.

They are geometric tilings of the triangle with about as many regions and vertices as the
QFL (7 fields) and QmFLt (10 fields) provenance sets, used only to time the calculation.
They are not provenance fields. Vertices are percent of the poles [A, B, C].
"""
import json

t1, t2 = 100.0 / 3.0, 200.0 / 3.0
seven = [
    ("apex", [[100, 0, 0], [75, 25, 0], [75, 0, 25]]),
    ("upper left", [[75, 25, 0], [50, 50, 0], [50, 25, 25], [75, 12.5, 12.5]]),
    ("upper right", [[75, 12.5, 12.5], [50, 25, 25], [50, 0, 50], [75, 0, 25]]),
    ("lower left", [[50, 50, 0], [0, 100, 0], [0, 50, 50]]),
    ("lower right", [[50, 0, 50], [0, 50, 50], [0, 0, 100]]),
    ("middle left", [[50, 50, 0], [0, 50, 50], [50, 25, 25]]),
    ("middle right", [[50, 25, 25], [0, 50, 50], [50, 0, 50]]),
]
ten = [
    ("apex left", [[100, 0, 0], [80, 20, 0], [80, 10, 10]]),
    ("apex right", [[100, 0, 0], [80, 10, 10], [80, 0, 20]]),
    ("high left", [[80, 20, 0], [60, 40, 0], [60, 20, 20], [80, 10, 10]]),
    ("high right", [[80, 10, 10], [60, 20, 20], [60, 0, 40], [80, 0, 20]]),
    ("mid left", [[60, 40, 0], [40, 60, 0], [40, 40, 20], [60, 20, 20]]),
    ("mid centre", [[60, 20, 20], [40, 40, 20], [40, 20, 40]]),
    ("mid right", [[60, 20, 20], [40, 20, 40], [40, 0, 60], [60, 0, 40]]),
    ("low left", [[40, 60, 0], [0, 100, 0], [0, t2, t1], [40, 40, 20]]),
    ("low centre", [[40, 40, 20], [0, t2, t1], [0, t1, t2], [40, 20, 40]]),
    ("low right", [[40, 20, 40], [0, t1, t2], [0, 0, 100], [40, 0, 60]]),
]
out = {
    "note": "Geometric tilings used only to time membership; not provenance fields.",
    "diagrams": [
        {"id": "qfl", "regions": [{"name": n, "vertices": v} for n, v in seven]},
        {"id": "qmflt", "regions": [{"name": n, "vertices": v} for n, v in ten]},
    ],
}
json.dump(out, open("membership_regions.json", "w"), indent=1)
