// siiplan night: plan one observing night for a catalog of targets and write the schedule, the
// per-pair resolution table, the plan file for `simulate`, and an HTML report.
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iostream>
#include <set>
#include <thread>

#include "astro/errors.hpp"
#include "astro/resolve.hpp"
#include "astro/time.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/catalog_fits.hpp"
#include "io/csv.hpp"
#include "io/ini.hpp"
#include "io/instrument_io.hpp"
#include "io/plan_h5.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/observing_options.hpp"
#include "planner/night_outputs.hpp"
#include "planner/night_plan.hpp"

namespace siiplan::cli {
namespace {

using astro::kDegToRad;

// Constraint keys: option name, [constraints] key in the site file.
struct ConstraintKey {
  const char* option;
  const char* ini;
};
constexpr ConstraintKey kKeys[] = {
    {"min-altitude-deg", "min_altitude_deg"},     {"sun-max-altitude-deg", "sun_max_altitude_deg"},
    {"moon-min-separation-deg", "moon_min_separation_deg"}, {"moonlit", "moonlit"},
    {"slot-min", "slot_min"},                     {"min-block-min", "min_block_min"},
    {"slew-deg-per-s", "slew_deg_per_s"},         {"slew-s", "slew_s"},
    {"setup-min", "setup_min"}};

void describe_night(po::options_description& desc) {
  add_site_option(desc);
  add_array_option(desc);
  desc.add_options()
      ("instrument", po::value<std::string>(), "instrument file (INI, [instrument] section)")
      ("catalog", po::value<std::string>(),
       "target catalog: CSV, or FITS binary table (.fits/.fit/.fts): name, ra, dec, [mag_b, mag_v, diameter_mas, model, "
       "limb_u, teff_k, priority, goal_pct, ...]")
      ("date", po::value<std::string>(), "the night that begins on the local evening of YYYY-MM-DD")
      ("out", po::value<std::string>(), "output directory (created if needed) for schedule.csv, baselines.csv, plan.h5, report.html")
      ("min-altitude-deg", po::value<std::string>(), "lowest target altitude (default: the site's min_altitude_deg; telescopes may have higher limits)")
      ("sun-max-altitude-deg", po::value<std::string>(), "darkness: the Sun below this altitude (default -18, astronomical twilight)")
      ("moon-min-separation-deg", po::value<std::string>(), "smallest target-Moon angle while the Moon is up (default 10)")
      ("moonlit", po::value<std::string>(), "'yes' (default) to observe while the Moon is up, 'no' to use only moonless dark time")
      ("slot-min", po::value<std::string>(), "time resolution of the plan in minutes (default 5)")
      ("min-block-min", po::value<std::string>(), "shortest block on one target in minutes (default 20)")
      ("slew-deg-per-s", po::value<std::string>(), "slew rate used for target changes, degrees per second (default 1)")
      ("slew-s", po::value<std::string>(), "fixed slew time in seconds for every target change (instead of --slew-deg-per-s)")
      ("setup-min", po::value<std::string>(), "setup per target change in minutes: calibration, zero-baseline or dark run (default 5)")
      ("threads", po::value<std::string>(), "worker threads (default: all cores); the plan does not depend on it");
}

// A constraint value: option, else [constraints] in the site file, else the default.
struct ConstraintSource {
  const po::variables_map& vm;
  const io::IniFile& ini;
  double number(const ConstraintKey& k, double fallback) const {
    if (vm.count(k.option)) return number_option(vm, k.option, "");
    std::string key = std::string("constraints.") + k.ini;
    return ini.has(key) ? ini.number(key, "") : fallback;
  }
  bool yes_no(const ConstraintKey& k, bool fallback) const {
    std::string text, where;
    if (vm.count(k.option)) {
      text = vm[k.option].as<std::string>();
      where = std::string("--") + k.option;
    } else if (auto v = ini.text(std::string("constraints.") + k.ini)) {
      text = *v;
      where = ini.where(std::string("constraints.") + k.ini);
    } else {
      return fallback;
    }
    if (text == "yes") return true;
    if (text == "no") return false;
    throw InputError(where, "'" + text + "' is not yes or no", "write yes or no");
  }
};

planner::NightConstraints load_constraints(const po::variables_map& vm, const std::string& site_path, const astro::Site& site) {
  io::IniFile ini = io::IniFile::read(site_path);
  std::set<std::string> known;
  for (const auto& k : kKeys) known.insert(k.ini);
  for (const auto& k : ini.unknown_keys("constraints", known)) warn(ini.where(k) + ": unknown key '" + k + "' ignored");
  ConstraintSource src{vm, ini};
  planner::NightConstraints c;
  c.min_altitude_rad = src.number(kKeys[0], site.min_altitude_rad / kDegToRad) * kDegToRad;
  c.sun_max_altitude_rad = src.number(kKeys[1], c.sun_max_altitude_rad / kDegToRad) * kDegToRad;
  c.moon_min_separation_rad = src.number(kKeys[2], c.moon_min_separation_rad / kDegToRad) * kDegToRad;
  c.allow_moonlit = src.yes_no(kKeys[3], c.allow_moonlit);
  c.slot_s = src.number(kKeys[4], c.slot_s / 60) * 60;
  c.min_block_s = src.number(kKeys[5], c.min_block_s / 60) * 60;
  c.slew_deg_per_s = src.number(kKeys[6], c.slew_deg_per_s);
  c.fixed_slew_s = src.number(kKeys[7], c.fixed_slew_s);
  c.setup_s = src.number(kKeys[8], c.setup_s / 60) * 60;
  if (vm.count("slew-s") && !(c.fixed_slew_s >= 0))
    throw InputError("--slew-s", "must be zero or more", "the fixed slew time in seconds");
  auto problems = planner::validate(c);
  if (!problems.empty())
    throw InputError("constraints", problems.front(), "change the option or the [constraints] key in " + site_path);
  return c;
}

int run_night(const po::variables_map& vm) {
  planner::NightInputs in;
  const std::string site_path = text_option(vm, "site", "give the site file, e.g. --site catalogs-demo/site.ini");
  in.site = load_site(vm);
  in.telescopes = load_array(vm, in.site);
  if (in.telescopes.size() < 2)
    throw InputError("--array", "the array has only one telescope", "an intensity interferometer needs at least two");
  std::vector<std::string> warnings;
  in.instrument = io::read_instrument(text_option(vm, "instrument", "give the instrument file, e.g. --instrument catalogs-demo/instrument-large.ini"), &warnings);
  for (const auto& w : warnings) warn(w);
  in.targets = load_catalog(vm);
  const std::string date_text = text_option(vm, "date", "the night's evening date, e.g. --date 2026-03-14");
  in.date = astro::parse_date(date_text, "--date");
  in.constraints = load_constraints(vm, site_path, in.site);
  const std::string out_text = text_option(vm, "out", "an output directory, e.g. --out demo-out/night");
  unsigned cores = std::max(1u, std::thread::hardware_concurrency());
  double threads = number_or(vm, "threads", cores);
  if (!(threads >= 1 && threads <= 1024 && threads == std::floor(threads)))
    throw InputError("--threads", "must be a whole number from 1 to 1024", "the number of worker threads");
  in.threads = int(threads);

  const std::filesystem::path out(out_text);
  std::error_code ec;
  if (std::filesystem::exists(out) && !std::filesystem::is_directory(out))
    throw InputError("--out", "'" + out_text + "' exists and is not a directory", "give a directory");
  std::filesystem::create_directories(out, ec);
  if (ec) throw RuntimeFailure(out_text, "cannot create the output directory: " + ec.message(), "check the path and permissions");

  const bool tty = isatty(STDERR_FILENO) != 0;
  auto progress = [&](std::size_t done, std::size_t total) {
    if (tty && (done % 50 == 0 || done == total))
      std::cerr << "\rsiiplan: targets " << done << "/" << total << (done == total ? "\n" : "") << std::flush;
  };
  planner::NightPlan plan = planner::plan_night(in, progress);
  warn_dubious_year(plan.grid.dubious_year);
  planner::NightProducts products = planner::make_products(in, plan, date_text, SIIPLAN_VERSION);

  io::write_text_atomically(out / "schedule.csv", [&](std::ostream& s) { products.schedule.write(s, io::Format::Csv); });
  io::write_text_atomically(out / "baselines.csv", [&](std::ostream& s) { products.baselines.write(s, io::Format::Csv); });
  io::write_plan_h5(out / "plan.h5", products.plan_file);
  io::write_text_atomically(out / "report.html", [&](std::ostream& s) {
    s << planner::night_report_html(in, plan, products, date_text, kSafetyNotice);
  });

  std::cout << planner::summary_header(in, plan);
  bool any_observable = false;
  for (const auto& st : plan.status) any_observable = any_observable || st.reason.empty();
  if (plan.grid.has_dark_time && !any_observable)
    std::cout << "No target of the catalog is observable on this night (reasons in the table and the report).\n";
  std::cout << '\n';
  products.summary.write(std::cout, io::Format::Table);
  std::cout << "\nDiameters marked 'estimated' come from mag_v and teff_k (bolometric flux; see the report).\n"
            << "Baseline verdicts: " << astro::resolve_criterion_text() << "\n"
            << "Written: " << (out / "schedule.csv").string() << ", " << (out / "baselines.csv").string() << ", "
            << (out / "plan.h5").string() << ", " << (out / "report.html").string() << "\n\n"
            << kSafetyNotice << '\n';
  return 0;
}

const Register reg{Command{
    "night",
    "plan an observing night: which targets when, which pairs resolve them, predicted diameter precision",
    "siiplan night --site FILE --array FILE --instrument FILE --catalog FILE --date YYYY-MM-DD --out DIR [constraints]",
    "Plans the dark time of one night (Sun below --sun-max-altitude-deg) in slots of --slot-min. For every target and\n"
    "slot it checks altitude (and each telescope's own limit), the Moon, and computes the Fisher information on the\n"
    "diameter from every usable pair's |V|^2 and its predicted noise. The schedule maximises the priority-weighted\n"
    "number of targets reaching their goal_pct (sigma_theta/theta), then the information on the rest, charging setup\n"
    "and slew time at each target change; it is compared with the simple schedule (highest priority first).\n"
    "Constraints may also be given in a [constraints] section of the site file (min_altitude_deg, sun_max_altitude_deg,\n"
    "moon_min_separation_deg, moonlit, slot_min, min_block_min, slew_deg_per_s, slew_s, setup_min); options win.\n\n"
    "Example:\n  siiplan night --site catalogs-demo/site.ini --array catalogs-demo/array-large.csv \\\n"
    "    --instrument catalogs-demo/instrument-large.ini --catalog catalogs-demo/targets.csv --date 2026-03-05 --out night",
    {},
    describe_night,
    run_night}};

}  // namespace
}  // namespace siiplan::cli
