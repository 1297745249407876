#!/usr/bin/env python3
"""Tests of scripts/plot_case.py on synthetic results of one solve.

Usage: python3 tests/apps/plot_case_test.py PATH/TO/scripts/plot_case.py

The fields are made-up closed forms (not physics and not model output), sampled on a grid as
nappe-solve's <stem>_map.csv is:
- pillar: a square cell with a rounded pillar s(r) = 5 exp(−(r/6)⁴) nm and a sheet draped over it,
  w = max(s, 5 exp(−r/9)) nm, gap = w − s, in contact where the gap is below 0.4 nm, larger principal
  strain 2 exp(−(r/7)²) − 0.3 %;
- drum: a disk of radius 20 nm without a substrate, w = 3 (1 − r²/400) nm (grid points off the disk
  absent), uniform strains;
- grating strip: 3 (or 2) rows in y, fields that depend on x only: s = cos(2πx/30) nm, w = s + 0.6 −
  0.5 cos²(…), strain 1.5 sin²(2πx/30) %.
The tests check the files, the exit status and messages, and what is drawn: the figures are rebuilt
in a probe (plot_test_support.probe) and the drawn data are compared with the numbers written here.
"""

import json
import math
import os
import unittest

import plot_test_support as support
from plot_test_support import artists, edit_lines, write_text

FIELD_COLUMNS = ["w_nm", "u_x_nm", "u_y_nm", "strain_xx", "strain_yy", "strain_xy", "principal_strain_1",
                 "principal_strain_2", "areal_strain", "shear_strain", "N_xx_N_per_m", "N_yy_N_per_m",
                 "N_xy_N_per_m", "curvature_xx_per_nm", "curvature_yy_per_nm", "curvature_xy_per_nm",
                 "curvature_max_per_nm"]
SUBSTRATE_COLUMNS = ["gap_nm", "substrate_height_nm", "adhesion_traction_MPa", "conformed"]
CONTACT_GAP = 0.4  # nm, where the synthetic sheet counts as in contact
FRACTURE = 0.25  # invented for the test


def pillar(x, y):
    r = math.hypot(x - 20, y - 20)
    s = 5 * math.exp(-(r / 6) ** 4)
    w = max(s, 5 * math.exp(-r / 9))
    e1 = 0.02 * math.exp(-(r / 7) ** 2) - 0.003
    return {"w_nm": w, "principal_strain_1": e1, "principal_strain_2": -0.4 * e1, "gap_nm": w - s,
            "substrate_height_nm": s, "conformed": 1.0 if w - s < CONTACT_GAP else 0.0}


def drum(x, y):
    r2 = x * x + y * y
    return {"w_nm": 3 * (1 - r2 / 400), "principal_strain_1": 0.004, "principal_strain_2": 0.004}


def grating(x, y):
    s = math.cos(2 * math.pi * x / 30)
    w = s + 0.6 - 0.5 * math.cos(math.pi * x / 30) ** 2
    return {"w_nm": w, "principal_strain_1": 0.015 * math.sin(2 * math.pi * x / 30) ** 2,
            "principal_strain_2": 0.0, "gap_nm": w - s, "substrate_height_nm": s,
            "conformed": 1.0 if w - s < CONTACT_GAP else 0.0}


def grid_points(xs, ys, inside=lambda x, y: True):
    return [(x, y) for y in ys for x in xs if inside(x, y)]  # rows in order of y then x


def write_case(stem, fields_at, points, material="graphene", fracture=FRACTURE, substrate=True, warnings=()):
    """Writes stem.json and stem_map.csv; returns the rows written as {column: value}."""
    header = ["x_nm", "y_nm"] + FIELD_COLUMNS + (SUBSTRATE_COLUMNS if substrate else [])
    rows = []
    for x, y in points:
        values = {c: 0.0 for c in header}
        values.update(fields_at(x, y), x_nm=x, y_nm=y)
        rows.append(values)
    write_text(stem + "_map.csv", "\n".join([",".join(header)] +
                                            [",".join(f"{r[c]:.10g}" for c in header) for r in rows]) + "\n")
    deepest = max(rows, key=lambda r: abs(r["w_nm"]))
    strained = max(rows, key=lambda r: r["principal_strain_1"])
    summary = {"program": "synthetic", "case": f"{os.path.basename(stem)} (synthetic test case)",
               "note": "synthetic", "sheet": {"material": material},
               "extremes": {"max_deflection": extreme(deepest["w_nm"], "nm", deepest),
                            "max_principal_strain": extreme(strained["principal_strain_1"], "1", strained)},
               "warnings": list(warnings)}
    if fracture is not None:
        summary["sheet"]["fracture_strain"] = {"value": fracture, "unit": "1"}
    if substrate:
        fraction = sum(r["conformed"] for r in rows) / len(rows)
        summary["conformation"] = {"verdict": "touches the floor",
                                   "conformed_fraction": {"value": fraction, "unit": "1"}}
    write_text(stem + ".json", json.dumps(summary, indent=2))
    return rows


