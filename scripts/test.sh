#!/usr/bin/env bash
# Sets up, builds and runs every test (serial, 2-rank MPI, install + consumer project).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
"$here/scripts/build.sh"
cd "$here/build"
ctest --output-on-failure "$@"
