#!/usr/bin/env bash
# CLI test of `pinchwise report` (no browser): the --json keys of the interface, provenance that
# matches the data file, numbers that agree with `pinchwise reflux`, no overwriting, the --svg and
# --csv folders, and refused arguments. Needs python3 (JSON parsing).
# Usage: bash test_report.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }
DEMO="$SRC/datasets/demo_acetone_water.csv"   # invented data (its source line says so)

"$PW" fit "$DEMO" --model nrtl --out "$TMP/fit.json" > /dev/null 2> "$TMP/err" \
    || fail "fit: $(cat "$TMP/err")"
fit_sum=$(sha256sum "$TMP/fit.json")

# 1. the interface: {"report": path, "plots": N}; quiet on a non-terminal stderr
"$PW" report "$TMP/fit.json" --out "$TMP/r.html" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 \
    --svg "$TMP/svg" --csv "$TMP/csv" --json > "$TMP/out.json" 2> "$TMP/err" \
    || fail "report exited non-zero: $(cat "$TMP/err")"
[ -s "$TMP/err" ] && fail "stderr not quiet when it is not a terminal: $(cat "$TMP/err")"
python3 - "$TMP/out.json" "$TMP/r.html" <<'PY' || fail "JSON keys"
import json, sys
o = json.load(open(sys.argv[1]))
assert set(o) == {"report", "plots"}, o
assert o["report"] == sys.argv[2] and o["plots"] == 6, o  # with the column: the enlarged view near the pinch
PY
head -c 15 "$TMP/r.html" | grep -q '<!DOCTYPE html>' || fail "the page does not start with a doctype"
for id in provenance plots parameters deviations consistency azeotropes column cautions; do
    grep -q "<section id=\"$id\"\|<aside class=\"pw-caution\" id=\"$id\"" "$TMP/r.html" || fail "section $id missing"
done
grep -qiE "\\bnan\\b|>-?inf<" "$TMP/r.html" && fail "NaN or Inf printed in the page: $(grep -oiE ".{40}\\bnan\\b.{10}" "$TMP/r.html" | head -2)"
grep -q 'SDS' "$TMP/r.html" || fail "the safety-data-sheet caution is missing"
grep -q 'licensed' "$TMP/r.html" || fail "the licensed-review caution is missing"

# 2. provenance: the SHA-256 in the page is the data file's (computed here by coreutils)
data_sha=$(sha256sum "$DEMO" | cut -d' ' -f1)
grep -q "$data_sha" "$TMP/r.html" || fail "the page does not carry the data file's SHA-256 $data_sha"

# 3. R_min and N_min agree with the reflux command (4 significant digits, the page's format)
"$PW" reflux "$TMP/fit.json" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 --json \
    > "$TMP/reflux.json" 2> /dev/null || fail "reflux failed"
python3 - "$TMP/reflux.json" "$TMP/r.html" <<'PY' || fail "page and reflux disagree"
import json, re, sys
r = json.load(open(sys.argv[1]))
page = open(sys.argv[2]).read()
m = re.search(r"Minimum reflux ratio R_min = L/D</th><td>([0-9.eE+-]+)", page)
assert m, "R_min row not found"
assert abs(float(m.group(1)) - r["r_min"]) <= 5e-4 * r["r_min"], (m.group(1), r["r_min"])
assert ("%s pinch" % r["pinch"]["kind"]) in page, r["pinch"]
assert r["pinch"]["section"] + " section" in page
m = re.search(r"Minimum stages N_min \(total reflux\)</th><td>([0-9.eE+-]+)", page)
assert m and abs(float(m.group(1)) - r["n_min"]) <= 5e-3 * r["n_min"], (m and m.group(1), r["n_min"])
for f in ("1.2", "1.3", "1.5"):
    assert '<td class="num">%s</td>' % f in page, "design row %s missing" % f
PY

# 4. --svg and --csv folders
for f in xy txy residual_y residual_T lngamma; do
    head -c 5 "$TMP/svg/$f.svg" | grep -q '<?xml' || fail "$f.svg is not a standalone SVG file"
    grep -q '<path d="M' "$TMP/svg/$f.svg" || fail "$f.svg has no path"
done
[ "$(ls "$TMP/svg" | wc -l)" -eq 6 ] || fail "expected 6 svg files: $(ls "$TMP/svg")"
for f in model_curves points column_curve column_lines; do
    [ -s "$TMP/csv/$f.csv" ] || fail "$f.csv missing"
