// Fitting a visibility model to squared-visibility measurements (models.md §5).
//
// Data model (models.md §1.9, §5.1): y_i = c0 |V(u_i/lambda_i, v_i/lambda_i; p)|^2 + noise, independent
// Gaussian errors sigma_i. The estimator minimises chi^2 = sum_i ((c0 |V_i|^2 - y_i)/sigma_i)^2 (weighted
// least squares), plus ((c0 - c0_prior)/sigma_prior)^2 when the zero-baseline correlation c0 carries a
// Gaussian prior. Negative y_i are kept (clipping biases the diameter).
//
// Minimiser: Levenberg-Marquardt with Marquardt's diagonal scaling, (J^T J + lambda diag(J^T J)) d = -J^T r
// (Levenberg 1944, Q. Appl. Math. 2, 164; Marquardt 1963, J. SIAM 11, 431; Press et al., Numerical
// Recipes 3rd ed. §15.5.2), written on Eigen with the analytic gradients of astro/models.hpp.
// Bounds by reparameterisation (the transforms of MINUIT, James & Roos 1975, Comput. Phys. Commun. 10, 343):
//   open lower bound 0 (diameter > 0):          p = exp(q)
//   closed lower bound a (flux ratio >= 0, ...): p = a - 1 + sqrt(q^2 + 1)
//   two-sided [a, b] (axis ratio, limb_u, ...):  p = a + (b - a)(sin q + 1)/2
//   unbounded (position angles):                 p = q, wrapped into [0, 180) deg for the ellipse's
//                                                major axis and [0, 360) deg for the binary's companion.
// Uncertainties (models.md §5.3) come from the Jacobian in the PHYSICAL parameters at the solution
// (so they do not depend on the transforms): C = (J^T J)^-1 with J the sigma-weighted residual Jacobian
// ("unscaled": right when the sigma_i are right; scipy curve_fit absolute_sigma=True), and
// C * chi^2_red ("scaled": when the sigma_i are trusted only up to a common factor; curve_fit's default,
// Numerical Recipes §15.6).
// Model comparison: AIC = chi^2 + 2k with k the number of free parameters (Akaike 1974, IEEE Trans.
// Autom. Control 19, 716; -2 ln L = chi^2 + const for Gaussian errors of known sigma). Lower is better;
// differences below ~2 do not distinguish models.
//
// Pure computation, no I/O. Tested in: tests/astro/fit_test.cpp.
#pragma once

#include <Eigen/Dense>
#include <cmath>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "astro/models.hpp"

