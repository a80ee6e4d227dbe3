#include "astro/coherence.hpp"

#include <cmath>
#include <limits>

#include "astro/bessel.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kMaxX = 200.0;

// Step (m) of the outward scan: 0.02 in x, finer for a binary's fringe term.
double scan_step_m(const Model& model, double lambda_m) {
  return 0.02 * lambda_m / (kPi * angular_scale_rad(model));
}

template <class F>
double bisect(F&& f, double a, double b) {
  double fa = f(a);
  for (int i = 0; i < 200 && b - a > 1e-15 * b; ++i) {
    const double m = 0.5 * (a + b), fm = f(m);
    if ((fm > 0) == (fa > 0)) {
      a = m;
      fa = fm;
    } else {
      b = m;
    }
  }
  return 0.5 * (a + b);
}

}  // namespace

double coherence_radius_circle_m(double theta_rad, double lambda_m) { return lambda_m / (kPi * theta_rad); }
double coherence_area_circle_m2(double theta_rad, double lambda_m) {
  return lambda_m * lambda_m / (kPi * theta_rad * theta_rad);
}
double coherence_area_integral_m2(double theta_rad, double lambda_m) {
  return 4.0 * lambda_m * lambda_m / (kPi * theta_rad * theta_rad);
}
double coherence_radius_integral_m(double theta_rad, double lambda_m) { return 2.0 * lambda_m / (kPi * theta_rad); }
double coherence_circle_gamma() { return 2.0 * j1_over_x(1.0); }

double baseline_at_vis2_m(const Model& model, double lambda_m, double level, double baseline_pa_rad) {
  const double su = std::sin(baseline_pa_rad) / lambda_m, sv = std::cos(baseline_pa_rad) / lambda_m;
  auto f = [&](double b_m) { return model.vis2(b_m * su, b_m * sv) - level; };
  const double step = scan_step_m(model, lambda_m);
  const double b_max = kMaxX * lambda_m / (kPi * angular_scale_rad(model));
  double prev = 0;
  for (double b = step; b <= b_max; b += step) {
    if (f(b) <= 0) return bisect(f, prev, b);
    prev = b;
  }
  return kInf;
}

double half_power_baseline_m(const Model& model, double lambda_m, double baseline_pa_rad) {
  return baseline_at_vis2_m(model, lambda_m, 0.5, baseline_pa_rad);
}

double first_null_baseline_m(const Model& model, double lambda_m, double baseline_pa_rad) {
  const double su = std::sin(baseline_pa_rad) / lambda_m, sv = std::cos(baseline_pa_rad) / lambda_m;
  const double step = scan_step_m(model, lambda_m);
  const double b_max = kMaxX * lambda_m / (kPi * angular_scale_rad(model));
  if (model.kind() != ModelKind::Binary) {
    auto f = [&](double b_m) { return model.visibility(b_m * su, b_m * sv).real(); };
    double prev = 0;
    for (double b = step; b <= b_max; b += step) {
      if (f(b) < 0) return bisect(f, prev, b);   // < 0: a Gaussian's V underflows to +0, not a null
      prev = b;
    }
    return kInf;
  }
  auto v2 = [&](double b_m) { return model.vis2(b_m * su, b_m * sv); };
  double b0 = 0, f0 = 1, b1 = step, f1 = v2(step);
  for (double b2 = 2 * step; b2 <= b_max; b2 += step) {
    const double f2 = v2(b2);
    if (f1 <= f0 && f1 <= f2 && f1 < 0.05) {
      const double g = 0.5 * (std::sqrt(5.0) - 1);
      double a = b0, b = b2, c = b - g * (b - a), d = a + g * (b - a), fc = v2(c), fd = v2(d);
      for (int i = 0; i < 100 && b - a > 1e-12 * b; ++i) {
        if (fc < fd) {
          b = d, d = c, fd = fc, c = b - g * (b - a), fc = v2(c);
        } else {
          a = c, c = d, fc = fd, d = a + g * (b - a), fd = v2(d);
        }
      }
      return 0.5 * (a + b);
    }
    b0 = b1, f0 = f1, b1 = b2, f1 = f2;
  }
  return kInf;
}

}  // namespace siiplan::astro
