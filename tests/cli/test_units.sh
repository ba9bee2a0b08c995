#!/usr/bin/env bash
# Units and compositions on the command line and in data files: blanks between number and unit,
# unit aliases (degC, degree sign, torr, psi, bara), --sigma-* with the file's syntax, mass
# fractions in data (w1, wy1) and in targets (wt, wt%, mol%).
# Molar masses computed from the IUPAC standard atomic weights (H 1.008, C 12.011, O 15.999):
# ethanol 46.069 g/mol, water 18.015 g/mol. Data: the shipped ethanol/water set (Perry's, see
# its source line), rewritten here by mass.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"

# A component file with molar masses: the library's ethanol and water rows plus M_g_mol, and the
# same ethanol row without a molar mass.
python3 - "$src/datasets/components.csv" <<'PY' || fail "component files"
import csv, sys
rows = list(csv.reader(open(sys.argv[1], newline="")))
hdr = rows[0][:10]
M = {"ethanol": "46.069", "water": "18.015"}
with open("comp.csv", "w", newline="") as f, open("comp_noM.csv", "w", newline="") as g:
    w, v = csv.writer(f), csv.writer(g)
    w.writerow(hdr + ["M_g_mol"]); v.writerow(hdr + ["M_g_mol"])
    for r in rows[1:]:
        if r and r[0] in M:
            w.writerow(r[:10] + [M[r[0]]])
            v.writerow(r[:10] + ["" if r[0] == "ethanol" else M[r[0]]])
PY

# The shipped data by mass, with a spreadsheet-style header and a spaced pressure.
python3 - "$src/datasets/ethanol_water_1atm.csv" <<'PY' || fail "mass dataset"
import sys
M1, M2 = 46.069, 18.015
w = lambda x: repr(x * M1 / (x * M1 + (1 - x) * M2))
out = ["# components: ethanol, water", "# pressure: 760 torr", "# sigma_T: 0.1 degC",
       "# sigma_y: 0.005", "w1,wy1,T (\u00b0C)"]
for line in open(sys.argv[1]):
    if line.startswith("#") or line.startswith("x1"):
        continue
    x, y, t = line.strip().split(",")
    out.append(",".join([w(float(x)), w(float(y)), t]))
open("ew_mass.csv", "w", encoding="utf-8").write("\n".join(out) + "\n")
PY

"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --components comp.csv --out mole.json --json > fm.json 2>/dev/null || fail "fit by mole"
"$pw" fit ew_mass.csv --model wilson --components comp.csv --out mass.json --json > fw.json 2>/dev/null || fail "fit by mass"
python3 - <<'PY' || fail "the same fit from mass fractions"
import json
a, b = json.load(open("fm.json")), json.load(open("fw.json"))
for k, v in a["parameters"].items():
    assert abs(b["parameters"][k] - v) <= 1e-6 * abs(v) + 1e-9, (k, v, b["parameters"][k])
assert abs(a["aad_T_K"] - b["aad_T_K"]) < 1e-6
PY

# A spreadsheet export of the same data: ';' between fields, decimal commas, quoted metadata cells.
python3 - "$src/datasets/ethanol_water_1atm.csv" <<'PY' || fail "semicolon export"
import sys
out = []
for line in open(sys.argv[1]):
    line = line.rstrip("\n")
    if line.startswith("#"):
        out.append('"%s";;' % line.replace('"', '""') if "," in line else line + ";;")
    else:
        out.append(line.replace(",", ";").replace(".", ",").replace("T[C]", "T (°C)"))
open("ew_semi.csv", "w", encoding="utf-8").write("\r\n".join(out) + "\r\n")
PY
"$pw" fit ew_semi.csv --model wilson --components comp.csv --out semi.json --json > fs.json 2>/dev/null || fail "fit of a semicolon export"
python3 -c 'import json; a,b=json.load(open("fm.json")),json.load(open("fs.json")); assert a["parameters"]==b["parameters"], (a["parameters"], b["parameters"])' || fail "semicolon export fits differently"

# No molar mass: refused, naming the file, line, column and component.
"$pw" fit ew_mass.csv --model wilson --components comp_noM.csv --out x.json 2> e.txt >/dev/null && fail "fit without M accepted"
grep -q "ew_mass.csv:5:" e.txt || fail "no file:line in: $(cat e.txt)"
grep -q "w1" e.txt && grep -q "'ethanol'" e.txt && grep -q "M_g_mol" e.txt || fail "message: $(cat e.txt)"
test -e x.json && fail "a fit file was written after a refusal"

# Pressure spellings give the same column; a quoted blank is allowed.
ref=$("$pw" reflux mole.json --pressure 101.325kPa --xd 0.8 --xb 0.02 --zf 0.2 --json 2>/dev/null | python3 -c 'import json,sys; print(json.load(sys.stdin)["r_min"])') || fail "reference reflux"
for p in "1 atm" "101.325 kPa" "760torr" "760 Torr" "14.69594878 psi" "1.01325bara" "0.101325 MPa"; do
  got=$("$pw" reflux mole.json --pressure "$p" --xd 0.8 --xb 0.02 --zf 0.2 --json 2>/dev/null | python3 -c 'import json,sys; print(json.load(sys.stdin)["r_min"])') || fail "--pressure '$p' refused"
  python3 -c "import sys; a,b=$ref,$got; sys.exit(0 if abs(a-b) <= 1e-6*a else 1)" || fail "--pressure '$p': $got vs $ref"
