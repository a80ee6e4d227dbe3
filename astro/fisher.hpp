// Diameter precision from the Fisher information of squared-visibility measurements.
//
// The data model is m_i = c0 |V(u_i, v_i; theta)|^2 with independent Gaussian errors sigma_i in |V|^2
// units (models.md §5.1). Only the diameter theta (the model's first parameter) and, when the
// zero-baseline correlation is free, c0 (at c0 = 1) are estimated; any other model parameter (limb
// darkening, axis ratio, ...) is held at its value. The Fisher matrix
//   F = sum_i g_i g_i^T / sigma_i^2,  g_i = (d m_i/d theta, d m_i/d c0) = (d|V|^2/d theta, |V|^2)
// gives sigma_theta = sqrt((F^-1)_theta,theta) (Cramér–Rao bound; models.md §5.3–5.5).
// Tested in: tests/astro/fisher_test.cpp (models.md §5.5: 0.005971 mas fixed, 0.007409 mas free, and a
// Monte-Carlo of Gauss–Newton fits).
#pragma once

#include <span>

#include "astro/models.hpp"
#include "astro/sensitivity.hpp"

namespace siiplan::astro {

// One |V|^2 measurement: where in the (u,v) plane and how noisy.
struct Vis2Point {
  double u_lambda = 0, v_lambda = 0;   // projected baseline in wavelengths
  double sigma_vis2 = 0;               // rms error in |V|^2 units (> 0)
};

struct DiameterPrecision {
  double sigma_theta_rad = 0;   // +inf when the data do not constrain theta
  double sigma_c0 = 0;          // free c0 only (0 when calibrated)
  double corr_theta_c0 = 0;     // free c0 only
};

// Running 2x2 Fisher matrix for (theta, c0): the planner adds one point per pair and slot and asks
// for sigma_theta at any time. No allocation after construction; add() costs one model evaluation.
class DiameterFisher {
 public:
  explicit DiameterFisher(Model model);
  void add(double u_lambda, double v_lambda, double sigma_vis2);
  void add(const Vis2Point& p) { add(p.u_lambda, p.v_lambda, p.sigma_vis2); }
  // Many points at once (u, v in wavelengths and sigma per point; equal sizes), added in order. For the
  // uniform and the linearly limb-darkened disk the vectorised kernel (astro/disk_kernel.hpp) evaluates
  // |V|^2 and d|V|^2/dtheta; other models go through add() point by point. Agrees with add() per point
  // to ~1e-15 relative (tests/astro/disk_kernel_test.cpp).
  void add_batch(std::span<const double> u_lambda, std::span<const double> v_lambda, std::span<const double> sigma_vis2);
  // Merge another accumulator's information (same model).
  void merge(const DiameterFisher& other);
  DiameterPrecision precision(ZeroBaseline zero_baseline) const;
  double sigma_theta_rad(ZeroBaseline zero_baseline) const { return precision(zero_baseline).sigma_theta_rad; }
  const Model& model() const { return model_; }
  // The accumulated Fisher entries (theta in radians).
  double f_theta_theta() const { return ftt_; }
  double f_theta_c0() const { return ftc_; }
  double f_c0_c0() const { return fcc_; }

 private:
  Model model_;
  double ftt_ = 0, ftc_ = 0, fcc_ = 0;
};

// One-shot form over a set of points.
DiameterPrecision diameter_precision(const Model& model, std::span<const Vis2Point> points, ZeroBaseline zero_baseline);

// sigma_theta of ONE point alone with c0 calibrated: sigma/|d|V|^2/d theta| (+inf where the derivative
// vanishes, e.g. at zero baseline). The per-baseline "contribution" reported by resolve.
double single_point_sigma_theta_rad(const Model& model, double u_lambda, double v_lambda, double sigma_vis2);

// Integration time needed to reach a goal sigma_theta, given the sigma_theta reached with time t_s
// spent on the same set of points: Fisher information grows linearly with time, so
// t_goal = t_s (sigma_theta/goal)^2. Returns +inf when sigma_theta is infinite.
double time_to_goal_s(double sigma_theta_rad, double t_s, double goal_sigma_theta_rad);

}  // namespace siiplan::astro
