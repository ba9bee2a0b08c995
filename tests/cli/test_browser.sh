#!/usr/bin/env bash
# Browser test of `pinchwise report`: fits the invented demo dataset, writes the report, opens it
# in headless Chromium and checks the console (no messages), the rendered plots (curves with path
# data, axis labels with units), that nothing outside the page is referenced, and saves a
# screenshot under tests/artifacts/. Skips (exit 77) only when chromium is not installed.
# Needs python3 (standard library only). Usage: bash test_browser.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
CHROMIUM=$(command -v chromium || command -v chromium-browser || true)
if [ -z "$CHROMIUM" ]; then
    echo "SKIP: chromium is not installed (apt-get install chromium); the report was not opened in a browser"
    exit 77
fi
command -v python3 > /dev/null || { echo "FAIL: python3 is needed for the DOM checks" >&2; exit 1; }
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }
ART="$SRC/tests/artifacts"
mkdir -p "$ART"

# Invented data (datasets/demo_acetone_water.csv says so in its source line).
"$PW" fit "$SRC/datasets/demo_acetone_water.csv" --model nrtl --out "$TMP/fit.json" --json \
    > "$TMP/fit.out" 2> "$TMP/fit.err" || fail "fit failed: $(cat "$TMP/fit.err")"

# Isobaric data with a column: x-y construction, T-x-y, two residual plots, ln gamma.
"$PW" report "$TMP/fit.json" --out "$TMP/report.html" --pressure 1atm --xd 0.95 --xb 0.02 \
    --zf 0.3 --json > "$TMP/rep.json" 2> "$TMP/rep.err" || fail "report failed: $(cat "$TMP/rep.err")"
python3 - "$TMP/rep.json" "$TMP/report.html" <<'PY' || exit 1
import json, sys
o = json.load(open(sys.argv[1]))
assert o == {"report": sys.argv[2], "plots": 5}, o
PY
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report.html" "$ART/report_isobaric.png" \
    plot-xy plot-txy plot-residual-y plot-residual-t plot-lngamma || exit 1

# With --uncertainty: the band of sampled equilibrium curves near the pinch as a sixth plot.
"$PW" report "$TMP/fit.json" --out "$TMP/report_unc.html" --pressure 1atm --xd 0.95 --xb 0.02 \
    --zf 0.3 --uncertainty --samples 100 --json > "$TMP/repu.json" 2> "$TMP/repu.err" \
    || fail "report --uncertainty failed: $(cat "$TMP/repu.err")"
python3 - "$TMP/repu.json" "$TMP/report_unc.html" <<'PY' || exit 1
import json, sys
o = json.load(open(sys.argv[1]))
assert o == {"report": sys.argv[2], "plots": 6, "uncertainty": True}, o
PY
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report_unc.html" \
    "$ART/report_uncertainty.png" plot-xy plot-txy plot-residual-y plot-residual-t plot-lngamma \
    plot-pinch-band || exit 1

# Isothermal P-x-y data (SVNA MEK/toluene set shipped in datasets/), no column: P-x-y plot.
"$PW" fit "$SRC/datasets/mek_toluene_50C_pxy.csv" --model margules --out "$TMP/fit2.json" \
    > /dev/null 2> "$TMP/fit2.err" || fail "fit of the P-x-y set failed: $(cat "$TMP/fit2.err")"
"$PW" report "$TMP/fit2.json" --out "$TMP/report2.html" --json > "$TMP/rep2.json" 2> "$TMP/rep2.err" \
    || fail "report of the P-x-y fit failed: $(cat "$TMP/rep2.err")"
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report2.html" "$ART/report_isothermal.png" \
    plot-xy plot-pxy plot-residual-y plot-residual-p plot-lngamma || exit 1
echo "PASS"
