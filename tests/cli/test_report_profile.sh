#!/usr/bin/env bash
# The report's column section carries the stage profile at the operating factor.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "demo fit"
"$pw" report demo.json --out r.html --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 >/dev/null 2>&1 || fail "report"
"$pw" reflux demo.json --pressure 1atm --xd 0.95 --xb 0.02 --zf 0.10 --factors 1.3 --json > d.json 2>/dev/null || fail "reflux"
python3 - <<'PY' || fail "profile table"
import json, re, math
html = open("r.html", encoding="utf-8").read()
m = re.search(r"<h3>Stage profile at ([0-9.]+) R_min.*?</table>", html, re.S)
assert m, "no stage profile table"
rows = re.findall(r"<tr><td class=\"num\">(\d+)</td>", m.group(0))
d = json.load(open("d.json"))
assert float(m.group(1)) == 1.3   # the report's default operating factor (--operating-factor)
assert len(rows) == len(d["design"][0]["profile"]), (len(rows), len(d["design"][0]["profile"]))
assert rows == [str(i) for i in range(1, len(rows) + 1)] and len(rows) >= 3
assert "partial reboiler" in m.group(0) and "feed" in m.group(0)
PY
echo "report profile test passed"
