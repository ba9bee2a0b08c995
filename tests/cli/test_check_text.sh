#!/usr/bin/env bash
# check's table names what each value is and carries its unit; a value that does not apply says
# why instead of printing "nan". Data: the shipped ethanol/water and MEK/toluene P-x-y sets.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
for d in ethanol_water_1atm.csv mek_toluene_50C_pxy.csv methanol_water_1atm.csv; do
  "$pw" check "$src/datasets/$d" > c.txt 2>/dev/null || fail "check $d"
  grep -qiw "nan" c.txt && fail "$d: nan in: $(grep -iw nan c.txt)"
  grep -q "value: " c.txt || fail "$d: the values are not named"
  grep -q "value: *$" c.txt && fail "$d: a value without its description: $(grep -B1 'value: *$' c.txt)"
  grep -q "not applicable, because\|not run, because" c.txt || true
done
"$pw" check "$src/datasets/ethanol_water_1atm.csv" > c.txt 2>/dev/null || fail "check"
grep -q "herington .* % points .* % points" c.txt || fail "Herington D - J without its unit: $(grep herington c.txt)"
grep -q "value: D - J" c.txt || fail "D - J not named"
grep -q "legendre_point .*mole fraction" c.txt || fail "point test without its unit"
grep -q "slope not applicable, because" c.txt || fail "the slope part does not say why it is missing"
# the verdict's reasons carry the unit too (a P-x set whose pure rows miss the vapor pressures)
"$pw" check "$src/datasets/mek_toluene_50C_px.csv" > c.txt 2>/dev/null || fail "check P-x"
grep -q "pure_endpoints failed ([0-9.]* % of P_sat, limit [0-9.]* % of P_sat)" c.txt || fail "reason without unit: $(grep failed c.txt)"
echo ok
