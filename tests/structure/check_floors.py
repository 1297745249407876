#!/usr/bin/env python3
"""Checks the library's layering (DEVELOPERS.md, "Floors"):

  - every #include <nappe/<module>/...> in include/nappe/ and lib/ goes to the same or a lower floor,
    base < geometry < physics < solvers < analysis < io < runs;
  - the headers include each other without a cycle;
  - no library source or header is longer than 500 lines.

Usage: check_floors.py SOURCE_DIR. Prints one line per violation and exits 1 if there is any.
"""
import os
import re
import sys

FLOORS = ["base", "geometry", "physics", "solvers", "analysis", "io", "runs"]
MAX_LINES = 500
INCLUDE = re.compile(r'^\s*#\s*include\s*<nappe/([a-z_]+)/([A-Za-z0-9_]+\.h)>', re.MULTILINE)


def library_files(root):
    for top in ("include/nappe", "lib"):
        for folder, _, names in os.walk(os.path.join(root, top)):
            for name in sorted(names):
                if name.endswith((".h", ".cc")):
                    yield os.path.join(folder, name)


def module_of(root, path):
    parts = os.path.relpath(path, root).split(os.sep)
    return parts[2] if parts[0] == "include" else parts[1]


def main(root):
    problems = []
    graph = {}
    for path in library_files(root):
        module = module_of(root, path)
        if module not in FLOORS:
            continue  # lib/nappe_pch.h
        with open(path, encoding="utf-8") as f:
            text = f.read()
        lines = text.count("\n")
        rel = os.path.relpath(path, root)
        if lines > MAX_LINES:
            problems.append(f"{rel}: {lines} lines, more than {MAX_LINES}")
        for target_module, header in INCLUDE.findall(text):
            if target_module not in FLOORS:
                problems.append(f"{rel}: includes nappe/{target_module}/{header}, a module outside the floors")
            elif FLOORS.index(target_module) > FLOORS.index(module):
                problems.append(f"{rel}: includes nappe/{target_module}/{header}: {module} may not include the "
                                f"higher floor {target_module}")
        if rel.startswith("include"):
            graph[f"{module}/{os.path.basename(path)}"] = [f"{m}/{h}" for m, h in INCLUDE.findall(text)]
    problems += cycles(graph)
    for p in problems:
        print(p)
    print(f"checked {sum(1 for _ in library_files(root))} library files: {len(problems)} problem(s)")
    return 1 if problems else 0


def cycles(graph):
    """Header include cycles, each reported once."""
    found, state = [], {}

    def visit(node, stack):
        state[node] = "open"
        for nxt in graph.get(node, []):
            if state.get(nxt) == "open":
                found.append("include cycle: " + " -> ".join(stack[stack.index(nxt):] + [nxt]))
            elif nxt not in state:
                visit(nxt, stack + [nxt])
        state[node] = "done"

    for node in sorted(graph):
        if node not in state:
            visit(node, [node])
    return found


if __name__ == "__main__":
    if len(sys.argv) != 2:
        sys.exit("usage: check_floors.py SOURCE_DIR")
    sys.exit(main(sys.argv[1]))
