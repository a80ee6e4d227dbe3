#!/usr/bin/python3
"""Demo measurements for README examples: catalogs-demo/measurements-demo.csv.

An INVENTED data set of the invented demo star Mirelle (catalogs-demo/targets.csv: linear limb darkening,
theta_LD = 0.444 mas, u = 0.38) observed at 420 nm (10 nm filter) with the invented large demo array
(catalogs-demo/array-large.csv) on three nights. Not real data.

How it is made: each telescope pair's ground vector (east, north) is turned into a projected baseline by
a simple stand-in for Earth rotation -- rotation by the hour angle and foreshortening of the north
component by 0.8 -- which gives plausible (u, v) tracks but is NOT siiplan's geometry (use siiplan
simulate for that). |V|^2 is the linear-limb-darkening formula of models.md §1.2 (scipy.special.j1);
Gaussian noise of sigma = 0.025 absolute (models.md §1.9: constant sigma in |V|^2 units) is added with
numpy default_rng(2025). One 30-minute segment per pair and hour angle; negative values are kept.

Run: /usr/bin/python3 scripts/make_demo_measurements.py
"""
import csv
import os

import numpy as np
from scipy.special import j1

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.join(HERE, "..")
MAS = np.pi / 180 / 3600 / 1000
THETA_LD_MAS, LIMB_U, LAMBDA_NM, SIGMA = 0.444, 0.38, 420.0, 0.025


def vis2_linear(theta_mas, u, b_m, lambda_nm):
    x = np.pi * theta_mas * MAS * b_m / (lambda_nm * 1e-9)
    v = ((1 - u) * j1(x) / x + u * (np.sin(x) - x * np.cos(x)) / x**3) / ((1 - u) / 2 + u / 3)
    return v * v


def main():
    tel = {}
    with open(os.path.join(ROOT, "catalogs-demo", "array-large.csv")) as f:
        rows = [r for r in csv.reader(f) if r and not r[0].startswith("#")]
    for r in rows[1:]:
        tel[r[0]] = (float(r[1]), float(r[2]))
    names = list(tel)
    pairs = [(a, b) for i, a in enumerate(names) for b in names[i + 1:]]
    rng = np.random.default_rng(2025)
    out = []
    for night, mjd0 in enumerate([60802.05, 60803.05, 60805.06]):
        for k, ha_h in enumerate([-2.0, -0.5, 1.0, 2.5]):
            ha = ha_h * 15 * np.pi / 180
            mjd = mjd0 + (ha_h + 2.0) / 24
            for a, b in pairs:
                e = tel[b][0] - tel[a][0]
                n = tel[b][1] - tel[a][1]
                u = e * np.cos(ha) - 0.8 * n * np.sin(ha)
                v = e * np.sin(ha) * 0.5 + 0.8 * n * np.cos(ha)
                bl = np.hypot(u, v)
                val = vis2_linear(THETA_LD_MAS, LIMB_U, bl, LAMBDA_NM) + rng.normal(0, SIGMA)
                out.append(["Mirelle", "%.5f" % mjd, f"{a}-{b}", "%.2f" % u, "%.2f" % v, "%.1f" % LAMBDA_NM, "10",
                            "1800", "%.4f" % val, "%.3f" % SIGMA])
    path = os.path.join(ROOT, "catalogs-demo", "measurements-demo.csv")
    with open(path, "w", newline="") as f:
        f.write("# INVENTED demo data (scripts/make_demo_measurements.py): star Mirelle, linear LD theta_LD = 0.444 mas,\n"
                "# u = 0.38, 420 nm, demo array-large, three nights, sigma = 0.025 absolute. Not real data.\n")
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["target", "mjd", "pair", "u_m", "v_m", "wavelength_nm", "bandwidth_nm", "int_time_s", "vis2", "vis2_err"])
        w.writerows(out)
    print("wrote", path, len(out), "rows")


if __name__ == "__main__":
    main()
