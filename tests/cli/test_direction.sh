#!/usr/bin/env bash
# Either split direction: reflux, screen, report and --uncertainty accept xd < zf < xb (component 1
# leaves with the bottoms). A split solved with the components in one order and in the other must
# give the same R_min, N_min and stages.
# Data: (1) INVENTED noise-free 2-propanol/water-like data (two-suffix-free Margules A12 2.3,
# A21 1.1 with the library's Antoine rows; azeotrope near x = 0.63, 79.4 C), written in both
# component orders: a round trip only. (2) The shipped ethanol/water set (Perry's, see its
# source line) for ethanol recovered as the bottoms above its azeotrope.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"

python3 - "$src/datasets/components.csv" <<'PY' || fail "invented data"
import csv, math, sys
rows = {r[0]: r for r in csv.reader(open(sys.argv[1], newline="")) if r}
def antoine(name):
    r = rows[name]
    assert r[4] == "ln" and r[5] == "kPa" and r[6] == "C"
    A, B, C = map(float, r[1:4])
    return lambda t: math.exp(A - B / (t + C))
p1, p2 = antoine("2-propanol"), antoine("water")
A12, A21 = 2.3, 1.1
def bubble(x1):
    x2 = 1 - x1
    g1 = math.exp(x2 * x2 * (A12 + 2 * (A21 - A12) * x1))
    g2 = math.exp(x1 * x1 * (A21 + 2 * (A12 - A21) * x2))
    lo, hi = 0.0, 150.0
    for _ in range(200):
        t = (lo + hi) / 2
        if x1 * g1 * p1(t) + x2 * g2 * p2(t) > 101.325: hi = t
        else: lo = t
    return t, x1 * g1 * p1(t) / 101.325
xs = [0.02, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.98]
pts = [(x,) + bubble(x) for x in xs]
head = "# source: INVENTED 2-propanol/water-like round-trip data (Margules 2.3, 1.1), not measured\n# pressure: 101.325 kPa\n# sigma_T: 0.1 K\n"
with open("ab.csv", "w") as f:
    f.write("# components: 2-propanol, water\n" + head + "x1,y1,T[C]\n")
    for x, t, y in pts: f.write("%r,%r,%r\n" % (x, y, t))
with open("ba.csv", "w") as f:
    f.write("# components: water, 2-propanol\n" + head + "x1,y1,T[C]\n")
    for x, t, y in reversed(pts): f.write("%r,%r,%r\n" % (1 - x, 1 - y, t))
PY
"$pw" fit ab.csv --model margules --out ab.json --json > fab.json 2>/dev/null || fail "fit ab"
"$pw" fit ba.csv --model margules --out ba.json --json > fba.json 2>/dev/null || fail "fit ba"

# The issue's case: 2-propanol (component 1) recovered as the bottoms above the azeotrope.
"$pw" reflux ab.json --pressure 1atm --xd 0.72 --zf 0.85 --xb 0.99 --json > down.json 2>/dev/null || fail "reflux xd < zf < xb refused"
"$pw" reflux ba.json --pressure 1atm --xd 0.28 --zf 0.15 --xb 0.01 --json > up.json 2>/dev/null || fail "reflux, swapped components"
python3 - <<'PY' || fail "the same column both ways"
import json
d, u = json.load(open("down.json")), json.load(open("up.json"))
assert d["feasible"] and u["feasible"], (d["reason"], u["reason"])
close = lambda a, b, r=1e-4: abs(a - b) <= r * abs(b) + 1e-9
assert close(d["r_min"], u["r_min"]), (d["r_min"], u["r_min"])
assert close(d["n_min"], u["n_min"]), (d["n_min"], u["n_min"])
assert d["pinch"]["kind"] == u["pinch"]["kind"] and d["pinch"]["section"] == u["pinch"]["section"]
assert abs(d["pinch"]["x"] - (1 - u["pinch"]["x"])) < 1e-4, (d["pinch"], u["pinch"])
assert d["pinch"]["y"] < d["pinch"]["x"]  # 2-propanol is the heavier one above the azeotrope
for a, b in zip(d["design"], u["design"]):
    assert close(a["stages"], b["stages"], 1e-3) and a["feed_stage"] == b["feed_stage"], (a, b)
