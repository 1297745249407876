#!/usr/bin/env python3
"""Figures of a nappe design sweep.

Usage:
    python3 scripts/plot_sweep.py SWEEP_DIR [--out DIR]

Reads SWEEP_DIR/sweep.json, SWEEP_DIR/sweep.csv and, when the sweep computed adhesion
thresholds, SWEEP_DIR/points/point-NNNN_path.csv; writes into SWEEP_DIR (or DIR), each
as .png and .svg:

    regime_map      what the sheet does at each point (conforms / touches the floor / tents on
                    the tops / suspended), with the conformed fraction (only with a substrate)
    peak_strain     largest principal strain in %, against each point's fracture strain
    gamma_hold      work of adhesion needed to hold the sheet down, against each point's own
                    Γ (only when the sweep has thresholds)
    gamma_fraction  conformed fraction against Γ along the lowering and raising paths
                    (only when the sweep has thresholds and path files)

Γ and the fracture strain belong to each point (a material axis changes both). Where all points
share one value it is drawn as a line or contour; otherwise each point is marked against its own
value and the values are listed in the legend. A categorical axis (named values, e.g. materials)
is drawn as categories, in the sweep file's order: cells, never contours across it.

Prints each file it wrote, one per line. Every file is written under a temporary name in
the output directory and renamed when complete. Bad input: a message naming the file and line
on stderr, exit status 2, and no figure written. Cannot write: exit status 1.

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib). If another
python3 (e.g. pyenv) comes first on PATH, run the script with /usr/bin/python3.
"""

import math
import os
import sys
from dataclasses import dataclass, field

import nappe_plotting as npl
from nappe_plotting import InputError, np
import sweep_figures
from sweep_figures import REGIMES

CORE_COLUMNS = ("status", "regime", "work_of_adhesion_J_per_m2", "fracture_strain", "max_principal_strain",
                "energy_J_per_m2", "message")
CONFORMATION_COLUMNS = ("conformed_fraction", "raised_contact_fraction", "floor_contact_fraction", "floor_touched",
                        "max_gap_nm")
GAMMA_COLUMNS = ("gamma_hold_J_per_m2", "gamma_snap_J_per_m2", "gamma_eq_J_per_m2")
OLD_FORMAT = {"peak_principal_strain": "this sweep was written by an older nappe (the column is "
                                      "max_principal_strain now); rerun the sweep"}


@dataclass
class Axis:
    parameter: str
    name: str
    unit: str
    categorical: bool
    values: list  # numbers ascending, or names in the sweep file's order

    @property
    def positions(self):
        return np.arange(len(self.values), dtype=float) if self.categorical else np.asarray(self.values, float)

    def label(self):
        if self.categorical:
            return self.name
        return f"{self.name} [{self.unit}]" if self.unit else f"{self.name} (dimensionless)"

    def text(self, i):
        return self.values[i] if self.categorical else f"{self.values[i]:g}"

    def describe(self, i):
        return f"{self.name} = {self.text(i)} {'' if self.categorical else self.unit}".rstrip()

    def locate(self, text, place, column):
        """Index of a CSV cell among the axis values (names exactly; numbers up to rounding)."""
        if self.categorical:
            if text not in self.values:
                raise InputError(f"{place}: column '{column}' is '{text}', not one of the names of axis "
                                 f"'{self.name}' in sweep.json ({', '.join(self.values)})")
            return self.values.index(text)
        value = npl.parse_number(text, column, place)
        values = self.positions
        i = int(np.argmin(np.abs(values - value)))
        if abs(values[i] - value) > 1e-6 * max(np.max(np.abs(values)), np.ptp(values), 1e-300):
            raise InputError(f"{place}: column '{column}' is {value:g}, not one of the values of axis "
                             f"'{self.name}' in sweep.json ({', '.join(f'{v:g}' for v in self.values)})")
        return i


@dataclass
class Point:
    number: int
    index: tuple  # position of each coordinate among its axis' values
    ok: bool
    regime: str
    gamma: float  # the point's own work of adhesion [J/m²], NaN if none
    fracture: float  # the point's own fracture strain [-], NaN if unknown
    values: dict
    message: str = ""


