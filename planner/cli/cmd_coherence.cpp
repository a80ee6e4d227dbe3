// siiplan coherence: coherence radius and area of a star's light, its first-null and half-power
// baselines, and whether a mirror of given size partly resolves it.
#include <cmath>
#include <ostream>

#include "astro/aperture_average.hpp"
#include "astro/coherence.hpp"
#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

constexpr double kAu_m = 149597870700.0;                       // IAU 2012 Resolution B2 (exact)
constexpr double kParsec_m = kAu_m * 648000.0 / kPi;           // IAU 2015 Resolution B2
constexpr const char* kSizeHint =
    "give one of --diameter-mas, --diameter-arcsec, --diameter-deg, or --linear-diameter-km with one of "
    "--distance-pc, --distance-au, --distance-km";

// The angular diameter (rad) from whichever form the user gave; exactly one form is allowed.
double angular_diameter_rad(const po::variables_map& vm) {
  struct Form {
    const char* option;
    double to_rad;
  };
  const Form forms[] = {{"diameter-mas", kMasToRad}, {"diameter-arcsec", kArcsecToRad}, {"diameter-deg", kDegToRad}};
  const Form* chosen = nullptr;
  int count = vm.count("linear-diameter-km") ? 1 : 0;
  for (const auto& f : forms)
    if (vm.count(f.option)) {
      chosen = &f;
      ++count;
    }
  if (count == 0) throw InputError("source size", "no diameter given", kSizeHint);
  if (count > 1) throw InputError("source size", "more than one diameter given", kSizeHint);
  if (chosen) return positive_option(vm, chosen->option, kSizeHint) * chosen->to_rad;

  const double diameter_m = positive_option(vm, "linear-diameter-km", kSizeHint) * 1e3;
  const Form distances[] = {{"distance-pc", kParsec_m}, {"distance-au", kAu_m}, {"distance-km", 1e3}};
  const Form* d = nullptr;
  int n = 0;
  for (const auto& f : distances)
    if (vm.count(f.option)) {
      d = &f;
      ++n;
    }
  if (n != 1) throw InputError("--linear-diameter-km", n == 0 ? "needs a distance" : "more than one distance given", kSizeHint);
  const double distance_m = positive_option(vm, d->option, kSizeHint) * d->to_rad;
  if (diameter_m >= distance_m)
    throw InputError("--linear-diameter-km", "the source is larger than its distance", "check the units of the diameter and distance");
  return 2.0 * std::atan(0.5 * diameter_m / distance_m);   // full angle subtended by a sphere's disk
}

struct Quantity {
  std::string column;   // snake_case with unit, for CSV
  double value;
  std::string meaning;  // for the human listing
};

int run_coherence(const po::variables_map& vm) {
  const double theta = angular_diameter_rad(vm);
  const double lambda = positive_option(vm, "wavelength-nm", "give the wavelength, e.g. --wavelength-nm 500") * kNmToM;
  const std::optional<double> mirror_m = vm.count("mirror-diameter-m")
      ? std::optional<double>(positive_option(vm, "mirror-diameter-m", "give the mirror diameter in metres"))
      : std::nullopt;
  const io::Format format = output_format(vm);

  const Model disk(ModelKind::UniformDisk, {theta});
  std::vector<Quantity> q{
      {"diameter_mas", theta * kRadToMas, "angular diameter of the uniform disk"},
      {"wavelength_nm", lambda / kNmToM, "wavelength"},
      {"coherence_radius_circle_m", coherence_radius_circle_m(theta, lambda),
       "radius lambda/(pi theta) inside which |gamma| >= 0.8801 (Born & Wolf §10.4.2)"},
      {"coherence_area_circle_m2", coherence_area_circle_m2(theta, lambda), "area of that circle, lambda^2/(pi theta^2)"},
      {"coherence_radius_integral_m", coherence_radius_integral_m(theta, lambda),
       "radius of a circle with the integral area, 2 lambda/(pi theta)"},
      {"coherence_area_integral_m2", coherence_area_integral_m2(theta, lambda),
       "integral of |gamma|^2 over the plane, 4 lambda^2/(pi theta^2) (Goodman §5.6)"},
      {"half_power_baseline_m", half_power_baseline_m(disk, lambda), "baseline where |V|^2 = 0.5 (x = 1.61634)"},
      {"first_null_baseline_m", first_null_baseline_m(disk, lambda), "first null of |V|^2, 1.21967 lambda/theta"},
  };
  ApertureEffect effect{};
  if (mirror_m) {
    // Beyond x = pi theta D / lambda ~ 2000 the quadrature gets slow and the average has reached its
    // asymptote: (integral coherence area) / (mirror area), to ~1e-3 relative (checked against the
    // quadrature at x = 5.8e4 in tests/astro/aperture_average_test.cpp).
    const double x_mirror = kPi * theta * *mirror_m / lambda;
    if (x_mirror > 2000) {
      effect.vis2_zero_baseline = coherence_area_integral_m2(theta, lambda) / (kPi * 0.25 * *mirror_m * *mirror_m);
      effect.loss = 1 - effect.vis2_zero_baseline;
      effect.matters = true;
    } else {
      effect = aperture_effect(disk, lambda, *mirror_m, *mirror_m);
    }
    q.push_back({"mirror_diameter_m", *mirror_m, "diameter of each of two mirrors"});
    q.push_back({"vis2_zero_baseline_mirrors", effect.vis2_zero_baseline,
                 "|V|^2 averaged over two such mirrors side by side (B = 0)"});
    q.push_back({"mirror_resolves", effect.matters ? 1.0 : 0.0,
                 "1 when a single mirror partly resolves the star (loss > 1 %)"});
  }

  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (format == io::Format::Csv) {
      io::Table wide;
      std::vector<io::Table::Cell> row;
      for (const auto& x : q) {
        wide.add_column(x.column);
        row.push_back(x.value);
      }
      wide.add_row(std::move(row));
      wide.write(out, io::Format::Csv);
      return;
    }
    io::Table listing;
    listing.add_column("quantity");
    listing.add_column("value", 8);
    listing.add_column("meaning");
    for (const auto& x : q) listing.add_row({x.column, x.value, x.meaning});
    listing.write(out, io::Format::Table);
    if (mirror_m) {
      out << "\n";
      const double first_order = aperture_loss_first_order(theta, lambda, *mirror_m, *mirror_m);
      if (!effect.matters)
        out << "A " << io::format_number(*mirror_m, 6) << " m mirror does not resolve the star: the zero-baseline\n"
            << "correlation drops by " << io::format_number(100 * effect.loss, 3) << " % (1 % threshold).\n";
      else if (effect.vis2_zero_baseline < 0.1)
        out << "A " << io::format_number(*mirror_m, 6) << " m mirror resolves the star almost completely: two such mirrors\n"
            << "side by side measure |V|^2 = " << io::format_number(effect.vis2_zero_baseline, 6)
            << ", about the integral coherence area divided by the mirror area.\n";
      else
        out << "A " << io::format_number(*mirror_m, 6) << " m mirror partly resolves the star: two such mirrors side by side\n"
            << "measure |V|^2 = " << io::format_number(effect.vis2_zero_baseline, 6) << " instead of 1 ("
            << io::format_number(100 * effect.loss, 3) << " % loss"
            << (first_order < 0.3 ? "; small-mirror estimate " + io::format_number(100 * first_order, 3) + " %" : std::string())
            << "), and every baseline's |V|^2 is smoothed over the mirror size.\n"
            << "Model it with aperture averaging rather than absorbing it into the zero-baseline correlation.\n";
    }
  });
  return 0;
}

