#!/usr/bin/env python3
"""Scaling plot of one Newton step, direct vs multilevel solve, from multilevel_scaling's JSON output.

    build/benchmarks/multilevel_scaling --benchmark_filter='drum' --benchmark_format=json > drum.json
    python3 benchmarks/plot_multilevel_scaling.py drum.json benchmarks/figures/multilevel_scaling.png

Left: time per Newton step (assembly + solve) against unknowns, log-log, with the slopes N^1.1 (the
multilevel target) and N^1.3 (the direct solver's measured growth) drawn through the smallest point of
each solver on the first case (alphabetically). Right: CG iterations per step of the multilevel solve, with the limit of 30. With
repetitions, the medians are drawn. Exit codes: 0 written, 1 no matplotlib or cannot write, 2 bad input.
"""

import json
import os
import sys

try:
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
except ImportError as missing:
    sys.stderr.write(f"plot_multilevel_scaling.py: {missing}; install Debian's python3-matplotlib\n")
    sys.exit(1)

SOLVER_COLOURS = {"direct": "#D55E00", "multilevel": "#0072B2"}
SOLVER_NAMES = {"direct": "direct (MUMPS LDLᵀ)", "multilevel": "multilevel CG"}
CASE_MARKERS = {"drum": "o", "egg_carton": "s", "pillars": "^"}
SECONDS = {"s": 1.0, "ms": 1e-3, "us": 1e-6, "ns": 1e-9}
ITERATION_LIMIT = 30


class InputError(Exception):
    """Bad input; the message names the file and the entry."""


def runs_of(path):
    """(solver, case, unknowns, seconds, CG iterations or None) per benchmark, medians if repeated."""
    try:
        with open(path, encoding="utf-8") as f:
            benchmarks = json.load(f)["benchmarks"]
    except (OSError, ValueError, KeyError, TypeError) as e:
        raise InputError(f"{path}: not multilevel_scaling's --benchmark_format=json output ({e})")
    repeated = any(b.get("run_type") == "aggregate" for b in benchmarks)
    runs = []
    for b in benchmarks:
        if repeated and b.get("aggregate_name") != "median":
            continue
        name = b.get("run_name", b.get("name", ""))
        parts = name.split("/")
        if len(parts) < 3 or not parts[0].startswith("newton_step_"):
            raise InputError(f"{path}: benchmark '{name}' is not newton_step_<solver>/<case>/<refinements>")
        try:
            seconds = float(b["real_time"]) * SECONDS[b["time_unit"]]
            unknowns = float(b["dofs"])
        except (KeyError, ValueError) as e:
            raise InputError(f"{path}: benchmark '{name}' lacks a time or the 'dofs' counter ({e})")
        runs.append((parts[0][len("newton_step_"):], parts[1], unknowns, seconds, b.get("cg_iterations")))
    if not runs:
        raise InputError(f"{path}: no newton_step benchmarks in it")
    return runs


def slope_line(ax, n, t, exponent, style, label):
    xs = [min(n), max(n)]
    ax.plot(xs, [t[n.index(min(n))] * (x / min(n)) ** exponent for x in xs], style, color="0.5", lw=1,
            label=label)


def figure(runs):
    """The two panels; each solver–case curve carries the gid '<panel>:<solver>:<case>'."""
    fig, (times, iterations) = plt.subplots(1, 2, figsize=(10, 4.2))
    for solver in ("direct", "multilevel"):
        for case in sorted({r[1] for r in runs if r[0] == solver}):
            points = sorted((r[2], r[3], r[4]) for r in runs if r[0] == solver and r[1] == case)
            n, t, its = [p[0] for p in points], [p[1] for p in points], [p[2] for p in points]
            style = dict(color=SOLVER_COLOURS.get(solver, "k"), marker=CASE_MARKERS.get(case, "x"))
            times.loglog(n, t, "-", label=f"{SOLVER_NAMES.get(solver, solver)}, {case}",
                         gid=f"time:{solver}:{case}", **style)
            if solver == "multilevel" and all(i is not None for i in its):
                iterations.semilogx(n, its, "-", label=case, gid=f"iterations:{solver}:{case}", **style)
    for solver, exponent, style in (("multilevel", 1.1, ":"), ("direct", 1.3, "--")):
        for case in sorted({r[1] for r in runs if r[0] == solver})[:1]:
            points = sorted((r[2], r[3]) for r in runs if r[0] == solver and r[1] == case)
            if len(points) > 1:
                slope_line(times, [p[0] for p in points], [p[1] for p in points], exponent, style,
                           f"N^{exponent} through the smallest {solver} point ({case})")
    times.set_xlabel("unknowns")
    times.set_ylabel("time per Newton step (assembly + solve) [s]")
    times.legend(fontsize=7, loc="lower right")
    times.grid(True, which="both", alpha=0.3)
    iterations.axhline(ITERATION_LIMIT, color="0.5", ls="--", lw=1, label=f"limit {ITERATION_LIMIT}")
    iterations.set_xlabel("unknowns")
    iterations.set_ylabel("CG iterations per Newton step")
    iterations.set_ylim(bottom=0)
    iterations.legend(fontsize=7)
    iterations.grid(True, which="both", alpha=0.3)
    fig.suptitle("One Newton step, direct vs multilevel solve (one rank)")
    fig.tight_layout()
    return fig


def save(fig, output):
    temporary = output + ".partial.png"
    try:
        fig.savefig(temporary, dpi=120)
        os.replace(temporary, output)
    finally:
        if os.path.exists(temporary):
            os.remove(temporary)


def main(argv):
    if len(argv) < 3:
        sys.stderr.write("usage: plot_multilevel_scaling.py RESULTS.json [MORE.json …] OUTPUT.png\n")
        return 2
    try:
        runs = [r for path in argv[1:-1] for r in runs_of(path)]
    except InputError as e:
        sys.stderr.write(f"plot_multilevel_scaling.py: {e}\n")
        return 2
    try:
        save(figure(runs), argv[-1])
    except OSError as e:
        sys.stderr.write(f"plot_multilevel_scaling.py: cannot write {argv[-1]}: {e}\n")
        return 1
    print(f"wrote {argv[-1]}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
