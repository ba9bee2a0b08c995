#!/usr/bin/env bash
# CI steps after the README's test command (called by .ci/run):
#   1. the whole ctest suite again in a second tree built with AddressSanitizer + UBSan (gcc);
#   2. valgrind memcheck of the command-line program over the demo (fit, check, reflux): any
#      memory error or definite/indirect leak fails;
#   3. a short libFuzzer smoke run of each fuzz target (clang), seeded from tests/fuzz/corpus.
# Every step is bounded: the fuzz runs take PW_FUZZ_SECONDS (default 45) each.
set -euo pipefail
cd "$(dirname "$0")/.."
root=$PWD
jobs=${PW_CI_JOBS:-2}
fuzz_seconds=${PW_FUZZ_SECONDS:-45}

step() { printf '\n==== ci-extra: %s\n' "$*"; }

# ---- 1. sanitizers ---------------------------------------------------------------------------
step "ctest under AddressSanitizer + UndefinedBehaviorSanitizer"
CC=gcc cmake -S . -B build-sanitize -DENABLE_SANITIZERS=ON -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DPINCHWISE_BENCH=OFF -DPINCHWISE_BROWSER_TEST=OFF > /dev/null
cmake --build build-sanitize -j"$jobs"
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1:strict_string_checks=1 \
UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build-sanitize --output-on-failure -j"$jobs" --timeout 1200

# ---- 2. valgrind memcheck over the demo ------------------------------------------------------
step "valgrind memcheck of fit, check and reflux on the demo dataset"
pw=$root/build/pinchwise
[ -x "$pw" ] || { cmake -S . -B build > /dev/null && cmake --build build -j"$jobs"; }
vg_tmp=$(mktemp -d); trap 'rm -rf "$vg_tmp"' EXIT
vg() {
  valgrind --quiet --error-exitcode=1 --leak-check=full --errors-for-leak-kinds=definite,indirect \
    --show-leak-kinds=definite,indirect --track-origins=yes "$@"
}
demo=$root/datasets/demo_acetone_water.csv
vg "$pw" fit "$demo" --model nrtl --out "$vg_tmp/demo.nrtl.json" --json > "$vg_tmp/fit.json"
vg "$pw" fit "$demo" --model wilson --out "$vg_tmp/demo.wilson.json" > /dev/null
vg "$pw" check "$demo" --json > "$vg_tmp/check.json"
vg "$pw" reflux "$vg_tmp/demo.nrtl.json" --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.3 --json \
  > "$vg_tmp/reflux.json"
vg "$pw" reflux "$vg_tmp/demo.nrtl.json" --pressure 101.325kPa --xd 0.9 --xb 0.05 --zf 0.4 --q 0.5 \
  > /dev/null
# A failing command must not leak either.
if vg "$pw" fit "$root/tests/bad-inputs/files/nan_T.csv" --model nrtl --out "$vg_tmp/bad.json" \
  2> "$vg_tmp/bad.err"; then
  echo "ci-extra: a bad dataset was accepted"; exit 1
fi
grep -q "nan_T.csv" "$vg_tmp/bad.err" || { cat "$vg_tmp/bad.err"; exit 1; }
# valgrind's own errors give exit 1; the program's refusal of this file is exit 3.
grep -q "ERROR SUMMARY: [1-9]" "$vg_tmp/bad.err" && { cat "$vg_tmp/bad.err"; exit 1; }
echo "valgrind: no errors, no definite or indirect leaks"

# ---- 3. fuzz smoke runs ----------------------------------------------------------------------
step "libFuzzer smoke runs, ${fuzz_seconds}s per target"
if ! command -v clang > /dev/null; then
  echo "ci-extra: clang is needed for the fuzz targets"; exit 1
fi
CC=clang cmake -S . -B build-fuzz -DENABLE_FUZZING=ON -DBUILD_TESTING=OFF \
  -DCMAKE_BUILD_TYPE=RelWithDebInfo > /dev/null
cmake --build build-fuzz -j"$jobs" --target fuzz_dataset fuzz_complib fuzz_fitfile fuzz_quantity
for t in dataset complib fitfile quantity; do
  work=$(mktemp -d)
  cp "$root"/tests/fuzz/corpus/$t/* "$work/"
  echo "fuzz_$t:"
  "$root/build-fuzz/tests/fuzz/fuzz_$t" -max_total_time="$fuzz_seconds" -timeout=10 \
    -rss_limit_mb=2048 -artifact_prefix="$vg_tmp/$t-" -print_final_stats=1 "$work" \
    > "$vg_tmp/fuzz_$t.log" 2>&1 || { tail -n 60 "$vg_tmp/fuzz_$t.log"; exit 1; }
  grep -E "^stat::number_of_executed_units" "$vg_tmp/fuzz_$t.log" || true
  rm -rf "$work"
done
step "all extra checks passed"
