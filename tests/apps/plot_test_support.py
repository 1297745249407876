"""What the tests of the figure scripts (plot_sweep, plot_case, plot_limits) share.

- `start(name)`: reads the script path from the command line, picks a Python with numpy and matplotlib
  (this interpreter, else Debian's /usr/bin/python3), exits 77 (skipped) when there is none.
- `run(*args)`: runs the script; `probe(input)`: loads the input with the script's own `load` and
  `figures`, builds every figure and returns what is drawn, by figure stem and artist id (gid), as
  plain numbers (lines also with their colour and marker; legend entries with their texts and, for
  line entries, colour and marker), so that a test can compare the drawn data with the numbers it wrote.
- `ProbedTestCase`: one synthetic input per test class, probed once.
- `FigureTestCase`: a temporary directory, a check that a run writes exactly the expected PNG + SVG
  files (and prints them), and a check that bad input exits 2 naming the file (and line) and writes
  nothing.
"""

import json
import os
import subprocess
import sys
import tempfile
import unittest

SCRIPT = None
PYTHON = None

# Runs inside the plotting interpreter: argv = scripts directory, module name, input path.
PROBE = r'''
import json, math, sys
sys.path.insert(0, sys.argv[1])
module = __import__(sys.argv[2])
import numpy as np
from matplotlib.colors import to_hex
from matplotlib.collections import Collection, QuadMesh
from matplotlib.lines import Line2D
from matplotlib.patches import Patch
from matplotlib.text import Annotation, Text

def plain(a):
    a = np.ma.masked_invalid(np.ma.asarray(a, dtype=float))
    return [None if m else float(v) for v, m in zip(a.data.ravel(), np.ma.getmaskarray(a).ravel())]

def describe(artist):
    if isinstance(artist, Line2D):
        return {"kind": "line", "x": plain(artist.get_xdata()), "y": plain(artist.get_ydata()),
                "colour": to_hex(artist.get_color()), "marker": str(artist.get_marker())}
    if isinstance(artist, Annotation):
        return {"kind": "arrow", "to": plain(artist.xy), "from": plain(artist.xyann)}
    if isinstance(artist, QuadMesh):
        array = artist.get_array()
        return {"kind": "mesh", "shape": list(np.shape(array)), "values": plain(array),
                "colours": [plain(c) for c in artist.to_rgba(np.ma.asarray(array).ravel())]}
    if isinstance(artist, Patch):  # a span (Polygon, or Rectangle in newer matplotlib) or a cell outline
        xy = np.asarray(artist.get_xy())
        if xy.ndim == 2:
            return {"kind": "box", "x": [float(xy[:, 0].min()), float(xy[:, 0].max())],
                    "y": [float(xy[:, 1].min()), float(xy[:, 1].max())]}
        return {"kind": "box", "x": [artist.get_x(), artist.get_x() + artist.get_width()],
                "y": [artist.get_y(), artist.get_y() + artist.get_height()]}
    if isinstance(artist, Collection):  # scatter points (xy) or the lines of a contour (paths)
        return {"kind": "collection", "xy": [plain(o) for o in artist.get_offsets()],
                "paths": [[plain(v) for v in p.vertices] for p in artist.get_paths()]}
    if isinstance(artist, Text):
        return {"kind": "text", "text": artist.get_text()}
    return {"kind": type(artist).__name__}

def axes_record(ax):
    found = {}
    for artist in ax.findobj():
        gid = artist.get_gid() if hasattr(artist, "get_gid") else None
        if gid and artist is not ax:
            found.setdefault(gid, []).append(describe(artist))
    legend = ax.get_legend()
    handles = []
    if legend:  # named legend_handles since matplotlib 3.7, legendHandles before
        handles = legend.legend_handles if hasattr(legend, "legend_handles") else legend.legendHandles
    return {"artists": found, "xlabel": ax.get_xlabel(), "ylabel": ax.get_ylabel(),
            "xticks": [t.get_text() for t in ax.get_xticklabels()],
            "xtick_positions": plain(ax.get_xticks()),
            "yticks": [t.get_text() for t in ax.get_yticklabels()],
            "xscale": ax.get_xscale(), "legend": [t.get_text() for t in legend.get_texts()] if legend else [],
            "legend_marks": [describe(h) if isinstance(h, Line2D) else None for h in handles],
            "texts": [t.get_text() for t in ax.texts]}

data = module.load(sys.argv[3])
out = {}
for stem, build in module.figures(data, sys.argv[3]):
    fig, notes = build()
    fig.canvas.draw()
    out[stem] = {"axes": [axes_record(ax) for ax in fig.axes], "notes": notes,
                 "title": fig._suptitle.get_text() if fig._suptitle else ""}
print(json.dumps(out))
'''


