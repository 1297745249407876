#!/usr/bin/env bash
# Builds and runs nappe's fuzz targets (clang's libFuzzer with AddressSanitizer and
# UndefinedBehaviorSanitizer; sources and seed corpora in tests/fuzz/, see tests/fuzz/README.md).
#
#   scripts/fuzz.sh [--runs N | --time SECONDS] [--ci] [target ...]
#
#   targets: height_map stl gmsh_mesh formula case_file sweep_file sweep_record (default: all)
#   --runs N     executions per target (default 1000000)
#   --time S     run each target for S seconds instead
#   --ci         the short run of ctest (fuzz.readers): --time 10 unless given, and exit 77 (skipped)
#                when clang, libFuzzer or the sanitizer runtimes are missing instead of installing them
#   --no-leaks   skip libFuzzer's leak check after each input that grew the heap (it rescans the whole
#                heap; caches and deal.II's parameter tree trigger it often, several times slower)
#
# Environment: NAPPE_BUILD_DIR (main build with lib/libnappe.so; default build/), NAPPE_FUZZ_DIR (the
# clang build and the working corpora; default $NAPPE_BUILD_DIR/fuzz). Inputs that fail are saved as
# $NAPPE_FUZZ_DIR/findings/<target>-crash-… (replay: build/fuzz/fuzz_<target> <file>).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
all_targets=(height_map stl gmsh_mesh formula case_file sweep_file sweep_record)
runs=1000000
seconds=""
ci=false
leaks=1
targets=()
while [ $# -gt 0 ]; do
  case "$1" in
    --runs) runs="$2"; shift 2 ;;
    --time) seconds="$2"; shift 2 ;;
    --ci) ci=true; shift ;;
    --no-leaks) leaks=0; shift ;;
    -h|--help) sed -n '2,19p' "$0"; exit 0 ;;
    *) targets+=("$1"); shift ;;
  esac
done
[ ${#targets[@]} -eq 0 ] && targets=("${all_targets[@]}")
$ci && [ -z "$seconds" ] && seconds=10

build="${NAPPE_BUILD_DIR:-$here/build}"
dir="${NAPPE_FUZZ_DIR:-$build/fuzz}"
mkdir -p "$dir"

# A fuzz target needs clang++ with the libFuzzer and sanitizer runtimes (Debian: clang, libclang-rt-N-dev).
toolchain_works() {
  command -v clang++ >/dev/null 2>&1 || return 1
  printf 'extern "C" int LLVMFuzzerTestOneInput(const unsigned char *, unsigned long) { return 0; }\n' \
    > "$dir/probe.cc"
  clang++ -fsanitize=fuzzer,address,undefined "$dir/probe.cc" -o "$dir/probe" >/dev/null 2>&1
}
if ! toolchain_works; then
  if $ci; then
    echo "fuzz: SKIPPED — clang++ with libFuzzer and the sanitizer runtimes is not installed (scripts/install-deps.sh)"
    exit 77
  fi
  "$here/scripts/install-deps.sh"
  toolchain_works || { echo "fuzz: clang++ cannot build a libFuzzer target" >&2; exit 1; }
fi

library="$build/lib/libnappe.so"
if [ ! -e "$library" ]; then
  cmake -S "$here" -B "$build" -DCMAKE_BUILD_TYPE=Release >/dev/null
  cmake --build "$build" -j 2 --target nappe
fi

start=$(date +%s)
cmake -S "$here/tests/fuzz" -B "$dir" -DCMAKE_CXX_COMPILER=clang++ -DNAPPE_LIBRARY="$library" >/dev/null
cmake --build "$dir" -j 2 --target $(printf 'fuzz_%s ' "${targets[@]}") >/dev/null
echo "fuzz: built ${#targets[@]} targets in $(( $(date +%s) - start )) s"

# No allocation stacks and a small quarantine: several times faster; replay a finding without these
# options for the full report.
export ASAN_OPTIONS="malloc_context_size=0:quarantine_size_mb=16:strict_string_checks=1"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1"
export LSAN_OPTIONS="suppressions=$here/tests/fuzz/lsan.supp:print_suppressions=0"
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1 OMP_NUM_THREADS=1
mkdir -p "$dir/findings"
export NAPPE_FUZZ_FINDINGS="$dir/findings"
status=0
summary=""
for target in "${targets[@]}"; do
  corpus="$dir/corpus/$target"
  seeds="$here/tests/fuzz/corpus/$target"
  mkdir -p "$corpus"
  limit=(-runs="$runs")
  [ -n "$seconds" ] && limit=(-max_total_time="$seconds")
  dict=()
  [ -f "$here/tests/fuzz/dict/$target.dict" ] && dict=(-dict="$here/tests/fuzz/dict/$target.dict")
  log="$dir/$target.log"
  t0=$(date +%s)
  if "$dir/fuzz_$target" "${limit[@]}" "${dict[@]}" -detect_leaks=$leaks -max_len=8192 -timeout=60 -rss_limit_mb=4096 \
       -print_final_stats=1 -artifact_prefix="$dir/findings/$target-" "$corpus" "$seeds" > "$log" 2>&1; then
    result="no finding"
  else
    result="FINDING (see $log)"
    status=1
    tail -40 "$log"
  fi
  executions=$(sed -n 's/^Done \([0-9]*\) runs.*/\1/p' "$log" | tail -1)
  [ -z "$executions" ] && executions=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -1)
  summary+=$(printf '%-11s %10s executions %6s s  %s' "$target" "${executions:-?}" "$(( $(date +%s) - t0 ))" "$result")$'\n'
done
printf '%s' "$summary"
exit $status
