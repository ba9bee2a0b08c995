#!/usr/bin/env bash
# CLI test of --show-in on every command that prints temperatures or pressures (fit, azeotrope,
# screen, reflux, rate, check, lle, decanter, study; the report has test_report_units.sh): the
# text gives the same quantities as the --json output of the same run, converted by the unit
# definitions (0 degC = 273.15 K, t/degF = 1.8 t/degC + 32, a temperature difference of 1 K =
# 1.8 degF, 1 bar = 100 kPa, 1 psi = 6.894757 kPa: NIST SP 811 (2008) appendix B.8); the --json
# output is the same with and without --show-in; no library mark (0x1e) reaches any output; each
# command's --help lists the option. The shipped ethanol/water and 1-butanol/water sets at 1 atm
# are the data.
# Usage: bash test_show_in.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$(cd "$(dirname "$1")" && pwd)/$(basename "$1")
SRC=$(cd "$2" && pwd)
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }
cd "$TMP" || exit 1

"$PW" fit "$SRC/datasets/ethanol_water_1atm.csv" --model nrtl --out ew.json --json > fit.json \
    2> /dev/null || fail "fit ethanol/water"
"$PW" fit "$SRC/datasets/butanol_water_1atm.csv" --model nrtl --out bw.json > /dev/null \
    2> /dev/null || fail "fit butanol/water"

# run NAME ARGS...: the text with --show-in C,bar (NAME.C.txt, stderr NAME.C.err), with
# --show-in F,psi (NAME.F.txt), and the JSON with and without --show-in (must be identical)
run() {
    local name=$1
    shift
    "$PW" "$@" --show-in C,bar > "$name.C.txt" 2> "$name.C.err" || fail "$name --show-in C,bar: $(cat "$name.C.err")"
    "$PW" "$@" --show-in F,psi > "$name.F.txt" 2> "$name.F.err" || fail "$name --show-in F,psi"
    "$PW" "$@" --json > "$name.json" 2> /dev/null || fail "$name --json"
    "$PW" "$@" --json --show-in C,bar > "$name.json2" 2> /dev/null || fail "$name --json --show-in"
    # (the fit document's "created" time is the second it was written: two runs may differ there)
    if [ "$name" != study ]; then
        cmp -s <(grep -v '"created": ' "$name.json") <(grep -v '"created": ' "$name.json2") \
            || fail "$name: --show-in changed the JSON output"
    fi
}
run fit fit "$SRC/datasets/ethanol_water_1atm.csv" --model nrtl --out ew2.json --force
run az azeotrope ew.json --pressure 1atm --sweep 50kPa:300kPa:3
run screen screen ew.json --pressure 1atm --xd 0.95 --xb 0.02
run reflux reflux ew.json --pressure 1atm --xd 0.8 --xb 0.02 --zf 0.3
run rate rate ew.json --pressure 1atm --stages 8 --feed-stage 5 --reflux 3 --zf 0.3 --distillate 0.3
run check check "$SRC/datasets/ethanol_water_1atm.csv"
run lle lle bw.json --temperature 25C --scan 20C:80C:3
run dec decanter bw.json --pressure 1atm --zf 0.3 --x1-rich 0.9 --x1-lean 0.001
run study study "$SRC/datasets/ethanol_water_1atm.csv" --model nrtl --pressure 1atm --xd 0.8 \
    --xb 0.02 --zf 0.3 --out-dir st --force

# the report: a library reason (the single column refused at the heterogeneous azeotrope) in the
# page's units, its JSON twin (reflux --json) in K
"$PW" report bw.json --out bw.html --pressure 1atm --xd 0.001 --xb 0.995 --zf 0.2 --show-in C,bar \
    > /dev/null 2> rep.err || fail "report: $(cat rep.err)"
"$PW" reflux bw.json --pressure 1atm --xd 0.001 --xb 0.995 --zf 0.2 --json > bwr.json 2> /dev/null \
    || fail "reflux of butanol/water"
cp bw.html page.html.txt

