"""Shared pieces of nappe's figure scripts (plot_sweep.py, plot_case.py, plot_limits.py).

Reading: JSON files whose objects remember the line of each key, CSV tables read with line numbers,
cells checked as numbers, fractions or 0/1 flags, {"value", "unit"} quantities converted to the unit a
figure uses. Every problem is an InputError whose message names the file and line (or key) and says what
was expected. Drawing: titles, the footer, jump-aware adhesion paths (shared by the sweep and the
threshold figures), and atomic PNG + SVG output. Running: `run_script` gives the three scripts one
command line shape and the same exit codes (0 written, 1 cannot write or no matplotlib, 2 bad input
and nothing written).

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib).
"""

import argparse
import contextlib
import csv
import json
import json.decoder
import json.scanner
import math
import os
import sys
import tempfile
import textwrap
from dataclasses import dataclass

try:
    import numpy as np
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
except ImportError as missing:
    sys.stderr.write(f"{os.path.basename(sys.argv[0])}: {missing} in {sys.executable}; install Debian's "
                     "python3-matplotlib and python3-numpy, and run this script with /usr/bin/python3 if "
                     "another python3 comes first on PATH\n")
    sys.exit(1)

FOOTER = "Model estimates — confirm by measurement."
GAMMA_UNIT = "J/m²"
GAMMA_UNITS = {"J/m^2": 1.0, "J/m²": 1.0, "mJ/m^2": 1e-3, "mJ/m²": 1e-3}
FRACTION_UNITS = {"1": 1.0, "%": 0.01}
NM_UNITS = {"nm": 1.0}
LABEL_BOX = dict(facecolor="white", alpha=0.85, edgecolor="none", pad=1.0)
PATH_COLOURS = {"down": "#0072B2", "up": "#D55E00"}
PATH_NAMES = {"down": "lowering Γ from the conformed state", "up": "raising Γ from the laid-down state"}
UMASK = os.umask(0)
os.umask(UMASK)


class InputError(Exception):
    """Bad input; the message names the file, the line or key, and what was expected."""


# ---------------------------------------------------------------- JSON with line numbers

class JsonObject(dict):
    """A JSON object that remembers the line of its opening brace and of each key's value."""
    line = 1
    key_lines = {}

    def line_of(self, key):
        return self.key_lines.get(key, self.line)


def _line_at(text, index):
    return text.count("\n", 0, index) + 1


def _parse_object(s_and_end, strict, scan_once, object_hook, object_pairs_hook, memo=None):
    text, start = s_and_end
    value_starts = []

    def scan_value(string, index):
        value_starts.append(index)
        return scan_once(string, index)

    pairs, end = json.decoder.JSONObject(s_and_end, strict, scan_value, None, list, memo)
    obj = JsonObject(pairs)
    obj.line = _line_at(text, start - 1)
    obj.key_lines = {key: _line_at(text, i) for (key, _), i in zip(pairs, value_starts)}
    return obj, end


class _LocatingDecoder(json.JSONDecoder):
    def __init__(self):
        super().__init__()
        self.parse_object = _parse_object
        self.scan_once = json.scanner.py_make_scanner(self)


def read_json(path, what):
    """The top-level JSON object of `path` (a JsonObject); `what` names the file's role in messages."""
    try:
        with open(path, encoding="utf-8") as f:
            raw = json.loads(f.read(), cls=_LocatingDecoder)
    except FileNotFoundError:
        raise InputError(f"{path}: file not found; expected {what}") from None
    except json.JSONDecodeError as err:
        raise InputError(f"{path} line {err.lineno}: not valid JSON at column {err.colno}: {err.msg}") from None
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot read: {err}") from None
    if not isinstance(raw, JsonObject):
        raise InputError(f"{path} line 1: expected a JSON object at the top level ({what})")
    return raw


def where(path, obj, key=None):
    """'file line N' for a key of a JSON object (the object's own line for a missing key)."""
    return f"{path} line {obj.line_of(key) if key is not None else obj.line}"


def json_key(obj, key, path, expected, context=""):
    """obj[key]; a missing key is reported at the line of the object that lacks it."""
    if key not in obj:
        raise InputError(f"{where(path, obj)}: missing key '{context}{key}'; expected {expected}")
    return obj[key]


def json_number(obj, key, path, context="", allow_null=False):
    value = json_key(obj, key, path, "a number", context)
    if value is None and allow_null:
        return None
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise InputError(f"{where(path, obj, key)}: '{context}{key}' must be a number"
                         f"{' or null' if allow_null else ''}, found {value!r}")
    return float(value)


