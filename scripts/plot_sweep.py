#!/usr/bin/env python3
"""Figures of a nappe design sweep.

Usage:
    python3 scripts/plot_sweep.py SWEEP_DIR [--out DIR]

Reads SWEEP_DIR/sweep.json, SWEEP_DIR/sweep.csv and, when the sweep computed adhesion
thresholds, SWEEP_DIR/points/point-NNNN_path.csv; writes into SWEEP_DIR (or DIR), each
as .png and .svg:

    regime_map      conforms / partially conformed / suspended over the sweep
    peak_strain     peak principal strain in %, with the fracture strain marked
    gamma_hold      work of adhesion needed to hold the sheet down, against the case's
                    Γ (only when the sweep has thresholds)
    gamma_fraction  conformed fraction against Γ along the lowering and raising paths
                    (only when the sweep has thresholds and path files)

Prints each file it wrote, one per line. Every file is written under a temporary name in
the output directory and renamed when complete. Bad input: a message naming the file on
stderr, exit status 2, and no figure written. Cannot write: exit status 1.

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib). If another
python3 (e.g. pyenv) comes first on PATH, run the script with /usr/bin/python3.
"""

import argparse
import contextlib
import csv
import json
import math
import os
import sys
import tempfile
import textwrap
from dataclasses import dataclass, field

try:
    import numpy as np
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    from matplotlib.colors import ListedColormap
    from matplotlib.lines import Line2D
    from matplotlib.patches import Patch, Rectangle
    from matplotlib.ticker import MaxNLocator
except ImportError as missing:
    sys.stderr.write(f"plot_sweep: {missing} in {sys.executable}; install Debian's python3-matplotlib "
                     "and python3-numpy, and run this script with /usr/bin/python3 if another "
                     "python3 comes first on PATH\n")
    sys.exit(1)

FOOTER = "Model estimates — confirm by measurement."
REGIMES = ("conforms", "partially conformed", "suspended")
REGIME_COLOURS = {"conforms": "#009E73", "partially conformed": "#E69F00", "suspended": "#0072B2"}
FAILED_COLOUR = "0.82"
VALUE_COLUMNS = ("conformed_fraction", "peak_principal_strain", "max_areal_strain", "max_shear_strain",
                 "max_gap_nm", "energy_J_per_m2")
GAMMA_COLUMNS = ("gamma_hold_J_per_m2", "gamma_snap_J_per_m2", "gamma_eq_J_per_m2")
PATH_COLUMNS = ("path", "gamma_J_per_m2", "conformed_fraction", "energy_J_per_m2", "peak_principal_strain")
MAX_PATH_POINTS = 8
GAMMA_UNIT = "J/m²"
HOLD = r"$\Gamma_\mathrm{hold}$"
LABEL_BOX = dict(facecolor="white", alpha=0.8, edgecolor="none", pad=1.0)


class InputError(Exception):
    """Bad input; the message names the file and what was expected."""


@dataclass
class Axis:
    parameter: str
    name: str
    unit: str
    values: list  # sorted ascending
    labels: tuple = ()  # a categorical axis (e.g. materials): names of the values 1, 2, …

    def label(self):
        if self.labels:
            return self.name
        return f"{self.name} [{self.unit}]" if self.unit else f"{self.name} (dimensionless)"

    def text(self, value):
        """A value as tick text: its name on a categorical axis, else the number."""
        return self.labels[self.values.index(value)] if self.labels else f"{value:g}"

    def describe(self, value):
        return f"{self.name} = {self.text(value)} {'' if self.labels else self.unit}".rstrip()


@dataclass
class Point:
    number: int
    coords: tuple
    index: tuple  # position of each coordinate in its axis' sorted values
    ok: bool
    regime: str
    values: dict


@dataclass
class Sweep:
    title: str
    axes: list
    gamma: float
    fracture: object  # float or None
    target: float
    thresholds: bool
    points: list = field(default_factory=list)
    paths: dict = field(default_factory=dict)  # point number -> {"down"|"up": (gamma, fraction)}

    def ok_points(self):
        return [p for p in self.points if p.ok]


# ---------------------------------------------------------------- reading sweep.json

def json_key(obj, key, path, expected):
    if key not in obj:
        raise InputError(f"{path}: missing key '{key}'; expected {expected}")
    return obj[key]


def json_number(value, what, path, allow_null=False):
    if value is None and allow_null:
        return None
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise InputError(f"{path}: {what} must be a number{' or null' if allow_null else ''}, found {value!r}")
    return float(value)


def json_string(obj, key, path):
    value = json_key(obj, key, path, "a string")
    if not isinstance(value, str):
        raise InputError(f"{path}: '{key}' must be a string, found {value!r}")
    return value


