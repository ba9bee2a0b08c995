#!/usr/bin/env bash
# pinchwise reflux through the command line: interface keys, infeasible splits, refusals.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json 2>/dev/null >/dev/null || fail "demo fit"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --out ew.json 2>/dev/null >/dev/null || fail "ethanol fit"

# 1. Feasible split with a tangent pinch (invented demo data; acetone/water-like curve).
"$pw" reflux demo.json --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.10 --json > r.json 2>/dev/null || fail "reflux"
python3 - <<'PY' || fail "feasible keys"
import json
d = json.load(open("r.json"))
for k in ["feasible", "reason", "r_min", "pinch", "n_min"]:
    assert k in d, k
assert d["feasible"] is True and d["reason"] is None
assert d["pinch"]["kind"] == "tangent" and d["pinch"]["section"] == "rectifying"
assert 0.1 < d["pinch"]["x"] < 0.95 and d["pinch"]["y"] > d["pinch"]["x"]
assert d["r_min"] > d["r_min_feed_point_only"] > 0
assert d["n_min"] > 1 and [r["factor"] for r in d["design"]] == [1.2, 1.3, 1.5]
# more reflux, fewer stages (common practice: 1.2-1.5 R_min as the operating range)
st = [r["stages"] for r in d["design"]]
assert st[0] > st[1] > st[2] > d["n_min"]
PY

# 2. Same split with other feed conditions: saturated vapor, subcooled, superheated.
for q in 0 1.3 -0.2 0.5; do
  "$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --q $q --json > q.json 2>/dev/null || fail "q = $q"
  python3 -c 'import json; d=json.load(open("q.json")); assert d["feasible"] and d["r_min"] > 0' || fail "q = $q keys"
done

# 3. Distillate beyond the ethanol/water azeotrope (x1 about 0.894 at 1 atm): infeasible.
"$pw" reflux ew.json --pressure 101.325kPa --xd 0.95 --xb 0.05 --zf 0.3 --json > inf.json 2>/dev/null || fail "infeasible exit status"
python3 - <<'PY' || fail "infeasible keys"
import json
d = json.load(open("inf.json"))
assert d["feasible"] is False and d["r_min"] is None and d["pinch"] is None and d["n_min"] is None
assert "azeotrope" in d["reason"], d["reason"]
PY

# 4. Refusals: a bare number for a pressure (message lists the units), xd < zf, missing file.
"$pw" reflux demo.json --pressure 101.325 --xd 0.95 --xb 0.02 --zf 0.1 2>err.txt && fail "bare pressure accepted"
grep -q "kPa" err.txt && grep -q "atm" err.txt || fail "unit list missing: $(cat err.txt)"
"$pw" reflux demo.json --pressure 1atm --xd 0.05 --xb 0.02 --zf 0.1 2>err.txt && fail "xd < zf accepted"
"$pw" reflux nothere.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 2>err.txt && fail "missing fit file"
grep -q "nothere.json" err.txt || fail "missing-file message lacks the name"
printf '{"format": "pinchwise-fit", "format_version": 1, "model": "nrtl"' > broken.json
"$pw" reflux broken.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.1 2>err.txt && fail "truncated fit file accepted"
grep -q "broken.json" err.txt || fail "broken-file message lacks the name"
echo "reflux CLI tests passed"
