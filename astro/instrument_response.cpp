#include "astro/instrument_response.hpp"

#include <algorithm>
#include <cmath>

#include "astro/aperture_average.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

bool point_mirrors(const Response& r) { return r.d1_m == 0 && r.d2_m == 0; }

}  // namespace

double measured_vis2(const Model& model, double u_m, double v_m, const Response& response) {
  if (point_mirrors(response)) return band_averaged_vis2(model, u_m, v_m, response.filter);
  double out = 0;
  band_average_values(model, u_m, v_m, response.filter, 1,
                      [&](double lambda_m, std::span<double> o) {
                        o[0] = aperture_averaged_vis2(model, u_m, v_m, lambda_m, response.d1_m, response.d2_m);
                      },
                      std::span<double>(&out, 1));
  return out;
}

double measured_vis2_and_gradient(const Model& model, double u_m, double v_m, const Response& response,
                                  std::span<double> grad) {
  if (point_mirrors(response)) return band_averaged_vis2_and_gradient(model, u_m, v_m, response.filter, grad);
  const std::size_t np = model.params().size();
  std::vector<double> out(np + 1);
  band_average_values(model, u_m, v_m, response.filter, np + 1,
                      [&](double lambda_m, std::span<double> o) {
                        o[0] = aperture_averaged_vis2_and_gradient(model, u_m, v_m, lambda_m, response.d1_m,
                                                                   response.d2_m, o.subspan(1, np));
                      },
                      out);
  std::copy(out.begin() + 1, out.end(), grad.begin());
  return out[0];
}

ResponseNeeds response_needs(const Model& model, const Response& response, double max_baseline_m) {
  ResponseNeeds needs;
  const double lambda = response.filter.lambda_m;
  if (!point_mirrors(response)) {
    needs.mirror_loss = aperture_effect(model, lambda, response.d1_m, response.d2_m, kMirrorLossThreshold).loss;
    needs.mirrors = needs.mirror_loss > kMirrorLossThreshold;
  }
  if (response.filter.bandwidth_m > 0 && max_baseline_m > 0) {
    constexpr int kProbes = 256;
    const bool radial = model.is_radially_symmetric();
    for (int axis = 0; axis < (radial ? 1 : 2); ++axis) {
      for (int j = 1; j <= kProbes; ++j) {
        const double b = max_baseline_m * j / kProbes;
        const double u = axis == 0 ? b : 0.0, v = axis == 0 ? 0.0 : b;
        const double change = std::fabs(band_averaged_vis2(model, u, v, response.filter) - model.vis2(u / lambda, v / lambda));
        needs.band_change = std::max(needs.band_change, change);
      }
    }
    needs.band = needs.band_change > kBandChangeThreshold;
  }
  return needs;
}

RadialResponseTable::RadialResponseTable(const Model& model, const Response& response, double max_baseline_m) {
  if (!model.is_radially_symmetric())
    throw InputError("response table", "the model's |V|^2 depends on the baseline's position angle",
                     "tabulate only radially symmetric models; evaluate others with measured_vis2");
  if (!(max_baseline_m > 0) || !std::isfinite(max_baseline_m))
    throw InputError("response table", "the longest baseline must be a positive number of metres", "check the array");
  max_b_m_ = max_baseline_m;
  n_params_ = model.params().size();
  // The shortest wavelength that carries weight (a Gaussian filter's weight beyond one FWHM is < 0.2 %).
  const double lambda_min = response.filter.lambda_m - response.filter.bandwidth_m;
  const double k = kPi * angular_scale_rad(model) / std::max(lambda_min, 0.5 * response.filter.lambda_m);
  const double steps = std::ceil(std::max(3.0, k * max_baseline_m / kTableStepRad));
  if (steps > 1e7)
    throw InputError("response table", "the star is resolved over so many lobes within the array that a table would need " +
                                           std::to_string(std::int64_t(steps)) + " nodes",
                     "such a star is far beyond the first null on every baseline: shorter baselines are needed");
  const std::size_t n_steps = std::size_t(steps);
  h_m_ = max_baseline_m / double(n_steps);
  n_ = n_steps + 2;   // nodes 0 .. n_steps + 1: one beyond the end so every interval has a centred window
  values_.assign(n_ * (1 + n_params_), 0.0);
  for (std::size_t i = 0; i < n_; ++i) {
    double* row = values_.data() + i * (1 + n_params_);
    row[0] = measured_vis2_and_gradient(model, double(i) * h_m_, 0.0, response, std::span<double>(row + 1, n_params_));
  }
}

double RadialResponseTable::interpolate(double b_m, std::size_t column) const {
  const std::size_t stride = 1 + n_params_;
  const double t = std::clamp(b_m, 0.0, max_b_m_) / h_m_;
  const std::size_t i = std::min(std::size_t(t), n_ - 3);   // the interval [i, i+1]
  const double s = t - double(i);                            // in [0, 1]
  // Nodes i-1 .. i+2; node -1 is node 1 (|V|^2 is an even function of the baseline length).
  const std::size_t im1 = i == 0 ? 1 : i - 1;
  const double f0 = values_[im1 * stride + column], f1 = values_[i * stride + column];
  const double f2 = values_[(i + 1) * stride + column], f3 = values_[(i + 2) * stride + column];
  // Four-point Lagrange weights on nodes -1, 0, 1, 2 at s.
  const double w0 = -s * (s - 1) * (s - 2) / 6, w1 = (s + 1) * (s - 1) * (s - 2) / 2;
  const double w2 = -(s + 1) * s * (s - 2) / 2, w3 = (s + 1) * s * (s - 1) / 6;
  return w0 * f0 + w1 * f1 + w2 * f2 + w3 * f3;
}

double RadialResponseTable::vis2(double b_m) const { return interpolate(b_m, 0); }

double RadialResponseTable::vis2_and_gradient(double b_m, std::span<double> grad) const {
  for (std::size_t q = 0; q < n_params_; ++q) grad[q] = interpolate(b_m, 1 + q);
  return interpolate(b_m, 0);
}

void RadialResponseTable::vis2_and_dtheta(std::span<const double> u_m, std::span<const double> v_m,
                                          std::span<double> vis2, std::span<double> dvis2_dtheta) const {
  for (std::size_t p = 0; p < u_m.size(); ++p) {
    const double b = std::sqrt(u_m[p] * u_m[p] + v_m[p] * v_m[p]);
    vis2[p] = interpolate(b, 0);
    dvis2_dtheta[p] = interpolate(b, 1);
  }
}

}  // namespace siiplan::astro