def read_json(path):
    try:
        with open(path, encoding="utf-8") as f:
            raw = json.load(f)
    except FileNotFoundError:
        raise InputError(f"{path}: file not found; expected the sweep description (sweep.json)") from None
    except json.JSONDecodeError as err:
        raise InputError(f"{path} line {err.lineno}: not valid JSON: {err.msg}") from None
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot read: {err}") from None
    if not isinstance(raw, dict):
        raise InputError(f"{path}: expected a JSON object at the top level")
    return raw


def parse_axis(raw, i, path):
    where = f"axes[{i}]"
    if not isinstance(raw, dict):
        raise InputError(f"{path}: {where} must be an object with parameter, name, unit, values")
    strings = [json_string(raw, key, f"{path}: {where}") for key in ("parameter", "name", "unit")]
    values = json_key(raw, "values", f"{path}: {where}", "a list of numbers")
    if not isinstance(values, list) or not values:
        raise InputError(f"{path}: {where}.values must be a non-empty list of numbers, found {values!r}")
    numbers = sorted(json_number(v, f"each of {where}.values", path) for v in values)
    if len(set(numbers)) != len(numbers):
        raise InputError(f"{path}: {where}.values has repeated values: {values!r}")
    labels = raw.get("labels", [])
    if not isinstance(labels, list) or (labels and (len(labels) != len(numbers) or
                                                    numbers != list(range(1, len(numbers) + 1)) or
                                                    not all(isinstance(t, str) for t in labels))):
        raise InputError(f"{path}: {where}.labels must name the values 1..n of a categorical axis, found {labels!r}")
    return Axis(*strings, numbers, tuple(labels))


def load_meta(directory):
    path = os.path.join(directory, "sweep.json")
    raw = read_json(path)
    axes = json_key(raw, "axes", path, "a list of 1 or 2 axes")
    if not isinstance(axes, list) or len(axes) not in (1, 2):
        raise InputError(f"{path}: 'axes' must be a list of 1 or 2 axes, found {axes!r}")
    gamma = json_number(json_key(raw, "work_of_adhesion_J_per_m2", path, "a number in J/m²"),
                        "'work_of_adhesion_J_per_m2'", path)
    fracture = json_number(json_key(raw, "fracture_strain", path, "a number or null"),
                           "'fracture_strain'", path, allow_null=True)
    target = json_number(json_key(raw, "target_fraction", path, "a number between 0 and 1"),
                         "'target_fraction'", path)
    if gamma <= 0 or not 0 < target <= 1 or (fracture is not None and fracture <= 0):
        raise InputError(f"{path}: expected work_of_adhesion_J_per_m2 > 0, 0 < target_fraction <= 1 and "
                         f"fracture_strain > 0 or null; found {gamma:g}, {target:g}, {fracture}")
    thresholds = json_key(raw, "thresholds", path, "true or false")
    if not isinstance(thresholds, bool):
        raise InputError(f"{path}: 'thresholds' must be true or false, found {thresholds!r}")
    return Sweep(json_string(raw, "title", path), [parse_axis(a, i, path) for i, a in enumerate(axes)],
                 gamma, fracture, target, thresholds)


# ---------------------------------------------------------------- reading CSV files

def read_table(path, required):
    """Rows of a CSV file as (line number, {column: text}); checks the header has `required`."""
    rows = []
    try:
        with open(path, newline="", encoding="utf-8") as f:
            reader = csv.reader(f)
            header = [h.strip() for h in next(reader, [])]
            check_header(path, header, required)
            for cells in reader:
                if not any(c.strip() for c in cells):
                    continue
                if len(cells) != len(header):
                    raise InputError(f"{path} line {reader.line_num}: {len(cells)} fields, expected "
                                     f"{len(header)} as in the header")
                rows.append((reader.line_num, dict(zip(header, (c.strip() for c in cells)))))
    except FileNotFoundError:
        raise InputError(f"{path}: file not found") from None
    except (OSError, UnicodeDecodeError, csv.Error) as err:
        raise InputError(f"{path}: cannot read: {err}") from None
    return rows


def check_header(path, header, required):
    if not any(header):
        raise InputError(f"{path}: empty file; expected a header line with columns {', '.join(required)}")
    missing = [c for c in required if c not in header]
    if missing:
        names = ", ".join(f"'{c}'" for c in missing)
        raise InputError(f"{path} line 1: missing column {names}; the header has {', '.join(header)}")
    if len(set(header)) != len(header):
        raise InputError(f"{path} line 1: repeated column names in the header")


