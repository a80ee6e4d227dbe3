#include "astro/models.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include "astro/bessel.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
const double kLn2 = std::log(2.0);

// name, user_per_internal, lower, upper, lower_open
constexpr ParamSpec kDiameter{"diameter_mas", kRadToMas, 0.0, kInf, true};
constexpr ParamSpec kLimbU{"limb_u", 1.0, 0.0, 1.0, false};
constexpr ParamSpec kLimbA{"limb_a", 1.0, -1.0, 2.0, false};
constexpr ParamSpec kLimbB{"limb_b", 1.0, -1.0, 1.0, false};
constexpr ParamSpec kLimbAlpha{"limb_alpha", 1.0, 0.0, 10.0, false};
constexpr ParamSpec kAxisRatio{"axis_ratio", 1.0, 0.0, 1.0, true};
constexpr ParamSpec kMajorPa{"major_pa_deg", kRadToDeg, -kInf, kInf, false};
constexpr ParamSpec kCompanionDiameter{"companion_diameter_mas", kRadToMas, 0.0, kInf, false};
constexpr ParamSpec kFluxRatio{"flux_ratio", 1.0, 0.0, kInf, false};
constexpr ParamSpec kSeparation{"separation_mas", kRadToMas, 0.0, kInf, false};
constexpr ParamSpec kCompanionPa{"companion_pa_deg", kRadToDeg, -kInf, kInf, false};

constexpr ParamSpec kUdParams[] = {kDiameter};
constexpr ParamSpec kLinearParams[] = {kDiameter, kLimbU};
constexpr ParamSpec kQuadraticParams[] = {kDiameter, kLimbA, kLimbB};
constexpr ParamSpec kPowerParams[] = {kDiameter, kLimbAlpha};
constexpr ParamSpec kEllipseParams[] = {kDiameter, kAxisRatio, kMajorPa};
constexpr ParamSpec kBinaryParams[] = {kDiameter, kCompanionDiameter, kFluxRatio, kSeparation, kCompanionPa};

struct KindInfo {
  ModelKind kind;
  std::string_view name;
  std::span<const ParamSpec> params;
};

constexpr KindInfo kKinds[] = {
    {ModelKind::UniformDisk, "ud", kUdParams},
    {ModelKind::LinearLD, "ld-linear", kLinearParams},
    {ModelKind::QuadraticLD, "ld-quadratic", kQuadraticParams},
    {ModelKind::PowerLD, "ld-power", kPowerParams},
    {ModelKind::Gaussian, "gaussian", kUdParams},
    {ModelKind::Ring, "ring", kUdParams},
    {ModelKind::Ellipse, "ellipse", kEllipseParams},
    {ModelKind::Binary, "binary", kBinaryParams},
};

constexpr ModelKind kAllKinds[] = {ModelKind::UniformDisk, ModelKind::LinearLD, ModelKind::QuadraticLD, ModelKind::PowerLD,
                               ModelKind::Gaussian,    ModelKind::Ring,     ModelKind::Ellipse,     ModelKind::Binary};

const KindInfo& info(ModelKind kind) {
  for (const auto& k : kKinds)
    if (k.kind == kind) return k;
  throw RuntimeFailure("model", "unknown model kind", "internal error; please report it");
}

std::string user_number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

// A real (centro-symmetric) radial profile evaluated at x: V, dV/dx and dV/d(limb coefficient k).
struct Radial {
  double v = 1, dv_dx = 0;
  double dv_dlimb[2] = {0, 0};
};

