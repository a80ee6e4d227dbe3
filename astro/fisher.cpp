#include "astro/fisher.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

#include "astro/disk_kernel.hpp"

namespace siiplan::astro {

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr std::size_t kMaxParams = 8;

bool informative(double sigma_vis2) { return sigma_vis2 > 0 && std::isfinite(sigma_vis2); }

// One point's share of F: g = (d m/d theta, d m/d c0) = (d|V|^2/dtheta, |V|^2) at c0 = 1 (models.md §5.1, §5.5).
void accumulate(double dvis2_dtheta, double vis2, double sigma_vis2, double& ftt, double& ftc, double& fcc) {
  const double w = 1.0 / (sigma_vis2 * sigma_vis2);
  ftt += dvis2_dtheta * dvis2_dtheta * w;
  ftc += dvis2_dtheta * vis2 * w;
  fcc += vis2 * vis2 * w;
}
}  // namespace

DiameterFisher::DiameterFisher(Model model) : model_(std::move(model)) {}

void DiameterFisher::add(double u_lambda, double v_lambda, double sigma_vis2) {
  if (!informative(sigma_vis2)) return;
  std::array<double, kMaxParams> grad{};
  double v2 = model_.vis2_and_gradient(u_lambda, v_lambda, std::span<double>(grad.data(), model_.params().size()));
  accumulate(grad[0], v2, sigma_vis2, ftt_, ftc_, fcc_);
}

void DiameterFisher::add_batch(std::span<const double> u_lambda, std::span<const double> v_lambda,
                               std::span<const double> sigma_vis2) {
  const auto kind = model_.kind();
  if (kind != ModelKind::UniformDisk && kind != ModelKind::LinearLD) {
    for (std::size_t k = 0; k < u_lambda.size(); ++k) add(u_lambda[k], v_lambda[k], sigma_vis2[k]);
    return;
  }
  const DiskLaw law = kind == ModelKind::UniformDisk ? DiskLaw::Uniform : DiskLaw::LinearLimbDarkened;
  const double limb_u = kind == ModelKind::LinearLD ? model_.params()[1] : 0.0;
  constexpr std::size_t kChunk = 256;   // stack scratch; the kernel vectorises within a chunk
  constexpr std::size_t kLanes = 4;     // independent partial sums (a fixed order: same result on every run)
  std::array<double, kChunk> v2, g;
  std::array<double, kLanes> tt{}, tc{}, cc{};
  for (std::size_t start = 0; start < u_lambda.size(); start += kChunk) {
    const std::size_t n = std::min(kChunk, u_lambda.size() - start);
    disk_vis2(law, model_.diameter_rad(), limb_u, u_lambda.subspan(start, n), v_lambda.subspan(start, n),
              std::span<double>(v2.data(), n), std::span<double>(g.data(), n));
    for (std::size_t k = 0; k < n; ++k)
      if (informative(sigma_vis2[start + k]))
        accumulate(g[k], v2[k], sigma_vis2[start + k], tt[k % kLanes], tc[k % kLanes], cc[k % kLanes]);
  }
  ftt_ += (tt[0] + tt[1]) + (tt[2] + tt[3]);
  ftc_ += (tc[0] + tc[1]) + (tc[2] + tc[3]);
  fcc_ += (cc[0] + cc[1]) + (cc[2] + cc[3]);
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
