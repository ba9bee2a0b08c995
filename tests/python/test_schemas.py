"""docs/schema/: the JSON Schemas of the fit file and of every command's --json output, checked
against what the program prints on the shipped datasets (and against documents broken on
purpose, so that a schema that accepts anything would fail here). Needs Debian's
python3-jsonschema; skipped without it."""

import copy
import glob
import json
import os
import shutil
import subprocess
import tempfile
import unittest

SRC = os.environ.get("PW_SOURCE_DIR") or os.path.abspath(
    os.path.join(os.path.dirname(__file__), "..", ".."))
CLI = os.environ.get("PINCHWISE_CLI") or os.path.join(SRC, "build", "pinchwise")
SCHEMA_DIR = os.path.join(SRC, "docs", "schema")
DATASETS = [d for d in sorted(glob.glob(os.path.join(SRC, "datasets", "*.csv")))
            if os.path.basename(d) != "components.csv"]

try:
    import jsonschema
except ImportError:  # pragma: no cover
    jsonschema = None


def load_schemas():
    schemas = {}
    for path in glob.glob(os.path.join(SCHEMA_DIR, "*.schema.json")):
        with open(path, encoding="utf-8") as f:
            schemas[os.path.basename(path)[:-len(".schema.json")]] = json.load(f)
    return schemas


def validator(schemas, name):
    """A Draft 2020-12 validator of schema `name` that resolves $ref between the files."""
    cls = jsonschema.Draft202012Validator
    try:
        import referencing
        resources = [(s["$id"], referencing.Resource.from_contents(s)) for s in schemas.values()]
        registry = referencing.Registry().with_resources(resources)
        return cls(schemas[name], registry=registry)
    except ImportError:  # jsonschema before 4.18 (Debian 12)
        store = {s["$id"]: s for s in schemas.values()}
        resolver = jsonschema.RefResolver.from_schema(schemas[name], store=store)
        return cls(schemas[name], resolver=resolver)


def run(*args, ok=True):
    p = subprocess.run([CLI, *args], capture_output=True, text=True)
    if ok and p.returncode != 0:
        raise AssertionError("pinchwise %s: %s" % (" ".join(args), p.stderr))
    return json.loads(p.stdout)


