#!/usr/bin/env python3
"""Tests of scripts/plot_sweep.py on synthetic sweep directories.

Usage: python3 tests/apps/plot_sweep_test.py PATH/TO/scripts/plot_sweep.py

The sweep data are synthetic (made-up closed forms, not physics and not model output): a
sinusoidal grating of amplitude A and period L with k = 2π/L; largest principal strain
s·(Ak)²/4 with a stiffness factor s per material; Γ_hold = 1.2 s·(Ak)² J/m², Γ_eq = 1.3 Γ_hold,
Γ_snap = 1.6 Γ_hold; conformed fraction f = 1 / (1 + (Γ_hold/Γ)³) at the point's own Γ; floor
touched = (f − 0.4)/0.5 clipped to [0, 1]; regime: conforms if f ≥ 0.99, suspended if f < 0.05,
tents on the tops if the floor is untouched, else touches the floor. The materials, their Γ and
fracture strains are invented for the test (not catalogue values).

The tests check what the script writes (files, exit status, messages) and what it draws: the
figures are rebuilt in a probe (plot_test_support.probe) and the drawn data are compared with
the numbers written here.

Runs the script under this interpreter if it has numpy and matplotlib, else under /usr/bin/python3;
with neither it exits 77 (skipped).
"""

import csv
import json
import math
import os
import unittest

import plot_test_support as support
from plot_test_support import artists, edit_lines, write_text

CASE_GAMMA = 0.45
TARGET = 0.99
FIGURES = ("regime_map", "peak_strain")
THRESHOLD_FIGURES = ("gamma_hold", "gamma_fraction")
REGIMES = ("conforms", "touches the floor", "tents on the tops", "suspended")
# Invented per-material data: (Γ of the interface [J/m²], fracture strain [-] or None, stiffness factor).
MATERIALS = {"graphene": (0.45, 0.25, 1.0), "MoS2": (0.27, 0.06, 1.8), "WSe2": (0.20, None, 2.2)}
MATERIAL_ORDER = ["graphene", "MoS2", "WSe2"]  # the sweep file's order (not sorted)
AMPLITUDES = [0.25, 0.5, 0.75, 1.0]
PERIODS = [5.0, 10.0, 15.0, 20.0]
MEASURES = ["max_gap_nm", "max_deflection_nm", "max_principal_strain", "min_principal_strain", "max_areal_strain",
            "max_shear_strain", "max_curvature_per_nm", "max_mean_curvature_per_nm"]


# ---------------------------------------------------------------- synthetic sweeps

def synthetic(amplitude, period, material="graphene", gamma=None):
    """Made-up responses of one grating point (see the module docstring); Γ is the material's unless given."""
    material_gamma, fracture, stiffness = MATERIALS[material]
    gamma = gamma or material_gamma
    ak = amplitude * 2 * math.pi / period
    hold = 1.2 * stiffness * ak ** 2
    fraction = 1 / (1 + (hold / gamma) ** 3)
    floor = min(max((fraction - 0.4) / 0.5, 0.0), 1.0)
    regime = ("conforms" if fraction >= TARGET else "suspended" if fraction < 0.05 else
              "tents on the tops" if floor == 0 else "touches the floor")
    strain = stiffness * ak ** 2 / 4
    values = {"regime": regime, "work_of_adhesion_J_per_m2": gamma, "fracture_strain": fracture,
              "conformed_fraction": fraction, "raised_contact_fraction": fraction * (1 - floor / 2),
              "floor_contact_fraction": fraction * floor / 2, "floor_touched": floor,
              "max_gap_nm": amplitude * (1 - fraction), "max_deflection_nm": amplitude,
              "max_principal_strain": strain, "min_principal_strain": -strain / 3, "max_areal_strain": strain * 4 / 3,
              "max_shear_strain": strain / 2, "max_curvature_per_nm": ak ** 2 / amplitude,
              "max_mean_curvature_per_nm": ak ** 2 / amplitude / 2, "energy_J_per_m2": 0.1 * ak ** 2,
              "gamma_hold_J_per_m2": hold, "gamma_snap_J_per_m2": 1.6 * hold, "gamma_eq_J_per_m2": 1.3 * hold}
    return values