Radial radial(ModelKind kind, const std::vector<double>& p, double x) {
  Radial r;
  switch (kind) {
    case ModelKind::UniformDisk:
    case ModelKind::Ellipse:
      r.v = 2.0 * j1_over_x(x);                 // models.md §1.1
      r.dv_dx = -2.0 * x * j2_over_x2(x);       // dV/dx = -2 J2(x)/x
      break;
    case ModelKind::LinearLD: {                 // models.md §1.2 (Hanbury Brown et al. 1974 form)
      const double u = p[1];
      const double j1x = j1_over_x(x), s3 = sinc3(x);
      const double num = (1 - u) * j1x + u * s3, den = (1 - u) / 2 + u / 3;
      r.v = num / den;
      r.dv_dx = -x * ((1 - u) * j2_over_x2(x) + u * sinc5(x)) / den;
      r.dv_dlimb[0] = ((-j1x + s3) - r.v * (-1.0 / 6)) / den;
      break;
    }
    case ModelKind::QuadraticLD: {              // models.md §1.3
      const double a = p[1], b = p[2];
      const double j1x = j1_over_x(x), s3 = sinc3(x), j2x2 = j2_over_x2(x);
      const double num = (1 - a - b) * j1x + (a + 2 * b) * s3 - 2 * b * j2x2;
      const double den = 0.5 - a / 6 - b / 12;
      r.v = num / den;
      r.dv_dx = -x * ((1 - a - b) * j2x2 + (a + 2 * b) * sinc5(x) - 2 * b * j3_over_x3(x)) / den;
      r.dv_dlimb[0] = ((-j1x + s3) - r.v * (-1.0 / 6)) / den;
      r.dv_dlimb[1] = ((-j1x + 2 * s3 - 2 * j2x2) - r.v * (-1.0 / 12)) / den;
      break;
    }
    case ModelKind::PowerLD: {                  // models.md §1.4, nu = 1 + alpha/2
      const double nu = 1 + p[1] / 2;
      const LambdaNu l = lambda_nu(nu, x);
      r.v = l.value;
      r.dv_dx = -x * lambda_nu_value(nu + 1, x) / (2 * (nu + 1));   // dLambda_nu/dx, models.md §1.0
      r.dv_dlimb[0] = 0.5 * l.d_dnu;
      break;
    }
    case ModelKind::Gaussian:                   // models.md §1.5, diameter = FWHM
      r.v = std::exp(-x * x / (4 * kLn2));
      r.dv_dx = -x / (2 * kLn2) * r.v;
      break;
    case ModelKind::Ring:                       // models.md §1.6, thin ring
      r.v = bessel_j0(x);
      r.dv_dx = -bessel_j1(x);
      break;
    case ModelKind::Binary:
      break;
  }
  return r;
}

// Ellipse geometry (models.md §1.7): with (b_maj, b_min) the baseline projected on the major and minor
// axes, x = pi theta sqrt(b_maj^2 + (r b_min)^2). Returns x and x * dx/dp for p = (theta, r, pa) (these
// products stay finite at x = 0).
struct EllipseX {
  double x;
  double x_dx[3];
};
EllipseX ellipse_x(const std::vector<double>& p, double u, double v) {
  const double theta = p[0], r = p[1], pa = p[2];
  const double s = std::sin(pa), c = std::cos(pa);
  const double b_maj = u * s + v * c, b_min = u * c - v * s;
  const double rho2 = b_maj * b_maj + r * r * b_min * b_min;
  const double k2 = (kPi * theta) * (kPi * theta);
  EllipseX e;
  e.x = kPi * theta * std::sqrt(rho2);
  e.x_dx[0] = k2 * rho2 / theta;
  e.x_dx[1] = k2 * r * b_min * b_min;
  e.x_dx[2] = k2 * (1 - r * r) * b_maj * b_min;   // d b_maj/dpa = b_min, d b_min/dpa = -b_maj
  return e;
}

}  // namespace

std::string_view model_name(ModelKind kind) { return info(kind).name; }

std::optional<ModelKind> model_from_name(std::string_view name) {
  for (const auto& k : kKinds)
    if (k.name == name) return k.kind;
  return std::nullopt;
}

std::span<const ParamSpec> model_params(ModelKind kind) { return info(kind).params; }
std::span<const ModelKind> all_model_kinds() { return kAllKinds; }

std::string param_range_text(const ParamSpec& s) {
  const bool lo = std::isfinite(s.lower), hi = std::isfinite(s.upper);
  const std::string l = user_number(s.lower * s.user_per_internal), u = user_number(s.upper * s.user_per_internal);
  if (lo && hi) return std::string(s.lower_open ? "(" : "[") + l + ", " + u + "]";
  if (lo) return (s.lower_open ? "greater than " : "at least ") + l;
  if (hi) return "at most " + u;
  return "any finite number";
}

Model::Model(ModelKind kind, std::vector<double> params_internal) : kind_(kind), params_(std::move(params_internal)) {
  auto specs = model_params(kind);
  if (params_.size() != specs.size())
    throw RuntimeFailure(std::string(model_name(kind)), "wrong number of model parameters", "internal error; please report it");
  for (std::size_t i = 0; i < specs.size(); ++i) {
    const double v = params_[i];
    const bool ok = std::isfinite(v) && v <= specs[i].upper && (specs[i].lower_open ? v > specs[i].lower : v >= specs[i].lower);
    if (!ok)
      throw InputError(std::string(specs[i].name), "value " + user_number(v * specs[i].user_per_internal) + " is out of range",
                       "it must be " + param_range_text(specs[i]));
  }
  if (kind == ModelKind::QuadraticLD) {
    // I(mu) = 1 - a t - b t^2 with t = 1 - mu in [0,1] must not go negative: check t = 1 and, for b < 0,
    // the interior minimum at t = -a/(2b).
    const double a = params_[1], b = params_[2];
    const double t_min = b < 0 ? -a / (2 * b) : -1.0;
    const bool negative = 1 - a - b < 0 || (t_min > 0 && t_min < 1 && 1 + a * a / (4 * b) < 0);
    if (negative)
      throw InputError("limb_a, limb_b", "a = " + user_number(a) + ", b = " + user_number(b) +
                                             " make the intensity 1 - a(1-mu) - b(1-mu)^2 negative near the limb",
                       "choose coefficients with a + b <= 1");
  }
}

