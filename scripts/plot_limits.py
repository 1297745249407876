#!/usr/bin/env python3
"""The Γ–fraction hysteresis loop of a nappe threshold search (nappe-limits).

Usage:
    python3 scripts/plot_limits.py LIMITS_STEM [--out DIR]

LIMITS_STEM is the result name nappe-limits wrote (e.g. out/grating for out/grating_limits.json; the
name of either file is accepted too). Reads:

    LIMITS_STEM_limits.json          Γ_hold, Γ_eq, Γ_snap (each found or not, with its bracket), the
                                     case's Γ, the target conformed fraction, and optionally the
                                     transitions found along the paths
    LIMITS_STEM_adhesion_paths.csv   the states along the lowering ("down") and raising ("up") paths

Writes NAME_adhesion_loop (.png and .svg; NAME is the stem's file name) into the stem's directory
(or DIR): the conformed fraction against Γ along both paths, and below it the largest principal
strain along them. Continuous stretches are drawn as lines; a jump (after_jump = 1) as a dotted arrow
from the last state before it to the first after it, since it happens somewhere in between. Γ_hold,
Γ_eq and Γ_snap are marked with their brackets, the case's Γ and the target fraction as reference
lines. Each listed transition is drawn in its path's colour: its Γ bracket shaded on both panels, and
on the fraction panel a bar at the middle of the bracket from the conformed fraction before the jump
to the one after it, ending in a marker whose shape names the kind of transition (the legend says
each kind present in plain words), with a number that leads to its line below the figure (bracket,
fractions, contact on raised parts and floor, energy released).

Prints the files it wrote. Bad input: one message naming the file and line on stderr, exit status 2,
nothing written. Cannot write: exit status 1.

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib); run with /usr/bin/python3 if
another python3 comes first on PATH.
"""

import math
import os
import sys
from dataclasses import dataclass, field

import nappe_plotting as npl
from nappe_plotting import InputError, np, plt, GAMMA_UNIT
from matplotlib.lines import Line2D
from matplotlib.patches import Patch

THRESHOLDS = (("gamma_hold", "Γ_hold", r"$\Gamma_\mathrm{hold}$", "holds a conformed sheet", "#0072B2"),
              ("gamma_eq", "Γ_eq", r"$\Gamma_\mathrm{eq}$", "equal energy", "#009E73"),
              ("gamma_snap", "Γ_snap", r"$\Gamma_\mathrm{snap}$", "pulls a laid-down sheet in", "#D55E00"))
EXTRA_COLUMNS = ("max_principal_strain", "energy_J_per_m2")
RELATIVE_SLACK = 1e-9  # rounding allowed when checking lower <= value <= upper
ARROWS = {"down": "←", "up": "→"}
DIRECTIONS = {"down": "lowering", "up": "raising"}
# The kinds nappe-limits names (lib/analysis/adhesion_transitions.cc): marker at the end of the bar and
# what the kind means; any other kind ("<regime> → <regime>") gets OTHER_KIND's marker and its own name.
KINDS = {"touch-down": ("o", "the hanging sheet first touches the surface"),
         "tents → floor contact": ("s", "the sheet resting on the tops reaches the floor"),
         "snap into conformation": ("^", "the sheet snaps onto the whole surface"),
         "detachment": ("X", "the sheet lets go of the surface"),
         "partial detachment": ("v", "the conformed sheet lets go in part"),
         "lift-off from the floor": ("D", "the sheet leaves the floor, still held on the tops"),
         "partial depinning": ("P", "the edge of the contact jumps; the kind of contact stays")}
OTHER_KIND = ("h", "")


@dataclass
class Threshold:
    key: str
    found: bool
    how: str
    value: float = math.nan
    lower: float = math.nan
    upper: float = math.nan


@dataclass
class Transition:
    path: str
    lower: float
    upper: float
    kind: str
    before: float  # conformed fraction before and after [-]
    after: float
    released: str  # energy released, as text with its unit ("" if not given)
    contact: tuple = ()  # shares in contact over raised parts and floor, before and after [-] (if given)

    @property
    def middle(self):
        """Where the bar stands: the middle of the bracket (geometric, as the bracket is found in ln Γ)."""
        return math.sqrt(self.lower * self.upper)


@dataclass
class Limits:
    name: str
    title: str
    subtitle: str
    case_gamma: float
    target: float
    thresholds: dict
    transitions: list = field(default_factory=list)
    paths: dict = field(default_factory=dict)


# ---------------------------------------------------------------- LIMITS_STEM_limits.json

