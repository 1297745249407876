#!/usr/bin/env python3
"""Tests of scripts/plot_limits.py on synthetic threshold searches.

Usage: python3 tests/apps/plot_limits_test.py PATH/TO/scripts/plot_limits.py

The paths are made-up (not physics and not model output): Γ on a geometric ladder from 0.02 to
2 J/m². Lowering from the conformed state the fraction stays 1 down to Γ_hold = 0.2 J/m², jumps to
0.35 and then falls as 0.35 (Γ/0.2)^0.5; raising from the laid-down state it rises as 0.1 (Γ/0.02)^0.45,
jumps once on the way (0.12 J/m², +0.08) and jumps to 1 at Γ_snap = 0.5 J/m². The report states
those thresholds by their brackets (the two ladder values around each jump; the value is their
geometric mean) and Γ_eq = 0.3 J/m²; the
transitions list names the three jumps. The tests check the files, the exit status and messages, and
what is drawn (rebuilt in a probe, plot_test_support.probe) against the numbers written here.
"""

import json
import os
import tempfile
import unittest

import plot_test_support as support
from plot_test_support import artists, edit_lines, write_text

CASE_GAMMA = 0.45
TARGET = 0.99
HOLD, SNAP, EQ = 0.2, 0.5, 0.3
STEP_UP = 0.12  # Γ of the small jump on the raising path


def ladder():
    return [0.02 * 100 ** (i / 40) for i in range(41)]


def down_states():
    states = []
    for g in reversed(ladder()):
        f = 1.0 if g >= HOLD else 0.35 * (g / HOLD) ** 0.5
        states.append((g, f, bool(states) and states[-1][1] == 1.0 and f < 1.0))
    return states


def up_states():
    states = []
    for g in ladder():
        f = 1.0 if g >= SNAP else min(0.1 * (g / 0.02) ** 0.45 + (0.08 if g >= STEP_UP else 0.0), 0.9)
        previous = states[-1][0] if states else None
        jump = previous is not None and ((previous < SNAP <= g) or (previous < STEP_UP <= g))
        states.append((g, f, jump))
    return states


def bracket_of(states):
    """(Γ before, Γ after) of each jump of a path."""
    return [(states[i - 1][0], states[i][0], states[i - 1][1], states[i][1]) for i in range(1, len(states))
            if states[i][2]]


def quantity(value, unit="J/m^2"):
    return {"value": value, "unit": unit}


def threshold(value, lower, upper, meaning):
    return {"meaning": meaning, "found": True, "value": quantity(value), "lower": quantity(lower),
            "upper": quantity(upper), "how": "bracketed by two states"}


def write_limits(directory, transitions=True, snap_found=True):
    stem = os.path.join(directory, "grating")
    header = ("path,gamma_J_per_m2,energy_J_per_m2,stretching_J_per_m2,bending_J_per_m2,adhesion_J_per_m2,"
              "conformed_fraction,raised_contact_fraction,floor_contact_fraction,floor_touched,max_gap_nm,"
              "max_deflection_nm,max_principal_strain,min_principal_strain,max_areal_strain,after_jump")
    lines = [header]
    for kind, states in (("down", down_states()), ("up", up_states())):
        for g, f, jump in states:
            lines.append(f"{kind},{g:.10g},{-g * f:.6g},0.01,0.001,{-g * f - 0.011:.6g},{f:.10g},{f / 2:.6g},"
                         f"{f / 2:.6g},{f:.6g},{2 * (1 - f):.6g},1.5,{0.02 * f:.6g},0,{0.02 * f:.6g},{int(jump)}")
    write_text(stem + "_adhesion_paths.csv", "\n".join(lines) + "\n")
    hold_lo, hold_hi = sorted(bracket_of(down_states())[0][:2])
    snap_lo, snap_hi = sorted(bracket_of(up_states())[1][:2])
    report = {"program": "synthetic", "case": "graphene on a grating (synthetic thresholds)", "note": "synthetic",
              "material": "graphene", "topography": "sinusoidal grating (synthetic)",
              "case_work_of_adhesion": quantity(CASE_GAMMA), "target_conformed_fraction": quantity(TARGET, "1"),
              "gamma_hold": threshold((hold_lo * hold_hi) ** 0.5, hold_lo, hold_hi, "lowered"),
              "gamma_eq": threshold(EQ, 0.29, 0.31, "equal energy"),
              "gamma_snap": threshold((snap_lo * snap_hi) ** 0.5, snap_lo, snap_hi, "raised") if snap_found else
              {"meaning": "raised", "found": False, "how": "the laid-down sheet does not conform in the range"}}
    if transitions:
        report["transitions"] = [
            {"path": kind, "gamma_lower": quantity(min(a, b)), "gamma_upper": quantity(max(a, b)), "kind": name,
             "fraction_before": fa, "fraction_after": fb, "energy_released": quantity(0.004, "J/m^2")}
            for kind, states, name in (("down", down_states(), "the sheet lets go of the floor"),
                                       ("up", up_states(), "the sheet snaps onto the floor"))
            for a, b, fa, fb in bracket_of(states)]
    write_text(stem + "_limits.json", json.dumps(report, indent=2))
    return stem


