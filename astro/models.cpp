#include "astro/models.hpp"

#include <cmath>

#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

constexpr ParamSpec kDiameter{"diameter_mas", kRadToMas, 0.0, kInf, true};

const ParamSpec kUdParams[] = {kDiameter};

struct KindInfo {
  ModelKind kind;
  std::string_view name;
  std::span<const ParamSpec> params;
};

const KindInfo kKinds[] = {
    {ModelKind::UniformDisk, "ud", kUdParams},
};

const KindInfo& info(ModelKind kind) {
  for (const auto& k : kKinds)
    if (k.kind == kind) return k;
  throw InputError("model", "this model is not available yet", "use 'ud'");
}

}  // namespace

std::string_view model_name(ModelKind kind) { return info(kind).name; }

std::optional<ModelKind> model_from_name(std::string_view name) {
  for (const auto& k : kKinds)
    if (k.name == name) return k.kind;
  return std::nullopt;
}

std::span<const ParamSpec> model_params(ModelKind kind) { return info(kind).params; }

Model::Model(ModelKind kind, std::vector<double> params_internal) : kind_(kind), params_(std::move(params_internal)) {
  auto specs = model_params(kind);
  if (params_.size() != specs.size())
    throw InputError(std::string(model_name(kind)), "wrong number of model parameters", "internal use");
  for (std::size_t i = 0; i < specs.size(); ++i) {
    double v = params_[i];
    bool ok = std::isfinite(v) && v <= specs[i].upper && (specs[i].lower_open ? v > specs[i].lower : v >= specs[i].lower);
    if (!ok)
      throw InputError(std::string(specs[i].name), "value " + std::to_string(v * specs[i].user_per_internal) +
                                                       " is outside the allowed range",
                       "see 'siiplan help curve' for the ranges");
  }
}

bool Model::is_radially_symmetric() const { return true; }

std::complex<double> Model::visibility(double u_lambda, double v_lambda) const {
  double x = kPi * params_[0] * std::hypot(u_lambda, v_lambda);
  return x < 1e-8 ? 1.0 : 2.0 * ::j1(x) / x;
}

double Model::vis2(double u_lambda, double v_lambda) const { return std::norm(visibility(u_lambda, v_lambda)); }

double Model::vis2_and_gradient(double u_lambda, double v_lambda, std::span<double> grad) const {
  double x = kPi * params_[0] * std::hypot(u_lambda, v_lambda);
  double v = x < 1e-8 ? 1.0 : 2.0 * ::j1(x) / x;
  double dv_dx = x < 1e-8 ? -x / 4 : -2.0 * ::jn(2, x) / x;
  grad[0] = 2 * v * dv_dx * (x / params_[0]);
  return v * v;
}

}  // namespace siiplan::astro
