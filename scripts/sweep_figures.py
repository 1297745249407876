"""The figures of a design sweep, drawn from a Sweep read by plot_sweep.py.

Each public function takes the sweep and returns (figure, notes): the regime map, the largest
principal strain, the work of adhesion needed to hold the sheet down, and the conformed fraction
along the Γ paths. A sweep has one or two axes; a categorical axis (named values) is drawn as
categories at positions 0, 1, … in the sweep file's order, and fields over it are drawn as cells
(no contour or line interpolates between named values).
"""

import math
from dataclasses import dataclass

import nappe_plotting as npl
from nappe_plotting import np, plt, GAMMA_UNIT
from matplotlib.colors import ListedColormap
from matplotlib.lines import Line2D
from matplotlib.patches import Patch, Rectangle
from matplotlib.ticker import MaxNLocator

REGIMES = ("conforms", "touches the floor", "tents on the tops", "suspended")
REGIME_COLOURS = {"conforms": "#009E73", "touches the floor": "#F0E442", "tents on the tops": "#E69F00",
                  "suspended": "#0072B2"}
DARK_REGIMES = ("conforms", "suspended")  # white text reads on these
FAILED_COLOUR = "0.82"
GAMMA_COLUMNS = ("gamma_hold_J_per_m2", "gamma_snap_J_per_m2", "gamma_eq_J_per_m2")
MAX_PATH_POINTS = 8
MAX_CELL_TEXTS = 64
HOLD = r"$\Gamma_\mathrm{hold}$"
ABOVE_FRACTURE = dict(s=140, facecolors="none", edgecolors="red", linewidths=2.0, marker="o")
OUTLINE_ABOVE_FRACTURE = dict(edgecolor="red", linewidth=2.5)


# ---------------------------------------------------------------- axes and grids

def new_figure(sweep, subject, size=(8.4, 5.6)):
    fig, ax = plt.subplots(figsize=size)
    npl.set_title(fig, sweep.title, subject)
    return fig, ax


def is_log(axis):
    v = axis.values
    return not axis.categorical and len(v) > 2 and v[0] > 0 and v[-1] / v[0] >= 100


def set_axis(ax, axis, which):
    """Label and scale; ticks at the sweep values when few, at the names on a categorical axis."""
    getattr(ax, f"set_{which}label")(axis.label())
    if is_log(axis):
        getattr(ax, f"set_{which}scale")("log")
    if axis.categorical or len(axis.values) <= 10:
        getattr(ax, f"set_{which}ticks")(axis.positions, [axis.text(i) for i in range(len(axis.values))])
        getattr(ax, f"{which}axis").set_minor_locator(plt.NullLocator())
    if axis.categorical:
        getattr(ax, f"set_{which}lim")(-0.5, len(axis.values) - 0.5)


def cell_edges(axis):
    return npl.cell_edges(axis.positions, log=is_log(axis))


def grid(sweep, value):
    """Masked (axis_2, axis_1) array of value(point) over ok points; missing/failed/NaN masked."""
    x_axis, y_axis = sweep.axes
    z = np.full((len(y_axis.values), len(x_axis.values)), np.nan)
    for p in sweep.ok_points():
        z[p.index[1], p.index[0]] = value(p)
    return np.ma.masked_invalid(z)


def smooth_grid(sweep, z):
    """Whether z may be contoured: both axes numeric, at least 2 × 2 values and 3 computed points."""
    return not sweep.any_categorical() and min(z.shape) >= 2 and z.count() >= 3


def levels_for(data):
    lo, hi = float(np.min(data)), float(np.max(data))
    if hi - lo <= 1e-12 * max(abs(lo), abs(hi), 1e-300):
        pad = 0.05 * abs(hi) if hi else 1.0
        lo, hi = lo - pad, hi + pad
    return MaxNLocator(nbins=10).tick_values(lo, hi)


