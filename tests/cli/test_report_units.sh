#!/usr/bin/env bash
# CLI test of `pinchwise report --show-in`: the page's temperatures and pressures in the units
# chosen, the same quantities as `azeotrope --json` gives in K and Pa converted by the unit
# definitions (0 degC = 273.15 K, t/degF = 1.8 t/degC + 32, 1 bar = 100 kPa: NIST SP 811 (2008)
# appendix B.8), no K left on the axis of the T-x-y plot, the refusals, and the JSON and CSV
# files unchanged. The shipped ethanol/water set at 1 atm is the data.
# Usage: bash test_report_units.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }

"$PW" fit "$SRC/datasets/ethanol_water_1atm.csv" --model nrtl --out "$TMP/ew.json" > /dev/null \
    2> "$TMP/err" || fail "fit: $(cat "$TMP/err")"
"$PW" azeotrope "$TMP/ew.json" --pressure 1atm --json > "$TMP/az.json" 2> /dev/null \
    || fail "azeotrope failed"
for u in K C,bar F,psi; do
    "$PW" report "$TMP/ew.json" --out "$TMP/r_$u.html" --show-in "$u" --csv "$TMP/csv_$u" --json \
        > "$TMP/r_$u.json" 2> "$TMP/err" || fail "report --show-in $u: $(cat "$TMP/err")"
done
python3 - "$TMP" <<'PY' || fail "display units in the page"
import json, re, sys
tmp = sys.argv[1]
az = json.load(open(tmp + "/az.json"))
a = az["azeotropes"][0] if "azeotropes" in az else az["results"][0]["azeotropes"][0]
T_K = a["T_K"]
def page(u):
    return open("%s/r_%s.html" % (tmp, u), encoding="utf-8").read()
def txy_axis(p):
    s = p[p.index('id="plot-txy"'):]
    s = s[:s.index("</svg>")]
    return re.findall(r'class="pw-axis-label pw-axis-y">([^<]*)<', s)[0]
# kelvin (the default): the answers give K and degC
k = page("K")
assert "%.2f K (%.2f \u00b0C)" % (T_K, T_K - 273.15) in k, "kelvin page"
assert txy_axis(k) == "T / K", txy_axis(k)
# degC and bar
c = page("C,bar")
assert "%.2f \u00b0C" % (T_K - 273.15) in c, "azeotrope in degC"
assert txy_axis(c) == "T / \u00b0C", txy_axis(c)
assert "1.013 bar" in c and "101.3 kPa" not in c, "the data's pressure in bar"
assert "<th>T / \u00b0C</th><th>P / bar</th>" in c, "azeotrope table headings"
# degF and psi
f = page("F,psi")
assert "%.2f \u00b0F" % (1.8 * (T_K - 273.15) + 32.0) in f, "azeotrope in degF"
assert txy_axis(f) == "T / \u00b0F", txy_axis(f)
assert "14.7 psia" in f, "1 atm in psi"
# the --json output and the CSV files do not change with the display units
assert json.load(open(tmp + "/r_K.json"))["plots"] == json.load(open(tmp + "/r_F,psi.json"))["plots"]
for name in ("model_curves.csv", "points.csv"):
    assert open("%s/csv_K/%s" % (tmp, name)).read() == open("%s/csv_C,bar/%s" % (tmp, name)).read(), name
PY
# refusals: an unknown unit, two temperature units; nothing written
for bad in "C,furlong" "C,K" "" ","; do
    "$PW" report "$TMP/ew.json" --out "$TMP/bad.html" --show-in "$bad" > /dev/null 2> "$TMP/err" \
        && fail "accepted --show-in '$bad'"
    [ -e "$TMP/bad.html" ] && fail "a refused --show-in '$bad' left a page"
    grep -q "display units" "$TMP/err" || fail "--show-in '$bad': unclear message: $(cat "$TMP/err")"
done
grep -q "furlong" <("$PW" report "$TMP/ew.json" --out "$TMP/bad.html" --show-in C,furlong 2>&1) \
    || fail "the message does not name the unknown unit"
"$PW" report --help | grep -q -- "--show-in" || fail "--show-in missing from --help"
echo "PASS"