def extreme(value, unit, row):
    return {"value": value, "unit": unit, "x": {"value": row["x_nm"], "unit": "nm"},
            "y": {"value": row["y_nm"], "unit": "nm"}}


def pillar_case(directory):
    coords = [i * 1.0 for i in range(41)]
    return write_case(os.path.join(directory, "pillar"), pillar, grid_points(coords, coords),
                      warnings=["the largest principal strain (2 %) is close to the fracture strain of the "
                                "substrate coating (synthetic warning)"])


def drum_case(directory):
    coords = [-20 + i for i in range(41)]
    return write_case(os.path.join(directory, "drum"), drum,
                      grid_points(coords, coords, lambda x, y: x * x + y * y <= 400), substrate=False,
                      fracture=None)


def grating_case(directory, rows=3):
    xs = [i * 0.5 for i in range(61)]
    return write_case(os.path.join(directory, "strip"), grating, grid_points(xs, [0.5 * j for j in range(rows)]))


# ---------------------------------------------------------------- tests

class WritesFigures(support.FigureTestCase):
    def test_pillar_cell_gives_three_maps(self):
        pillar_case(self.dir)
        self.check_run(os.path.join(self.dir, "pillar"),
                       ["pillar_deflection_map", "pillar_strain_map", "pillar_gap_map"])

    def test_disk_without_substrate_gives_two_maps(self):
        drum_case(self.dir)
        self.check_run(os.path.join(self.dir, "drum"), ["drum_deflection_map", "drum_strain_map"])

    def test_grating_strip_adds_a_line_cut(self):
        grating_case(self.dir)
        self.check_run(os.path.join(self.dir, "strip.json"),
                       ["strip_deflection_map", "strip_strain_map", "strip_gap_map", "strip_line_cut"])

    def test_two_rows_give_only_the_line_cut(self):
        grating_case(self.dir, rows=2)
        self.check_run(os.path.join(self.dir, "strip_map.csv"), ["strip_line_cut"])

    def test_out_directory(self):
        drum_case(self.dir)
        out = os.path.join(self.dir, "figures")
        self.check_run(os.path.join(self.dir, "drum"), ["drum_deflection_map", "drum_strain_map"], out=out,
                       extra=("--out", out))


def probed(make, stem):
    """What ProbedTestCase.make wants: the stem to plot and the rows written."""
    return staticmethod(lambda directory: (os.path.join(directory, stem), make(directory)))


class DrawsAGratingStrip(support.ProbedTestCase):
    make = probed(grating_case, "strip")

    def test_line_cut_is_the_csv_row_and_keeps_its_extremes(self):
        cut = self.drawn["strip_line_cut"]
        w = artists(cut, "cut:w_nm")[0]
        row = [r for r in self.written if r["y_nm"] == 0.5]
        self.assertEqual(w["x"], [r["x_nm"] for r in row])
        for drawn, r in zip(w["y"], row):
            self.assertAlmostEqual(drawn, r["w_nm"], places=8)
        self.assertAlmostEqual(max(w["y"]), max(r["w_nm"] for r in self.written), places=8)
        self.assertAlmostEqual(min(w["y"]), min(r["w_nm"] for r in self.written), places=8)
        strain = artists(cut, "cut:principal_strain_1")[0]["y"]
        self.assertAlmostEqual(max(strain), 100 * max(r["principal_strain_1"] for r in self.written), places=6)

    def test_contact_is_shaded_where_the_csv_says_so(self):
        spans = artists(self.drawn["strip_line_cut"], "contact_span", axes=0)
        self.assertTrue(spans)
        row = [r for r in self.written if r["y_nm"] == 0.5]
        for r in row:
            inside = any(s["x"][0] < r["x_nm"] < s["x"][1] for s in spans)
            self.assertEqual(inside, r["conformed"] == 1.0, r["x_nm"])

    def test_axes_carry_units(self):
        cut = self.drawn["strip_line_cut"]["axes"]
        self.assertEqual([ax["ylabel"] for ax in cut], ["height [nm]", "principal strain [%]", "gap [nm]"])
        self.assertEqual(cut[-1]["xlabel"], "x [nm]")


