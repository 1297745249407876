#!/usr/bin/env python3
"""Tests of scripts/plot_sweep.py on synthetic sweep directories.

Usage: python3 tests/apps/plot_sweep_test.py PATH/TO/scripts/plot_sweep.py

The sweep data are synthetic (made-up closed forms, not physics and not model output): a
sinusoidal grating of amplitude A and period L with k = 2π/L, peak strain (Ak)²/4,
Γ_hold = 1.2 (Ak)² J/m², Γ_eq = 1.3 Γ_hold, Γ_snap = 1.6 Γ_hold, conformed fraction
1 / (1 + (Γ_hold/Γ)³) at the case Γ. The tests check what the script writes (files, formats,
exit status, messages), not the numbers in the figures.

The script runs under this interpreter if it has numpy and matplotlib, else under
/usr/bin/python3 (Debian's python3-matplotlib lives there when a pyenv python3 comes
first on PATH). With neither, the test exits 77 (skipped).
"""

import json
import math
import os
import subprocess
import sys
import tempfile
import unittest

SCRIPT = None
PYTHON = None
CASE_GAMMA = 0.45
FIGURES = ("regime_map", "peak_strain")
THRESHOLD_FIGURES = ("gamma_hold", "gamma_fraction")
BASE_COLUMNS = ["status", "regime", "conformed_fraction", "peak_principal_strain", "max_areal_strain",
                "max_shear_strain", "max_gap_nm", "energy_J_per_m2"]
GAMMA_COLUMNS = ["gamma_hold_J_per_m2", "gamma_snap_J_per_m2", "gamma_eq_J_per_m2"]


def has_plotting(python):
    try:
        return subprocess.run([python, "-c", "import numpy, matplotlib"], capture_output=True,
                              timeout=120).returncode == 0
    except (OSError, subprocess.TimeoutExpired):
        return False


def pick_python():
    for candidate in (sys.executable, "/usr/bin/python3"):
        if candidate and os.path.exists(candidate) and has_plotting(candidate):
            return candidate
    return None


# ---------------------------------------------------------------- synthetic sweeps

def synthetic(amplitude, period):
    """Made-up smooth responses of one grating point (see the module docstring)."""
    ak = amplitude * 2 * math.pi / period
    hold = 1.2 * ak ** 2
    fraction = 1 / (1 + (hold / CASE_GAMMA) ** 3)
    regime = "conforms" if fraction >= 0.99 else "suspended" if fraction < 0.05 else "partially conformed"
    return {"regime": regime, "conformed_fraction": fraction, "peak_principal_strain": ak ** 2 / 4,
            "max_areal_strain": ak ** 2 / 3, "max_shear_strain": ak ** 2 / 8, "max_gap_nm": amplitude * (1 - fraction),
            "energy_J_per_m2": 0.1 * ak ** 2, "gamma_hold_J_per_m2": hold, "gamma_snap_J_per_m2": 1.6 * hold,
            "gamma_eq_J_per_m2": 1.3 * hold}


def path_rows(amplitude, period):
    """Made-up down/up paths: the sheet lets go below Γ_hold (down), snaps on at Γ_snap (up)."""
    hold = synthetic(amplitude, period)["gamma_hold_J_per_m2"]
    gammas = [hold * 10 ** (-1 + 2 * i / 20) for i in range(21)]
    down = [(g, 1.0 if g >= hold else (g / hold) ** 2) for g in reversed(gammas)]
    up = [(g, 1.0 if g >= 1.6 * hold else 0.5 * (g / (1.6 * hold)) ** 2) for g in gammas]
    return [("down", g, f) for g, f in down] + [("up", g, f) for g, f in up]


def axis(name, parameter, values):
    return {"parameter": f"Topography/Sinusoidal grating/{parameter}", "name": name, "unit": "nm", "values": values}