# ---------------------------------------------------------------- tests

class WritesFigures(support.FigureTestCase):
    def test_loop_is_written(self):
        stem = write_limits(self.dir)
        self.check_run(stem, ["grating_adhesion_loop"])

    def test_file_names_are_accepted_as_the_stem(self):
        stem = write_limits(self.dir)
        self.check_run(stem + "_adhesion_paths.csv", ["grating_adhesion_loop"])

    def test_report_without_transitions(self):
        stem = write_limits(self.dir, transitions=False)
        self.check_run(stem + "_limits.json", ["grating_adhesion_loop"])

    def test_threshold_not_found(self):
        stem = write_limits(self.dir, snap_found=False)
        self.check_run(stem, ["grating_adhesion_loop"])


class DrawsTheLoop(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.tmp = tempfile.TemporaryDirectory(prefix="plot_limits_test.")
        cls.drawn = support.probe(write_limits(cls.tmp.name))["grating_adhesion_loop"]
        bare = os.path.join(cls.tmp.name, "bare")
        os.makedirs(bare)
        cls.bare = support.probe(write_limits(bare, transitions=False, snap_found=False))["grating_adhesion_loop"]

    @classmethod
    def tearDownClass(cls):
        cls.tmp.cleanup()

    def check_path(self, kind, states):
        """Continuous pieces hold the states between jumps; each jump is an arrow, never a line."""
        loop = self.drawn["axes"][0]["artists"]
        jumps = [i for i, (_, _, jump) in enumerate(states) if jump]
        starts = [0] + jumps
        for n, start in enumerate(starts):
            stop = starts[n + 1] if n + 1 < len(starts) else len(states)
            piece = loop[f"{kind}:piece{n}"][0]
            self.assertEqual(len(piece["x"]), stop - start, f"{kind} piece {n}")
            for (g, f, _), x, y in zip(states[start:stop], piece["x"], piece["y"]):
                self.assertAlmostEqual(x, g, places=8)
                self.assertAlmostEqual(y, 100 * f, places=6)
        self.assertNotIn(f"{kind}:piece{len(starts)}", loop)
        for i in jumps:
            arrow = loop[f"{kind}:jump{i}"][0]
            self.assertAlmostEqual(arrow["from"][0], states[i - 1][0], places=8)
            self.assertAlmostEqual(arrow["to"][0], states[i][0], places=8)
            self.assertAlmostEqual(arrow["to"][1], 100 * states[i][1], places=6)

    def test_lowering_path_with_its_jump(self):
        self.check_path("down", down_states())

    def test_raising_path_with_its_jumps(self):
        self.check_path("up", up_states())

    def test_thresholds_and_brackets_where_the_report_puts_them(self):
        with open(os.path.join(self.tmp.name, "grating_limits.json")) as f:
            report = json.load(f)
        for key in ("gamma_hold", "gamma_eq", "gamma_snap"):
            line = artists(self.drawn, f"threshold:{key}", axes=0)[0]
            self.assertEqual(line["x"], [report[key]["value"]["value"]] * 2, key)
            band = artists(self.drawn, f"bracket:{key}", axes=0)[0]
            self.assertAlmostEqual(band["x"][0], report[key]["lower"]["value"], places=10)
            self.assertAlmostEqual(band["x"][1], report[key]["upper"]["value"], places=10)
            self.assertEqual(len(artists(self.drawn, f"threshold:{key}", axes=1)), 1, "also on the strain panel")

    def test_case_gamma_and_target_fraction(self):
        self.assertEqual(artists(self.drawn, "case_gamma", axes=0)[0]["x"], [CASE_GAMMA] * 2)
        self.assertEqual(artists(self.drawn, "target", axes=0)[0]["y"], [100 * TARGET] * 2)

    def test_transitions_are_marked_and_explained(self):
        jumps = bracket_of(down_states()) + bracket_of(up_states())
        for n, (a, b, before, after) in enumerate(jumps, start=1):
            span = artists(self.drawn, f"transition{n}", axes=0)[0]
            self.assertAlmostEqual(span["x"][0], min(a, b), places=9)
            self.assertAlmostEqual(span["x"][1], max(a, b), places=9)
        notes = self.drawn["notes"]
        self.assertEqual(len(notes), len(jumps))
        self.assertIn("the sheet lets go of the floor", notes[0])
        self.assertIn("releases 0.004 J/m²", notes[0])

    def test_strain_panel_follows_the_paths(self):
        strain = self.drawn["axes"][1]
        self.assertEqual(strain["ylabel"], "largest principal\nstrain [%]")
        piece = strain["artists"]["down:piece0"][0]
        self.assertAlmostEqual(max(piece["y"]), 100 * 0.02, places=6)

    def test_without_transitions_and_a_missing_threshold(self):
        self.assertEqual([g for ax in self.bare["axes"] for g in ax["artists"] if g.startswith("transition")], [])
        self.assertEqual(artists(self.bare, "threshold:gamma_snap"), [])
        self.assertIn("Γ_snap not found: the laid-down sheet does not conform in the range", self.bare["notes"])

    def test_axes_carry_units_and_log_scale(self):
        self.assertEqual(self.drawn["axes"][0]["ylabel"], "conformed fraction [%]")
        self.assertEqual(self.drawn["axes"][1]["xlabel"], "work of adhesion Γ [J/m²]")
        self.assertEqual(self.drawn["axes"][0]["xscale"], "log", "Γ spans two decades")


class RejectsBadInput(support.FigureTestCase):
    def setUp(self):
        super().setUp()
        self.stem = write_limits(self.dir)
        self.json = self.stem + "_limits.json"

    def edit_report(self, edit):
        with open(self.json) as f:
            report = json.load(f)
        edit(report)
        text = json.dumps(report, indent=2)
        write_text(self.json, text)
        return text.splitlines()

    def test_found_threshold_without_value(self):
        lines = self.edit_report(lambda r: r["gamma_hold"].pop("value"))
        line = 1 + next(i for i, t in enumerate(lines) if '"gamma_hold"' in t)
        self.check_rejected(self.stem, self.json, f"line {line}", "gamma_hold.value")

    def test_value_outside_its_bracket(self):
        self.edit_report(lambda r: r["gamma_eq"]["value"].update(value=0.5))
        self.check_rejected(self.stem, self.json, "'gamma_eq'", "lower <= value <= upper")

    def test_unknown_gamma_unit(self):
        lines = self.edit_report(lambda r: r["case_work_of_adhesion"].update(unit="eV"))
        line = 1 + next(i for i, t in enumerate(lines) if '"eV"' in t)
        self.check_rejected(self.stem, self.json, f"line {line}", "case_work_of_adhesion.unit", "J/m^2")

    def test_transition_on_an_unknown_path(self):
        lines = self.edit_report(lambda r: r["transitions"][1].update(path="sideways"))
        line = 1 + next(i for i, t in enumerate(lines) if '"sideways"' in t)
        self.check_rejected(self.stem, self.json, f"line {line}", "transitions[1].path", "'down' or 'up'")

    def test_bad_jump_flag(self):
        path = self.stem + "_adhesion_paths.csv"
        edit_lines(path, lambda lines: lines[:7] + [lines[7].rsplit(",", 1)[0] + ",2"] + lines[8:])
        self.check_rejected(self.stem, path, "line 8", "'after_jump'", "0 or 1")

    def test_missing_paths_file(self):
        os.remove(self.stem + "_adhesion_paths.csv")
        self.check_rejected(self.stem, self.stem + "_adhesion_paths.csv", "not found")


if __name__ == "__main__":
    support.start("plot_limits")
    unittest.main(verbosity=2)
