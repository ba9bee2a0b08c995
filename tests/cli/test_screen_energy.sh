#!/usr/bin/env bash
# screen --energy: the rough column's R_min with energy balances, equal to reflux --energy at q = 1.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "demo fit"
# Heats: SVNA 7th ed. Table B.2 and the CRC Handbook (from memory; methods brief part 2, section 7).
cat > heat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation,dHvap_kJ_mol,cpL_J_molK,cpV_J_molK
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97; heats SVNA B.2, CRC (from memory)",iapws-if97,40.66,75.3,33.6
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory); heats SVNA B.2, CRC (from memory)",antoine,29.10,126.3,74.5
CSV
"$pw" screen demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 --components heat.csv --energy --json > s.json 2>/dev/null || fail "screen --energy"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 --components heat.csv --energy --json > r.json 2>/dev/null || fail "reflux --energy"
python3 - <<'PY' || fail "screen energy keys"
import json
s = json.load(open("s.json")); r = json.load(open("r.json"))
e = s["energy"]
assert e["feasible"] is True
assert abs(e["r_min"] - r["r_min"]) <= 1e-9 * r["r_min"], (e["r_min"], r["r_min"])
assert e["r_min_constant_molal_overflow"] == r["energy"]["r_min_constant_molal_overflow"]
PY
cat > noheat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97",iapws-if97
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory)",antoine
CSV
"$pw" screen demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 --components noheat.csv --energy 2>err.txt >/dev/null && fail "screen --energy without heat data accepted"
grep -q "dHvap_kJ_mol" err.txt || fail "message: $(cat err.txt)"
echo "screen --energy tests passed"
