#!/usr/bin/python3
"""Reference values for the visibility models: writes tests/data/models_reference.csv.

Run with Debian's interpreter (it has python3-mpmath and python3-scipy):
    /usr/bin/python3 scripts/make_ref_models.py

How each value is computed (mpmath at 40 significant digits unless stated):
  j1_zero, j0_zero   mpmath.besseljzero(n, k); cross-checked with scipy.special.jn_zeros.
  lambda_nu          Gamma(nu+1) (2/x)^nu J_nu(x) with mpmath.besselj (any real order), and
                     d/dnu of it by mpmath.diff.
  vis2 (radial)      the NUMERICAL Hankel transform of each model's own intensity profile,
                     V(x) = ∫0^1 I(r) J0(x r) r dr / ∫0^1 I(r) r dr (models.md §1.0), by mpmath.quad
                     (tanh-sinh) — independent of the closed forms in astro/models.cpp. The ring is J0(x)
                     and the Gaussian exp(-x^2/(4 ln 2)) (its profile extends beyond r = 1). Here the
                     diameter is 1 mas, lambda = 420 nm, v = 0 and u_m = x lambda / (pi theta).
  vis2 (ellipse, binary)  the closed forms of models.md §1.7, §1.8 (stretch and shift theorems) in mpmath.
  first_null_m       mpmath.findroot on the Hankel-transform V of the LD profiles, started from the UD
                     null scaled by models.md §2 column (d); the power law also as besseljzero(nu, 1).
  ld_ud_lsq          the ratio k minimising ∫0^X (|V_UD(x/k)|^2 - |V_LD(x)|^2)^2 dx, X = 0.95 x0 (models.md §2
                     column (e)), with scipy.optimize.minimize_scalar on a 400-point Gauss-Legendre
                     quadrature (numpy.polynomial.legendre.leggauss) in double precision.
"""
import csv
import math
import sys

import mpmath as mp
import numpy as np
import scipy
import scipy.optimize
import scipy.special

mp.mp.dps = 40
MAS = mp.pi / (180 * 3600 * 1000)
LAM = mp.mpf('420e-9')
OUT = 'tests/data/models_reference.csv'


def profile(model, p):
    """Intensity I(r), r in units of the radius; p in user units after the diameter."""
    if model == 'ud':
        return lambda r: mp.mpf(1)
    mu = lambda r: mp.sqrt(1 - r * r)
    if model == 'ld-linear':
        u = mp.mpf(p[0])
        return lambda r: 1 - u * (1 - mu(r))
    if model == 'ld-quadratic':
        a, b = mp.mpf(p[0]), mp.mpf(p[1])
        return lambda r: 1 - a * (1 - mu(r)) - b * (1 - mu(r)) ** 2
    if model == 'ld-power':
        al = mp.mpf(p[0])
        return lambda r: mu(r) ** al
    raise ValueError(model)


def hankel_v(model, p, x):
    if model == 'ring':
        return mp.besselj(0, x)
    if model == 'gaussian':
        return mp.exp(-x * x / (4 * mp.log(2)))
    I = profile(model, p)
    num = mp.quad(lambda r: I(r) * mp.besselj(0, x * r) * r, mp.linspace(0, 1, 8))
    den = mp.quad(lambda r: I(r) * r, [0, 1])
    return num / den


def ud_v(x):
    return mp.mpf(1) if x == 0 else 2 * mp.besselj(1, x) / x


rows = []


def add(quantity, model='', params=(), x='', u='', v='', lam='', value=''):
    rows.append([quantity, model, ';'.join(str(q) for q in params), x, u, v, lam, mp.nstr(value, 20)])


# Zeros of J1 and J0.
for k in range(1, 6):
    z = mp.besseljzero(1, k)
    assert abs(float(z) - scipy.special.jn_zeros(1, k)[-1]) < 1e-12
    add('j1_zero', params=(k,), value=z)
add('j0_zero', params=(1,), value=mp.besseljzero(0, 1))

# Lambda_nu and its nu-derivative.
L = lambda nu, x: mp.gamma(nu + 1) * (2 / x) ** nu * mp.besselj(nu, x)
for nu in ['1', '1.15', '1.5', '2.35', '3.7', '6']:
    for x in ['0.001', '0.3', '2', '7.5', '12', '15.9', '16.1', '23', '40', '100']:
        n, xx = mp.mpf(nu), mp.mpf(x)
        add('lambda_nu', params=(nu,), x=x, value=L(n, xx))
        add('lambda_nu_dnu', params=(nu,), x=x, value=mp.diff(lambda t: L(t, xx), n))

# |V|^2 of the radially symmetric models by numerical Hankel transform.
radial = [('ud', []), ('ld-linear', ['0.3']), ('ld-linear', ['0.6']), ('ld-quadratic', ['0.4', '0.25']),
          ('ld-quadratic', ['0.8', '-0.3']), ('ld-power', ['0.3']), ('ld-power', ['2.7']), ('gaussian', []),
          ('ring', [])]
for model, p in radial:
    for x in ['0.001', '0.05', '0.5', '1', '2', '3', '5', '10', '20']:
        xx = mp.mpf(x)
        u = xx * LAM / (mp.pi * MAS)
        add('vis2', model, ['1'] + p, x=x, u=mp.nstr(u, 25), v=0, lam='4.2e-07', value=hankel_v(model, p, xx) ** 2)