def write_sweep(directory, axes, points, thresholds, failed=(), skip=()):
    """Writes sweep.json, sweep.csv and path files; `points` are tuples of axis values."""
    os.makedirs(os.path.join(directory, "points"), exist_ok=True)
    meta = {"title": "graphene on a sinusoidal grating (synthetic)", "axes": axes,
            "work_of_adhesion_J_per_m2": CASE_GAMMA, "fracture_strain": 0.25, "target_fraction": 0.99,
            "thresholds": thresholds}
    with open(os.path.join(directory, "sweep.json"), "w") as f:
        json.dump(meta, f, indent=2)
    columns = BASE_COLUMNS + (GAMMA_COLUMNS if thresholds else [])
    header = ["point"] + [f"axis_{i + 1}" for i in range(len(axes))] + columns
    lines = [",".join(header)]
    for number, coords in enumerate(points, start=1):
        if coords in skip:
            continue
        lines.append(csv_line(number, coords, columns, coords in failed))
        if thresholds and coords not in failed:
            write_path(directory, number, coords)
    lines = [lines[0]] + list(reversed(lines[1:]))  # rows in any order
    with open(os.path.join(directory, "sweep.csv"), "w") as f:
        f.write("\n".join(lines) + "\n")


def csv_line(number, coords, columns, failed):
    amplitude, period = coords if len(coords) == 2 else (coords[0], 10.0)
    values = synthetic(amplitude, period)
    cells = [str(number)] + [f"{c:g}" for c in coords]
    for column in columns:
        if column == "status":
            cells.append("failed" if failed else "ok")
        elif failed:
            cells.append("")
        else:
            value = values[column]
            cells.append(value if isinstance(value, str) else f"{value:.6g}")
    return ",".join(cells)


def write_path(directory, number, coords):
    amplitude, period = coords if len(coords) == 2 else (coords[0], 10.0)
    lines = ["path,gamma_J_per_m2,conformed_fraction,energy_J_per_m2,peak_principal_strain"]
    lines += [f"{kind},{g:.6g},{f:.6g},,{0.01 * f:.6g}" for kind, g, f in path_rows(amplitude, period)]
    with open(os.path.join(directory, "points", f"point-{number:04d}_path.csv"), "w") as f:
        f.write("\n".join(lines) + "\n")


AMPLITUDES = [0.25, 0.5, 0.75, 1.0]
PERIODS = [5.0, 10.0, 15.0, 20.0]


def sweep_1d(directory, thresholds):
    points = [(a,) for a in [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8]]
    write_sweep(directory, [axis("amplitude", "Amplitude", [p[0] for p in points])], points, thresholds,
                failed={(0.6,)})


def sweep_2d(directory, thresholds, irregular=False):
    points = [(a, p) for p in PERIODS for a in AMPLITUDES]
    skip = {(0.75, 5.0), (1.0, 5.0), (1.0, 10.0)} if irregular else set()
    write_sweep(directory, [axis("amplitude", "Amplitude", AMPLITUDES), axis("period", "Wavelength", PERIODS)],
                points, thresholds, failed={(0.5, 15.0)}, skip=skip)


# ---------------------------------------------------------------- tests

def run(*args):
    return subprocess.run([PYTHON, SCRIPT, *args], capture_output=True, text=True, timeout=240)


def figure_files(directory):
    return sorted(f for f in os.listdir(directory) if f.endswith((".png", ".svg")))


