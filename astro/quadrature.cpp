#include "astro/quadrature.hpp"

#include <array>
#include <cmath>
#include <vector>

#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

struct Rule {
  std::vector<double> x, w;
  explicit Rule(int n) : x(n), w(n) {
    for (int i = 0; i < n; ++i) {
      // Tricomi's approximation to the i-th root, then Newton on P_n (A&S 22.7.10 recurrence).
      double z = std::cos(kPi * (i + 0.75) / (n + 0.5));
      double dp = 1;
      for (int it = 0; it < 100; ++it) {
        double p0 = 1, p1 = z;
        for (int k = 2; k <= n; ++k) {
          const double p2 = ((2.0 * k - 1) * z * p1 - (k - 1.0) * p0) / k;
          p0 = p1;
          p1 = p2;
        }
        dp = n * (z * p1 - p0) / (z * z - 1);
        const double dz = p1 / dp;
        z -= dz;
        if (std::fabs(dz) < 1e-16) break;
      }
      x[i] = z;
      w[i] = 2.0 / ((1 - z * z) * dp * dp);   // A&S 25.4.29
    }
  }
};

}  // namespace

GaussRule gauss_legendre(int n) {
  static const std::array<Rule, 4> rules{Rule(8), Rule(16), Rule(32), Rule(64)};
  for (const auto& r : rules)
    if (int(r.x.size()) == n) return {r.x, r.w};
  throw RuntimeFailure("gauss_legendre", "no rule with " + std::to_string(n) + " points", "use 8, 16, 32 or 64");
}

}  // namespace siiplan::astro