def parse_threshold(raw, key, path):
    entry = npl.json_object(raw, key, path, "meaning, found, value, lower, upper, how")
    context = f"{key}."
    found = npl.json_bool(entry, "found", path, context)
    threshold = Threshold(key, found, npl.json_string(entry, "how", path, context))
    if not found:
        return threshold
    for part in ("value", "lower", "upper"):
        setattr(threshold, part, npl.json_quantity(entry, part, path, npl.GAMMA_UNITS, context))
    slack = RELATIVE_SLACK * threshold.upper
    if not (0 < threshold.lower <= threshold.value + slack and threshold.value <= threshold.upper + slack):
        raise InputError(f"{npl.where(path, entry)}: '{key}' must satisfy 0 < lower <= value <= upper, found "
                         f"{threshold.lower:g} <= {threshold.value:g} <= {threshold.upper:g} {GAMMA_UNIT}")
    return threshold


def fraction_entry(obj, key, path, context):
    """A conformed fraction given as a number or as a {"value", "unit"} quantity, checked to be in [0, 1]."""
    value = obj.get(key)
    if isinstance(value, dict):
        value = npl.json_quantity(obj, key, path, npl.FRACTION_UNITS, context)
    else:
        value = npl.json_number(obj, key, path, context)
    if not -1e-9 <= value <= 1 + 1e-9:
        raise InputError(f"{npl.where(path, obj, key)}: '{context}{key}' must be a fraction between 0 and 1, "
                         f"found {value:g}")
    return value


def parse_transition(raw, i, path):
    context = f"transitions[{i}]."
    if not isinstance(raw, npl.JsonObject):
        raise InputError(f"{path}: 'transitions[{i}]' must be an object")
    kind = npl.json_string(raw, "path", path, context)
    if kind not in ARROWS:
        raise InputError(f"{npl.where(path, raw, 'path')}: '{context}path' must be 'down' or 'up', found '{kind}'")
    lower = npl.json_quantity(raw, "gamma_lower", path, npl.GAMMA_UNITS, context)
    upper = npl.json_quantity(raw, "gamma_upper", path, npl.GAMMA_UNITS, context)
    if not 0 < lower <= upper:
        raise InputError(f"{npl.where(path, raw)}: '{context}gamma_lower' and 'gamma_upper' must satisfy "
                         f"0 < lower <= upper, found {lower:g} and {upper:g} {GAMMA_UNIT}")
    released = ""
    if "energy_released" in raw:
        energy = npl.json_object(raw, "energy_released", path, "value and unit", context)
        value = npl.json_number(energy, "value", path, f"{context}energy_released.")
        unit = npl.json_string(energy, "unit", path, f"{context}energy_released.")
        released = f"{npl.significant(value)} {unit.replace('^2', '²')}"
    contact_keys = ("raised_contact_before", "floor_contact_before", "raised_contact_after", "floor_contact_after")
    contact = tuple(fraction_entry(raw, key, path, context) for key in contact_keys) \
        if all(key in raw for key in contact_keys) else ()
    return Transition(kind, lower, upper, npl.json_string(raw, "kind", path, context),
                      fraction_entry(raw, "fraction_before", path, context),
                      fraction_entry(raw, "fraction_after", path, context), released, contact)


def load_summary(path, name):
    raw = npl.read_json(path, "the report of a nappe-limits run (<name>_limits.json)")
    target = npl.json_quantity(raw, "target_conformed_fraction", path, npl.FRACTION_UNITS)
    if not 0 < target <= 1:
        raise InputError(f"{npl.where(path, raw, 'target_conformed_fraction')}: 'target_conformed_fraction' "
                         f"must be in (0, 1], found {target:g}")
    subtitle = " on ".join(raw[k] for k in ("material", "topography") if isinstance(raw.get(k), str))
    limits = Limits(name, npl.json_string(raw, "case", path), subtitle,
                    npl.json_quantity(raw, "case_work_of_adhesion", path, npl.GAMMA_UNITS), target,
                    {key: parse_threshold(raw, key, path) for key, *_ in THRESHOLDS})
    transitions = raw.get("transitions", [])
    if not isinstance(transitions, list):
        raise InputError(f"{npl.where(path, raw, 'transitions')}: 'transitions' must be a list of objects")
    limits.transitions = [parse_transition(t, i, path) for i, t in enumerate(transitions)]
    return limits


def load(argument):
    stem = npl.strip_suffix(argument, ("_limits.json", "_adhesion_paths.csv"))
    limits = load_summary(stem + "_limits.json", os.path.basename(stem))
    limits.paths = npl.load_adhesion_paths(stem + "_adhesion_paths.csv", EXTRA_COLUMNS)
    return limits


