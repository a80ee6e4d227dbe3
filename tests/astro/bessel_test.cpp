// Tests of astro/bessel: against mpmath (40 digits) values in tests/data/models_reference.csv, written by
// scripts/make_ref_models.py, and the identities that tie the normalised functions together.
#include "astro/bessel.hpp"

#include <cmath>

#include "astro/units.hpp"
#include "support/close.hpp"
#include "tests/astro/models_reference.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {
constexpr double kAbsTol = 1e-14;   // Lambda_nu and its nu-derivative, absolute (header promise ~1e-14)
}

TEST_SUITE("astro/bessel") {
  TEST_CASE("Lambda_nu and dLambda_nu/dnu against mpmath, both sides of the series/asymptotic switch at x = 16") {
    auto values = siiplan::test::models_reference("lambda_nu");
    auto derivs = siiplan::test::models_reference("lambda_nu_dnu");
    REQUIRE(values.size() == 60);
    REQUIRE(derivs.size() == values.size());
    for (std::size_t i = 0; i < values.size(); ++i) {
      CAPTURE(values[i].line);
      const LambdaNu l = lambda_nu(values[i].params[0], values[i].x);
      check_close(l.value, values[i].value, 1e-13, kAbsTol, "Lambda_nu");
      check_close(l.d_dnu, derivs[i].value, 1e-12, kAbsTol, "dLambda_nu/dnu");
    }
  }

  TEST_CASE("zeros of J1 and J0 (mpmath besseljzero)") {
    for (const auto& r : siiplan::test::models_reference("j1_zero")) {
      CAPTURE(r.line);
      check_close(bessel_j1(r.value), 0.0, 0, 1e-15, "J1 at its zero");
      check_close(j1_over_x(r.value), 0.0, 0, 1e-15, "J1/x at the zero of J1");
    }
    const auto z0 = siiplan::test::models_reference("j0_zero");
    REQUIRE(z0.size() == 1);
    check_close(bessel_j0(z0[0].value), 0.0, 0, 1e-15, "J0 at its first zero");
    // models.md §3: j_{1,1} = 3.83170597021
    check_close(z0[0].value, 2.40482555770, 0, 5e-12, "j_{0,1} (models.md §3)");
  }

  TEST_CASE("normalised ratios equal Lambda_nu / constant on both sides of their series switch at x = 2") {
    for (double x : {0.0, 1e-6, 1e-3, 0.3, 1.999, 2.001, 3.5, 9.0, 25.0}) {
      CAPTURE(x);
      check_close(j1_over_x(x), lambda_nu_value(1.0, x) / 2, 1e-13, 1e-15, "J1/x");
      check_close(j2_over_x2(x), lambda_nu_value(2.0, x) / 8, 1e-13, 1e-15, "J2/x^2");
      check_close(j3_over_x3(x), lambda_nu_value(3.0, x) / 48, 1e-13, 1e-15, "J3/x^3");
      check_close(sinc3(x), lambda_nu_value(1.5, x) / 3, 1e-13, 1e-15, "(sin x - x cos x)/x^3");
      check_close(sinc5(x), lambda_nu_value(2.5, x) / 15, 1e-13, 1e-15, "sinc5");
    }
    // models.md §4.4: series values at small x, (sin x - x cos x)/x^3 = 1/3 - x^2/30 + x^4/840.
    const double x = 1e-2;
    check_close(sinc3(x), 1.0 / 3 - x * x / 30 + std::pow(x, 4) / 840, 1e-15, 0, "sinc3 series");
    check_close(j2_over_x2(x), (1 - x * x / 12 + std::pow(x, 4) / 384) / 8, 1e-15, 0, "J2/x^2 series");
  }

  TEST_CASE("digamma against known values") {
    // psi(1) = -EulerGamma, psi(1/2) = -EulerGamma - 2 ln 2 (DLMF 5.4.12, 5.4.13)
    const double euler = 0.57721566490153286061;
    check_close(digamma(1.0), -euler, 1e-15, 0, "psi(1)");
    check_close(digamma(0.5), -euler - 2 * std::log(2.0), 1e-15, 0, "psi(1/2)");
    check_close(digamma(20.0), digamma(19.0) + 1.0 / 19, 1e-15, 0, "recurrence");
  }
}
