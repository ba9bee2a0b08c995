#!/usr/bin/env bash
# UNIQUAC through every command: fit (r and q from the component library, held fixed),
# azeotrope against the published ethanol/water azeotrope, reflux with --uncertainty, screen,
# report, --model all, and the refusal when a component has no r or q.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"

# 1. fit: parameters named with their index pair, r and q from the library and held fixed.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model UNIQUAC --out ew.json --json > fit.json \
    2>/dev/null || fail "fit --model UNIQUAC"
python3 - <<'PY' || fail "fit JSON"
import json
d = json.load(open("fit.json"))
assert d["model"] == "uniquac" and d["converged"] is True, d
p = d["parameters"]
assert set(p) == {"du12_K", "du21_K", "r1", "q1", "r2", "q2"}, p
# ethanol: Bondi group sums (datasets/components.csv); water: Abrams & Prausnitz 1975
assert (p["r1"], p["q1"], p["r2"], p["q2"]) == (2.1055, 1.972, 0.92, 1.4), p
assert d["stderr"]["du12_K"] > 0 and d["stderr"]["du21_K"] > 0
assert d["stderr"].get("r1") is None
assert d["aad_y"] < 0.02 and d["aad_T_K"] < 1.0, d
f = json.load(open("ew.json"))
assert "r1" in f["fixed"] and "q2" in f["fixed"] and "du12_K" not in f["fixed"]
PY

# 2. azeotrope: ethanol/water at 1 atm has a minimum-boiling azeotrope near x1 = 0.89, 78.2 C
#    (CRC Handbook azeotrope table: 95.6 wt% ethanol; from memory). A screening fit to 15 points
#    is asked to land within 0.06 in x1 and 1 K.
"$pw" azeotrope ew.json --pressure 101.325kPa --json > az.json 2>/dev/null || fail "azeotrope"
python3 - <<'PY' || fail "azeotrope JSON: $(cat az.json)"
import json
a = json.load(open("az.json"))["azeotropes"]
assert len(a) == 1 and a[0]["kind"] == "minimum-boiling", a
assert abs(a[0]["x1"] - 0.894) < 0.06 and abs(a[0]["T_K"] - 351.3) < 1.0, a
PY

# 3. reflux below the azeotrope, with the uncertainty options.
"$pw" reflux ew.json --pressure 101.325kPa --xd 0.80 --xb 0.02 --zf 0.10 --uncertainty --json \
    > r.json 2>/dev/null || fail "reflux --uncertainty"
python3 - <<'PY' || fail "reflux JSON: $(head -c 400 r.json)"
import json
d = json.load(open("r.json"))
assert d["feasible"] is True and d["r_min"] > 0
lo, hi = d["r_min_ci95"]
assert lo <= d["r_min"] <= hi and d["feasible_probability"] > 0.5
PY
# ... and across the azeotrope: infeasible
"$pw" reflux ew.json --pressure 101.325kPa --xd 0.97 --xb 0.02 --zf 0.10 --json > r2.json \
    2>/dev/null
python3 -c 'import json; d=json.load(open("r2.json")); assert d["feasible"] is False' \
    || fail "reflux across the azeotrope"

# 4. screen and report.
"$pw" screen ew.json --pressure 101.325kPa --xd 0.80 --xb 0.02 --zf 0.10 --json > s.json \
    2>/dev/null || fail "screen"
python3 -c 'import json; json.load(open("s.json"))' || fail "screen JSON"
"$pw" report ew.json --out rep.html --pressure 101.325kPa --xd 0.80 --xb 0.02 --zf 0.10 --json \
    > rep.json 2>/dev/null || fail "report"
python3 -c 'import json; d=json.load(open("rep.json")); assert d["plots"] > 0' || fail "report JSON"
grep -q "du12_K" rep.html || fail "report lacks the UNIQUAC parameters"

# 5. --model all fits UNIQUAC too.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model all --out-dir all --json > all.json \
    2>/dev/null || fail "--model all"
python3 -c 'import json; d=json.load(open("all.json")); assert "uniquac" in [m["model"] for m in d["models"]]' \
    || fail "--model all without uniquac"

# 6. A component without r or q: refused, naming the component and the column.
head -1 "$src/datasets/components.csv" | cut -d, -f1-10 > c.csv
echo 'ethanol,16.8958,3795.17,230.918,ln,kPa,C,3,96,test row without r and q' >> c.csv
if "$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model uniquac --components c.csv \
    --out x.json > out.txt 2> err.txt; then
    fail "fit without r and q succeeded"
fi
grep -q "ethanol" err.txt && grep -q "has no r" err.txt || fail "message: $(cat err.txt)"
grep -q "c.csv:2: component 'ethanol'" err.txt || fail "no component file and line in: $(cat err.txt)"
[ -e x.json ] && fail "a fit file was written after the refusal"
echo "ok"
