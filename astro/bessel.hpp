// Bessel-function building blocks of the visibility models, fast and accurate in double precision.
//
// Every function here is normalised so that it is finite and smooth at x = 0, which is where the
// closed forms cancel (models.md §4.4): the models call these, never 1/x or 1/x^2 of a Bessel function.
//
//   Lambda_nu(x) = Gamma(nu+1) (2/x)^nu J_nu(x),  Lambda_nu(0) = 1           (models.md §1.0)
//   j1_over_x(x) = J1(x)/x              = Lambda_1(x)/2
//   j2_over_x2(x) = J2(x)/x^2           = Lambda_2(x)/8
//   j3_over_x3(x) = J3(x)/x^3           = Lambda_3(x)/48
//   sinc3(x) = (sin x - x cos x)/x^3    = sqrt(pi/2) J_{3/2}(x)/x^{3/2} = Lambda_{3/2}(x)/3
//   sinc5(x) = (3 sin x - 3x cos x - x^2 sin x)/x^5 = sqrt(pi/2) J_{5/2}(x)/x^{5/2} = Lambda_{5/2}(x)/15
// Derivatives follow from d[x^-nu J_nu]/dx = -x^-nu J_{nu+1} (DLMF 10.6.6):
//   d/dx j1_over_x = -x j2_over_x2,  d/dx j2_over_x2 = -x j3_over_x3,  d/dx sinc3 = -x sinc5,
//   d/dx Lambda_nu = -x Lambda_{nu+1} / (2(nu+1)).
//
// Accuracy (tests/astro/bessel_test.cpp against mpmath at 40 digits, tests/data/models_reference.csv):
//   J0, J1: glibc libm j0/j1, <= ~2e-16 absolute on [0, 40] (models.md §4.3).
//   the ratios above: series for x < 2 (no cancellation there), closed forms beyond: ~1e-15 relative.
//   Lambda_nu, non-integer nu in [0.5, 12]: power series in long double for x < 16, Hankel's asymptotic
//   expansion (DLMF 10.17.3) summed to its smallest term for x >= 16; ~1e-14 absolute or better.
// All functions take x >= 0 (they are even in x; callers pass |x|). Pure functions, thread-safe.
#pragma once

namespace siiplan::astro {

double bessel_j0(double x);
double bessel_j1(double x);
double j1_over_x(double x);
double j2_over_x2(double x);
double j3_over_x3(double x);
double sinc3(double x);
double sinc5(double x);

// Lambda_nu(x) and its partial derivative with respect to the ORDER nu (needed for the gradient of the
// power-law limb-darkened disk with respect to its exponent).
struct LambdaNu {
  double value;   // Lambda_nu(x)
  double d_dnu;   // dLambda_nu(x)/dnu at fixed x
};
// Given:   nu  order, 0.5 <= nu <= 12 (not checked; the models keep it in range)
//          x   argument, >= 0
// Returns: Lambda_nu(x) = Gamma(nu+1) (2/x)^nu J_nu(x) and d/dnu of it.
// Notes:   x < 16: Lambda_nu = sum_k (-x^2/4)^k / (k! (nu+1)_k) (DLMF 10.2.2 divided by its first term),
//          summed in long double because the terms grow to ~e^x/x before cancelling; d/dnu term by term,
//          d(term_k)/dnu = -term_k sum_{j=1..k} 1/(nu+j).
//          x >= 16: J_nu = sqrt(2/(pi x)) (P cos w - Q sin w), w = x - nu pi/2 - pi/4, with
//          a_k(nu) = prod_{j=1..k} (4nu^2 - (2j-1)^2)/(8j) (DLMF 10.17.1, 10.17.3), summed until the
//          terms stop decreasing or fall below 1e-17; d/dnu via the product rule on a_k and dw/dnu = -pi/2,
//          and d/dnu [Gamma(nu+1)(2/x)^nu] = Gamma(nu+1)(2/x)^nu (psi(nu+1) + ln(2/x)).
// References: DLMF §10.2, §10.17 (https://dlmf.nist.gov/10); Abramowitz & Stegun 9.1.10, 9.2.5.
LambdaNu lambda_nu(double nu, double x);
double lambda_nu_value(double nu, double x);

// Digamma function psi(z) for z > 0 (recurrence to z >= 15, then the asymptotic series DLMF 5.11.2);
// ~1e-15 relative.
double digamma(double z);

}  // namespace siiplan::astro
