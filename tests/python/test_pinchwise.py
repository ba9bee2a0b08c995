"""The Python module against the command line: on every shipped dataset, every function returns
the same keys and values as the matching command's --json (identity check: both come from one
library function), errors carry the library's file, line and message, and the module finds its
library. Run by ctest (python3 -m unittest) with PINCHWISE_CLI naming the built program."""

import concurrent.futures
import glob
import json
import os
import re
import subprocess
import sys
import tempfile
import unittest

SRC = os.environ.get("PW_SOURCE_DIR") or os.path.abspath(
    os.path.join(os.path.dirname(__file__), "..", ".."))
sys.path.insert(0, os.path.join(SRC, "python"))
import pinchwise  # noqa: E402

CLI = os.environ.get("PINCHWISE_CLI") or os.path.join(SRC, "build", "pinchwise")
DATASETS = sorted(glob.glob(os.path.join(SRC, "datasets", "*.csv")))
DATASETS = [d for d in DATASETS if os.path.basename(d) != "components.csv"
            and "x1_I" not in open(d, encoding="utf-8").read()]  # leave out tie-line (LLE) files
MODELS = ["margules", "vanlaar", "wilson", "nrtl"]
SPLITS = [(0.95, 0.02, 0.10, 1.0), (0.8, 0.05, 0.3, 0.5)]


def cli(*args):
    """stdout of the program parsed as JSON; fails the test on a non-zero status."""
    p = subprocess.run([CLI, *args], capture_output=True, text=True)
    if p.returncode != 0:
        raise AssertionError("pinchwise %s failed (%d): %s" % (" ".join(args), p.returncode, p.stderr))
    return json.loads(p.stdout)


def cli_error(*args):
    p = subprocess.run([CLI, *args], capture_output=True, text=True)
    return p.returncode, p.stderr


def condition(path):
    """('pressure'|'temperature', '101.325kPa') from a dataset's metadata."""
    with open(path, encoding="utf-8") as f:
        for line in f:
            m = re.match(r"#\s*(pressure|temperature)\s*:\s*(\S+)\s*(\S+)", line, re.I)
            if m:
                return m.group(1).lower(), m.group(2) + m.group(3)
    raise AssertionError("%s: no condition" % path)


def without_created(doc):
    """The fit's provenance records when it was made, the one value that differs between runs."""
    doc = json.loads(json.dumps(doc))
    doc.get("provenance", {}).pop("created", None)
    return doc


