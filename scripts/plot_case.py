#!/usr/bin/env python3
"""Figures of one nappe solve: maps of the sheet and, for 1D-like cells, a line cut.

Usage:
    python3 scripts/plot_case.py CASE_STEM [--out DIR]

CASE_STEM is the result name nappe-solve wrote (e.g. out/pillars for out/pillars.json; the name of
either file is accepted too). Reads:

    CASE_STEM.json       the summary: case title, sheet material (and fracture strain if given), the
                         extremes with their locations, the conformation verdict, warnings
    CASE_STEM_map.csv    the fields sampled on a regular grid over the sheet's bounding box, one row per
                         grid point on the sheet (points off the sheet, e.g. outside a disk, are absent)

Writes into the stem's directory (or DIR), each as .png and .svg, NAME being the stem's file name:

    NAME_deflection_map  deflection w [nm], substrate height contours, the largest deflection marked
    NAME_strain_map      larger principal strain [%], the fracture strain contour where known, the
                         largest strain marked
    NAME_gap_map         gap to the substrate [nm] with the contact region outlined (with a substrate)
    NAME_pseudo_field_map, NAME_potential_map, NAME_gap_shift_map
                         the electronic estimates where the map has them (pseudo-magnetic field of
                         valley K [T], deformation potential [eV], optical gap shift [meV];
                         docs/electronics.md), the summary's extreme marked
    NAME_line_cut        deflection and substrate, principal strains and gap along x (1D-like cells:
                         fewer than 3 grid rows in y, or fields that do not vary along y by more than
                         0.1 % of their range)

Maps need at least 3 grid rows in y. Prints each file it wrote. Bad input: one message naming the
file and line on stderr, exit status 2, nothing written. Cannot write: exit status 1.

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib); run with /usr/bin/python3 if
another python3 comes first on PATH.
"""

import math
import os
import sys
from dataclasses import dataclass, field

import nappe_plotting as npl
from nappe_plotting import InputError, np, plt
from matplotlib.colors import TwoSlopeNorm
from matplotlib.lines import Line2D
from matplotlib.patches import Patch

MAP_COLUMNS = ("x_nm", "y_nm", "w_nm", "principal_strain_1", "principal_strain_2")
SUBSTRATE_COLUMNS = ("gap_nm", "substrate_height_nm", "conformed")
FLAT_ALONG_Y = 1e-3  # a field is y-invariant if it varies along y by less than this share of its range
MAX_WARNINGS = 3
CONTACT_COLOUR = "#D55E00"
OFF_SHEET = "0.93"
# map column: (figure name, subject, unit, extreme of the summary marked on it)
ELECTRONIC_MAPS = {
    "pseudo_magnetic_field_K_T": ("pseudo_field_map", "pseudo-magnetic field B, valley K (K′: −B)", "T",
                                  "max_pseudo_magnetic_field_K"),
    "deformation_potential_eV": ("potential_map", "deformation potential V = g tr ε", "eV",
                                 "max_deformation_potential"),
    "gap_shift_meV": ("gap_shift_map", "optical gap shift (trace model)", "meV", "min_gap_shift"),
}
ELECTRONIC_NOTE = "First-order continuum estimates, not band structures: confirm with electronic-structure " \
                  "calculations and measurement."


@dataclass
class Extreme:
    value: float  # in the figure's unit (nm, or % for strains)
    x: float  # nm
    y: float  # nm


@dataclass
class Summary:
    title: str
    material: str
    fracture: float  # fracture strain [-], NaN if not given
    verdict: str  # "" without a substrate
    conformed_fraction: float  # NaN without a substrate
    extremes: dict = field(default_factory=dict)
    warnings: list = field(default_factory=list)


@dataclass
class FieldMap:
    """Fields on the grid x (nx) × y (ny); each field an (ny, nx) array, NaN off the sheet."""
    x: np.ndarray
    y: np.ndarray
    fields: dict

    def has_substrate(self):
        return "gap_nm" in self.fields


@dataclass
class Case:
    name: str
    summary: Summary
    map: FieldMap


# ---------------------------------------------------------------- the summary (CASE_STEM.json)

def coordinate(obj, key, path, context):
    """An extreme's x or y in nm: a number, or a {"value", "unit": "nm"} quantity."""
    if isinstance(obj.get(key), (int, float)) and not isinstance(obj.get(key), bool):
        return npl.json_number(obj, key, path, context)
    return npl.json_quantity(obj, key, path, npl.NM_UNITS, context)