def cell_number(row, column, where, required=False):
    text = row[column]
    if text == "":
        if required:
            raise InputError(f"{where}: column '{column}' is empty; expected a number")
        return math.nan
    try:
        value = float(text)
    except ValueError:
        raise InputError(f"{where}: column '{column}' is not a number: '{text}'") from None
    return value if math.isfinite(value) else math.nan


def cell_fraction(row, column, where, required=False):
    value = cell_number(row, column, where, required)
    if not (math.isnan(value) or -1e-9 <= value <= 1 + 1e-9):
        raise InputError(f"{where}: column '{column}' must be a fraction between 0 and 1, found {value:g}")
    return value


def locate(value, axis, where):
    """Index of `value` among the axis values (tolerating rounding in the CSV)."""
    values = np.asarray(axis.values)
    i = int(np.argmin(np.abs(values - value)))
    scale = max(np.max(np.abs(values)), np.ptp(values), 1e-300)
    if abs(values[i] - value) > 1e-6 * scale:
        raise InputError(f"{where}: {value:g} is not one of the values of axis '{axis.name}' in "
                         f"sweep.json ({', '.join(f'{v:g}' for v in axis.values)})")
    return i


def parse_point(row, where, sweep):
    text = row["point"]
    if not text.isdigit() or int(text) < 1:
        raise InputError(f"{where}: column 'point' must be a positive integer, found '{text}'")
    status, regime = row["status"], row["regime"]
    if status not in ("ok", "failed"):
        raise InputError(f"{where}: column 'status' must be 'ok' or 'failed', found '{status}'")
    if (status == "ok" or regime) and regime not in REGIMES:
        raise InputError(f"{where}: column 'regime' must be one of {', '.join(REGIMES)}"
                         f"{' (or empty for a failed point)' if status == 'failed' else ''}, found '{regime}'")
    coords = tuple(cell_number(row, f"axis_{i + 1}", where, required=True) for i in range(len(sweep.axes)))
    index = tuple(locate(c, a, f"{where}: column 'axis_{i + 1}'")
                  for i, (c, a) in enumerate(zip(coords, sweep.axes)))
    columns = VALUE_COLUMNS + (GAMMA_COLUMNS if sweep.thresholds else ())
    values = {c: cell_number(row, c, where) for c in columns}
    values["conformed_fraction"] = cell_fraction(row, "conformed_fraction", where)
    return Point(int(text), coords, index, status == "ok", regime, values)


def load_points(directory, sweep):
    path = os.path.join(directory, "sweep.csv")
    axis_columns = tuple(f"axis_{i + 1}" for i in range(len(sweep.axes)))
    required = ("point",) + axis_columns + ("status", "regime") + VALUE_COLUMNS
    rows = read_table(path, required + (GAMMA_COLUMNS if sweep.thresholds else ()))
    if not rows:
        raise InputError(f"{path}: no data rows; expected one row per sweep point")
    numbers, cells = {}, {}
    for line, row in rows:
        point = parse_point(row, f"{path} line {line}", sweep)
        for key, seen in ((point.number, numbers), (point.index, cells)):
            if key in seen:
                raise InputError(f"{path} line {line}: point {point.number} repeats line {seen[key]} "
                                 f"({'same point number' if seen is numbers else 'same axis values'})")
            seen[key] = line
        sweep.points.append(point)


def parse_path_row(row, where):
    kind = row["path"]
    if kind not in ("down", "up"):
        raise InputError(f"{where}: column 'path' must be 'down' or 'up', found '{kind}'")
    gamma = cell_number(row, "gamma_J_per_m2", where, required=True)
    return kind, gamma, cell_fraction(row, "conformed_fraction", where, required=True)


def load_path(path):
    """{"down"|"up": (gamma array, fraction array)} from one point's path file."""
    found = {"down": ([], []), "up": ([], [])}
    for line, row in read_table(path, PATH_COLUMNS):
        kind, gamma, fraction = parse_path_row(row, f"{path} line {line}")
        found[kind][0].append(gamma)
        found[kind][1].append(fraction)
    return {k: (np.array(g), np.array(f)) for k, (g, f) in found.items() if g}


def load_paths(directory, sweep):
    for point in sweep.ok_points():
        path = os.path.join(directory, "points", f"point-{point.number:04d}_path.csv")
        found = load_path(path) if os.path.exists(path) else None
        if found:
            sweep.paths[point.number] = found


def load_sweep(directory):
    if not os.path.isdir(directory):
        raise InputError(f"{directory}: not a directory; expected a sweep directory with sweep.json and sweep.csv")
    sweep = load_meta(directory)
    load_points(directory, sweep)
    if sweep.thresholds:
        load_paths(directory, sweep)
    return sweep


