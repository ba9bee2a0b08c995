#!/usr/bin/env bash
# Whole-process figures against the speed targets (issue on speed; docs/performance.md), counted
# in instructions with valgrind's callgrind (repeatable on a loaded machine) beside CPU times.
# Each command's count is given less the count of `pinchwise --version` (start-up), as the
# targets are stated. Also: peak resident memory of a 10,000-point fit of the whole program, and
# 40 whole-process fits against the SciPy version of the same fit (needs python3-scipy).
# Usage: tools/perf-targets.sh            (Release build in build-perf/)
set -euo pipefail
cd "$(dirname "$0")/.."
root=$PWD
bld=$root/build-perf
cmake -S . -B "$bld" -DCMAKE_BUILD_TYPE=Release -DPINCHWISE_BENCH=ON -DBUILD_TESTING=ON > /dev/null
cmake --build "$bld" -j2 --target pinchwise pw-gen-dataset > /dev/null
pw=$bld/pinchwise; gen=$bld/tests/pw-gen-dataset
comps=$root/datasets/components.csv
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
cd "$work"

count() { # instructions of one whole process
  valgrind --tool=callgrind --callgrind-out-file="$work/cg.out" "$@" 2>&1 >/dev/null |
    awk '/Collected/ { print $4 }'
}
cpu() { # user+system seconds of one whole process, median of 5
  for i in 1 2 3 4 5; do /usr/bin/time -f "%U %S" "$@" 2>&1 >/dev/null | tail -1; done |
    awk '{ print $1 + $2 }' | sort -g | sed -n 3p
}
row() { # label, instructions, target (instructions), cpu
  awk -v l="$1" -v n="$2" -v t="$3" -v c="$4" 'BEGIN {
    printf "  %-44s %8.2f M  target %6.2f M  %-4s  %.4f s CPU\n", l, n / 1e6, t / 1e6,
      (n <= t ? "met" : "not"), c }'
}

echo "date: $(date -u +%Y-%m-%dT%H:%MZ)  nproc: $(nproc)  cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2- | sed 's/^ //')"
base=$(count "$pw" --version)
row "start-up (pinchwise --version)" "$base" 2000000 "$(cpu "$pw" --version)"

data=$root/datasets/demo_acetone_water.csv # invented demo data, 29 points
n=$(count "$pw" fit "$data" --model nrtl --out fit.json --force)
row "default NRTL fit, demo (29 points), less start-up" $((n - base)) 3000000 \
  "$(cpu "$pw" fit "$data" --model nrtl --out fit2.json --force)"
spec=(--pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.10)
n=$(count "$pw" reflux fit.json "${spec[@]}")
row "reflux with a tangent pinch, less start-up" $((n - base)) 600000 "$(cpu "$pw" reflux fit.json "${spec[@]}")"
n=$(count "$pw" azeotrope fit.json --pressure 101.325kPa)
row "azeotrope, less start-up" $((n - base)) 600000 "$(cpu "$pw" azeotrope fit.json --pressure 101.325kPa)"

# The README's chain: fit every model, check, azeotrope, reflux, report.
chain=0
for c in "fit $data --model all --out-dir fits --force" "check $data" \
         "azeotrope fits/demo_acetone_water.nrtl.json --pressure 101.325kPa" \
         "reflux fits/demo_acetone_water.nrtl.json ${spec[*]}" \
         "report fits/demo_acetone_water.nrtl.json --out r.html --force ${spec[*]}"; do
  # shellcheck disable=SC2086
  n=$(count "$pw" $c); chain=$((chain + n))
done
row "README chain (5 commands, start-ups included)" "$chain" 40000000 0

"$gen" --components "$comps" --names acetone,methanol --model nrtl --params 150,100 \
  --pressure 101.325kPa --points 10000 --seed 7 > big.csv
rss=$(/usr/bin/time -f "%M" "$pw" fit big.csv --model nrtl --out big.json --force 2>&1 >/dev/null | tail -1)
awk -v r="$rss" 'BEGIN { printf "  %-44s %8.1f MB  target %6.1f MB  %s\n", "10,000-point fit, peak resident memory",
  r / 1024, 20, (r / 1024 <= 20 ? "met" : "not") }'

# The SciPy comparison: each side one whole process per data set (start-up, reading, fitting,
# writing), the 40 sets in turn; chi2 of both sides printed. SciPy (python3-scipy) is an optional
# extra: without it the row is skipped with a message.
if /usr/bin/python3 -c "import scipy.optimize" 2> /dev/null; then
  mkdir sets
  for i in $(seq 1 40); do
    "$gen" --components "$comps" --names acetone,methanol --model nrtl --params "$((20 * i)),$((300 - 5 * i))" \
      --pressure 101.325kPa --points 30 --noise-T 0.1 --noise-y 0.004 --seed "$i" > "sets/s$i.csv"
  done
  t0=$(date +%s.%N)
  for i in $(seq 1 40); do "$pw" fit "sets/s$i.csv" --model nrtl --out "sets/s$i.json" --force > /dev/null 2>&1; done
  t1=$(date +%s.%N)
  for i in $(seq 1 40); do /usr/bin/python3 "$root/tests/bench/scipy_nrtl.py" "$comps" "sets/s$i.csv" >> py.tsv; done
  t2=$(date +%s.%N)
  awk -v a="$t0" -v b="$t1" -v c="$t2" 'BEGIN { r = (c - b) / (b - a);
    printf "  %-44s %8.1f x  target %6.1f x  %s  (pinchwise %.2f s, SciPy %.2f s)\n",
      "40 whole-process fits, SciPy time / ours", r, 50, (r >= 50 ? "met" : "not"), b - a, c - b }'
  # chi2 of both sides, set by set (SciPy: one LM run from b12 = b21 = 0; pinchwise: its multistart)
  lower=0; same=0
  for i in $(seq 1 40); do
    c=$(/usr/bin/python3 -c 'import json, sys; print(repr(json.load(open(sys.argv[1]))["statistics"]["chi2"]))' "sets/s$i.json")
    p=$(awk -v f="s$i.csv" '$1 == f { print $3 }' py.tsv)
    printf "    set %2d  chi2 pinchwise %-14.8g SciPy %-14.8g\n" "$i" "$c" "$p"
    awk -v c="$c" -v p="$p" 'BEGIN { exit !(c <= p * (1 + 1e-9)) }' && lower=$((lower + 1))
    awk -v c="$c" -v p="$p" 'BEGIN { d = c - p; if (d < 0) d = -d; exit !(d <= 1e-6 * (p > 1 ? p : 1)) }' && same=$((same + 1))
  done
  echo "    chi2: pinchwise <= SciPy on $lower of 40 sets, equal to 1e-6 relative on $same of 40"
else
  echo "  40 whole-process fits against SciPy: skipped, SciPy not installed (optional extra: apt-get install -y python3-scipy)"
fi