class DrawsAPillarCell(support.ProbedTestCase):
    make = probed(pillar_case, "pillar")

    def test_deflection_map_holds_the_csv_values(self):
        mesh = artists(self.drawn["pillar_deflection_map"], "map")[0]
        self.assertEqual(len(mesh["values"]), 41 * 41)
        for r in self.written[::37]:
            k = int(round(r["y_nm"])) * 41 + int(round(r["x_nm"]))
            self.assertAlmostEqual(mesh["values"][k], r["w_nm"], places=8)

    def test_contact_outline_separates_contact_from_gap(self):
        outline = artists(self.drawn["pillar_gap_map"], "contact_outline")
        vertices = [v for item in outline for path in item["paths"] for v in path]
        self.assertTrue(vertices)
        contact = {(r["x_nm"], r["y_nm"]): r["conformed"] for r in self.written}
        for x, y in vertices:
            # On a 0/1 field the level 0.5 lies halfway between a grid point in contact and one not.
            ends = [(math.floor(x), y), (math.ceil(x), y)] if x % 1 else [(x, math.floor(y)), (x, math.ceil(y))]
            self.assertAlmostEqual((x % 1) or (y % 1), 0.5, places=9)
            self.assertEqual(sorted(contact[e] for e in ends), [0.0, 1.0], (x, y))

    def test_extremes_are_marked_where_the_summary_puts_them(self):
        deepest = max(self.written, key=lambda r: abs(r["w_nm"]))
        mark = artists(self.drawn["pillar_deflection_map"], "extreme:max_deflection")[0]
        self.assertEqual((mark["x"][0], mark["y"][0]), (deepest["x_nm"], deepest["y_nm"]))
        legend = " ".join(self.drawn["pillar_strain_map"]["axes"][0]["legend"])
        # 2 % − 0.3 % at the pillar's centre
        self.assertIn("largest principal strain = 1.7 % at (x, y) = (20, 20) nm", legend)

    def test_warnings_are_shown(self):
        self.assertIn("synthetic warning", " ".join(self.drawn["pillar_gap_map"]["notes"]))


class DrawsADrum(support.ProbedTestCase):
    make = probed(drum_case, "drum")

    def test_grid_points_off_the_disk_stay_empty(self):
        mesh = artists(self.drawn["drum_deflection_map"], "map")[0]
        drawn = [v for v in mesh["values"] if v is not None]
        self.assertEqual(len(drawn), len(self.written))
        self.assertIsNone(mesh["values"][0], "the corner of the bounding box is off the disk")


class RejectsBadInput(support.FigureTestCase):
    def setUp(self):
        super().setUp()
        pillar_case(self.dir)
        self.stem = os.path.join(self.dir, "pillar")

    def test_short_row(self):
        edit_lines(self.stem + "_map.csv", lambda lines: lines[:5] + [lines[5].rsplit(",", 1)[0]] + lines[6:])
        self.check_rejected(self.stem, self.stem + "_map.csv", "line 6", "fields")

    def test_not_a_number(self):
        def spoil(lines):
            cells = lines[9].split(",")
            cells[lines[0].split(",").index("gap_nm")] = "n/a"
            return lines[:9] + [",".join(cells)] + lines[10:]
        edit_lines(self.stem + "_map.csv", spoil)
        self.check_rejected(self.stem, self.stem + "_map.csv", "line 10", "'gap_nm'", "'n/a'")

    def test_repeated_grid_point(self):
        edit_lines(self.stem + "_map.csv", lambda lines: lines + [lines[3]])
        self.check_rejected(self.stem, self.stem + "_map.csv", f"line {41 * 41 + 2}", "grid point of line 4")

    def test_substrate_reported_but_no_gap_column(self):
        edit_lines(self.stem + "_map.csv",
                   lambda lines: [",".join(c.replace("gap_nm", "clearance_nm") for c in lines[0].split(","))] +
                   lines[1:])
        self.check_rejected(self.stem, self.stem + "_map.csv", "line 1", "'gap_nm'", "pillar.json")

    def test_summary_without_case_title(self):
        with open(self.stem + ".json") as f:
            summary = json.load(f)
        del summary["case"]
        write_text(self.stem + ".json", json.dumps(summary, indent=2))
        self.check_rejected(self.stem, self.stem + ".json", "line 1", "'case'")

    def test_extreme_off_the_map(self):
        with open(self.stem + ".json") as f:
            summary = json.load(f)
        summary["extremes"]["max_deflection"]["x"]["value"] = 400.0
        write_text(self.stem + ".json", json.dumps(summary, indent=2))
        self.check_rejected(self.stem, self.stem + ".json", "max_deflection", "outside the grid")

    def test_bad_fracture_unit(self):
        with open(self.stem + ".json") as f:
            summary = json.load(f)
        summary["sheet"]["fracture_strain"]["unit"] = "GPa"
        text = json.dumps(summary, indent=2)
        write_text(self.stem + ".json", text)
        line = 1 + next(i for i, t in enumerate(text.splitlines()) if '"GPa"' in t)
        self.check_rejected(self.stem, self.stem + ".json", f"line {line}", "sheet.fracture_strain.unit", "'GPa'")


if __name__ == "__main__":
    support.start("plot_case")
    unittest.main(verbosity=2)
