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
echo "batch: ok"