# ---------------------------------------------------------------- figure helpers

def new_figure(sweep, subject, size=(8.0, 5.2)):
    fig, ax = plt.subplots(figsize=size)
    ax.set_title("\n".join(textwrap.wrap(sweep.title, 70) + [subject]), fontsize=11)
    return fig, ax


def finish(fig):
    fig.text(0.5, 0.012, FOOTER, ha="center", va="bottom", fontsize=8, style="italic", color="0.3")
    fig.tight_layout(rect=(0, 0.035, 1, 1))


def save_atomically(fig, out_dir, stem):
    """Writes stem.png and stem.svg through temporary files renamed when complete."""
    written = []
    for ext in ("png", "svg"):
        final = os.path.join(out_dir, f"{stem}.{ext}")
        fd, tmp = tempfile.mkstemp(prefix=f".{stem}.", suffix=f".{ext}", dir=out_dir)
        os.close(fd)
        try:
            fig.savefig(tmp, format=ext, dpi=150)
            os.chmod(tmp, 0o666 & ~UMASK)  # mkstemp creates 0600
            os.replace(tmp, final)
        except BaseException:
            with contextlib.suppress(OSError):
                os.remove(tmp)
            raise
        written.append(final)
    return written


def is_log(axis):
    v = axis.values
    return len(v) > 2 and v[0] > 0 and v[-1] / v[0] >= 100


def set_axis(ax, axis, which):
    """Label, scale and (for few values) ticks at the sweep values."""
    getattr(ax, f"set_{which}label")(axis.label())
    if is_log(axis):
        getattr(ax, f"set_{which}scale")("log")
    if len(axis.values) <= 10:
        getattr(ax, f"set_{which}ticks")(axis.values, [axis.text(v) for v in axis.values])
        getattr(ax, f"{which}axis").set_minor_locator(plt.NullLocator())


def cell_edges(axis):
    v = np.asarray(axis.values, dtype=float)
    if len(v) == 1:
        half = 0.5 * abs(v[0]) if v[0] else 0.5
        return np.array([v[0] - half, v[0] + half])
    mid = np.sqrt(v[:-1] * v[1:]) if is_log(axis) else 0.5 * (v[:-1] + v[1:])
    first = v[0] ** 2 / mid[0] if is_log(axis) else 2 * v[0] - mid[0]
    last = v[-1] ** 2 / mid[-1] if is_log(axis) else 2 * v[-1] - mid[-1]
    return np.concatenate(([first], mid, [last]))


def grid(sweep, value):
    """Masked (axis_2, axis_1) array of value(point) over ok points; missing/failed/NaN masked."""
    x_axis, y_axis = sweep.axes
    z = np.full((len(y_axis.values), len(x_axis.values)), np.nan)
    for p in sweep.ok_points():
        z[p.index[1], p.index[0]] = value(p)
    return np.ma.masked_invalid(z)


def levels_for(data):
    lo, hi = float(np.min(data)), float(np.max(data))
    if hi - lo <= 1e-12 * max(abs(lo), abs(hi), 1e-300):
        pad = 0.05 * abs(hi) if hi else 1.0
        lo, hi = lo - pad, hi + pad
    return MaxNLocator(nbins=10).tick_values(lo, hi)


def draw_field(fig, ax, sweep, z, cmap, label):
    """Filled contours of z over the grid (cells if the grid is too thin); returns the colour bar."""
    x, y = (np.asarray(a.values) for a in sweep.axes)
    if z.count() == 0:
        ax.text(0.5, 0.5, "no computed values", transform=ax.transAxes, ha="center", va="center")
        return None
    levels = levels_for(z.compressed())
    if min(z.shape) >= 2 and z.count() >= 3:
        shade = ax.contourf(x, y, z, levels=levels, cmap=cmap)
    else:
        edges = [cell_edges(a) for a in sweep.axes]
        shade = ax.pcolormesh(*edges, z, cmap=cmap, vmin=levels[0], vmax=levels[-1])
    bar = fig.colorbar(shade, ax=ax)
    bar.set_label(label)
    return bar