@dataclass
class Sweep:
    title: str
    axes: list
    target: float
    thresholds: bool
    substrate: bool = False
    points: list = field(default_factory=list)
    paths: dict = field(default_factory=dict)  # point number -> {"down"|"up": AdhesionPath}

    def ok_points(self):
        return [p for p in self.points if p.ok]

    def coords(self, point):
        return tuple(a.positions[i] for a, i in zip(self.axes, point.index))

    def any_categorical(self):
        return any(a.categorical for a in self.axes)

    def shared(self, attribute):
        """The value every point has for `attribute` ('gamma' or 'fracture'), NaN if all lack it,
        None if the points differ."""
        found = {getattr(p, attribute) for p in self.points}
        if all(math.isnan(v) for v in found):
            return math.nan
        known = [v for v in found if not math.isnan(v)]
        if len(known) == len(found) and max(known) - min(known) <= 1e-9 * max(known):
            return known[0]
        return None


# ---------------------------------------------------------------- reading sweep.json

def parse_axis(raw, i, path):
    context = f"axes[{i}]."
    if not isinstance(raw, npl.JsonObject):
        raise InputError(f"{path}: axes[{i}] must be an object with parameter, name, unit, categorical, values")
    strings = [npl.json_string(raw, key, path, context) for key in ("parameter", "name", "unit")]
    categorical = npl.json_bool(raw, "categorical", path, context)
    values = npl.json_key(raw, "values", path, "a non-empty list", context)
    place = npl.where(path, raw, "values")
    kind = str if categorical else (int, float)
    if (not isinstance(values, list) or not values or
            not all(isinstance(v, kind) and not isinstance(v, bool) for v in values)):
        raise InputError(f"{place}: '{context}values' must be a non-empty list of "
                         f"{'names' if categorical else 'numbers'}, found {values!r}")
    if categorical and not all(v.strip() for v in values):
        raise InputError(f"{place}: '{context}values' has an empty name")
    if not categorical and not all(math.isfinite(v) for v in values):
        raise InputError(f"{place}: '{context}values' must be finite numbers, found {values!r}")
    if len(set(values)) != len(values):
        raise InputError(f"{place}: '{context}values' has repeated values: {values!r}")
    return Axis(*strings, categorical, list(values) if categorical else sorted(float(v) for v in values))


def load_meta(directory):
    path = os.path.join(directory, "sweep.json")
    raw = npl.read_json(path, "the sweep description (sweep.json)")
    axes = npl.json_key(raw, "axes", path, "a list of 1 or 2 axes")
    if not isinstance(axes, list) or len(axes) not in (1, 2):
        raise InputError(f"{npl.where(path, raw, 'axes')}: 'axes' must be a list of 1 or 2 axes, found {axes!r}")
    target = npl.json_number(raw, "target_fraction", path)
    if not 0 < target <= 1:
        raise InputError(f"{npl.where(path, raw, 'target_fraction')}: 'target_fraction' must be in (0, 1], "
                         f"found {target:g}")
    return Sweep(npl.json_string(raw, "title", path), [parse_axis(a, i, path) for i, a in enumerate(axes)],
                 target, npl.json_bool(raw, "thresholds", path))


# ---------------------------------------------------------------- reading sweep.csv

def value_columns(header, sweep):
    """Numeric columns to read: the fixed ones and every further max_*/min_* measure."""
    fixed = ["max_principal_strain", "energy_J_per_m2"]
    fixed += list(CONFORMATION_COLUMNS) if sweep.substrate else []
    fixed += list(GAMMA_COLUMNS) if sweep.thresholds else []
    return fixed + [c for c in header if c.startswith(("max_", "min_")) and c not in fixed]


def positive_or_nan(text, column, place):
    value = npl.parse_number(text, column, place, required=False)
    if value <= 0:
        raise InputError(f"{place}: column '{column}' must be positive or empty, found {value:g}")
    return value


def parse_regime(table, k, sweep, ok):
    regime, place = table.cell(k, "regime"), table.at(k)
    if regime and regime not in REGIMES:
        raise InputError(f"{place}: column 'regime' must be one of {', '.join(REGIMES)} (or empty), found '{regime}'")
    if ok and sweep.substrate and not regime:
        raise InputError(f"{place}: column 'regime' is empty for a computed point; expected one of "
                         f"{', '.join(REGIMES)}")
    return regime


