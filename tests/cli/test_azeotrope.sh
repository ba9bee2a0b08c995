#!/usr/bin/env bash
# CLI test of `pinchwise azeotrope` and `pinchwise screen`: the JSON keys of the interface
# (CONTRACT: azeotropes[].x1, T_K, P_kPa, kind), published azeotrope values, verdicts, and
# error messages. Needs python3 (JSON parsing).
# Usage: bash test_azeotrope.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }

# Fit NRTL to the shipped ethanol/water (Perry's, 1 atm) and methanol/water sets.
for s in ethanol_water_1atm methanol_water_1atm; do
    "$PW" fit "$SRC/datasets/$s.csv" --model nrtl --out "$TMP/$s.json" --json > /dev/null 2> "$TMP/err.txt" \
        || fail "fit of $s failed: $(cat "$TMP/err.txt")"
done

# Ethanol/water at 101.325 kPa: one minimum-boiling azeotrope. Handbook value 89.4 mol%, 78.2 C
# (METHODS 5.5 [S]); the tolerance (0.05 in x1, 0.5 K) allows for a model fitted to one data set.
"$PW" azeotrope "$TMP/ethanol_water_1atm.json" --pressure 101.325kPa --json > "$TMP/ew.json" 2> "$TMP/err.txt" \
    || fail "azeotrope exited $?: $(cat "$TMP/err.txt")"
python3 - "$TMP/ew.json" <<'PY' || fail "ethanol/water azeotrope JSON"
import json, sys
d = json.load(open(sys.argv[1]))
a = d["azeotropes"]
assert len(a) == 1, a
z = a[0]
assert set(["x1", "T_K", "P_kPa", "kind"]) <= set(z), z
assert z["kind"] == "minimum-boiling", z
assert abs(z["x1"] - 0.894) < 0.05, z
assert abs(z["T_K"] - (78.2 + 273.15)) < 0.5, z
assert abs(z["P_kPa"] - 101.325) < 1e-6, z
PY

# Scan: Wrewsky's rule (from memory; water has the larger heat of vaporisation) - lowering P
# raises the ethanol content of the azeotrope.
"$PW" azeotrope "$TMP/ethanol_water_1atm.json" --pressure 1atm --scan 20kPa:300kPa:5 --json \
    > "$TMP/scan.json" 2> /dev/null || fail "scan exited $?"
python3 - "$TMP/scan.json" <<'PY' || fail "scan JSON"
import json, sys
d = json.load(open(sys.argv[1]))
pts = d["scan"]["points"]
assert len(pts) == 5
xs = [p["azeotropes"][0]["x1"] for p in pts]
assert all(a > b for a, b in zip(xs, xs[1:])), xs
assert abs(pts[0]["P_kPa"] - 20) < 1e-9 and abs(pts[-1]["P_kPa"] - 300) < 1e-9
assert d["scan"]["x1_shift"] > 0
PY

# Methanol/water has no azeotrope at 1 atm (no azeotrope is listed for it in the handbook
# tables of METHODS 5.5/7.4; from memory): the list is empty.
"$PW" azeotrope "$TMP/methanol_water_1atm.json" --pressure 1atm --json > "$TMP/mw.json" 2> /dev/null \
    || fail "azeotrope on methanol/water exited $?"
python3 -c 'import json,sys; d=json.load(open(sys.argv[1])); assert d["azeotropes"] == [], d' "$TMP/mw.json" \
    || fail "methanol/water should have no azeotrope"

# Readable output names the kind and carries the caution.
"$PW" azeotrope "$TMP/ethanol_water_1atm.json" --pressure 1atm > "$TMP/txt" 2> /dev/null || fail "text exit"
grep -q "minimum-boiling" "$TMP/txt" || fail "text lacks the kind"
grep -q "Caution" "$TMP/txt" || fail "text lacks the caution"

# Screen: a split across the azeotrope is infeasible; methanol/water 0.95/0.02 is feasible.
"$PW" screen "$TMP/ethanol_water_1atm.json" --pressure 1atm --xd 0.95 --xb 0.02 --json > "$TMP/s1.json" 2> /dev/null \
    || fail "screen exited $?"
python3 - "$TMP/s1.json" <<'PY' || fail "screen infeasible JSON"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["verdict"] == "infeasible", d["verdict"]
assert any(r["key"] == "azeotrope-barrier" for r in d["reasons"]), d["reasons"]
assert d["thresholds"]["alpha_difficult"]["origin"] == "common practice"
assert d["r_min"] is None
PY
"$PW" screen "$TMP/methanol_water_1atm.json" --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.3 --json > "$TMP/s2.json" 2> /dev/null \
    || fail "screen exited $?"
python3 - "$TMP/s2.json" <<'PY' || fail "screen feasible JSON"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["verdict"] == "feasible", d
assert d["r_min"] > 0 and d["n_min"] > 1, d
assert d["azeotropes"] == []
PY

# Errors: bare number, both modes, missing mode, bad --samples; stdout stays empty.
expect_fail() {
    "$@" > "$TMP/o" 2> "$TMP/e" && fail "should fail: $*"
    [ -s "$TMP/o" ] && fail "stdout not empty on failure: $*"
    [ "$(wc -l < "$TMP/e")" -ge 1 ] || fail "no message: $*"
    return 0
}
F="$TMP/ethanol_water_1atm.json"
expect_fail "$PW" azeotrope "$F" --pressure 101.325
grep -q "kPa" "$TMP/e" || fail "the bare-number message should list the units"
expect_fail "$PW" azeotrope "$F" --pressure 1atm --temperature 50C
expect_fail "$PW" azeotrope --pressure 1atm  # no fit file (without a condition the fit's own is used)
expect_fail "$PW" azeotrope "$F" --pressure 1atm --samples many
grep -q "samples" "$TMP/e" || fail "a bad --samples value should be named"
expect_fail "$PW" azeotrope "$F" --pressure 1atm --scan 10kPa  # no TO
expect_fail "$PW" azeotrope "$TMP/missing.json" --pressure 1atm
expect_fail "$PW" screen "$F" --pressure 1atm --xd 0.5 --xb 0.5
expect_fail "$PW" screen "$F" --pressure 1atm --xd 0.9 --xb 0.1 --samples
echo "ok"
