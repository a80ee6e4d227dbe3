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

# The observing-night planner on the large and the small array (night of 2026-03-14).
for arr in large small; do
  "$bin" night --site "$demo/site.ini" --array "$demo/array-$arr.csv" --instrument "$demo/instrument-$arr.ini" \
    --catalog "$demo/targets.csv" --date 2026-03-14 --out "demo-out/night-$arr" > "demo-out/night-$arr.txt"
  echo "Night plan ($arr array): demo-out/night-$arr/report.html (summary in demo-out/night-$arr.txt)"
done
