#!/usr/bin/python3
"""The NRTL fit of pinchwise written in Python with SciPy (Debian python3-scipy), for the speed
comparison of tools/bench.sh. Same objective as include/pinchwise/fit.h for isobaric T-x-y data:
residuals (T_calc - T)/sigma_T and (y_calc - y)/sigma_y over the mixture points, T_calc and
y_calc from the bubble temperature (modified Raoult's law, Antoine vapor pressures from
datasets/components.csv) solved with scipy.optimize.brentq; NRTL with tau_ij = b_ij/T and alpha
fixed at 0.3; scipy.optimize.least_squares (method "lm") from the start b12 = b21 = 0, pinchwise's
first start. Each fit is timed in-process with time.perf_counter.

usage: scipy_nrtl.py COMPONENTS.csv DATASET.csv...   prints: name, seconds, chi2, success"""
import csv
import math
import sys
import time

try:
    from scipy.optimize import brentq, least_squares
except ImportError:
    sys.stderr.write("scipy_nrtl.py: SciPy is not installed (optional extra of the benchmarks: "
                     "apt-get install -y python3-scipy); the SciPy comparison is skipped\n")
    sys.exit(77)

TO_KPA = {"kPa": 1.0, "Pa": 1e-3, "MPa": 1e3, "bar": 100.0, "atm": 101.325,
          "mmHg": 101.325 / 760.0, "psia": 6.894757293168361}


def to_kelvin(v, unit):
    return {"K": v, "C": v + 273.15, "F": (v + 459.67) * 5.0 / 9.0}[unit]


def from_kelvin(T, unit):
    return {"K": T, "C": T - 273.15, "F": T * 9.0 / 5.0 - 459.67}[unit]


def load_components(path):
    comps = {}
    with open(path, newline="", encoding="utf-8") as f:
        for row in csv.DictReader(f):
            comps[row["name"].lower()] = row
    return comps


def psat_kpa(c, T):
    A, B, C = float(c["A"]), float(c["B"]), float(c["C"])
    t = from_kelvin(T, c["T_unit"])
    v = A - B / (t + C)
    p = 10.0 ** v if c["log"] == "log10" else math.exp(v)
    return p * TO_KPA[c["P_unit"]]


def read_dataset(path):
    meta, rows = {}, []
    with open(path, encoding="utf-8") as f:
        lines = f.read().splitlines()
    i = 0
    while lines[i].startswith("#"):
        k, _, v = lines[i][1:].partition(":")
        meta[k.strip().lower()] = v.strip()
        i += 1
    header = lines[i].split(",")
    for line in lines[i + 1:]:
        if line:
            rows.append(dict(zip(header, line.split(","))))
    names = [s.strip() for s in meta["components"].split(",")]
    pv, pu = meta["pressure"].split()
    P = float(pv) * TO_KPA[pu]
    tcol = next(h for h in header if h.startswith("T["))
    tunit = tcol[2:-1]
    pts = [(float(r["x1"]), float(r["y1"]), to_kelvin(float(r[tcol]), tunit)) for r in rows]
    pts = [p for p in pts if 0.0 < p[0] < 1.0]
    sT = float(meta.get("sigma_t", "0.1 K").split()[0])
    sy = float(meta.get("sigma_y", "0.004"))
    return names, P, pts, sT, sy


def nrtl_gamma(b12, b21, x1, T, alpha=0.3):
    x2 = 1.0 - x1
    t12, t21 = b12 / T, b21 / T
    G12, G21 = math.exp(-alpha * t12), math.exp(-alpha * t21)
    D1, D2 = x1 + x2 * G21, x2 + x1 * G12
    l1 = x2 * x2 * (t21 * G21 * G21 / (D1 * D1) + t12 * G12 / (D2 * D2))
    l2 = x1 * x1 * (t12 * G12 * G12 / (D2 * D2) + t21 * G21 / (D1 * D1))
    return math.exp(l1), math.exp(l2)


def bubble_T(c1, c2, b, P, x1):
    def f(T):
        g1, g2 = nrtl_gamma(b[0], b[1], x1, T)
        return math.log(x1 * g1 * psat_kpa(c1, T) + (1.0 - x1) * g2 * psat_kpa(c2, T)) - math.log(P)
    lo, hi = 150.0, 700.0
    T = brentq(f, lo, hi, xtol=1e-10, rtol=1e-14, maxiter=200)
    g1, g2 = nrtl_gamma(b[0], b[1], x1, T)
    y1 = x1 * g1 * psat_kpa(c1, T) / P
    return T, y1


def fit(c1, c2, P, pts, sT, sy):
    def residuals(b):
        r = []
        for x, y, T in pts:
            try:
                Tc, yc = bubble_T(c1, c2, b, P, x)
            except (ValueError, OverflowError, ZeroDivisionError):
                Tc, yc = T + 1e3, y + 1.0
            r.append((Tc - T) / sT)
            r.append((yc - y) / sy)
        return r
    return least_squares(residuals, [0.0, 0.0], method="lm", x_scale=[100.0, 100.0])


def main():
    comps = load_components(sys.argv[1])
    for path in sys.argv[2:]:
        names, P, pts, sT, sy = read_dataset(path)
        c1, c2 = comps[names[0].lower()], comps[names[1].lower()]
        t0 = time.perf_counter()
        res = fit(c1, c2, P, pts, sT, sy)
        dt = time.perf_counter() - t0
        chi2 = float(sum(v * v for v in res.fun))
        print("%s\t%.6g\t%.10g\t%d" % (path.rsplit("/", 1)[-1], dt, chi2, int(res.success)))


if __name__ == "__main__":
    main()
