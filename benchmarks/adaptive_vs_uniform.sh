#!/usr/bin/env bash
# Adaptive vs uniform meshes, side by side in one run: the built-in demo cell (MoS2 on rounded SiO2 pillars)
# and the egg-carton example laid down on a deeper corrugation (amplitude 5 nm, contact on the crests only).
# For each: the uniform mesh at the finest level and the adaptive solve that reaches the same level from two
# refinements lower; prints unknowns, contact, peak principal strain, solve wall time and peak memory.
#   benchmarks/adaptive_vs_uniform.sh [build dir]       (results: benchmarks/README.md, "Adaptive meshes")
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
solve="${1:-$here/build}/apps/nappe-solve"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
egg=(--set "Topography/Egg carton/Amplitude=5" --set "Substrate/Protocol=laid down"
     --set "Electronics/Lattice export/Enabled=false")

run() { # label, case arguments...
  local label="$1"; shift
  /usr/bin/time -f "%M" -o "$work/mem" "$solve" "$@" --set "Output/Directory=$work" --set "Output/Base name=r" \
    --no-plots --quiet > "$work/log" 2>&1 || { echo "$label: failed"; cat "$work/log"; return 1; }
  python3 - "$label" "$work/r.json" "$(cat "$work/mem")" <<'PY'
import json, sys
label, path, kb = sys.argv[1], sys.argv[2], int(sys.argv[3])
d = json.load(open(path))
print(f"{label:34s} {d['discretization']['degrees_of_freedom']:>9d} unknowns  contact "
      f"{100 * d['conformation']['conformed_fraction']['value']:6.2f} %  peak strain "
      f"{100 * d['extremes']['max_principal_strain']['value']:7.4f} %  {d['solver']['wall_time']['value']:7.2f} s  "
      f"{kb / 1024:7.0f} MB")
PY
}

run "demo cell, uniform r5" --demo --set "Domain/Global refinements=5"
run "demo cell, r3 + 2 adaptive cycles" --demo --set "Domain/Global refinements=3" --set "Mesh adaptation/Cycles=2"
run "egg carton, uniform r4" "$here/examples/mos2_egg_carton_gap.prm" "${egg[@]}" --set "Domain/Global refinements=4"
run "egg carton, r2 + 2 adaptive cycles" "$here/examples/mos2_egg_carton_gap.prm" "${egg[@]}" \
    --set "Domain/Global refinements=2" --set "Mesh adaptation/Cycles=2"
