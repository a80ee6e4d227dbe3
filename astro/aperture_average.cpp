#include "astro/aperture_average.hpp"

#include <algorithm>
#include <cmath>
#include <span>
#include <vector>

#include "astro/errors.hpp"
#include "astro/quadrature.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kMaxEvaluations = 2e7;

// Area of the intersection of two circles of radii r1, r2 whose centres are d apart.
double overlap_area(double d, double r1, double r2) {
  const double rmin = std::min(r1, r2), rmax = std::max(r1, r2);
  if (d >= r1 + r2) return 0.0;
  if (d <= rmax - rmin) return kPi * rmin * rmin;
  // Standard circular-lens area: sum of the two circular segments.
  const double a1 = std::acos(std::clamp((d * d + r1 * r1 - r2 * r2) / (2 * d * r1), -1.0, 1.0));
  const double a2 = std::acos(std::clamp((d * d + r2 * r2 - r1 * r1) / (2 * d * r2), -1.0, 1.0));
  return r1 * r1 * (a1 - std::sin(2 * a1) / 2) + r2 * r2 * (a2 - std::sin(2 * a2) / 2);
}

// The quadrature of the header for n values at once: g(u_lambda, v_lambda, out) writes n values (|V|^2 and,
// when asked, its gradient) at one baseline; `out` receives their averages.
template <class G>
void aperture_average_values(const Model& model, double u_m, double v_m, double lambda_m, double d1_m, double d2_m,
                             std::size_t n, G&& g, std::span<double> out) {
  const double r1 = 0.5 * d1_m, r2 = 0.5 * d2_m;
  const double u0 = u_m / lambda_m, v0 = v_m / lambda_m;
  if (r1 + r2 == 0) {
    g(u0, v0, out);
    return;
  }
  const double a1 = r1 > 0 ? kPi * r1 * r1 : 1.0, a2 = r2 > 0 ? kPi * r2 * r2 : 1.0;
  // K(s) for a point mirror degenerates to the other pupil's indicator / area.
  auto kernel = [&](double s) {
    if (r1 == 0 || r2 == 0) return s <= r1 + r2 ? 1.0 / (kPi * (r1 + r2) * (r1 + r2)) : 0.0;
    return overlap_area(s, r1, r2) / (a1 * a2);
  };
  const double scale = angular_scale_rad(model);
  const double k = kPi * scale / lambda_m;   // model phase per metre of baseline
  const bool radial_only = model.is_radially_symmetric() && u_m == 0 && v_m == 0;
  auto too_many = [] {
    throw RuntimeFailure("aperture averaging", "the mirrors resolve the source too strongly for the quadrature",
                         "the average is then about coherence area / mirror area; use smaller mirrors");
  };

  // Panels in s: split at the kink |R1 - R2|, each piece into panels of ~1 radian of phase.
  const double knots[3] = {0.0, std::fabs(r1 - r2), r1 + r2};
  const GaussRule rule = gauss_legendre(16);
  std::vector<double> sum(n, 0.0), ring(n), val(n);
  double evaluations = 0, norm = 0;
  for (int piece = 0; piece < 2; ++piece) {
    const double a = knots[piece], b = knots[piece + 1];
    if (b <= a) continue;
    const int panels = 1 + int(std::min(k * (b - a), 1e9));
    const double h = (b - a) / panels;
    for (int p = 0; p < panels; ++p) {
      const double mid = a + (p + 0.5) * h;
      for (std::size_t i = 0; i < rule.x.size(); ++i) {
        const double s = mid + 0.5 * h * rule.x[i];
        // ring = ∫ g(B0 + s e(phi)) dphi
        if (radial_only) {
          g(s / lambda_m, 0.0, ring);
          for (auto& r : ring) r *= kTwoPi;
          evaluations += 1;
        } else {
          const int n_phi = 16 + 2 * int(std::ceil(2 * k * s));
          evaluations += n_phi;
          if (evaluations > kMaxEvaluations) too_many();
          std::fill(ring.begin(), ring.end(), 0.0);
          for (int j = 0; j < n_phi; ++j) {
            const double phi = kTwoPi * j / n_phi;
            g(u0 + s * std::sin(phi) / lambda_m, v0 + s * std::cos(phi) / lambda_m, val);
            for (std::size_t q = 0; q < n; ++q) ring[q] += val[q];
          }
          for (auto& r : ring) r *= kTwoPi / n_phi;
        }
        const double w = rule.w[i] * 0.5 * h * s * kernel(s);
        for (std::size_t q = 0; q < n; ++q) sum[q] += w * ring[q];
        norm += w * kTwoPi;   // ∫ K d^2s = 1 exactly; dividing by its quadrature cancels the rule's error at
                              // the (R1+R2-s)^(3/2) end point to first order
      }
      if (evaluations > kMaxEvaluations) too_many();
    }
  }
  for (std::size_t q = 0; q < n; ++q) out[q] = sum[q] / norm;
}

}  // namespace

double aperture_averaged_vis2(const Model& model, double u_m, double v_m, double lambda_m, double d1_m, double d2_m) {
  double out = 0;
  aperture_average_values(model, u_m, v_m, lambda_m, d1_m, d2_m, 1,
                          [&](double u, double v, std::span<double> o) { o[0] = model.vis2(u, v); },
                          std::span<double>(&out, 1));
  return out;
}

double aperture_averaged_vis2_and_gradient(const Model& model, double u_m, double v_m, double lambda_m, double d1_m,
                                           double d2_m, std::span<double> grad) {
  const std::size_t np = model.params().size();
  std::vector<double> out(np + 1);
  aperture_average_values(model, u_m, v_m, lambda_m, d1_m, d2_m, np + 1,
                          [&](double u, double v, std::span<double> o) {
                            o[0] = model.vis2_and_gradient(u, v, o.subspan(1, np));
                          },
                          out);
  std::copy(out.begin() + 1, out.end(), grad.begin());
  return out[0];
}

double aperture_loss_first_order(double theta_rad, double lambda_m, double d1_m, double d2_m) {
  const double k = kPi * theta_rad / lambda_m;
  return k * k * (d1_m * d1_m + d2_m * d2_m) / 32.0;
}

ApertureEffect aperture_effect(const Model& model, double lambda_m, double d1_m, double d2_m, double threshold) {
  ApertureEffect e{};
  e.vis2_zero_baseline = aperture_averaged_vis2(model, 0, 0, lambda_m, d1_m, d2_m);
  e.loss = 1.0 - e.vis2_zero_baseline;
  e.matters = e.loss > threshold;
  return e;
}

}  // namespace siiplan::astro
