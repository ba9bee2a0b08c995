#!/usr/bin/env bash
# CLI test of --uncertainty on the heterogeneous azeotrope (`azeotrope`) and on the decanter scheme
# (`decanter`): the intervals are in the JSON, each contains its point value, the draw counts add
# up, the same seed repeats, and the text output names the intervals. Data: the shipped
# 1-butanol/water set at 1 atm (Stockhardt & Hull 1931). Few draws, to keep the test short.
# Usage: bash test_hetero_uncertainty.sh PATH_TO_pinchwise SOURCE_DIR
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*" >&2; exit 1; }

"$PW" fit "$SRC/datasets/butanol_water_1atm.csv" --model nrtl --out "$TMP/bw.json" \
    > /dev/null 2> "$TMP/err.txt" || fail "fit: $(cat "$TMP/err.txt")"

for run in a b; do
  "$PW" azeotrope "$TMP/bw.json" --uncertainty --samples 25 --seed 3 --json > "$TMP/az_$run.json" \
      2> "$TMP/err.txt" || fail "azeotrope --uncertainty exited $?: $(cat "$TMP/err.txt")"
done
cmp -s "$TMP/az_a.json" "$TMP/az_b.json" || fail "same seed, different azeotrope output"
python3 - "$TMP/az_a.json" <<'PY' || fail "azeotrope uncertainty JSON"
import json, sys
d = json.load(open(sys.argv[1]))
het = [a for a in d["azeotropes"] if a["heterogeneous"]]
assert len(het) == 1, d["azeotropes"]
h = het[0]
lo, hi = h["x1_ci95"]
assert lo <= h["x1"] <= hi, h
lo, hi = h["T_K_ci95"]
assert lo <= h["T_K"] <= hi, h
for (lo, hi), x in zip(h["x1_liquids_ci95"], h["x1_liquids"]):
    assert lo <= x <= hi, h
u = h["uncertainty"]
dr = u["draws"]
assert dr["evaluated"] == 25 and dr["present"] + dr["split_lost"] + dr["failed"] == 25, dr
assert u["seed"] == 3, u
PY

"$PW" decanter "$TMP/bw.json" --pressure 1atm --zf 0.2 --x1-rich 0.99 --x1-lean 0.001 \
    --uncertainty --samples 20 --json > "$TMP/dec.json" 2> "$TMP/err.txt" \
    || fail "decanter --uncertainty exited $?: $(cat "$TMP/err.txt")"
python3 - "$TMP/dec.json" <<'PY' || fail "decanter uncertainty JSON"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["feasible"] is True, d
u = d["uncertainty"]
for c, b in zip(d["columns"], u["boilup_min"]):
    lo, hi = c["boilup_min_ci95"]
    assert lo <= c["boilup_min"] <= hi, c
    assert abs(b["value"] - c["boilup_min"]) < 1e-12, (b, c)
lo, hi = u["T_K"]["ci95"]
assert lo <= d["decanter"]["T_K"] <= hi, u
dr = u["draws"]
assert dr["feasible"] + dr["infeasible"] + dr["failed"] == dr["evaluated"] == 20, dr
assert 0 <= u["feasible_probability"] <= 1, u
# not cooled: the decanter's own layers are the boiling ones
assert u["decanter_x1_layers"] == u["x1_layers"], u
PY

# a cooled decanter (fit with the 25 C tie line, decanter at 25 C): its own layers get intervals,
# their values lle's at 25 C, and the text names them
"$PW" fit "$SRC/datasets/butanol_water_1atm.csv" --model nrtl \
    --lle "$SRC/datasets/lle/butanol_water_25C_ties.csv" --out "$TMP/bwl.json" \
    > /dev/null 2> "$TMP/err.txt" || fail "fit --lle: $(cat "$TMP/err.txt")"
"$PW" lle "$TMP/bwl.json" --temperature 25C --json > "$TMP/lle25.json" 2> /dev/null || fail "lle 25C"
"$PW" decanter "$TMP/bwl.json" --pressure 1atm --zf 0.2 --x1-rich 0.995 --x1-lean 0.001 \
    --decanter-temperature 25C --uncertainty --samples 20 --json > "$TMP/decc.json" \
    2> "$TMP/err.txt" || fail "cooled decanter --uncertainty exited $?: $(cat "$TMP/err.txt")"
python3 - "$TMP/decc.json" "$TMP/lle25.json" <<'PY' || fail "cooled decanter uncertainty JSON"
import json, sys
d, l = (json.load(open(p)) for p in sys.argv[1:])
assert d["feasible"] is True and d["decanter"]["cooled"] is True, d
u = d["uncertainty"]
for o, x in zip(u["decanter_x1_layers"], l["x1"]):
    assert o["value"] == x, (o, x)
    assert o["ci95"][0] <= x <= o["ci95"][1], o
assert [o["value"] for o in u["x1_layers"]] == d["three_phase"]["x1_layers"], u
PY
"$PW" decanter "$TMP/bwl.json" --pressure 1atm --zf 0.2 --x1-rich 0.995 --x1-lean 0.001 \
    --decanter-temperature 25C --uncertainty --samples 20 > "$TMP/decc.txt" 2> /dev/null \
    || fail "cooled decanter text exited $?"
grep -q "cooled layer rich, x1" "$TMP/decc.txt" || fail "no cooled-layer interval in the text"

# text output: the intervals are named
"$PW" decanter "$TMP/bw.json" --pressure 1atm --zf 0.2 --x1-rich 0.99 --x1-lean 0.001 \
    --uncertainty --samples 20 > "$TMP/dec.txt" 2> /dev/null || fail "decanter text exited $?"
grep -q "column A minimum V/B" "$TMP/dec.txt" || fail "no boil-up interval in the text"
grep -q "95 % interval" "$TMP/dec.txt" || fail "no interval in the text"
# an infeasible specification: exit 0, no interval, said so
"$PW" decanter "$TMP/bw.json" --pressure 1atm --zf 0.2 --x1-rich 0.3 --x1-lean 0.001 \
    --uncertainty --samples 20 > "$TMP/inf.txt" 2> /dev/null || fail "infeasible exited $?"
grep -q "no interval" "$TMP/inf.txt" || fail "infeasible: no word about the interval"
echo "ok"