def label_contour(ax, lines, text):
    """One label on a white box at the middle (by screen length) of the longest piece of a contour."""
    ax.get_xlim(), ax.get_ylim()  # brings the data limits up to date before measuring on screen
    pieces = [ax.transData.transform(seg) for seg in lines.allsegs[0] if len(seg) >= 2]
    if not pieces:
        return
    runs = [np.concatenate(([0.0], np.cumsum(np.hypot(*np.diff(seg, axis=0).T)))) for seg in pieces]
    k = int(np.argmax([run[-1] for run in runs]))
    seg, run = pieces[k], runs[k]
    i = min(max(int(np.searchsorted(run, run[-1] / 2)) - 1, 0), len(run) - 2)
    t = (run[-1] / 2 - run[i]) / max(run[i + 1] - run[i], 1e-300)
    middle = ax.transData.inverted().transform(seg[i] + t * (seg[i + 1] - seg[i]))
    for label in ax.clabel(lines, fmt={lines.levels[0]: text}, manual=[tuple(middle)], fontsize=8):
        label.set_bbox(LABEL_BOX)


def mark_groups(ax, groups):
    """Scatter groups of (label, points, style) at their grid coordinates."""
    for label, points, style in groups:
        if points:
            xs, ys = zip(*(p.coords for p in points))
            ax.scatter(xs, ys, label=label, zorder=4, clip_on=False, **style)


def missing_cells(sweep):
    x_axis, y_axis = sweep.axes
    taken = {p.index for p in sweep.points}
    return [(x, y) for i, x in enumerate(x_axis.values) for j, y in enumerate(y_axis.values)
            if (i, j) not in taken]


def point_groups(sweep):
    failed = [p for p in sweep.points if not p.ok]
    return [("computed point", sweep.ok_points(), dict(s=16, facecolors="white", edgecolors="k")),
            ("failed point", failed, dict(s=40, c="0.25", marker="x"))]


def mark_missing(ax, sweep):
    """Grid cells that have no row in sweep.csv."""
    cells = missing_cells(sweep)
    if cells:
        xs, ys = zip(*cells)
        ax.scatter(xs, ys, marker="s", s=30, facecolors="none", edgecolors="0.5", zorder=4, clip_on=False,
                   label="not in sweep.csv")


def legend_below(ax, handles=None, ncol=3):
    if handles is None:
        handles = ax.get_legend_handles_labels()[0]
    if handles:
        ax.legend(handles=handles, loc="upper center", bbox_to_anchor=(0.5, -0.14), ncol=ncol,
                  fontsize=8, frameon=False)


def sorted_points(sweep):
    return sorted(sweep.points, key=lambda p: p.coords[0])


def column_1d(points, key, scale=1.0):
    return np.array([p.values[key] * scale if p.ok else np.nan for p in points])


def mark_failed_1d(ax, points):
    failed = [p.coords[0] for p in points if not p.ok]
    if failed:
        ax.scatter(failed, [0.03] * len(failed), transform=ax.get_xaxis_transform(), marker="x",
                   s=40, c="0.25", zorder=5, label="failed point", clip_on=False)


# ---------------------------------------------------------------- regime map

def regime_code(point):
    return REGIMES.index(point.regime) if point.ok else len(REGIMES)


def regime_row(point):
    """Row of the 1D chart: conforms on top, failed at the bottom."""
    return len(REGIMES) - 1 - REGIMES.index(point.regime) if point.ok else -1


def regime_map_2d(sweep):
    fig, ax = new_figure(sweep, "regime of the sheet (cell text: conformed fraction)")
    z = np.ma.masked_less(grid_codes(sweep), 0)
    colours = [REGIME_COLOURS[r] for r in REGIMES] + [FAILED_COLOUR]
    edges = [cell_edges(a) for a in sweep.axes]
    ax.pcolormesh(*edges, z, cmap=ListedColormap(colours), vmin=-0.5, vmax=len(REGIMES) + 0.5,
                  edgecolors="white", linewidth=1.0)
    hatch_failed(ax, sweep, edges)
    annotate_fractions(ax, sweep)
    set_axis(ax, sweep.axes[0], "x")
    set_axis(ax, sweep.axes[1], "y")
    ax.legend(handles=regime_handles(sweep), loc="upper left", bbox_to_anchor=(1.02, 1), fontsize=9,
              title="regime", title_fontsize=9)
    return fig


def grid_codes(sweep):
    x_axis, y_axis = sweep.axes
    codes = np.full((len(y_axis.values), len(x_axis.values)), -1)
    for p in sweep.points:
        codes[p.index[1], p.index[0]] = regime_code(p)
    return codes


def hatch_failed(ax, sweep, edges):
    for p in sweep.points:
        if not p.ok:
            (x0, x1), (y0, y1) = ((e[i], e[i + 1]) for e, i in zip(edges, p.index))
            ax.add_patch(Rectangle((x0, y0), x1 - x0, y1 - y0, facecolor=FAILED_COLOUR, edgecolor="0.45",
                                   hatch="///", linewidth=0, zorder=2))