def parse_extreme(extremes, key, path):
    context, raw = f"extremes.{key}.", extremes[key]
    if not isinstance(raw, npl.JsonObject):
        raise InputError(f"{npl.where(path, extremes, key)}: 'extremes.{key}' must be an object with value, unit, x, y")
    value = npl.json_number(raw, "value", path, context)
    unit = npl.json_string(raw, "unit", path, context)
    scale = {"nm": 1.0, "1": 100.0, "%": 1.0}
    if key in ("max_deflection", "max_principal_strain") and unit not in scale:
        raise InputError(f"{npl.where(path, raw, 'unit')}: '{context}unit' must be nm, 1 or %, found '{unit}'")
    return Extreme(value * scale.get(unit, 1.0), coordinate(raw, "x", path, context),
                   coordinate(raw, "y", path, context))


def parse_warnings(raw, path):
    warnings = raw.get("warnings", [])
    if not isinstance(warnings, list) or not all(isinstance(w, str) for w in warnings):
        raise InputError(f"{npl.where(path, raw, 'warnings')}: 'warnings' must be a list of texts")
    return warnings


def load_summary(path):
    raw = npl.read_json(path, "the summary of a nappe-solve run (<name>.json)")
    sheet = npl.json_object(raw, "sheet", path, "the sheet's material")
    fracture = math.nan
    if "fracture_strain" in sheet:
        fracture = npl.json_quantity(sheet, "fracture_strain", path, npl.FRACTION_UNITS, "sheet.")
    extremes = npl.json_object(raw, "extremes", path, "the extremes with their locations")
    summary = Summary(npl.json_string(raw, "case", path), npl.json_string(sheet, "material", path, "sheet."),
                      fracture, "", math.nan, {k: parse_extreme(extremes, k, path) for k in extremes},
                      parse_warnings(raw, path))
    if "conformation" in raw:
        conformation = npl.json_object(raw, "conformation", path, "the verdict and the conformed fraction")
        summary.verdict = npl.json_string(conformation, "verdict", path, "conformation.")
        summary.conformed_fraction = npl.json_quantity(conformation, "conformed_fraction", path,
                                                       npl.FRACTION_UNITS, "conformation.")
    return summary


# ---------------------------------------------------------------- the map (CASE_STEM_map.csv)

def grid_positions(values):
    """The distinct coordinates (ascending) and each value's index among them (rounding tolerated)."""
    span = max(float(np.ptp(values)), 1e-12)
    keys = np.round((values - values.min()) / span, 8)
    distinct, index = np.unique(keys, return_inverse=True)
    coordinates = np.empty(len(distinct))
    coordinates[index] = values
    return coordinates, index


def load_map(path, summary, summary_path):
    table = npl.read_table(path, MAP_COLUMNS)
    present = [c for c in SUBSTRATE_COLUMNS if c in table.header]
    if present and len(present) != len(SUBSTRATE_COLUMNS) or (not present and summary.verdict):
        missing = ", ".join(f"'{c}'" for c in SUBSTRATE_COLUMNS if c not in present)
        why = f"{summary_path} reports a substrate" if summary.verdict else "the substrate columns come together"
        raise InputError(f"{path} line 1: missing column {missing} ({why})")
    if len(table.rows) < 2:
        raise InputError(f"{path}: {len(table.rows)} data rows; expected the fields at the grid points of the sheet")
    columns = {name: npl.number_column(table, name) for name in table.header}
    if present:
        outside = np.flatnonzero((columns["conformed"] < 0) | (columns["conformed"] > 1))
        if outside.size:
            raise InputError(f"{table.at(outside[0])}: column 'conformed' must be between 0 and 1, "
                             f"found {columns['conformed'][outside[0]]:g}")
    x, ix = grid_positions(columns["x_nm"])
    y, iy = grid_positions(columns["y_nm"])
    check_distinct_points(table, iy * len(x) + ix)
    if len(x) < 2:
        raise InputError(f"{path}: all rows have x = {x[0]:g} nm; expected a grid with at least 2 values of x")
    fields = {}
    for name, values in columns.items():
        grid = np.full((len(y), len(x)), np.nan)
        grid[iy, ix] = values
        fields[name] = grid
    return FieldMap(x, y, fields)


def check_distinct_points(table, keys):
    _, first, counts = np.unique(keys, return_index=True, return_counts=True)
    if (counts > 1).any():
        repeated = first[np.argmax(counts > 1)]
        later = np.flatnonzero(keys == keys[repeated])[1]
        raise InputError(f"{table.at(later)}: the grid point of line {table.lines[repeated]} appears again")