class WritesFigures(unittest.TestCase):
    def setUp(self):
        self.tmp = tempfile.TemporaryDirectory(prefix="plot_sweep_test.")
        self.dir = self.tmp.name

    def tearDown(self):
        self.tmp.cleanup()

    def check_run(self, stems, out=None, extra=()):
        result = run(self.dir, *extra)
        self.assertEqual(result.returncode, 0, result.stderr)
        self.assertNotIn("Traceback", result.stderr)
        out = out or self.dir
        expected = sorted(f"{s}.{e}" for s in stems for e in ("png", "svg"))
        self.assertEqual(figure_files(out), expected)
        printed = sorted(os.path.basename(line) for line in result.stdout.split())
        self.assertEqual(printed, expected)
        for name in expected:
            self.check_file(os.path.join(out, name))
        self.assertEqual([f for f in os.listdir(out) if f.startswith(".")], [], "temporary files left behind")

    def check_file(self, path):
        with open(path, "rb") as f:
            data = f.read()
        if path.endswith(".png"):
            self.assertTrue(data.startswith(b"\x89PNG\r\n\x1a\n"), path)
        else:
            self.assertIn(b"<svg", data, path)

    def test_one_axis_with_thresholds(self):
        sweep_1d(self.dir, thresholds=True)
        self.check_run(FIGURES + THRESHOLD_FIGURES)

    def test_one_axis_without_thresholds(self):
        sweep_1d(self.dir, thresholds=False)
        self.check_run(FIGURES)

    def test_two_axes_with_thresholds(self):
        sweep_2d(self.dir, thresholds=True)
        self.check_run(FIGURES + THRESHOLD_FIGURES)

    def test_two_axes_without_thresholds(self):
        sweep_2d(self.dir, thresholds=False)
        self.check_run(FIGURES)

    def test_irregular_grid(self):
        sweep_2d(self.dir, thresholds=True, irregular=True)
        self.check_run(FIGURES + THRESHOLD_FIGURES)

    def test_thresholds_without_path_files(self):
        sweep_2d(self.dir, thresholds=True)
        for name in os.listdir(os.path.join(self.dir, "points")):
            os.remove(os.path.join(self.dir, "points", name))
        self.check_run(FIGURES + ("gamma_hold",))

    def test_out_directory(self):
        sweep_1d(self.dir, thresholds=True)
        out = os.path.join(self.dir, "figures")
        self.check_run(FIGURES + THRESHOLD_FIGURES, out=out, extra=("--out", out))
        self.assertEqual(figure_files(self.dir), [])


class RejectsBadInput(unittest.TestCase):
    def setUp(self):
        self.tmp = tempfile.TemporaryDirectory(prefix="plot_sweep_test.")
        self.dir = self.tmp.name
        sweep_2d(self.dir, thresholds=True)

    def tearDown(self):
        self.tmp.cleanup()

    def edit_csv(self, name, edit):
        path = os.path.join(self.dir, name)
        with open(path) as f:
            lines = f.read().splitlines()
        with open(path, "w") as f:
            f.write("\n".join(edit(lines)) + "\n")

    def check_rejected(self, file_name, *words):
        result = run(self.dir)
        self.assertEqual(result.returncode, 2, result.stderr)
        self.assertNotIn("Traceback", result.stderr)
        self.assertIn(os.path.join(self.dir, file_name), result.stderr)
        for word in words:
            self.assertIn(word, result.stderr)
        self.assertEqual(figure_files(self.dir), [])

    def test_missing_column(self):
        self.edit_csv("sweep.csv", lambda lines: [line.rsplit(",", 1)[0] for line in lines])
        self.check_rejected("sweep.csv", "missing column", "gamma_eq_J_per_m2")

    def test_not_a_number(self):
        def spoil(lines):
            cells = lines[2].split(",")
            cells[lines[0].split(",").index("conformed_fraction")] = "abc"
            return lines[:2] + [",".join(cells)] + lines[3:]
        self.edit_csv("sweep.csv", spoil)
        self.check_rejected("sweep.csv", "line 3", "'conformed_fraction'", "not a number", "'abc'")

    def test_missing_sweep_json(self):
        os.remove(os.path.join(self.dir, "sweep.json"))
        self.check_rejected("sweep.json", "not found")

    def test_bad_path_file(self):
        self.edit_csv(os.path.join("points", "point-0001_path.csv"),
                      lambda lines: lines[:3] + ["sideways,0.1,0.5,,0.01"] + lines[3:])
        self.check_rejected(os.path.join("points", "point-0001_path.csv"), "line 4", "'path'")

    def test_axis_value_not_in_sweep_json(self):
        self.edit_csv("sweep.csv", lambda lines: lines[:1] + [lines[1].replace(",20,", ",21,", 1)] + lines[2:])
        self.check_rejected("sweep.csv", "line 2", "axis_2", "period")


def main():
    global SCRIPT, PYTHON
    if len(sys.argv) < 2:
        sys.exit("usage: plot_sweep_test.py PATH/TO/plot_sweep.py [unittest options]")
    SCRIPT = os.path.abspath(sys.argv.pop(1))
    PYTHON = pick_python()
    if PYTHON is None:
        print("plot_sweep_test: no python3 with numpy and matplotlib (install python3-matplotlib); skipped")
        sys.exit(77)
    unittest.main(verbosity=2)


if __name__ == "__main__":
    main()