def annotate_fractions(ax, sweep):
    if len(sweep.points) > 64:
        return
    for p in sweep.ok_points():
        f = p.values["conformed_fraction"]
        if not math.isnan(f):
            ax.text(*p.coords, f"{100 * f:.0f} %", ha="center", va="center", fontsize=8, zorder=3,
                    color="white" if p.regime != "partially conformed" else "black")


def regime_handles(sweep):
    handles = [Patch(facecolor=REGIME_COLOURS[r], label=r) for r in REGIMES]
    if any(not p.ok for p in sweep.points):
        handles.append(Patch(facecolor=FAILED_COLOUR, edgecolor="0.45", hatch="///", label="failed"))
    if missing_cells(sweep):
        handles.append(Patch(facecolor="white", edgecolor="0.6", label="not in sweep.csv"))
    return handles


def regime_map_1d(sweep):
    fig, ax = new_figure(sweep, "regime of the sheet and conformed fraction")
    points = sorted_points(sweep)
    x = np.array([p.coords[0] for p in points])
    y = np.array([regime_row(p) for p in points], dtype=float)
    ax.step(x, np.where(y < 0, np.nan, y), where="mid", color="0.6", linewidth=1, zorder=1)
    names = ("failed",) + REGIMES[::-1]
    for row, regime in reversed(list(enumerate(names, start=-1))):
        if (y == row).any():
            ax.scatter(x[y == row], y[y == row], s=70, zorder=3, edgecolors="k", label=regime,
                       c=REGIME_COLOURS.get(regime, FAILED_COLOUR), marker="X" if row < 0 else "o")
    bottom = -1 if (y < 0).any() else 0
    ax.set_yticks(range(bottom, len(REGIMES)), names[bottom + 1:])
    ax.set_ylim(bottom - 0.5, len(REGIMES) - 0.5)
    set_axis(ax, sweep.axes[0], "x")
    right = fraction_on_twin(ax, sweep, x, column_1d(points, "conformed_fraction", 100))
    handles = ax.get_legend_handles_labels()[0] + right.get_legend_handles_labels()[0]
    legend_below(ax, handles, ncol=3)
    return fig


def fraction_on_twin(ax, sweep, x, fraction_pct):
    right = ax.twinx()
    right.plot(x, fraction_pct, color="#CC79A7", marker=".", linewidth=1.5, label="conformed fraction")
    right.axhline(100 * sweep.target, color="#CC79A7", linestyle=":", linewidth=1.2,
                  label=f"target fraction {100 * sweep.target:g} %")
    right.set_ylim(-3, 103)
    right.set_ylabel("conformed fraction [%]", color="#A0527F")
    return right


# ---------------------------------------------------------------- peak strain

def peak_strain_2d(sweep):
    fig, ax = new_figure(sweep, "peak principal strain")
    set_axis(ax, sweep.axes[0], "x")
    set_axis(ax, sweep.axes[1], "y")
    z = grid(sweep, lambda p: 100 * p.values["peak_principal_strain"])
    bar = draw_field(fig, ax, sweep, z, "viridis", "peak principal strain [%]")
    handles = fracture_contour(ax, bar, sweep, z)
    mark_groups(ax, point_groups(sweep))
    mark_missing(ax, sweep)
    legend_below(ax, ax.get_legend_handles_labels()[0] + handles)
    return fig


def level_contour(ax, bar, sweep, z, level, text):
    """Red labelled contour of z at `level` (also marked on the colour bar); returns why not drawn, or None."""
    lo, hi = float(z.min()), float(z.max())
    if bar is not None and bar.vmin <= level <= bar.vmax:
        bar.ax.axhline(level, color="red", linewidth=2)
    if level >= hi or level <= lo:
        return "above every point" if level >= hi else "below every point"
    if min(z.shape) < 2:
        return "marked on the colour bar"
    lines = ax.contour(*(np.asarray(a.values) for a in sweep.axes), z, levels=[level], colors="red",
                       linewidths=2, zorder=3)
    label_contour(ax, lines, text)
    return None


def fracture_contour(ax, bar, sweep, z):
    """The fracture-strain level as a labelled contour; legend handles."""
    if sweep.fracture is None or z.count() == 0:
        return [Line2D([], [], color="none", label="fracture strain unknown")]
    level = 100 * sweep.fracture
    note = level_contour(ax, bar, sweep, z, level, f"fracture {level:g} %")
    label = f"fracture strain {level:g} %" + (f" ({note})" if note else "")
    return [Line2D([], [], color="red", linewidth=2, label=label)]


