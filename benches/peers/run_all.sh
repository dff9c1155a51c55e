#!/usr/bin/env bash
# Every speed comparison of sandprov against its Python peers, side by side, in one table.
#
#   bash benches/peers/run_all.sh
#
# 1. makes a virtualenv in benches/peers/.venv (git-ignored) with pinned NumPy, pandas,
#    scikit-learn (and SciPy, which scikit-learn needs), and pyarrow for the second modes peer;
# 2. builds the release binary and a synthetic table of ROWS samples (default 300,000) in
#    benches/peers/out/ (git-ignored);
# 3. times the Rust side: `sandprov modes` on that table (wall clock, best of 3), and the
#    criterion benches membership, classifier and plot (mean of each bench's estimate);
# 4. runs the peers: modes_pandas.py (pandas' CSV I/O, and pyarrow's), membership_numpy.py,
#    classifier_sklearn.py;
# 5. prints: task, sandprov time, peer time, ratio (peer / sandprov), target, met.
#
# Environment: ROWS (table size), CARGO_TARGET_DIR (as cargo). Takes about 10 minutes on
# 2 cores. Timings on a shared machine swing; run it when the machine is otherwise quiet.
set -euo pipefail

cd "$(dirname "$0")/../.."
PEERS=benches/peers
OUT=$PEERS/out
VENV=$PEERS/.venv
TARGET=${CARGO_TARGET_DIR:-target}
ROWS=${ROWS:-300000}
mkdir -p "$OUT"

echo "== machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ *//'), $(date -u '+%Y-%m-%d %H:%M UTC')"
echo "== load average at start: $(cut -d' ' -f1-3 /proc/loadavg)"

echo "== virtualenv $VENV"
[ -x "$VENV/bin/python" ] || python3 -m venv "$VENV"
"$VENV/bin/pip" install --quiet --disable-pip-version-check \
  numpy==2.4.6 pandas==3.1.1 scikit-learn==1.9.1 scipy==1.17.1 pyarrow==26.0.1
PY="$VENV/bin/python"

echo "== release build"
cargo build --quiet --release -p provenance-cli --bin sandprov
cargo build --quiet --release -p provenance-core --example synthetic_counts
SANDPROV="$TARGET/release/sandprov"
"$TARGET/release/examples/synthetic_counts" "$ROWS" > "$OUT/big.csv"
echo "table: $OUT/big.csv, $ROWS samples, $(du -h "$OUT/big.csv" | cut -f1)"

# Best wall-clock seconds of three runs of a command (output discarded).
best_of_3() {
  "$PY" -c 'import subprocess, sys, time
times = []
for _ in range(3):
    t = time.perf_counter()
    subprocess.run(sys.argv[1:], check=True, stdout=subprocess.DEVNULL)
    times.append(time.perf_counter() - t)
print(f"{min(times):.4f}")' "$@"
}

echo "== sandprov modes ($ROWS samples, read + modes + CSV, best of 3)"
MODES_RUST=$(best_of_3 "$SANDPROV" modes "$OUT/big.csv" -o "$OUT/modes-sandprov.csv")
echo "sandprov modes: ${MODES_RUST} s"

echo "== pandas peers of modes (pandas CSV I/O, then pyarrow CSV I/O); numbers checked on every row"
"$PY" "$PEERS/modes_pandas.py" "$OUT/big.csv" "$OUT/modes-pandas.csv" \
  --check "$OUT/modes-sandprov.csv" --rows "$ROWS" | tee "$OUT/modes-pandas.txt"
"$PY" "$PEERS/modes_pandas.py" "$OUT/big.csv" "$OUT/modes-pyarrow.csv" --io pyarrow \
  --check "$OUT/modes-sandprov.csv" --rows "$ROWS" | tee "$OUT/modes-pyarrow.txt"

echo "== criterion: membership (shipped field sets), classifier, plot"
cargo bench --quiet -p provenance-core --bench membership -- 'membership shipped/' 2>&1 | tee "$OUT/bench-membership.txt" | grep -E "time:|^membership" || true
cargo bench --quiet -p provenance-core --bench classifier 2>&1 | tee "$OUT/bench-classifier.txt" | grep -E "time:|log-loss" || true
cargo bench --quiet -p provenance-core --bench plot 2>&1 | tee "$OUT/bench-plot.txt" | grep -E "time:" || true