def draw_field(fig, ax, sweep, z, cmap, label, cell_text):
    """Filled contours of z over a numeric grid, else cells with their value written in; the colour bar."""
    if z.count() == 0:
        ax.text(0.5, 0.5, "no computed values", transform=ax.transAxes, ha="center", va="center")
        return None
    levels = levels_for(z.compressed())
    if smooth_grid(sweep, z):
        shade = ax.contourf(*(a.positions for a in sweep.axes), z, levels=levels, cmap=cmap)
    else:
        shade = ax.pcolormesh(*(cell_edges(a) for a in sweep.axes), z, cmap=cmap, vmin=levels[0],
                              vmax=levels[-1], edgecolors="white", linewidth=1.0)
        shade.set_gid("cells")
        write_in_cells(ax, sweep, shade, cell_text)
    bar = fig.colorbar(shade, ax=ax)
    bar.set_label(label)
    return bar


def write_in_cells(ax, sweep, shade, text_of):
    """Each computed cell's value as text, white on dark colours."""
    if len(sweep.points) > MAX_CELL_TEXTS:
        return
    z = shade.get_array().reshape(len(sweep.axes[1].values), len(sweep.axes[0].values))
    for p in sweep.ok_points():
        value = z[p.index[1], p.index[0]]
        if np.ma.is_masked(value):
            continue
        red, green, blue, _ = shade.to_rgba(value)
        dark = 0.299 * red + 0.587 * green + 0.114 * blue < 0.5
        ax.text(*sweep.coords(p), text_of(p), ha="center", va="center", fontsize=8, zorder=5,
                color="white" if dark else "black")


def level_contour(ax, sweep, z, level, text, gid):
    """Red labelled contour of z at `level` on a numeric grid; returns why it is not drawn, or None."""
    lo, hi = float(z.min()), float(z.max())
    if level >= hi or level <= lo:
        return "above every point" if level >= hi else "below every point"
    if not smooth_grid(sweep, z):
        return None
    lines = ax.contour(*(a.positions for a in sweep.axes), z, levels=[level], colors="red", linewidths=2, zorder=3)
    npl.tag(lines, gid)
    npl.label_contour(ax, lines, text)
    return None


@dataclass
class Mark:
    """A group of points to mark on a 2D figure: `marker` (scatter style) on a contour map, `outline`
    (cell border style) on a cell map; None leaves the group unmarked there."""
    label: str
    points: list
    gid: str
    marker: dict = None
    outline: dict = None


def mark_points(ax, sweep, z, marks):
    """Marks each group; on a cell map failed cells are hatched and computed ones need no marker."""
    smooth = smooth_grid(sweep, z)
    if not smooth:
        hatch_failed(ax, sweep)
    for mark in marks:
        style = mark.marker if smooth else mark.outline
        if mark.points and style is not None:
            (scatter_points if smooth else outline_cells)(ax, sweep, mark, style)
    mark_missing(ax, sweep)


def scatter_points(ax, sweep, mark, style):
    xs, ys = zip(*(sweep.coords(p) for p in mark.points))
    npl.tag(ax.scatter(xs, ys, label=mark.label, zorder=4, clip_on=False, **style), mark.gid)


def outline_cells(ax, sweep, mark, style):
    edges = [cell_edges(a) for a in sweep.axes]
    for n, p in enumerate(mark.points):
        (x0, x1), (y0, y1) = ((e[i], e[i + 1]) for e, i in zip(edges, p.index))
        dx, dy = 0.06 * (x1 - x0), 0.06 * (y1 - y0)  # inset: neighbouring outlines stay apart
        cell = Rectangle((x0 + dx, y0 + dy), x1 - x0 - 2 * dx, y1 - y0 - 2 * dy, fill=False, zorder=4,
                         label=mark.label if n == 0 else None, **style)
        npl.tag(ax.add_patch(cell), mark.gid)


def missing_cells(sweep):
    x_axis, y_axis = sweep.axes
    taken = {p.index for p in sweep.points}
    return [(x, y) for i, x in enumerate(x_axis.positions) for j, y in enumerate(y_axis.positions)
            if (i, j) not in taken]