done
head -1 "$TMP/csv/model_curves.csv" | grep -q '^x1,y1_bubble,T_bubble_K' || fail "model_curves.csv header"
[ "$(wc -l < "$TMP/csv/model_curves.csv")" -eq 162 ] || fail "model_curves.csv should hold 161 rows"
npts=$(python3 -c "import json,sys; print(len(json.load(open(sys.argv[1]))['data']['points']))" "$TMP/fit.json" 2>/dev/null || echo "")
if [ -n "$npts" ]; then
    [ "$(($(wc -l < "$TMP/csv/points.csv") - 1))" -eq "$npts" ] || fail "points.csv rows != fit file points"
fi
grep -q 'stage_steps' "$TMP/csv/column_lines.csv" || fail "no stage steps in column_lines.csv"

# 5. never overwrite without --force; never overwrite the input at all
before=$(sha256sum "$TMP/r.html")
"$PW" report "$TMP/fit.json" --out "$TMP/r.html" 2> "$TMP/err" && fail "overwrote an existing --out"
grep -q 'exists' "$TMP/err" || fail "no 'exists' message: $(cat "$TMP/err")"
[ "$(sha256sum "$TMP/r.html")" = "$before" ] || fail "the existing page changed"
"$PW" report "$TMP/fit.json" --out "$TMP/new.html" --svg "$TMP/svg" 2> "$TMP/err" \
    && fail "replaced existing svg files without --force"
[ -e "$TMP/new.html" ] && fail "a refused run left a page behind"
"$PW" report "$TMP/fit.json" --out "$TMP/r.html" --svg "$TMP/svg" --force 2> "$TMP/err" \
    || fail "--force did not replace: $(cat "$TMP/err")"
"$PW" report "$TMP/fit.json" --out "$TMP/fit.json" --force 2> "$TMP/err" && fail "wrote over the fit file"
[ "$(sha256sum "$TMP/fit.json")" = "$fit_sum" ] || fail "the fit file changed"
ls "$TMP" | grep -q 'tmp' && fail "temporary files left behind: $(ls "$TMP")"

# 6. refused arguments
"$PW" report "$TMP/fit.json" --out "$TMP/a.html" --pressure 101.325 --xd 0.95 --xb 0.02 --zf 0.3 \
    2> "$TMP/err" && fail "accepted a bare pressure"
grep -q 'kPa' "$TMP/err" || fail "bare-number message lists no units: $(cat "$TMP/err")"
"$PW" report "$TMP/fit.json" --out "$TMP/a.html" --pressure 1atm 2> "$TMP/err" \
    && fail "accepted a partial column specification"
"$PW" report "$TMP/fit.json" --out "$TMP/a.html" --pressure 1atm --xd 0.3 --xb 0.02 --zf 0.5 \
    2> "$TMP/err" && fail "accepted zf > xd"
"$PW" report "$TMP/fit.json" --out "$TMP/a.html" --pressure 1atm --xd 0.9 --xb 0.1 --zf 0.5 \
    --operating-factor 0.9 2> "$TMP/err" && fail "accepted an operating factor below 1"
"$PW" report "$TMP/nope.json" --out "$TMP/a.html" 2> "$TMP/err" && fail "accepted a missing fit file"
grep -q 'nope.json' "$TMP/err" || fail "the message does not name the file: $(cat "$TMP/err")"
[ -e "$TMP/a.html" ] && fail "a failed run left a page behind"

# 7. a split across the azeotrope: ethanol/water at 1 atm cannot reach xd = 0.95. Reference:
#    the azeotrope at 1 atm lies at x = 0.894, 78.15 C (Perry's Chemical Engineers' Handbook,
#    6th ed., p. 13-12, the table the shipped dataset reproduces). Wilson is used: an NRTL fit
#    with alpha fixed at 0.3 places it near x = 0.93 on the same data.
"$PW" fit "$SRC/datasets/ethanol_water_1atm.csv" --model wilson --out "$TMP/ew.json" > /dev/null 2>&1 \
    || fail "fit of ethanol/water failed"
"$PW" report "$TMP/ew.json" --out "$TMP/ew.html" --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.3 \
    2> "$TMP/err" || fail "report of an infeasible split failed: $(cat "$TMP/err")"