def peak_strain_1d(sweep):
    fig, ax = new_figure(sweep, "peak principal strain")
    points = sorted_points(sweep)
    x = np.array([p.coords[0] for p in points])
    strain = column_1d(points, "peak_principal_strain", 100)
    ax.plot(x, strain, "o-", color="#0072B2", label="peak principal strain")
    fracture_line(ax, sweep, strain)
    mark_failed_1d(ax, points)
    set_axis(ax, sweep.axes[0], "x")
    ax.set_ylabel("peak principal strain [%]")
    ax.set_ylim(bottom=0)
    ax.grid(alpha=0.3)
    legend_below(ax)
    return fig


def fracture_line(ax, sweep, strain_pct):
    """Horizontal fracture-strain line; noted in the legend instead when far off scale."""
    if sweep.fracture is None:
        ax.plot([], [], color="none", label="fracture strain unknown")
        return
    level, top = 100 * sweep.fracture, np.nanmax(strain_pct) if np.isfinite(strain_pct).any() else 0
    if top > 0 and level > 3 * top:
        ax.plot([], [], color="red", linestyle="--", label=f"fracture strain {level:g} % (off scale, "
                f"{level / top:.0f}× the largest)")
        return
    ax.axhline(level, color="red", linestyle="--", linewidth=1.5, label=f"fracture strain {level:g} %")


# ---------------------------------------------------------------- adhesion thresholds

def gamma_hold_2d(sweep):
    fig, ax = new_figure(sweep, f"work of adhesion needed to hold the sheet down, {HOLD}")
    set_axis(ax, sweep.axes[0], "x")
    set_axis(ax, sweep.axes[1], "y")
    z = grid(sweep, lambda p: p.values["gamma_hold_J_per_m2"])
    bar = draw_field(fig, ax, sweep, z, "cividis", f"{HOLD} [{GAMMA_UNIT}]")
    handles = case_gamma_contour(ax, bar, sweep, z)
    mark_groups(ax, hold_groups(sweep))
    mark_missing(ax, sweep)
    legend_below(ax, ax.get_legend_handles_labels()[0] + handles, ncol=2)
    return fig


def case_gamma_contour(ax, bar, sweep, z):
    """The case Γ as a labelled contour of Γ_hold; legend handles."""
    label = f"case Γ = {sweep.gamma:g} {GAMMA_UNIT}"
    if z.count() == 0:
        return []
    note = level_contour(ax, bar, sweep, z, sweep.gamma, label)
    text = f"{label}: held down where {HOLD} is below it" + (f" ({note})" if note else "")
    return [Line2D([], [], color="red", linewidth=2, label=text)]


def hold_groups(sweep):
    ok = sweep.ok_points()
    hold = [p.values["gamma_hold_J_per_m2"] for p in ok]
    held = [p for p, g in zip(ok, hold) if g <= sweep.gamma]
    loose = [p for p, g in zip(ok, hold) if g > sweep.gamma]
    unknown = [p for p, g in zip(ok, hold) if math.isnan(g)]
    return [("held down at case Γ", held, dict(s=30, facecolors="white", edgecolors="k")),
            ("needs more than case Γ", loose, dict(s=14, c="k")),
            (f"{HOLD} not found", unknown, dict(s=40, c="#D55E00", marker="+")),
            point_groups(sweep)[1]]


def gamma_1d(sweep):
    fig, ax = new_figure(sweep, "adhesion thresholds")
    points = sorted_points(sweep)
    x = np.array([p.coords[0] for p in points])
    hold, snap, eq = (column_1d(points, c) for c in GAMMA_COLUMNS)
    both = np.isfinite(hold) & np.isfinite(snap)
    ax.fill_between(x, hold, snap, where=both, color="#E69F00", alpha=0.25, linewidth=0,
                    label="bistable (hysteresis)")
    ax.plot(x, hold, "o-", color="#0072B2", label=r"$\Gamma_\mathrm{hold}$: holds once laid down")
    ax.plot(x, eq, "s--", color="#009E73", label=r"$\Gamma_\mathrm{eq}$: equal energy")
    ax.plot(x, snap, "^-", color="#D55E00", label=r"$\Gamma_\mathrm{snap}$: snaps down unaided")
    ax.axhline(sweep.gamma, color="red", linewidth=1.5, linestyle=":",
               label=f"case Γ = {sweep.gamma:g} {GAMMA_UNIT}")
    mark_failed_1d(ax, points)
    set_axis(ax, sweep.axes[0], "x")
    ax.set_ylabel(f"work of adhesion Γ [{GAMMA_UNIT}]")
    ax.grid(alpha=0.3)
    legend_below(ax)
    return fig


# ---------------------------------------------------------------- conformed fraction along the Γ paths