class EqualToCommandLine(unittest.TestCase):
    """Same keys and values as --json, on every shipped dataset and every model."""

    @classmethod
    def setUpClass(cls):
        cls.tmp = tempfile.TemporaryDirectory()
        cls.fits = {}
        for data in DATASETS:
            for model in MODELS:
                stem = os.path.basename(data)[:-4]
                out = os.path.join(cls.tmp.name, "%s.%s.json" % (stem, model))
                cls.fits[data, model] = (out, cli("fit", data, "--model", model, "--out", out,
                                                  "--json"))

    @classmethod
    def tearDownClass(cls):
        cls.tmp.cleanup()

    def test_datasets_present(self):
        self.assertGreaterEqual(len(DATASETS), 5)

    def test_fit(self):
        for (data, model), (out, want) in self.fits.items():
            with self.subTest(data=os.path.basename(data), model=model):
                got = pinchwise.fit(data, model, out=out, force=True)
                self.assertEqual(without_created(got), without_created(want))
                self.assertEqual(got["fit_file"], out)
                # the file written is the fit file the text carries
                with open(out, encoding="utf-8") as f:
                    self.assertEqual(without_created(json.load(f)),
                                     without_created(json.loads(got.fit_file_text)))
                unwritten = pinchwise.fit(data, model)
                self.assertIsNone(unwritten["fit_file"])
                want_unwritten = without_created(want)
                want_unwritten["fit_file"] = None
                self.assertEqual(without_created(unwritten), want_unwritten)

    def test_check(self):
        for data in DATASETS:
            with self.subTest(data=os.path.basename(data)):
                self.assertEqual(pinchwise.check(data), cli("check", data, "--json"))
                self.assertEqual(pinchwise.check(data, strict=True),
                                 cli("check", data, "--strict", "--json"))

    def test_azeotrope(self):
        for (data, model), (out, _) in self.fits.items():
            kind, value = condition(data)
            with self.subTest(data=os.path.basename(data), model=model):
                want = cli("azeotrope", out, "--" + kind, value, "--json")
                self.assertEqual(pinchwise.azeotrope(out, **{kind: value}), want)
                # from the dict fit() returned, and at the data's own condition by default
                f = pinchwise.fit(data, model)
                self.assertEqual(pinchwise.azeotrope(f, **{kind: value}), want)
                self.assertEqual(pinchwise.azeotrope(f), want)
                self.assertEqual(pinchwise.azeotrope(out, pressure="2bar"),
                                 cli("azeotrope", out, "--pressure", "2bar", "--json"))

    def test_reflux(self):
        for (data, model), (out, _) in self.fits.items():
            f = pinchwise.fit(data, model)
            for xd, xb, zf, q in SPLITS:
                with self.subTest(data=os.path.basename(data), model=model, split=(xd, xb, zf, q)):
                    want = cli("reflux", out, "--pressure", "101.325kPa", "--xd", str(xd),
                               "--xb", str(xb), "--zf", str(zf), "--q", str(q), "--json")
                    self.assertEqual(pinchwise.reflux(out, "101.325kPa", xd, xb, zf, q=q), want)
                    self.assertEqual(pinchwise.reflux(f, "101.325kPa", xd, xb, zf, q=q), want)

    def test_screen(self):
        for (data, model), (out, _) in self.fits.items():
            with self.subTest(data=os.path.basename(data), model=model):
                self.assertEqual(pinchwise.screen(out, "1atm", 0.9, 0.05),
                                 cli("screen", out, "--pressure", "1atm", "--xd", "0.9", "--xb",
                                     "0.05", "--json"))
                self.assertEqual(pinchwise.screen(out, "1atm", 0.9, 0.05, zf=0.3),
                                 cli("screen", out, "--pressure", "1atm", "--xd", "0.9", "--xb",
                                     "0.05", "--zf", "0.3", "--json"))

    def test_uncertainty(self):
        """--uncertainty --samples --seed: the same draws, the same intervals."""
        for data in DATASETS:
            kind, value = condition(data)
            out, _ = self.fits[data, "nrtl"]
            f = pinchwise.fit(data, "nrtl")
            with self.subTest(data=os.path.basename(data)):
                want = cli("azeotrope", out, "--" + kind, value, "--uncertainty", "--samples",
                           "60", "--seed", "3", "--json")
                self.assertEqual(pinchwise.azeotrope(f, **{kind: value}, uncertainty=True,
                                                     samples=60, seed=3), want)
                want = cli("reflux", out, "--pressure", "1atm", "--xd", "0.8", "--xb", "0.05",
                           "--zf", "0.3", "--samples", "60", "--json")
                got = pinchwise.reflux(f, "1atm", 0.8, 0.05, 0.3, samples=60)
                self.assertEqual(got, want)
                self.assertIn("r_min_ci95", got)
        ethanol = [d for d in DATASETS if "ethanol" in d][0]
        az = pinchwise.azeotrope(self.fits[ethanol, "nrtl"][0], pressure="1atm", uncertainty=True,
                                 samples=40)
        self.assertIn("x1_ci95", az["azeotropes"][0])
        with self.assertRaises(pinchwise.PinchwiseError):
            pinchwise.reflux(self.fits[ethanol, "nrtl"][0], "1atm", 0.8, 0.05, 0.3, samples=-2)

    def test_components_override(self):
        """--components on a fit file: the rows of the file replace the fit file's."""
        data = os.path.join(SRC, "datasets", "demo_acetone_water.csv")
        out, _ = self.fits[data, "nrtl"]
        comp = os.path.join(SRC, "datasets", "components.csv")
        self.assertEqual(pinchwise.reflux(out, "1atm", 0.95, 0.02, 0.1, components=comp),
                         cli("reflux", out, "--pressure", "1atm", "--xd", "0.95", "--xb", "0.02",
                             "--zf", "0.1", "--components", comp, "--json"))


