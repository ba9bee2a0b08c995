#!/usr/bin/env bash
# Every failure: non-zero exit, exactly one line on stderr naming the problem, nothing on stdout
# (the interface's rule for errors). Usage mistakes of every command.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out f.json > /dev/null 2>&1 || fail "setup fit"
check() { # expected-fragment command...
  local frag=$1; shift
  "$@" > out.txt 2> err.txt && fail "succeeded: $*"
  [ "$(wc -l < err.txt)" -eq 1 ] || fail "not one stderr line for: $* -> $(cat err.txt)"
  [ ! -s out.txt ] || fail "stdout not empty for: $*"
  grep -q -- "$frag" err.txt || fail "no '$frag' in: $(cat err.txt)"
}
check "no command" "$pw"
check "unknown command" "$pw" frobnicate
check "unknown option" "$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --bogus
check "unknown model" "$pw" fit "$src/datasets/demo_acetone_water.csv" --model uniquack
check "no unit" "$pw" reflux f.json --pressure 101.325 --xd 0.95 --xb 0.02 --zf 0.1 --json
check "unknown option" "$pw" reflux f.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 --bogus 1
check "[0, 1]" "$pw" reflux f.json --pressure 1atm --xd 1.5 --xb 0.02 --zf 0.1
check "no unit" "$pw" azeotrope f.json --pressure 101.325 --json
check "unknown option" "$pw" check "$src/datasets/demo_acetone_water.csv" --bogus
check "no unit" "$pw" screen f.json --pressure 1 --xd 0.9 --xb 0.1
check "out" "$pw" report f.json
check "nothere.csv" "$pw" check nothere.csv --json
echo "error-message tests passed"
