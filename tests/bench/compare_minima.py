#!/usr/bin/env python3
"""Compares two outputs of `pw-bench minima` (two builds, same files): the same status, class,
number of minima and starts per minimum on every file and model, and the largest relative
differences of the chosen chi2, the chosen parameters, every minimum's chi2 and parameters and
the stability screen's minimum D. Parameters are compared relative to max(|p|, 1) (energies in
K are of order 100). Exit status 1 when a count or class differs or a difference exceeds --tol
(default 1e-6; chi2 to tol^2)."""
import sys


def parse(path):
    out = {}
    for line in open(path):
        f = line.rstrip("\n").split("\t")
        key = (f[0], f[1])
        rec = {"status": int(f[2])}
        if rec["status"] == 0:
            cls, chi2, npar = int(f[3]), float(f[4]), int(f[5])
            par = [float(v) for v in f[6:6 + npar]]
            i = 6 + npar
            D, iters, nfev, nmin = float(f[i]), int(f[i + 1]), int(f[i + 2]), int(f[i + 3])
            i += 4
            mins = []
            for _ in range(nmin):
                mins.append((float(f[i]), int(f[i + 1]), [float(v) for v in f[i + 2:i + 2 + npar]]))
                i += 2 + npar
            rec.update(cls=cls, chi2=chi2, par=par, D=D, iters=iters, nfev=nfev, mins=mins)
        out[key] = rec
    return out


def rel(a, b, floor=1e-300):
    if a == b:
        return 0.0
    return abs(a - b) / max(abs(a), abs(b), floor)


def main():
    args = [a for a in sys.argv[1:] if not a.startswith("--tol=")]
    tol = float(next((a[6:] for a in sys.argv[1:] if a.startswith("--tol=")), "1e-6"))
    a, b = parse(args[0]), parse(args[1])
    bad, n = 0, 0
    worst = {"chi2": (0.0, None), "par": (0.0, None), "min_chi2": (0.0, None),
             "min_par": (0.0, None), "D": (0.0, None)}
    it_a = it_b = fev_a = fev_b = 0

    def note(kind, v, key):
        if v > worst[kind][0]:
            worst[kind] = (v, key)

    for key in sorted(a):
        n += 1
        ra, rb = a[key], b.get(key)
        if rb is None or ra["status"] != rb["status"]:
            print("DIFFERENT status", key); bad += 1; continue
        if ra["status"] != 0:
            continue
        if ra["cls"] != rb["cls"] or len(ra["mins"]) != len(rb["mins"]):
            print("DIFFERENT class or minima count", key, ra["cls"], rb["cls"],
                  len(ra["mins"]), len(rb["mins"])); bad += 1; continue
        if [m[1] for m in ra["mins"]] != [m[1] for m in rb["mins"]]:
            print("DIFFERENT starts per minimum", key); bad += 1
        it_a += ra["iters"]; it_b += rb["iters"]; fev_a += ra["nfev"]; fev_b += rb["nfev"]
        note("chi2", rel(ra["chi2"], rb["chi2"]), key)
        note("par", max([abs(p - q) / max(abs(p), abs(q), 1.0) for p, q in zip(ra["par"], rb["par"])] or [0.0]), key)
        for ma, mb in zip(ra["mins"], rb["mins"]):
            note("min_chi2", rel(ma[0], mb[0]), key)
            note("min_par", max([abs(p - q) / max(abs(p), abs(q), 1.0) for p, q in zip(ma[2], mb[2])] or [0.0]), key)
        if ra["D"] == ra["D"] or rb["D"] == rb["D"]:
            note("D", rel(ra["D"], rb["D"]), key)
    print(f"{n} fits compared; LM iterations {it_a} -> {it_b}; objective evaluations {fev_a} -> {fev_b}")
    for kind, (v, key) in worst.items():
        print(f"  largest relative difference, {kind}: {v:.3g} ({key[0] + ' ' + key[1] if key else '-'})")
    lim = {"chi2": tol * tol, "min_chi2": tol * tol, "par": tol, "min_par": tol, "D": tol}
    for kind, (v, key) in worst.items():
        if v > lim[kind]:
            print(f"  {kind} differs by more than {lim[kind]:g}"); bad += 1
    print("same minima, choice and class on every fit" if bad == 0 else f"{bad} difference(s)")
    return 1 if bad else 0


if __name__ == "__main__":
    sys.exit(main())
