#!/usr/bin/env bash
# Builds nappe, then runs the two electronic demo scenarios (our own inventions) and draws their maps into
# demo-output/electronics/: graphene on a hexagonal array of Gaussian bumps (pseudo-magnetic field, deformation
# potential) and MoS2 on an egg-carton corrugation (optical gap shift). Each writes the strained lattice (.xyz, .cif).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
"$here/scripts/build.sh"
out="$here/demo-output/electronics"
mkdir -p "$out"
python="${NAPPE_PYTHON:-/usr/bin/python3}"
for case in graphene_bump_array_electronics mos2_egg_carton_gap; do
  "$here/build/apps/nappe-solve" "$here/examples/$case.prm" --set "Output/Directory=$out" "$@"
done
for lattice in graphene-bumps_lattice.xyz mos2-egg-carton_lattice.xyz; do
  "$python" "$here/scripts/plot_electronics.py" "$out/$lattice"
done
