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
