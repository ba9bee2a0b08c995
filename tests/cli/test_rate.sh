#!/usr/bin/env bash
# pinchwise rate through the command line: CONTRACT keys, balances, a reflux design rated back,
# refusals of impossible specifications.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "demo fit"

# 1. Keys and balances (invented demo data).
"$pw" rate demo.json --pressure 101.325kPa --stages 12 --feed-stage 9 --reflux 0.8 --zf 0.1 --distillate 0.09 --json > r.json 2>/dev/null || fail "rate"
python3 - <<'PY' || fail "rate keys"
import json
d = json.load(open("r.json"))
assert set(["xd", "xb", "stages"]) <= set(d)
st = d["stages"]
assert [s["stage"] for s in st] == list(range(1, 13))
for s in st:
    assert set(["stage", "x1", "y1", "T_K"]) <= set(s)
    assert 0 <= s["x1"] <= 1 and 0 <= s["y1"] <= 1 and 300 < s["T_K"] < 400
assert abs(st[0]["y1"] - d["xd"]) < 1e-15            # total condenser
assert abs(0.09 * d["xd"] + 0.91 * d["xb"] - 0.1) < 1e-12   # component balance
assert d["xd"] > 0.9 and d["xb"] < 0.05
PY

# 2. A reflux design rated back: with the design's stages rounded up, its feed stage, R and D/F,
#    the column makes at least the design's purities (more stages than the fractional count).
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --json > d.json 2>/dev/null || fail "reflux"
read N K R D < <(python3 -c '
import json, math
d = json.load(open("d.json")); r = d["design"][2]
print(math.ceil(r["stages"]), r["feed_stage"], repr(r["R"]), repr((0.10 - 0.02) / (0.95 - 0.02)))')
"$pw" rate demo.json --pressure 1atm --stages "$N" --feed-stage "$K" --reflux "$R" --zf 0.10 --distillate "$D" --json > rr.json 2>/dev/null || fail "rate of the design"
python3 -c '
import json; d = json.load(open("rr.json"))
assert d["xd"] >= 0.95 - 1e-9 and d["xb"] <= 0.02 + 1e-9, d' || fail "rated design short of its products"

# 3. Refusals: a distillate the feed cannot supply, no boil-up, feed stage outside the column.
"$pw" rate demo.json --pressure 1atm --stages 10 --feed-stage 5 --reflux 1 --zf 0.1 --distillate 1.2 2>err.txt && fail "D/F > 1 accepted"
grep -q "feed cannot supply" err.txt || fail "D/F message: $(cat err.txt)"
"$pw" rate demo.json --pressure 1atm --stages 10 --feed-stage 5 --reflux 0.1 --zf 0.1 --distillate 0.05 --q -3 2>err.txt && fail "no boil-up accepted"
grep -q "boil-up" err.txt || fail "boil-up message: $(cat err.txt)"
"$pw" rate demo.json --pressure 1atm --stages 10 --feed-stage 11 --reflux 1 --zf 0.1 --distillate 0.05 2>err.txt && fail "feed stage 11 of 10 accepted"
"$pw" rate demo.json --pressure 1atm --stages 2.5 --feed-stage 1 --reflux 1 --zf 0.1 --distillate 0.05 2>err.txt && fail "fractional stages accepted"
"$pw" rate demo.json --pressure 1 --stages 10 --feed-stage 5 --reflux 1 --zf 0.1 --distillate 0.05 2>err.txt && fail "bare pressure accepted"
"$pw" rate demo.json --pressure 1atm --stages 10 --feed-stage 5 --reflux 1 --zf 0.1 2>err.txt && fail "missing --distillate accepted"
# 4. --energy: needs heat data (refused naming the column without it), then adds the duties.
cat > noheat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97",iapws-if97
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory)",antoine
CSV
"$pw" rate demo.json --pressure 1atm --stages 10 --feed-stage 5 --reflux 1 --zf 0.1 --distillate 0.05 --components noheat.csv --energy 2>err.txt && fail "--energy without heat data accepted"
grep -q "dHvap_kJ_mol" err.txt || fail "--energy message: $(cat err.txt)"
# Heats: SVNA 7th ed. Table B.2 and the CRC Handbook (from memory; methods brief part 2, section 7).
cat > heat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation,dHvap_kJ_mol,cpL_J_molK,cpV_J_molK
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97; heats SVNA B.2, CRC (from memory)",iapws-if97,40.66,75.3,33.6
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory); heats SVNA B.2, CRC (from memory)",antoine,29.10,126.3,74.5
CSV
"$pw" rate demo.json --pressure 1atm --stages 12 --feed-stage 9 --reflux 0.8 --zf 0.1 --distillate 0.09 --components heat.csv --energy --json > e.json 2>/dev/null || fail "rate --energy"
python3 - <<'PY' || fail "rate --energy keys"
import json
d = json.load(open("e.json"))
assert d["balance"] == "energy" and d["condenser_kJ_per_mol_feed"] > 0 and d["reboiler_kJ_per_mol_feed"] > 0
assert len(d["stages"]) == 12 and d["steady_states_found"] >= 1
assert abs(0.09 * d["xd"] + 0.91 * d["xb"] - 0.1) < 1e-12
assert "energy balance" in d["caution"] and "constant molal" not in d["caution"], d["caution"]
PY
python3 -c '
import json; d = json.load(open("r.json"))
assert "constant molal overflow" in d["caution"]' || fail "constant-overflow caution"
echo "rate CLI tests passed"