def point_marks(sweep):
    failed = [p for p in sweep.points if not p.ok]
    return [Mark("computed point", sweep.ok_points(), "computed", dict(s=16, facecolors="white", edgecolors="k")),
            Mark("failed point", failed, "failed", dict(s=40, c="0.25", marker="x"))]


def mark_missing(ax, sweep):
    cells = missing_cells(sweep)
    if cells:
        ax.scatter(*zip(*cells), marker="s", s=30, facecolors="none", edgecolors="0.5", zorder=4, clip_on=False,
                   label="not in sweep.csv")


def sorted_points(sweep):
    return sorted(sweep.points, key=lambda p: p.index[0])


def column_1d(points, key, scale=1.0):
    return np.array([p.values[key] * scale if p.ok else np.nan for p in points])


def line_style(axis):
    """Markers joined by lines along a numeric axis, markers alone over named values."""
    return "-" if not axis.categorical else "none"


def mark_failed_1d(ax, sweep, points):
    failed = [sweep.coords(p)[0] for p in points if not p.ok]
    if failed:
        ax.scatter(failed, [0.03] * len(failed), transform=ax.get_xaxis_transform(), marker="x",
                   s=40, c="0.25", zorder=5, label="failed point", clip_on=False)


def failure_notes(sweep, shown=3):
    """How many points failed, and why for the first few (the message column of sweep.csv)."""
    failed = sorted((p for p in sweep.points if not p.ok), key=lambda p: p.number)
    if not failed:
        return []
    notes = [f"{len(failed)} of {len(sweep.points)} points failed; see the message column of sweep.csv."]
    for p in failed[:shown]:
        where = ", ".join(a.describe(i) for a, i in zip(sweep.axes, p.index))
        notes.append(f"Point {p.number} ({where}): {p.message or 'no message'}")
    if len(failed) > shown:
        notes.append(f"… and {len(failed) - shown} more.")
    return notes


def deciding_axis(sweep, attribute):
    """The categorical axis whose value decides a per-point attribute (e.g. the material decides the
    fracture strain), or None."""
    for k, axis in enumerate(sweep.axes):
        found = {}
        for p in sweep.points:
            value = getattr(p, attribute)
            found.setdefault(p.index[k], set()).add("unknown" if math.isnan(value) else value)
        if axis.categorical and all(len(v) == 1 for v in found.values()):
            return k
    return None


def per_point_values(sweep, attribute, show):
    """The values of a per-point attribute in words: by category where a categorical axis decides it
    (e.g. 'graphene 25 %, MoS2 6 %'), else the distinct values."""
    k = deciding_axis(sweep, attribute)
    if k is not None:
        first = {}
        for p in sorted(sweep.points, key=lambda p: p.index[k]):
            first.setdefault(sweep.axes[k].values[p.index[k]], getattr(p, attribute))
        return ", ".join(f"{name} {show(value)}" for name, value in first.items())
    values = [getattr(p, attribute) for p in sweep.points]
    known = sorted({v for v in values if not math.isnan(v)})
    unknown = sum(map(math.isnan, values))
    return ", ".join(map(show, known)) + (f"; unknown at {unknown} points" if unknown else "")


def show_fracture(value):
    return "unknown" if math.isnan(value) else f"{100 * value:g} %"


def show_gamma(value):
    return "none" if math.isnan(value) else f"{value:g} {GAMMA_UNIT}"


# ---------------------------------------------------------------- regime map

def regime_map(sweep):
    return (regime_map_2d if len(sweep.axes) == 2 else regime_map_1d)(sweep), failure_notes(sweep)


def regime_code(point):
    return REGIMES.index(point.regime) if point.ok else len(REGIMES)


