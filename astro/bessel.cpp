#include "astro/bessel.hpp"

#include <cmath>

#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

// sum_k (-x^2/4)^k / (k! (nu+1)_k) in double, for x < 2 where it needs no extended precision: the terms
// decrease from the first and at most 1/(k! (nu+1)_k) <= 1, so the rounding error stays ~1e-16.
double lambda_series_small(double nu, double x) {
  const double q = -0.25 * x * x;
  double term = 1.0, sum = 1.0;
  for (int k = 1; k < 40; ++k) {
    term *= q / (k * (nu + k));
    sum += term;
    if (std::fabs(term) < 1e-17 * std::fabs(sum)) break;
  }
  return sum;
}

constexpr double kSmallX = 2.0;     // below: series (models.md §4.4: the closed forms cancel)
constexpr double kSeriesMax = 16.0; // Lambda_nu: long-double series below, Hankel asymptotic above

}  // namespace

double bessel_j0(double x) { return ::j0(x); }
double bessel_j1(double x) { return ::j1(x); }

double j1_over_x(double x) { return x < 1e-3 ? 0.5 * lambda_series_small(1.0, x) : ::j1(x) / x; }

double j2_over_x2(double x) {
  if (x < kSmallX) return lambda_series_small(2.0, x) / 8.0;
  // J2 = 2 J1/x - J0 (DLMF 10.6.1); for x >= 2 the two terms differ by a factor < 4, no real cancellation.
  return (2.0 * ::j1(x) / x - ::j0(x)) / (x * x);
}

double j3_over_x3(double x) {
  if (x < kSmallX) return lambda_series_small(3.0, x) / 48.0;
  const double j2 = 2.0 * ::j1(x) / x - ::j0(x);
  return (4.0 * j2 / x - ::j1(x)) / (x * x * x);   // J3 = 4 J2/x - J1 (DLMF 10.6.1)
}

double sinc3(double x) {
  if (x < kSmallX) return lambda_series_small(1.5, x) / 3.0;
  return (std::sin(x) - x * std::cos(x)) / (x * x * x);
}

double sinc5(double x) {
  if (x < kSmallX) return lambda_series_small(2.5, x) / 15.0;
  const double s = std::sin(x), c = std::cos(x);
  return (3.0 * s - 3.0 * x * c - x * x * s) / (x * x * x * x * x);
}

double digamma(double z) {
  double shift = 0.0;
  while (z < 15.0) {
    shift -= 1.0 / z;
    z += 1.0;
  }
  const double r = 1.0 / (z * z);
  // DLMF 5.11.2: psi(z) ~ ln z - 1/(2z) - sum B_2k / (2k z^2k)
  const double tail = r * (1.0 / 12 - r * (1.0 / 120 - r * (1.0 / 252 - r * (1.0 / 240 - r * (1.0 / 132 - r * 691.0 / 32760)))));
  return shift + std::log(z) - 0.5 / z - tail;
}

LambdaNu lambda_nu(double nu, double x) {
  if (x < kSeriesMax) {
    // DLMF 10.2.2 normalised by its leading term; long double keeps the cancellation of the growing
    // terms (largest ~ e^x Gamma(nu+1) (2/x)^nu / sqrt(2 pi x)) below ~1e-14 absolute at x = 16.
    const long double q = -0.25L * (long double)x * (long double)x;
    long double term = 1.0L, sum = 1.0L, dsum = 0.0L, harmonic = 0.0L;
    for (int k = 1; k < 200; ++k) {
      term *= q / ((long double)k * ((long double)nu + k));
      harmonic += 1.0L / ((long double)nu + k);
      sum += term;
      dsum -= term * harmonic;
      if (fabsl(term) < 1e-22L && fabsl(term * harmonic) < 1e-22L && k > x) break;
    }
    return {double(sum), double(dsum)};
  }
  // Hankel's asymptotic expansion (DLMF 10.17.3) for J_nu and its nu-derivative.
  const double mu4 = 4.0 * nu * nu;
  double a = 1.0, da = 0.0;       // a_k(nu) and d a_k/dnu
  double xp = 1.0;                // x^k
  double p = 1.0, dp = 0.0, qq = 0.0, dq = 0.0;
  double last = INFINITY;
  for (int k = 1; k < 80; ++k) {
    const double f = (mu4 - (2.0 * k - 1) * (2.0 * k - 1)) / (8.0 * k);
    const double df = nu / k;     // d f/dnu = 8 nu / (8 k)
    da = da * f + a * df;
    a *= f;
    xp *= x;
    const double t = a / xp, dt = da / xp;
    const double size = std::fabs(t) + std::fabs(dt);
    if (size > last) break;       // asymptotic series: stop at the smallest term
    last = size;
    // (-1)^k a_2k / x^2k into P, (-1)^k a_{2k+1} / x^{2k+1} into Q
    const double sign = ((k / 2) % 2 == 0) ? 1.0 : -1.0;
    if (k % 2 == 0) {
      p += sign * t;
      dp += sign * dt;
    } else {
      qq += sign * t;
      dq += sign * dt;
    }
    if (size < 1e-17) break;
  }
  const double w = x - 0.5 * nu * kPi - 0.25 * kPi;
  const double cw = std::cos(w), sw = std::sin(w);
  const double amp = std::sqrt(2.0 / (kPi * x));
  const double jnu = amp * (p * cw - qq * sw);
  const double djnu = amp * ((dp * cw - dq * sw) + 0.5 * kPi * (p * sw + qq * cw));
  const double pref = std::tgamma(nu + 1.0) * std::pow(2.0 / x, nu);
  const double value = pref * jnu;
  return {value, value * (digamma(nu + 1.0) + std::log(2.0 / x)) + pref * djnu};
}

double lambda_nu_value(double nu, double x) { return lambda_nu(nu, x).value; }

}  // namespace siiplan::astro