# ---------------------------------------------------------------- the loop

def threshold_marks(ax, limits, labelled):
    """A dashed line at each threshold found and a band over its bracket; legend entries for the
    labelled panel."""
    handles = []
    for key, _, symbol, meaning, colour in THRESHOLDS:
        t = limits.thresholds[key]
        if not t.found:
            continue
        npl.tag(ax.axvspan(t.lower, t.upper, color=colour, alpha=0.18, linewidth=0), f"bracket:{key}")
        npl.tag(ax.axvline(t.value, color=colour, linestyle="--", linewidth=1.4), f"threshold:{key}")
        if labelled:
            handles.append(Line2D([], [], color=colour, linestyle="--", label=(
                f"{symbol} = {npl.significant(t.value)} {GAMMA_UNIT}: {meaning}\n(bracket "
                f"{npl.significant(t.lower)}–{npl.significant(t.upper)} {GAMMA_UNIT}, shaded)")))
    return handles


def name_thresholds(ax, limits):
    """The names of the thresholds above the panel, stacked where they would overlap (call after the
    scale and limits are set)."""
    lo, hi = ax.get_xlim()
    log = ax.get_xscale() == "log"
    position = (lambda g: (math.log(g) - math.log(lo)) / (math.log(hi) - math.log(lo))) if log else \
        (lambda g: (g - lo) / (hi - lo))
    found = sorted((limits.thresholds[key].value, symbol, colour) for key, _, symbol, _, colour in THRESHOLDS
                   if limits.thresholds[key].found)
    level, last = 0, -1.0
    for value, symbol, colour in found:
        level = level + 1 if position(value) - last < 0.06 else 0
        last = position(value)
        ax.text(value, 1.01 + 0.07 * level, symbol, transform=ax.get_xaxis_transform(), ha="center", va="bottom",
                color=colour, fontsize=10)


def reference_lines(ax, limits, with_target):
    npl.tag(ax.axvline(limits.case_gamma, color="red", linestyle=":", linewidth=1.8), "case_gamma")
    if with_target:
        npl.tag(ax.axhline(100 * limits.target, color="0.35", linestyle=":", linewidth=1.2), "target")


def draw_paths(ax, limits, values_of):
    for kind in ("down", "up"):
        path = limits.paths.get(kind)
        if path is not None:
            npl.draw_path(ax, path, values_of(path), npl.PATH_COLOURS[kind],
                          f"{npl.PATH_NAMES[kind]} ({ARROWS[kind]})", f"{kind}")


def shade_transitions(ax, limits):
    """The Γ bracket of each listed transition, shaded in its path's colour (edged, so that a bracket
    narrower than a pixel still shows)."""
    for n, t in enumerate(limits.transitions, start=1):
        colour = npl.PATH_COLOURS[t.path]
        npl.tag(ax.axvspan(t.lower, t.upper, facecolor=colour, edgecolor=colour, alpha=0.3, linewidth=0.6),
                f"transition{n}")


def kind_marker(kind):
    return KINDS.get(kind, OTHER_KIND)[0]


def mark_transitions(ax, limits):
    """Each listed transition: its bracket shaded, a bar in its path's colour at the middle of the bracket
    from the conformed fraction before the jump to the one after it, ending in its kind's marker, and its
    number beside the bar."""
    shade_transitions(ax, limits)
    for n, t in enumerate(limits.transitions, start=1):
        colour = npl.PATH_COLOURS[t.path]
        y = (100 * t.before, 100 * t.after)
        npl.tag(ax.plot([t.middle] * 2, y, color=colour, linewidth=3.2, alpha=0.6, solid_capstyle="butt",
                        zorder=4)[0], f"transition{n}:bar")
        npl.tag(ax.plot(t.middle, y[1], linestyle="none", marker=kind_marker(t.kind), markersize=8,
                        color=colour, markeredgecolor="white", markeredgewidth=0.8, zorder=5)[0],
                f"transition{n}:kind")
        ax.annotate(str(n), (t.middle, 0.5 * sum(y)), xytext=(7 if t.path == "up" else -7, 0),
                    textcoords="offset points", ha="left" if t.path == "up" else "right", va="center",
                    fontsize=8, color=colour, fontweight="bold", bbox=npl.LABEL_BOX)