def check_extremes_on_map(summary, field_map, path, map_path):
    """An extreme outside the map's bounding box means the two files are not from one run."""
    x, y = field_map.x, field_map.y
    dx, dy = (np.diff(a).max() if len(a) > 1 else 0.0 for a in (x, y))
    for key, e in summary.extremes.items():
        if not (x[0] - dx <= e.x <= x[-1] + dx and y[0] - dy <= e.y <= y[-1] + dy):
            raise InputError(f"{path}: 'extremes.{key}' lies at ({e.x:g}, {e.y:g}) nm, outside the grid of "
                             f"{map_path} (x {x[0]:g}…{x[-1]:g} nm, y {y[0]:g}…{y[-1]:g} nm); expected the two "
                             "files of one run")


def load(argument):
    stem = npl.strip_suffix(argument, ("_map.csv", ".json"))
    summary_path, map_path = stem + ".json", stem + "_map.csv"
    summary = load_summary(summary_path)
    field_map = load_map(map_path, summary, summary_path)
    check_extremes_on_map(summary, field_map, summary_path, map_path)
    return Case(os.path.basename(stem), summary, field_map)


# ---------------------------------------------------------------- which pictures fit

def flat_along_y(grid):
    """Whether a field varies along y by less than FLAT_ALONG_Y of its range (NaN ignored)."""
    finite = np.isfinite(grid)
    if not finite.any():
        return True
    spread = np.nanmax(grid, axis=0) - np.nanmin(grid, axis=0)
    scale = float(np.nanmax(grid) - np.nanmin(grid))
    return bool(np.nanmax(spread) <= FLAT_ALONG_Y * scale) if scale > 0 else True


def is_one_dimensional(field_map):
    fields = ("w_nm", "principal_strain_1", "gap_nm")
    return len(field_map.y) < 3 or all(flat_along_y(field_map.fields[f]) for f in fields if f in field_map.fields)


def cut_row(field_map):
    """The grid row of the line cut: among the rows with the most points on the sheet, the nearest to
    the middle of the y range."""
    counts = np.isfinite(field_map.fields["w_nm"]).sum(axis=1)
    rows = np.flatnonzero(counts == counts.max())
    middle = 0.5 * (field_map.y[0] + field_map.y[-1])
    return int(rows[np.argmin(np.abs(field_map.y[rows] - middle))])


# ---------------------------------------------------------------- maps

def map_figure(case, subject):
    width, height = np.ptp(case.map.x), np.ptp(case.map.y)
    fig, ax = plt.subplots(figsize=(8.2, 6.4))
    npl.set_title(fig, case.summary.title, f"{subject} — {case.summary.material}")
    ax.set_xlabel("x [nm]")
    ax.set_ylabel("y [nm]")
    if 0.2 <= height / max(width, 1e-300) <= 5:
        ax.set_aspect("equal")
    return fig, ax


def shade(fig, ax, case, values, label, **style):
    mesh = ax.pcolormesh(npl.cell_edges(case.map.x), npl.cell_edges(case.map.y), np.ma.masked_invalid(values),
                         shading="flat", rasterized=True, **style)  # an image inside the SVG, not a path per cell
    npl.tag(mesh, "map")
    fig.colorbar(mesh, ax=ax, shrink=0.9).set_label(label)
    return mesh


def mark_extreme(ax, case, key, text, unit):
    extreme = case.summary.extremes.get(key)
    if extreme is None:
        return []
    npl.tag(ax.plot(extreme.x, extreme.y, marker="*", markersize=15, color="white", markeredgecolor="k",
                    linestyle="none", zorder=5)[0], f"extreme:{key}")
    return [Line2D([], [], marker="*", markersize=12, color="white", markeredgecolor="k", linestyle="none",
                   label=f"{text} = {npl.significant(extreme.value)} {unit} at (x, y) = "
                         f"({extreme.x:.4g}, {extreme.y:.4g}) nm")]


def substrate_contours(ax, case):
    height = case.map.fields.get("substrate_height_nm")
    if height is None or not np.isfinite(height).any() or np.nanmax(height) - np.nanmin(height) <= 0:
        return []
    lines = ax.contour(case.map.x, case.map.y, np.ma.masked_invalid(height), levels=6, colors="white",
                       linewidths=0.7, alpha=0.8)
    npl.tag(lines, "substrate_contours")
    step = lines.levels[1] - lines.levels[0] if len(lines.levels) > 1 else 0
    return [Line2D([], [], color="0.6", linewidth=0.8, label=f"substrate height contours, every {step:.3g} nm")]


