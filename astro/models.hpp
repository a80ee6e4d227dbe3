// Visibility models of stars: the contract every other module uses.
//
// Conventions (models.md §1.0, §6.4):
//   * (u, v) are projected baseline components in wavelengths (u_lambda = u_m / lambda_m), u towards
//     East, v towards North on the sky.
//   * V is normalised so that V(0,0) = 1 for every model; the observable of intensity interferometry is
//     |V|^2 (c(B) = c(0)|V(B)|^2, models.md §1.9).
//   * Fourier sign: V(u,v) = ∫ I(α,δ) exp(-2πi(uα+vδ)) dα dδ / ∫ I, α towards East. It matters only
//     for the binary's complex V; |V|^2 is even in (u,v).
//   * Parameters are stored in internal units (radians for angles, plain numbers otherwise) in the
//     order listed by model_params(kind). Their user-facing names (used by the CLI, the fitter's
//     --fix, CSV output) carry the user unit: "diameter_mas", "major_pa_deg", ...
//
// Model objects are immutable values: safe to copy into threads and into the fitter.
#pragma once

#include <complex>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace siiplan::astro {

enum class ModelKind {
  UniformDisk,   // params: diameter
  LinearLD,      // params: diameter (limb-darkened), limb_u
  QuadraticLD,   // params: diameter (limb-darkened), limb_a, limb_b
  PowerLD,       // params: diameter (limb-darkened), limb_alpha
  Gaussian,      // params: diameter (= FWHM)
  Ring,          // params: diameter (thin ring)
  Ellipse,       // params: diameter (major axis), axis_ratio (minor/major, in (0,1]), major_pa (N through E)
  Binary,        // params: diameter (primary UD), companion_diameter, flux_ratio (F2/F1), separation, companion_pa
};
//
// The models and their parameters (internal units, in this order; x = pi * diameter * |(u,v)|):
//   ud            diameter_rad                          V = 2 J1(x)/x                          (models.md §1.1)
//   ld-linear     diameter_rad (LD), limb_u in [0,1]    I(mu) = 1 - u(1-mu)                    (§1.2; Hanbury Brown et al. 1974)
//   ld-quadratic  diameter_rad (LD), limb_a, limb_b     I(mu) = 1 - a(1-mu) - b(1-mu)^2        (§1.3)
//                 (a in [-1,2], b in [-1,1], and I(mu) >= 0 for all mu in [0,1])
//   ld-power      diameter_rad (LD), limb_alpha [0,10]  I(mu) = mu^alpha, V = Lambda_{1+alpha/2}(x) (§1.4; Hestroffer 1997, A&A 327, 199)
//   gaussian      diameter_rad = FWHM                   V = exp(-x^2/(4 ln 2))                 (§1.5)
//   ring          diameter_rad (infinitely thin ring)   V = J0(x)                              (§1.6)
//   ellipse       diameter_rad (MAJOR axis), axis_ratio (minor/major, (0,1]),
//                 major_pa_rad: position angle of the MAJOR axis, from North through East.
//                 Note: papers often quote the PA of an oblate star's rotation axis, which is its MINOR
//                 axis: major_pa = rotation-axis PA + 90 deg.                                   (§1.7)
//   binary        diameter_rad (primary UD), companion_diameter_rad (UD, >= 0), flux_ratio F2/F1 >= 0,
//                 separation_rad >= 0, companion_pa_rad: position angle of the COMPANION as seen from the
//                 primary, from North through East. The companion sits at offset
//                 (dalpha, ddelta) = separation * (sin pa, cos pa) from the primary (dalpha towards East),
//                 the primary at the phase centre:
//                 V = [V1 + f V2 exp(-2 pi i (u dalpha + v ddelta))] / (1 + f)                     (§1.8)
// Gradients are analytic for every parameter (power law: d/dalpha through dLambda_nu/dnu, astro/bessel.hpp).

// One model parameter: its user-facing name and unit, and its allowed range in internal units.
struct ParamSpec {
  std::string_view name;      // e.g. "diameter_mas", "limb_u", "major_pa_deg"
  double user_per_internal;   // multiply an internal value by this to get the user unit (e.g. kRadToMas)
  double lower;               // allowed range, internal units (inclusive unless lower_open)
  double upper;
  bool lower_open;            // true when the lower bound itself is not allowed (diameter > 0)
};

// The CLI/CSV name of a model: "ud", "ld-linear", "ld-quadratic", "ld-power", "gaussian", "ring",
// "ellipse", "binary".
std::string_view model_name(ModelKind kind);
std::optional<ModelKind> model_from_name(std::string_view name);
std::span<const ParamSpec> model_params(ModelKind kind);
// All models, in the order of ModelKind (for help texts and loops in tests).
std::span<const ModelKind> all_model_kinds();
// The allowed range of a parameter in user units, e.g. "(0, 1]" or "at least 0" (for error messages).
std::string param_range_text(const ParamSpec& spec);

class Model {
 public:
  // Throws siiplan::InputError naming the parameter when a value is outside its range or the count is wrong.
  Model(ModelKind kind, std::vector<double> params_internal);

  ModelKind kind() const { return kind_; }
  const std::vector<double>& params() const { return params_; }
  double diameter_rad() const { return params_[0]; }
  // A copy with other parameter values (validated like the constructor).
  Model with_params(std::vector<double> params_internal) const { return Model(kind_, std::move(params_internal)); }
  // True when |V|^2 depends only on the projected baseline length (not on its position angle).
  bool is_radially_symmetric() const;

  // Complex visibility, V(0,0) = 1. Real for centro-symmetric models.
  std::complex<double> visibility(double u_lambda, double v_lambda) const;
  // |V|^2.
  double vis2(double u_lambda, double v_lambda) const;
  // |V|^2, and d|V|^2/dp_k for every parameter p_k (internal units) written into grad
  // (grad.size() must equal params().size()).
  double vis2_and_gradient(double u_lambda, double v_lambda, std::span<double> grad) const;

 private:
  ModelKind kind_;
  std::vector<double> params_;
};

// The largest angular scale (radians) that sets how fast |V|^2 changes with baseline: the largest of the
// diameters and, for a binary, twice the separation (its fringe term varies like a disk of that size).
// Used to choose step sizes in root finders and quadratures.
double angular_scale_rad(const Model& model);

}  // namespace siiplan::astro