def regime_map_2d(sweep):
    fig, ax = new_figure(sweep, "what the sheet does (cell text: conformed fraction)")
    x_axis, y_axis = sweep.axes
    codes = np.full((len(y_axis.values), len(x_axis.values)), -1)
    for p in sweep.points:
        codes[p.index[1], p.index[0]] = regime_code(p)
    colours = [REGIME_COLOURS[r] for r in REGIMES] + [FAILED_COLOUR]
    edges = [cell_edges(a) for a in sweep.axes]
    cells = ax.pcolormesh(*edges, np.ma.masked_less(codes, 0), cmap=ListedColormap(colours), vmin=-0.5,
                          vmax=len(REGIMES) + 0.5, edgecolors="white", linewidth=1.0)
    cells.set_gid("regime_cells")
    hatch_failed(ax, sweep)
    if len(sweep.points) <= MAX_CELL_TEXTS:
        for p in sweep.ok_points():
            ax.text(*sweep.coords(p), npl.percent(p.values["conformed_fraction"]), ha="center", va="center",
                    fontsize=8, zorder=3, color="white" if p.regime in DARK_REGIMES else "black")
    set_axis(ax, x_axis, "x")
    set_axis(ax, y_axis, "y")
    ax.legend(handles=regime_handles(sweep), loc="upper left", bbox_to_anchor=(1.02, 1), fontsize=9,
              title="the sheet …", title_fontsize=9)
    return fig


def hatch_failed(ax, sweep):
    edges = [cell_edges(a) for a in sweep.axes]
    for n, p in enumerate(p for p in sweep.points if not p.ok):
        (x0, x1), (y0, y1) = ((e[i], e[i + 1]) for e, i in zip(edges, p.index))
        npl.tag(ax.add_patch(Rectangle((x0, y0), x1 - x0, y1 - y0, facecolor=FAILED_COLOUR, edgecolor="0.45",
                                       hatch="///", linewidth=0, zorder=2, label="failed" if n == 0 else None)),
                "failed")


def regime_handles(sweep):
    handles = [Patch(facecolor=REGIME_COLOURS[r], label=r) for r in REGIMES]
    handles.append(Line2D([], [], color="none", label=f"conforms: fraction ≥ {npl.percent(sweep.target)}"))
    if any(not p.ok for p in sweep.points):
        handles.append(Patch(facecolor=FAILED_COLOUR, edgecolor="0.45", hatch="///", label="failed"))
    if missing_cells(sweep):
        handles.append(Patch(facecolor="white", edgecolor="0.6", label="not in sweep.csv"))
    return handles


def regime_map_1d(sweep):
    fig, ax = new_figure(sweep, "what the sheet does, and the conformed fraction")
    points = sorted_points(sweep)
    x = np.array([sweep.coords(p)[0] for p in points])
    row = np.array([len(REGIMES) - 1 - REGIMES.index(p.regime) if p.ok else -1 for p in points], dtype=float)
    if not sweep.axes[0].categorical:
        ax.step(x, np.where(row < 0, np.nan, row), where="mid", color="0.6", linewidth=1, zorder=1)
    names = ("failed",) + REGIMES[::-1]
    for r, regime in reversed(list(enumerate(names, start=-1))):
        if (row == r).any():
            ax.scatter(x[row == r], row[row == r], s=80, zorder=3, edgecolors="k", label=regime,
                       c=REGIME_COLOURS.get(regime, FAILED_COLOUR), marker="X" if r < 0 else "o").set_gid(regime)
    bottom = -1 if (row < 0).any() else 0
    ax.set_yticks(range(bottom, len(REGIMES)), names[bottom + 1:])
    ax.set_ylim(bottom - 0.5, len(REGIMES) - 0.5)
    set_axis(ax, sweep.axes[0], "x")
    right = fraction_on_twin(ax, sweep, x, column_1d(points, "conformed_fraction", 100))
    npl.legend_below(ax, ax.get_legend_handles_labels()[0] + right.get_legend_handles_labels()[0], ncol=3)
    return fig


