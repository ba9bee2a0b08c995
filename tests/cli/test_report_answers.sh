#!/usr/bin/env bash
# The report answers first: the answers block comes before everything else, and its numbers are
# those of the command line (R_min, stages); one azeotrope table when the column runs at the
# data's pressure, two otherwise. Data: the invented demo set.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "fit"
spec="--xd 0.95 --xb 0.02 --zf 0.10"
"$pw" report demo.json --out a.html $spec --pressure 101.325kPa >/dev/null 2>&1 || fail "report"
"$pw" reflux demo.json $spec --pressure 101.325kPa --json > r.json 2>/dev/null || fail "reflux"
"$pw" report demo.json --out b.html $spec --pressure 200kPa >/dev/null 2>&1 || fail "report at 200 kPa"
python3 - <<'PY' || fail "answers block"
import json, re
html = open("a.html", encoding="utf-8").read()
r = json.load(open("r.json"))
a = html.index('<section id="answers">')
assert a < html.index('id="plots"') and a < html.index("Where these numbers come from"), "answers first"
block = html[a:html.index("</section>", a)]
for term in ["Measured data", "Model", "Azeotropes", "Split", "Minimum reflux", "Stages", "Warnings"]:
    assert "<dt>%s</dt>" % term in block, term
assert "R<sub>min</sub> = %.4g" % r["r_min"] in block, "R_min as the command line gives it"
row = [d for d in r["design"] if abs(d["factor"] - 1.3) < 1e-12][0]
assert "%.3g equilibrium stages at 1.3" % row["stages"] in block, "stages at the operating factor"
assert r["pinch"]["kind"] in block and "tangent pinch: stage counts" in block
assert "column pressure" not in block, "one set of azeotropes at the data's pressure"
assert html.count('<section id="azeotropes">') == 1
b = open("b.html", encoding="utf-8").read()
sec = b[b.index('<section id="azeotropes">'):]
sec = sec[:sec.index("</section>")]
assert "At the column pressure, 200 kPa" in sec and "At the data&#39;s condition" in sec
PY
echo ok