def has_plotting(python):
    try:
        return subprocess.run([python, "-c", "import numpy, matplotlib"], capture_output=True,
                               timeout=120).returncode == 0
    except (OSError, subprocess.TimeoutExpired):
        return False


def start(name):
    """Takes the script path from argv (leaving unittest's options) and picks the interpreter."""
    global SCRIPT, PYTHON
    if len(sys.argv) < 2:
        sys.exit(f"usage: {name}_test.py PATH/TO/scripts/{name}.py [unittest options]")
    SCRIPT = os.path.abspath(sys.argv.pop(1))
    PYTHON = next((p for p in (sys.executable, "/usr/bin/python3")
                   if p and os.path.exists(p) and has_plotting(p)), None)
    if PYTHON is None:
        print(f"{name}_test: no python3 with numpy and matplotlib (install python3-matplotlib); skipped")
        sys.exit(77)


def run(*args):
    return subprocess.run([PYTHON, SCRIPT, *args], capture_output=True, text=True, timeout=240)


def probe(input_path):
    """{stem: {"axes": [{"artists": {gid: [drawn data]}, labels, ticks, legend}], "notes", "title"}}."""
    module = os.path.splitext(os.path.basename(SCRIPT))[0]
    result = subprocess.run([PYTHON, "-c", PROBE, os.path.dirname(SCRIPT), module, input_path],
                            capture_output=True, text=True, timeout=240)
    if result.returncode != 0:
        raise AssertionError(f"probe of {module} failed:\n{result.stderr}")
    return json.loads(result.stdout)


def artists(figure, gid, axes=None):
    """All drawn items with this id in a probed figure (all axes, or one)."""
    chosen = figure["axes"] if axes is None else [figure["axes"][axes]]
    return [item for ax in chosen for item in ax["artists"].get(gid, [])]


def figure_files(directory):
    return sorted(f for f in os.listdir(directory) if f.endswith((".png", ".svg")))


def write_text(path, text):
    with open(path, "w", encoding="utf-8") as f:
        f.write(text)


def edit_lines(path, edit):
    with open(path, encoding="utf-8") as f:
        lines = f.read().splitlines()
    write_text(path, "\n".join(edit(lines)) + "\n")


class ProbedTestCase(unittest.TestCase):
    """Writes one synthetic input once per class and probes its figures: `make(directory)` returns
    (the script's argument, what the tests compare with); tests read self.drawn and self.written."""
    make = None

    @classmethod
    def setUpClass(cls):
        cls.tmp = tempfile.TemporaryDirectory(prefix="plot_test.")
        argument, cls.written = cls.make(cls.tmp.name)
        cls.drawn = probe(argument)

    @classmethod
    def tearDownClass(cls):
        cls.tmp.cleanup()


class FigureTestCase(unittest.TestCase):
    """A temporary directory per test (self.dir) and the checks every script's test makes."""

    def setUp(self):
        self.tmp = tempfile.TemporaryDirectory(prefix="plot_test.")
        self.dir = self.tmp.name

    def tearDown(self):
        self.tmp.cleanup()

    def check_run(self, argument, stems, out=None, extra=()):
        """The run succeeds and writes (and prints) exactly stem.png and stem.svg for each stem."""
        result = run(argument, *extra)
        self.assertEqual(result.returncode, 0, result.stderr)
        self.assertNotIn("Traceback", result.stderr)
        out = out or self.dir
        expected = sorted(f"{s}.{e}" for s in stems for e in ("png", "svg"))
        self.assertEqual([f for f in figure_files(out)], expected)
        self.assertEqual(sorted(os.path.basename(line) for line in result.stdout.splitlines()), expected)
        for name in expected:
            with open(os.path.join(out, name), "rb") as f:
                data = f.read()
            if name.endswith(".png"):
                self.assertTrue(data.startswith(b"\x89PNG\r\n\x1a\n"), name)
            else:
                self.assertIn(b"<svg", data, name)
        self.assertEqual([f for f in os.listdir(out) if f.startswith(".")], [], "temporary files left behind")

    def check_rejected(self, argument, file_path, *words):
        """Exit 2, a message naming the file and containing each word, no traceback, no figure."""
        result = run(argument)
        self.assertEqual(result.returncode, 2, result.stderr)
        self.assertNotIn("Traceback", result.stderr)
        self.assertIn(file_path, result.stderr)
        for word in words:
            self.assertIn(word, result.stderr)
        self.assertEqual(len(result.stderr.strip().splitlines()), 1, result.stderr)
        self.assertEqual(figure_files(os.path.dirname(file_path)), [])