const Register reg{Command{
    "coherence",
    "coherence radius and area of a star's light, first-null and half-power baselines, mirror resolution",
    "siiplan coherence (--diameter-mas D | --diameter-arcsec D | --diameter-deg D | --linear-diameter-km D "
    "--distance-pc|--distance-au|--distance-km R) --wavelength-nm L [--mirror-diameter-m M] [options]",
    "For a uniformly bright disk (the star) of angular diameter theta at wavelength lambda (van Cittert-Zernike\n"
    "theorem), prints the coherence radius and area under both definitions in use:\n"
    "  circle:   |gamma| >= 0.8801 within radius lambda/(pi theta); area lambda^2/(pi theta^2)\n"
    "  integral: area = integral of |gamma|^2 = 4 lambda^2/(pi theta^2), four times larger\n"
    "and the baselines of |V|^2 = 0.5 and of the first null. The source is given by its angular diameter, or by\n"
    "its linear diameter and distance. With --mirror-diameter-m, |V|^2 is averaged over all baselines between\n"
    "points of two such mirrors side by side; when that lowers the zero-baseline correlation by more than 1 %\n"
    "a single mirror partly resolves the star.\n\n"
    "Example (the Sun, common practice: about 900 um^2, a circle about 34 um across):\n"
    "  siiplan coherence --diameter-deg 0.53 --wavelength-nm 500\n"
    "  coherence_radius_circle_m    1.7205484e-05  radius lambda/(pi theta) inside which |gamma| >= 0.8801\n"
    "  coherence_area_circle_m2     9.3000153e-10  area of that circle, lambda^2/(pi theta^2)\n"
    "  coherence_area_integral_m2   3.7200061e-09  integral of |gamma|^2 over the plane, 4 lambda^2/(pi theta^2)\n"
    "CSV (--format csv) gives one row whose columns are the quantity names.",
    {},
    [](po::options_description& desc) {
      desc.add_options()
          ("diameter-mas", po::value<std::string>(), "angular diameter in milliarcseconds")
          ("diameter-arcsec", po::value<std::string>(), "angular diameter in arcseconds")
          ("diameter-deg", po::value<std::string>(), "angular diameter in degrees")
          ("linear-diameter-km", po::value<std::string>(), "linear diameter in km (with a distance)")
          ("distance-pc", po::value<std::string>(), "distance in parsecs")
          ("distance-au", po::value<std::string>(), "distance in astronomical units")
          ("distance-km", po::value<std::string>(), "distance in km")
          ("wavelength-nm", po::value<std::string>(), "wavelength in nm (required)")
          ("mirror-diameter-m", po::value<std::string>(), "mirror diameter in m: does one mirror partly resolve the star?");
      add_output_options(desc, false);
    },
    run_coherence}};

}  // namespace
}  // namespace siiplan::cli
