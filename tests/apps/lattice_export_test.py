#!/usr/bin/env python3
"""Checks the strained-lattice files written by strained_lattice_export_test with general-purpose libraries.

Usage: python3 tests/apps/lattice_export_test.py DIRECTORY   (DIRECTORY holds lattice-export/*.xyz, *.cif)

- ASE (Debian python3-ase) reads the extended XYZ files: atom counts, pbc, cell and the per-atom columns.
- spglib (Debian python3-spglib) finds the space group of the unstrained periodic cells: graphene P6/mmm (191),
  hBN and 1H-MoS2 P-6m2 (187) (layer symmetries of the honeycomb and 1H monolayers in a 3D cell with vacuum;
  International Tables for Crystallography Vol. A, space groups 191 and 187; from memory).
- gemmi (Debian python3-gemmi) reads the CIF files: the same atoms at the same positions as the XYZ file.
- The files written on 1 and 2 MPI ranks hold the same atoms in the same order.

Runs under this interpreter if it has the three libraries, else under /usr/bin/python3; with neither, exits 77
(skipped).
"""

import json
import os
import subprocess
import sys
import unittest

MODULES = "import ase.io, spglib, gemmi, numpy"


def has_modules(python):
    try:
        return subprocess.run([python, "-c", MODULES], capture_output=True, timeout=120).returncode == 0
    except (OSError, subprocess.TimeoutExpired):
        return False


if __name__ == "__main__" and os.environ.get("NAPPE_LATTICE_TEST_CHILD") != "1":
    for candidate in (sys.executable, "/usr/bin/python3"):
        if candidate and os.path.exists(candidate) and has_modules(candidate):
            env = dict(os.environ, NAPPE_LATTICE_TEST_CHILD="1")
            sys.exit(subprocess.run([candidate, __file__] + sys.argv[1:], env=env).returncode)
    print("lattice_export_test: no Python with ase, spglib, gemmi and numpy (Debian python3-ase, python3-spglib, "
          "python3-gemmi); skipped")
    sys.exit(77)

import ase.io  # noqa: E402
import gemmi  # noqa: E402
import numpy  # noqa: E402
import spglib  # noqa: E402

DIRECTORY = None
CELLS = {"graphene": (240, 191), "hBN": (240, 187), "MoS2": (360, 187)}


def path(name, ranks=1, ext="xyz"):
    return os.path.join(DIRECTORY, "lattice-export", f"{name}_np{ranks}.{ext}")


