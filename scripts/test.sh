#!/usr/bin/env bash
# Sets up, builds and runs every test (serial, 2-rank MPI, install + consumer project).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
"$here/scripts/build.sh"
cd "$here/build"
# Two tests at a time (the development and CI machines have two cores; MPI tests oversubscribe).
ctest --output-on-failure -j 2 "$@"