namespace siiplan::astro {

// One squared-visibility measurement.
struct Vis2Measurement {
  double u_m = 0, v_m = 0;   // projected baseline, u East, v North (m)
  double lambda_m = 0;       // effective wavelength (m)
  double vis2 = 0;           // measured |V|^2 (or raw correlation c(B) with a free/prior c0)
  double vis2_err = 0;       // 1-sigma error (> 0)
  double mjd = NAN;          // UTC; needed only for the bootstrap over nights
};

enum class NormMode {
  Fixed,   // c0 = value (1 for calibrated |V|^2)
  Free,    // c0 fitted without constraint
  Prior,   // c0 fitted with a Gaussian prior value +- error
};
struct NormSpec {
  NormMode mode = NormMode::Fixed;
  double value = 1.0;
  double error = 0.0;  // Prior only, > 0
};

struct FitOptions {
  ModelKind kind = ModelKind::UniformDisk;
  // Per model parameter (internal units, model_params(kind) order): a start value, or nullopt to take
  // it from the data (size scan, grids) or a typical value. Empty = all nullopt.
  std::vector<std::optional<double>> start;
  // Per model parameter: true = held at its start value (which must then be given). Empty = all free.
  std::vector<bool> fixed;
  NormSpec norm;
  int max_iterations = 200;      // LM iterations (each one or more model evaluations over the data)
  double chi2_rel_tol = 1e-12;   // converged when an accepted step changes chi^2 by less than this, relatively
  double step_rel_tol = 1e-12;   // ... or moves every parameter by less than this, relatively
};

enum class FitStatus {
  Converged,            // a minimum was reached within the tolerances
  ConvergedDegenerate,  // a minimum, but some free parameter is not constrained (singular J^T J): no errors
  IterationLimit,       // stopped at max_iterations before chi^2 settled: NOT a valid result
  Stalled,              // no step could reduce chi^2 while the gradient is not small: NOT a valid result
};

struct FitParameter {
  std::string name;              // user-facing name: "diameter_mas", ..., and "norm" for c0
  double user_per_internal = 1;  // multiply internal values by this for the user unit
  double value = 0;              // best value, internal units
  bool free = false;
  bool at_bound = false;         // the best value sits on a bound: the linear error means little
  double error = NAN;            // sqrt of (J^T J)^-1 diagonal ("unscaled"), internal units; NaN when fixed
  double error_scaled = NAN;     // error * sqrt(chi2_reduced) ("scaled")
  double bootstrap_error = NAN;  // filled by bootstrap_fit()
};

struct FitResult {
  ModelKind kind = ModelKind::UniformDisk;
  std::vector<FitParameter> params;  // the model's parameters in model_params order, then "norm"
  std::vector<int> free_params;      // indices into params of the free ones (covariance order)
  Eigen::MatrixXd covariance;        // (J^T J)^-1 of the free parameters, internal units (unscaled)
  Eigen::MatrixXd correlation;       // correlation matrix of the free parameters
  double chi2 = NAN;                 // including the c0 prior term when there is one
  int n_data = 0;                    // measurements used (+1 for a c0 prior, counted as a datum)
  int n_free = 0;
  int dof = 0;                       // n_data - n_free
  double chi2_reduced = NAN;         // chi2 / dof (NaN when dof <= 0)
  double aic = NAN;                  // chi2 + 2 n_free
  FitStatus status = FitStatus::Stalled;
  std::string status_text;           // the status in words, e.g. "converged after 7 iterations (...)"
  int iterations = 0;
  int evaluations = 0;               // model evaluations over the whole data set (grids included)

  bool usable() const { return status == FitStatus::Converged || status == FitStatus::ConvergedDegenerate; }
  Model model() const;               // the best-fit model
  double norm() const { return params.back().value; }
  const FitParameter* find(std::string_view name) const;
};

// Fits options.kind to the data. Throws InputError for unusable requests: no data, a fixed parameter
// without a value, a start value outside its range, a non-positive prior error, a non-positive sigma,
// or more free parameters than data. A fit that does not converge is NOT an exception: see status.
FitResult fit_vis2(std::span<const Vis2Measurement> data, const FitOptions& options);

// The chi^2-weighted residuals (y_i - c0 |V_i|^2)/sigma_i of a result, in data order.
std::vector<double> normalised_residuals(std::span<const Vis2Measurement> data, const FitResult& result);

struct BootstrapOptions {
  int samples = 200;
  std::uint64_t seed = 1;
  bool by_night = false;  // resample whole nights (groups of points closer than 0.3 d in MJD) instead of points
};
struct BootstrapSummary {
  int samples = 0;        // resamples whose fit converged (used)
  int failed = 0;         // resamples whose fit did not converge (left out)
  int groups = 0;         // points or nights resampled
};

// Efron's bootstrap (Efron 1979, Ann. Stat. 7, 1; Efron & Tibshirani 1993 ch. 6): draws the data (or
// whole nights) with replacement `samples` times (std::mt19937_64 seeded with `seed`: reproducible),
// refits from the best solution, and writes the standard deviation of each free parameter into
// result.params[k].bootstrap_error. Throws InputError when nights are asked for and an MJD is missing,
// or when there are fewer than 2 groups to resample.
BootstrapSummary bootstrap_fit(std::span<const Vis2Measurement> data, const FitOptions& options, FitResult& result,
                               const BootstrapOptions& bootstrap);

}  // namespace siiplan::astro