grep -q 'cannot be made by ordinary' "$TMP/ew.html" || fail "the infeasible split is not stated"
grep -q 'minimum-boiling' "$TMP/ew.html" || fail "the ethanol/water azeotrope is not listed"
python3 - "$TMP/ew.html" <<'PY' || fail "azeotrope against the handbook value"
import re, sys
page = open(sys.argv[1]).read()
sec = page[page.index('id="azeotropes"'):]
x, T, P = (float(v) for v in re.findall(r'<td class="num">([0-9.]+)</td>', sec)[:3])
assert abs(x - 0.894) < 0.01, x
assert abs(T - (78.15 + 273.15)) < 0.5, T
assert abs(P - 101.325) < 0.01, P
PY
# 8. --uncertainty: the "how sure" table, the band plot near the pinch, azeotrope intervals.
#    Cross-checks against the reflux and azeotrope commands (same draws, same seed) and the
#    handbook azeotrope of section 7; the band's plot and its numbers are checked for content.
"$PW" report "$TMP/fit.json" --out "$TMP/u.html" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 \
    --uncertainty --samples 200 --seed 7 --csv "$TMP/ucsv" --json > "$TMP/u.json" 2> "$TMP/err" \
    || fail "report --uncertainty: $(cat "$TMP/err")"
[ -s "$TMP/err" ] && fail "report --uncertainty wrote to a non-terminal stderr: $(cat "$TMP/err")"
"$PW" reflux "$TMP/fit.json" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 --uncertainty \
    --samples 200 --seed 7 --json > "$TMP/ur.json" 2> /dev/null || fail "reflux --uncertainty failed"
python3 - "$TMP/u.json" "$TMP/u.html" "$TMP/ur.json" "$TMP/ucsv/pinch_band.csv" <<'PY' || fail "uncertainty report content"
import csv, json, math, re, sys
o = json.load(open(sys.argv[1]))
assert o == {"report": sys.argv[2], "plots": 7, "uncertainty": True}, o
page = open(sys.argv[2]).read()
r = json.load(open(sys.argv[3]))["uncertainty"]
# the band plot: 40 sampled curves with path data, the best fit, the R_min line, the pinch
m = re.search(r'<svg[^>]*id="plot-pinch-band".*?</svg>', page, re.S)
assert m, "no band plot"
svg = m.group(0)
def attr(tag, name):
    m = re.search(r'\b%s="([^"]*)"' % name, tag)
    return m.group(1) if m else ""
paths = [(attr(t, "class"), attr(t, "d")) for t in re.findall(r"<path\b[^>]*>", svg)]
samples = [d for c, d in paths if "pw-sample" in c]
assert len(samples) == 40 and all(len(d) > 100 for d in samples), (len(samples), samples[:1])
for cls in ("pw-central", "pw-band-line"):
    assert any(cls in c and d.startswith("M") and len(d) > 20 for c, d in paths), cls + " missing"
assert "pw-marks" in svg and "tangent pinch x = " in svg, "pinch not marked"
labels = re.findall(r'<text[^>]*pw-axis-label[^>]*>([^<]*)<', svg)
assert len(labels) == 2 and all("/ (mol/mol)" in l for l in labels), labels
assert not re.search(r'nan|inf', svg, re.I)
# the window: pinch x +/- 0.15 inside [xb, xd]
rows = list(csv.reader(open(sys.argv[4])))
assert rows[0][:3] == ["x1", "y1_best_fit", "y1_draw_1"] and len(rows[0]) == 42, rows[0][:3]
xs = [float(row[0]) for row in rows[1:]]
pinch = float(re.search(r"tangent pinch x = ([0-9.]+)", svg).group(1))
assert abs(xs[0] - max(0.02, pinch - 0.15)) < 2e-3 and abs(xs[-1] - min(0.95, pinch + 0.15)) < 2e-3, (xs[0], xs[-1], pinch)
# the how-sure table: finite intervals around each value, equal to the reflux command's
sec = page[page.index('id="how-sure"'):]
sec = sec[:sec.index("</section>")]
for label, key in (("Minimum reflux ratio R_min", "r_min"), ("Minimum boil-up ratio", "boilup_min"),
                   ("Stages at 1.3 R_min", "stages_operating")):
    m = re.search(re.escape(label) + r'.*?</td><td class="num">([^<]+)</td><td class="num">([^<]+)</td>'
                  r'<td class="num">([^<]+)</td><td>([^<]+)</td>', sec)
    assert m, label + " row missing"
    v, lo, hi = (float(m.group(i)) for i in (1, 2, 3))
    assert all(math.isfinite(t) for t in (v, lo, hi)) and lo < v < hi, (label, v, lo, hi)
    ref = r[key]
    assert abs(lo - ref["ci95"][0]) <= 5e-4 * abs(ref["ci95"][0]), (label, lo, ref["ci95"])
    assert abs(hi - ref["ci95"][1]) <= 5e-4 * abs(ref["ci95"][1]), (label, hi, ref["ci95"])
    assert m.group(4).startswith(ref["ci95_from"]), (label, m.group(4), ref["ci95_from"])