bool Model::is_radially_symmetric() const {
  switch (kind_) {
    case ModelKind::Ellipse: return params_[1] == 1.0;
    case ModelKind::Binary: return params_[2] == 0.0 || params_[3] == 0.0;
    default: return true;
  }
}

std::complex<double> Model::visibility(double u_lambda, double v_lambda) const {
  if (kind_ == ModelKind::Ellipse) return 2.0 * j1_over_x(ellipse_x(params_, u_lambda, v_lambda).x);
  const double b = std::hypot(u_lambda, v_lambda);
  if (kind_ != ModelKind::Binary) return radial(kind_, params_, kPi * params_[0] * b).v;
  // models.md §1.8: shift theorem with the exp(-2 pi i (u alpha + v delta)) convention of models.hpp.
  const double f = params_[2], sep = params_[3], pa = params_[4];
  const double v1 = 2.0 * j1_over_x(kPi * params_[0] * b), v2 = 2.0 * j1_over_x(kPi * params_[1] * b);
  const double phase = kTwoPi * sep * (u_lambda * std::sin(pa) + v_lambda * std::cos(pa));
  return (v1 + f * v2 * std::polar(1.0, -phase)) / (1.0 + f);
}

double Model::vis2(double u_lambda, double v_lambda) const { return std::norm(visibility(u_lambda, v_lambda)); }

double Model::vis2_and_gradient(double u_lambda, double v_lambda, std::span<double> grad) const {
  const double b = std::hypot(u_lambda, v_lambda);
  switch (kind_) {
    case ModelKind::Ellipse: {
      const EllipseX e = ellipse_x(params_, u_lambda, v_lambda);
      const double v = 2.0 * j1_over_x(e.x);
      const double dv_dx_over_x = -2.0 * j2_over_x2(e.x);   // (dV/dx)/x, finite at x = 0
      for (int k = 0; k < 3; ++k) grad[k] = 2 * v * dv_dx_over_x * e.x_dx[k];
      return v * v;
    }
    case ModelKind::Binary: {
      // models.md §1.8: |V|^2 = [V1^2 + f^2 V2^2 + 2 f V1 V2 cos(phase)] / (1+f)^2
      const double th1 = params_[0], th2 = params_[1], f = params_[2], sep = params_[3], pa = params_[4];
      const double x1 = kPi * th1 * b, x2 = kPi * th2 * b;
      const double v1 = 2.0 * j1_over_x(x1), v2 = 2.0 * j1_over_x(x2);
      const double dv1 = -2.0 * x1 * j2_over_x2(x1) * kPi * b;   // dV1/dtheta1
      const double dv2 = -2.0 * x2 * j2_over_x2(x2) * kPi * b;   // dV2/dtheta2
      const double sp = std::sin(pa), cp = std::cos(pa);
      const double phase = kTwoPi * sep * (u_lambda * sp + v_lambda * cp);
      const double cph = std::cos(phase), sph = std::sin(phase);
      const double n = 1.0 + f, n2 = n * n;
      const double s = v1 * v1 + f * f * v2 * v2 + 2 * f * v1 * v2 * cph;
      grad[0] = 2 * (v1 + f * v2 * cph) * dv1 / n2;
      grad[1] = 2 * (f * f * v2 + f * v1 * cph) * dv2 / n2;
      grad[2] = (2 * f * v2 * v2 + 2 * v1 * v2 * cph) / n2 - 2 * s / (n2 * n);
      grad[3] = -2 * f * v1 * v2 * sph * kTwoPi * (u_lambda * sp + v_lambda * cp) / n2;
      grad[4] = -2 * f * v1 * v2 * sph * kTwoPi * sep * (u_lambda * cp - v_lambda * sp) / n2;
      return s / n2;
    }
    default: {
      const double x = kPi * params_[0] * b;
      const Radial r = radial(kind_, params_, x);
      grad[0] = 2 * r.v * r.dv_dx * kPi * b;   // dx/dtheta = pi |b|
      for (std::size_t k = 1; k < params_.size(); ++k) grad[k] = 2 * r.v * r.dv_dlimb[k - 1];
      return r.v * r.v;
    }
  }
}

double angular_scale_rad(const Model& model) {
  const auto& p = model.params();
  if (model.kind() == ModelKind::Binary) return std::max({p[0], p[1], 2.0 * p[3]});
  return p[0];
}

}  // namespace siiplan::astro
