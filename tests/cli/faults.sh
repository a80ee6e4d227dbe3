#!/usr/bin/env bash
# Fault tests of the real binary (registered by tests/cli/faults_tests.cmake):
#   faults.sh kill        SIIPLAN DEMO WORK   SIGKILL mid-write: the target is the old file or the whole new one
#   faults.sh determinism SIIPLAN DEMO WORK   same inputs and seed: byte-identical outputs
#   faults.sh unwritable  SIIPLAN DEMO WORK   output directory without write permission: exit 1, clear message
#   faults.sh diskfull    SIIPLAN DEMO WORK   a 64 KiB tmpfs fills up: exit 1, clear message, no partial file
# Exit 0 = pass, 77 = skipped (ctest SKIP_RETURN_CODE; the reason is printed), anything else = failure.
set -uo pipefail
mode=$1 siiplan=$2 demo=$3 work=$4
rm -rf "$work" && mkdir -p "$work" || exit 1
cd "$work" || exit 1

fail() { echo "FAIL: $*"; exit 1; }
OBS=(--site "$demo/site.ini" --array "$demo/array-large.csv")
NIGHT=(night --site "$demo/site.ini" --array "$demo/array-small.csv" --instrument "$demo/instrument-small.ini"
       --date 2026-03-14 --catalog "$demo/targets.csv")
# A table of 400001 rows (about 20 MB of CSV): long enough to be caught while it is being written.
BIG_CURVE=(curve --model ud --diameter-mas 1.5 --wavelength-nm 450 --baselines-m 0:200:0.0005 --format csv)

# Runs the command in the background, kills it with SIGKILL after $1 seconds; returns 0 when it was
# killed (still running at that moment), 1 when it had already finished.
kill_after() {
  local delay=$1; shift
  "$@" >/dev/null 2>&1 &
  local pid=$!
  sleep "$delay"
  local killed=1
  if kill -0 "$pid" 2>/dev/null; then kill -KILL "$pid" 2>/dev/null && killed=0; fi
  wait "$pid" 2>/dev/null
  return $killed
}