assert "parameter sets drawn from the fit" in sec and "split can be made" in sec, "feasibility share missing"
assert "more points with x1 between" in sec, "measurement recommendation missing"
assert r["next_measurements"]["advice"].replace("'", "&#39;") in sec, "advice differs from reflux"
PY
# same seed, same page (apart from the creation time); another seed, another page
"$PW" report "$TMP/fit.json" --out "$TMP/u2.html" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 \
    --uncertainty --samples 200 --seed 7 2> /dev/null || fail "second --uncertainty report"
"$PW" report "$TMP/fit.json" --out "$TMP/u3.html" --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.3 \
    --uncertainty --samples 200 --seed 8 2> /dev/null || fail "--seed 8 report"
for f in u u2 u3; do grep -v 'Report made on (UTC)' "$TMP/$f.html" > "$TMP/$f.cmp"; done
cmp -s "$TMP/u.cmp" "$TMP/u2.cmp" || fail "the same seed gave a different page: $(diff "$TMP/u.cmp" "$TMP/u2.cmp" | head -4)"
cmp -s "$TMP/u.cmp" "$TMP/u3.cmp" && fail "a different seed gave the same page (the seed is ignored?)"
grep -q 'id="how-sure"\|plot-pinch-band' "$TMP/r.html" && fail "the page without --uncertainty changed"
"$PW" report "$TMP/fit.json" --out "$TMP/u4.html" --samples 12x 2> "$TMP/err" && fail "accepted --samples 12x"
[ -e "$TMP/u4.html" ] && fail "a refused --samples left a page behind"

# 9. azeotrope intervals (ethanol/water of section 7, no column): as the azeotrope command gives them
"$PW" report "$TMP/ew.json" --out "$TMP/ewu.html" --uncertainty --samples 200 --json > "$TMP/ewu.json" \
    2> "$TMP/err" || fail "report --uncertainty of ethanol/water: $(cat "$TMP/err")"
"$PW" azeotrope "$TMP/ew.json" --pressure 1atm --uncertainty --samples 200 --json > "$TMP/ewa.json" \
    2> /dev/null || fail "azeotrope --uncertainty failed"
python3 - "$TMP/ewu.json" "$TMP/ewu.html" "$TMP/ewa.json" <<'PY' || fail "azeotrope intervals in the page"
import json, re, sys
o = json.load(open(sys.argv[1]))
assert o["uncertainty"] is True and o["plots"] == 5, o   # no column: no band
page = open(sys.argv[2]).read()
assert 'id="how-sure"' not in page
az = json.load(open(sys.argv[3]))["azeotropes"][0]
sec = page[page.index('id="azeotropes"'):]
m = re.search(r'minimum-boiling</td><td class="num">([0-9.]+) \u2013 ([0-9.]+)</td>'
              r'<td class="num">([0-9.]+) \u2013 ([0-9.]+)</td>', sec)
assert m, "no interval cells in the azeotrope table"
x_lo, x_hi, T_lo, T_hi = (float(v) for v in m.groups())
assert abs(x_lo - az["x1_ci95"][0]) < 1e-4 and abs(x_hi - az["x1_ci95"][1]) < 1e-4, (m.groups(), az)
assert abs(T_lo - az["T_K_ci95"][0]) < 0.006 and abs(T_hi - az["T_K_ci95"][1]) < 0.006, (m.groups(), az)
# sanity check, not a coverage claim: the handbook azeotrope x = 0.894 (Perry's, 6th ed.,
# p. 13-12) lies inside the interval of this fit to the data that table reproduces
assert x_lo < 0.894 < x_hi, (x_lo, x_hi)
PY

