#!/usr/bin/env bash
# Installs the dependencies, builds siiplan (Release, in build/) and runs it on the demo scenario in
# catalogs-demo/ (an invented site, array and stars). Outputs go to demo-out/.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/install-deps.sh
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release >/dev/null
# only the program (the test suite and fuzz replays are built by scripts/test.sh)
cmake --build build -j "$(nproc 2>/dev/null || echo 2)" --target siiplan
mkdir -p demo-out
bin=build/planner/siiplan
demo=catalogs-demo

# The observing-night planner on the large and the small array (night of 2026-03-14).
for arr in large small; do
  "$bin" night --site "$demo/site.ini" --array "$demo/array-$arr.csv" --instrument "$demo/instrument-$arr.ini" \
    --catalog "$demo/targets.csv" --date 2026-03-14 --out "demo-out/night-$arr" > "demo-out/night-$arr.txt"
  echo "Night plan ($arr array): demo-out/night-$arr/report.html (summary in demo-out/night-$arr.txt)"
done

# Optional: the whole chain on the large-array plan: simulate (with faults) -> reduce -> fit.
if [ "${DEMO_CHAIN:-0}" = 1 ]; then
  "$bin" simulate demo-out/night-large/plan.h5 --seed 1 --timing-offset Birch:8 --cloud 120:135:0.1 \
    --drop-telescope Elm:200:230 -o demo-out/corr-large.h5
  # instrument-large.ini has zero_baseline = free: no calibration recorded, c0 is fitted with the diameter
  "$bin" reduce demo-out/corr-large.h5 --zero-baseline-nominal -o demo-out/vis2-large.oifits \
    --csv demo-out/vis2-large.csv > demo-out/reduce-large.txt
  "$bin" fit demo-out/vis2-large.oifits --target Kelvane --free-norm > demo-out/fit-kelvane.txt
  echo "Simulated and reduced night: demo-out/reduce-large.txt; fit of Kelvane: demo-out/fit-kelvane.txt"
fi