def path_rows(hold):
    """Made-up down/up paths: the sheet lets go below Γ_hold (a jump down), snaps on at 1.6 Γ_hold (a jump up)."""
    gammas = [hold * 10 ** (-1 + 2 * i / 20) for i in range(21)]
    down = [(g, 1.0 if g >= hold else 0.4 * (g / hold) ** 2) for g in reversed(gammas)]
    up = [(g, 1.0 if g >= 1.6 * hold else 0.4 * (g / (1.6 * hold)) ** 2) for g in gammas]
    rows = []
    for kind, states in (("down", down), ("up", up)):
        for i, (g, f) in enumerate(states):
            jump = i > 0 and abs(f - states[i - 1][1]) > 0.3
            rows.append((kind, g, f, jump))
    return rows


class SweepWriter:
    """Writes sweep.json, sweep.csv and path files for points given as tuples of axis values."""

    def __init__(self, directory, axes, thresholds, substrate=True):
        self.directory, self.axes, self.thresholds, self.substrate = directory, axes, thresholds, substrate
        os.makedirs(os.path.join(directory, "points"), exist_ok=True)

    def columns(self):
        conformation = ["conformed_fraction", "raised_contact_fraction", "floor_contact_fraction", "floor_touched",
                        "max_gap_nm"] if self.substrate else []
        measures = [m for m in MEASURES if m != "max_gap_nm"]
        gammas = ["gamma_hold_J_per_m2", "gamma_snap_J_per_m2", "gamma_eq_J_per_m2"] if self.thresholds else []
        return (["status", "regime", "work_of_adhesion_J_per_m2", "fracture_strain"] + conformation + measures +
                ["energy_J_per_m2"] + gammas + ["message"])

    def write(self, points, failed=(), skip=()):
        meta = {"title": "sheets on a sinusoidal grating (synthetic)", "note": "synthetic test data",
                "case_file": "grating.prm", "axes": self.axes, "target_fraction": TARGET,
                "thresholds": self.thresholds}
        write_text(os.path.join(self.directory, "sweep.json"), json.dumps(meta, indent=2))
        header = ["point"] + [f"axis_{i + 1}" for i in range(len(self.axes))] + self.columns()
        lines = []
        for number, coords in enumerate(points, start=1):
            if coords not in skip:
                lines.append(self.row(number, coords, coords in failed))
        write_text(os.path.join(self.directory, "sweep.csv"),
                   "\n".join([",".join(header)] + list(reversed(lines))) + "\n")  # rows in any order

    def values_of(self, coords):
        named = {a["name"]: c for a, c in zip(self.axes, coords)}
        return synthetic(named.get("amplitude", 0.5), named.get("period", 10.0),
                         named.get("sheet material", "graphene"), named.get("work of adhesion"))

    def row(self, number, coords, failed):
        values = self.values_of(coords)
        cells = [str(number)] + [f'"{c}"' if isinstance(c, str) else f"{c:g}" for c in coords]
        for column in self.columns():
            if column == "status":
                cells.append("failed" if failed else "ok")
            elif column == "message":
                cells.append('"Newton did not converge, last residual 3e-4 N"' if failed else '""')
            elif column == "regime" and not self.substrate:
                cells.append("")
            elif failed and column not in ("work_of_adhesion_J_per_m2", "fracture_strain"):
                cells.append("")
            else:
                value = values[column]
                cells.append("" if value is None else value if isinstance(value, str) else f"{value:.8g}")
        if self.thresholds and not failed:
            self.write_path(number, values["gamma_hold_J_per_m2"])
        return ",".join(cells)

    def write_path(self, number, hold):
        header = ("path,gamma_J_per_m2,energy_J_per_m2,stretching_J_per_m2,bending_J_per_m2,adhesion_J_per_m2,"
                  "conformed_fraction,raised_contact_fraction,floor_contact_fraction,floor_touched,max_gap_nm,"
                  "max_deflection_nm,max_principal_strain,after_jump")
        lines = [header] + [f"{kind},{g:.8g},{-g * f:.6g},0.01,0.001,{-g * f:.6g},{f:.8g},{f:.6g},0,0,0.5,1,0.01,"
                            f"{int(jump)}" for kind, g, f, jump in path_rows(hold)]
        write_text(os.path.join(self.directory, "points", f"point-{number:04d}_path.csv"), "\n".join(lines) + "\n")


