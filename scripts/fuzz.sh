#!/usr/bin/env bash
# Builds the libFuzzer harnesses (tests/fuzz/fuzz_*.cpp) with clang and runs each for SECONDS seconds
# (default 60) from its committed seed corpus (tests/fuzz/corpus/<harness>/). New inputs found go to a
# scratch copy of the corpus; a crash leaves crash-* files in build-fuzz/ and makes the script fail.
#   scripts/fuzz.sh [SECONDS]
set -euo pipefail
cd "$(dirname "$0")/.."
seconds=${1:-60}
scripts/install-deps.sh
cmake -S . -B build-fuzz -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_C_COMPILER=clang -DCMAKE_CXX_COMPILER=clang++ \
      -DSIIPLAN_FUZZ=ON -DSIIPLAN_BUILD_TESTS=OFF -DSIIPLAN_SANITIZE=ON >/dev/null
cmake --build build-fuzz -j "$(nproc 2>/dev/null || echo 2)" --target $(cd tests/fuzz && ls fuzz_*.cpp | sed 's/\.cpp$//')
status=0
for src in tests/fuzz/fuzz_*.cpp; do
  name=$(basename "$src" .cpp)
  work=build-fuzz/corpus-$name
  mkdir -p "$work"
  [ -d "tests/fuzz/corpus/$name" ] && cp -n tests/fuzz/corpus/"$name"/* "$work"/ 2>/dev/null || true
  echo "== $name (${seconds}s)"
  (cd build-fuzz && "tests/fuzz/$name" -max_total_time="$seconds" -max_len=65536 -print_final_stats=0 \
       "corpus-$name" 2>"$name.log") || { echo "$name: finding, see build-fuzz/$name.log"; status=1; }
  tail -n 1 "build-fuzz/$name.log"
done
exit $status
