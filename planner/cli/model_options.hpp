// Command-line options that describe one star model, shared by every command that evaluates a model
// (curve, coherence, resolve, fit, simulate).
//
// Options (all read as text so that every bad value gets the same "--name: ..." message):
//   --model ud|ld-linear|ld-quadratic|ld-power|gaussian|ring|ellipse|binary   (default ud)
//   --diameter-mas            the model's size: disk or ring diameter, Gaussian FWHM, ellipse major axis,
//                             binary primary diameter
//   --limb-u                  linear law I(mu) = 1 - u(1 - mu)
//   --limb-a, --limb-b        quadratic law I(mu) = 1 - a(1 - mu) - b(1 - mu)^2
//   --limb-alpha              power law I(mu) = mu^alpha
//   --axis-ratio              ellipse minor/major in (0, 1]
//   --major-pa-deg            ellipse position angle of the MAJOR axis, from North through East
//   --companion-diameter-mas, --flux-ratio (F2/F1), --separation-mas,
//   --companion-pa-deg        binary: companion offset from the primary, PA from North through East
// Each model needs exactly its own parameters (astro::model_params); an option that does not belong to
// the chosen model is an error, so a typo never silently falls back to another model.
#pragma once

#include <boost/program_options.hpp>

#include <optional>
#include <vector>

#include "astro/models.hpp"

namespace siiplan::cli {

namespace po = boost::program_options;

// Declares --model and every model parameter option (as po::value<std::string>()).
void add_model_options(po::options_description& desc);

// Builds the model from the parsed options, converting user units (mas, deg) to internal ones (rad).
// Throws InputError naming the option: unknown model, missing or non-numeric parameter, a parameter
// outside its range (e.g. --axis-ratio outside (0,1], --diameter-mas <= 0), or a parameter given that
// the model does not use.
astro::Model model_from_options(const po::variables_map& vm);

// For commands where model parameters are optional (fit: start or fixed values): the model named by
// --model and, per parameter of that model (astro::model_params order), the value given in internal
// units or nullopt. Same checks and messages as model_from_options, except that parameters may be absent.
struct ModelChoice {
  astro::ModelKind kind;
  std::vector<std::optional<double>> params;
};
ModelChoice model_choice_from_options(const po::variables_map& vm);

// The option name ("diameter-mas") of a model parameter ("diameter_mas").
std::string model_option_name(std::string_view param_name);

// One line listing the parameters of a model with their values in user units, e.g.
// "ld-linear diameter_mas=1 limb_u=0.6" (for table headers, plot titles and reports).
std::string describe_model(const astro::Model& model);

}  // namespace siiplan::cli