def fraction_on_twin(ax, sweep, x, fraction_pct):
    right = ax.twinx()
    right.plot(x, fraction_pct, color="#CC79A7", marker="D", markersize=5, linewidth=1.5,
               linestyle=line_style(sweep.axes[0]), label="conformed fraction")
    right.axhline(100 * sweep.target, color="#CC79A7", linestyle=":", linewidth=1.2,
                  label=f"target fraction {npl.percent(sweep.target)}")
    right.set_ylim(-3, 103)
    right.set_ylabel("conformed fraction [%]", color="#A0527F")
    return right


# ---------------------------------------------------------------- largest principal strain

def above_fracture(sweep):
    return [p for p in sweep.ok_points()
            if not math.isnan(p.fracture) and p.values["max_principal_strain"] > p.fracture]


def fracture_handles(sweep, contoured, cells=False):
    """Legend entries saying how the fracture strain is shown."""
    shared, above = sweep.shared("fracture"), above_fracture(sweep)
    if shared is not None and math.isnan(shared):
        return [Line2D([], [], color="none", label="fracture strain unknown")]
    handles = []
    if shared is not None:
        text = f"fracture strain {npl.percent(shared)}" + (f" ({contoured})" if contoured else "")
        handles.append(Line2D([], [], color="red", linewidth=2, label=text))
    else:
        handles.append(Line2D([], [], color="none", label="fracture strain of each point: " +
                              per_point_values(sweep, "fracture", show_fracture)))
    label = f"above its own fracture strain ({len(above)} points)" if above else \
        "no point above its own fracture strain"
    if cells and above:
        handles.append(Patch(fill=False, edgecolor="red", linewidth=2.5, label=label))
    else:
        handles.append(Line2D([], [], linestyle="none", markerfacecolor="none", markeredgecolor="red",
                              markeredgewidth=2, marker="o", markersize=10 if above else 0, label=label))
    return handles


def peak_strain(sweep):
    fig = (peak_strain_2d if len(sweep.axes) == 2 else peak_strain_1d)(sweep)
    return fig, failure_notes(sweep)


def peak_strain_2d(sweep):
    fig, ax = new_figure(sweep, "largest principal strain")
    set_axis(ax, sweep.axes[0], "x")
    set_axis(ax, sweep.axes[1], "y")
    z = grid(sweep, lambda p: 100 * p.values["max_principal_strain"])
    bar = draw_field(fig, ax, sweep, z, "viridis", "largest principal strain [%]",
                     lambda p: npl.percent(p.values["max_principal_strain"], 2))
    contoured = fracture_level(ax, bar, sweep, z)
    mark_points(ax, sweep, z, point_marks(sweep) + [
        Mark(None, above_fracture(sweep), "above_fracture", ABOVE_FRACTURE, OUTLINE_ABOVE_FRACTURE)])
    handles = fracture_handles(sweep, contoured, cells=not smooth_grid(sweep, z))
    npl.legend_below(ax, ax.get_legend_handles_labels()[0] + handles, ncol=2)
    return fig


def fracture_level(ax, bar, sweep, z):
    """The shared fracture strain as a contour (numeric grid) and on the colour bar, or the contour
    strain = own fracture strain where the points differ; returns a note for the legend."""
    shared = sweep.shared("fracture")
    if z.count() == 0 or (shared is not None and math.isnan(shared)):
        return None
    if shared is not None:
        level = 100 * shared
        if bar is not None and bar.vmin <= level <= bar.vmax:
            bar.ax.axhline(level, color="red", linewidth=2)
        return level_contour(ax, sweep, z, level, f"fracture {level:g} %", "fracture_contour")
    ratio = grid(sweep, lambda p: p.values["max_principal_strain"] / p.fracture)
    if ratio.count() == z.count():
        level_contour(ax, sweep, ratio, 1.0, "own fracture strain", "fracture_ratio_contour")
    return None


