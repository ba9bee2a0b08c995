#!/usr/bin/env bash
# The two measured 1 atm VLE sets with three-phase points besides 1-butanol/water
# (datasets/three_phase/, sources in datasets/README.md), through the whole chain: fit (the
# three-phase points found), azeotrope (the heterogeneous azeotrope against the published
# values), fit --lle with the measured tie lines, screen and reflux (refusing to cross it and
# naming the decanter scheme), decanter (feasible, balances closing) and check.
#
# Published values the checks use:
#   chloroform/water at 101.3 kPa: the set's own three-phase points, 328.95 K and y1 0.855 (Hu,
#     Fluid Phase Equilib. 289 (2010) 80-89), and the paper's abstract, 55.8 C and
#     x1 = y1 = 0.856; layers at 56.1 C, 0.001216 / 0.98884 (Conti, Othmer & Gilmont, J. Chem.
#     Eng. Data 5 (1960) 301, via NIST SRD 106; datasets/lle/chloroform_water_0C_60C_ties.csv).
#   ethyl acetate/water at 101.325 kPa: the handbook heterogeneous azeotrope, 70.4 C and
#     91.9 wt% ester, y1 = 0.6988 (CRC 44th / Lange's 10th, METHODS2 3.5, confirmed).
# The tolerances are regression guards on two-parameter models of scattered data (chloroform's
# dilute end scatters; see datasets/README.md), not the data's uncertainty.
set -u
PW=$1
SRC=$2
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
D="$SRC/datasets/three_phase"

for sys in chloroform ethyl_acetate; do
    "$PW" fit "$D/${sys}_water_1atm.csv" --model nrtl --out "$TMP/$sys.json" --json \
        > "$TMP/$sys.fit.json" 2> "$TMP/$sys.fit.err" || fail "$sys: fit exited $?"
    grep -q "three-phase points" "$TMP/$sys.fit.err" || fail "$sys: no three-phase warning"
    "$PW" azeotrope "$TMP/$sys.json" --json > "$TMP/$sys.az.json" 2> /dev/null \
        || fail "$sys: azeotrope exited $?"
    "$PW" fit "$D/${sys}_water_1atm.csv" --model nrtl \
        --lle "$(ls "$SRC"/datasets/lle/${sys}_water_*_ties.csv)" --out "$TMP/$sys.lle.json" \
        > /dev/null 2>&1 || fail "$sys: fit --lle exited $?"
    "$PW" azeotrope "$TMP/$sys.lle.json" --json > "$TMP/$sys.lle.az.json" 2> /dev/null \
        || fail "$sys: azeotrope on the fit --lle exited $?"
    "$PW" azeotrope "$TMP/$sys.json" --scan 50kPa:200kPa:4 --json > "$TMP/$sys.scan.json" \
        2> /dev/null || fail "$sys: azeotrope --scan exited $?"
    "$PW" reflux "$TMP/$sys.json" --pressure 1atm --xd 0.99 --xb 0.001 --zf 0.3 --json \
        > "$TMP/$sys.reflux.json" 2> /dev/null || fail "$sys: reflux exited $?"
    "$PW" screen "$TMP/$sys.json" --pressure 1atm --xd 0.99 --xb 0.001 --json \
        > "$TMP/$sys.screen.json" 2> /dev/null || fail "$sys: screen exited $?"
    "$PW" decanter "$TMP/$sys.json" --pressure 1atm --zf 0.3 --x1-rich 0.995 --x1-lean 0.0002 \
        --json > "$TMP/$sys.dec.json" 2> /dev/null || fail "$sys: decanter exited $?"
    "$PW" check "$D/${sys}_water_1atm.csv" --json > "$TMP/$sys.check.json" 2> /dev/null
    [ $? -le 1 ] || fail "$sys: check failed to run"
    "$PW" report "$TMP/$sys.json" --out "$TMP/$sys.html" --pressure 1atm --xd 0.995 \
        --xb 0.0002 --zf 0.3 > /dev/null 2>&1 || fail "$sys: report exited $?"
    grep -q 'id="decanter"' "$TMP/$sys.html" || fail "$sys: report without the decanter scheme"
done

