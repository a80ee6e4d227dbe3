#include "astro/fisher.hpp"

#include <array>
#include <cmath>
#include <limits>

namespace siiplan::astro {

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr std::size_t kMaxParams = 8;
}

DiameterFisher::DiameterFisher(Model model) : model_(std::move(model)) {}

void DiameterFisher::add(double u_lambda, double v_lambda, double sigma_vis2) {
  if (!(sigma_vis2 > 0) || !std::isfinite(sigma_vis2)) return;   // no information
  std::array<double, kMaxParams> grad{};
  double v2 = model_.vis2_and_gradient(u_lambda, v_lambda, std::span<double>(grad.data(), model_.params().size()));
  double w = 1.0 / (sigma_vis2 * sigma_vis2);
  // g = (d m/d theta, d m/d c0) at c0 = 1 (models.md §5.1, §5.5).
  ftt_ += grad[0] * grad[0] * w;
  ftc_ += grad[0] * v2 * w;
  fcc_ += v2 * v2 * w;
}

void DiameterFisher::merge(const DiameterFisher& other) {
  ftt_ += other.ftt_;
  ftc_ += other.ftc_;
  fcc_ += other.fcc_;
}

DiameterPrecision DiameterFisher::precision(ZeroBaseline zero_baseline) const {
  DiameterPrecision p;
  if (zero_baseline == ZeroBaseline::Calibrated) {
    p.sigma_theta_rad = ftt_ > 0 ? 1.0 / std::sqrt(ftt_) : kInf;
    return p;
  }
  double det = ftt_ * fcc_ - ftc_ * ftc_;
  // Singular (e.g. one baseline only) or numerically so: theta and c0 cannot be separated.
  if (!(det > 1e-12 * ftt_ * fcc_)) {
    p.sigma_theta_rad = kInf;
    p.sigma_c0 = kInf;
    return p;
  }
  p.sigma_theta_rad = std::sqrt(fcc_ / det);
  p.sigma_c0 = std::sqrt(ftt_ / det);
  p.corr_theta_c0 = -ftc_ / std::sqrt(ftt_ * fcc_);
  return p;
}

DiameterPrecision diameter_precision(const Model& model, std::span<const Vis2Point> points, ZeroBaseline zero_baseline) {
  DiameterFisher f(model);
  for (const auto& p : points) f.add(p);
  return f.precision(zero_baseline);
}

double single_point_sigma_theta_rad(const Model& model, double u_lambda, double v_lambda, double sigma_vis2) {
  std::array<double, kMaxParams> grad{};
  model.vis2_and_gradient(u_lambda, v_lambda, std::span<double>(grad.data(), model.params().size()));
  return grad[0] != 0 ? sigma_vis2 / std::fabs(grad[0]) : kInf;
}

double time_to_goal_s(double sigma_theta_rad, double t_s, double goal_sigma_theta_rad) {
  if (!std::isfinite(sigma_theta_rad)) return kInf;
  double r = sigma_theta_rad / goal_sigma_theta_rad;
  return t_s * r * r;
}

}  // namespace siiplan::astro