def same_as_cli(test, py_call, *args):
    """py_call() equals `pinchwise ARGS --json`; where the program refuses (non-zero exit), the
    module raises PinchwiseError with the program's message."""
    p = subprocess.run([CLI, *args, "--json"], capture_output=True, text=True)
    if p.returncode == 0:
        test.assertEqual(py_call(), json.loads(p.stdout))
        return json.loads(p.stdout)
    with test.assertRaises(pinchwise.PinchwiseError) as cm:
        py_call()
    test.assertIn(str(cm.exception), p.stderr)
    return None


class NewCommandsEqualToCommandLine(unittest.TestCase):
    """lle, decanter, rate and reflux --energy: the same keys and values as the program's --json
    (or the same refusal), on the shipped data fitted with every model."""

    BW = os.path.join(SRC, "datasets", "butanol_water_1atm.csv")
    DEMO = os.path.join(SRC, "datasets", "demo_acetone_water.csv")  # invented data (the demo)
    MW = os.path.join(SRC, "datasets", "methanol_water_1atm.csv")

    @classmethod
    def setUpClass(cls):
        cls.tmp = tempfile.TemporaryDirectory()
        cls.fits = {}
        for data in DATASETS:
            for model in MODELS:
                out = os.path.join(cls.tmp.name, "%s.%s.json" % (os.path.basename(data)[:-4], model))
                cli("fit", data, "--model", model, "--out", out, "--json")
                cls.fits[data, model] = out

    @classmethod
    def tearDownClass(cls):
        cls.tmp.cleanup()

    def test_lle_butanol_water(self):
        """1-butanol/water (NRTL) splits at 25 C and at 90 C, as the program says."""
        out = self.fits[self.BW, "nrtl"]
        f = pinchwise.fit(self.BW, "nrtl")
        for T in ("25C", "90C"):
            with self.subTest(T=T):
                want = cli("lle", out, "--temperature", T, "--json")
                self.assertTrue(want["split"])
                self.assertEqual(pinchwise.lle(out, T), want)
                self.assertEqual(pinchwise.lle(f, T), want)
        want = cli("lle", out, "--temperature", "25C", "--scan", "20C:120C:6", "--json")
        self.assertEqual(len(want["scan"]), 6)
        self.assertEqual(pinchwise.lle(out, "25C", scan="20C:120C:6"), want)
        self.assertEqual(pinchwise.lle(f, "25C", scan=("20C", "120C", 6)), want)
        # a scan alone: the answer at FROM, as the command without --temperature
        alone = cli("lle", out, "--scan", "20C:120C:6", "--json")
        self.assertEqual(pinchwise.lle(out, scan="20C:120C:6"), alone)
        self.assertEqual(pinchwise.lle(out, scan=("20C", "120C", 6)), alone)
        with self.assertRaises(pinchwise.PinchwiseError):
            pinchwise.lle(out)

    def test_lle_every_dataset(self):
        for (data, model), out in self.fits.items():
            with self.subTest(data=os.path.basename(data), model=model):
                same_as_cli(self, lambda: pinchwise.lle(out, "25C"), "lle", out,
                            "--temperature", "25C")
                same_as_cli(self, lambda: pinchwise.lle(out, "300K", scan="280K:380K:5"), "lle",
                            out, "--temperature", "300K", "--scan", "280K:380K:5")

    def test_fit_with_tie_lines(self):
        """fit(..., lle=...) gives the program's `fit --lle --json`, for the tie lines named in
        either component order, and the same refusal for a model that cannot split."""
        ties = os.path.join(SRC, "datasets", "lle", "butanol_water_25C_ties.csv")
        out = os.path.join(self.tmp.name, "bw_lle.json")
        want = cli("fit", self.BW, "--model", "nrtl", "--lle", ties, "--out", out, "--json")
        self.assertEqual(want["lle"]["tie_lines"], 1)
        got = pinchwise.fit(self.BW, "nrtl", lle=ties, out=out, force=True)
        self.assertEqual(without_created(got), without_created(want))
        swapped = os.path.join(self.tmp.name, "ties_swapped.csv")
        with open(swapped, "w", encoding="utf-8") as f:
            f.write("# components: water, 1-butanol\n# sigma_x: 0.003\nT[K],x1_I,x1_II\n"
                    "298.15,0.512,0.981\n")
        again = pinchwise.fit(self.BW, "nrtl", lle=swapped)
        # 1 - x rounds in the last digit. A least-squares minimum fixes a parameter only to
        # about its standard error times sqrt(eps * chi2) (chi2 cannot tell nearer points apart):
        # here about 7 K * sqrt(2.2e-16 * 756) = 3e-6 K for dg12, so 1e-6 relative
        for k, v in want["parameters"].items():
            self.assertAlmostEqual(again["parameters"][k], v, delta=1e-6 * max(1.0, abs(v)))
        code, msg = cli_error("fit", self.BW, "--model", "wilson", "--lle", ties, "--out",
                              os.path.join(self.tmp.name, "w.json"))
        self.assertNotEqual(code, 0)
        with self.assertRaises(pinchwise.PinchwiseError) as e:
            pinchwise.fit(self.BW, "wilson", lle=ties)
        self.assertIn("cannot", str(e.exception))
        with self.assertRaises(pinchwise.PinchwiseError):
            pinchwise.fit(self.BW, "nrtl", lle=swapped, out=swapped, force=True)
        with open(swapped, encoding="utf-8") as f:
            self.assertIn("0.512", f.read())

    def test_decanter(self):
        """The specifications of the command-line tests (tests/cli/test_hetero.sh) and the one of
        the module's documentation, feasible and not."""
        out = self.fits[self.BW, "nrtl"]
        f = pinchwise.fit(self.BW, "nrtl")
        seen = set()
        for zf, rich, lean, q in [(0.3, 0.99, 0.001, 1.0), (0.2, 0.995, 0.001, 1.0),
                                  (0.2, 0.995, 0.001, 0.5), (0.2, 0.3, 0.001, 1.0)]:
            with self.subTest(zf=zf, rich=rich, lean=lean, q=q):
                want = cli("decanter", out, "--pressure", "1atm", "--zf", str(zf), "--x1-rich",
                           str(rich), "--x1-lean", str(lean), "--q", str(q), "--json")
                seen.add(want["feasible"])
                self.assertEqual(pinchwise.decanter(out, "1atm", zf, rich, lean, q=q), want)
                self.assertEqual(pinchwise.decanter(f, "101.325kPa", zf, rich, lean, q=q), want)
        self.assertEqual(seen, {True, False})  # both shapes of the document
        # a cooled decanter (--decanter-temperature), feasible and above the boiling layers
        for T in ("40C", "150C"):
            with self.subTest(decanter_temperature=T):
                want = cli("decanter", out, "--pressure", "1atm", "--zf", "0.2", "--x1-rich",
                           "0.995", "--x1-lean", "0.001", "--decanter-temperature", T, "--json")
                self.assertEqual(pinchwise.decanter(out, "1atm", 0.2, 0.995, 0.001,
                                                    decanter_temperature=T), want)
                self.assertEqual(want["feasible"], T == "40C")

    def test_decanter_uncertainty(self):
        """decanter --uncertainty --samples N --seed N: the same draws and intervals as the
        program's --json for the same seed (also from the dict fit() returned); giving samples or
        seed alone switches it on; an infeasible scheme gets no interval, as on the command
        line."""
        out = self.fits[self.BW, "nrtl"]
        f = pinchwise.fit(self.BW, "nrtl")
        spec = ["--pressure", "1atm", "--zf", "0.2", "--x1-rich", "0.99", "--x1-lean", "0.001"]
        want = cli("decanter", out, *spec, "--uncertainty", "--samples", "12", "--seed", "7",
                   "--json")
        self.assertTrue(want["feasible"])
        self.assertEqual(want["uncertainty"]["seed"], 7)
        self.assertEqual(want["uncertainty"]["draws"]["evaluated"], 12)
        self.assertIn("boilup_min_ci95", want["columns"][0])
        got = pinchwise.decanter(out, "1atm", 0.2, 0.99, 0.001, uncertainty=True, samples=12,
                                 seed=7)
        self.assertEqual(got, want)
        self.assertEqual(pinchwise.decanter(f, "1atm", 0.2, 0.99, 0.001, samples=12, seed=7), want)
        other = pinchwise.decanter(out, "1atm", 0.2, 0.99, 0.001, samples=12, seed=8)
        self.assertEqual(other["uncertainty"]["seed"], 8)
        self.assertEqual(other, cli("decanter", out, *spec, "--samples", "12", "--seed", "8",
                                    "--json"))
        want = cli("decanter", out, "--pressure", "1atm", "--zf", "0.2", "--x1-rich", "0.3",
                   "--x1-lean", "0.001", "--samples", "12", "--json")
        self.assertFalse(want["feasible"])
        self.assertNotIn("uncertainty", want)
        self.assertEqual(pinchwise.decanter(out, "1atm", 0.2, 0.3, 0.001, samples=12), want)
        with self.assertRaises(pinchwise.PinchwiseError):
            pinchwise.decanter(out, "1atm", 0.2, 0.99, 0.001, samples=-3)

    def test_decanter_every_fit(self):
        for (data, model), out in self.fits.items():
            with self.subTest(data=os.path.basename(data), model=model):
                same_as_cli(self, lambda: pinchwise.decanter(out, "1atm", 0.3, 0.99, 0.001),
                            "decanter", out, "--pressure", "1atm", "--zf", "0.3", "--x1-rich",
                            "0.99", "--x1-lean", "0.001")

    def test_rate(self):
        """The demo column of tests/cli/test_rate.sh, both balances; methanol/water."""
        demo = self.fits[self.DEMO, "nrtl"]
        args = ["--pressure", "101.325kPa", "--stages", "12", "--feed-stage", "9", "--reflux",
                "0.8", "--zf", "0.1", "--distillate", "0.09"]
        want = cli("rate", demo, *args, "--json")
        self.assertEqual(want["balance"], "constant-molal-overflow")
        self.assertEqual(pinchwise.rate(demo, "101.325kPa", 12, 9, 0.8, 0.1, 0.09), want)
        want = cli("rate", demo, *args, "--energy", "--json")
        self.assertEqual(want["balance"], "energy")
        self.assertIn("reboiler_kJ_per_mol_feed", want)
        self.assertEqual(pinchwise.rate(demo, "101.325kPa", 12, 9, 0.8, 0.1, 0.09, energy=True),
                         want)
        f = pinchwise.fit(self.MW, "nrtl")
        for energy in (False, True):
            with self.subTest(energy=energy):
                want = cli("rate", self.fits[self.MW, "nrtl"], "--pressure", "1atm", "--stages",
                           "15", "--feed-stage", "10", "--reflux", "1.5", "--zf", "0.4",
                           "--distillate", "0.38", "--q", "0.8",
                           *(["--energy"] if energy else []), "--json")
                self.assertEqual(pinchwise.rate(f, "1atm", 15, 10, 1.5, 0.4, 0.38, q=0.8,
                                                energy=energy), want)

    def test_rate_every_fit(self):
        for (data, model), out in self.fits.items():
            for energy in ([], ["--energy"]):
                with self.subTest(data=os.path.basename(data), model=model, energy=energy):
                    same_as_cli(self, lambda: pinchwise.rate(out, "1atm", 10, 5, 2.0, 0.5, 0.5,
                                                             energy=bool(energy)),
                                "rate", out, "--pressure", "1atm", "--stages", "10",
                                "--feed-stage", "5", "--reflux", "2", "--zf", "0.5",
                                "--distillate", "0.5", *energy)

    def test_reflux_energy(self):
        for (data, model), out in self.fits.items():
            for xd, xb, zf, q in SPLITS:
                with self.subTest(data=os.path.basename(data), model=model, split=(xd, xb, zf, q)):
                    got = same_as_cli(self, lambda: pinchwise.reflux(out, "1atm", xd, xb, zf, q=q,
                                                                     energy=True),
                                      "reflux", out, "--pressure", "1atm", "--xd", str(xd),
                                      "--xb", str(xb), "--zf", str(zf), "--q", str(q), "--energy")
                    if got is not None:
                        self.assertEqual(got["balance"], "energy")
        # without energy the balance is constant molal overflow, as before
        self.assertEqual(pinchwise.reflux(self.fits[self.DEMO, "nrtl"], "1atm", 0.95, 0.02,
                                          0.1)["balance"], "constant-molal-overflow")

    def test_reflux_energy_uncertainty(self):
        out = self.fits[self.DEMO, "nrtl"]
        want = cli("reflux", out, "--pressure", "1atm", "--xd", "0.95", "--xb", "0.02", "--zf",
                   "0.1", "--energy", "--uncertainty", "--samples", "20", "--json")
        got = pinchwise.reflux(pinchwise.fit(self.DEMO, "nrtl"), "1atm", 0.95, 0.02, 0.1,
                               energy=True, uncertainty=True, samples=20)
        self.assertEqual(got, want)
        self.assertIn("r_min_ci95", got)

    def test_refusals(self):
        out = self.fits[self.BW, "nrtl"]
        demo = self.fits[self.DEMO, "nrtl"]
        for call, words in [
            (lambda: pinchwise.lle(out, "25"), "has no unit"),
            (lambda: pinchwise.lle(out, "25C", scan="20C:120C"), "FROM:TO:N"),
            (lambda: pinchwise.lle(out, "25C", scan="20C:120C:1"), "from 2 to 1000"),
            (lambda: pinchwise.lle(out, "25C", scan="20C:20C:5"), "FROM differ from TO"),
            (lambda: pinchwise.lle(out, "25C", scan=("20C", "120C", 2.5)), "whole number"),
            (lambda: pinchwise.decanter(out, "1atm", 0.0, 0.99, 0.001), "strictly between"),
            (lambda: pinchwise.decanter(out, "1atm", 0.3, 1.5, 0.001), "mole fraction"),
            (lambda: pinchwise.decanter(out, "1", 0.3, 0.99, 0.001), "has no unit"),
            (lambda: pinchwise.rate(demo, "1atm", 2.5, 1, 1, 0.1, 0.05), "whole number"),
            (lambda: pinchwise.rate(demo, "1atm", 0, 1, 1, 0.1, 0.05), "from 1 to 100000"),
            (lambda: pinchwise.rate(demo, "1atm", 10, 11, 1, 0.1, 0.05), "feed-stage 11"),
            (lambda: pinchwise.rate(demo, "1atm", 10, 5, 1, 0.1, 1.2), "D/F"),
            (lambda: pinchwise.rate(demo, "1atm", 10, 5, 1, 0.1, 0.05, q=20), "q 20"),
            (lambda: pinchwise.rate({"model": "nrtl"}, "1atm", 10, 5, 1, 0.1, 0.05), "fit must be"),
        ]:
            with self.subTest(words=words):
                with self.assertRaises(pinchwise.PinchwiseError) as cm:
                    call()
                self.assertIn(words, str(cm.exception))

    def test_energy_needs_heat_data(self):
        """--energy with a component file without heats: refused, naming the missing column, in
        the program's words."""
        demo = self.fits[self.DEMO, "nrtl"]
        noheat = os.path.join(self.tmp.name, "noheat.csv")
        with open(noheat, "w", encoding="utf-8") as f:
            # Antoine rows as the shipped library (SVNA 7th ed. Table B.2, from memory), no heats
            f.write("name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation\n"
                    "water,16.3872,3885.70,230.170,ln,kPa,C,0,200,\"SVNA 7th ed. Table B.2 (from "
                    "memory); IAPWS-IF97\",iapws-if97\n"
                    "acetone,14.3145,2756.22,228.060,ln,kPa,C,-26,77,\"SVNA 7th ed. Table B.2 "
                    "(from memory)\",antoine\n")
        for call, args in [
            (lambda: pinchwise.rate(demo, "1atm", 10, 5, 1, 0.1, 0.05, energy=True,
                                    components=noheat),
             ["rate", demo, "--pressure", "1atm", "--stages", "10", "--feed-stage", "5",
              "--reflux", "1", "--zf", "0.1", "--distillate", "0.05"]),
            (lambda: pinchwise.reflux(demo, "1atm", 0.95, 0.02, 0.1, energy=True,
                                      components=noheat),
             ["reflux", demo, "--pressure", "1atm", "--xd", "0.95", "--xb", "0.02", "--zf",
              "0.1"]),
        ]:
            with self.subTest(command=args[0]):
                with self.assertRaises(pinchwise.PinchwiseError) as cm:
                    call()
                self.assertIn("dHvap_kJ_mol", str(cm.exception))
                code, err = cli_error(*args, "--components", noheat, "--energy")
                self.assertNotEqual(code, 0)
                self.assertIn(str(cm.exception), err)


