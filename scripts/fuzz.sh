#!/usr/bin/env bash
# Builds the libFuzzer harnesses (tests/fuzz/fuzz_*.cpp, one per reader) with clang, ASan and UBSan and
# runs each for SECONDS seconds (default 60) from its committed inputs: the seed corpus
# (tests/fuzz/corpus/<harness>/) and the regression inputs (tests/fuzz/regressions/<harness>/; ctest replays
# both in every ordinary test build, so a fixed bug stays fixed).
# New inputs found go to a scratch copy of the corpus (build-fuzz/corpus-<harness>/); a finding (crash,
# sanitizer report, uncaught exception other than siiplan::InputError, leak, input slower than 25 s, an
# allocation above 512 MiB) leaves crash-*/leak-*/timeout-*/oom-* files in build-fuzz/findings-<harness>/
# and, unless it lies inside HDF5 or cfitsio (see the triage below), makes the script fail. Leaks inside
# HDF5 and cfitsio are suppressed by tests/lsan.supp (third-party frames only).
#   scripts/fuzz.sh [SECONDS [HARNESS...]]     (default: every harness)
set -euo pipefail
cd "$(dirname "$0")/.."
seconds=${1:-60}
shift $(( $# > 0 ? 1 : 0 ))
harnesses=("$@")
[ ${#harnesses[@]} -gt 0 ] || harnesses=($(cd tests/fuzz && ls fuzz_*.cpp | sed 's/\.cpp$//'))
scripts/install-deps.sh
cmake -S . -B build-fuzz -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_C_COMPILER=clang -DCMAKE_CXX_COMPILER=clang++ \
      -DSIIPLAN_FUZZ=ON -DSIIPLAN_BUILD_TESTS=OFF -DSIIPLAN_SANITIZE=ON >/dev/null
cmake --build build-fuzz -j "$(nproc 2>/dev/null || echo 2)" --target "${harnesses[@]}"
export LSAN_OPTIONS="suppressions=$PWD/tests/lsan.supp:print_suppressions=0"
# A huge allocation request from a corrupt header returns NULL, as in the real program (cfitsio checks).
export ASAN_OPTIONS="allocator_may_return_null=1"
# Any single allocation above 512 MiB is a finding with its stack: siiplan's readers never ask for more than
# about 1000 times the file's size (inputs here are at most 64 KiB), so the stack says whose it is.
limits=(-max_len=65536 -timeout=25 -rss_limit_mb=2048 -malloc_limit_mb=512)
status=0
for name in "${harnesses[@]}"; do
  work=build-fuzz/corpus-$name findings=build-fuzz/findings-$name
  rm -rf "$findings" && mkdir -p "$work" "$findings"
  for seeds in tests/fuzz/corpus/"$name" tests/fuzz/regressions/"$name"; do
    [ -d "$seeds" ] && cp -n "$seeds"/* "$work"/ 2>/dev/null || true
  done
  echo "== $name (${seconds}s)"
  # fork mode keeps fuzzing after a finding; every finding is saved and triaged below
  (cd build-fuzz && "tests/fuzz/$name" -fork=1 -ignore_crashes=1 -ignore_timeouts=1 -ignore_ooms=1 \
       -max_total_time="$seconds" "${limits[@]}" -artifact_prefix="findings-$name/" \
       "corpus-$name" >"$name.log" 2>&1) || true
  grep -E 'cov: ' "build-fuzz/$name.log" | tail -n 1 || true
  # Triage: a finding whose innermost frame in either our code or HDF5/cfitsio (skipping the sanitizer,
  # libFuzzer and C library frames, e.g. a fortify abort inside strcpy) lies in HDF5 or cfitsio is a
  # third-party bug (listed, not fatal: siiplan cannot guard against every malformed file inside those
  # libraries); anything else is ours and fails the run.
  for f in "$findings"/*; do
    [ -e "$f" ] || continue
    trace=$("build-fuzz/tests/fuzz/$name" -timeout=10 -rss_limit_mb=2048 -malloc_limit_mb=512 "$f" 2>&1 || true)
    summary=$(grep -m 1 -E '^SUMMARY' <<<"$trace" || true)
    # (our frames by their source file, so that an allocator frame in the harness binary does not count)
    frame=$(grep -E '^ +#[0-9]+ 0x' <<<"$trace" \
              | grep -vE 'sanitizer|interceptor|fuzzer::| in (malloc|calloc|realloc|free|operator (new|delete))' \
              | grep -E 'lib(hdf5|cfitsio)|/(astro|io|planner|tests)/[^ ]*\.(cpp|hpp):[0-9]' | head -n 1 || true)
    if grep -qE 'libhdf5|libcfitsio' <<<"$frame"; then
      echo "   third-party finding $f: $summary in $(grep -oE 'lib(hdf5|cfitsio)[^ )]*' <<<"$frame" | head -n 1)"
    elif [ -n "$summary" ]; then
      echo "   FINDING $f: $summary"; status=1
    else
      echo "   finding $f no longer reproduces"
    fi
  done
done
exit $status
