#include "planner/cli/model_options.hpp"

#include <cmath>
#include <string>

#include "astro/errors.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"

namespace siiplan::cli {

namespace {

constexpr const char* kModelList = "ud, ld-linear, ld-quadratic, ld-power, gaussian, ring, ellipse or binary";

// Every model parameter option with its help text, in the order shown by --help.
struct ParamOption {
  const char* param;   // astro::ParamSpec name
  const char* help;
};
const ParamOption kParamOptions[] = {
    {"diameter_mas", "model size in mas: disk or ring diameter, Gaussian FWHM, ellipse major axis, binary primary diameter"},
    {"limb_u", "ld-linear: coefficient u of I(mu) = 1 - u(1 - mu), 0..1"},
    {"limb_a", "ld-quadratic: coefficient a of I(mu) = 1 - a(1 - mu) - b(1 - mu)^2"},
    {"limb_b", "ld-quadratic: coefficient b of I(mu) = 1 - a(1 - mu) - b(1 - mu)^2"},
    {"limb_alpha", "ld-power: exponent alpha of I(mu) = mu^alpha, 0..10"},
    {"axis_ratio", "ellipse: minor/major axis ratio, in (0, 1]"},
    {"major_pa_deg", "ellipse: position angle of the MAJOR axis in degrees, from North through East"},
    {"companion_diameter_mas", "binary: uniform-disk diameter of the companion in mas (0 = point)"},
    {"flux_ratio", "binary: flux ratio companion/primary F2/F1, >= 0"},
    {"separation_mas", "binary: angular separation of the companion from the primary in mas"},
    {"companion_pa_deg", "binary: position angle of the companion seen from the primary, degrees from North through East"},
};

}  // namespace

std::string model_option_name(std::string_view param_name) {
  std::string s(param_name);
  for (auto& c : s)
    if (c == '_') c = '-';
  return s;
}

void add_model_options(po::options_description& desc) {
  desc.add_options()("model", po::value<std::string>(),
                     (std::string("star model: ") + kModelList + " (default ud)").c_str());
  for (const auto& p : kParamOptions)
    desc.add_options()(model_option_name(p.param).c_str(), po::value<std::string>(), p.help);
}

ModelChoice model_choice_from_options(const po::variables_map& vm) {
  std::string name = vm.count("model") ? vm["model"].as<std::string>() : std::string("ud");
  auto kind = astro::model_from_name(name);
  if (!kind) throw InputError("--model", "unknown model '" + name + "'", std::string("choose ") + kModelList);

  auto specs = astro::model_params(*kind);
  auto uses = [&](std::string_view param) {
    for (const auto& s : specs)
      if (s.name == param) return true;
    return false;
  };
  for (const auto& p : kParamOptions) {
    std::string opt = model_option_name(p.param);
    if (vm.count(opt) && !uses(p.param))
      throw InputError("--" + opt, "does not apply to model '" + name + "'",
                       "remove it, or choose a model that uses it: see 'siiplan help curve'");
  }

  ModelChoice choice{*kind, {}};
  for (const auto& s : specs) {
    std::string opt = model_option_name(s.name);
    if (!vm.count(opt)) {
      choice.params.push_back(std::nullopt);
      continue;
    }
    double internal = number_option(vm, opt, "") / s.user_per_internal;
    bool ok = internal <= s.upper && (s.lower_open ? internal > s.lower : internal >= s.lower);
    if (!ok)
      throw InputError("--" + opt, "value " + vm[opt].as<std::string>() + " is out of range",
                       "it must be " + astro::param_range_text(s));
    choice.params.push_back(internal);
  }
  return choice;
}

astro::Model model_from_options(const po::variables_map& vm) {
  ModelChoice choice = model_choice_from_options(vm);
  auto specs = astro::model_params(choice.kind);
  std::string needed;
  for (const auto& s : specs) needed += (needed.empty() ? "--" : ", --") + model_option_name(s.name);
  std::vector<double> params;
  for (std::size_t k = 0; k < specs.size(); ++k) {
    if (!choice.params[k])
      throw InputError("--" + model_option_name(specs[k].name), "this option is required",
                       "model '" + std::string(astro::model_name(choice.kind)) + "' needs " + needed);
    params.push_back(*choice.params[k]);
  }
  // Joint constraints (e.g. a non-negative limb-darkening profile) are checked by the Model itself.
  return astro::Model(choice.kind, std::move(params));
}

std::string describe_model(const astro::Model& model) {
  std::string s(astro::model_name(model.kind()));
  auto specs = astro::model_params(model.kind());
  for (std::size_t i = 0; i < specs.size(); ++i)
  {
    s.append(" ").append(specs[i].name).append("=");
    s.append(io::format_number(model.params()[i] * specs[i].user_per_internal, 8));
  }
  return s;
}

}  // namespace siiplan::cli
