#!/usr/bin/env python3
"""Fits every lab file of a folder with every model, ranks the models of each file by AICc and
prints one summary table. Usage (from the source tree, after the README's build):

    PYTHONPATH=python python3 examples/rank_models.py datasets

Screening results only: see the README's cautions."""

import concurrent.futures
import glob
import os
import sys

import pinchwise

MODELS = pinchwise.models()  # every model of the library


def fit_all(path):
    """Every model fitted to one file, best (lowest AICc) first; failures are kept as text."""
    fits, failed = [], []
    for model in MODELS:
        try:
            fits.append(pinchwise.fit(path, model))
        except pinchwise.PinchwiseError as e:
            failed.append("%s: %s" % (model, e))
    # the rule of `pinchwise fit --model all`: fits that did not converge or predict a liquid
    # split rank last, the rest by AICc (Hurvich & Tsai 1989)
    fits.sort(key=lambda f: (not f["converged"] or f["liquid_split"]["predicted"],
                             f["statistics"]["aicc"]))
    return path, fits, failed


def main(folder):
    files = sorted(p for p in glob.glob(os.path.join(folder, "*.csv"))
                   if os.path.basename(p) != "components.csv")
    # the library keeps no global state and releases the interpreter lock: fit files in parallel
    with concurrent.futures.ThreadPoolExecutor(max_workers=2) as pool:
        results = list(pool.map(fit_all, files))

    print("%-26s %-8s %7s %-9s %8s %8s  %s" % ("dataset", "best", "dAICc", "next", "AAD y",
                                               "AAD T/K", "azeotrope (x1, T or P)"))
    for path, fits, failed in results:
        name = os.path.basename(path)
        if not fits:
            print("%-26s failed: %s" % (name, "; ".join(failed)))
            continue
        best = fits[0]
        runner = fits[1] if len(fits) > 1 else None
        gap = runner["statistics"]["aicc"] - best["statistics"]["aicc"] if runner else float("nan")
        az = pinchwise.azeotrope(best)  # at the condition of the file's own data
        if az["azeotropes"]:
            a = az["azeotropes"][0]
            where = "%.4f, %s" % (a["x1"], "%.2f K" % a["T_K"] if az["mode"] == "isobaric"
                                  else "%.2f kPa" % a["P_kPa"])
        else:
            where = "none"
        aad_y = "%.4f" % best["aad_y"] if best["aad_y"] is not None else "-"
        aad_T = "%.3f" % best["aad_T_K"] if best["aad_T_K"] is not None else "-"
        print("%-26s %-8s %7.2f %-9s %8s %8s  %s" % (name, best["model"], gap,
                                                     runner["model"] if runner else "-", aad_y,
                                                     aad_T, where))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1] if len(sys.argv) > 1 else "datasets"))
