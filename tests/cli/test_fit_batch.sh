#!/usr/bin/env bash
# Batch fitting (pinchwise fit DIR --model M --out-dir OUT): file-name order, failures listed and
# passed over, the summary, and every batch result identical to the single fit of that file.
set -u
pw=$(realpath "$1"); src=$(realpath "$2")
gen=$(dirname "$pw")/tests/pw-gen-dataset
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
mkdir -p "$tmp/in"
cp "$src"/datasets/{demo_acetone_water,ethanol_water_1atm,methanol_water_1atm,mek_toluene_50C_pxy}.csv "$tmp/in/"
cp "$src/tests/bad-inputs/files/nan_T.csv" "$tmp/in/b_broken.csv"
if [ -x "$gen" ]; then  # a few INVENTED sets more, so that both threads have work
  for s in 1 2 3; do
    "$gen" --components "$src/datasets/components.csv" --names benzene,toluene --model margules \
      --params 0.1$s,0.2$s --pressure 101.325kPa --points 20 --seed $s > "$tmp/in/gen_bt_$s.csv" || fail "generator"
  done
fi
for m in wilson nrtl; do
  # one file fails: the others are written and the exit status is non-zero (CONTRACT)
  "$pw" fit "$tmp/in" --model $m --out-dir "$tmp/batch_$m" --json > "$tmp/batch_$m.json" 2> "$tmp/err" \
    && fail "batch $m: exit 0 although b_broken.csv failed"
  for f in "$tmp"/in/*.csv; do
    b=$(basename "$f" .csv)
    [ "$b" = b_broken ] && continue
    "$pw" fit "$f" --model $m --out "$tmp/single_$b.$m.json" > /dev/null 2>&1 || fail "single $b $m"
  done
  python3 - "$tmp" "$m" <<'PY' || fail "batch and single fits differ ($m)"
import json, os, sys
tmp, m = sys.argv[1], sys.argv[2]
d = json.load(open(f"{tmp}/batch_{m}.json"))
names = sorted(f for f in os.listdir(f"{tmp}/in") if f.endswith(".csv"))
fitted = [e["dataset"] for e in d["fits"]]
assert fitted == [n for n in names if n != "b_broken.csv"], fitted       # file-name order
assert [e["dataset"] for e in d["failed"]] == ["b_broken.csv"], d["failed"]
assert "b_broken.csv:8:" in d["failed"][0]["error"], d["failed"][0]
s = d["summary"]
assert s == {"datasets": len(names), "fitted": len(fitted), "converged": sum(e["converged"] for e in d["fits"]),
             "failed": 1, "model": m}, s
for e in d["fits"]:
    stem = e["dataset"][:-4]
    b = json.load(open(e["fit_file"]))
    a = json.load(open(f"{tmp}/single_{stem}.{m}.json"))
    assert os.path.dirname(e["fit_file"]) == f"{tmp}/batch_{m}", e["fit_file"]
    # Same data, same seed, same code: the results must agree to the last bit.
    for key in ("parameters", "stderr", "converged", "stop_reason", "ln_gamma_inf", "T_ref_K",
                "aad_y", "aad_T_K", "aad_P_kPa", "covariance"):
        assert a[key] == b[key], (stem, key, a[key], b[key])
    assert a["statistics"]["chi2"] == b["statistics"]["chi2"], stem
    assert e["chi2_per_dof"] == b["statistics"]["chi2_per_dof"], stem
PY
done
# The table names every dataset and the failure.
"$pw" fit "$tmp/in" --model wilson --out-dir "$tmp/batch_table" > "$tmp/table.txt" 2> "$tmp/err" && fail "table run: exit 0"
grep -q "fitted with wilson" "$tmp/table.txt" || fail "no summary line"
grep -q "chi2/dof" "$tmp/table.txt" || fail "no table header"
grep -q "b_broken.csv *failed: .*b_broken.csv:8:" "$tmp/table.txt" || fail "failure not in table"
[ ! -e "$tmp/batch_table/b_broken.wilson.json" ] || fail "a fit file was written for a failed dataset"
# The diagnostics: a batch shows the same list as a single fit, in its JSON and on stderr,
# including the duplicated-point note (an altered copy of a shipped set, line 7 repeated).
mkdir -p "$tmp/dup"
awk '{print} NR==7{print}' "$src/datasets/methanol_water_1atm.csv" > "$tmp/dup/dup_mw.csv"
cp "$src/datasets/ethanol_water_1atm.csv" "$tmp/dup/"
"$pw" fit "$tmp/dup" --model nrtl --out-dir "$tmp/dup_out" --json > "$tmp/dup.json" 2> "$tmp/dup_err.txt" || fail "dup batch"
for b in dup_mw ethanol_water_1atm; do
  "$pw" fit "$tmp/dup/$b.csv" --model nrtl --out "$tmp/dup_single_$b.json" --json > "$tmp/dup_single_$b.out" 2> "$tmp/dup_single_$b.err" || fail "dup single $b"
  # every warning of the single fit appears in the batch's stderr
  while IFS= read -r line; do
    grep -qF -- "$line" "$tmp/dup_err.txt" || fail "batch stderr lacks: $line"
  done < "$tmp/dup_single_$b.err"
done
grep -q "dup_mw.csv:8: 1 duplicated point (line 8 repeats line 7)" "$tmp/dup_err.txt" || fail "no duplicate note: $(cat "$tmp/dup_err.txt")"
python3 - "$tmp" <<'PY' || fail "batch and single diagnostics differ"
import json, sys
tmp = sys.argv[1]
d = json.load(open(f"{tmp}/dup.json"))
for e in d["fits"]:
    stem = e["dataset"][:-4]
    single = json.load(open(f"{tmp}/dup_single_{stem}.out"))
    assert e["diagnostics"] == single["diagnostics"], (stem, e["diagnostics"], single["diagnostics"])
kinds = [g["kind"] for g in d["fits"][0]["diagnostics"]]
assert d["fits"][0]["dataset"] == "dup_mw.csv" and "duplicated-points" in kinds, kinds
PY
echo "batch: ok"
