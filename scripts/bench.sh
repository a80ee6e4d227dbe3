#!/bin/bash
# All benchmarks of issue 8 with one command, from the repository root:
#
#     scripts/bench.sh
#
# 1. builds build-bench/ (Release, -DSIIPLAN_BUILD_BENCH=ON: kernel_bench, geometry_bench, night_bench, siiplan);
# 2. writes synthetic inputs into a temporary directory (scripts/bench-inputs.py: 2,000 and 200 stars,
#    50- and 4-telescope arrays) and runs `siiplan night` on them (demo site and instrument-large.ini,
#    night of 2026-03-14, 10-minute slots) under /usr/bin/time -v: wall, CPU and peak memory;
# 3. runs the Google Benchmark programs (kernel ns/element and its floor, geometry, planner scaling);
# 4. runs the numpy/scipy reference (scripts/bench-peer.py) on the same grid in the same run;
# 5. prints a summary: ratios to the reference and the floor, scaling exponents, the load average.
# Other jobs on the machine distort the numbers: look at the load average printed before and after.
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$PWD
BUILD=${SIIPLAN_BENCH_BUILD:-$ROOT/build-bench}
PY=/usr/bin/python3   # Debian's interpreter: numpy, scipy

cmake -S "$ROOT" -B "$BUILD" -DCMAKE_BUILD_TYPE=Release -DSIIPLAN_BUILD_BENCH=ON -DSIIPLAN_BUILD_TESTS=OFF > /dev/null
cmake --build "$BUILD" -j2 --target siiplan kernel_bench geometry_bench night_bench > /dev/null

TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
$PY scripts/bench-inputs.py "$TMP"
echo "machine: $(lscpu | sed -n 's/^Model name: *//p'), $(nproc) cores; load before: $(cut -d' ' -f1-3 /proc/loadavg)"

# siiplan night under /usr/bin/time -v: NAME CATALOG ARRAY THREADS
night() {
  /usr/bin/time -v -o "$TMP/time-$1.txt" "$BUILD/planner/siiplan" night --site catalogs-demo/site.ini --array "$TMP/$3" \
    --instrument catalogs-demo/instrument-large.ini --catalog "$TMP/$2" --date 2026-03-14 --slot-min 10 \
    --threads "$4" --out "$TMP/out-$1" > "$TMP/night-$1.txt"
}
night 2000x50-t1 catalog-2000.csv array-50.csv 1
night 2000x50-t2 catalog-2000.csv array-50.csv 2
night 200x4-t2 catalog-200.csv array-4.csv 2
cmp "$TMP/out-2000x50-t1/schedule.csv" "$TMP/out-2000x50-t2/schedule.csv" > /dev/null &&
  echo "schedule.csv identical with 1 and 2 threads" || echo "schedule.csv DIFFERS between 1 and 2 threads"

"$BUILD/bench/kernel_bench" --benchmark_format=json --benchmark_out="$TMP/kernel.json" --benchmark_out_format=json > /dev/null
"$BUILD/bench/geometry_bench" --benchmark_out="$TMP/geometry.json" --benchmark_out_format=json > /dev/null
"$BUILD/bench/night_bench" --benchmark_min_time=0.1 --benchmark_out="$TMP/night.json" --benchmark_out_format=json > /dev/null

# The reference on the same grid: dark window start and slot count as siiplan night printed them.
DARK=$(head -1 "$TMP/night-2000x50-t2.txt")
START=$(sed -E 's/.*: ([0-9T:-]+Z) to.*/\1/' <<< "$DARK")
SLOTS=$(sed -E 's/.*, ([0-9]+) slots of.*/\1/' <<< "$DARK")
$PY scripts/bench-peer.py --catalog "$TMP/catalog-2000.csv" --array "$TMP/array-50.csv" --site catalogs-demo/site.ini \
  --start "$START" --slots "$SLOTS" --slot-min 10 --json "$TMP/peer.json" > /dev/null