class Errors(unittest.TestCase):
    """Failures are PinchwiseError with the library's message: file, line, what is wrong."""

    def test_bad_inputs_catalogue(self):
        base = os.path.join(SRC, "tests", "bad-inputs")
        demo = os.path.join(SRC, "datasets", "demo_acetone_water.csv")
        n = 0
        with open(os.path.join(base, "cases.tsv"), encoding="utf-8") as f:
            for line in f:
                if line.startswith("#") or not line.strip():
                    continue
                name, command, status, fragment = line.rstrip("\n").split("\t")
                if name.startswith("@") or status == "0":
                    continue
                path = os.path.join(base, "files", name)
                calls = {
                    "fit": lambda: pinchwise.fit(path, "nrtl"),
                    "check": lambda: pinchwise.check(path),
                    "components": lambda: pinchwise.fit(demo, "nrtl", components=path),
                    "reflux": lambda: pinchwise.reflux(path, "1atm", 0.95, 0.02, 0.3),
                }
                if command not in calls:  # e.g. report: a command of the program only
                    continue
                with self.subTest(file=name, command=command):
                    with self.assertRaises(pinchwise.PinchwiseError) as cm:
                        calls[command]()
                    self.assertIn(fragment, str(cm.exception))
                    n += 1
        self.assertGreater(n, 40)

    def test_parts_of_the_error(self):
        bad = os.path.join(SRC, "tests", "bad-inputs", "files", "nan_T.csv")
        with self.assertRaises(pinchwise.PinchwiseError) as cm:
            pinchwise.fit(bad, "nrtl")
        e = cm.exception
        self.assertEqual(e.file, bad)
        self.assertEqual(e.line, 8)
        self.assertEqual(str(e), "%s:%d: %s" % (bad, e.line, e.message))
        self.assertEqual(e.status, "malformed input")
        # the same words as the command line's message
        code, err = cli_error("fit", bad, "--model", "nrtl", "--out", os.devnull + ".x")
        self.assertNotEqual(code, 0)
        self.assertIn(str(e), err)

    def test_refusals(self):
        data = os.path.join(SRC, "datasets", "demo_acetone_water.csv")
        f = pinchwise.fit(data, "wilson")
        for call, words in [
            (lambda: pinchwise.reflux(f, "101.325", 0.95, 0.02, 0.1), "has no unit"),
            # (xd 0.02 < zf 0.1 < xb 0.95 is a valid split, component 1 to the bottoms; a feed
            # outside both products is not)
            (lambda: pinchwise.reflux(f, "1atm", 0.02, 0.95, 0.99), "invalid argument"),
            (lambda: pinchwise.reflux(f, "1atm", "x", 0.02, 0.1), "not a number"),
            (lambda: pinchwise.reflux(f, "1atm", float("nan"), 0.02, 0.1), "not a finite number"),
            (lambda: pinchwise.fit(data, "unknown"), "unknown model"),
            (lambda: pinchwise.azeotrope(f, pressure="1atm", temperature="50C"), "not both"),
            (lambda: pinchwise.reflux({"model": "nrtl"}, "1atm", 0.9, 0.1, 0.5), "fit must be"),
            (lambda: pinchwise.check(os.path.join(SRC, "no-such-file.csv")), "no-such-file.csv"),
        ]:
            with self.subTest(words=words):
                with self.assertRaises(pinchwise.PinchwiseError) as cm:
                    call()
                self.assertIn(words, str(cm.exception))

    def test_awkward_paths(self):
        """Names with spaces and non-ASCII letters, pathlib paths, and a NUL (refused: C would
        read only the part before it)."""
        import pathlib
        import shutil
        data = os.path.join(SRC, "datasets", "methanol_water_1atm.csv")
        with tempfile.TemporaryDirectory() as d:
            odd = os.path.join(d, "Lab files (Mörtel)", "méthanol eau.csv")
            os.mkdir(os.path.dirname(odd))
            shutil.copy(data, odd)
            out = pathlib.Path(d) / "fït out.json"
            got = pinchwise.fit(pathlib.Path(odd), "wilson", out=out)
            self.assertEqual(got["fit_file"], str(out))
            self.assertEqual(without_created(got),
                             without_created(cli("fit", odd, "--model", "wilson", "--out",
                                                 str(out), "--force", "--json")))
            with self.assertRaises(pinchwise.PinchwiseError) as cm:
                pinchwise.check(odd + "\0.csv")
            self.assertIn("NUL", str(cm.exception))
            with self.assertRaises(pinchwise.PinchwiseError) as cm:
                pinchwise.check(os.path.join(d, "Lab files (Mörtel)", "missing ü.csv"))
            self.assertIn("missing ü.csv", str(cm.exception))

    def test_existing_fit_file_is_kept(self):
        data = os.path.join(SRC, "datasets", "demo_acetone_water.csv")
        with tempfile.TemporaryDirectory() as d:
            out = os.path.join(d, "keep.json")
            with open(out, "w") as f:
                f.write("precious\n")
            with self.assertRaises(pinchwise.PinchwiseError) as cm:
                pinchwise.fit(data, "nrtl", out=out)
            self.assertIn(out, str(cm.exception))
            with open(out) as f:
                self.assertEqual(f.read(), "precious\n")
            self.assertEqual(os.listdir(d), ["keep.json"])