done
"$pw" reflux mole.json --pressure "1 furlong" --xd 0.8 --xb 0.02 --zf 0.2 2> e.txt >/dev/null && fail "furlong accepted"
grep -q "torr" e.txt || fail "unit list missing in: $(cat e.txt)"

# Targets by mass: xd 85 wt% is 0.6891 mole fraction (computed with the molar masses above);
# 85wt% and 0.85wt give the same; mol% is a mole percent; JSON stays in mole fractions.
"$pw" reflux mole.json --pressure 1atm --xd 85wt% --xb 0.5wt% --zf "30 wt%" --json > rw.json 2>/dev/null || fail "reflux by mass"
"$pw" reflux mole.json --pressure 1atm --xd 0.85wt --xb 0.005wt --zf 0.3wt --json > rw2.json 2>/dev/null || fail "reflux by mass fraction"
"$pw" reflux mole.json --pressure 1atm --xd 80mol% --xb 2mol% --zf 20mol% --json > rm.json 2>/dev/null || fail "reflux in mol%"
python3 - <<'PY' || fail "targets by mass"
import json
M1, M2 = 46.069, 18.015
x = lambda w: (w / M1) / (w / M1 + (1 - w) / M2)
a, b = json.load(open("rw.json")), json.load(open("rw2.json"))
for k, w in [("xd", 0.85), ("xb", 0.005), ("zf", 0.30)]:
    assert abs(a["spec"][k] - x(w)) < 1e-12, (k, a["spec"][k], x(w))
assert abs(a["spec"]["xd"] - 0.6891) < 1e-4
assert a["r_min"] == b["r_min"] and a["feasible"]
m = json.load(open("rm.json"))
assert abs(m["spec"]["xd"] - 0.8) < 1e-15 and abs(m["spec"]["zf"] - 0.2) < 1e-15
PY
"$pw" reflux mole.json --pressure 1atm --xd 85wt% --xb 0.5wt% --zf "30 wt%" > rw.txt 2>/dev/null || fail "reflux text by mass"
grep -q "as given: xd 85wt%, xb 0.5wt%, zf 30 wt%" rw.txt || fail "text output does not echo the mass targets: $(head -3 rw.txt)"
"$pw" reflux mole.json --pressure 1atm --xd 95% --xb 0.02 --zf 0.2 2> e.txt >/dev/null && fail "bare % accepted"
grep -q "mol%" e.txt || fail "which-percent hint: $(cat e.txt)"
"$pw" reflux mole.json --pressure 1atm --xd 80 --xb 0.02 --zf 0.2 2> e.txt >/dev/null && fail "80 accepted"
grep -q "looks like a percentage" e.txt || fail "percentage hint: $(cat e.txt)"
"$pw" screen mole.json --pressure 1atm --xd 85wt% --xb 1wt% --json > s.json 2>/dev/null || fail "screen by mass"
python3 -c 'import json; d=json.load(open("s.json")); assert abs(d["xd"]-0.6891)<1e-4, d["xd"]' || fail "screen xd by mass"

# A fit file without molar masses (the components given without M_g_mol) refuses wt targets.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --components comp_noM.csv --out noM.json >/dev/null 2>&1 || fail "fit without M"
"$pw" reflux noM.json --pressure 1atm --xd 85wt% --xb 0.02 --zf 0.2 2> e.txt >/dev/null && fail "wt% without M accepted"
grep -q -- "--xd" e.txt && grep -q "ethanol" e.txt && grep -q "M_g_mol" e.txt || fail "message: $(cat e.txt)"

# --sigma-* with the data file's syntax; a bare --sigma-P number is still percent.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --components comp.csv --out s1.json --sigma-P 0.2% --sigma-T "0.1 degC" --json > s1.txt 2>/dev/null || fail "--sigma-P 0.2%"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --components comp.csv --out s2.json --sigma-P 0.2 --sigma-T 0.1K --json > s2.txt 2>/dev/null || fail "--sigma-P 0.2"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --components comp.csv --out s3.json --sigma-P 0.05kPa --json > /dev/null 2>&1 || fail "--sigma-P 0.05kPa"
python3 -c 'import json; a,b=json.load(open("s1.txt")),json.load(open("s2.txt")); assert a["parameters"]==b["parameters"]' || fail "0.2% and 0.2 differ"
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --out s4.json --sigma-P 0.05furlong 2> e.txt >/dev/null && fail "bad --sigma-P accepted"
grep -q -- "--sigma-P" e.txt && grep -q "furlong" e.txt || fail "sigma message: $(cat e.txt)"
# JSON numbers as the shortest text that reads back (checked against Python's float repr, which
# is the shortest round-trip form): no 0.80000000000000004.
"$pw" reflux mole.json --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.2 --factors 1.1,1.3 --json > short.json 2>/dev/null || fail "reflux for the number check"
grep -q '"xd": 0.8,' short.json || fail "xd not written as 0.8"
grep -q '0000000000000[0-9]' short.json && fail "a long round-off tail in: $(grep -m1 '0000000000000[0-9]' short.json)"
python3 - <<'PY' || fail "reals not shortest"
import re
text = open("short.json").read()
text = re.sub(r'"(?:[^"\\]|\\.)*"', '""', text)  # strings out
for tok in re.findall(r'-?\d[\d.eE+-]*', text):
    if not re.search(r'[.eE]', tok):
        continue
    v = float(tok)
    digits = lambda s: len(re.sub(r'^0+', '', re.sub(r'[eE].*$', '', s.lstrip('-')).replace('.', '')).rstrip('0') or '0')
    assert digits(tok) <= max(digits(repr(v)), 1), (tok, repr(v))
PY
echo "ok"