def json_string(obj, key, path, context=""):
    value = json_key(obj, key, path, "a string", context)
    if not isinstance(value, str):
        raise InputError(f"{where(path, obj, key)}: '{context}{key}' must be a string, found {value!r}")
    return value


def json_bool(obj, key, path, context=""):
    value = json_key(obj, key, path, "true or false", context)
    if not isinstance(value, bool):
        raise InputError(f"{where(path, obj, key)}: '{context}{key}' must be true or false, found {value!r}")
    return value


def json_object(obj, key, path, expected, context=""):
    value = json_key(obj, key, path, expected, context)
    if not isinstance(value, JsonObject):
        raise InputError(f"{where(path, obj, key)}: '{context}{key}' must be an object ({expected}), "
                         f"found {value!r}")
    return value


def json_quantity(obj, key, path, units, context=""):
    """A {"value", "unit"} entry in the unit whose factor is 1 in `units` ({unit: factor to it})."""
    expected = f"an object {{\"value\": number, \"unit\": one of {', '.join(units)}}}"
    quantity = json_object(obj, key, path, expected, context)
    value = json_number(quantity, "value", path, f"{context}{key}.")
    unit = json_string(quantity, "unit", path, f"{context}{key}.")
    if unit not in units:
        raise InputError(f"{where(path, quantity, 'unit')}: '{context}{key}.unit' must be one of "
                         f"{', '.join(units)}, found '{unit}'")
    return value * units[unit]


# ---------------------------------------------------------------- CSV tables

@dataclass
class Table:
    path: str
    header: list
    lines: list  # line number of each row
    rows: list   # each a list of stripped cells, as many as the header

    def column(self, name):
        i = self.header.index(name)
        return [row[i] for row in self.rows]

    def cell(self, k, name):
        return self.rows[k][self.header.index(name)]

    def at(self, k):
        return f"{self.path} line {self.lines[k]}"


def read_table(path, required, hints=None):
    """A CSV file with a header naming at least `required`; `hints` maps a column of an older
    format to what to say when it is found instead."""
    try:
        with open(path, newline="", encoding="utf-8") as f:
            reader = csv.reader(f)
            header = [h.strip() for h in next(reader, [])]
            check_header(path, header, required, hints or {})
            lines, rows = [], []
            for cells in reader:
                if not any(c.strip() for c in cells):
                    continue
                if len(cells) != len(header):
                    raise InputError(f"{path} line {reader.line_num}: {len(cells)} fields, expected "
                                     f"{len(header)} as in the header")
                lines.append(reader.line_num)
                rows.append([c.strip() for c in cells])
    except FileNotFoundError:
        raise InputError(f"{path}: file not found") from None
    except (OSError, UnicodeDecodeError, csv.Error) as err:
        raise InputError(f"{path}: cannot read: {err}") from None
    return Table(path, header, lines, rows)


def check_header(path, header, required, hints):
    if not any(header):
        raise InputError(f"{path}: empty file; expected a header line with columns {', '.join(required)}")
    for old, advice in hints.items():
        if old in header:
            raise InputError(f"{path} line 1: column '{old}' is from an older format; {advice}")
    missing = [c for c in required if c not in header]
    if missing:
        names = ", ".join(f"'{c}'" for c in missing)
        raise InputError(f"{path} line 1: missing column {names}; the header has {', '.join(header)}")
    if len(set(header)) != len(header):
        raise InputError(f"{path} line 1: repeated column names in the header")


def parse_number(text, column, place, required=True):
    """A finite number from a cell; NaN for an empty optional cell."""
    if text == "":
        if required:
            raise InputError(f"{place}: column '{column}' is empty; expected a number")
        return math.nan
    try:
        value = float(text)
    except ValueError:
        raise InputError(f"{place}: column '{column}' is not a number: '{text}'") from None
    if not math.isfinite(value):
        raise InputError(f"{place}: column '{column}' must be a finite number, found '{text}'")
    return value


def parse_fraction(text, column, place, required=True):
    value = parse_number(text, column, place, required)
    if not (math.isnan(value) or -1e-9 <= value <= 1 + 1e-9):
        raise InputError(f"{place}: column '{column}' must be a fraction between 0 and 1, found {value:g}")
    return value


def parse_flag(text, column, place):
    if text not in ("0", "1"):
        raise InputError(f"{place}: column '{column}' must be 0 or 1, found '{text}'")
    return text == "1"


