#!/usr/bin/env bash
# pinchwise study: the whole study in one command gives the same numbers as the single commands
# (fit, check, azeotrope, reflux, report) run by hand. Data: the shipped ethanol/water set
# (Perry's, see its source line).
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
D="$src/datasets/ethanol_water_1atm.csv"
"$pw" study "$D" --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --out-dir s --json > s.json 2>/dev/null || fail "study"
python3 - <<'PY' || fail "study keys"
import json, os
d = json.load(open("s.json"))
assert d["consistent"] in (True, False)  # the verdict itself is check's (compared below)
ms = d["models"]
assert [m["model"] for m in ms] == ["margules", "vanlaar", "wilson", "nrtl", "uniquac"], ms
chosen = [m for m in ms if m["chosen"]]
assert len(chosen) == 1 and chosen[0]["model"] == d["chosen_model"]
ok = [m for m in ms if m["fitted"] and m["converged"] and not m["liquid_split"]]
assert chosen[0]["aicc"] == min(m["aicc"] for m in ok)
assert os.path.exists(d["report"]) and d["report"].endswith(".report.html")
r = d["reflux"]
for k in ("feasible", "reason", "r_min", "pinch", "n_min", "design"):
    assert k in r, k
assert len(d["azeotropes_at_data_condition"]) == 1
open("chosen.txt", "w").write(chosen[0]["fit_file"])
PY
fit=$(cat chosen.txt)
"$pw" reflux "$fit" --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --json > r.json 2>/dev/null || fail "reflux on the chosen fit"
"$pw" azeotrope "$fit" --json > a.json 2>/dev/null || fail "azeotrope on the chosen fit"
"$pw" check "$D" --json > c.json 2>/dev/null || fail "check"
python3 - <<'PY' || fail "study differs from the single commands"
import json
d, r, a, c = (json.load(open(f)) for f in ("s.json", "r.json", "a.json", "c.json"))
assert d["reflux"]["r_min"] == r["r_min"] and d["reflux"]["n_min"] == r["n_min"]
assert d["reflux"]["design"] == r["design"]
assert [z["x1"] for z in d["azeotropes_at_data_condition"]] == [z["x1"] for z in a["azeotropes"]]
assert d["consistent"] == c["consistent"]
PY
# the text's stages line lists the design rows of the same run (1.2, 1.3, 1.5 R_min by default)
"$pw" study "$D" --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --out-dir st > st.txt 2>/dev/null || fail "study text"
python3 - <<'PY' || fail "study text without the design rows: $(grep stages st.txt)"
import json, re
r = json.load(open("r.json"))
line = [l for l in open("st.txt") if l.strip().startswith("stages")][0]
got = [(float(f), float(n)) for n, f in re.findall(r"([0-9.]+) at ([0-9.]+) R_min", line)]
want = [(row["factor"], round(row["stages"], 3)) for row in r["design"]]
assert len(got) == len(want) == 3, (line, want)
assert all(abs(g[0] - w[0]) < 1e-9 and abs(g[1] - w[1]) < 6e-4 for g, w in zip(got, want)), (got, want)
PY
grep -q 'id="answers"' s/ethanol_water_1atm.report.html || fail "report without the answers block"
grep -q "Models fitted to these data, side by side" s/ethanol_water_1atm.report.html || fail "report without the other models"

# a second run into the same folder is refused unless --force
"$pw" study "$D" --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --out-dir s 2> e.txt >/dev/null && fail "overwrote without --force"
grep -q -- "--force" e.txt || fail "message: $(cat e.txt)"
"$pw" study "$D" --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --out-dir s --force >/dev/null 2>&1 || fail "--force"

# --model takes one model; an infeasible split with --exit-verdict is status 7
"$pw" study "$D" --pressure=1atm --xd 0.95 --xb 0.05 --zf 0.3 --model Wilson --out-dir w --exit-verdict --json > w.json 2>/dev/null; rc=$?
test $rc -eq 7 || fail "infeasible study status $rc"
python3 -c 'import json; d=json.load(open("w.json")); assert d["chosen_model"]=="wilson" and len(d["models"])==1 and d["reflux"]["feasible"] is False' || fail "--model wilson"
# bad column options are refused before any work
"$pw" study "$D" --pressure 1atm --xd 0.8 --xb 0.02 --out-dir bad 2> e.txt >/dev/null && fail "missing --zf accepted"
test -e bad && fail "a folder was made for a refused study"
"$pw" study --help | grep -q -- "--components FILE" || fail "help"
echo ok