def numeric_axis(name, parameter, values, unit="nm"):
    return {"parameter": f"Topography/Sinusoidal grating/{parameter}", "name": name, "unit": unit,
            "categorical": False, "values": values}


def material_axis():
    return {"parameter": "Sheet/Material", "name": "sheet material", "unit": "", "categorical": True,
            "values": MATERIAL_ORDER}


AMPLITUDES_1D = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1.0, 1.3, 1.6, 2.0]


def sweep_1d(directory, thresholds, substrate=True):
    points = [(a,) for a in AMPLITUDES_1D]
    SweepWriter(directory, [numeric_axis("amplitude", "Amplitude", AMPLITUDES_1D)], thresholds, substrate).write(
        points, failed={(0.6,)})


def sweep_2d(directory, thresholds, irregular=False):
    points = [(a, p) for p in PERIODS for a in AMPLITUDES]
    skip = {(0.75, 5.0), (1.0, 5.0), (1.0, 10.0)} if irregular else set()
    SweepWriter(directory, [numeric_axis("amplitude", "Amplitude", AMPLITUDES),
                            numeric_axis("period", "Wavelength", PERIODS)], thresholds).write(
        points, failed={(0.5, 15.0)}, skip=skip)


GAMMAS = [0.2, 0.3, 0.45, 0.6]


def sweep_gamma_axis(directory):
    """Amplitude × the work of adhesion itself: each point has its own Γ, both axes numeric."""
    axes = [numeric_axis("amplitude", "Amplitude", AMPLITUDES),
            {"parameter": "Adhesion/Work of adhesion", "name": "work of adhesion", "unit": "J/m²",
             "categorical": False, "values": GAMMAS}]
    SweepWriter(directory, axes, True).write([(a, g) for g in GAMMAS for a in AMPLITUDES])


def sweep_materials(directory, thresholds):
    """Materials (categorical, with their own Γ and fracture strain) × amplitude."""
    points = [(m, a) for a in AMPLITUDES for m in MATERIAL_ORDER]
    SweepWriter(directory, [material_axis(), numeric_axis("amplitude", "Amplitude", AMPLITUDES)],
                thresholds).write(points, failed={("WSe2", 0.25)})
    return [p for p in points if p != ("WSe2", 0.25)]


def sweep_materials_1d(directory):
    points = [(m,) for m in MATERIAL_ORDER]
    SweepWriter(directory, [material_axis()], True).write(points)
    return points


# ---------------------------------------------------------------- tests

def xy_set(items):
    """Where drawn items mark points: scatter positions, or the centres of cell outlines."""
    found = set()
    for item in items:
        centres = item["xy"] if item["kind"] == "collection" else [[sum(item["x"]) / 2, sum(item["y"]) / 2]]
        found |= {tuple(round(v, 9) for v in xy) for xy in centres}
    return found


class WritesFigures(support.FigureTestCase):
    def test_one_axis_with_thresholds(self):
        sweep_1d(self.dir, thresholds=True)
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES)

    def test_one_axis_without_thresholds(self):
        sweep_1d(self.dir, thresholds=False)
        self.check_run(self.dir, FIGURES)

    def test_without_substrate_there_is_no_regime_map(self):
        sweep_1d(self.dir, thresholds=False, substrate=False)
        self.check_run(self.dir, ("peak_strain",))

    def test_two_axes_with_thresholds(self):
        sweep_2d(self.dir, thresholds=True)
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES)

    def test_two_axes_without_thresholds(self):
        sweep_2d(self.dir, thresholds=False)
        self.check_run(self.dir, FIGURES)

    def test_irregular_grid(self):
        sweep_2d(self.dir, thresholds=True, irregular=True)
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES)

    def test_thresholds_without_path_files(self):
        sweep_2d(self.dir, thresholds=True)
        for name in os.listdir(os.path.join(self.dir, "points")):
            os.remove(os.path.join(self.dir, "points", name))
        self.check_run(self.dir, FIGURES + ("gamma_hold",))

    def test_out_directory(self):
        sweep_1d(self.dir, thresholds=True)
        out = os.path.join(self.dir, "figures")
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES, out=out, extra=("--out", out))
        self.assertEqual(support.figure_files(self.dir), [])

    def test_material_axis_with_thresholds(self):
        sweep_materials(self.dir, thresholds=True)
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES)

    def test_one_material_axis(self):
        sweep_materials_1d(self.dir)
        self.check_run(self.dir, FIGURES + THRESHOLD_FIGURES)


