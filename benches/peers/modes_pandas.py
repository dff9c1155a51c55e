"""pandas peer of `sandprov modes` (the whole command: read, recalculate, write CSV).

The same work on the same file: a count table from the synthetic_counts example
(`cargo run --release -p provenance-core --example synthetic_counts 300000 > big.csv`), and for
every sample the framework total, the matrix percentage, the five diagrams with their points
n, pole percentages and counting sd = sqrt(p(100 - p)/n) (Van der Plas & Tobi 1965), and the
five grain ratios, written as CSV with sandprov's column names and decimals (percentages and
sd to 2 decimals, ratios to 4, rounded half away from zero as sandprov does; empty where a
diagram or ratio has no grains). Poles as in
provenance-core/src/diagram.rs (Dickinson 1985; Dickinson & Suczek 1979):

    qfl      Q = Qm + Qp + C,  F = P + K,  L = Lv + Ls + Lm
    qmflt    Qm, F, Lt = L + Qp + C
    qmpk     Qm, P, K
    qplvlsm  Qp = Qp + C, Lv, Lsm = Ls + Lm
    lmlvls   Lm, Lv, Ls

Vectorised over whole columns. Prints the best of three wall-clock times of
read + compute + write. `--io pyarrow` reads with pandas' pyarrow engine and writes with
pyarrow's CSV writer (both multi-threaded, much faster than `to_csv`); the computation is the
same. With --check SANDPROV.csv (the output of
`sandprov modes big.csv -o SANDPROV.csv`), compares every shared numeric column on the first
--rows rows and prints the largest absolute difference.

Usage: python modes_pandas.py BIG.csv OUT.csv [--io pandas|pyarrow] [--check SANDPROV.csv] [--rows 1000]
"""
import argparse
import time

import numpy as np
import pandas as pd

COUNTS = ["Qm", "Qp", "C", "P", "K", "Lv", "Ls", "Lm"]


def poles(d):
    """The three pole amounts of each diagram, as float arrays."""
    q = d["Qm"] + d["Qp"] + d["C"]
    f = d["P"] + d["K"]
    lith = d["Lv"] + d["Ls"] + d["Lm"]
    qp = d["Qp"] + d["C"]
    return {
        "qfl": {"Q": q, "F": f, "L": lith},
        "qmflt": {"Qm": d["Qm"], "F": f, "Lt": lith + qp},
        "qmpk": {"Qm": d["Qm"], "P": d["P"], "K": d["K"]},
        "qplvlsm": {"Qp": qp, "Lv": d["Lv"], "Lsm": d["Ls"] + d["Lm"]},
        "lmlvls": {"Lm": d["Lm"], "Lv": d["Lv"], "Ls": d["Ls"]},
    }


def rounded(x, decimals):
    """Round half away from zero, as sandprov writes its numbers (all values here are >= 0)."""
    scale = 10.0 ** decimals
    return np.floor(x * scale + 0.5) / scale


def ratio(a, b):
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(b > 0, a / b, np.nan)


def modes(table):
    meta = [c for c in table.columns if c not in COUNTS and c not in ("sample", "matrix")]
    d = {c: table[c].to_numpy(dtype=np.float64) for c in COUNTS}
    total = sum(d[c] for c in COUNTS)
    out = {"sample": table["sample"]}
    for m in meta:
        out[m] = table[m]
    out["framework_total"] = total.astype(np.int64)
    if "matrix" in table:
        matrix = table["matrix"].to_numpy(dtype=np.float64)
        out["matrix_pct"] = rounded(ratio(100.0 * matrix, total + matrix), 2)
    for diagram, parts in poles(d).items():
        n = sum(parts.values())
        out[f"{diagram}_n"] = pd.array(np.where(n > 0, n, np.nan), dtype="Int64")
        for pole, x in parts.items():
            p = ratio(100.0 * x, n)
            with np.errstate(invalid="ignore"):
                sd = np.sqrt(np.maximum(p * (100.0 - p) / n, 0.0))
            out[f"{diagram}_{pole}"] = rounded(p, 2)
            out[f"{diagram}_{pole}_sd"] = rounded(sd, 2)
    f = d["P"] + d["K"]
    lith = d["Lv"] + d["Ls"] + d["Lm"]
    q = d["Qm"] + d["Qp"] + d["C"]
    for name, a, b in [
        ("P_F", d["P"], f),
        ("K_F", d["K"], f),
        ("Lv_L", d["Lv"], lith),
        ("Qp_Q", d["Qp"] + d["C"], q),
        ("C_Q", d["C"], q),
    ]:
        out[name] = rounded(ratio(a, b), 4)
    return pd.DataFrame(out)


TEXT = {"sample": str, "formation": str, "height_m": str}


def run(src, dst, io):
    if io == "pyarrow":
        import pyarrow
        import pyarrow.csv

        table = pd.read_csv(src, dtype=TEXT, engine="pyarrow")
        result = modes(table)
        pyarrow.csv.write_csv(pyarrow.Table.from_pandas(result, preserve_index=False), dst)
    else:
        table = pd.read_csv(src, dtype=TEXT)
        result = modes(table)
        result.to_csv(dst, index=False)
    return len(result)


def check(ours, theirs, rows):
    a = pd.read_csv(ours, nrows=rows)
    b = pd.read_csv(theirs, nrows=rows)
    shared = [c for c in a.columns if c in b.columns and c != "sample"
              and pd.api.types.is_numeric_dtype(a[c]) and pd.api.types.is_numeric_dtype(b[c])]
    assert (a["sample"] == b["sample"]).all(), "rows in the same order"
    worst, where = 0.0, None
    for c in shared:
        x, y = a[c].to_numpy(float), b[c].to_numpy(float)
        if not np.array_equal(np.isnan(x), np.isnan(y)):
            raise SystemExit(f"column {c}: empty cells differ")
        diff = np.nanmax(np.abs(x - y)) if np.isfinite(x).any() else 0.0
        if diff > worst:
            worst, where = diff, c
    print(f"check: {len(shared)} numeric columns, first {len(a)} rows, "
          f"max abs difference {worst:.4g}" + (f" (column {where})" if where else ""))
    return worst


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("src")
    ap.add_argument("dst")
    ap.add_argument("--check")
    ap.add_argument("--rows", type=int, default=1000)
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--io", choices=["pandas", "pyarrow"], default="pandas",
                    help="CSV reading and writing: pandas' own (C parser, to_csv) or pyarrow's")
    args = ap.parse_args()
    times = []
    for _ in range(args.repeat):
        t = time.perf_counter()
        n = run(args.src, args.dst, args.io)
        times.append(time.perf_counter() - t)
    extra = ""
    if args.io == "pyarrow":
        import pyarrow

        extra = f", pyarrow {pyarrow.__version__} CSV reading and writing"
    print(f"pandas {pd.__version__}, numpy {np.__version__}{extra}: modes of {n} samples")
    print("times (s):", " ".join(f"{t:.3f}" for t in times), f"best {min(times):.3f}")
    if args.check:
        check(args.dst, args.check, args.rows)


if __name__ == "__main__":
    main()
