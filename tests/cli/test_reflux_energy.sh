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
# overflow check: |40.66 - 29.10| / 29.10 = 39.7 % against the 10 % rule (common practice);
# doubtful only where constant molal overflow was used
for d, used in ((c, True), (e, False)):
    o = d["overflow_check"]
    assert abs(o["latent_heat_mismatch"] - (40.66 - 29.10) / 29.10) < 1e-12, o
    assert o["limit"] == 0.1 and o["doubtful"] is used and o["basis"] == "common practice", o
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
# Without heats the mismatch is unknown (null) and never doubtful.
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components noheat.csv --json > n.json 2>warn3.txt || fail "reflux without heats"
python3 -c 'import json; o = json.load(open("n.json"))["overflow_check"]; assert o["doubtful"] is False and o["latent_heat_mismatch"] is None, o' || fail "overflow check without heats"
grep -q "heats of vaporization" warn3.txt && fail "latent-heat warning without heats"
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
# --energy with --compare: every compared model is solved with energy balances (the same heat
# data); each row's R_min is that fit's own `reflux --energy` answer.
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model wilson --out demo_w.json >/dev/null 2>&1 || fail "wilson fit"
"$pw" reflux demo_w.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --json > ew.json 2>/dev/null || fail "reflux --energy, wilson"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --compare demo_w.json --json > cmp.json 2>/dev/null || fail "--energy --compare"
python3 - <<'PY' || fail "--energy --compare keys"
import json
d = json.load(open("cmp.json")); e = json.load(open("e.json")); w = json.load(open("ew.json"))
m = d["model_comparison"]
assert m["balance"] == "energy", m
rows = {r["fit_file"]: r for r in m["models"]}
assert abs(rows["demo.json"]["r_min"] - e["r_min"]) <= 1e-9 * e["r_min"], (rows, e["r_min"])
assert abs(rows["demo_w.json"]["r_min"] - w["r_min"]) <= 1e-9 * w["r_min"], (rows, w["r_min"])
assert d["r_min"] == e["r_min"] and d["balance"] == "energy"
PY
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --components heat.csv --energy --compare demo_w.json > cmp.txt 2>/dev/null || fail "--energy --compare text"
grep -q "energy balances" cmp.txt || fail "--compare text does not name the balance: $(cat cmp.txt)"

# Component 1 leaving with the bottoms: the invented demo data with the components named the
# other way round (x -> 1 - x) give the same column (R_min, pinch, duties) to the fits' precision.
python3 - "$src/datasets/demo_acetone_water.csv" <<'PY' || fail "swapped demo data"
import sys
lines = open(sys.argv[1]).read().splitlines()
out = []
for l in lines:
    if l.startswith("# components:"):
        out.append("# components: water, acetone")
    elif l.startswith("#") or l.startswith("x1"):
        out.append(l)
    elif l.strip():
        x, y, t = l.split(",")
        out.append("%r,%r,%s" % (1 - float(x), 1 - float(y), t))
open("swapped.csv", "w").write("\n".join(out) + "\n")
PY
"$pw" fit swapped.csv --model nrtl --out sw.json >/dev/null 2>&1 || fail "swapped fit"
"$pw" reflux sw.json --pressure 1atm --xd 0.05 --xb 0.98 --zf 0.90 --components heat.csv --energy --json > sw.out.json 2>err.txt || fail "--energy with component 1 to the bottoms: $(cat err.txt)"
python3 - <<'PY' || fail "bottoms direction = swapped naming"
import json
e = json.load(open("e.json")); s = json.load(open("sw.out.json"))
assert s["feasible"] and s["balance"] == "energy"
assert abs(s["r_min"] - e["r_min"]) <= 1e-4 * e["r_min"], (s["r_min"], e["r_min"])
assert s["pinch"]["kind"] == e["pinch"]["kind"] and s["pinch"]["section"] == e["pinch"]["section"]
assert abs(s["pinch"]["x"] - (1 - e["pinch"]["x"])) < 1e-3, (s["pinch"], e["pinch"])
for a, b in zip(s["design"], e["design"]):
    assert a["feed_stage"] == b["feed_stage"] and abs(a["stages"] - b["stages"]) < 0.05 * b["stages"]
    assert abs(a["condenser_kJ_per_mol_feed"] - b["condenser_kJ_per_mol_feed"]) < 1e-3 * b["condenser_kJ_per_mol_feed"]
    p = a["profile"]
    assert abs(p[0]["y1"] - 0.05) < 1e-12 and p[-1]["x1"] >= 0.98 - 1e-9   # fractions of component 1
PY
echo "reflux --energy CLI tests passed"
