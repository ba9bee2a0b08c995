#!/usr/bin/env bash
# Parameter names of the project's own (dg12_K, dg21_K for NRTL; dlambda12_K, dlambda21_K for
# Wilson), and fit files written with the older names (b12_K, b21_K; a12_K, a21_K) still read and
# give the same answers.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"
for m in nrtl wilson; do
    "$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model $m --out $m.json --json > $m.out \
        2>/dev/null || fail "fit $m"
    python3 - "$m" <<'PY' || fail "$m: keys or old-name rewrite"
import json, sys
m = sys.argv[1]
new, old = {"nrtl": (["dg12_K", "dg21_K"], ["b12_K", "b21_K"]),
            "wilson": (["dlambda12_K", "dlambda21_K"], ["a12_K", "a21_K"])}[m]
d = json.load(open(m + ".out"))
assert all(k in d["parameters"] and k in d["stderr"] for k in new), d["parameters"]
assert not any(k in d["parameters"] for k in old)
f = json.load(open(m + ".json"))
def rename(obj):
    if isinstance(obj, dict):
        for n, o in zip(new, old):
            if n in obj:
                obj[o] = obj.pop(n)
    return obj
for key in ["parameters", "stderr", "ci95"]:
    if key in f:
        rename(f[key])
for mi in f.get("minima", []):
    rename(mi["parameters"])
f["fixed"] = [dict(zip(new, old)).get(k, k) for k in f.get("fixed", [])]
s = json.dumps(f)
assert not any(k in s for k in new)
open(m + ".old.json", "w").write(s)
PY
    for f in $m.json $m.old.json; do
        "$pw" reflux $f --pressure 101.325kPa --xd 0.80 --xb 0.02 --zf 0.10 --json > $f.r 2>/dev/null \
            || fail "reflux $f"
    done
    python3 -c "import json,sys; a=json.load(open('$m.json.r')); b=json.load(open('$m.old.json.r')); assert a['r_min'] == b['r_min'] and a['n_min'] == b['n_min']" \
        || fail "$m: old-name fit file gives another answer"
done
echo "ok"
