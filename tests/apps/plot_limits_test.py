#!/usr/bin/env python3
"""Tests of scripts/plot_limits.py on synthetic threshold searches and on two real nappe-limits outputs.

Usage: python3 tests/apps/plot_limits_test.py PATH/TO/scripts/plot_limits.py

The paths are made-up (not physics and not model output): Γ on a geometric ladder from 0.02 to
2 J/m². Lowering from the conformed state the fraction stays 1 down to Γ_hold = 0.2 J/m², jumps to
0.35 and then falls as 0.35 (Γ/0.2)^0.5; raising from the laid-down state it rises as 0.1 (Γ/0.02)^0.45,
jumps once on the way (0.12 J/m², +0.08) and jumps to 1 at Γ_snap = 0.5 J/m². The report states
those thresholds by their brackets (the two ladder values around each jump; the value is their
geometric mean) and Γ_eq = 0.3 J/m²; the
transitions list names the three jumps. The tests check the files, the exit status and messages, and
what is drawn (rebuilt in a probe, plot_test_support.probe) against the numbers written here.

The real outputs are in tests/apps/data/limits/ (how they were made: README.md there): demo-grating, the
short demo of app.limits.demo_short with three transitions (two on the lowering path, one on the raising
path), and demo-no-jumps, the same case over a Γ range without a jump (an empty transitions list). Their
transitions are checked against the report and, independently, against the states around each jump in
the paths file.
"""

import csv
import json
import math
import os
import tempfile
import unittest

import plot_test_support as support
from plot_test_support import artists, edit_lines, run, write_text

CASE_GAMMA = 0.45
TARGET = 0.99
HOLD, SNAP, EQ = 0.2, 0.5, 0.3
STEP_UP = 0.12  # Γ of the small jump on the raising path
REAL = os.path.join(os.path.dirname(os.path.abspath(__file__)), "data", "limits")


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

    def test_many_transitions_make_the_figure_taller(self):
        """A note a transition: 30 of them do not fit below the axes of the usual figure (7.8 in at 150 dpi)."""
        stem = write_limits(self.dir)
        heights = {}
        for copies in (1, 10):
            with open(stem + "_limits.json", encoding="utf-8") as f:
                report = json.load(f)
            report["transitions"] = report["transitions"][:3] * copies
            write_text(stem + "_limits.json", json.dumps(report))
            self.assertEqual(run(stem).returncode, 0)
            with open(stem + "_adhesion_loop.png", "rb") as f:
                heights[copies] = int.from_bytes(f.read(24)[20:24], "big")  # PNG IHDR: width, then height
        self.assertEqual(heights[1], round(7.8 * 150))
        # The axes keep three quarters of the 7.8 in; below them 30 notes and the footer, one line of 8 pt each
        # (1.35 line spacing), and 0.1 in.
        self.assertAlmostEqual(heights[10], (0.75 * 7.8 + 0.1 + 31 * 8 * 1.35 / 72) * 150, delta=2)


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
            bar = artists(self.drawn, f"transition{n}:bar", axes=0)[0]
            self.assertAlmostEqual(bar["x"][0], math.sqrt(a * b), places=9)
            self.assertAlmostEqual(bar["y"][0], 100 * before, places=6)
            self.assertAlmostEqual(bar["y"][1], 100 * after, places=6)
        notes = self.drawn["notes"]
        self.assertEqual(len(notes), len(jumps))
        self.assertIn("the sheet lets go of the floor", notes[0])
        self.assertIn("releases 0.004 J/m²", notes[0])

    def test_a_kind_nappe_does_not_name_keeps_its_own_words(self):
        legend = [text.replace("\n", " ") for text in self.drawn["axes"][0]["legend"]]
        self.assertIn("the sheet lets go of the floor (lowering Γ)", legend)
        self.assertIn("the sheet snaps onto the floor (raising Γ)", legend)

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