# 10. progress: on a terminal (util-linux `script` gives one) there are progress lines; tests
#     otherwise run without a terminal, where sections 1 and 8 check that stderr stays empty.
if command -v script > /dev/null; then
    script -qec "'$PW' report '$TMP/fit.json' --out '$TMP/tty.html' --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.3 --uncertainty --samples 50 > /dev/null" \
        /dev/null > "$TMP/tty.out" 2>&1 || fail "report under script failed: $(cat "$TMP/tty.out")"
    grep -q 'pinchwise report: 50/50 parameter sets sampled' "$TMP/tty.out" \
        || fail "no sampling progress on a terminal: $(head -c 300 "$TMP/tty.out")"
    grep -q 'pinchwise report: 5/50 parameter sets sampled' "$TMP/tty.out" \
        || fail "no progress at 10 %: $(head -c 300 "$TMP/tty.out")"
    grep -q 'pinchwise report: 7/50' "$TMP/tty.out" && fail "progress not limited to tenths"
    script -qec "'$PW' fit '$DEMO' --model all --out-dir '$TMP/all' > /dev/null" /dev/null \
        > "$TMP/tty2.out" 2>&1 || fail "fit --model all under script failed"
    [ "$(grep -c 'pinchwise fit: [1-5]/5 models' "$TMP/tty2.out")" -eq 5 ] \
        || fail "fit --model all: expected one progress line per model: $(cat "$TMP/tty2.out")"
    "$PW" fit "$DEMO" --model all --out-dir "$TMP/all2" > /dev/null 2> "$TMP/err"
    grep -q '[0-9]/[0-9]* models' "$TMP/err" && fail "fit --model all printed progress to a non-terminal"
    script -qec "'$PW' azeotrope '$TMP/ew.json' --pressure 1atm --scan 50kPa:200kPa:6 > /dev/null" \
        /dev/null > "$TMP/tty3.out" 2>&1 || fail "azeotrope --scan under script failed"
    for k in 1 2 3 4 5 6; do
        grep -q "pinchwise azeotrope: $k/6 scan points" "$TMP/tty3.out" || fail "scan step $k not shown"
    done
    "$PW" azeotrope "$TMP/ew.json" --pressure 1atm --scan 50kPa:200kPa:6 --uncertainty --samples 20 \
        > /dev/null 2> "$TMP/err" || fail "azeotrope --scan --uncertainty failed"
    grep -q 'scan points\|parameter sets sampled' "$TMP/err" \
        && fail "azeotrope wrote progress to a non-terminal: $(cat "$TMP/err")"
else
    echo "NOTE: util-linux script is not installed: progress on a terminal not tested (only its absence)"
fi
# Model comparison: the siblings that `fit --model all` writes are ranked on the page; a stale
# sibling (other data) is left out with a warning; --compare names files explicitly.
mkdir -p "$TMP/rank"
"$PW" fit "$DEMO" --model all --out-dir "$TMP/rank" > /dev/null 2>&1 || fail "fit --model all"
"$PW" report "$TMP/rank/demo_acetone_water.nrtl.json" --out "$TMP/rank.html" --pressure 101.325kPa \
    --xd 0.95 --xb 0.02 --zf 0.1 > /dev/null 2> "$TMP/err" || fail "report with siblings: $(cat "$TMP/err")"
python3 - "$TMP/rank.html" <<'PY' || fail "ranking table"
import re, sys
s = open(sys.argv[1]).read()
i = s.index('id="ranking"'); j = s.index("</section>", i)
rows = re.findall(r"<tr[^>]*><td class=\"num\">(\d+)</td><td>(\w+)", s[i:j])
assert [int(r[0]) for r in rows] == [1, 2, 3, 4, 5], rows
assert sorted(r[1] for r in rows) == ["margules", "nrtl", "uniquac", "vanlaar", "wilson"], rows
PY
"$PW" fit "$SRC/datasets/ethanol_water_1atm.csv" --model wilson --out "$TMP/rank/demo_acetone_water.wilson.json" --force > /dev/null 2>&1
"$PW" report "$TMP/rank/demo_acetone_water.nrtl.json" --out "$TMP/rank2.html" > /dev/null 2> "$TMP/err" || fail "report, stale sibling"
grep -q "other data" "$TMP/err" || fail "stale sibling not reported: $(cat "$TMP/err")"
"$PW" report "$TMP/fit.json" --out "$TMP/rank3.html" --compare "$TMP/rank/demo_acetone_water.vanlaar.json" > /dev/null 2>&1 || fail "--compare"
grep -q 'id="ranking"' "$TMP/rank3.html" || fail "--compare gave no ranking table"
grep -q 'id="ranking"' "$TMP/r.html" && fail "a ranking table without other fits"
echo PASS
