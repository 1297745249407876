#!/usr/bin/env python3
"""Tests of benchmarks/plot_multilevel_scaling.py on made-up benchmark outputs (not measurements).

Usage: python3 tests/apps/plot_multilevel_scaling_test.py PATH/TO/benchmarks/plot_multilevel_scaling.py

The synthetic files mimic Google Benchmark's JSON: newton_step_<solver>/<case>/<refinements> entries with
real_time, time_unit and the dofs and cg_iterations counters; with repetitions, the aggregates. The tests
check what is drawn (the curves' data against the numbers written here), that medians are taken when runs
are repeated, and that bad input exits 2 with the file and the entry named and no figure written.
"""

import importlib.util
import json
import os
import subprocess
import sys
import tempfile
import unittest

SCRIPT = None


def entry(name, seconds, dofs, iterations=None, **extra):
    counters = {"dofs": dofs} if iterations is None else {"dofs": dofs, "cg_iterations": iterations}
    return {"name": name, "run_name": name, "real_time": seconds * 1e3, "time_unit": "ms", **counters, **extra}


SINGLE = [entry("newton_step_direct/drum/4/iterations:1", 1.0, 37e3),
          entry("newton_step_direct/drum/5/iterations:1", 6.0, 148e3),
          entry("newton_step_multilevel/drum/4/iterations:1", 0.5, 37e3, 19),
          entry("newton_step_multilevel/drum/5/iterations:1", 2.0, 148e3, 22)]


def repeated():
    name = "newton_step_multilevel/pillars/3/iterations:1"
    runs = [entry(name, t, 12e3, 18, run_type="iteration") for t in (0.3, 0.1, 0.2)]
    aggregates = [entry(name, t, 12e3, 18, run_type="aggregate", aggregate_name=a)
                  for a, t in (("mean", 0.2), ("median", 0.2), ("stddev", 0.1))]
    return runs + aggregates


class PlotMultilevelScaling(unittest.TestCase):
    def setUp(self):
        self.dir = tempfile.TemporaryDirectory()
        spec = importlib.util.spec_from_file_location("plot_multilevel_scaling", SCRIPT)
        self.module = importlib.util.module_from_spec(spec)
        spec.loader.exec_module(self.module)

    def tearDown(self):
        self.dir.cleanup()

    def write(self, name, benchmarks):
        path = os.path.join(self.dir.name, name)
        with open(path, "w", encoding="utf-8") as f:
            json.dump({"context": {}, "benchmarks": benchmarks}, f)
        return path

    def run_script(self, *args):
        return subprocess.run([sys.executable, SCRIPT, *args], capture_output=True, text=True, timeout=240)

    def curve(self, fig, gid):
        lines = [l for ax in fig.axes for l in ax.get_lines() if l.get_gid() == gid]
        self.assertEqual(len(lines), 1, gid)
        return [list(map(float, lines[0].get_xdata())), list(map(float, lines[0].get_ydata()))]

    def test_draws_the_times_and_iterations_written(self):
        fig = self.module.figure(self.module.runs_of(self.write("one.json", SINGLE)))
        self.assertEqual(self.curve(fig, "time:direct:drum"), [[37e3, 148e3], [1.0, 6.0]])
        self.assertEqual(self.curve(fig, "time:multilevel:drum"), [[37e3, 148e3], [0.5, 2.0]])
        self.assertEqual(self.curve(fig, "iterations:multilevel:drum"), [[37e3, 148e3], [19, 22]])

    def test_repeated_runs_are_drawn_by_their_medians(self):
        runs = self.module.runs_of(self.write("repeated.json", repeated()))
        self.assertEqual(runs, [("multilevel", "pillars", 12e3, 0.2, 18)])

    def test_writes_the_figure_and_exits_zero(self):
        output = os.path.join(self.dir.name, "scaling.png")
        result = self.run_script(self.write("one.json", SINGLE), self.write("two.json", repeated()), output)
        self.assertEqual(result.returncode, 0, result.stderr)
        self.assertTrue(os.path.getsize(output) > 0)
        self.assertEqual(sorted(os.listdir(self.dir.name)), ["one.json", "scaling.png", "two.json"])

    def test_bad_input_names_the_file_and_entry_and_writes_nothing(self):
        output = os.path.join(self.dir.name, "scaling.png")
        no_dofs = self.write("no_dofs.json", [{"name": "newton_step_direct/drum/4", "real_time": 1.0,
                                               "time_unit": "s"}])
        result = self.run_script(no_dofs, output)
        self.assertEqual(result.returncode, 2)
        self.assertIn("no_dofs.json", result.stderr)
        self.assertIn("newton_step_direct/drum/4", result.stderr)
        not_json = os.path.join(self.dir.name, "log.txt")
        with open(not_json, "w", encoding="utf-8") as f:
            f.write("newton_step_direct/drum/4   1.0 s\n")
        result = self.run_script(not_json, output)
        self.assertEqual(result.returncode, 2)
        self.assertIn("log.txt", result.stderr)
        self.assertIn("--benchmark_format=json", result.stderr)
        self.assertFalse(os.path.exists(output))


if __name__ == "__main__":
    if len(sys.argv) < 2:
        sys.exit("usage: plot_multilevel_scaling_test.py PATH/TO/benchmarks/plot_multilevel_scaling.py")
    SCRIPT = os.path.abspath(sys.argv.pop(1))
    try:
        import matplotlib  # noqa: F401
    except ImportError:
        print("plot_multilevel_scaling_test: no matplotlib (install python3-matplotlib); skipped")
        sys.exit(77)
    unittest.main()