if grep -l $'\x1e' ./*.txt ./*.err ./*.json ./*.json2 st/*.html 2> /dev/null; then
    fail "a library mark reached an output"
fi

python3 - <<'PY' || fail "values under --show-in"
import json, re

def txt(name, u="C"):
    return open(f"{name}.{u}.txt", encoding="utf-8").read()

def js(name):
    return json.load(open(f"{name}.json"))

C = "\u00b0C"
F = "\u00b0F"

def near(a, b, tol, what):
    assert abs(a - b) <= tol, f"{what}: {a} vs {b}"

# fit: ln gamma_inf at T_ref (the fit file's T_ref_K)
ref = json.load(open("ew2.json"))["T_ref_K"]
m = re.search(r"ln gamma_inf at ([-\d.]+) " + C, txt("fit"))
assert m, "fit: no T_ref in C"
near(float(m.group(1)) + 273.15, ref, 0.006, "fit T_ref")
m = re.search(r"ln gamma_inf at ([-\d.]+) " + F, txt("fit", "F"))
near((float(m.group(1)) - 32) / 1.8 + 273.15, ref, 0.006, "fit T_ref in F")

# azeotrope: the table's T [C] and P [bar], the heading, the scan
t = txt("az")
z = js("az")["azeotropes"][0]
m = re.search(r"^\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+minimum-boiling", t, re.M)
assert m, t
near(float(m.group(1)), z["x1"], 1e-6, "azeotrope x1")
near(float(m.group(2)) + 273.15, z["T_K"], 6e-4, "azeotrope T in C")
near(float(m.group(3)) * 100.0, z["P_kPa"], 1e-3, "azeotrope P in bar")
assert "T [" + C + "]" in t and "P [bar]" in t and "[K]" not in t and "kPa" not in t.split("Caution")[0], t
assert "at 1.01325 bar" in t
tf = txt("az", "F")
m = re.search(r"^\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+minimum-boiling", tf, re.M)
near((float(m.group(2)) - 32) / 1.8 + 273.15, z["T_K"], 6e-4, "azeotrope T in F")
near(float(m.group(3)) * 6.894757, z["P_kPa"], 1e-3, "azeotrope P in psi")
scan = js("az")["scan"]["points"]
rows = re.findall(r"^\s+([\d.]+)\s+0\.9\d+\s+([\d.]+)\s+minimum-boiling$", t, re.M)
assert len(rows) == 3, rows
for (p, T), pt in zip(rows, scan):
    near(float(p) * 100.0, pt["P_kPa"], 1e-4 * pt["P_kPa"], "scan P (5 digits)")
    near(float(T) + 273.15, pt["azeotropes"][0]["T_K"], 0.06, "scan T")

# screen: the library's reason quotes the azeotrope's T in C; its JSON text keeps K
t = txt("screen")
reasons = js("screen")["reasons"]
bar = [r["text"] for r in reasons if r["key"] == "azeotrope-barrier"][0]
mK = re.search(r"T = ([\d.]+) K", bar)
mC = re.search(r"T = ([\d.]+) " + C, t)
assert mK and mC, (bar, t)
near(float(mC.group(1)) + 273.15, float(mK.group(1)), 0.006, "screen reason T")
assert "between 0.2 bar and 5 bar" in t, t
assert "Split screen" in t and "at 1.01325 bar" in t

# reflux: the column pressure
assert re.search(r"column at 1\.013 bar", txt("reflux")), txt("reflux")
assert re.search(r"column at 14\.7 psi", txt("reflux", "F")), txt("reflux", "F")

# rate: the stage profile's temperatures
t = txt("rate")
stages = js("rate")["stages"]
rows = re.findall(r"^\s+(\d+)\s+[\d.]+\s+[\d.]+\s+([\d.]+)\s+[\d.]+\s+[\d.]+", t, re.M)
assert len(rows) == len(stages), (rows, len(stages))
for (k, T), s in zip(rows, stages):
    near(float(T) + 273.15, s["T_K"], 6e-4, f"rate stage {k}")
assert "T " + C in t

# check: temperature differences in F are 1.8 x the kelvin ones
t = txt("check", "F")
pts = {p["line"]: p for p in js("check")["points"]}
rows = re.findall(r"^\s+(\d+)\s+[\d.]+\s+[\d.]+\s+[\d.]+\s+[-+][\d.]+\s+[-+][\d.]+\s+([-+][\d.e-]+)", t, re.M)
assert len(rows) == len(pts), rows
for line, dT in rows:
    near(float(dT), 1.8 * pts[int(line)]["dT_K"], 6e-4 * max(1.0, abs(float(dT))), f"check dT line {line}")
assert "dT [" + F + "]" in t
# in C a temperature difference stays in kelvin
assert "dT [K]" in txt("check")

# lle: the scan table in C
t = txt("lle")
scan = js("lle")["scan"]
rows = re.findall(r"^\s+([\d.]+)\s+(0\.\d+)\s+(0\.\d+)$", t, re.M)
assert len(rows) == len(scan), rows
for (T, a, b), s in zip(rows, scan):
    near(float(T) + 273.15, s["T_K"], 6e-4, "lle scan T")
assert "at 25.000 " + C in t

# decanter: the three-phase temperature
m = re.search(r"three-phase temperature ([\d.]+) " + C, txt("dec"))
assert m, txt("dec")
near(float(m.group(1)) + 273.15, js("dec")["decanter"]["T_K"], 6e-4, "decanter T")
assert "at 1.01325 bar" in txt("dec")

# study: the azeotrope line
m = re.search(r"azeotropes at the data's condition: minimum-boiling at x1 = [\d.]+, T = ([\d.]+) "
              + C + r", P = ([\d.]+) bar", txt("study"))
assert m, txt("study")
near(float(m.group(1)) + 273.15, z["T_K"], 0.006, "study azeotrope T")

# the report's reason in C equals the JSON's in K
why = js("bwr")["reason"] if "reason" in js("bwr") else js("bwr")["column"]["reason"]
mK = re.search(r"heterogeneous azeotrope \(x1 = [\d.]+ at ([\d.]+) K,", why)
page = open("page.html.txt", encoding="utf-8").read()
mC = re.search(r"heterogeneous azeotrope \(x1 = [\d.]+ at ([\d.]+) " + C + ",", page)
assert mK and mC, (why, mC)
near(float(mC.group(1)) + 273.15, float(mK.group(1)), 0.006, "report reason T")

# warnings on stderr follow the display units too (no "K" temperature in C)
for name in ("az", "screen"):
    e = open(f"{name}.C.err", encoding="utf-8").read()
    for line in e.splitlines():
        assert not re.search(r"\d K[ ,)]", line.replace(" K above", "").replace(" K below", "")), line
PY

# each command's --help lists --show-in; a bad unit is refused with the option named
for c in fit azeotrope screen reflux rate check lle decanter study report; do
    "$PW" "$c" --help | grep -q -- "--show-in UNITS" || fail "$c --help lacks --show-in"
done
"$PW" azeotrope ew.json --show-in C,furlong > /dev/null 2> err && fail "accepted --show-in C,furlong"
grep -q -- "--show-in" err && grep -q furlong err || fail "unclear --show-in message: $(cat err)"
echo "ok"
