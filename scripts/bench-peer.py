#!/usr/bin/python3
"""The reference a practitioner would write: the night's |V|^2 grid with numpy + scipy.special.j1.

    /usr/bin/python3 scripts/bench-peer.py --catalog FILE --array FILE --site FILE --start ISO --slots N \
        --slot-min M [--lambda-nm 420] [--json OUT]

Computes, for every target of the catalog (uniform disks), every telescope pair of the array and every
slot middle of the dark window (start + (k + 1/2) slot, k < N -- siiplan night prints start and N), the
projected baseline (u, v) of Thompson, Moran & Swenson eq. 4.1 and |V|^2 = (2 J1(x)/x)^2,
x = pi theta |(u,v)| / lambda, with numpy arrays (Debian python3-numpy) and scipy.special.j1 (Debian
python3-scipy, Cephes). The hour angle is the local mean sidereal time (Meeus, Astronomical Algorithms
2nd ed., eq. 12.4, UT1 = UTC) minus the catalog RA: what one would write for a quick planning grid (no
precession, nutation or aberration; off by a few arcminutes, enough for timing). Targets are processed in
chunks so the arrays stay below ~200 MB. It also times |V|^2 over 10^7 points x ~ U[0, 40], the
distribution of bench/kernel_bench.cpp, for a per-element comparison with the C++ kernel.
Prints the timings and, with --json, writes them to a file for scripts/bench.sh.
"""
import argparse
import configparser
import csv
import json
import math
import time

from datetime import datetime, timezone

import numpy as np
import scipy.special


def read_csv(path):
    with open(path) as f:
        return list(csv.DictReader(line for line in f if not line.startswith('#')))


def vis2_ud(x):
    """|V|^2 of a uniform disk; x = 0 gives 1."""
    with np.errstate(invalid='ignore', divide='ignore'):
        v = np.where(x > 0, 2.0 * scipy.special.j1(x) / x, 1.0)
    return v * v


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument('--catalog', required=True)
    ap.add_argument('--array', required=True)
    ap.add_argument('--site', required=True)
    ap.add_argument('--start', required=True)
    ap.add_argument('--slots', type=int, required=True)
    ap.add_argument('--slot-min', type=float, required=True)
    ap.add_argument('--lambda-nm', type=float, default=420)
    ap.add_argument('--json')
    a = ap.parse_args()

    site = configparser.ConfigParser(inline_comment_prefixes=('#',))
    site.read(a.site)
    lat = math.radians(float(site['site']['latitude_deg']))
    lon = float(site['site']['longitude_deg'])
    stars = read_csv(a.catalog)
    tel = read_csv(a.array)
    lam = a.lambda_nm * 1e-9

    t0 = time.perf_counter()
    ra = np.radians([float(s['ra']) for s in stars])
    dec = np.radians([float(s['dec']) for s in stars])
    theta = np.array([float(s['diameter_mas']) for s in stars]) * math.pi / (180 * 3600e3)
    e = np.array([float(t['east_m']) for t in tel])
    n = np.array([float(t['north_m']) for t in tel])
    up = np.array([float(t['up_m']) for t in tel])
    i, j = np.triu_indices(len(tel), 1)
    de, dn, du = e[j] - e[i], n[j] - n[i], up[j] - up[i]
    bx = -math.sin(lat) * dn + math.cos(lat) * du   # TMS frame, geometry.md §1.3
    by = de
    bz = math.cos(lat) * dn + math.sin(lat) * du
    start = datetime.fromisoformat(a.start.replace('Z', '+00:00')).replace(tzinfo=timezone.utc)
    jd = start.timestamp() / 86400.0 + 2440587.5 + (np.arange(a.slots) + 0.5) * a.slot_min / 1440.0
    tc = (jd - 2451545.0) / 36525.0   # Meeus eq. 12.4: GMST in degrees
    gmst = 280.46061837 + 360.98564736629 * (jd - 2451545.0) + 0.000387933 * tc ** 2 - tc ** 3 / 38710000.0
    lst = np.radians(np.mod(gmst + lon, 360.0))
    t_setup = time.perf_counter() - t0

    t_geom = t_vis = 0.0
    checksum = 0.0
    chunk = max(1, 2_000_000 // (len(bx) * a.slots))
    for c in range(0, len(stars), chunk):
        s = slice(c, c + chunk)
        t1 = time.perf_counter()
        h = lst[None, :] - ra[s, None]                      # [targets, slots]
        sh, ch = np.sin(h)[..., None], np.cos(h)[..., None]
        sd, cd = np.sin(dec[s])[:, None, None], np.cos(dec[s])[:, None, None]
        u = sh * bx + ch * by                                # [targets, slots, pairs], TMS eq. 4.1
        v = -sd * ch * bx + sd * sh * by + cd * bz
        q = np.hypot(u, v) / lam
        t2 = time.perf_counter()
        v2 = vis2_ud(math.pi * theta[s, None, None] * q)
        t3 = time.perf_counter()
        t_geom += t2 - t1
        t_vis += t3 - t2
        checksum += float(v2.sum())
    elements = len(stars) * a.slots * len(bx)

    x = np.random.default_rng(20261201).uniform(0.0, 40.0, 10_000_000)
    best = math.inf
    for _ in range(3):
        t4 = time.perf_counter()
        vis2_ud(x)
        best = min(best, time.perf_counter() - t4)

    out = {
        'targets': len(stars), 'pairs': int(len(bx)), 'slots': a.slots, 'elements': elements,
        'setup_s': t_setup, 'geometry_s': t_geom, 'vis2_s': t_vis, 'total_s': t_setup + t_geom + t_vis,
        'geometry_ns_per_element': 1e9 * t_geom / elements, 'vis2_ns_per_element': 1e9 * t_vis / elements,
        'vis2_uniform_x_ns_per_element': 1e9 * best / x.size, 'checksum': checksum,
        'numpy': np.__version__, 'scipy': scipy.__version__,
    }
    print('peer (numpy %s, scipy %s): %d targets x %d pairs x %d slots = %d elements' %
          (np.__version__, scipy.__version__, len(stars), len(bx), a.slots, elements))
    print('  geometry %.2f s (%.2f ns/element), |V|^2 %.2f s (%.2f ns/element); |V|^2 over 1e7 x~U[0,40]: %.2f ns/element'
          % (t_geom, out['geometry_ns_per_element'], t_vis, out['vis2_ns_per_element'], out['vis2_uniform_x_ns_per_element']))
    if a.json:
        with open(a.json, 'w') as f:
            json.dump(out, f, indent=1)


if __name__ == '__main__':
    main()
