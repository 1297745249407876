#!/usr/bin/env bash
# Sets up, builds and runs the built-in demo case; results go to demo-output/.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
"$here/scripts/build.sh"
mkdir -p "$here/demo-output"
cd "$here/demo-output"
"$here/build/apps/nappe-solve" --demo "$@"
