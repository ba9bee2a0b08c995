#!/usr/bin/env bash
# CLI test of `pinchwise check`: the JSON keys of the interface (docs/consistency.md), the
# data types that do not allow the tests, and error messages. Needs python3 (JSON parsing).
# Usage: bash test_check.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }

# Smith, Van Ness & Abbott, 7th ed. (2005), ch. 12: methyl ethyl ketone(1)/toluene(2) at 50 C,
# presented there as consistent (values from memory). The component file reproduces SVNA's
# measured pure pressures, 36.09 and 12.30 kPa at 50 C: B and C from SVNA Table B.2 (from
# memory), A = ln(P_end/kPa) + B/(50 + C).
cat > "$TMP/ends.csv" <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source
mek-svna-ends,14.149267149184304,2838.24,218.690,ln,kPa,C,-8,103,"B, C: SVNA 7th ed. Table B.2 (from memory); A matched to the measured P1 at 50 C"
toluene-svna-ends,13.932149472560528,3056.96,217.625,ln,kPa,C,13,136,"B, C: SVNA 7th ed. Table B.2 (from memory); A matched to the measured P2 at 50 C"
CSV
cat > "$TMP/svna.csv" <<'CSV'
# components: mek-svna-ends, toluene-svna-ends
# temperature: 50 C
# source: SVNA 7th ed. ch. 12, MEK/toluene at 50 C (from memory)
x1,y1,P[kPa]
0,0,12.30
0.0895,0.2716,15.51
0.1981,0.4565,18.61
0.3193,0.5934,21.63
0.4232,0.6815,24.01
0.5119,0.7440,25.92
0.6096,0.8050,27.96
0.7135,0.8639,30.12
0.7934,0.9048,31.75
0.9102,0.9590,34.15
1,1,36.09
CSV
sum_before=$(sha256sum "$TMP/svna.csv")
"$PW" check "$TMP/svna.csv" --components "$TMP/ends.csv" --json > "$TMP/out.json" 2> "$TMP/err.txt" \
    || fail "check exited $? on the SVNA set: $(cat "$TMP/err.txt")"
[ "$sum_before" = "$(sha256sum "$TMP/svna.csv")" ] || fail "the input file was modified"
python3 - "$TMP/out.json" <<'PY' || fail "JSON of the SVNA set"
import json, sys
o = json.load(open(sys.argv[1]))           # exactly one object: json.load fails on trailing text
assert isinstance(o, dict)
assert isinstance(o["consistent"], bool) and o["consistent"] is True, o.get("reasons")
names = set()
for t in o["tests"]:
    for k in ("name", "value", "limit", "pass", "source", "ran", "meaning", "criterion", "primary"):
        assert k in t, (t.get("name"), k)
    assert isinstance(t["pass"], bool) and t["ran"] is True
    assert isinstance(t["value"], (int, float)) and isinstance(t["limit"], (int, float))
    assert isinstance(t["source"], str) and t["source"]
    names.add(t["name"])
assert {"rk_area", "legendre_point", "pure_endpoints"} <= names, names
nr = {t["name"]: t for t in o["not_run"]}
assert "herington" in nr and "isothermal" in nr["herington"]["reason"]
pt = [t for t in o["tests"] if t["name"] == "legendre_point"][0]
assert pt["pass"] and pt["value"] < 0.01 and pt["limit"] == 0.01
assert len(o["points"]) == 9
for p in o["points"]:
    for k in ("line", "x1", "y1", "y1_calc", "dy", "dln_gamma_ratio", "dP_rel", "flagged"):
        assert k in p, k
assert isinstance(o["flagged"], list)
q = o["evidence_score"]
for k in ("score", "area_part", "point_part", "slope_part", "dilution_part", "pure_part", "note"):
    assert k in q, k
assert 0.0 < q["score"] <= 1.0
assert o["legendre_fit"]["terms"] in (3, 4, 5)
assert o["kind"] == "isothermal" and o["components"] == ["mek-svna-ends", "toluene-svna-ends"]
assert o["reasons"] and o["cautions"]
PY

# P-x data (no y): only the endpoint test can run; the verdict is not "consistent"
grep -v '^#\|^x1' "$TMP/svna.csv" | awk -F, 'BEGIN{print "# components: mek-svna-ends, toluene-svna-ends"; print "# temperature: 50 C"; print "x1,P[kPa]"} {print $1","$3}' > "$TMP/px.csv"
"$PW" check "$TMP/px.csv" --components "$TMP/ends.csv" --json > "$TMP/px.json" 2> "$TMP/err.txt" \
    || fail "check exited $? on P-x data: $(cat "$TMP/err.txt")"
python3 - "$TMP/px.json" <<'PY' || fail "JSON of the P-x set"
import json, sys
o = json.load(open(sys.argv[1]))
assert o["consistent"] is False
assert [t["name"] for t in o["tests"]] == ["pure_endpoints"], o["tests"]
nr = {t["name"]: t["reason"] for t in o["not_run"]}
assert "no y column" in nr["legendre_point"] and "no y column" in nr["rk_area"], nr
PY

# Human-readable output: the verdict and the caution
"$PW" check "$TMP/svna.csv" --components "$TMP/ends.csv" > "$TMP/out.txt" || fail "text output exit $?"
grep -q "CONSISTENT" "$TMP/out.txt" || fail "no verdict in the text output"
grep -q "Caution" "$TMP/out.txt" || fail "no caution in the text output"

# Unknown component: non-zero exit, one line naming the data file and close names
sed 's/toluene-svna-ends$/toluene-svna-endz/' "$TMP/svna.csv" > "$TMP/typo.csv"
if "$PW" check "$TMP/typo.csv" --components "$TMP/ends.csv" --json > "$TMP/typo.out" 2> "$TMP/typo.err"; then
    fail "unknown component accepted"
fi
[ ! -s "$TMP/typo.out" ] || fail "stdout not empty on failure"
grep -q "typo.csv" "$TMP/typo.err" || fail "error does not name the file: $(cat "$TMP/typo.err")"
grep -q "toluene-svna-ends" "$TMP/typo.err" || fail "no suggestion: $(cat "$TMP/typo.err")"
[ "$(wc -l < "$TMP/typo.err")" -eq 1 ] || fail "error is not one line"

# Missing file and bad usage
if "$PW" check "$TMP/none.csv" 2> "$TMP/none.err"; then fail "missing file accepted"; fi
grep -q "none.csv" "$TMP/none.err" || fail "missing-file error does not name the file"
if "$PW" check 2> /dev/null; then fail "no argument accepted"; fi
if "$PW" check "$TMP/svna.csv" --frobnicate 2> /dev/null; then fail "unknown option accepted"; fi
echo "ok"
