#!/usr/bin/env bash
# pinchwise check on exact and on offset data (docs/consistency.md, "Exact data" and "Stated
# uncertainties"): noise-free Raoult's-law and non-ideal data are consistent with and without
# --strict; a 0.5 K offset on the mixture rows is caught when the file states sigma_y 0.002 and
# sigma_T 0.05 K, or when --sigma-y gives it; the JSON keeps the interface keys.
# Data from exact_vle.awk (INVENTED, noise-free; Antoine rows of benzene, toluene, methanol and
# water as in datasets/components.csv: Smith, Van Ness & Abbott, 7th ed. 2005, Table B.2, from
# memory; water given here by its Antoine row). Needs awk and python3.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
gen() { awk -f "$src/tests/cli/exact_vle.awk" "$@"; }
BZ=(-v n1=benzene -v a1=13.7819 -v b1=2726.81 -v c1=217.572)
TO=(-v n2=toluene -v a2=13.932 -v b2=3056.96 -v c2=217.625)
ME=(-v n1=methanol -v a1=16.5785 -v b1=3638.27 -v c1=239.500)
WA=(-v n2=water-antoine -v a2=16.3872 -v b2=3885.70 -v c2=230.170)
cat > water.csv <<'CSV'
name,A,B,C,log,P_unit,T_unit,T_min,T_max,source
water-antoine,16.3872,3885.70,230.170,ln,kPa,C,0,200,"Smith, Van Ness & Abbott, 7th ed. 2005, Table B.2 (from memory)"
CSV

gen "${BZ[@]}" "${TO[@]}" -v P=101.325 > ideal_tx.csv
gen "${BZ[@]}" "${TO[@]}" -v t=80 > ideal_px.csv
gen "${ME[@]}" "${WA[@]}" -v P=101.325 -v A12=0.8 -v A21=0.45 > mw_tx.csv
gen "${ME[@]}" "${WA[@]}" -v t=60 -v A12=0.8 -v A21=0.45 -v sy=0.002 > mw_px.csv
gen "${ME[@]}" "${WA[@]}" -v P=101.325 -v A12=0.8 -v A21=0.45 -v dT=0.5 -v sy=0.002 -v sT=0.05 > mw_off.csv
gen "${ME[@]}" "${WA[@]}" -v P=101.325 -v A12=0.8 -v A21=0.45 -v dT=0.5 > mw_off_nosigma.csv

# 1. Noise-free data: consistent with and without --strict, every test that ran passes.
for f in ideal_tx ideal_px mw_tx mw_px; do
  for strict in "" --strict; do
    "$pw" check $f.csv --components water.csv $strict --json > out.json 2>err.txt \
      || fail "check $f $strict exited $?: $(cat err.txt)"
    python3 - "$f" "$strict" <<'PY' || fail "exact data $f $strict: $(cat out.json)"
import json, sys
f, strict = sys.argv[1], sys.argv[2]
d = json.load(open("out.json"))
assert set(d) >= {"tests", "consistent"}
for t in d["tests"]:
    assert set(t) >= {"name", "value", "limit", "pass", "source"}, t
    assert t["pass"] is True, (t["name"], t["value"], t["limit"])
assert d["consistent"] is True, d["reasons"]
names = {t["name"] for t in d["tests"]}
assert "legendre_point" in names
if f.startswith("ideal"):
    area = [t for t in d["tests"] if t["name"] in ("rk_area", "herington")][0]
    assert area["details"]["areas_at_rounding_level"] is True, area
if f == "mw_px":   # states sigma_y: the uncertainty-based tests run
    assert d["uncertainties"]["used"] is True and d["uncertainties"]["sigma_y"] == 0.002
    assert "point_scatter" in names
else:
    assert d["uncertainties"]["used"] is False and "point_scatter" not in names
    pt = [t for t in d["tests"] if t["name"] == "legendre_point"][0]
    assert pt["limit"] == 0.01
PY
  done
done

# 2. A 0.5 K offset on the mixture rows: caught when the file states sigma_y and sigma_T ...
"$pw" check mw_off.csv --components water.csv --json > out.json 2>err.txt || fail "check mw_off: $(cat err.txt)"
python3 - <<'PY' || fail "offset with stated uncertainties not caught: $(cat out.json)"
import json
d = json.load(open("out.json"))
assert d["consistent"] is False, d["reasons"]
t = {t["name"]: t for t in d["tests"]}
assert t["point_scatter"]["pass"] is False and t["point_scatter"]["primary"] is True
assert t["legendre_point"]["limit"] < 0.01
assert d["uncertainties"]["sigma_T_K"] == 0.05
# the reason quotes the scatter as a multiple of the stated uncertainties, not as a percentage
r = [x for x in d["reasons"] if x.startswith("point_scatter failed")][0]
assert " x stated, limit " in r and "%" not in r.split(":")[0], r
PY
# ... passes the classic limit without them (the reason to state them) ...
"$pw" check mw_off_nosigma.csv --components water.csv --json > out.json 2>err.txt || fail "check: $(cat err.txt)"
python3 -c "import json; d = json.load(open('out.json')); assert d['consistent'] is True, d" \
  || fail "the classic criterion was expected to miss a noise-free 0.5 K offset"
# ... and --sigma-y states sigma_y on the command line (sigma_T then the default 0.1 K).
"$pw" check mw_off_nosigma.csv --components water.csv --sigma-y 0.002 --json > out.json 2>err.txt \
  || fail "check --sigma-y: $(cat err.txt)"
python3 - <<'PY' || fail "--sigma-y: $(cat out.json)"
import json
d = json.load(open("out.json"))
assert d["uncertainties"]["used"] is True and d["uncertainties"]["sigma_y"] == 0.002
assert d["consistent"] is False, d["reasons"]
PY
"$pw" check mw_off_nosigma.csv --components water.csv --sigma-y 0.002 > out.txt 2>err.txt || fail "text output"
grep -q "limits from the stated uncertainties" out.txt || fail "text output does not say which limits apply"

# 3. Bad --sigma-y values are refused with a message naming the option.
for v in 0 1 -0.1 abc 1e400; do
  if "$pw" check ideal_tx.csv --sigma-y "$v" > /dev/null 2>err.txt; then fail "--sigma-y $v accepted"; fi
  grep -q -- "--sigma-y" err.txt || fail "--sigma-y $v: message does not name the option: $(cat err.txt)"
done
if "$pw" check ideal_tx.csv --sigma-y > /dev/null 2>err.txt; then fail "--sigma-y without value accepted"; fi
echo "ok"