class DrawsAMaterialSweep(support.ProbedTestCase):
    make = staticmethod(lambda directory: (directory, sweep_materials(directory, thresholds=True)))

    def test_material_axis_is_drawn_as_named_categories_in_file_order(self):
        for stem in FIGURES + ("gamma_hold",):
            ax = self.drawn[stem]["axes"][0]
            self.assertEqual(ax["xticks"], MATERIAL_ORDER, stem)
            self.assertEqual(ax["xtick_positions"], [0.0, 1.0, 2.0], stem)
            self.assertEqual(ax["xlabel"], "sheet material", stem)
            self.assertEqual(ax["ylabel"], "amplitude [nm]", stem)
            contours = [gid for gid in ax["artists"] if "contour" in gid]
            self.assertEqual(contours, [], f"{stem}: no contour across a categorical axis")

    def test_cells_hold_each_points_own_strain(self):
        values = artists(self.drawn["peak_strain"], "cells")[0]["values"]
        self.assertEqual(len(values), len(AMPLITUDES) * len(MATERIAL_ORDER))
        for j, a in enumerate(AMPLITUDES):
            for i, m in enumerate(MATERIAL_ORDER):
                drawn = values[j * len(MATERIAL_ORDER) + i]
                if (m, a) == ("WSe2", 0.25):
                    self.assertIsNone(drawn, "a failed point is not drawn as a value")
                else:
                    self.assertAlmostEqual(drawn, 100 * synthetic(a, 10.0, m)["max_principal_strain"], places=5)

    def test_points_above_their_own_fracture_strain_are_marked(self):
        drawn = self.drawn["peak_strain"]
        expected = {(float(MATERIAL_ORDER.index(m)), a) for m, a in self.written
                    if MATERIALS[m][1] is not None and synthetic(a, 10.0, m)["max_principal_strain"] > MATERIALS[m][1]}
        self.assertTrue(expected, "the synthetic sweep must have points above their fracture strain")
        self.assertEqual(xy_set(artists(drawn, "above_fracture")), expected)
        legend = " ".join(drawn["axes"][0]["legend"])
        self.assertIn("graphene 25 %", legend)
        self.assertIn("MoS2 6 %", legend)
        self.assertIn("WSe2 unknown", legend)

    def test_points_held_down_at_their_own_gamma_are_marked(self):
        drawn = self.drawn["gamma_hold"]
        held = {(float(MATERIAL_ORDER.index(m)), a) for m, a in self.written
                if synthetic(a, 10.0, m)["gamma_hold_J_per_m2"] <= MATERIALS[m][0]}
        loose = {(float(MATERIAL_ORDER.index(m)), a) for m, a in self.written} - held
        self.assertTrue(held and loose)
        # A cell map outlines the cells that need more than their own Γ; the others are held down.
        self.assertEqual(xy_set(artists(drawn, "not_held")), loose)
        self.assertEqual(artists(drawn, "held"), [])
        self.assertIn("graphene 0.45 J/m²", " ".join(drawn["axes"][0]["legend"]))

    def test_every_regime_has_its_own_colour(self):
        mesh = artists(self.drawn["regime_map"], "regime_cells")[0]
        colour_of = {}
        for j, a in enumerate(AMPLITUDES):
            for i, m in enumerate(MATERIAL_ORDER):
                if (m, a) != ("WSe2", 0.25):
                    regime = synthetic(a, 10.0, m)["regime"]
                    colour = tuple(mesh["colours"][j * len(MATERIAL_ORDER) + i])
                    self.assertEqual(colour_of.setdefault(regime, colour), colour, regime)
        self.assertEqual(set(colour_of), set(REGIMES), "the synthetic sweep must show all four regimes")
        self.assertEqual(len(set(colour_of.values())), 4)


