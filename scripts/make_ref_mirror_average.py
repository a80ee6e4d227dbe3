#!/usr/bin/env python3
"""Reference values of |V|^2 measured through two finite mirrors (and a filter band), computed
independently of siiplan with scipy.integrate (Debian python3-scipy) for
tests/astro/instrument_response_test.cpp.

The measured value is the average of the point-to-point |V|^2 over every pair of points, one on each
filled circular pupil. For equal mirrors of diameter D the difference vector s of the two points has the
density K(s) = A_lens(|s|) / A^2 (the autocorrelation of the pupil, A_lens the area of the lens where two
discs of radius D/2 at distance |s| overlap), so

    <|V|^2>(B0) = integral over the plane of K(s) |V(B0 + s)|^2 d^2 s.

Here that 2-D integral is done in CARTESIAN coordinates with scipy.integrate.dblquad (siiplan integrates
in polar coordinates with Gauss-Legendre panels), and the lens area is written from the textbook formula
2 r^2 acos(d / 2r) - (d / 2) sqrt(4 r^2 - d^2). For the band case the 2-D integral is averaged over a
top-hat filter with scipy.integrate.quad (weight T^2 = T). The star is a uniform disk,
V = 2 J1(x)/x with x = pi theta |b| / lambda (scipy.special.j1).

Run:  /usr/bin/python3 scripts/make_ref_mirror_average.py > tests/data/mirror_average_reference.csv
(about a minute).
"""
import math
import sys

from scipy import integrate, special

MAS = math.pi / 180 / 3600 / 1000


def vis2_ud(theta_rad, b_m, lam_m):
    x = math.pi * theta_rad * b_m / lam_m
    if x < 1e-8:
        return 1.0
    return (2 * special.j1(x) / x) ** 2


def lens_area(d, r):
    if d >= 2 * r:
        return 0.0
    return 2 * r * r * math.acos(d / (2 * r)) - 0.5 * d * math.sqrt(4 * r * r - d * d)


def mirror_average(theta_rad, b0_m, lam_m, d_m):
    r = d_m / 2
    area = math.pi * r * r
    def f(y, x):
        s = math.hypot(x, y)
        return lens_area(s, r) / area ** 2 * vis2_ud(theta_rad, math.hypot(b0_m + x, y), lam_m)
    lim = 2 * r
    val, _ = integrate.dblquad(f, -lim, lim, lambda x: -math.sqrt(max(lim * lim - x * x, 0.0)),
                               lambda x: math.sqrt(max(lim * lim - x * x, 0.0)), epsabs=1e-11, epsrel=1e-10)
    return val


def main():
    out = sys.stdout
    out.write("# |V|^2 of a uniform disk through two equal filled mirrors, scipy.integrate.dblquad in Cartesian\n")
    out.write("# coordinates (scripts/make_ref_mirror_average.py); bandwidth_nm > 0: averaged over a top-hat band\n")
    out.write("diameter_mas,mirror_m,lambda_nm,bandwidth_nm,baseline_m,vis2_point,vis2_measured\n")
    lam = 420e-9
    for theta_mas in (1.0, 3.0):
        for d in (6.0, 12.0):
            for b0 in (0.0, 20.0, 50.0, 90.0):
                th = theta_mas * MAS
                v = mirror_average(th, b0, lam, d)
                out.write(f"{theta_mas},{d},420,0,{b0},{vis2_ud(th, b0, lam):.15g},{v:.15g}\n")
    # Mirrors and a 20 nm top-hat band together.
    dl = 20e-9
    for theta_mas, d, b0 in ((3.0, 12.0, 30.0), (1.0, 12.0, 120.0)):
        th = theta_mas * MAS
        val, _ = integrate.quad(lambda l: mirror_average(th, b0, l, d), lam - dl / 2, lam + dl / 2,
                                epsabs=1e-12, epsrel=1e-9, limit=20)
        out.write(f"{theta_mas},{d},420,20,{b0},{vis2_ud(th, b0, lam):.15g},{val / dl:.15g}\n")


if __name__ == "__main__":
    main()
