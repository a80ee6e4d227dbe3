#include "astro/band_average.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <vector>

#include "astro/errors.hpp"
#include "astro/quadrature.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

struct LambdaRange {
  double lo, hi;          // integration limits (m)
  double sigma;           // Gaussian weight sigma (m); 0 for top-hat
  double center;
};

LambdaRange band_of(const Filter& f) {
  if (!(f.lambda_m > 0)) throw InputError("wavelength", "must be greater than zero", "give the filter's central wavelength");
  if (!(f.bandwidth_m >= 0)) throw InputError("bandwidth", "must not be negative", "give 0 for a monochromatic model");
  LambdaRange b{};
  b.center = f.lambda_m;
  if (f.profile == FilterProfile::TopHat) {
    b.lo = f.lambda_m - 0.5 * f.bandwidth_m;
    b.hi = f.lambda_m + 0.5 * f.bandwidth_m;
  } else {
    // w = T^2 = exp(-8 ln2 (l-l0)^2/dl^2) = exp(-(l-l0)^2/(2 sigma^2)), sigma = dl/(4 sqrt(ln 2)).
    b.sigma = f.bandwidth_m / (4.0 * std::sqrt(std::log(2.0)));
    b.lo = f.lambda_m - 8 * b.sigma;
    b.hi = f.lambda_m + 8 * b.sigma;
  }
  if (!(b.lo > 0))
    throw InputError("bandwidth", "the band reaches zero wavelength", "give a bandwidth well below the central wavelength");
  return b;
}

}  // namespace

void band_average_values(const Model& model, double u_m, double v_m, const Filter& filter, std::size_t n,
                         const std::function<void(double, std::span<double>)>& g, std::span<double> out) {
  const LambdaRange b = band_of(filter);
  if (filter.bandwidth_m == 0) {
    g(filter.lambda_m, out);
    return;
  }
  const double phase_span = kPi * angular_scale_rad(model) * std::hypot(u_m, v_m) * (1.0 / b.lo - 1.0 / b.hi);
  // At least 8 panels (one per 2 sigma) under a Gaussian weight; 16-point rules on each.
  const int panels = std::max(b.sigma > 0 ? 8 : 1, 1 + int(std::min(phase_span, 1e5)));
  const GaussRule rule = gauss_legendre(16);
  std::vector<double> val(n);
  std::fill(out.begin(), out.begin() + std::ptrdiff_t(n), 0.0);
  double wsum = 0;
  const double h = (b.hi - b.lo) / panels;
  for (int p = 0; p < panels; ++p) {
    const double mid = b.lo + (p + 0.5) * h;
    for (std::size_t i = 0; i < rule.x.size(); ++i) {
      const double lambda = mid + 0.5 * h * rule.x[i];
      double w = rule.w[i];
      if (b.sigma > 0) {
        const double d = (lambda - b.center) / b.sigma;
        w *= std::exp(-0.5 * d * d);
      }
      g(lambda, val);
      for (std::size_t k = 0; k < n; ++k) out[k] += w * val[k];
      wsum += w;
    }
  }
  for (std::size_t k = 0; k < n; ++k) out[k] /= wsum;
}

double band_averaged_vis2(const Model& model, double u_m, double v_m, const Filter& filter) {
  double out = 0;
  band_average_values(model, u_m, v_m, filter, 1, [&](double l, std::span<double> v) { v[0] = model.vis2(u_m / l, v_m / l); },
                      std::span<double>(&out, 1));
  return out;
}

double band_averaged_vis2_and_gradient(const Model& model, double u_m, double v_m, const Filter& filter,
                                       std::span<double> grad) {
  const std::size_t np = model.params().size();
  std::vector<double> out(np + 1);
  band_average_values(model, u_m, v_m, filter, np + 1,
                      [&](double l, std::span<double> v) { v[0] = model.vis2_and_gradient(u_m / l, v_m / l, v.subspan(1, np)); },
                      out);
  std::copy(out.begin() + 1, out.end(), grad.begin());
  return out[0];
}

}  // namespace siiplan::astro