# JSON keys unchanged and still fractions of component 1
assert d["spec"]["xd"] == 0.72 and d["spec"]["xb"] == 0.99
assert d["T_top_K"] < d["T_bottom_K"]
PY

# The same split written the usual way round is infeasible (2-propanol cannot go overhead there).
"$pw" reflux ab.json --pressure 1atm --xd 0.99 --zf 0.85 --xb 0.72 --json > wrong.json 2>/dev/null || fail "wrong-way exit status"
python3 -c 'import json; d=json.load(open("wrong.json")); assert d["feasible"] is False and d["reason"], d' || fail "wrong way feasible"
# The feed outside the products: refused with both orderings named.
"$pw" reflux ab.json --pressure 1atm --xd 0.72 --zf 0.5 --xb 0.99 2> e.txt >/dev/null && fail "zf outside accepted"
grep -q "xd < zf < xb" e.txt || fail "message: $(cat e.txt)"

# screen, both ways; and with --q.
"$pw" screen ab.json --pressure 1atm --xd 0.72 --zf 0.85 --xb 0.99 --json > sd.json 2>/dev/null || fail "screen down"
"$pw" screen ba.json --pressure 1atm --xd 0.28 --zf 0.15 --xb 0.01 --json > su.json 2>/dev/null || fail "screen up"
"$pw" screen ab.json --pressure 1atm --xd 0.72 --zf 0.85 --xb 0.99 --q 0.5 --json > sq.json 2>/dev/null || fail "screen --q"
python3 - <<'PY' || fail "screen both ways"
import json
d, u, q = (json.load(open(f)) for f in ("sd.json", "su.json", "sq.json"))
assert d["verdict"] == u["verdict"] != "infeasible", (d["verdict"], d["reasons"])
assert abs(d["r_min"] - u["r_min"]) <= 1e-4 * u["r_min"], (d["r_min"], u["r_min"])
assert abs(d["r_min_underwood_mean_alpha"] - u["r_min_underwood_mean_alpha"]) <= 1e-4 * u["r_min_underwood_mean_alpha"]
assert d["q"] == 1 and q["q"] == 0.5 and q["r_min"] != d["r_min"]
PY

# report with the targets either way round, and --uncertainty on reflux.
"$pw" report ab.json --out rep.html --pressure 1atm --xd 0.72 --zf 0.85 --xb 0.99 --json > rep.json 2>/dev/null || fail "report down"
grep -q "<svg" rep.html || fail "report has no plot"
python3 - <<'PY' || fail "report answers"
h = open("rep.html", encoding="utf-8").read()
s, p = h.find('id="answers"'), h.find('id="plots"')
assert 0 < s < p, (s, p)
block = h[s:p]
for words in ("Minimum reflux", "which goes to the bottoms", "Split", "Stages", "Warnings"):
    assert words in block, words
import re
assert not re.search(r"\bnan\b", block, re.I), "nan in the answers"
PY
"$pw" reflux ab.json --pressure 1atm --xd 0.72 --zf 0.85 --xb 0.99 --uncertainty --samples 40 --json > ud.json 2>/dev/null || fail "uncertainty down"
python3 - <<'PY' || fail "uncertainty keys"
import json
d = json.load(open("ud.json"))
lo, hi = d["r_min_ci95"]
assert lo <= d["r_min"] <= hi, (lo, d["r_min"], hi)
assert 0 <= d["feasible_probability"] <= 1
PY

# Published data: ethanol recovered as the bottoms above its azeotrope (x1 about 0.894 at 1 atm).
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --out ew.json >/dev/null 2>&1 || fail "ethanol fit"
"$pw" reflux ew.json --pressure 1atm --xd 0.9 --zf 0.95 --xb 0.995 --json > ew.json.out 2>/dev/null || fail "ethanol bottoms"
python3 - <<'PY' || fail "ethanol bottoms keys"
import json
d = json.load(open("ew.json.out"))
assert d["feasible"] and d["r_min"] > 1 and d["n_min"] > 10, d
assert 0.9 <= d["pinch"]["x"] <= 0.995
PY
echo ok
