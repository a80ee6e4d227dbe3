// Tests of astro/band_average: monochromatic limit, agreement with brute-force averages of the stated
// weight T(lambda)^2, and the gradient.
#include "astro/band_average.hpp"

#include <cmath>
#include <vector>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {
Model ud() { return Model(ModelKind::UniformDisk, {kMasToRad}); }

// Midpoint rule with a million points over [lo, hi] of w(lambda) |V|^2 / w: an independent slow path.
double brute(const Model& m, double u_m, double v_m, double lo, double hi, double (*w)(double, double, double), double l0,
             double dl) {
  const int n = 1000000;
  double num = 0, den = 0;
  for (int i = 0; i < n; ++i) {
    const double l = lo + (i + 0.5) * (hi - lo) / n;
    const double wt = w(l, l0, dl);
    num += wt * m.vis2(u_m / l, v_m / l);
    den += wt;
  }
  return num / den;
}
double tophat(double, double, double) { return 1.0; }
// Gaussian transmission T of FWHM dl, weight T^2.
double gauss2(double l, double l0, double dl) {
  const double t = std::exp(-4 * std::log(2.0) * (l - l0) * (l - l0) / (dl * dl));
  return t * t;
}
}  // namespace

TEST_SUITE("astro/band_average") {
  TEST_CASE("zero bandwidth is the monochromatic model") {
    check_close(band_averaged_vis2(ud(), 80, 0, {420e-9, 0, FilterProfile::TopHat}), ud().vis2(80 / 420e-9, 0), 1e-15, 0, "mono");
  }

  TEST_CASE("top-hat and Gaussian filters against a brute-force average of T^2") {
    for (double b : {40.0, 100.0, 300.0}) {
      CAPTURE(b);
      const Filter top{420e-9, 20e-9, FilterProfile::TopHat};
      check_close(band_averaged_vis2(ud(), b, 0, top), brute(ud(), b, 0, 410e-9, 430e-9, tophat, 420e-9, 20e-9), 0, 1e-11, "top-hat");
      const Filter gau{420e-9, 20e-9, FilterProfile::Gaussian};
      check_close(band_averaged_vis2(ud(), b, 0, gau), brute(ud(), b, 0, 370e-9, 470e-9, gauss2, 420e-9, 20e-9), 0, 1e-10, "gaussian");
    }
    // A wide band fills in the first null (the null moves with wavelength).
    CHECK(band_averaged_vis2(ud(), 105.661488999, 0, {420e-9, 40e-9, FilterProfile::TopHat}) > 1e-4);
  }

  TEST_CASE("gradient of the band average against central differences") {
    const Model m(ModelKind::LinearLD, {kMasToRad, 0.5});
    const Filter f{420e-9, 30e-9, FilterProfile::Gaussian};
    std::vector<double> g(2);
    band_averaged_vis2_and_gradient(m, 70, 20, f, g);
    const double scale[2] = {kMasToRad, 1.0};
    for (int k = 0; k < 2; ++k) {
      auto pp = m.params(), pm = m.params();
      pp[k] += 1e-6 * scale[k];
      pm[k] -= 1e-6 * scale[k];
      const double fd = (band_averaged_vis2(m.with_params(pp), 70, 20, f) - band_averaged_vis2(m.with_params(pm), 70, 20, f)) /
                        (2e-6 * scale[k]);
      check_close(g[k] * scale[k], fd * scale[k], 1e-6, 1e-8, "gradient");
    }
  }

  TEST_CASE("bad filters are InputError") {
    CHECK_THROWS_AS(band_averaged_vis2(ud(), 50, 0, {0.0, 0, FilterProfile::TopHat}), siiplan::InputError);
    CHECK_THROWS_AS(band_averaged_vis2(ud(), 50, 0, {420e-9, -1e-9, FilterProfile::TopHat}), siiplan::InputError);
    CHECK_THROWS_AS(band_averaged_vis2(ud(), 50, 0, {420e-9, 300e-9, FilterProfile::Gaussian}), siiplan::InputError);
  }
}