@unittest.skipIf(jsonschema is None, "python3-jsonschema is not installed")
class Schemas(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.schemas = load_schemas()
        cls.tmp = tempfile.TemporaryDirectory()
        cls.fits = []
        for data in DATASETS:
            for model in ("margules", "vanlaar", "wilson", "nrtl"):
                out = os.path.join(cls.tmp.name, "%s.%s.json" % (os.path.basename(data), model))
                cls.fits.append((data, out, run("fit", data, "--model", model, "--out", out,
                                                "--json")))

    @classmethod
    def tearDownClass(cls):
        cls.tmp.cleanup()

    def valid(self, name, doc):
        errors = sorted(validator(self.schemas, name).iter_errors(doc), key=str)
        self.assertEqual(errors, [], "%s: %s" % (name, errors[:1]))

    def invalid(self, name, doc):
        self.assertFalse(validator(self.schemas, name).is_valid(doc), name)

    def test_every_schema_is_a_schema(self):
        for name in ["fit-file", "fit", "fit-all", "fit-batch", "check", "azeotrope", "reflux",
                     "screen", "report", "lle", "decanter", "rate", "study"]:
            with self.subTest(schema=name):
                self.assertIn(name, self.schemas)
                jsonschema.Draft202012Validator.check_schema(self.schemas[name])

    def test_fit_and_fit_file(self):
        for data, out, doc in self.fits:
            with self.subTest(fit=os.path.basename(out)):
                self.valid("fit", doc)
                with open(out, encoding="utf-8") as f:
                    self.valid("fit-file", json.load(f))

    def test_study(self):
        # the shipped ethanol/water set (Perry's table), as tests/cli/test_study.sh runs it
        data = os.path.join(SRC, "datasets", "ethanol_water_1atm.csv")
        doc = run("study", data, "--pressure", "1atm", "--xd", "0.8", "--xb", "0.02", "--zf", "0.2",
                  "--out-dir", os.path.join(self.tmp.name, "study"), "--json")
        self.valid("study", doc)
        broken = dict(doc)
        del broken["chosen_model"]
        self.invalid("study", broken)

    def test_fit_all_and_batch(self):
        self.valid("fit-all", run("fit", DATASETS[0], "--model", "all", "--out-dir",
                                  os.path.join(self.tmp.name, "all"), "--json"))
        folder = os.path.join(self.tmp.name, "folder")
        os.mkdir(folder)
        for d in DATASETS:
            shutil.copy(d, folder)
        with open(os.path.join(folder, "zz_broken.csv"), "w") as f:
            f.write("# components: acetone, water\n")
        doc = run("fit", folder, "--model", "wilson", "--out-dir",
                  os.path.join(self.tmp.name, "batch"), "--json", ok=False)
        self.assertEqual(len(doc["failed"]), 1)
        self.valid("fit-batch", doc)

    def test_check(self):
        for data in DATASETS:
            with self.subTest(data=os.path.basename(data)):
                self.valid("check", run("check", data, "--json"))

    def test_azeotrope(self):
        for _, out, doc in self.fits:
            with self.subTest(fit=os.path.basename(out)):
                self.valid("azeotrope", run("azeotrope", out, "--pressure", "1atm", "--json"))
                self.valid("azeotrope", run("azeotrope", out, "--temperature", "50C", "--json"))
        # intervals from the fit's covariance (ethanol/water has an azeotrope at 1 atm)
        out = [o for d, o, _ in self.fits if "ethanol" in d and o.endswith(".nrtl.json")][0]
        doc = run("azeotrope", out, "--pressure", "1atm", "--uncertainty", "--samples", "40",
                  "--json")
        self.assertTrue(doc["azeotropes"] and "x1_ci95" in doc["azeotropes"][0])
        self.valid("azeotrope", doc)

    def test_reflux(self):
        seen = set()
        for _, out, _ in self.fits:
            for xd, xb, zf in [(0.95, 0.02, 0.1), (0.8, 0.05, 0.3), (0.99, 0.01, 0.5)]:
                doc = run("reflux", out, "--pressure", "1atm", "--xd", str(xd), "--xb", str(xb),
                          "--zf", str(zf), "--json")
                seen.add(doc["feasible"])
                with self.subTest(fit=os.path.basename(out), split=(xd, xb, zf)):
                    self.valid("reflux", doc)
        self.assertEqual(seen, {True, False})  # both shapes of the document were checked
        out = self.fits[-1][1]
        self.valid("reflux", run("reflux", out, "--pressure", "1atm", "--xd", "0.9", "--xb",
                                 "0.1", "--zf", "0.5", "--uncertainty", "--samples", "40",
                                 "--json"))

    def test_screen_and_report(self):
        for _, out, _ in self.fits:
            with self.subTest(fit=os.path.basename(out)):
                self.valid("screen", run("screen", out, "--pressure", "1atm", "--xd", "0.9",
                                         "--xb", "0.05", "--json"))
        out = self.fits[0][1]
        self.valid("report", run("report", out, "--out", os.path.join(self.tmp.name, "r.html"),
                                 "--json"))

    def test_reflux_energy(self):
        seen = set()
        for _, out, _ in self.fits:
            doc = run("reflux", out, "--pressure", "1atm", "--xd", "0.8", "--xb", "0.05", "--zf",
                      "0.3", "--energy", "--json")
            seen.add(doc["feasible"])
            with self.subTest(fit=os.path.basename(out)):
                self.assertEqual(doc["balance"], "energy")
                self.valid("reflux", doc)

    def test_lle(self):
        """Every fit at 25 C and over a scan; 1-butanol/water (NRTL) splits, Wilson never does."""
        seen = set()
        for _, out, _ in self.fits:
            with self.subTest(fit=os.path.basename(out)):
                doc = run("lle", out, "--temperature", "25C", "--json")
                seen.add(doc["split"])
                self.valid("lle", doc)
                self.valid("lle", run("lle", out, "--temperature", "90C", "--scan",
                                      "20C:120C:6", "--json"))
        self.assertEqual(seen, {True, False})

    def test_decanter(self):
        seen = set()
        for _, out, _ in self.fits:
            for rich in ("0.99", "0.3"):
                for cool in ([], ["--decanter-temperature", "30C"]):
                    doc = run("decanter", out, "--pressure", "1atm", "--zf", "0.3", "--x1-rich",
                              rich, "--x1-lean", "0.001", "--json", *cool)
                    seen.add(doc["feasible"])
                    with self.subTest(fit=os.path.basename(out), rich=rich, cool=cool):
                        self.valid("decanter", doc)
        self.assertEqual(seen, {True, False})

    def test_rate(self):
        for _, out, _ in self.fits:
            for energy in ([], ["--energy"]):
                with self.subTest(fit=os.path.basename(out), energy=energy):
                    # butanol/water: a column on the butanol-rich side, since one whose liquids
                    # enter the two-liquid region is refused (docs/heterogeneous.md)
                    zf, dist = ("0.9", "0.2") if "butanol_water" in out else ("0.5", "0.5")
                    doc = run("rate", out, "--pressure", "1atm", "--stages", "10", "--feed-stage",
                              "5", "--reflux", "2", "--zf", zf, "--distillate", dist,
                              *energy, "--json")
                    self.valid("rate", doc)

    def test_new_schemas_reject_broken_documents(self):
        bw = next(o for d, o, _ in self.fits
                  if d.endswith("butanol_water_1atm.csv") and o.endswith(".nrtl.json"))
        lle = run("lle", bw, "--temperature", "25C", "--scan", "20C:120C:3", "--json")
        self.assertTrue(lle["split"])
        broken = copy.deepcopy(lle)
        broken["x1"] = None  # a split without its layers
        self.invalid("lle", broken)
        broken = copy.deepcopy(lle)
        broken["x1"] = [0.1, 1.2]
        self.invalid("lle", broken)
        broken = copy.deepcopy(lle)
        del broken["critical"]
        self.invalid("lle", broken)
        dec = run("decanter", bw, "--pressure", "1atm", "--zf", "0.3", "--x1-rich", "0.99",
                  "--x1-lean", "0.001", "--json")
        self.assertTrue(dec["feasible"])
        broken = copy.deepcopy(dec)
        broken["columns"] = broken["columns"][:1]
        self.invalid("decanter", broken)
        broken = copy.deepcopy(dec)
        broken["feasible"] = False  # infeasible with columns and no reason
        self.invalid("decanter", broken)
        broken = copy.deepcopy(dec)
        broken["columns"][0]["pinch"]["kind"] = "somewhere"
        self.invalid("decanter", broken)
        rate = run("rate", bw, "--pressure", "1atm", "--stages", "10", "--feed-stage", "5",
                   "--reflux", "2", "--zf", "0.9", "--distillate", "0.2", "--json")
        broken = copy.deepcopy(rate)
        broken["balance"] = "something-else"
        self.invalid("rate", broken)
        broken = copy.deepcopy(rate)
        del broken["stages"]
        self.invalid("rate", broken)

    def test_schemas_reject_broken_documents(self):
        # the demo data: the split below is feasible there
        data, out, fit = next(t for t in self.fits if t[0].endswith("demo_acetone_water.csv"))
        broken = copy.deepcopy(fit)
        del broken["ln_gamma_inf"]
        self.invalid("fit", broken)
        with open(out, encoding="utf-8") as f:
            whole = json.load(f)
        broken = copy.deepcopy(whole)
        broken["format"] = "something-else"
        self.invalid("fit-file", broken)
        broken = copy.deepcopy(whole)
        broken["data"]["points"][0]["x1"] = 1.5
        self.invalid("fit-file", broken)
        reflux = run("reflux", out, "--pressure", "1atm", "--xd", "0.95", "--xb", "0.02", "--zf",
                     "0.1", "--json")
        broken = copy.deepcopy(reflux)
        broken["pinch"]["kind"] = "somewhere"
        self.invalid("reflux", broken)
        broken = copy.deepcopy(reflux)
        broken["feasible"] = False  # infeasible with an r_min and no reason
        self.invalid("reflux", broken)
        az = {"azeotropes": [{"x1": 0.5, "T_K": 350.0, "P_kPa": 101.3, "kind": "sideways"}]}
        self.invalid("azeotrope", az)
        self.invalid("check", {"tests": [{"name": "x"}], "consistent": True})
        # extra keys are allowed everywhere: others add keys to these documents
        extended = copy.deepcopy(reflux)
        extended["a_key_added_later"] = [1, 2, 3]
        self.valid("reflux", extended)


if __name__ == "__main__":
    unittest.main()