def number_column(table, name):
    """A whole column as a float array; a bad cell is reported with its line."""
    cells = table.column(name)
    try:
        values = np.array(cells, dtype=float)
    except ValueError:
        values = None
    if values is not None and np.isfinite(values).all():
        return values
    for k, text in enumerate(cells):
        parse_number(text, name, table.at(k))
    raise AssertionError("unreachable: a bad cell was not found")


# ---------------------------------------------------------------- adhesion paths (Γ continuation)

PATH_COLUMNS = ("path", "gamma_J_per_m2", "conformed_fraction", "after_jump")
PATH_HINTS = {"peak_principal_strain": "this file was written by an older nappe (the column is "
                                       "max_principal_strain now); rerun the threshold search"}


@dataclass
class AdhesionPath:
    """One Γ continuation: states in the order followed; jump[i] says state i was reached by a jump."""
    kind: str  # "down" (lowering Γ) or "up" (raising Γ)
    gamma: np.ndarray
    fraction: np.ndarray
    jump: np.ndarray
    values: dict  # further numeric columns by name (NaN where empty)


def load_adhesion_paths(path, extra_columns=()):
    """{"down"|"up": AdhesionPath} from a paths CSV; `extra_columns` are read when present."""
    table = read_table(path, PATH_COLUMNS, PATH_HINTS)
    extras = [c for c in extra_columns if c in table.header]
    found = {"down": [], "up": []}
    for k in range(len(table.rows)):
        place = table.at(k)
        kind = table.cell(k, "path")
        if kind not in found:
            raise InputError(f"{place}: column 'path' must be 'down' or 'up', found '{kind}'")
        gamma = parse_number(table.cell(k, "gamma_J_per_m2"), "gamma_J_per_m2", place)
        if gamma <= 0:
            raise InputError(f"{place}: column 'gamma_J_per_m2' must be positive, found {gamma:g}")
        found[kind].append((gamma, parse_fraction(table.cell(k, "conformed_fraction"), "conformed_fraction", place),
                            parse_flag(table.cell(k, "after_jump"), "after_jump", place),
                            [parse_number(table.cell(k, c), c, place, required=False) for c in extras]))
    paths = {}
    for kind, states in found.items():
        if states:
            gamma, fraction, jump, rest = zip(*states)
            values = {c: np.array([r[i] for r in rest]) for i, c in enumerate(extras)}
            paths[kind] = AdhesionPath(kind, np.array(gamma), np.array(fraction), np.array(jump), values)
    if not paths:
        raise InputError(f"{path}: no data rows; expected the states of the lowering and raising paths")
    return paths


def continuous_pieces(path):
    """Index ranges [start, stop) of the runs of states joined without a jump."""
    breaks = [0] + [i for i in range(1, len(path.gamma)) if path.jump[i]] + [len(path.gamma)]
    return list(zip(breaks[:-1], breaks[1:]))


def draw_path(ax, path, y, colour, label, gid, linestyle="-", markersize=3):
    """Draws y along one path: continuous runs as lines, each jump as a dotted arrow from the last state
    before it to the first state after it (the jump happens somewhere between their Γ)."""
    for n, (i, j) in enumerate(continuous_pieces(path)):
        line, = ax.plot(path.gamma[i:j], y[i:j], linestyle=linestyle, color=colour, marker="o",
                        markersize=markersize, linewidth=1.6, label=label if n == 0 else None, zorder=3)
        tag(line, f"{gid}:piece{n}")
    for i in np.flatnonzero(path.jump):
        arrow = ax.annotate("", xy=(path.gamma[i], y[i]), xytext=(path.gamma[i - 1], y[i - 1]),
                            arrowprops=dict(arrowstyle="-|>", color=colour, linestyle=":", linewidth=1.3,
                                            shrinkA=0, shrinkB=2), zorder=3)
        tag(arrow, f"{gid}:jump{i}")


def tag(artist, gid):
    """Names what is drawn (its id in the SVG; the tests find drawn data by it); returns the artist.
    A contour set names each of its lines (older matplotlib has no id on the set itself)."""
    if hasattr(artist, "set_gid"):
        artist.set_gid(gid)
    else:
        for part in artist.collections:
            part.set_gid(gid)
    return artist


