#!/usr/bin/env bash
# Static analysis of our own code with cppcheck, using the compile commands of a configured build
# (build/compile_commands.json by default, or the directory given). Configuration: scripts/cppcheck.supp
# (suppressions, each with its reason). Third-party headers (Eigen, Boost, ERFA, cfitsio, HDF5,
# doctest) are not analysed: only files under astro/, io/, planner/ and tests/ are checked.
# Fails (exit 1) on any finding.
#   scripts/lint.sh [BUILD_DIR]
set -euo pipefail
cd "$(dirname "$0")/.."
build=${1:-build}
if [ ! -f "$build/compile_commands.json" ]; then
  cmake -S . -B "$build" -DCMAKE_BUILD_TYPE=Release >/dev/null
fi
mkdir -p "$build/cppcheck"
cppcheck --project="$build/compile_commands.json" \
         --enable=warning,style,performance,portability --std=c++20 --inline-suppr \
         --suppressions-list=scripts/cppcheck.supp --cppcheck-build-dir="$build/cppcheck" \
         -j "$(nproc 2>/dev/null || echo 2)" --error-exitcode=1 --quiet \
         --template='{file}:{line}: {severity} ({id}): {message}'
echo "cppcheck: no findings"
