#!/usr/bin/env bash
# Installs the Debian packages nappe needs to build, test and plot. Idempotent: packages
# already present are skipped by apt, and the whole step is skipped when every package is there.
set -euo pipefail

packages=(
  cmake make g++ pkg-config
  libdeal.ii-dev            # deal.II 9.4 with MPI, p4est, Trilinos (Amesos/MUMPS, ROL), Gmsh, muParser, CGAL
  openmpi-bin libopenmpi-dev
  libopenblas-dev libopenblas0   # optimised BLAS; Debian's default reference BLAS makes MUMPS ~6x slower
  libboost-dev
  libgtest-dev googletest libbenchmark-dev
  python3 python3-matplotlib     # plots of sweeps and regime maps
  clang                          # fuzz targets (scripts/fuzz.sh): libFuzzer, AddressSanitizer, UBSan
  python3-ase python3-spglib python3-gemmi   # tests read the strained-lattice exports (extended XYZ, CIF) and check symmetry
)
# clang's libFuzzer and sanitizer runtimes come in a package named after clang's major version.
clang_major=$(clang++ --version 2>/dev/null | sed -n 's/.*clang version \([0-9]*\).*/\1/p' | head -1)
packages+=("libclang-rt-${clang_major:-14}-dev")

missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done

if [ ${#missing[@]} -eq 0 ]; then
  echo "install-deps: all ${#packages[@]} packages present"
else
  echo "install-deps: installing ${missing[*]}"
  SUDO=""
  [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi

# Make sure the BLAS alternative points at OpenBLAS, not the reference implementation.
blas=$(readlink -f /usr/lib/x86_64-linux-gnu/libblas.so.3 2>/dev/null || true)
case "$blas" in
  *openblas*) echo "install-deps: BLAS is $blas" ;;
  *) echo "install-deps: warning: BLAS resolves to '$blas', not OpenBLAS; MUMPS will be slow" >&2 ;;
esac