$PY - "$TMP" <<'PYEOF'
import json, math, re, sys
tmp = sys.argv[1]
def bench(name):
    return {b['name']: b for b in json.load(open('%s/%s.json' % (tmp, name)))['benchmarks']}
def ns(b):
    return 1e9 / b['items_per_second']
def timev(case):
    t = open('%s/time-%s.txt' % (tmp, case)).read()
    wall = re.search(r'Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (\S+)', t).group(1).split(':')
    wall = sum(float(p) * 60 ** i for i, p in enumerate(reversed(wall)))
    cpu = float(re.search(r'User time \(seconds\): (\S+)', t).group(1)) + float(re.search(r'System time \(seconds\): (\S+)', t).group(1))
    rss = int(re.search(r'Maximum resident set size \(kbytes\): (\d+)', t).group(1)) / 1024
    return wall, cpu, rss
k, g, n, peer = bench('kernel'), bench('geometry'), bench('night'), json.load(open(tmp + '/peer.json'))
print('\nend to end: siiplan night, 10-minute slots (wall, CPU = user + sys, peak RSS)')
for case in ('2000x50-t1', '2000x50-t2', '200x4-t2'):
    wall, cpu, rss = timev(case)
    print('  %-12s wall %6.2f s   CPU %6.2f s   peak RSS %7.1f MiB' % (case, wall, cpu, rss))
print('\nkernel, single thread, 1e7 points x ~ U[0, 40] (ns per element)')
floor = ns(k['Floor'])
peer_x = peer['vis2_uniform_x_ns_per_element']
for key in ('Kernel/0/0', 'Kernel/0/1', 'Kernel/1/0', 'Kernel/1/1', 'KernelJ1', 'Floor', 'ScalarModel/0', 'ScalarModel/1'):
    b = k[key]
    print('  %-14s %7.2f ns  %-58s %5.2fx floor' % (key, ns(b), b.get('label', ''), ns(b) / floor))
ud = ns(k['Kernel/0/0'])
print('  numpy/scipy |V|^2 (same x): %.2f ns/element -> kernel (UD |V|^2) is %.1fx faster; with d|V|^2/dtheta %.1fx'
      % (peer_x, peer_x / ud, peer_x / ns(k['Kernel/0/1'])))
print('  numpy/scipy |V|^2 on the night grid (%d targets x %d pairs x %d slots): %.2f ns/element -> %.1fx the kernel'
      % (peer['targets'], peer['pairs'], peer['slots'], peer['vis2_ns_per_element'], peer['vis2_ns_per_element'] / ud))
print('\ngeometry')
for key, b in g.items():
    if 'items_per_second' in b:
        print('  %-24s %7.3f ns per (u,v)' % (key, ns(b)))
    else:
        print('  %-24s %9.3f us  %s' % (key, b['real_time'] / (1000 if b['time_unit'] == 'ns' else 1), b.get('label', '')))
print('  numpy (u,v) on the night grid: %.2f ns/element' % peer['geometry_ns_per_element'])
print('\nplanner (plan_night, no file output), wall time')
t = {key.split('/real_time')[0]: b['real_time'] / 1000 for key, b in n.items()}
for key, v in t.items():
    print('  %-28s %7.3f s' % (key, v))
slots = {key.split('/real_time')[0]: b['slots'] for key, b in n.items()}
base = 'NightPlan/500/25/1/600'
e_t = math.log(t['NightPlan/2000/25/1/600'] / t[base]) / math.log(4)
e_p = math.log(t['NightPlan/500/50/1/600'] / t[base]) / math.log(1225 / 300)
e_s = math.log(t['NightPlan/500/25/1/150'] / t[base]) / math.log(slots['NightPlan/500/25/1/150'] / slots[base])
print('  scaling exponents (time ~ N^e, 1 thread): targets %.2f, pairs %.2f, slots %.2f' % (e_t, e_p, e_s))
print('  threads: 2000 x 50, 1 -> 2 threads: %.2fx' % (t['NightPlan/2000/50/1/600'] / t['NightPlan/2000/50/2/600']))
PYEOF
echo "load after: $(cut -d' ' -f1-3 /proc/loadavg)"
