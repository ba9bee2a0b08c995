#!/usr/bin/env bash
# Runs every benchmark of tests/bench (not part of ctest) and prints the results:
#   (a) NRTL fit of 200 generated 30-point datasets (INVENTED data, acetone/methanol, seeded
#       random parameters and noise): pinchwise in-process (default multistart and one start)
#       against the same fit in Python with SciPy (tests/bench/scipy_nrtl.py), per-dataset ratio;
#       and every model on every set with and without the multistart's known-basin rule;
#   (b) time per reflux analysis (pw_column_solve, tangent-pinch search) on the demo NRTL fit;
#   (c) fit time and peak resident memory for 10, 100, 1000 and 10000 points;
#   (d) the design-grade column: energy-balance R_min with design rows, rating (pw-bench-design).
# Usage: tools/bench.sh [N_DATASETS]   (default 200). The SciPy comparison needs /usr/bin/python3
# with python3-scipy (optional extra; without it that comparison is skipped with a message).
set -euo pipefail
cd "$(dirname "$0")/.."
root=$PWD
n=${1:-200}
bld=$root/build-bench
cmake -S . -B "$bld" -DCMAKE_BUILD_TYPE=Release -DPINCHWISE_BENCH=ON > /dev/null
cmake --build "$bld" -j2 --target pw-bench pw-bench-design pw-gen-dataset pinchwise > /dev/null
bench=$bld/tests/bench/pw-bench; gen=$bld/tests/pw-gen-dataset
comps=$root/datasets/components.csv
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
py=/usr/bin/python3

echo "date: $(date -u +%Y-%m-%dT%H:%MZ)  nproc: $(nproc)  cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ //')"

# (a) ---------------------------------------------------------------------------------------
mkdir -p "$work/sets"
awk -v n="$n" 'BEGIN { srand(20261202); for (i = 1; i <= n; i++)
  printf "%d %.1f %.1f %.3f %.4f\n", i, -100 + 500 * rand(), -100 + 500 * rand(), 0.05 + 0.1 * rand(), 0.002 + 0.004 * rand() }' |
while read -r i b12 b21 sT sy; do
  "$gen" --components "$comps" --names acetone,methanol --model nrtl --params "$b12,$b21" \
    --pressure 101.325kPa --points 30 --noise-T "$sT" --noise-y "$sy" --seed "$i" \
    --note "benchmark set $i" > "$work/sets/set_$(printf %04d "$i").csv"
done
files=("$work"/sets/*.csv)
"$bench" fit --reps 5 "${files[@]}" > "$work/c_default.tsv"
"$bench" fit --reps 5 --starts 1 "${files[@]}" > "$work/c_one.tsv"
if ! "$py" -c "import scipy.optimize" 2> /dev/null; then
  echo "(a) skipped: SciPy not installed (optional extra of the benchmarks: apt-get install -y python3-scipy)"
else
"$py" "$root/tests/bench/scipy_nrtl.py" "$comps" "${files[@]}" > "$work/py.tsv"
"$py" - "$work" <<'PY'
import statistics as st, sys
w = sys.argv[1]
def load(name):
    return {l.split("\t")[0]: l.rstrip("\n").split("\t")[1:] for l in open(f"{w}/{name}")}
cd, c1, py = load("c_default.tsv"), load("c_one.tsv"), load("py.tsv")
names = sorted(py)
t_d = [float(cd[k][0]) for k in names]; t_1 = [float(c1[k][0]) for k in names]
t_p = [float(py[k][0]) for k in names]
same = sum(abs(float(c1[k][2]) - float(py[k][1])) <= 1e-6 * max(1.0, float(py[k][1])) for k in names)
lower = sum(float(cd[k][2]) <= float(py[k][1]) * (1 + 1e-9) for k in names)
r_d = [p / c for p, c in zip(t_p, t_d)]; r_1 = [p / c for p, c in zip(t_p, t_1)]
print(f"(a) NRTL fit, {len(names)} datasets of 30 points (median over the datasets; per dataset the median of 5 runs for C)")
print(f"    pinchwise, default multistart: median {st.median(t_d)*1e3:.3f} ms  (min {min(t_d)*1e3:.3f}, max {max(t_d)*1e3:.3f})")
print(f"    pinchwise, one start:          median {st.median(t_1)*1e3:.3f} ms  (min {min(t_1)*1e3:.3f}, max {max(t_1)*1e3:.3f})")
print(f"    SciPy least_squares (lm):      median {st.median(t_p)*1e3:.3f} ms  (min {min(t_p)*1e3:.3f}, max {max(t_p)*1e3:.3f})")
print(f"    ratio SciPy/pinchwise per dataset, default multistart: median {st.median(r_d):.1f}x (min {min(r_d):.1f}, max {max(r_d):.1f})")
print(f"    ratio SciPy/pinchwise per dataset, one start:          median {st.median(r_1):.1f}x (min {min(r_1):.1f}, max {max(r_1):.1f})")
print(f"    same chi2 (rel 1e-6) one-start pinchwise vs SciPy: {same}/{len(names)}; multistart chi2 <= SciPy's: {lower}/{len(names)}")
PY
fi
echo "    per-dataset times: $work/c_default.tsv, c_one.tsv, py.tsv (deleted at exit; copy with KEEP=1)"
echo "    known basins (docs/fitting.md): every model on every set, default multistart against exhaustive_starts:"
"$bench" basins "${files[@]}" > "$work/basins.tsv" || true
tail -1 "$work/basins.tsv" | sed 's/^/    /'
grep -h DIFFERENT "$work/basins.tsv" | sed 's/^/    /' || true
[ "${KEEP:-0}" = 1 ] && cp "$work"/*.tsv "$bld/"

# (b) ---------------------------------------------------------------------------------------
"$bld/pinchwise" fit "$root/datasets/demo_acetone_water.csv" --model nrtl --out "$work/demo.json" 2> /dev/null > /dev/null
echo "(b) reflux analysis on the demo NRTL fit (1 atm, xd 0.95, xb 0.02, zf 0.3, q 1), median of 200 calls:"
"$bench" reflux "$work/demo.json" 101.325 0.95 0.02 0.3 1 200 | awk -F'\t' '{ printf "    %.1f us per call, %s pinch, %s, %s\n", $2 * 1e6, $3, $4, $5 }'

# (c) ---------------------------------------------------------------------------------------
echo "(c) NRTL fit against points (default multistart; peak RSS of the whole process):"
echo "    points  seconds    peak_RSS_MiB"
for np in 10 100 1000 10000; do
  "$gen" --components "$comps" --names acetone,methanol --model nrtl --params 150,100 \
    --pressure 101.325kPa --points "$np" --seed 7 > "$work/scale_$np.csv"
  "$bench" scale "$work/scale_$np.csv" | awk -F'\t' '{ printf "    %6d  %-10.4g %.1f\n", $1, $2, $3 / 1024 }'
done

# (d) ---------------------------------------------------------------------------------------
echo "(d) design-grade column on methanol/water (METHODS2 5.6 model), median of 10 calls:"
"$bld/tests/bench/pw-bench-design" 10 | sed 's/^/    /'
