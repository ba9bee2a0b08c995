#!/usr/bin/env bash
# The single column's limits, checked at their edges on the shipped data (NRTL fits):
#  - butanol/water at 1 atm splits into two liquids (layers x1 about 0.0184 and 0.5545, three-phase
#    365.75 K): reflux, screen and rate refuse a column whose liquids reach into that region, naming
#    the layers and the decanter scheme, and a product inside it boils at the three-phase T;
#  - rate never prints a profile whose feed-stage mismatch is not ~0 (no steady state found);
#  - reflux gives a pinch object whenever feasible; a superheated feed limited by zero boil-up has
#    R_min = (1 - q) F / D - 1 (hand calculation from the balances) and its pinch on the curve;
#  - targets on the wrong side of the azeotrope are told that either direction is accepted.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/butanol_water_1atm.csv" --model nrtl --out bw.json > /dev/null 2>&1 || fail "fit bw"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model nrtl --out ew.json > /dev/null 2>&1 || fail "fit ew"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json > /dev/null 2>&1 || fail "fit demo"

# 1. reflux inside the two-liquid region: refused, layers named, T_top the three-phase T
"$pw" reflux bw.json --pressure 1atm --xd 0.2 --xb 0.001 --zf 0.01 --json > r1.json 2>/dev/null \
  || fail "reflux in the two-liquid region exits non-zero"
python3 - r1.json <<'PY' || fail "reflux refusal in the two-liquid region"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["feasible"] is False and d["pinch"] is None and d["r_min"] is None, d
r = d["reason"]
assert "two-liquid region" in r and "decanter" in r and "0.0184" in r and "0.5545" in r, r
# a liquid of overall x1 = 0.2 is two layers: it boils at the three-phase temperature, never below
assert abs(d["T_top_K"] - 365.75) < 0.02, d["T_top_K"]
PY
# the same targets on screen: its column check refuses with the same reason
"$pw" screen bw.json --pressure 1atm --xd 0.2 --xb 0.001 --zf 0.01 --json > s1.json 2>/dev/null \
  || fail "screen"
python3 -c 'import json,sys; d=json.load(open("s1.json")); t=" ".join(r["text"] for r in d["reasons"]); assert d["verdict"]=="infeasible" and "two-liquid region" in t, d' \
  || fail "screen refusal in the two-liquid region"

# 2. feasible beside the rich layer (component 1 to the bottoms): r_min 0 and still a pinch object
"$pw" reflux bw.json --pressure 1atm --xd 0.56 --xb 0.99 --zf 0.7 --json > r2.json 2>/dev/null \
  || fail "reflux beside the rich layer"
python3 - r2.json <<'PY' || fail "a feasible reflux without a pinch object"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["feasible"] is True and d["r_min"] == 0.0, d
p = d["pinch"]
assert isinstance(p, dict) and p["kind"] in ("feed", "tangent"), p
assert p["section"] in ("rectifying", "stripping"), p
assert d["r_min_feed_point_only"] < 0.0      # the feed's vapor is already richer than xd
assert p["kind"] == "feed" and p["x"] == d["q_line_point"]["x"] and p["y"] == d["q_line_point"]["y"], p
PY

# 3. superheated feed, ethanol/water: R_min set by zero boil-up. Hand calculation:
#    D/F = (zf - xb)/(xd - xb) = 0.09/0.84; Vbar = (R + 1) D - (1 - q) F >= 0 -> R >= 1.3 F/D - 1.
"$pw" reflux ew.json --pressure 1atm --xd 0.85 --xb 0.01 --zf 0.1 --q -0.3 --json > r3.json \
  2>/dev/null || fail "reflux superheated"
python3 - r3.json <<'PY' || fail "zero boil-up limit"
import json, sys
d = json.load(open(sys.argv[1]))
D = 0.09 / 0.84
assert abs(d["r_min"] - (1.3 / D - 1.0)) < 1e-9, d["r_min"]
p = d["pinch"]
assert p["kind"] == "feed" and p["section"] == "stripping" and p["x"] == 0.01, p
# on the equilibrium curve: y*(xb) from the reported relative volatility at the bottom
a = d["alpha_bottom"]; x = 0.01
assert abs(p["y"] - a * x / (1 + (a - 1) * x)) < 1e-9, (p, a)
yq = (-0.3 * 0.01 - 0.1) / (-0.3 - 1.0)          # the q-line at xb, 0.0792, below the curve
assert p["y"] > yq + 0.01, p
assert "zero boil-up" in d["limit"], d["limit"]
PY

# 4. rate: no profile with a non-zero mismatch; the two-liquid region refused in both balances
for e in "" "--energy"; do
  if "$pw" rate bw.json --pressure 1atm --stages 10 --feed-stage 3 --reflux 0.5 --zf 0.1 \
       --distillate 0.3 --json $e > out.json 2> err.txt; then
    fail "rate $e into the two-liquid region exits 0: $(head -c 300 out.json)"
  fi
  grep -q "two-liquid region" err.txt && grep -q "decanter" err.txt && grep -q "0.0184" err.txt \
    || fail "rate $e: $(cat err.txt)"
done
if "$pw" rate demo.json --pressure 1atm --stages 200 --feed-stage 100 --reflux 50 --zf 0.3 \
     --distillate 0.3 --json > out.json 2> err.txt; then
  fail "rate with unresolvable products exits 0: $(head -c 300 out.json)"
fi
grep -q "no steady state found" err.txt || fail "rate demo: $(cat err.txt)"
"$pw" rate demo.json --pressure 1atm --stages 200 --feed-stage 100 --reflux 50 --zf 0.3 \
  --distillate 0.5 --json > ok.json 2> err.txt || fail "rate demo D 0.5: $(cat err.txt)"
python3 -c 'import json; d=json.load(open("ok.json")); assert abs(d["feed_stage_mismatch"]) < 1e-8, d["feed_stage_mismatch"]' \
  || fail "rate demo D 0.5 mismatch"

# 5. targets beyond the azeotrope: either direction is named, no talk of the component order
"$pw" reflux ew.json --pressure 1atm --xd 0.99 --xb 0.95 --zf 0.97 --json > r5.json 2>/dev/null \
  || fail "reflux beyond the azeotrope"
python3 - r5.json <<'PY' || fail "direction message"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["feasible"] is False, d
r = d["reason"]
assert "xb < zf < xd" in r and "xd < zf < xb" in r and "component order" not in r, r
PY
echo "ok"
