// What a pair of real telescopes measures: |V|^2 seen through two finite mirrors and a filter band.
//
// A point-mirror, monochromatic |V|^2 (astro::Model) is what the star offers; a pair of telescopes
// measures it averaged twice over:
//   * over the two mirrors (aperture averaging, astro/aperture_average.hpp): every pair of points, one on
//     each filled circular pupil, weighted uniformly (the correlation is linear in the intensity each
//     pupil collects, so it is the pupil average of the point-to-point |V|^2);
//   * over the filter (band averaging, astro/band_average.hpp): weight T(lambda)^2, the correlation
//     being second order in the detected flux.
// Both are linear averages of |V|^2 over independent variables, so the measured value is
//   <|V|^2> = ∫ w(lambda) <|V|^2>_mirrors(B0; lambda) dlambda / ∫ w(lambda) dlambda,
// with the mirror average taken at each wavelength of the band quadrature (mirrors in wavelengths
// scale with lambda too). Gradients with respect to the model parameters are the same averages of the
// model's analytic gradient.
//
// When it matters (our criteria, stated in every product that applies them):
//   * mirrors: the zero-baseline |V|^2 of the two mirrors side by side is reduced by more than 1 %
//     (astro::aperture_effect; about the accuracy to which a zero-baseline correlation is calibrated in
//     practice);
//   * band: somewhere between zero and the longest baseline the band changes |V|^2 by more than 1e-3
//     (0.1 % of the zero-baseline value; common practice is to neglect bandwidth smearing below the
//     measurement errors, which rarely reach 1e-3 in SII).
//
// Tested in: tests/astro/instrument_response_test.cpp
#pragma once

#include <span>
#include <vector>

#include "astro/band_average.hpp"
#include "astro/models.hpp"

namespace siiplan::astro {

// The two mirrors and the filter of one telescope pair.
struct Response {
  Filter filter;                 // central wavelength, full width (0: monochromatic), profile
  double d1_m = 0, d2_m = 0;     // mirror diameters (0: a point)
};

// Given:   model; (u_m, v_m) the projected baseline between the mirror centres in metres (u East, v North);
//          the response.
// Returns: the measured <|V|^2> defined above (equal to Model::vis2 at lambda0 for point mirrors and
//          bandwidth 0), and with the gradient form d<|V|^2>/dp_k for every parameter (internal units;
//          grad.size() == params().size()).
// Throws:  InputError for a bad filter (band_average.hpp); RuntimeFailure when the mirrors resolve the
//          source too strongly for the mirror quadrature (aperture_average.hpp).
double measured_vis2(const Model& model, double u_m, double v_m, const Response& response);
double measured_vis2_and_gradient(const Model& model, double u_m, double v_m, const Response& response,
                                  std::span<double> grad);

// Which averages matter for this model and pair over baselines up to max_baseline_m (criteria above).
struct ResponseNeeds {
  double mirror_loss = 0;       // 1 - <|V|^2>(B0 = 0) of the mirrors, monochromatic
  bool mirrors = false;         // mirror_loss > 1 %
  double band_change = 0;       // largest |<|V|^2>_band - |V|^2(lambda0)| found on a grid of baselines
  bool band = false;            // band_change > 1e-3
  bool any() const { return mirrors || band; }
};
inline constexpr double kMirrorLossThreshold = 0.01;
inline constexpr double kBandChangeThreshold = 1e-3;
// The band is probed at 256 baselines evenly spaced over [0, max_baseline_m] (and along the u axis for
// models that are not radially symmetric, plus the v axis).
ResponseNeeds response_needs(const Model& model, const Response& response, double max_baseline_m);

// The measured |V|^2 of a RADIALLY SYMMETRIC model (Model::is_radially_symmetric) as a function of the
// projected baseline length, tabulated once per model and pair response so that a planner can evaluate
// it at the cost of an interpolation.
//
// Nodes: uniform in baseline length b on [0, max_baseline_m], spaced so that the model phase
// pi * angular_scale * b / lambda_min changes by at most kTableStepRad per step (lambda_min the band's
// shortest wavelength). Interpolation: four-point (cubic) Lagrange on the uniform grid. Its error is
// bounded by (9/384) h^4 max|f''''|; |V|^2 and its gradient have no spatial frequency above twice the
// model phase rate, so max|f''''| <= (2 k)^4 max|f| with k the phase per metre, and the bound is
// (9/384) (2 kTableStepRad)^4 = 2.3e-6 of the function's scale (tested against the exact quadrature in
// tests/astro/instrument_response_test.cpp: observed errors are below 1e-6 absolute in |V|^2 and in
// theta d|V|^2/dtheta). A planner needs information to a few per cent, not |V|^2 to 1e-15; fits use
// the exact path.
inline constexpr double kTableStepRad = 0.05;

class RadialResponseTable {
 public:
  // Throws InputError when the model is not radially symmetric or max_baseline_m is not > 0.
  RadialResponseTable(const Model& model, const Response& response, double max_baseline_m);

  double max_baseline_m() const { return max_b_m_; }
  std::size_t n_nodes() const { return n_; }
  // |V|^2 at baseline length b_m in [0, max_baseline_m] (clamped to the ends outside it).
  double vis2(double b_m) const;
  // |V|^2 and d|V|^2/dp_k for every parameter at b_m.
  double vis2_and_gradient(double b_m, std::span<double> grad) const;
  // Batch for the planner: |V|^2 and d|V|^2/dtheta (the first parameter, 1/rad) at baselines in metres
  // given by their (u, v) components; all spans of equal size.
  void vis2_and_dtheta(std::span<const double> u_m, std::span<const double> v_m, std::span<double> vis2,
                       std::span<double> dvis2_dtheta) const;

 private:
  std::size_t n_ = 0, n_params_ = 0;
  double max_b_m_ = 0, h_m_ = 0;
  std::vector<double> values_;   // [node][1 + n_params]: |V|^2, then the gradient
  double interpolate(double b_m, std::size_t column) const;
};

}  // namespace siiplan::astro