def peak_strain_1d(sweep):
    fig, ax = new_figure(sweep, "largest principal strain")
    points, axis = sorted_points(sweep), sweep.axes[0]
    x = np.array([sweep.coords(p)[0] for p in points])
    strain = column_1d(points, "max_principal_strain", 100)
    npl.tag(ax.plot(x, strain, marker="o", linestyle=line_style(axis), color="#0072B2",
                    label="largest principal strain")[0], "strain")
    fracture_marks_1d(ax, sweep, points, x, strain)
    mark_failed_1d(ax, sweep, points)
    set_axis(ax, axis, "x")
    ax.set_ylabel("largest principal strain [%]")
    ax.set_ylim(bottom=0)
    ax.grid(alpha=0.3)
    npl.legend_below(ax, ax.get_legend_handles_labels()[0] + fracture_handles(sweep, None)[1:], ncol=2)
    return fig


def fracture_marks_1d(ax, sweep, points, x, strain_pct):
    """A fracture line when shared (noted instead when far off scale), else each point's own level."""
    shared = sweep.shared("fracture")
    top = np.nanmax(strain_pct) if np.isfinite(strain_pct).any() else 0
    if shared is not None and math.isnan(shared):
        ax.plot([], [], color="none", label="fracture strain unknown")
    elif shared is not None and top > 0 and 100 * shared > 3 * top:
        ax.plot([], [], color="red", linestyle="--", label=f"fracture strain {npl.percent(shared)} (off scale, "
                f"{100 * shared / top:.0f}× the largest strain)")
    elif shared is not None:
        npl.tag(ax.axhline(100 * shared, color="red", linestyle="--", linewidth=1.5,
                           label=f"fracture strain {npl.percent(shared)}"), "fracture_line")
    else:
        own = np.array([100 * p.fracture for p in points])
        npl.tag(ax.plot(x, own, linestyle="none", marker="_", markersize=22, markeredgewidth=2.5, color="red",
                        label="fracture strain of each point: " + per_point_values(sweep, "fracture", show_fracture)
                        )[0], "fracture_marks")
        for p in points[:MAX_CELL_TEXTS]:
            if p.ok and math.isnan(p.fracture):
                ax.annotate("fracture strain\nunknown", (sweep.coords(p)[0], 100 * p.values["max_principal_strain"]),
                            xytext=(0, 10), textcoords="offset points", ha="center", fontsize=8, color="0.35")
    above = above_fracture(sweep)
    if above:
        ax.scatter([sweep.coords(p)[0] for p in above], [100 * p.values["max_principal_strain"] for p in above],
                   zorder=4, **ABOVE_FRACTURE).set_gid("above_fracture")


# ---------------------------------------------------------------- adhesion thresholds

def gamma_hold(sweep):
    return (gamma_hold_2d if len(sweep.axes) == 2 else gamma_1d)(sweep), failure_notes(sweep)


def gamma_hold_2d(sweep):
    fig, ax = new_figure(sweep, f"work of adhesion needed to hold the sheet down, {HOLD}")
    set_axis(ax, sweep.axes[0], "x")
    set_axis(ax, sweep.axes[1], "y")
    z = grid(sweep, lambda p: p.values["gamma_hold_J_per_m2"])
    bar = draw_field(fig, ax, sweep, z, "cividis", f"{HOLD} [{GAMMA_UNIT}]",
                     lambda p: npl.significant(p.values["gamma_hold_J_per_m2"], 2))
    handles = own_gamma_level(ax, bar, sweep, z)
    mark_points(ax, sweep, z, hold_marks(sweep))
    npl.legend_below(ax, ax.get_legend_handles_labels()[0] + handles, ncol=2)
    return fig