def read_real(name):
    """The report and the paths file (rows as dicts) of a real nappe-limits output, read without the script."""
    stem = os.path.join(REAL, name)
    with open(stem + "_limits.json", encoding="utf-8") as f:
        report = json.load(f)
    with open(stem + "_adhesion_paths.csv", newline="", encoding="utf-8") as f:
        rows = list(csv.DictReader(f))
    return stem, report, rows


def jumps_in_paths_file(rows):
    """(path, state before, state after) of each row the paths file marks with a transition kind."""
    found = []
    for i, row in enumerate(rows):
        if row["transition"]:
            assert row["after_jump"] == "1" and i > 0 and rows[i - 1]["path"] == row["path"], row
            found.append((row["path"], rows[i - 1], row))
    return found


class DrawsRealTransitions(unittest.TestCase):
    """The short demo's output: every transition of the report is drawn where the paths file puts its jump."""

    @classmethod
    def setUpClass(cls):
        cls.stem, cls.report, cls.rows = read_real("demo-grating")
        cls.drawn = support.probe(cls.stem)["demo-grating_adhesion_loop"]
        cls.transitions = cls.report["transitions"]

    def bar(self, n):
        bars = artists(self.drawn, f"transition{n}:bar", axes=0)
        self.assertEqual(len(bars), 1, f"transition {n}")
        return bars[0]

    def test_fixture_has_transitions_on_both_paths(self):
        self.assertEqual([t["path"] for t in self.transitions], ["down", "down", "up"])
        self.assertEqual(len(jumps_in_paths_file(self.rows)), len(self.transitions))

    def test_every_transition_has_one_bar_and_one_kind_marker(self):
        loop = self.drawn["axes"][0]["artists"]
        self.assertEqual(sorted(g for g in loop if g.endswith(":bar")),
                         [f"transition{n}:bar" for n in range(1, len(self.transitions) + 1)])
        self.assertEqual(sorted(g for g in loop if g.endswith(":kind")),
                         [f"transition{n}:kind" for n in range(1, len(self.transitions) + 1)])

    def test_bars_stand_in_the_bracket_from_the_fraction_before_to_after(self):
        for n, t in enumerate(self.transitions, start=1):
            bar = self.bar(n)
            lower, upper = t["gamma_lower"]["value"], t["gamma_upper"]["value"]
            self.assertEqual(bar["x"][0], bar["x"][1], "a vertical bar")
            self.assertTrue(lower <= bar["x"][0] <= upper, f"transition {n}: {bar['x'][0]} in [{lower}, {upper}]")
            self.assertAlmostEqual(bar["y"][0], 100 * t["fraction_before"]["value"], places=6)
            self.assertAlmostEqual(bar["y"][1], 100 * t["fraction_after"]["value"], places=6)
            marker = artists(self.drawn, f"transition{n}:kind", axes=0)[0]
            self.assertEqual((marker["x"][0], marker["y"][0]), (bar["x"][1], bar["y"][1]), "marker at the after end")

    def test_bars_join_the_states_around_each_jump_of_the_paths_file(self):
        for n, (path, before, after) in enumerate(jumps_in_paths_file(self.rows), start=1):
            bar = self.bar(n)
            gammas = sorted((float(before["gamma_J_per_m2"]), float(after["gamma_J_per_m2"])))
            self.assertTrue(gammas[0] <= bar["x"][0] <= gammas[1], f"transition {n}")
            self.assertAlmostEqual(bar["y"][0], 100 * float(before["conformed_fraction"]), places=6)
            self.assertAlmostEqual(bar["y"][1], 100 * float(after["conformed_fraction"]), places=6)
            self.assertEqual(self.transitions[n - 1]["kind"], after["transition"])

    def test_paths_are_told_apart_by_colour(self):
        colour = {kind: artists(self.drawn, f"{kind}:piece0", axes=0)[0]["colour"] for kind in ("down", "up")}
        self.assertNotEqual(colour["down"], colour["up"])
        for n, t in enumerate(self.transitions, start=1):
            self.assertEqual(self.bar(n)["colour"], colour[t["path"]], f"transition {n}")
            self.assertEqual(artists(self.drawn, f"transition{n}:kind", axes=0)[0]["colour"], colour[t["path"]])

    def test_each_kind_has_its_marker_and_a_legend_entry_in_words(self):
        legend = [text.replace("\n", " ") for text in self.drawn["axes"][0]["legend"]]
        marks = self.drawn["axes"][0]["legend_marks"]
        expected = {"partial depinning (lowering Γ): the edge of the contact jumps; the kind of contact stays",
                    "lift-off from the floor (lowering Γ): the sheet leaves the floor, still held on the tops",
                    "snap into conformation (raising Γ): the sheet snaps onto the whole surface"}
        self.assertEqual({text for text in legend if " Γ): " in text}, expected)
        markers = {}
        for n, t in enumerate(self.transitions, start=1):
            drawn = artists(self.drawn, f"transition{n}:kind", axes=0)[0]
            markers[t["kind"]] = drawn["marker"]
            entry = next(i for i, text in enumerate(legend) if text.startswith(t["kind"] + " ("))
            self.assertEqual((marks[entry]["marker"], marks[entry]["colour"]), (drawn["marker"], drawn["colour"]))
        self.assertEqual(len(set(markers.values())), len(markers), f"one marker a kind: {markers}")

    def test_brackets_are_shaded_on_both_panels(self):
        for n, t in enumerate(self.transitions, start=1):
            for axes in (0, 1):
                span = artists(self.drawn, f"transition{n}", axes=axes)[0]
                self.assertAlmostEqual(span["x"][0], t["gamma_lower"]["value"], places=9)
                self.assertAlmostEqual(span["x"][1], t["gamma_upper"]["value"], places=9)

    def test_notes_give_the_bracket_fractions_contact_and_energy(self):
        # The same numbers as nappe-limits' own transition table for this run (console output).
        notes = self.drawn["notes"]
        self.assertIn("2: lift-off from the floor (lowering Γ, between 0.1206 and 0.1213 J/m²; conformed "
                      "fraction 83 % → 42 %; contact on raised parts + floor 50 % + 33 % → 42 % + 0 %; "
                      "releases 0.0292 J/m²)", notes)
        self.assertTrue(notes[2].startswith("3: snap into conformation (raising Γ, between 0.2317 and 0.233 J/m²; "
                                            "conformed fraction 58 % → 100 %"), notes[2])

    def test_axes_carry_units(self):
        self.assertEqual(self.drawn["axes"][0]["ylabel"], "conformed fraction [%]")
        self.assertEqual(self.drawn["axes"][1]["ylabel"], "largest principal\nstrain [%]")
        self.assertEqual(self.drawn["axes"][1]["xlabel"], "work of adhesion Γ [J/m²]")


