#!/usr/bin/env bash
# reflux with the distillate 1e-3 ... 1e-5 below the fitted minimum-boiling azeotrope of the shipped
# ethanol-water data: a tangent pinch in the rectifying section beside the product, R_min well
# above the feed-point value, and a design row the column cannot reach within the stage limit
# reported as such ("reached": false), never a failed command; --uncertainty still writes its JSON.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model nrtl --out ew.json > /dev/null 2>&1 || fail "fit"
"$pw" azeotrope ew.json --pressure 1atm --json > az.json 2>/dev/null || fail "azeotrope"
xaz=$(python3 -c 'import json; print(repr(json.load(open("az.json"))["azeotropes"][0]["x1"]))')
for d in 1e-3 1e-4 1e-5; do
  xd=$(python3 -c "print(repr($xaz - $d))")
  "$pw" reflux ew.json --pressure 1atm --xd "$xd" --xb 0.02 --zf 0.3 --json > r$d.json 2>err.txt \
    || fail "reflux xd = azeotrope - $d: $(cat err.txt)"
  python3 - "$xd" r$d.json <<'PY' || fail "reflux JSON at azeotrope - $d"
import json, sys
xd = float(sys.argv[1]); d = json.load(open(sys.argv[2]))
assert d["feasible"] is True and d["reason"] is None
p = d["pinch"]
assert p["kind"] == "tangent" and p["section"] == "rectifying", p
assert xd - p["x"] < 0.02 * (xd - 0.02), (xd, p)      # beside the product
assert d["r_min"] > 5 * d["r_min_feed_point_only"], d["r_min"]
for row in d["design"]:
    assert isinstance(row["reached"], bool)
    assert (row["stages"] is None) == (not row["reached"]), row
    if not row["reached"]:
        assert "iteration limit" in row["note"], row
PY
done
python3 -c 'import json; d = json.load(open("r1e-5.json")); assert not d["design"][0]["reached"], d["design"][0]' \
  || fail "the 1.2 R_min row at azeotrope - 1e-5 should need more than the stage limit"
"$pw" reflux ew.json --pressure 1atm --xd "$(python3 -c "print(repr($xaz - 1e-5))")" --xb 0.02 --zf 0.3 \
  --uncertainty --samples 40 --json > u.json 2>err.txt || fail "reflux --uncertainty: $(cat err.txt)"
python3 - <<'PY' || fail "uncertainty JSON"
import json
d = json.load(open("u.json"))
assert "r_min_ci95" in d and "feasible_probability" in d
assert 0.0 <= d["feasible_probability"] <= 1.0
st = d["uncertainty"]["stages_operating"]
assert isinstance(st["draws_not_reached"], int) and st["draws_not_reached"] >= 0, st
PY
echo ok
