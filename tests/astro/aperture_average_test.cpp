// Tests of astro/aperture_average: models.md §1.9 values, the small-mirror limit, the 2-D path against the
// 1-D one, the large-mirror asymptote, and a small seeded Monte Carlo of the definition itself.
#include "astro/aperture_average.hpp"

#include <cmath>
#include <random>

#include "astro/coherence.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {
const double kLambda = 420e-9;
Model ud(double mas) { return Model(ModelKind::UniformDisk, {mas * kMasToRad}); }
}  // namespace

TEST_SUITE("astro/aperture_average") {
  TEST_CASE("two 12 m mirrors at zero separation (models.md §1.9: 0.99704, MC 0.99705; 5 mas: MC 0.757)") {
    check_close(aperture_averaged_vis2(ud(0.5), 0, 0, kLambda, 12, 12), 0.99705, 0, 2e-5, "0.5 mas");
    check_close(1 - aperture_loss_first_order(0.5 * kMasToRad, kLambda, 12, 12), 0.99704, 0, 1e-5, "first order");
    check_close(aperture_averaged_vis2(ud(5), 0, 0, kLambda, 12, 12), 0.757, 0, 1e-3, "5 mas");
    CHECK(!aperture_effect(ud(0.5), kLambda, 12, 12).matters);
    CHECK(aperture_effect(ud(5), kLambda, 12, 12).matters);
  }

  TEST_CASE("small mirrors: the loss approaches the second-moment formula") {
    // x = pi theta D/lambda = 0.011: the next term of the expansion is ~x^2 ~ 1e-4 relative.
    const double loss = 1 - aperture_averaged_vis2(ud(0.01), 0, 0, kLambda, 3, 1);
    check_close(loss, aperture_loss_first_order(0.01 * kMasToRad, kLambda, 3, 1), 1e-3, 0, "(pi theta/lambda)^2 (D1^2+D2^2)/32");
  }

  TEST_CASE("the 2-D quadrature agrees with the 1-D radial one, and a point mirror changes nothing") {
    const Model round_ellipse(ModelKind::Ellipse, {5 * kMasToRad, 1.0 - 1e-12, 0.3});
    CHECK(!round_ellipse.is_radially_symmetric());
    check_close(aperture_averaged_vis2(round_ellipse, 0, 0, kLambda, 12, 8),
                aperture_averaged_vis2(ud(5), 0, 0, kLambda, 12, 8), 0, 1e-9, "2-D vs 1-D");
    check_close(aperture_averaged_vis2(ud(1), 30, 40, kLambda, 0, 0), ud(1).vis2(30 / kLambda, 40 / kLambda), 1e-15, 0, "points");
  }

  TEST_CASE("seeded Monte Carlo of the definition at a 60 m baseline (std::mt19937_64, 200000 pairs)") {
    const Model m(ModelKind::Ellipse, {1.2 * kMasToRad, 0.7, 0.4});
    const double d1 = 10, d2 = 6, u0 = 36, v0 = 48;
    std::mt19937_64 rng(20240601);
    std::uniform_real_distribution<double> uni(-1, 1);
    auto point = [&](double d) {
      double x, y;
      do {
        x = uni(rng), y = uni(rng);
      } while (x * x + y * y > 1);
      return std::pair{0.5 * d * x, 0.5 * d * y};
    };
    double sum = 0, sum2 = 0;
    const int n = 200000;
    for (int i = 0; i < n; ++i) {
      auto [x1, y1] = point(d1);
      auto [x2, y2] = point(d2);
      const double v2 = m.vis2((u0 + x2 - x1) / kLambda, (v0 + y2 - y1) / kLambda);
      sum += v2;
      sum2 += v2 * v2;
    }
    const double mean = sum / n, sigma = std::sqrt((sum2 / n - mean * mean) / n);
    const double q = aperture_averaged_vis2(m, u0, v0, kLambda, d1, d2);
    CAPTURE(sigma);
    check_close(q, mean, 0, 4 * sigma, "quadrature vs Monte Carlo (4 sigma)");
    CHECK(std::fabs(q - m.vis2(u0 / kLambda, v0 / kLambda)) > 10 * sigma);   // the effect is real here
  }

  TEST_CASE("a mirror far larger than the coherence area: <|V|^2> -> integral coherence area / mirror area") {
    const double theta = 0.53 * kDegToRad, lambda = 500e-9;   // the Sun with 1 m mirrors, x = 5.8e4
    const double q = aperture_averaged_vis2(Model(ModelKind::UniformDisk, {theta}), 0, 0, lambda, 1, 1);
    check_close(q, coherence_area_integral_m2(theta, lambda) / (kPi * 0.25), 1e-3, 0, "asymptote");
  }
}
