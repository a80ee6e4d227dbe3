#!/usr/bin/python3
"""Reference fits for tests/astro/fit_test.cpp, computed with scipy.optimize.curve_fit.

Writes
  tests/data/curvefit_data.csv  a simulated squared-visibility data set: uniform disk of 0.8 mas times a
                                zero-baseline factor c0 = 0.9, 443 nm, 15 baselines 10..188 m, Gaussian
                                noise sigma = 0.03 (numpy default_rng(12345)); values written with repr()
                                so the C++ test reads the same doubles.
  tests/data/curvefit_ref.csv   best values and errors of three fits of that data set:
    ud_free_norm              c0 * [2 J1(x)/x]^2, x = pi theta B / lambda       (theta, c0 free)
    ld_linear_u0.6_free_norm  c0 * V_lin(x)^2, u = 0.6 fixed, models.md §1.2    (theta_LD, c0 free)
    ud_fixed_norm             [2 J1(x)/x]^2                                      (theta free, c0 = 1)
  error_unscaled = sqrt(diag(pcov)) with absolute_sigma=True   ((J^T J)^-1)
  error_scaled   = sqrt(diag(pcov)) with absolute_sigma=False  ((J^T J)^-1 * chi2/dof)
curve_fit runs MINPACK lmder through scipy.optimize.leastsq (method 'lm') with ftol = xtol = gtol = 1e-15
so its optimum is converged far below the 1e-6 comparison tolerance.

Run: /usr/bin/python3 scripts/make_ref_curvefit.py   (Debian python3-scipy 1.10.1, python3-numpy 1.24.2)
"""
import csv
import os

import numpy as np
import scipy
from scipy.optimize import curve_fit
from scipy.special import j1

MAS = np.pi / (180 * 3600 * 1000)
LAMBDA_NM = 443.0
HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "tests", "data")


def ud_v(theta_mas, b_m):
    x = np.pi * theta_mas * MAS * b_m / (LAMBDA_NM * 1e-9)
    return 2 * j1(x) / x


def lin_v(theta_mas, b_m, u):
    x = np.pi * theta_mas * MAS * b_m / (LAMBDA_NM * 1e-9)
    return ((1 - u) * j1(x) / x + u * (np.sin(x) - x * np.cos(x)) / x**3) / ((1 - u) / 2 + u / 3)


def main():
    rng = np.random.default_rng(12345)
    b = np.linspace(10.0, 188.0, 15)
    sigma = np.full_like(b, 0.03)
    y = 0.9 * ud_v(0.8, b) ** 2 + rng.normal(0.0, 0.03, b.size)
    with open(os.path.join(DATA, "curvefit_data.csv"), "w", newline="") as f:
        f.write("# Simulated UD 0.8 mas x c0 0.9, 443 nm, sigma 0.03 (scripts/make_ref_curvefit.py, numpy %s)\n"
                % np.__version__)
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["baseline_m", "wavelength_nm", "vis2", "vis2_err"])
        for bi, yi, si in zip(b, y, sigma):
            w.writerow([repr(float(bi)), repr(LAMBDA_NM), repr(float(yi)), repr(float(si))])

    tight = dict(method="lm", ftol=1e-15, xtol=1e-15, gtol=1e-15, maxfev=100000)
    cases = [
        ("ud_free_norm", lambda bb, t, c: c * ud_v(t, bb) ** 2, [0.7, 1.0], ["diameter_mas", "norm"]),
        ("ld_linear_u0.6_free_norm", lambda bb, t, c: c * lin_v(t, bb, 0.6) ** 2, [0.7, 1.0], ["diameter_mas", "norm"]),
        ("ud_fixed_norm", lambda bb, t: ud_v(t, bb) ** 2, [0.7], ["diameter_mas"]),
    ]
    rows = []
    for name, f, p0, names in cases:
        p_abs, c_abs = curve_fit(f, b, y, p0=p0, sigma=sigma, absolute_sigma=True, **tight)
        p_rel, c_rel = curve_fit(f, b, y, p0=p0, sigma=sigma, absolute_sigma=False, **tight)
        assert np.allclose(p_abs, p_rel, rtol=1e-12)
        for k, pname in enumerate(names):
            rows.append([name, pname, repr(float(p_abs[k])), repr(float(np.sqrt(c_abs[k, k]))),
                         repr(float(np.sqrt(c_rel[k, k])))])
    with open(os.path.join(DATA, "curvefit_ref.csv"), "w", newline="") as f:
        f.write("# scipy %s curve_fit (method lm, tolerances 1e-15) by scripts/make_ref_curvefit.py\n" % scipy.__version__)
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["case", "parameter", "value", "error_unscaled", "error_scaled"])
        w.writerows(rows)
    for r in rows:
        print(*r)


if __name__ == "__main__":
    main()