def chosen_path_points(sweep):
    points = sorted((p for p in sweep.ok_points() if p.number in sweep.paths), key=lambda p: p.coords[::-1])
    if len(points) <= MAX_PATH_POINTS:
        return points, len(points)
    picks = np.unique(np.round(np.linspace(0, len(points) - 1, MAX_PATH_POINTS)).astype(int))
    return [points[i] for i in picks], len(points)


def gamma_fraction(sweep):
    points, total = chosen_path_points(sweep)
    subject = "conformed fraction along the Γ paths"
    if len(points) < total:
        subject += f" ({len(points)} of {total} points, evenly spaced)"
    fig, ax = new_figure(sweep, subject, size=(9.0, 5.4))
    for colour, p in zip(plt.get_cmap("tab10").colors, points):
        label = ", ".join(a.describe(c) for a, c in zip(sweep.axes, p.coords))
        for kind, style in (("down", "-"), ("up", "--")):
            if kind in sweep.paths[p.number]:
                g, f = sweep.paths[p.number][kind]
                ax.plot(g, 100 * f, style, color=colour, marker=".", markersize=4,
                        label=label if kind == "down" or "down" not in sweep.paths[p.number] else None)
    reference_lines(ax, sweep)
    gamma_scale(ax, points, sweep)
    ax.set_xlabel(f"work of adhesion Γ [{GAMMA_UNIT}]")
    ax.set_ylabel("conformed fraction [%]")
    ax.set_ylim(-3, 103)
    ax.grid(alpha=0.3)
    ax.legend(handles=ax.get_legend_handles_labels()[0] + path_style_handles(sweep), fontsize=8,
              loc="upper left", bbox_to_anchor=(1.02, 1), frameon=False)
    return fig


def reference_lines(ax, sweep):
    ax.axvline(sweep.gamma, color="red", linestyle=":", linewidth=1.5)
    ax.axhline(100 * sweep.target, color="0.3", linestyle=":", linewidth=1.2)


def path_style_handles(sweep):
    return [Line2D([], [], color="none", label=""),
            Line2D([], [], color="k", linestyle="-", label="down: lowering Γ from conformed"),
            Line2D([], [], color="k", linestyle="--", label="up: raising Γ from laid down"),
            Line2D([], [], color="red", linestyle=":", label=f"case Γ = {sweep.gamma:g} {GAMMA_UNIT}"),
            Line2D([], [], color="0.3", linestyle=":", label=f"target fraction {100 * sweep.target:g} %")]


def gamma_scale(ax, points, sweep):
    """Log Γ axis when the paths span two decades or more."""
    gammas = np.concatenate([g for p in points for g, _ in sweep.paths[p.number].values()] + [[sweep.gamma]])
    gammas = gammas[np.isfinite(gammas)]
    if gammas.size and gammas.min() > 0 and gammas.max() / gammas.min() >= 100:
        ax.set_xscale("log")


# ---------------------------------------------------------------- driver

def figures(sweep):
    """(stem, function) of each figure this sweep supports."""
    two = len(sweep.axes) == 2
    chosen = [("regime_map", regime_map_2d if two else regime_map_1d),
              ("peak_strain", peak_strain_2d if two else peak_strain_1d)]
    if sweep.thresholds:
        chosen.append(("gamma_hold", gamma_hold_2d if two else gamma_1d))
        if sweep.paths:
            chosen.append(("gamma_fraction", gamma_fraction))
    return chosen


def write_figures(sweep, out_dir):
    os.makedirs(out_dir, exist_ok=True)
    for stem, plot in figures(sweep):
        fig = plot(sweep)
        finish(fig)
        try:
            for path in save_atomically(fig, out_dir, stem):
                print(path, flush=True)
        finally:
            plt.close(fig)


def parse_args(argv):
    parser = argparse.ArgumentParser(prog="plot_sweep", description="Figures of a nappe design sweep.")
    parser.add_argument("sweep_dir", metavar="SWEEP_DIR", help="directory with sweep.json and sweep.csv")
    parser.add_argument("--out", metavar="DIR", help="where to write the figures (default: SWEEP_DIR)")
    return parser.parse_args(argv)


def main(argv=None):
    args = parse_args(argv)
    try:
        sweep = load_sweep(args.sweep_dir)
    except InputError as err:
        print(f"plot_sweep: {err}", file=sys.stderr)
        return 2
    out_dir = args.out or args.sweep_dir
    try:
        write_figures(sweep, out_dir)
    except OSError as err:
        print(f"plot_sweep: cannot write figures into {out_dir}: {err}", file=sys.stderr)
        return 1
    return 0


UMASK = os.umask(0)
os.umask(UMASK)

if __name__ == "__main__":
    sys.exit(main())
