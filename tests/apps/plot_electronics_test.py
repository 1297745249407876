#!/usr/bin/env python3
"""Tests of scripts/plot_electronics.py on the strained-lattice files written by the test suite.

Usage: python3 tests/apps/plot_electronics_test.py PATH/TO/scripts/plot_electronics.py DIRECTORY

Checks what the script writes (files, formats, exit status, messages), not the pictures. Runs the script under this
interpreter if it has numpy and matplotlib, else under /usr/bin/python3; with neither, exits 77 (skipped).
"""

import os
import sys
import tempfile
import unittest

import plot_test_support as support
from plot_test_support import run

DIRECTORY = None


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
    DIRECTORY = os.path.join(sys.argv.pop(2), "lattice-export")
    support.start("plot_electronics")
    unittest.main()