echo "== NumPy peer of membership (5,000 samples x 4,000 draws x 2 diagrams, shipped sets)"
(cd "$PEERS" && "../../$PY" membership_numpy.py 5000 4000 membership_regions_shipped.json) | tee "$OUT/membership-numpy.txt"

echo "== scikit-learn peer of the classifier fit (10,000 samples)"
(cd "$PEERS" && "../../$PY" classifier_sklearn.py) | tee "$OUT/classifier-sklearn.txt"

echo
echo "== load average at end: $(cut -d' ' -f1-3 /proc/loadavg)"
"$PY" - "$TARGET/criterion" "$OUT" "$MODES_RUST" <<'EOF'
import json, pathlib, re, sys

criterion, out, modes_rust = pathlib.Path(sys.argv[1]), pathlib.Path(sys.argv[2]), float(sys.argv[3])

def bench(group, function):
    """Mean time in seconds of one criterion bench, from its latest estimates.json."""
    for meta in criterion.glob("*/*/new/benchmark.json"):
        m = json.loads(meta.read_text())
        if m.get("group_id") == group and m.get("function_id") == function:
            est = json.loads((meta.parent / "estimates.json").read_text())
            return est["mean"]["point_estimate"] / 1e9
    raise SystemExit(f"no criterion result for {group}/{function}")

def best(path):
    return float(re.search(r"best ([0-9.]+)", (out / path).read_text()).group(1))

# The classifier: scikit-learn at the loosest tolerance whose objective is at least as low as
# sandprov's (equal log-loss), from the objective the bench prints.
obj = float(re.search(r"classifier fit: mean penalised log-loss ([0-9.]+)",
                      (out / "bench-classifier.txt").read_text()).group(1))
sk = None
for line in (out / "classifier-sklearn.txt").read_text().splitlines():
    m = re.match(r"tol (\S+): best ([0-9.]+) ms .* mean penalised log-loss ([0-9.]+)", line)
    if m and float(m.group(3)) <= obj + 1e-9:
        sk = (m.group(1), float(m.group(2)) / 1000)
        break
if sk is None:
    raise SystemExit("scikit-learn never reached sandprov's log-loss")

numpy_membership = best("membership-numpy.txt")
rows = [
    ("modes, 300,000 samples, 5 diagrams + sd, CSV (pandas)", modes_rust, best("modes-pandas.txt"), 5.0),
    ("modes, same, pandas with pyarrow CSV reading and writing", modes_rust, best("modes-pyarrow.txt"), 5.0),
    ("membership 5000x4000x2, default method (NumPy)",
     bench("membership shipped", "5000x4000x2 default: shortcut, integration, sampling"), numpy_membership, 10.0),
    ("membership 5000x4000x2, plain sampling (NumPy)",
     bench("membership shipped", "5000x4000x2 plain sampling"), numpy_membership, None),
    (f"classifier fit 10,000, equal log-loss (sklearn lbfgs tol {sk[0]})",
     bench("classifier", "fit 10000 samples framework l2=1"), sk[1], 1.0),
    ("SVG 10,000 samples, density (default)", bench("plot_svg_10k", "density (default)"), None, 0.5),
    ("SVG 10,000 samples, markers", bench("plot_svg_10k", "markers"), None, 0.5),
]
print(f"{'task':<66} {'sandprov':>10} {'peer':>10} {'ratio':>7} {'target':>10} {'met':>4}")
for task, ours, peer, target in rows:
    if peer is None:
        ratio, tgt = "-", f"< {target} s"
        met = "-" if target is None else ("yes" if ours < target else "no")
    else:
        r = peer / ours
        ratio = f"{r:.1f}x"
        tgt = "-" if target is None else f">= {target:g}x"
        met = "-" if target is None else ("yes" if r >= target else "no")
    peer_s = "-" if peer is None else f"{peer:.3f} s"
    print(f"{task:<66} {ours:>8.3f} s {peer_s:>10} {ratio:>7} {tgt:>10} {met:>4}")
EOF