class SavedFit(unittest.TestCase):
    def test_save_and_reuse(self):
        data = os.path.join(SRC, "datasets", "methanol_water_1atm.csv")
        f = pinchwise.fit(data, "nrtl")
        with tempfile.TemporaryDirectory() as d:
            path = os.path.join(d, "mw.json")
            f.save(path)
            self.assertEqual(pinchwise.reflux(path, "1atm", 0.95, 0.05, 0.4),
                             pinchwise.reflux(f, "1atm", 0.95, 0.05, 0.4))
            with self.assertRaises(pinchwise.PinchwiseError):
                f.save(path)
            f.save(path, force=True)
            self.assertEqual(sorted(os.listdir(d)), ["mw.json"])


class Loading(unittest.TestCase):
    """The module finds its library by itself or through PINCHWISE_LIBRARY."""

    def run_python(self, code, env_changes):
        env = dict(os.environ)
        env["PYTHONPATH"] = os.path.join(SRC, "python")
        for k, v in env_changes.items():
            if v is None:
                env.pop(k, None)
            else:
                env[k] = v
        return subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                              env=env, cwd=tempfile.gettempdir())

    def test_environment_variable(self):
        lib = os.environ.get("PINCHWISE_LIBRARY")
        if not lib:
            self.skipTest("PINCHWISE_LIBRARY not set by the test runner")
        p = self.run_python("import pinchwise; print(pinchwise.library_path())", {})
        self.assertEqual(p.returncode, 0, p.stderr)
        self.assertEqual(p.stdout.strip(), os.path.realpath(lib))

    def test_missing_library_is_a_clear_error(self):
        p = self.run_python("import pinchwise\ntry:\n    pinchwise.version()\n"
                            "except pinchwise.PinchwiseError as e:\n    print(e)\n",
                            {"PINCHWISE_LIBRARY": "/nonexistent/libpinchwise.so"})
        self.assertEqual(p.returncode, 0, p.stderr)
        self.assertIn("not found", p.stdout)
        self.assertIn("/nonexistent/libpinchwise.so", p.stdout)

    def test_finds_the_build_tree_by_itself(self):
        built = glob.glob(os.path.join(SRC, "build", "libpinchwise.so*"))
        if not built:
            self.skipTest("no build/ folder in the source tree (built elsewhere)")
        p = self.run_python("import pinchwise; print(pinchwise.library_path())",
                            {"PINCHWISE_LIBRARY": None})
        self.assertEqual(p.returncode, 0, p.stderr)
        self.assertTrue(p.stdout.strip().startswith(os.path.join(SRC, "build")), p.stdout)

    def test_version_is_the_programs(self):
        p = subprocess.run([CLI, "--version"], capture_output=True, text=True)
        self.assertEqual(p.stdout.strip(), "pinchwise " + pinchwise.version())


class Threads(unittest.TestCase):
    """Calls release the interpreter lock and keep no state: fits on threads equal serial ones."""

    def test_threads_equal_serial(self):
        jobs = [(d, m) for d in DATASETS for m in ("wilson", "nrtl")]
        serial = [without_created(pinchwise.fit(d, m)) for d, m in jobs]
        with concurrent.futures.ThreadPoolExecutor(max_workers=4) as ex:
            par = list(ex.map(lambda j: without_created(pinchwise.fit(*j)), jobs))
        self.assertEqual(par, serial)


if __name__ == "__main__":
    unittest.main()