def own_gamma_level(ax, bar, sweep, z):
    """The shared Γ as a contour of Γ_hold (numeric grid) and on the colour bar; where the points' Γ
    differ, the contour Γ_hold = own Γ (numeric grid) and the values in the legend."""
    shared = sweep.shared("gamma")
    if z.count() == 0 or (shared is not None and math.isnan(shared)):
        return []
    if shared is not None:
        if bar is not None and bar.vmin <= shared <= bar.vmax:
            bar.ax.axhline(shared, color="red", linewidth=2)
        label = f"Γ = {shared:g} {GAMMA_UNIT}"
        note = level_contour(ax, sweep, z, shared, label, "gamma_contour")
        text = f"{label} (every point): held down where {HOLD} is below it" + (f" ({note})" if note else "")
        return [Line2D([], [], color="red", linewidth=2, label=text)]
    ratio = grid(sweep, lambda p: p.values["gamma_hold_J_per_m2"] / p.gamma)
    if ratio.count() == z.count():
        level_contour(ax, sweep, ratio, 1.0, f"{HOLD} = own Γ", "gamma_ratio_contour")
    return [Line2D([], [], color="none", label="Γ of each point: " + per_point_values(sweep, "gamma", show_gamma))]


def hold_marks(sweep):
    """Held down or not at each point's own Γ: markers on a contour map; on a cell map the cells that
    need more than their own Γ are outlined (the others are held down)."""
    ok = [p for p in sweep.ok_points() if not math.isnan(p.gamma)]
    hold = [p.values["gamma_hold_J_per_m2"] for p in ok]
    return [Mark("held down at its own Γ", [p for p, g in zip(ok, hold) if g <= p.gamma], "held",
                 dict(s=34, facecolors="white", edgecolors="k")),
            Mark("needs more than its own Γ", [p for p, g in zip(ok, hold) if g > p.gamma], "not_held",
                 dict(s=18, c="k"), dict(edgecolor="red", linewidth=2.5)),
            Mark(f"{HOLD} not found", [p for p, g in zip(ok, hold) if math.isnan(g)], "hold_not_found",
                 dict(s=50, c="#D55E00", marker="+"), dict(edgecolor="#D55E00", linewidth=2, linestyle="--")),
            point_marks(sweep)[1]]


def gamma_1d(sweep):
    fig, ax = new_figure(sweep, "adhesion thresholds")
    points, axis = sorted_points(sweep), sweep.axes[0]
    x = np.array([sweep.coords(p)[0] for p in points])
    hold, snap, eq = (column_1d(points, c) for c in GAMMA_COLUMNS)
    both = np.isfinite(hold) & np.isfinite(snap)
    if axis.categorical:
        ax.vlines(x[both], hold[both], snap[both], color="#E69F00", alpha=0.35, linewidth=14,
                  label="bistable (hysteresis)")
    else:
        ax.fill_between(x, hold, snap, where=both, color="#E69F00", alpha=0.25, linewidth=0,
                        label="bistable (hysteresis)")
    style = line_style(axis)
    ax.plot(x, hold, marker="o", linestyle=style, color="#0072B2", label=f"{HOLD}: holds once laid down")
    ax.plot(x, eq, marker="s", linestyle=style if style == "none" else "--", color="#009E73",
            label=r"$\Gamma_\mathrm{eq}$: equal energy")
    ax.plot(x, snap, marker="^", linestyle=style, color="#D55E00", label=r"$\Gamma_\mathrm{snap}$: snaps down unaided")
    own_gamma_1d(ax, sweep, points, x)
    mark_failed_1d(ax, sweep, points)
    set_axis(ax, axis, "x")
    ax.set_ylabel(f"work of adhesion Γ [{GAMMA_UNIT}]")
    ax.grid(alpha=0.3)
    npl.legend_below(ax)
    return fig


def own_gamma_1d(ax, sweep, points, x):
    shared = sweep.shared("gamma")
    if shared is not None and math.isnan(shared):
        return
    if shared is not None:
        ax.axhline(shared, color="red", linewidth=1.5, linestyle=":",
                   label=f"Γ = {shared:g} {GAMMA_UNIT} (every point)")
        return
    npl.tag(ax.plot(x, [p.gamma for p in points], linestyle=":" if not sweep.axes[0].categorical else "none",
                    marker="_", markersize=22, markeredgewidth=2.5, color="red",
                    label="Γ of each point: " + per_point_values(sweep, "gamma", show_gamma))[0], "own_gamma")