def deflection_map(case):
    fig, ax = map_figure(case, "deflection w")
    shade(fig, ax, case, case.map.fields["w_nm"], "deflection w [nm]", cmap="viridis")
    handles = substrate_contours(ax, case) + mark_extreme(ax, case, "max_deflection", "largest |w|", "nm")
    finish_map(ax, case, handles)
    return fig, notes(case)


def strain_norm(values):
    """Centred at zero (blue compression, red tension) when both signs appear, else sequential."""
    lo, hi = float(np.nanmin(values)), float(np.nanmax(values))
    if lo < 0 < hi:
        return dict(cmap="RdBu_r", norm=TwoSlopeNorm(0.0, lo, hi))
    return dict(cmap="magma")


def strain_map(case):
    fig, ax = map_figure(case, "larger principal strain")
    strain = 100 * case.map.fields["principal_strain_1"]
    shade(fig, ax, case, strain, "larger principal strain ε₁ [%]", **strain_norm(strain))
    handles = fracture_contour(ax, case, strain) + mark_extreme(ax, case, "max_principal_strain",
                                                               "largest principal strain", "%")
    finish_map(ax, case, handles)
    return fig, notes(case)


def fracture_contour(ax, case, strain_pct):
    fracture = case.summary.fracture
    if math.isnan(fracture):
        return [Line2D([], [], color="none", label=f"fracture strain of {case.summary.material}: not given")]
    level = 100 * fracture
    label = f"fracture strain {npl.percent(fracture)}"
    if np.nanmax(strain_pct) < level:
        largest = npl.significant(np.nanmax(strain_pct))
        return [Line2D([], [], color="none", label=f"{label}: not reached (largest {largest} %)")]
    npl.tag(ax.contour(case.map.x, case.map.y, np.ma.masked_invalid(strain_pct), levels=[level], colors="k",
                       linewidths=2), "fracture_contour")
    return [Line2D([], [], color="k", linewidth=2, label=f"{label}: exceeded inside")]


def gap_map(case):
    fig, ax = map_figure(case, "gap to the substrate")
    shade(fig, ax, case, case.map.fields["gap_nm"], "gap [nm]", cmap="cividis")
    contact = case.map.fields["conformed"]
    handles = [Line2D([], [], color="none", label=verdict_text(case.summary))]
    if np.nanmin(contact) < 0.5 < np.nanmax(contact):
        npl.tag(ax.contour(case.map.x, case.map.y, np.ma.masked_invalid(contact), levels=[0.5],
                           colors=CONTACT_COLOUR, linewidths=2.2), "contact_outline")
        handles.append(Line2D([], [], color=CONTACT_COLOUR, linewidth=2.2, label="edge of the contact region"))
    else:
        handles.append(Line2D([], [], color="none", label="in contact everywhere" if np.nanmin(contact) >= 0.5
                              else "no contact anywhere"))
    finish_map(ax, case, handles)
    return fig, notes(case) + ["Contact: the gap is within the adhesion range up to the peak traction."]


def electronic_map(case, column):
    _, subject, unit, key = ELECTRONIC_MAPS[column]
    fig, ax = map_figure(case, subject)
    values = case.map.fields[column]
    shade(fig, ax, case, values, f"{subject} [{unit}]", **strain_norm(values))
    finish_map(ax, case, mark_extreme(ax, case, key, key.replace("_", " "), unit))
    return fig, notes(case) + [ELECTRONIC_NOTE]


def verdict_text(summary):
    return f"the sheet {summary.verdict} (conformed fraction {npl.percent(summary.conformed_fraction)})"


def finish_map(ax, case, handles):
    """Grey where the grid leaves the sheet (e.g. outside a disk), and the legend."""
    ax.set_facecolor(OFF_SHEET)
    if not np.isfinite(case.map.fields["w_nm"]).all():
        handles = handles + [Patch(facecolor=OFF_SHEET, edgecolor="0.6", label="off the sheet")]
    npl.legend_below(ax, handles, ncol=1, offset=-0.1)


def notes(case):
    warnings = case.summary.warnings
    shown = [f"Warning: {w}" for w in warnings[:MAX_WARNINGS]]
    if len(warnings) > MAX_WARNINGS:
        shown.append(f"({len(warnings) - MAX_WARNINGS} more warnings in {case.name}.json)")
    return shown