def parse_point(table, k, sweep, columns):
    place, cell = table.at(k), (lambda c: table.cell(k, c))
    text = cell("point")
    if not text.isdigit() or int(text) < 1:
        raise InputError(f"{place}: column 'point' must be a positive integer, found '{text}'")
    if cell("status") not in ("ok", "failed"):
        raise InputError(f"{place}: column 'status' must be 'ok' or 'failed', found '{cell('status')}'")
    ok = cell("status") == "ok"
    index = tuple(a.locate(cell(f"axis_{i + 1}"), place, f"axis_{i + 1}") for i, a in enumerate(sweep.axes))
    values = {c: npl.parse_number(cell(c), c, place, required=False) for c in columns}
    for c in CONFORMATION_COLUMNS[:4] if sweep.substrate else ():
        values[c] = npl.parse_fraction(cell(c), c, place, required=ok)
    if ok:
        npl.parse_number(cell("max_principal_strain"), "max_principal_strain", place)
    gamma = positive_or_nan(cell("work_of_adhesion_J_per_m2"), "work_of_adhesion_J_per_m2", place)
    for c in GAMMA_COLUMNS if sweep.thresholds else ():
        positive_or_nan(cell(c), c, place)
    return Point(int(text), index, ok, parse_regime(table, k, sweep, ok), gamma,
                 positive_or_nan(cell("fracture_strain"), "fracture_strain", place), values, cell("message"))


def load_points(directory, sweep):
    path = os.path.join(directory, "sweep.csv")
    axis_columns = tuple(f"axis_{i + 1}" for i in range(len(sweep.axes)))
    required = ("point",) + axis_columns + CORE_COLUMNS + (GAMMA_COLUMNS if sweep.thresholds else ())
    table = npl.read_table(path, required, OLD_FORMAT)
    present = [c for c in CONFORMATION_COLUMNS if c in table.header]
    if present and len(present) != len(CONFORMATION_COLUMNS):
        missing = ", ".join(f"'{c}'" for c in CONFORMATION_COLUMNS if c not in present)
        raise InputError(f"{path} line 1: missing column {missing} (the conformation columns come together)")
    sweep.substrate = bool(present)
    if not table.rows:
        raise InputError(f"{path}: no data rows; expected one row per sweep point")
    columns, numbers, cells = value_columns(table.header, sweep), {}, {}
    for k in range(len(table.rows)):
        point = parse_point(table, k, sweep, columns)
        for key, seen, why in ((point.number, numbers, "same point number"), (point.index, cells, "same axis values")):
            if key in seen:
                raise InputError(f"{table.at(k)}: point {point.number} repeats line {seen[key]} ({why})")
            seen[key] = table.lines[k]
        sweep.points.append(point)


def load_paths(directory, sweep):
    for point in sweep.ok_points():
        path = os.path.join(directory, "points", f"point-{point.number:04d}_path.csv")
        if os.path.exists(path):
            sweep.paths[point.number] = npl.load_adhesion_paths(path)


def load(directory):
    if not os.path.isdir(directory):
        raise InputError(f"{directory}: not a directory; expected a sweep directory with sweep.json and sweep.csv")
    sweep = load_meta(directory)
    load_points(directory, sweep)
    if sweep.thresholds:
        load_paths(directory, sweep)
    return sweep


# ---------------------------------------------------------------- driver

def figures(sweep, _directory):
    """(stem, builder) of each figure this sweep supports."""
    chosen = []
    if sweep.substrate:
        chosen.append(("regime_map", lambda: sweep_figures.regime_map(sweep)))
    chosen.append(("peak_strain", lambda: sweep_figures.peak_strain(sweep)))
    if sweep.thresholds:
        chosen.append(("gamma_hold", lambda: sweep_figures.gamma_hold(sweep)))
        if sweep.paths:
            chosen.append(("gamma_fraction", lambda: sweep_figures.gamma_fraction(sweep)))
    return chosen


if __name__ == "__main__":
    sys.exit(npl.run_script("plot_sweep", __doc__, "sweep directory with sweep.json and sweep.csv", load, figures,
                            default_out=lambda directory: directory))