# ---------------------------------------------------------------- conformed fraction along the Γ paths

def chosen_path_points(sweep):
    points = sorted((p for p in sweep.ok_points() if p.number in sweep.paths), key=lambda p: p.index[::-1])
    if len(points) <= MAX_PATH_POINTS:
        return points, len(points)
    picks = np.unique(np.round(np.linspace(0, len(points) - 1, MAX_PATH_POINTS)).astype(int))
    return [points[i] for i in picks], len(points)


def gamma_fraction(sweep):
    points, total = chosen_path_points(sweep)
    subject = "conformed fraction along the Γ paths"
    if len(points) < total:
        subject += f" ({len(points)} of {total} points, evenly spaced)"
    fig, ax = new_figure(sweep, subject, size=(9.6, 5.6))
    for colour, p in zip(plt.get_cmap("tab10").colors, points):
        label = ", ".join(a.describe(i) for a, i in zip(sweep.axes, p.index))
        drawn = [(k, s) for k, s in (("down", "-"), ("up", "--")) if k in sweep.paths[p.number]]
        for n, (kind, style) in enumerate(drawn):
            path = sweep.paths[p.number][kind]
            npl.draw_path(ax, path, 100 * path.fraction, colour, label if n == 0 else None,
                          f"point{p.number}:{kind}", linestyle=style)
    own_gamma_lines(ax, sweep, points)
    ax.axhline(100 * sweep.target, color="0.3", linestyle=":", linewidth=1.2)
    npl.use_log_scale_for(ax, np.concatenate([path.gamma for p in points for path in sweep.paths[p.number].values()]))
    ax.set_xlabel(f"work of adhesion Γ [{GAMMA_UNIT}]")
    ax.set_ylabel("conformed fraction [%]")
    ax.set_ylim(-3, 103)
    ax.grid(alpha=0.3)
    ax.legend(handles=ax.get_legend_handles_labels()[0] + path_style_handles(sweep), fontsize=8,
              loc="upper left", bbox_to_anchor=(1.02, 1), frameon=False)
    return fig, failure_notes(sweep)


def own_gamma_lines(ax, sweep, points):
    """A dotted red line at each distinct Γ of the drawn points, named by the category that decides it
    (e.g. 'Γ MoS2') where there is one."""
    k = deciding_axis(sweep, "gamma")
    owners = {}
    for p in points:
        if not math.isnan(p.gamma):
            owners.setdefault(p.gamma, set()).add(sweep.axes[k].values[p.index[k]] if k is not None else "")
    for gamma, names in owners.items():
        npl.tag(ax.axvline(gamma, color="red", linestyle=":", linewidth=1.4), "own_gamma")
        named = ", ".join(sorted(n for n in names if n))
        text = f"Γ{' ' + named if named else ''} = {gamma:g} {GAMMA_UNIT}"
        ax.text(gamma, 0.5, text, rotation=90, transform=ax.get_xaxis_transform(), va="center", ha="right",
                fontsize=8, color="red", bbox=npl.LABEL_BOX)


def path_style_handles(sweep):
    handles = [Line2D([], [], color="none", label=""),
               Line2D([], [], color="k", linestyle="-", label="down: lowering Γ from conformed"),
               Line2D([], [], color="k", linestyle="--", label="up: raising Γ from laid down"),
               Line2D([], [], color="k", linestyle=":", marker=">", markersize=5,
                      label="jump between two states\n(somewhere in that Γ interval)")]
    if any(not math.isnan(p.gamma) for p in sweep.points):
        handles.append(Line2D([], [], color="red", linestyle=":", label="Γ of the points (as labelled)"))
    handles.append(Line2D([], [], color="0.3", linestyle=":", label=f"target fraction {npl.percent(sweep.target)}"))
    return handles
