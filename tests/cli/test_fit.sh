#!/usr/bin/env bash
# pinchwise fit through the command line: the JSON keys of the interface, the fit file, refusals.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"

# 1. JSON keys of CONTRACT.md for every model on the published isobaric set.
for m in margules vanlaar wilson nrtl; do
  "$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model $m --json > out.json 2>err.txt || fail "fit $m: $(cat err.txt)"
  python3 - "$m" <<'PY' || fail "keys $m"
import json, sys, os
d = json.load(open("out.json"))
m = sys.argv[1]
for k in ["model", "converged", "components", "parameters", "stderr", "ln_gamma_inf", "T_ref_K",
          "aad_y", "aad_T_K", "aad_P_kPa", "fit_file"]:
    assert k in d, k
assert d["model"] == m and d["converged"] is True
assert d["components"] == ["ethanol", "water"]
assert d["aad_P_kPa"] is None and d["aad_T_K"] > 0 and 0 < d["aad_y"] < 0.01
assert len(d["ln_gamma_inf"]) == 2 and os.path.exists(d["fit_file"])
assert d["fit_file"] == "fits/ethanol_water_1atm.%s.json" % m
f = json.load(open(d["fit_file"]))
assert f["format"] == "pinchwise-fit" and len(f["component_data"]) == 2
assert len(f["data"]["points"]) > 10 and len(f["provenance"]["dataset_sha256"]) == 64
PY
done

# 2. Isothermal P-x-y and P-x: aad_T_K null, aad_y null for P-x.
"$pw" fit "$src/datasets/mek_toluene_50C_px.csv" --model margules --json --out px.json > out.json || fail "P-x fit"
python3 -c 'import json; d=json.load(open("out.json")); assert d["aad_y"] is None and d["aad_T_K"] is None and d["aad_P_kPa"] > 0' || fail "P-x keys"

# 2b. Every model on the published isothermal P-x-y and P-x sets (SVNA 7th ed. Ex. 12.1, from memory).
for f in mek_toluene_50C_pxy mek_toluene_50C_px; do
  for m in margules vanlaar wilson nrtl; do
    "$pw" fit "$src/datasets/$f.csv" --model $m --json --out $f.$m.json > o.json 2>/dev/null || fail "fit $f $m"
    python3 -c 'import json,sys; d=json.load(open("o.json")); assert d["converged"] and d["aad_P_kPa"] < 0.5 and d["aad_T_K"] is None and (d["aad_y"] is None) == sys.argv[1].endswith("_px"), d' "$f" || fail "keys $f $m"
  done
done

# 3. An existing fit file is not overwritten without --force; with --force it is.
cp px.json px.before
"$pw" fit "$src/datasets/mek_toluene_50C_px.csv" --model margules --out px.json 2>err.txt && fail "overwrote without --force"
grep -q "exists" err.txt || fail "no 'exists' message: $(cat err.txt)"
cmp -s px.json px.before || fail "file changed although refused"
"$pw" fit "$src/datasets/mek_toluene_50C_px.csv" --model margules --out px.json --force > /dev/null || fail "--force"

# 4. Bad input: one line on stderr naming file and line, non-zero exit, nothing written.
printf '# components: ethanol, water\n# pressure: 1 atm\nx1,y1,T[C]\n0.1,0.4,90\n1.5,0.5,80\n0.3,0.6,82\n' > bad.csv
rm -rf fits
"$pw" fit bad.csv --model nrtl 2>err.txt && fail "accepted x1 = 1.5"
grep -q "bad.csv:5:" err.txt || fail "message lacks file:line: $(cat err.txt)"
[ "$(wc -l < err.txt)" -eq 1 ] || fail "more than one line on stderr"
[ ! -e fits/bad.nrtl.json ] || fail "wrote a fit file for bad input"

# 5. Unknown component: suggestion of a close name.
printf '# components: ethanoll, water\n# pressure: 1 atm\nx1,y1,T[C]\n0.1,0.4,90\n0.2,0.5,85\n0.3,0.6,82\n0.5,0.65,80\n' > typo.csv
"$pw" fit typo.csv --model wilson 2>err.txt && fail "accepted an unknown component"
grep -q "ethanol" err.txt || fail "no suggestion: $(cat err.txt)"

# 6. Too few points for the model.
printf '# components: ethanol, water\n# pressure: 1 atm\nx1,T[C]\n0.2,85\n' > few.csv
"$pw" fit few.csv --model nrtl 2>err.txt && fail "fitted one point"
grep -qi "too few" err.txt || fail "no 'too few' message: $(cat err.txt)"

# 7. Batch over a folder: name order, goes past bad files (the others are still written), exit
#    non-zero when any file failed (CONTRACT, batch paragraph).
mkdir in; cp "$src/datasets/methanol_water_1atm.csv" in/b.csv; cp bad.csv in/a.csv; cp "$src/datasets/mek_toluene_50C_pxy.csv" in/c.csv
"$pw" fit in --model nrtl --out-dir outdir --json > batch.json && fail "batch exit 0 with a failed file"
python3 - <<'PY' || fail "batch JSON"
import json, os
d = json.load(open("batch.json"))
assert [f["dataset"] for f in d["fits"]] == ["b.csv", "c.csv"], d
assert [f["dataset"] for f in d["failed"]] == ["a.csv"] and "a.csv:5" in d["failed"][0]["error"]
assert all(os.path.exists(f["fit_file"]) for f in d["fits"])
PY

# 8. --model all ranks the models.
"$pw" fit "$src/datasets/methanol_water_1atm.csv" --model all --out-dir all --json > all.json || fail "--model all"
python3 -c 'import json; d=json.load(open("all.json")); assert len(d["models"]) == 5 and d["best"] == d["models"][0]["model"]' || fail "ranking JSON"

# 9. Quantities without units are refused where options take them.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model nrtl --sigma-T 0.1 --out x.json 2>err.txt && fail "accepted a bare sigma-T"
# 10. --exclude drops rows by file line and records them with the reason.
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --exclude 8,10-11 --exclude-reason "suspected leak" --out ex.json > /dev/null || fail "--exclude"
python3 - <<'PY' || fail "exclusions not recorded"
import json
d = json.load(open("ex.json"))
assert d["excluded"]["lines"] == [8, 10, 11], d["excluded"]
assert d["excluded"]["reason"] == "suspected leak"
assert sum(p["excluded"] for p in d["data"]["points"]) == 3
PY
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --exclude 2 --out ex2.json 2>err.txt && fail "excluded a line without data"
grep -q ":2:" err.txt || fail "exclude error lacks the line: $(cat err.txt)"
[ ! -e ex2.json ] || fail "wrote a fit file after a refused --exclude"
# 11. Names are found by alias and in any case; outputs keep the dataset's spelling.
sed 's/# components: ethanol, water/# components: EtOH, Water/' "$src/datasets/ethanol_water_1atm.csv" > alias.csv
"$pw" fit alias.csv --model wilson --out alias.json --json > o.json 2>/dev/null || fail "alias fit"
python3 -c 'import json; d=json.load(open("o.json")); assert d["components"] == ["EtOH", "Water"], d["components"]' || fail "alias names"
echo "fit CLI tests passed"