class PlotsRealOutputs(support.FigureTestCase):
    def test_output_with_transitions_is_written(self):
        self.check_run(os.path.join(REAL, "demo-grating"), ["demo-grating_adhesion_loop"], extra=("--out", self.dir))

    def test_output_without_transitions_is_written_without_marks(self):
        stem, report, rows = read_real("demo-no-jumps")
        self.assertEqual(report["transitions"], [])
        self.assertEqual(jumps_in_paths_file(rows), [])
        self.check_run(stem + "_limits.json", ["demo-no-jumps_adhesion_loop"], extra=("--out", self.dir))
        drawn = support.probe(stem)["demo-no-jumps_adhesion_loop"]
        self.assertEqual([g for ax in drawn["axes"] for g in ax["artists"] if g.startswith("transition")], [])
        self.assertEqual([text for text in drawn["axes"][0]["legend"] if "Γ):" in text.replace("\n", " ")], [])
        self.assertEqual([text for text in drawn["axes"][0]["legend"] if text.startswith("jump")], [],
                         "no jump drawn, none in the legend")
        with_jumps = support.probe(os.path.join(REAL, "demo-grating"))["demo-grating_adhesion_loop"]
        self.assertEqual(len([t for t in with_jumps["axes"][0]["legend"] if t.startswith("jump")]), 1)
        self.assertEqual(len(artists(drawn, "down:piece0", axes=0)[0]["x"]), 3, "the lowering path's three states")


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