class DrawsAOneAxisSweep(support.ProbedTestCase):
    make = staticmethod(lambda directory: (directory, sweep_1d(directory, thresholds=True)))

    def test_regime_rows_follow_the_fixed_order(self):
        ax = self.drawn["regime_map"]["axes"][0]
        self.assertEqual(ax["yticks"], ["failed"] + list(reversed(REGIMES)))
        for regime in REGIMES:
            rows = {xy[1] for item in ax["artists"].get(regime, []) for xy in item["xy"]}
            self.assertEqual(rows, {float(len(REGIMES) - 1 - REGIMES.index(regime))}, regime)

    def test_strain_line_is_the_csv_column(self):
        line = artists(self.drawn["peak_strain"], "strain")[0]
        self.assertEqual(line["x"], AMPLITUDES_1D)
        for a, y in zip(AMPLITUDES_1D, line["y"]):
            if a == 0.6:
                self.assertIsNone(y)
            else:
                self.assertAlmostEqual(y, 100 * synthetic(a, 10.0)["max_principal_strain"], places=5)

    def test_paths_are_drawn_with_jumps_not_joined(self):
        drawn = self.drawn["gamma_fraction"]["axes"][0]["artists"]
        hold = synthetic(AMPLITUDES_1D[0], 10.0)["gamma_hold_J_per_m2"]
        rows = [r for r in path_rows(hold) if r[0] == "down"]
        jumps = [i for i, r in enumerate(rows) if r[3]]
        self.assertEqual(len(jumps), 1)
        arrow = drawn[f"point1:down:jump{jumps[0]}"][0]
        self.assertAlmostEqual(arrow["from"][0], rows[jumps[0] - 1][1], places=6)
        self.assertAlmostEqual(arrow["to"][0], rows[jumps[0]][1], places=6)
        pieces = [drawn[f"point1:down:piece{n}"][0]["x"] for n in range(2)]
        self.assertEqual(len(pieces[0]) + len(pieces[1]), len(rows))
        self.assertAlmostEqual(pieces[0][-1], rows[jumps[0] - 1][1], places=6)
        self.assertAlmostEqual(pieces[1][0], rows[jumps[0]][1], places=6)


class DrawsATwoAxisSweep(support.ProbedTestCase):
    make = staticmethod(lambda directory: (directory, sweep_2d(directory, thresholds=True)))

    def test_shared_gamma_is_a_contour_at_that_gamma(self):
        hold = {(a, p): synthetic(a, p)["gamma_hold_J_per_m2"] for a in AMPLITUDES for p in PERIODS}
        check_contour(self, artists(self.drawn["gamma_hold"], "gamma_contour"), hold, AMPLITUDES, PERIODS,
                      CASE_GAMMA)


class DrawsAGammaAxisSweep(support.ProbedTestCase):
    make = staticmethod(lambda directory: (directory, sweep_gamma_axis(directory)))

    def test_own_gamma_gives_the_contour_where_hold_equals_it(self):
        self.assertEqual(artists(self.drawn["gamma_hold"], "gamma_contour"), [], "Γ differs between points")
        ratio = {(a, g): synthetic(a, 10.0)["gamma_hold_J_per_m2"] / g for a in AMPLITUDES for g in GAMMAS}
        check_contour(self, artists(self.drawn["gamma_hold"], "gamma_ratio_contour"), ratio, AMPLITUDES, GAMMAS,
                      1.0)


def check_contour(test, contour, values, xs, ys, level):
    """A contour of a grid function: its vertices on grid lines are where the linear interpolation along
    the line equals the level (the label's gap adds vertices elsewhere, which are skipped)."""
    test.assertTrue(contour, "the contour is drawn")
    vertices = [v for item in contour for path in item["paths"] for v in path]
    on_lines = [(x, y) for x, y in vertices if on_line(x, xs) is not None or on_line(y, ys) is not None]
    test.assertGreaterEqual(len(on_lines), 4)
    for x, y in on_lines:
        test.assertAlmostEqual(interpolated_on_grid_lines(values, xs, ys, x, y), level, delta=1e-6 * level)


def on_line(u, grid_values):
    """The grid value u lies on, or None."""
    return next((g for g in grid_values if abs(u - g) <= 1e-9 * max(grid_values)), None)