def transition_notes(limits):
    notes = []
    for n, t in enumerate(limits.transitions, start=1):
        contact = ""
        if t.contact:
            raised_before, floor_before, raised_after, floor_after = (npl.percent(c) for c in t.contact)
            contact = (f"; contact on raised parts + floor {raised_before} + {floor_before} → "
                       f"{raised_after} + {floor_after}")
        released = f"; releases {t.released}" if t.released else ""
        notes.append(f"{n}: {t.kind} ({DIRECTIONS[t.path]} Γ, between {npl.significant(t.lower, 4)} and "
                     f"{npl.significant(t.upper, 4)} {GAMMA_UNIT}; conformed fraction {npl.percent(t.before)} → "
                     f"{npl.percent(t.after)}{contact}{released})")
    return notes


def transition_legend(limits):
    """One entry a kind and path present, in the order met: the kind's marker in the path's colour and
    what the kind means."""
    handles, seen = [], set()
    for t in limits.transitions:
        if (t.path, t.kind) in seen:
            continue
        seen.add((t.path, t.kind))
        meaning = KINDS.get(t.kind, OTHER_KIND)[1]
        label = f"{t.kind} ({DIRECTIONS[t.path]} Γ)" + (f": {meaning}" if meaning else "")
        handles.append(Line2D([], [], linestyle="none", marker=kind_marker(t.kind), markersize=8,
                              color=npl.PATH_COLOURS[t.path], markeredgecolor="white", label=npl.wrap(label, 52)))
    return handles


def missing_threshold_notes(limits):
    return [f"{name} not found: {limits.thresholds[key].how}" for key, name, *_ in THRESHOLDS
            if not limits.thresholds[key].found]


def has_strain(limits):
    return any(np.isfinite(p.values.get("max_principal_strain", np.array([np.nan]))).any()
               for p in limits.paths.values())


def adhesion_loop(limits):
    panels = 2 if has_strain(limits) else 1
    fig, axes = plt.subplots(panels, 1, sharex=True, figsize=(11.5, 5.4 + 2.4 * (panels - 1)), squeeze=False,
                             gridspec_kw=dict(height_ratios=[2.2, 1][:panels]))
    axes = axes[:, 0]
    npl.set_title(fig, limits.title, "conformed fraction along the work-of-adhesion paths" +
                  (f" — {limits.subtitle}" if limits.subtitle else ""))
    loop = axes[0]
    draw_paths(loop, limits, lambda p: 100 * p.fraction)
    mark_transitions(loop, limits)
    handles = threshold_marks(loop, limits, labelled=True)
    reference_lines(loop, limits, with_target=True)
    loop.set_ylabel("conformed fraction [%]")
    loop.set_ylim(-3, 103)
    if panels == 2:
        strain_panel(axes[1], limits)
    gammas = [limits.case_gamma] + [g for p in limits.paths.values() for g in p.gamma]
    npl.use_log_scale_for(loop, gammas)
    name_thresholds(loop, limits)
    axes[-1].set_xlabel(f"work of adhesion Γ [{GAMMA_UNIT}]")
    for ax in axes:
        ax.grid(alpha=0.3)
    loop.legend(handles=loop.get_legend_handles_labels()[0] + legend_extras(limits) + handles, fontsize=8,
                loc="upper left", bbox_to_anchor=(1.01, 1), frameon=False)
    return fig, transition_notes(limits) + missing_threshold_notes(limits)


def legend_extras(limits):
    jumped = any(p.jump.any() for p in limits.paths.values())
    extras = [Line2D([], [], color="k", linestyle=":", marker=">", markersize=5,
                     label="jump (somewhere in that Γ interval)")] if jumped else []
    extras += [Line2D([], [], color="red", linestyle=":", linewidth=1.8,
                      label=f"case Γ = {npl.significant(limits.case_gamma)} {GAMMA_UNIT}"),
               Line2D([], [], color="0.35", linestyle=":", label=f"target fraction {npl.percent(limits.target)}")]
    if limits.transitions:
        extras.append(Patch(color="0.5", alpha=0.35, label="transition n: Γ bracket shaded, bar from the\n"
                            "fraction before to after (listed below the figure)"))
    return extras + transition_legend(limits)


def strain_panel(ax, limits):
    draw_paths(ax, limits, lambda p: 100 * p.values["max_principal_strain"])
    shade_transitions(ax, limits)
    threshold_marks(ax, limits, labelled=False)
    reference_lines(ax, limits, with_target=False)
    ax.set_ylabel("largest principal\nstrain [%]")
    ax.set_ylim(bottom=0)


# ---------------------------------------------------------------- driver

def figures(limits, _argument):
    return [(f"{limits.name}_adhesion_loop", lambda: adhesion_loop(limits))]


if __name__ == "__main__":
    sys.exit(npl.run_script("plot_limits", __doc__, "result name of a nappe-limits run (LIMITS_STEM, or one of "
                            "its two files)", load, figures))
