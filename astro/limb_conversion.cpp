#include "astro/limb_conversion.hpp"

#include <cmath>
#include <string>

#include "astro/bessel.hpp"
#include "astro/coherence.hpp"
#include "astro/errors.hpp"
#include "astro/quadrature.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

// <r^2>/R^2 of I = sum c_k mu^k (possibly non-integer k): [sum c_k (1/(k+2) - 1/(k+4))] / sum c_k/(k+2).
double second_moment(const Model& m) {
  struct Term {
    double c, k;
  };
  Term t[3] = {{1, 0}, {0, 1}, {0, 2}};
  const auto& p = m.params();
  switch (m.kind()) {
    case ModelKind::UniformDisk: break;
    case ModelKind::LinearLD: t[0] = {1 - p[1], 0}, t[1] = {p[1], 1}; break;            // (1-u) + u mu
    case ModelKind::QuadraticLD: t[0] = {1 - p[1] - p[2], 0}, t[1] = {p[1] + 2 * p[2], 1}, t[2] = {-p[2], 2}; break;
    case ModelKind::PowerLD: t[0] = {1, p[1]}; break;                                    // mu^alpha
    default:
      throw InputError("model", "UD/LD conversion needs a limb-darkened disk model, not '" + std::string(model_name(m.kind())) + "'",
                       "use ld-linear, ld-quadratic or ld-power");
  }
  double num = 0, den = 0;
  for (const auto& term : t) {
    num += term.c * (1 / (term.k + 2) - 1 / (term.k + 4));
    den += term.c / (term.k + 2);
  }
  return num / den;
}

double lsq_ratio(const Model& ld) {
  // Work in x = pi theta_LD B / lambda: take theta_LD = 1 rad, lambda = 1 m, so u_lambda = x/pi.
  const Model unit = ld.with_params([&] {
    auto p = ld.params();
    p[0] = 1.0;
    return p;
  }());
  const double x0 = kPi * first_null_baseline_m(unit, 1.0);
  const double x_max = 0.95 * x0;
  // Model |V|^2 on the Gauss-Legendre nodes once; the UD is evaluated at x/k.
  const GaussRule g = gauss_legendre(64);
  const int panels = 4;
  std::vector<double> xs, ws, ld_v2;
  const double h = x_max / panels;
  for (int p = 0; p < panels; ++p)
    for (std::size_t i = 0; i < g.x.size(); ++i) {
      const double x = (p + 0.5) * h + 0.5 * h * g.x[i];
      xs.push_back(x);
      ws.push_back(0.5 * h * g.w[i]);
      ld_v2.push_back(unit.vis2(x / kPi, 0.0));
    }
  auto cost = [&](double k) {
    double c = 0;
    for (std::size_t i = 0; i < xs.size(); ++i) {
      const double v = 2 * j1_over_x(xs[i] / k);   // UD of diameter theta_LD/k
      const double r = v * v - ld_v2[i];
      c += ws[i] * r * r;
    }
    return c;
  };
  // Golden-section search for the minimum on [0.8, 1.6] (the ratio is 1..1.2 for physical laws).
  const double gr = 0.5 * (std::sqrt(5.0) - 1);
  double a = 0.8, b = 1.6, c = b - gr * (b - a), d = a + gr * (b - a), fc = cost(c), fd = cost(d);
  for (int i = 0; i < 200 && b - a > 1e-13; ++i) {
    if (fc < fd) {
      b = d, d = c, fd = fc, c = b - gr * (b - a), fc = cost(c);
    } else {
      a = c, c = d, fc = fd, d = a + gr * (b - a), fd = cost(d);
    }
  }
  return 0.5 * (a + b);
}

}  // namespace

double hb74_ld_over_ud_ratio(double limb_u) { return std::sqrt((1 - limb_u / 3) / (1 - 7 * limb_u / 15)); }

double ld_over_ud_ratio(const Model& ld_model, LimbCriterion criterion) {
  const double m2 = second_moment(ld_model);   // also rejects non-LD models
  if (ld_model.kind() == ModelKind::UniformDisk) return 1.0;
  if (criterion == LimbCriterion::ShortBaseline) return std::sqrt(0.5 / m2);
  return lsq_ratio(ld_model);
}

double ud_diameter_rad(const Model& ld_model, LimbCriterion criterion) {
  return ld_model.diameter_rad() / ld_over_ud_ratio(ld_model, criterion);
}

Model ld_model_from_ud(double theta_ud_rad, const Model& ld_law, LimbCriterion criterion) {
  auto p = ld_law.params();
  p[0] = theta_ud_rad * ld_over_ud_ratio(ld_law, criterion);
  return ld_law.with_params(std::move(p));
}

}  // namespace siiplan::astro
