#!/usr/bin/env bash
# Adhesion limits on adaptive vs uniform meshes, side by side in one run: MoS2 on a square array of SiO2
# nanopillars (sweeps/pillar_cell.prm with pitch 60 nm, height 5 nm, radius 12 nm: the tents collapse onto
# the floor near 0.7 J/m²), both Γ paths over 0.2–1 J/m², relative tolerance 0.2 %. The uniform mesh at the
# finest level and the adaptive run that reaches that level two refinements lower (Mesh adaptation/Cycles =
# 2, default shares; a coarser start does not resolve the pillar's 2 nm edge radius); prints each
# transition (path, kind, Γ bracket, conformed fraction before → after), the largest mesh each path used,
# the minimisations, the wall time and the peak memory.
#   benchmarks/adaptive_limits.sh [build dir] [finest refinement, default 4]
#   (results: benchmarks/README.md, "Adhesion limits on adaptive meshes")
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
limits="${1:-$here/build}/apps/nappe-limits"
finest="${2:-4}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
range=(--set "Topography/Array pitch=60" --set "Topography/Pillar/Height=5" --set "Topography/Pillar/Radius=12"
       --set "Adhesion limits/Lowest work of adhesion=0.2" --set "Adhesion limits/Highest work of adhesion=1"
       --set "Adhesion limits/Relative tolerance=0.002")

run() { # label, case arguments...
  local label="$1"; shift
  /usr/bin/time -f "%M" -o "$work/mem" "$limits" "$here/benchmarks/sweeps/pillar_cell.prm" "${range[@]}" "$@" \
    --set "Output/Directory=$work" --set "Output/Base name=r" --no-plots --quiet > "$work/log" 2>&1 ||
    { echo "$label: failed"; cat "$work/log"; return 1; }
  python3 - "$label" "$work/r_limits.json" "$(cat "$work/mem")" <<'PY'
import json, sys
label, path, kb = sys.argv[1], sys.argv[2], int(sys.argv[3])
d = json.load(open(path))
paths = [d["lowering_path"], d["raising_path"]]
print(f"{label}: largest mesh {max(p['largest_unknowns'] for p in paths):,} unknowns, "
      f"{sum(p['minimisations'] for p in paths)} minimisations, "
      f"{sum(p['wall_time']['value'] for p in paths):.1f} s, {kb / 1024:.0f} MB")
for t in d["transitions"]:
    print(f"    {t['path']:4s} {t['kind']:24s} [{t['gamma_lower']['value']:.4f}, {t['gamma_upper']['value']:.4f}] J/m^2"
          f"  fraction {t['fraction_before']['value']:.4f} -> {t['fraction_after']['value']:.4f}")
PY
}

run "uniform, refinement $finest" --set "Domain/Global refinements=$finest"
run "refinement $((finest - 2)) + 2 adaptive cycles" --set "Domain/Global refinements=$((finest - 2))" \
    --set "Mesh adaptation/Cycles=2"
