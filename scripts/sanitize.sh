#!/usr/bin/env bash
# Builds nappe and its whole test suite with AddressSanitizer + UndefinedBehaviorSanitizer (gcc's
# -fsanitize=address,undefined) in a separate build directory and runs every test there (ctest label
# `sanitize`). Not part of every CI run: about 26 min to build and 43 min to test on two cores (DEVELOPERS.md).
#
#   scripts/sanitize.sh [ctest arguments]      e.g. scripts/sanitize.sh -R height_map
#   NAPPE_SANITIZE_DIR=/path scripts/sanitize.sh   (default: build/sanitize)
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
dir="${NAPPE_SANITIZE_DIR:-$here/build/sanitize}"
"$here/scripts/install-deps.sh"
start=$(date +%s)
# Debug information for readable reports; -O1 keeps the run time bearable; benchmarks are not tests.
# gcc 12 with -fsanitize warns "may be used uninitialized" inside libstdc++'s <regex> (std::function in
# its automaton states), a false positive that -Werror would turn into a failed build.
cmake -S "$here" -B "$dir" -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_FLAGS_RELEASE="-O1 -g -DNDEBUG -Wno-maybe-uninitialized" \
      -DNAPPE_SANITIZE=ON -DNAPPE_BUILD_BENCHMARKS=OFF >/dev/null
cmake --build "$dir" -j 2
built=$(date +%s)
cd "$dir"
status=0
ctest --output-on-failure -L sanitize "$@" || status=$?
finished=$(date +%s)
echo "sanitize: build $((built - start)) s, tests $((finished - built)) s"
exit $status
