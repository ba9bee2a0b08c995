"""examples/rank_models.py (the worked example of docs/python.md) runs on the shipped datasets
and picks, for each file, the model that `pinchwise fit --model all` ranks first."""

import glob
import json
import os
import subprocess
import sys
import tempfile
import unittest

SRC = os.environ.get("PW_SOURCE_DIR") or os.path.abspath(
    os.path.join(os.path.dirname(__file__), "..", ".."))
CLI = os.environ.get("PINCHWISE_CLI") or os.path.join(SRC, "build", "pinchwise")


class RankModelsExample(unittest.TestCase):
    def test_table_matches_the_command_line_ranking(self):
        env = dict(os.environ, PYTHONPATH=os.path.join(SRC, "python"))
        p = subprocess.run([sys.executable, os.path.join(SRC, "examples", "rank_models.py"),
                            os.path.join(SRC, "datasets")], capture_output=True, text=True,
                           env=env)
        self.assertEqual(p.returncode, 0, p.stderr)
        rows = {line.split()[0]: line.split() for line in p.stdout.splitlines()[1:]}
        datasets = [d for d in sorted(glob.glob(os.path.join(SRC, "datasets", "*.csv")))
                    if os.path.basename(d) != "components.csv"]
        self.assertEqual(sorted(rows), sorted(os.path.basename(d) for d in datasets))
        with tempfile.TemporaryDirectory() as tmp:
            for d in datasets:
                q = subprocess.run([CLI, "fit", d, "--model", "all", "--out-dir", tmp, "--force",
                                    "--json"], capture_output=True, text=True)
                self.assertEqual(q.returncode, 0, q.stderr)
                with self.subTest(data=os.path.basename(d)):
                    self.assertEqual(rows[os.path.basename(d)][1], json.loads(q.stdout)["best"])


if __name__ == "__main__":
    unittest.main()