def interpolate(along, free, value_at):
    k = max(i for i, g in enumerate(along[:-1]) if g <= free + 1e-12)
    t = (free - along[k]) / (along[k + 1] - along[k])
    return (1 - t) * value_at(along[k]) + t * value_at(along[k + 1])


def interpolated_on_grid_lines(values, xs, ys, x, y):
    """Linear interpolation of a grid function {(x, y): value} at a point on a grid line."""
    if on_line(x, xs) is not None:
        return interpolate(ys, y, lambda v: values[(on_line(x, xs), v)])
    return interpolate(xs, x, lambda v: values[(v, on_line(y, ys))])


class RejectsBadInput(support.FigureTestCase):
    def setUp(self):
        super().setUp()
        sweep_materials(self.dir, thresholds=True)
        self.csv = os.path.join(self.dir, "sweep.csv")

    def edit_table(self, edit):
        with open(self.csv, newline="") as f:
            rows = list(csv.reader(f))
        edit(rows)
        with open(self.csv, "w", newline="") as f:
            csv.writer(f, lineterminator="\n").writerows(rows)

    def spoil_cell(self, line_index, column, text):
        def spoil(rows):
            rows[line_index][rows[0].index(column)] = text
        self.edit_table(spoil)

    def test_missing_column(self):
        def drop(rows):
            k = rows[0].index("gamma_eq_J_per_m2")
            for row in rows:
                del row[k]
        self.edit_table(drop)
        self.check_rejected(self.dir, self.csv, "line 1", "missing column", "gamma_eq_J_per_m2")

    def test_older_format_is_named(self):
        edit_lines(self.csv, lambda lines: [lines[0].replace("max_principal_strain", "peak_principal_strain")] +
                   lines[1:])
        self.check_rejected(self.dir, self.csv, "line 1", "peak_principal_strain", "older")

    def test_not_a_number(self):
        self.spoil_cell(2, "conformed_fraction", "abc")
        self.check_rejected(self.dir, self.csv, "line 3", "'conformed_fraction'", "not a number", "'abc'")

    def test_unknown_regime(self):
        self.spoil_cell(4, "regime", "partially conformed")
        self.check_rejected(self.dir, self.csv, "line 5", "'regime'", "tents on the tops")

    def test_negative_work_of_adhesion(self):
        self.spoil_cell(3, "work_of_adhesion_J_per_m2", "-0.2")
        self.check_rejected(self.dir, self.csv, "line 4", "'work_of_adhesion_J_per_m2'", "positive")

    def test_unknown_material_name(self):
        edit_lines(self.csv, lambda lines: lines[:2] + [lines[2].replace('"MoS2"', '"MoSe2"').replace(
            '"graphene"', '"MoSe2"').replace('"WSe2"', '"MoSe2"')] + lines[3:])
        self.check_rejected(self.dir, self.csv, "line 3", "'MoSe2'", "sheet material", "graphene, MoS2, WSe2")

    def test_categorical_values_must_be_names(self):
        path = os.path.join(self.dir, "sweep.json")
        with open(path) as f:
            meta = json.load(f)
        meta["axes"][0]["values"] = [1, 2, 3]
        write_text(path, json.dumps(meta, indent=2))
        with open(path) as f:
            line = 1 + next(i for i, text in enumerate(f) if '"values"' in text)
        self.check_rejected(self.dir, path, f"line {line}", "axes[0].values", "names")

    def test_missing_sweep_json(self):
        os.remove(os.path.join(self.dir, "sweep.json"))
        self.check_rejected(self.dir, os.path.join(self.dir, "sweep.json"), "not found")

    def test_bad_path_file(self):
        path = os.path.join(self.dir, "points", "point-0001_path.csv")
        edit_lines(path, lambda lines: lines[:3] + ["sideways" + lines[3][lines[3].index(","):]] + lines[4:])
        self.check_rejected(self.dir, path, "line 4", "'path'", "'down' or 'up'")

    def test_numeric_axis_value_not_in_sweep_json(self):
        self.spoil_cell(1, "axis_2", "0.3")
        self.check_rejected(self.dir, self.csv, "line 2", "axis_2", "amplitude", "0.25, 0.5, 0.75, 1")


if __name__ == "__main__":
    support.start("plot_sweep")
    unittest.main(verbosity=2)