case $mode in
kill)
  "$siiplan" "${BIG_CURVE[@]}" -o ref.csv >/dev/null 2>&1 || fail "reference run of siiplan curve failed"
  "$siiplan" "${NIGHT[@]}" --out ref-night >/dev/null 2>&1 || fail "reference run of siiplan night failed"
  killed=0 finished=0 old=0 new=0
  for delay in 0.05 0.1 0.2 0.3 0.4 0.5 0.7 0.9 1.2 1.5 2.0 3.0; do
    # curve -o FILE over an existing file
    printf 'old content\n' > out.csv
    if kill_after "$delay" "$siiplan" "${BIG_CURVE[@]}" -o out.csv; then killed=$((killed + 1)); else finished=$((finished + 1)); fi
    if cmp -s out.csv ref.csv; then new=$((new + 1))
    elif [ "$(cat out.csv)" = "old content" ]; then old=$((old + 1))
    else fail "after SIGKILL at ${delay}s out.csv is neither the old file nor the complete new one ($(wc -c < out.csv) bytes)"
    fi
    # night --out DIR: every file is absent, or complete
    rm -rf night && mkdir night
    kill_after "$delay" "$siiplan" "${NIGHT[@]}" --out night && killed=$((killed + 1))
    for f in night/*; do
      [ -e "$f" ] || continue
      case $(basename "$f") in
        report.html|schedule.csv|baselines.csv|plan.h5)
          cmp -s "$f" "ref-night/$(basename "$f")" || fail "after SIGKILL at ${delay}s $f differs from a complete run's" ;;
        *) fail "after SIGKILL at ${delay}s an unexpected file is visible: $f" ;;
      esac
    done
  done
  echo "kills during a run: $killed; curve runs that finished first: $finished; out.csv old: $old, new: $new"
  [ "$killed" -ge 3 ] || fail "fewer than 3 runs were interrupted; the test proved nothing"
  echo "ok: no partial output after SIGKILL"
  ;;

determinism)
  # curve, tracks: tables and SVG; night: schedule.csv, baselines.csv, plan.h5, report.html (which
  # embeds no generation time); simulate/reduce: correlation file, OIFITS and CSV; fit: bootstrap text.
  # Each run works in its own directory with the same relative paths. The one allowed difference is the
  # OIFITS primary header's DATE card (file creation time, metadata only).
  for run in 1 2; do
    mkdir -p "r$run" && cd "r$run" || exit 1
    "$siiplan" curve --model ld-linear --diameter-mas 2.1 --limb-u 0.6 --wavelength-nm 450 --bandwidth-nm 10 \
        --baselines-m 0:300:0.5 --format csv -o curve.csv >/dev/null || fail "curve run $run"
    "$siiplan" tracks "${OBS[@]}" --ra 05:55:10.3 --dec +07:24:25 --night 2026-01-15 --format csv \
        -o tracks.csv --plot tracks.svg >/dev/null || fail "tracks run $run"
    "$siiplan" "${NIGHT[@]}" --out night --threads "$run" >/dev/null || fail "night run $run"
    "$siiplan" simulate --plan night/plan.h5 --seed 7 -o corr.h5 >/dev/null 2>&1 || fail "simulate run $run"
    "$siiplan" reduce corr.h5 -o vis2.oifits --csv vis2.csv >/dev/null 2>&1 || fail "reduce run $run"
    "$siiplan" fit vis2.csv --model ud --bootstrap 50 --seed 3 > fit.txt 2>&1 || fail "fit run $run"
    cd ..
  done
  status=0
  for f in $(cd r1 && find . -type f | sort); do
    if cmp -s "r1/$f" "r2/$f"; then echo "identical: $f"; continue; fi
    case $f in
      *.oifits)
        # every differing byte must lie inside the 80-byte DATE card of the primary header
        card=$(grep -abo "DATE    = '" "r1/$f" | head -n 1 | cut -d: -f1)
        others=$(cmp -l "r1/$f" "r2/$f" | awk -v c="${card:--1000}" '$1 - 1 < c || $1 - 1 >= c + 80' | wc -l)
        if [ -n "$card" ] && [ "$others" = 0 ]; then echo "identical except the DATE card: $f"; continue; fi ;;
    esac
    echo "DIFFERENT: $f"; status=1
  done
  [ $status = 0 ] || fail "outputs differ between two runs with the same inputs and seed"
  grep -qiE 'generated (at|on) [0-9]{4}-' r1/night/report.html && fail "report.html embeds a generation time in its body"
  echo "ok: byte-identical"
  ;;

unwritable)
  mkdir ro && printf 'old\n' > ro/curve.csv
  run=("$siiplan")
  if [ "$(id -u)" = 0 ]; then
    # root ignores permission bits: run as nobody, which cannot write to a directory owned by root
    command -v setpriv >/dev/null || { echo "skipped: running as root and setpriv is missing"; exit 77; }
    run=(setpriv --reuid=65534 --regid=65534 --clear-groups "$siiplan")
  fi
  chmod 755 ro
  chmod 644 ro/curve.csv
  [ "$(id -u)" = 0 ] || chmod 555 ro
  "${run[@]}" curve --model ud --diameter-mas 1 --wavelength-nm 450 --baselines-m 0:100:10 -o ro/curve.csv \
      > stdout.txt 2> stderr.txt
  rc=$?
  chmod 755 ro
  cat stderr.txt
  [ $rc = 1 ] || fail "exit code $rc, expected 1"
  grep -qE '^siiplan: ro/curve.csv: cannot create the output file: Permission denied \(check that the directory is writable\)' stderr.txt \
      || fail "message does not name the file and the cause"
  [ "$(cat ro/curve.csv)" = "old" ] || fail "the existing file changed"
  [ -z "$(ls -A ro | grep -v '^curve.csv$')" ] || fail "a temporary file was left behind: $(ls -A ro)"
  # a directory that does not exist
  "$siiplan" curve --model ud --diameter-mas 1 --wavelength-nm 450 --baselines-m 0:100:10 -o nodir/curve.csv 2> stderr2.txt
  rc=$?
  cat stderr2.txt
  [ $rc = 1 ] || fail "missing directory: exit code $rc, expected 1"
  grep -q "the output directory 'nodir' does not exist" stderr2.txt || fail "missing directory: unclear message"
  echo "ok: unwritable output"
  ;;

diskfull)
  mkdir full
  if [ "$(id -u)" = 0 ] && mount -t tmpfs -o size=64k tmpfs full 2>/dev/null; then
    trap 'umount "$work/full"' EXIT
    in_ns=()
  elif unshare -rm true 2>/dev/null; then
    in_ns=(unshare -rm sh -c 'mount -t tmpfs -o size=64k tmpfs full && exec "$0" "$@"')
  else
    echo "skipped: cannot mount a small tmpfs here (needs root or user namespaces)"; exit 77
  fi
  # curve table (text writer), then night (CSV, HTML and HDF5 writers) into the full file system
  check_full() {
    local rc=$1 name=$2
    cat stderr.txt
    [ "$rc" = 1 ] || fail "$name: exit code $rc, expected 1"
    grep -qE '^siiplan: .*(disk full|No space left|free some space)' stderr.txt || fail "$name: the message does not say the disk is full"
  }
  if [ ${#in_ns[@]} = 0 ]; then
    printf 'old\n' > full/curve.csv
    "$siiplan" "${BIG_CURVE[@]}" -o full/curve.csv 2> stderr.txt; check_full $? curve
    [ "$(cat full/curve.csv)" = old ] || fail "curve: the existing file changed"
    [ "$(ls -A full)" = curve.csv ] || fail "curve: files left behind: $(ls -A full)"
    # night writes four files one after the other: those written before the disk filled are complete
    "$siiplan" "${NIGHT[@]}" --out ref-night >/dev/null 2>&1 || fail "reference run of siiplan night failed"
    "$siiplan" "${NIGHT[@]}" --out full/night 2> stderr.txt; check_full $? night
    for f in $(ls -A full/night 2>/dev/null); do
      cmp -s "full/night/$f" "ref-night/$f" || fail "night: $f is not a complete output"
    done
  else
    "${in_ns[@]}" "$siiplan" "${BIG_CURVE[@]}" -o full/curve.csv 2> stderr.txt; check_full $? curve
  fi
  echo "ok: disk full"
  ;;
*) fail "unknown mode $mode" ;;
esac
