// Tests of astro/coherence: coherence areas, first-null and half-power baselines.
#include "astro/coherence.hpp"

#include <cmath>

#include "astro/units.hpp"
#include "support/close.hpp"
#include "tests/astro/models_reference.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

TEST_SUITE("astro/coherence") {
  TEST_CASE("the Sun at 500 nm: about 900 um^2, a circle about 34 um across (common practice)") {
    const double theta = 0.53 * kDegToRad, lambda = 500e-9;
    const double area_um2 = coherence_area_circle_m2(theta, lambda) * 1e12;
    const double across_um = 2 * coherence_radius_circle_m(theta, lambda) * 1e6;
    CHECK(area_um2 > 850);
    CHECK(area_um2 < 1000);
    CHECK(across_um > 33);
    CHECK(across_um < 36);
    // Exact forms: lambda^2/(pi theta^2) and four times that for the integral definition.
    check_close(area_um2, 930.00153, 1e-7, 0, "lambda^2/(pi theta^2)");
    check_close(coherence_area_integral_m2(theta, lambda), 4 * coherence_area_circle_m2(theta, lambda), 1e-15, 0, "integral = 4x circle");
    check_close(kPi * std::pow(coherence_radius_integral_m(theta, lambda), 2), coherence_area_integral_m2(theta, lambda), 1e-15, 0,
                "integral radius");
  }

  TEST_CASE("|gamma| at the edge of the circle definition is 0.880101171490 (models.md §3)") {
    check_close(coherence_circle_gamma(), 0.880101171490, 1e-11, 0, "2 J1(1)");
  }

  TEST_CASE("UD null and half-power baselines, theta = 1 mas at 420 nm (models.md §3, mpmath)") {
    const Model ud(ModelKind::UniformDisk, {kMasToRad});
    check_close(first_null_baseline_m(ud, 420e-9), 105.661488999, 1e-11, 0, "first null");
    check_close(half_power_baseline_m(ud, 420e-9), 44.5715007872, 1e-11, 0, "half power");
    check_close(baseline_at_vis2_m(ud, 420e-9, 0.3) * kPi * kMasToRad / 420e-9, 2.08178916516, 1e-11, 0, "|V|^2 = 0.3");
    const Model half(ModelKind::UniformDisk, {0.5 * kMasToRad});
    check_close(first_null_baseline_m(half, 420e-9), 211.322977998, 1e-11, 0, "first null 0.5 mas");
    const Model ring(ModelKind::Ring, {kMasToRad});
    check_close(first_null_baseline_m(ring, 420e-9) * kPi * kMasToRad / 420e-9, 2.40482555770, 1e-11, 0, "ring null j0,1");
  }

  TEST_CASE("LD first nulls against mpmath root finding (scripts/make_ref_models.py)") {
    auto rows = siiplan::test::models_reference("first_null_m");
    REQUIRE(rows.size() == 5);
    for (const auto& r : rows) {
      CAPTURE(r.line);
      check_close(first_null_baseline_m(siiplan::test::reference_model(r), r.lambda_m), r.value, 1e-12, 0, r.model);
    }
  }

  TEST_CASE("no null for a Gaussian; ellipse nulls depend on the baseline direction; binary minimum") {
    CHECK(std::isinf(first_null_baseline_m(Model(ModelKind::Gaussian, {kMasToRad}), 420e-9)));
    const Model e(ModelKind::Ellipse, {kMasToRad, 0.5, 0.0});   // major axis North-South
    check_close(first_null_baseline_m(e, 420e-9, 0.0), 105.661488999, 1e-11, 0, "along the major axis");
    check_close(first_null_baseline_m(e, 420e-9, kPi / 2), 2 * 105.661488999, 1e-11, 0, "along the minor axis");
    // Equal point-like components 2 mas apart along East: |V|^2 = cos^2(pi sep u), null at u = 1/(2 sep).
    const Model b(ModelKind::Binary, {1e-3 * kMasToRad, 1e-3 * kMasToRad, 1.0, 2 * kMasToRad, kPi / 2});
    check_close(first_null_baseline_m(b, 420e-9, kPi / 2), 420e-9 / (2 * 2 * kMasToRad), 1e-7, 0, "binary fringe null");
  }
}
