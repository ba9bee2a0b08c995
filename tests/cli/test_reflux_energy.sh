#!/usr/bin/env bash
# reflux --energy through the command line: the balance key, duties in the design rows, the
# overall energy balance from the printed enthalpies, refusals, and the latent-heat warning.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "demo fit"
# Heats: dHvap at Tb from Smith, Van Ness & Abbott 7th ed. Table B.2; cpL, cpV near 25 C from the
# CRC Handbook (from memory; methods brief part 2, section 7). Antoine rows as the shipped library.
cat > heat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation,dHvap_kJ_mol,cpL_J_molK,cpV_J_molK
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97; heats SVNA B.2, CRC (from memory)",iapws-if97,40.66,75.3,33.6
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory); heats SVNA B.2, CRC (from memory)",antoine,29.10,126.3,74.5
CSV
sed 's/,40.66,75.3,33.6$/,40.66,75.3,/' heat.csv > nocpv.csv

"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --json > e.json 2>/dev/null || fail "reflux --energy"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --json > c.json 2>warn.txt || fail "reflux"
python3 - <<'PY' || fail "energy keys"
import json
e = json.load(open("e.json")); c = json.load(open("c.json"))
assert e["balance"] == "energy" and c["balance"] == "constant-molal-overflow"
for k in ["feasible", "reason", "r_min", "pinch", "n_min"]:
    assert k in e, k
assert e["feasible"] and e["r_min"] > 0 and e["pinch"]["kind"] in ("feed", "tangent")
assert e["n_min"] == c["n_min"]                     # total reflux: no energy balance plays a part
assert e["energy"]["r_min_constant_molal_overflow"] == c["r_min"]
D = (0.10 - 0.02) / (0.95 - 0.02); B = 1 - D
en = e["energy"]
for r in e["design"]:
    assert r["reached"] and r["condenser_kJ_per_mol_feed"] > 0 and r["reboiler_kJ_per_mol_feed"] > 0
    # overall balance: F h_F + Q_R = D h_D + B h_B + Q_C (kJ vs J converted once)
    lhs = en["h_feed_J_mol"] + 1e3 * r["reboiler_kJ_per_mol_feed"]
    rhs = D * en["h_distillate_J_mol"] + B * en["h_bottoms_J_mol"] + 1e3 * r["condenser_kJ_per_mol_feed"]
    assert abs(lhs - rhs) < 1e-6 * abs(lhs), (lhs, rhs)
    assert [s["stage"] for s in r["profile"]] == list(range(1, len(r["profile"]) + 1))
assert [r["factor"] for r in e["design"]] == [1.2, 1.3, 1.5]
PY
grep -q "heats of vaporization" warn.txt || fail "no latent-heat warning without --energy"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy 2>warn2.txt >/dev/null || fail "text"
grep -q "heats of vaporization" warn2.txt && fail "latent-heat warning with --energy"
# No heat data: refused, naming the component and the column.
cat > noheat.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation
water,16.3872,3885.70,230.170,ln,kPa,C,0,200,"SVNA 7th ed. Table B.2 (from memory); IAPWS-IF97",iapws-if97
acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,"SVNA 7th ed. Table B.2 (from memory)",antoine
CSV
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components noheat.csv --energy 2>err.txt && fail "--energy without heat data accepted"
grep -q "dHvap_kJ_mol" err.txt || fail "message lacks the column: $(cat err.txt)"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components nocpv.csv --energy 2>err.txt && fail "missing cpV accepted"
grep -q "water" err.txt && grep -q "cpV_J_molK" err.txt || fail "message: $(cat err.txt)"
# --uncertainty with --energy: the interval brackets the energy R_min (few draws: a smoke test of
# the combination; the propagation itself is tested in test_uncertainty*).
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --uncertainty --samples 20 --json > u.json 2>/dev/null || fail "--energy --uncertainty"
python3 - <<'PY' || fail "--energy --uncertainty keys"
import json
d = json.load(open("u.json")); e = json.load(open("e.json"))
assert d["r_min"] == e["r_min"]
lo, hi = d["r_min_ci95"]
assert lo < d["r_min"] < hi and 0 <= d["feasible_probability"] <= 1
PY
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --compare demo.json 2>err.txt && fail "--energy --compare accepted"
echo "reflux --energy CLI tests passed"