def cell_edges(centres, log=False):
    """Edges of the cells around sorted centres: halfway between neighbours (geometric mean on a log
    axis), the outer cells as wide as their neighbour; one centre gets a cell of half its size each side."""
    v = np.asarray(centres, dtype=float)
    if len(v) == 1:
        half = 0.5 * abs(v[0]) if v[0] else 0.5
        return np.array([v[0] - half, v[0] + half])
    mid = np.sqrt(v[:-1] * v[1:]) if log else 0.5 * (v[:-1] + v[1:])
    first = v[0] ** 2 / mid[0] if log else 2 * v[0] - mid[0]
    last = v[-1] ** 2 / mid[-1] if log else 2 * v[-1] - mid[-1]
    return np.concatenate(([first], mid, [last]))


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


def use_log_scale_for(ax, gammas):
    """Log Γ axis when the values span two decades or more."""
    gammas = np.asarray(gammas, dtype=float)
    gammas = gammas[np.isfinite(gammas)]
    if gammas.size and gammas.min() > 0 and gammas.max() / gammas.min() >= 100:
        ax.set_xscale("log")


# ---------------------------------------------------------------- figures

def wrap(text, width=80):
    return "\n".join(textwrap.wrap(text, width)) if text else ""


def set_title(fig, title, subject):
    fig.suptitle("\n".join(textwrap.wrap(title, 80) + textwrap.wrap(subject or "", 100)), fontsize=11)


def significant(value, digits=3):
    """A number to `digits` significant digits, never in exponent form (0.0062, 99.2, 100, 1230)."""
    return np.format_float_positional(value, precision=digits, unique=True, fractional=False, trim="-")


def percent(fraction, digits=3):
    return f"{significant(100 * fraction, digits)} %"


def legend_below(ax, handles=None, ncol=3, offset=-0.14):
    if handles is None:
        handles = ax.get_legend_handles_labels()[0]
    if handles:
        ax.legend(handles=handles, loc="upper center", bbox_to_anchor=(0.5, offset), ncol=ncol,
                  fontsize=8, frameon=False)


NOTES_SHARE = 0.25  # notes taller than this share of the figure make it taller instead of squeezing the axes


def finish(fig, notes=()):
    """Notes, then the footer, below the axes; a layout that keeps them clear of the axes. Many notes
    (e.g. one a transition) make the figure taller, so that the axes keep at least 1 − NOTES_SHARE of
    its height."""
    width, height = fig.get_size_inches()
    characters = int(width * 15)  # about what fits across the figure at 8 pt
    text = "\n".join([wrap(n, characters) for n in notes] + [FOOTER])
    line = 8 * 1.35 / 72  # inches per line of 8 pt text
    notes_height = 0.1 + line * (text.count("\n") + 1)
    if notes_height > NOTES_SHARE * height:
        height = (1 - NOTES_SHARE) * height + notes_height
        fig.set_size_inches(width, height)
    fig.text(0.5, 0.01, text, ha="center", va="bottom", fontsize=8, style="italic", color="0.3")
    fig.tight_layout(rect=(0, notes_height / height, 1, 0.98))


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


def write_figures(builders, out_dir):
    """Builds each (stem, function returning (figure, notes)) and writes it; prints each file written."""
    os.makedirs(out_dir, exist_ok=True)
    for stem, build in builders:
        fig, notes = build()
        finish(fig, notes)
        try:
            for path in save_atomically(fig, out_dir, stem):
                print(path, flush=True)
        finally:
            plt.close(fig)


def strip_suffix(argument, suffixes):
    """A result stem from what the user typed: the stem itself or one of its files."""
    for suffix in suffixes:
        if argument.endswith(suffix):
            return argument[:-len(suffix)]
    return argument


def beside(argument):
    """The directory of a result name or file (the current one for a bare name)."""
    return os.path.dirname(argument) or "."


def run_script(prog, doc, input_help, load, figures, default_out=beside, argv=None):
    """Command line INPUT [--out DIR] (described by the first line of the script's `doc`): load(INPUT)
    reads everything (InputError: exit 2, nothing written), figures(data, INPUT) lists (stem, builder);
    the files go to DIR or default_out(INPUT). Returns the exit status."""
    parser = argparse.ArgumentParser(prog=prog, description=doc.strip().splitlines()[0])
    parser.add_argument("input", metavar="INPUT", help=input_help)
    parser.add_argument("--out", metavar="DIR", help="where to write the figures (default: beside the input)")
    args = parser.parse_args(argv)
    try:
        data = load(args.input)
        builders = figures(data, args.input)
    except InputError as err:
        print(f"{prog}: {err}", file=sys.stderr)
        return 2
    out_dir = args.out or default_out(args.input)
    try:
        write_figures(builders, out_dir)
    except OSError as err:
        print(f"{prog}: cannot write figures into {out_dir}: {err}", file=sys.stderr)
        return 1
    return 0