class LatticeFiles(unittest.TestCase):
    def test_unstrained_cells_have_the_lattice_space_group(self):
        for material, (count, group) in CELLS.items():
            atoms = ase.io.read(path(f"{material}_cell"), format="extxyz")
            self.assertEqual(len(atoms), count, material)
            self.assertEqual(list(atoms.pbc), [True, True, False], material)
            cell = (atoms.cell[:], atoms.get_scaled_positions(wrap=True), atoms.numbers)
            dataset = spglib.get_symmetry_dataset(cell, symprec=1e-4)
            self.assertEqual(dataset["number"], group, f"{material}: {dataset['international']}")

    def test_no_atom_is_duplicated_across_cell_edges(self):
        for material in CELLS:
            atoms = ase.io.read(path(f"{material}_cell"), format="extxyz")
            distances = atoms.get_all_distances(mic=True)
            numpy.fill_diagonal(distances, numpy.inf)
            self.assertGreater(distances.min(), 1.3, material)  # Å; the shortest bond is C–C 1.42 Å

    def test_cif_holds_the_same_atoms_as_the_xyz_file(self):
        for name in ["graphene_cell", "hBN_cell", "MoS2_cell", "graphene_rippled", "MoS2_rippled", "graphene_flake"]:
            atoms = ase.io.read(path(name), format="extxyz")
            structure = gemmi.read_small_structure(path(name, ext="cif"))
            self.assertEqual(len(structure.sites), len(atoms), name)
            for length, ase_length in zip((structure.cell.a, structure.cell.b, structure.cell.c),
                                          atoms.cell.lengths()):
                self.assertAlmostEqual(length, ase_length, places=5)
            fractional = numpy.array([[s.fract.x, s.fract.y, s.fract.z] for s in structure.sites])
            difference = fractional - atoms.cell.scaled_positions(atoms.positions)
            self.assertLess(numpy.abs(difference).max(), 1e-7, name)
            symbols = [s.type_symbol for s in structure.sites]
            self.assertEqual(symbols, atoms.get_chemical_symbols(), name)

    def test_strained_files_carry_strain_and_field_columns(self):
        graphene = ase.io.read(path("graphene_rippled"), format="extxyz")
        for column in ("strain_xx", "strain_yy", "strain_xy", "pseudo_magnetic_field_K_T", "deformation_potential_eV"):
            self.assertIn(column, graphene.arrays)
        self.assertGreater(numpy.abs(graphene.arrays["strain_xx"]).max(), 1e-3)
        mos2 = ase.io.read(path("MoS2_rippled"), format="extxyz")
        self.assertIn("gap_shift_meV", mos2.arrays)
        # The trace-only model: gap shift = -99 meV/% x tr(strain)/2 (Lloyd et al., Nano Lett. 16, 5836 (2016)).
        trace = mos2.arrays["strain_xx"] + mos2.arrays["strain_yy"]
        numpy.testing.assert_allclose(mos2.arrays["gap_shift_meV"], -9900 * trace / 2, rtol=1e-6, atol=1e-6)
        flake = ase.io.read(path("graphene_flake"), format="extxyz")
        self.assertEqual(list(flake.pbc), [False, False, False])

    def test_biaxially_strained_mos2_case_gives_the_published_gap_shift(self):
        # nappe-solve on tests/apps/data/mos2_biaxial_lattice.prm: 1 % equibiaxial strain, so every atom carries
        # -99 meV (Lloyd et al., Nano Letters 16, 5836 (2016): 99 meV per % of biaxial strain).
        name = os.path.join(DIRECTORY, "lattice-export", "mos2-biaxial_lattice.xyz")
        if not os.path.exists(name):
            self.skipTest("app.solve.mos2_biaxial_lattice did not run")
        atoms = ase.io.read(name, format="extxyz")
        self.assertEqual(len(atoms), 360)
        numpy.testing.assert_allclose(atoms.arrays["gap_shift_meV"], -99.0, rtol=1e-9)
        numpy.testing.assert_allclose(atoms.cell.lengths()[:2], [1.01 * 31.60, 1.01 * 32.839683], rtol=1e-7)

    def test_egg_carton_maps_are_the_models_applied_to_the_solved_strain(self):
        # nappe-solve on examples/mos2_egg_carton_gap.prm (coarsened). The gap shift is the trace model, -99/2 meV per %
        # of tr(strain) (Lloyd et al., Nano Letters 16, 5836 (2016) calibration), applied to nappe's solved strain:
        # at every atom of the lattice file, at every point of the map (<stem>_map.csv, the quantity table's fields on
        # a grid), and for the extreme of the summary, which sits where the areal strain is largest.
        base = os.path.join(DIRECTORY, "lattice-export", "egg-carton")
        if not os.path.exists(base + "_lattice.xyz"):
            self.skipTest("app.solve.egg_carton_lattice did not run")
        atoms = ase.io.read(base + "_lattice.xyz", format="extxyz")
        trace = atoms.arrays["strain_xx"] + atoms.arrays["strain_yy"]
        self.assertGreater(trace.max(), 0.01)  # a conformed corrugation, not a flat sheet
        numpy.testing.assert_allclose(atoms.arrays["gap_shift_meV"], -9900 * trace / 2, rtol=1e-6, atol=1e-9)
        table = numpy.genfromtxt(base + "_map.csv", delimiter=",", names=True)
        map_trace = table["strain_xx"] + table["strain_yy"]
        self.assertGreater(map_trace.max(), 0.01)
        numpy.testing.assert_allclose(table["gap_shift_meV"], -9900 * map_trace / 2, rtol=1e-6, atol=1e-6)
        with open(base + ".json", encoding="utf-8") as f:
            summary = json.load(f)
        self.assertEqual(summary["conformation"]["verdict"], "conforms")
        extremes = summary["extremes"]
        self.assertEqual(extremes["min_gap_shift"]["unit"], "meV")
        areal = extremes["max_areal_strain"]
        self.assertGreater(areal["value"], 0.0)
        self.assertAlmostEqual(extremes["min_gap_shift"]["value"] / (-9900 * areal["value"] / 2), 1.0, places=6)
        for axis in ("x", "y"):
            self.assertAlmostEqual(extremes["min_gap_shift"][axis]["value"], areal[axis]["value"], places=6)
        self.assertEqual(summary["strained_lattice"]["atoms"], len(atoms))
        # The graphene file: V = g tr(strain) with g = 4 eV (catalogue; Choi, Jhi & Son, PRB 81, 081407(R) (2010)).
        graphene = ase.io.read(path("graphene_rippled"), format="extxyz")
        numpy.testing.assert_allclose(graphene.arrays["deformation_potential_eV"],
                                      4.0 * (graphene.arrays["strain_xx"] + graphene.arrays["strain_yy"]),
                                      rtol=1e-6, atol=1e-9)

    def test_one_and_two_ranks_write_the_same_atoms(self):
        for name in ["graphene_cell", "MoS2_rippled", "graphene_flake"]:
            if not os.path.exists(path(name, 2)):
                self.skipTest("no 2-rank files")
            one, two = (ase.io.read(path(name, r), format="extxyz") for r in (1, 2))
            self.assertEqual(one.get_chemical_symbols(), two.get_chemical_symbols(), name)
            numpy.testing.assert_allclose(one.positions, two.positions, atol=1e-9)


if __name__ == "__main__":
    DIRECTORY = sys.argv.pop(1)
    unittest.main()