# Ellipse (models.md §1.7 check value) and more orientations.
def ellipse_v2(theta_mas, r, pa_deg, u, v):
    t = mp.mpf(theta_mas) * MAS
    pa = mp.radians(pa_deg)
    bmaj = u * mp.sin(pa) + v * mp.cos(pa)
    bmin = u * mp.cos(pa) - v * mp.sin(pa)
    x = mp.pi / LAM * mp.sqrt((t * bmaj) ** 2 + (r * t * bmin) ** 2)
    return ud_v(x) ** 2
for (th, r, pa, u, v) in [('1', '0.8', '30', 60, 80), ('1', '0.8', '30', -60, -80), ('2', '0.5', '-75', 30, 10),
                          ('0.7', '0.3', '120', 0, 150)]:
    add('vis2', 'ellipse', [th, r, pa], u=u, v=v, lam='4.2e-07',
        value=ellipse_v2(th, mp.mpf(r), mp.mpf(pa), mp.mpf(u), mp.mpf(v)))

# Binary (models.md §1.8 check value: offset (+5, -3) mas = separation sqrt(34), PA atan2(5, -3)).
def binary_v2(t1, t2, f, sep_mas, pa_deg, u, v):
    t1, t2, f = mp.mpf(t1) * MAS, mp.mpf(t2) * MAS, mp.mpf(f)
    sep, pa = mp.mpf(sep_mas) * MAS, mp.radians(mp.mpf(pa_deg))
    b = mp.sqrt(u * u + v * v)
    v1, v2 = ud_v(mp.pi * t1 * b / LAM), ud_v(mp.pi * t2 * b / LAM)
    ph = 2 * mp.pi * (u * sep * mp.sin(pa) + v * sep * mp.cos(pa)) / LAM
    return (v1 ** 2 + f ** 2 * v2 ** 2 + 2 * f * v1 * v2 * mp.cos(ph)) / (1 + f) ** 2
sep = mp.sqrt(34)
pa = mp.degrees(mp.atan2(5, -3))
for (t1, t2, f, s, p, u, v) in [('1', '0.5', '0.3', sep, pa, 50, 20), ('0.8', '0', '1', '3', '45', 40, -25),
                                ('0.4', '0.2', '0.05', '12', '200', 150, 90)]:
    add('vis2', 'binary', [t1, t2, f, mp.nstr(mp.mpf(s), 25), mp.nstr(mp.mpf(p), 25)], u=u, v=v, lam='4.2e-07',
        value=binary_v2(t1, t2, f, s, p, mp.mpf(u), mp.mpf(v)))

# First nulls of the LD laws (theta = 1 mas, 420 nm), by root finding on the Hankel-transform V.
for model, p in [('ld-linear', ['0.2']), ('ld-linear', ['0.6']), ('ld-linear', ['1']), ('ld-quadratic', ['0.4', '0.25']),
                 ('ld-power', ['0.3'])]:
    x0 = mp.findroot(lambda x: hankel_v(model, p, x), mp.mpf('4.1'))
    if model == 'ld-power':
        assert abs(x0 - mp.besseljzero(1 + mp.mpf(p[0]) / 2, 1)) < mp.mpf('1e-25')
    add('first_null_m', model, ['1'] + p, lam='4.2e-07', value=x0 * LAM / (mp.pi * MAS))

# Least-squares first-lobe UD/LD ratio (double precision, scipy).
gx, gw = np.polynomial.legendre.leggauss(400)
def lsq_ratio(model, p):
    x0 = float(mp.findroot(lambda x: hankel_v(model, p, x), mp.mpf('4.1')))
    X = 0.95 * x0
    xs = 0.5 * X * (gx + 1)
    ws = 0.5 * X * gw
    ld = np.array([float(hankel_v(model, p, mp.mpf(x)) ** 2) for x in xs])
    def cost(k):
        y = xs / k
        return float(np.sum(ws * ((2 * scipy.special.j1(y) / y) ** 2 - ld) ** 2))
    res = scipy.optimize.minimize_scalar(cost, bounds=(0.8, 1.6), method='bounded', options={'xatol': 1e-12})
    return res.x
for model, p in [('ld-linear', ['0.1']), ('ld-linear', ['0.6']), ('ld-power', ['0.3']), ('ld-quadratic', ['0.4', '0.25'])]:
    add('ld_ud_lsq', model, p, value=mp.mpf(lsq_ratio(model, p)))

with open(OUT, 'w', newline='') as fh:
    fh.write('# Generated by scripts/make_ref_models.py with mpmath %s, scipy %s, numpy %s, Python %s.\n'
             % (mp.__version__, scipy.__version__, np.__version__, sys.version.split()[0]))
    fh.write('# params: the model parameters in user units in astro::model_params order (diameter_mas first).\n')
    w = csv.writer(fh, lineterminator='\n')
    w.writerow(['quantity', 'model', 'params', 'x', 'u_m', 'v_m', 'lambda_m', 'value'])
    w.writerows(rows)
print('wrote', OUT, len(rows), 'rows')
