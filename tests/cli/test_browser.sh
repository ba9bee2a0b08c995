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

# Isobaric data with a column and two other models of the same data (--compare): x-y
# construction, its enlarged view near the pinch, T-x-y, every model on one plot, two residual
# plots, ln gamma. The browser check also measures every text element against its plot and
# checks that the pinch marker is drawn above the data markers.
for m in wilson margules; do
    "$PW" fit "$SRC/datasets/demo_acetone_water.csv" --model $m --out "$TMP/fit.$m.json" \
        > /dev/null 2> "$TMP/fit.err" || fail "fit $m failed: $(cat "$TMP/fit.err")"
done
"$PW" report "$TMP/fit.json" --out "$TMP/report.html" --pressure 1atm --xd 0.95 --xb 0.02 \
    --zf 0.3 --compare "$TMP/fit.wilson.json" --compare "$TMP/fit.margules.json" --json \
    > "$TMP/rep.json" 2> "$TMP/rep.err" || fail "report failed: $(cat "$TMP/rep.err")"
python3 - "$TMP/rep.json" "$TMP/report.html" <<'PY' || exit 1
import json, sys
o = json.load(open(sys.argv[1]))
assert o == {"report": sys.argv[2], "plots": 7}, o
page = open(sys.argv[2]).read()
models = page[page.index('id="plot-models"'):]
models = models[:models.index("</svg>")]
assert models.count("pw-model-bubble") == 3 and models.count("pw-model-dew") == 3, "three models"
PY
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report.html" "$ART/report_isobaric.png" \
    plot-xy plot-xy-pinch plot-txy plot-models plot-residual-y plot-residual-t plot-lngamma || exit 1

# Partly miscible liquids (the shipped 1-butanol/water set at 1 atm) with targets across the
# heterogeneous azeotrope, shown in degrees Celsius and bar: the two-liquid region and the
# layers on the T-x-y plot, the decanter scheme's two staircases on the x-y plot.
"$PW" fit "$SRC/datasets/butanol_water_1atm.csv" --model nrtl --out "$TMP/bw.json" > /dev/null \
    2> "$TMP/fit.err" || fail "fit of butanol/water failed: $(cat "$TMP/fit.err")"
"$PW" report "$TMP/bw.json" --out "$TMP/report_bw.html" --pressure 1atm --xd 0.001 --xb 0.995 \
    --zf 0.2 --show-in C,bar > /dev/null 2> "$TMP/rep.err" \
    || fail "report of butanol/water failed: $(cat "$TMP/rep.err")"
python3 - "$TMP/report_bw.html" <<'PY' || exit 1
import re, sys
page = open(sys.argv[1]).read()
def plot(pid):
    s = page[page.index('id="%s"' % pid):]
    return s[:s.index("</svg>")]
xy, txy = plot("plot-xy"), plot("plot-txy")
assert xy.count("pw-decanter-steps") == 2, "both stripping columns' staircases"
assert "pw-two-liquid" in xy, "the two-liquid region on the x-y plot"
assert txy.count("pw-binodal") == 2 and "pw-layers" in txy, "binodal and layers on T-x-y"
assert "T / \u00b0C" in txy, "temperature axis in degrees Celsius"
assert 'id="decanter"' in page and "Decanter scheme" in page
assert "column at 1.013 bar" in page
# each decanter column enlarged: only its own staircase, inside the window the library chose
for k in "ab":
    z = plot("plot-xy-decanter-" + k)
    assert z.count("pw-decanter-steps") == 1, "one staircase in the enlarged view of column " + k
assert "Column B (lean layer), enlarged" in page
PY
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report_bw.html" \
    "$ART/report_heterogeneous.png" plot-xy plot-xy-decanter-a plot-xy-decanter-b plot-txy \
    plot-residual-y plot-residual-t plot-lngamma \
    || exit 1

# With --uncertainty: the band of sampled equilibrium curves near the pinch as one more plot.
"$PW" report "$TMP/fit.json" --out "$TMP/report_unc.html" --pressure 1atm --xd 0.95 --xb 0.02 \
    --zf 0.3 --uncertainty --samples 100 --json > "$TMP/repu.json" 2> "$TMP/repu.err" \
    || fail "report --uncertainty failed: $(cat "$TMP/repu.err")"
python3 - "$TMP/repu.json" "$TMP/report_unc.html" <<'PY' || exit 1
import json, sys
o = json.load(open(sys.argv[1]))
assert o == {"report": sys.argv[2], "plots": 7, "uncertainty": True}, o
PY
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report_unc.html" \
    "$ART/report_uncertainty.png" plot-xy plot-xy-pinch plot-txy plot-residual-y plot-residual-t \
    plot-lngamma plot-pinch-band || exit 1

# Isothermal P-x-y data (SVNA MEK/toluene set shipped in datasets/), no column: P-x-y plot.
"$PW" fit "$SRC/datasets/mek_toluene_50C_pxy.csv" --model margules --out "$TMP/fit2.json" \
    > /dev/null 2> "$TMP/fit2.err" || fail "fit of the P-x-y set failed: $(cat "$TMP/fit2.err")"
"$PW" report "$TMP/fit2.json" --out "$TMP/report2.html" --json > "$TMP/rep2.json" 2> "$TMP/rep2.err" \
    || fail "report of the P-x-y fit failed: $(cat "$TMP/rep2.err")"
python3 "$SRC/tests/cli/browser_check.py" "$CHROMIUM" "$TMP/report2.html" "$ART/report_isothermal.png" \
    plot-xy plot-pxy plot-residual-y plot-residual-p plot-lngamma || exit 1
echo "PASS"
