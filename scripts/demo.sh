#!/usr/bin/env bash
# Installs the dependencies, builds siiplan (Release, in build/) and runs it on the demo scenario in
# catalogs-demo/ (an invented site, array and stars). Outputs go to demo-out/.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/install-deps.sh
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release >/dev/null
cmake --build build -j "$(nproc 2>/dev/null || echo 2)"
mkdir -p demo-out
bin=build/planner/siiplan
demo=catalogs-demo