python3 - "$TMP" <<'PY' || fail "values"
import json, os, sys
t = sys.argv[1]
J = lambda n: json.load(open(os.path.join(t, n)))
cases = {
    # system: (three-phase points flagged, T3 published [K], y3 published, T guard, y guard)
    "chloroform": (4, 328.95, 0.855, 0.5, 0.03),
    "ethyl_acetate": (3, 273.15 + 70.4, 0.6988, 0.5, 0.02),
}
for sys_, (n3, T3, y3, dT, dy) in cases.items():
    fit = J(sys_ + ".json")
    assert fit["converged"], sys_
    flagged = [p for p in fit["data"]["points"] if p.get("three_phase")]
    assert len(flagged) == n3, (sys_, [p["line"] for p in flagged])
    # with the measured tie lines the fit weighs layers from other temperatures too (ethyl
    # acetate's 25-60 C lines put the ester layer wetter, T3 0.56 K up): a wider guard there
    for name, wT in ((sys_ + ".az.json", dT), (sys_ + ".lle.az.json", 2 * dT)):
        az = J(name)["azeotropes"]
        assert len(az) == 1 and az[0]["heterogeneous"] and az[0]["kind"] == "minimum-boiling", az
        a = az[0]
        assert abs(a["T_K"] - T3) < wT, (name, a["T_K"], T3)
        assert abs(a["x1"] - y3) < dy, (name, a["x1"], y3)
        lo, hi = a["x1_liquids"]
        assert lo < a["x1"] < hi, a
        # every measured overall liquid of a three-phase point lies between the model's layers
        assert all(lo < p["x1"] < hi for p in flagged if p["T_K"] < T3 + 0.5), (name, lo, hi)
    sc = J(sys_ + ".scan.json")
    assert all(any(z["heterogeneous"] for z in p["azeotropes"]) for p in sc["scan"]["points"]), sc["scan"]
    r = J(sys_ + ".reflux.json")
    assert r["feasible"] is False and "decanter" in r["reason"], r["reason"]
    s = J(sys_ + ".screen.json")
    assert s["verdict"] == "infeasible" and any("decanter" in x["text"] for x in s["reasons"]), s["reasons"]
    # the volatility profile leaves out the points inside the layers: none of its values may
    # come from there (null where a product itself is two liquids)
    lo3, hi3 = J(sys_ + ".az.json")["three_phase"]["x1_liquids"]
    assert s["alpha_points_in_layers"] > 0, s
    for key, x in (("alpha_top", s["xd"]), ("alpha_bottom", s["xb"])):
        assert (s[key] is None) == (lo3 < x < hi3), (key, x, s[key], lo3, hi3)
    assert s["x_alpha_min"] is None or not (lo3 < s["x_alpha_min"] < hi3), s
    d = J(sys_ + ".dec.json")
    assert d["feasible"] and abs(d["balance_closure"]) < 1e-12, d
    B = d["bottoms_per_mol_feed"]
    # overall balance on component 1 from the JSON: z = B_rich x_rich + B_lean x_lean
    c = d["columns"]
    assert abs(B[0] * c[0]["bottoms_x1"] + B[1] * c[1]["bottoms_x1"] - 0.3) < 1e-12, (B, c)
    assert all(col["boilup_min"] > 0 and col["n_min"] > 0 for col in c), c
    assert d["overflow_check"]["doubtful"] is True, d["overflow_check"]  # 39 % and 27 %
    ch = J(sys_ + ".check.json")
    assert len(ch["three_phase_points"]["points"]) == n3, ch["three_phase_points"]
    her = [x for x in ch["tests"] if x["name"] == "herington"][0]
    assert her["details"]["gap_bridge"] is not None, her

# chloroform/water: the layers at T3 against the measured tie line at 56.1 C (Conti et al. 1960):
# the chloroform-rich layer within 0.01; the water-rich one, 0.0012 measured, the model puts 2.3
# times too dilute (0.0005; the set's dilute end scatters), guarded at 0.0002 .. 0.0015
lo, hi = J("chloroform.az.json")["azeotropes"][0]["x1_liquids"]
assert abs(hi - 0.98884) < 0.01 and 0.0002 < lo < 0.0015, (lo, hi)
# against the paper's abstract: 55.8 C, x1 = y1 = 0.856
a = J("chloroform.az.json")["azeotropes"][0]
assert abs(a["T_K"] - 328.95) < 0.5 and abs(a["x1"] - 0.856) < 0.03, a
PY
echo "three-phase sets: chloroform/water and ethyl acetate/water through the chain"
