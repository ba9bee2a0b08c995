#!/usr/bin/env bash
# reflux --uncertainty / --samples / --seed / --compare through the command line: the interface keys,
# reproducibility of the seeded draws, the model table, refusals.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
data="$src/datasets/methanol_water_1atm.csv"
for m in margules vanlaar wilson nrtl; do
  "$pw" fit "$data" --model $m --out mw.$m.json > /dev/null 2>&1 || fail "fit $m"
done
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model nrtl --out ew.nrtl.json > /dev/null 2>&1 || fail "fit ew"
col="--pressure 1atm --xd 0.95 --xb 0.05 --zf 0.4"

# 1. Interface keys (CONTRACT.md) and this project's own keys.
"$pw" reflux mw.nrtl.json $col --uncertainty --samples 120 --json > u1.json 2>err.txt || fail "reflux --uncertainty: $(cat err.txt)"
python3 - <<'PY' || fail "keys"
import json
d = json.load(open("u1.json"))
lo, hi = d["r_min_ci95"]
assert lo < d["r_min"] < hi, (lo, d["r_min"], hi)
assert 0.0 <= d["feasible_probability"] <= 1.0
u = d["uncertainty"]
for k in ["r_min", "boilup_min", "stages_operating"]:
    for kk in ["value", "ci95", "ci95_linearised", "ci95_sampled", "intervals_disagree", "ci95_from"]:
        assert kk in u[k], (k, kk)
assert u["draws"]["evaluated"] == 120 and u["seed"] == 1
assert isinstance(u["feasibility_risk"], str) and "parameter sets" in u["feasibility_risk"]
nm = u["next_measurements"]
assert nm is None or (0 <= nm["x1_range"][0] < nm["x1_range"][1] <= 1 and "x1 between" in nm["advice"])
PY

# 2. The same seed gives the same numbers; another seed other draws.
"$pw" reflux mw.nrtl.json $col --uncertainty --samples 120 --json > u2.json 2>/dev/null || fail "repeat"
cmp -s u1.json u2.json || fail "same seed, different output"
"$pw" reflux mw.nrtl.json $col --samples 120 --seed 7 --json > u3.json 2>/dev/null || fail "seed 7"
python3 -c '
import json
a = json.load(open("u1.json"))["uncertainty"]["r_min"]["ci95_sampled"]
b = json.load(open("u3.json"))["uncertainty"]["r_min"]["ci95_sampled"]
assert a != b' || fail "seed ignored"

# 3. Model comparison: one best model with delta AICc 0, every row has an R_min or says why not.
"$pw" reflux mw.nrtl.json $col --compare mw.margules.json --compare mw.wilson.json --compare mw.vanlaar.json --json > c.json 2>/dev/null || fail "--compare"
python3 - <<'PY' || fail "model table"
import json
d = json.load(open("c.json"))
assert "r_min_ci95" not in d          # --compare alone does not propagate
rows = d["model_comparison"]["models"]
assert [r["model"] for r in rows] == ["nrtl", "margules", "wilson", "vanlaar"]
best = [r for r in rows if r["support"] == "best"]
assert len(best) == 1 and best[0]["delta_aicc"] == 0
assert all(r["delta_aicc"] >= 0 for r in rows)
assert all(r["feasible"] is not True or r["r_min"] > 0 for r in rows)
lo, hi = d["model_comparison"]["r_min_range"]
assert lo <= hi
PY
"$pw" reflux mw.nrtl.json $col --compare mw.wilson.json > c.txt 2>/dev/null || fail "--compare text"
grep -q "delta AICc" c.txt || fail "no model table in text output"

# 4. Refusals: a fit of other data, a bad sample count.
"$pw" reflux mw.nrtl.json $col --compare ew.nrtl.json > /dev/null 2>err.txt && fail "compared fits of different data"
grep -q "same data set" err.txt || fail "message: $(cat err.txt)"
"$pw" reflux mw.nrtl.json $col --samples 2.5 > /dev/null 2>err.txt && fail "accepted --samples 2.5"
grep -q "whole number" err.txt || fail "message: $(cat err.txt)"
# 5. azeotrope --uncertainty: x1_ci95 and T_K_ci95 (fixed P) or P_kPa_ci95 (fixed T) on each azeotrope.
"$pw" azeotrope ew.nrtl.json --pressure 1atm --uncertainty --samples 60 --json > a.json 2>/dev/null || fail "azeotrope --uncertainty"
"$pw" azeotrope ew.nrtl.json --temperature 70C --samples 60 --json > b.json 2>/dev/null || fail "azeotrope --samples at fixed T"
python3 - <<'PY' || fail "azeotrope keys"
import json
a = json.load(open("a.json"))["azeotropes"]
assert len(a) == 1
lo, hi = a[0]["x1_ci95"]; assert lo < a[0]["x1"] < hi
lo, hi = a[0]["T_K_ci95"]; assert lo < a[0]["T_K"] < hi
assert 0 <= a[0]["uncertainty"]["present_probability"] <= 1
b = json.load(open("b.json"))["azeotropes"]
lo, hi = b[0]["P_kPa_ci95"]; assert lo < b[0]["P_kPa"] < hi and "T_K_ci95" not in b[0]
PY
"$pw" azeotrope ew.nrtl.json --pressure 1atm --samples -3 > /dev/null 2>&1 && fail "accepted --samples -3"
echo "ok"
