#!/usr/bin/python3
# Writes the FITS binary-table catalogs used by tests/cli/night_tests.cmake, with astropy (Debian
# python3-astropy), independently of siiplan's cfitsio reader:
#   tests/data/night-targets.fits   catalogs-demo/targets.csv as a BINTABLE named TARGETS (numbers as
#                                   float64 with NaN for empty cells, text as character columns)
#   tests/data/night-bad-ra.fits    two rows, the second with ra = 400 deg (must be rejected: exit 2)
# Run: /usr/bin/python3 scripts/make_night_fits_catalogs.py   (from the repository root)
import csv

import astropy
from astropy.table import Table

numeric = {"ra", "dec", "mag_b", "mag_v", "diameter_mas", "limb_u", "teff_k", "priority", "goal_pct"}
rows = list(csv.reader(line for line in open("catalogs-demo/targets.csv") if not line.startswith("#")))
header, data = rows[0], rows[1:]
t = Table()
for j, name in enumerate(header):
    values = [r[j] for r in data]
    if name in numeric and name not in ("ra", "dec"):
        t[name] = [float(v) if v else float("nan") for v in values]
    else:
        t[name] = values   # ra/dec stay text: sexagesimal and degrees mixed, as in the CSV
t.meta["EXTNAME"] = "TARGETS"
t.write("tests/data/night-targets.fits", format="fits", overwrite=True)

bad = Table({"name": ["Alpha", "Beta"], "ra": [10.0, 400.0], "dec": [-20.0, -20.0], "mag_b": [3.0, 3.0]})
bad.meta["EXTNAME"] = "TARGETS"
bad.write("tests/data/night-bad-ra.fits", format="fits", overwrite=True)
print("astropy", astropy.__version__, "wrote tests/data/night-targets.fits and tests/data/night-bad-ra.fits")