# ---------------------------------------------------------------- line cut

def contact_spans(ax, x, contact, label):
    """Shades the runs of x where the sheet is in contact."""
    inside = np.nan_to_num(contact, nan=0.0) >= 0.5
    edges = npl.cell_edges(x)
    runs = np.flatnonzero(np.diff(np.concatenate(([0], inside.astype(int), [0]))))
    for n, (start, stop) in enumerate(zip(runs[::2], runs[1::2])):
        npl.tag(ax.axvspan(edges[start], edges[stop], color=CONTACT_COLOUR, alpha=0.12, linewidth=0,
                           label="in contact" if n == 0 and label else None), "contact_span")


def line_cut(case):
    fields, row = case.map.fields, cut_row(case.map)
    x, substrate = case.map.x, case.map.has_substrate()
    panels = 3 if substrate else 2
    fig, axes = plt.subplots(panels, 1, sharex=True, figsize=(8.4, 2.6 * panels + 1.4))
    y_text = "" if len(case.map.y) == 1 else f" at y = {case.map.y[row]:.4g} nm"
    npl.set_title(fig, case.summary.title, f"line cut along x{y_text} — {case.summary.material}")
    heights, strains = axes[0], axes[1]
    npl.tag(heights.plot(x, fields["w_nm"][row], color="#0072B2", linewidth=1.8, label="sheet (deflection w)")[0],
            "cut:w_nm")
    if substrate:
        surface = fields["substrate_height_nm"][row]
        heights.fill_between(x, np.nanmin(surface) - 0.05 * max(np.ptp(surface), 1), surface, color="0.75",
                             label="substrate")
        for k, ax in enumerate(axes):
            contact_spans(ax, x, fields["conformed"][row], label=k == 0)
        npl.tag(axes[2].plot(x, fields["gap_nm"][row], color="#009E73", linewidth=1.6, label="gap")[0], "cut:gap_nm")
        axes[2].set_ylabel("gap [nm]")
        axes[2].set_ylim(bottom=0)
    heights.set_ylabel("height [nm]")
    cut_strains(strains, case, row)
    for ax in axes:
        ax.grid(alpha=0.3)
        ax.legend(fontsize=8, loc="upper left", bbox_to_anchor=(1.01, 1), frameon=False)
    axes[-1].set_xlabel("x [nm]")
    axes[-1].set_xlim(x[0], x[-1])
    return fig, notes(case) + ([verdict_text(case.summary).capitalize() + "."] if substrate else [])


def cut_strains(ax, case, row):
    fields, x = case.map.fields, case.map.x
    npl.tag(ax.plot(x, 100 * fields["principal_strain_1"][row], color="#D55E00", linewidth=1.6,
                    label="ε₁ (larger principal)")[0], "cut:principal_strain_1")
    npl.tag(ax.plot(x, 100 * fields["principal_strain_2"][row], color="#CC79A7", linewidth=1.4, linestyle="--",
                    label="ε₂ (smaller principal)")[0], "cut:principal_strain_2")
    fracture = case.summary.fracture
    top = np.nanmax(100 * fields["principal_strain_1"][row])
    if not math.isnan(fracture) and 100 * fracture <= 3 * max(top, 1e-12):
        ax.axhline(100 * fracture, color="k", linestyle=":", label=f"fracture strain {npl.percent(fracture)}")
    ax.axhline(0, color="0.5", linewidth=0.8)
    ax.set_ylabel("principal strain [%]")


# ---------------------------------------------------------------- driver

def figures(case, _argument):
    chosen = []
    if len(case.map.y) >= 3:
        chosen += [(f"{case.name}_deflection_map", lambda: deflection_map(case)),
                   (f"{case.name}_strain_map", lambda: strain_map(case))]
        if case.map.has_substrate():
            chosen.append((f"{case.name}_gap_map", lambda: gap_map(case)))
        chosen += [(f"{case.name}_{ELECTRONIC_MAPS[c][0]}", lambda c=c: electronic_map(case, c))
                   for c in ELECTRONIC_MAPS if c in case.map.fields]
    if is_one_dimensional(case.map):
        chosen.append((f"{case.name}_line_cut", lambda: line_cut(case)))
    return chosen


if __name__ == "__main__":
    sys.exit(npl.run_script("plot_case", __doc__, "result name of a nappe-solve run (CASE_STEM, or CASE_STEM.json "
                            "or CASE_STEM_map.csv)", load, figures))
