#!/usr/bin/env python3
"""Tests of scripts/plot_electronics.py on the strained-lattice files written by the test suite.

Usage: python3 tests/apps/plot_electronics_test.py PATH/TO/scripts/plot_electronics.py DIRECTORY

Checks what the script writes (files, formats, exit status, messages), not the pictures. Runs the script under this
interpreter if it has numpy and matplotlib, else under /usr/bin/python3; with neither, exits 77 (skipped).
"""

import os
import subprocess
import sys
import tempfile
import unittest

SCRIPT = DIRECTORY = PYTHON = None


def has_plotting(python):
    try:
        return subprocess.run([python, "-c", "import numpy, matplotlib"], capture_output=True,
                              timeout=120).returncode == 0
    except (OSError, subprocess.TimeoutExpired):
        return False


def run(*args):
    return subprocess.run([PYTHON, SCRIPT, *args], capture_output=True, text=True, timeout=300)


class PlotElectronics(unittest.TestCase):
    def test_graphene_file_gives_strain_field_and_potential_maps(self):
        with tempfile.TemporaryDirectory() as out:
            result = run(os.path.join(DIRECTORY, "graphene_rippled_np1.xyz"), "--out", out)
            self.assertEqual(result.returncode, 0, result.stderr)
            for name in ("areal_strain", "pseudo_field", "potential"):
                for ext in ("png", "svg"):
                    path = os.path.join(out, f"graphene_rippled_np1_{name}.{ext}")
                    self.assertTrue(os.path.getsize(path) > 1000, path)
                    self.assertIn(path, result.stdout)
            self.assertFalse(any("gap_shift" in f for f in os.listdir(out)))

    def test_dichalcogenide_file_gives_a_gap_map(self):
        with tempfile.TemporaryDirectory() as out:
            result = run(os.path.join(DIRECTORY, "MoS2_rippled_np1.xyz"), "--out", out)
            self.assertEqual(result.returncode, 0, result.stderr)
            self.assertTrue(os.path.exists(os.path.join(out, "MoS2_rippled_np1_gap_shift.png")))
            self.assertFalse(any("pseudo_field" in f for f in os.listdir(out)))

    def test_bad_file_is_refused_naming_it(self):
        with tempfile.TemporaryDirectory() as out:
            bad = os.path.join(out, "not_a_lattice.xyz")
            with open(bad, "w") as f:
                f.write("2\nplain comment\nC 0 0 0\nC 1 0 0\n")
            result = run(bad, "--out", out)
            self.assertEqual(result.returncode, 2)
            self.assertIn("not_a_lattice.xyz", result.stderr)
            self.assertFalse(any(f.endswith(".png") for f in os.listdir(out)))


if __name__ == "__main__":
    SCRIPT, DIRECTORY = sys.argv.pop(1), os.path.join(sys.argv.pop(1), "lattice-export")
    PYTHON = next((p for p in (sys.executable, "/usr/bin/python3") if p and os.path.exists(p) and has_plotting(p)),
                  None)
    if PYTHON is None:
        print("plot_electronics_test: no Python with numpy and matplotlib; skipped")
        sys.exit(77)
    unittest.main()
