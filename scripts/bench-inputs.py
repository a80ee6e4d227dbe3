#!/usr/bin/python3
"""Synthetic inputs for scripts/bench.sh: target catalogs and telescope arrays (seeded, invented).

    /usr/bin/python3 scripts/bench-inputs.py OUTDIR

Writes OUTDIR/catalog-2000.csv and catalog-200.csv (stars uniform on the sky south of dec +40 deg,
mag_b 1..6, uniform disks of 0.2..3 mas, priority 1..3) and OUTDIR/array-50.csv and array-4.csv
(telescopes of 12 m, 100 m^2, scattered over 600 m x 600 m), the same recipe as bench/night_bench.cpp.
"""
import math
import os
import random
import sys


def catalog(path, n, seed):
    rng = random.Random(seed)
    with open(path, 'w') as f:
        f.write('name,ra,dec,mag_b,diameter_mas,model,priority\n')
        for k in range(n):
            ra = 360 * rng.random()
            dec = math.degrees(math.asin(-1 + 1.64 * rng.random()))
            f.write('S%d,%.6f,%.6f,%.3f,%.4f,ud,%d\n' % (k, ra, dec, 1 + 5 * rng.random(), 0.2 + 2.8 * rng.random(),
                                                        1 + int(3 * rng.random())))


def array(path, n, seed):
    rng = random.Random(seed)
    with open(path, 'w') as f:
        f.write('name,east_m,north_m,up_m,diameter_m,area_m2\n')
        for k in range(n):
            f.write('T%d,%.3f,%.3f,0,12,100\n' % (k, 600 * (rng.random() - 0.5), 600 * (rng.random() - 0.5)))


def main():
    out = sys.argv[1]
    os.makedirs(out, exist_ok=True)
    catalog(os.path.join(out, 'catalog-2000.csv'), 2000, 2000)
    catalog(os.path.join(out, 'catalog-200.csv'), 200, 200)
    array(os.path.join(out, 'array-50.csv'), 50, 50)
    array(os.path.join(out, 'array-4.csv'), 4, 4)


if __name__ == '__main__':
    main()
