#include "planner/cli/observing_options.hpp"

#include <cmath>

#include "astro/errors.hpp"
#include "astro/night.hpp"
#include "astro/units.hpp"
#include "io/table.hpp"
#include "io/catalog.hpp"
#include "io/catalog_fits.hpp"
#include "io/site_io.hpp"

namespace siiplan::cli {

void add_site_option(po::options_description& desc) {
  desc.add_options()("site", po::value<std::string>(),
                     "site file (INI, [site] section: name, latitude_deg, longitude_deg (east +), height_m, ...)");
}

astro::Site load_site(const po::variables_map& vm) {
  std::string path = text_option(vm, "site", "give the site file, e.g. --site catalogs-demo/site.ini");
  std::vector<std::string> warnings;
  astro::Site site = io::read_site(path, &warnings);
  for (const auto& w : warnings) warn(w);
  return site;
}

void add_array_option(po::options_description& desc) {
  desc.add_options()("array", po::value<std::string>(),
                     "telescope array file (CSV: name, east_m,north_m,up_m or latitude_deg,longitude_deg,height_m, "
                     "diameter_m, [area_m2], [min_altitude_deg])");
}

std::vector<astro::Telescope> load_array(const po::variables_map& vm, const astro::Site& site) {
  std::string path = text_option(vm, "array", "give the telescope file, e.g. --array catalogs-demo/array-large.csv");
  return io::read_array(path, site);
}

void add_target_options(po::options_description& desc) {
  desc.add_options()
      ("ra", po::value<std::string>(), "target right ascension, ICRS J2000: hours hh:mm:ss.s or degrees")
      ("dec", po::value<std::string>(), "target declination, ICRS J2000: +-dd:mm:ss.s or degrees")
      ("pmra-mas-per-yr", po::value<std::string>(), "proper motion in RA, mu_alpha* = mu_alpha cos(dec), mas/yr (default 0)")
      ("pmdec-mas-per-yr", po::value<std::string>(), "proper motion in Dec, mas/yr (default 0)")
      ("target", po::value<std::string>(), "name of the target in --catalog (instead of --ra/--dec)");
  if (!desc.find_nothrow("catalog", false)) add_catalog_option(desc);
}

void add_catalog_option(po::options_description& desc) {
  desc.add_options()("catalog", po::value<std::string>(),
                     "target catalog (CSV: name, ra, dec, [pmra_mas_per_yr, pmdec_mas_per_yr, mag_v, diameter_mas, ...])");
}

std::vector<astro::Target> load_catalog(const po::variables_map& vm) {
  return io::read_target_catalog(text_option(vm, "catalog", "give the target catalog, e.g. --catalog catalogs-demo/targets.csv"));
}

astro::Target load_target(const po::variables_map& vm) {
  bool by_coordinates = vm.count("ra") || vm.count("dec");
  bool by_name = vm.count("target") != 0;
  const std::string hint = "give either --ra and --dec, or --target NAME with --catalog FILE";
  if (by_coordinates && by_name) throw InputError("--target", "given together with --ra/--dec", hint);
  if (by_name) {
    std::string name = vm["target"].as<std::string>();
    if (!vm.count("catalog")) throw InputError("--target", "needs --catalog FILE to look the name up in", hint);
    for (const auto& t : load_catalog(vm))
      if (t.name == name) return t;
    throw InputError("--target", "'" + name + "' is not in " + vm["catalog"].as<std::string>(),
                     "names are matched exactly, including case");
  }
  if (!by_coordinates) throw InputError("--ra", "no target given", hint);
  if (!vm.count("ra")) throw InputError("--ra", "this option is required with --dec", hint);
  if (!vm.count("dec")) throw InputError("--dec", "this option is required with --ra", hint);
  astro::Target t;
  t.position.ra_rad = io::parse_ra_rad(vm["ra"].as<std::string>(), "--ra");
  t.position.dec_rad = io::parse_dec_rad(vm["dec"].as<std::string>(), "--dec");
  t.position.pmra_cosdec_rad_per_yr = number_or(vm, "pmra-mas-per-yr", 0) * astro::kMasToRad;
  t.position.pmdec_rad_per_yr = number_or(vm, "pmdec-mas-per-yr", 0) * astro::kMasToRad;
  t.name = "RA " + vm["ra"].as<std::string>() + " Dec " + vm["dec"].as<std::string>();
  t.diameter_estimated = true;
  t.diameter_note = "target given by coordinates";
  return t;
}

void add_time_options(po::options_description& desc, double default_step_min) {
  desc.add_options()
      ("night", po::value<std::string>(), "YYYY-MM-DD: the night that begins on the local evening of this date")
      ("start", po::value<std::string>(), "start of the span, ISO 8601 UTC (e.g. 2026-03-14T22:00:00); with --end")
      ("end", po::value<std::string>(), "end of the span, ISO 8601 UTC")
      ("step-min", po::value<std::string>()->default_value(io::format_number(default_step_min)),
       "time step in minutes");
}

TimeSpan load_time_span(const po::variables_map& vm, const astro::Site& site) {
  const std::string hint = "give --night YYYY-MM-DD, or --start and --end as ISO 8601 UTC times";
  TimeSpan span;
  span.step_s = positive_option(vm, "step-min", "time step in minutes, e.g. 5") * 60;
  bool dubious = false;
  if (vm.count("night")) {
    if (vm.count("start") || vm.count("end")) throw InputError("--night", "given together with --start/--end", hint);
    span.night = astro::parse_date(vm["night"].as<std::string>(), "--night");
    auto w = astro::night_window(site, *span.night);
    span.start_utc = w.start_utc;
    span.end_utc = w.end_utc;
    span.label = "night of " + vm["night"].as<std::string>();
    astro::tt_from_utc(w.start_utc, &dubious);
  } else {
    if (!vm.count("start") && !vm.count("end")) throw InputError("--night", "no time given", hint);
    if (!vm.count("start")) throw InputError("--start", "this option is required with --end", hint);
    if (!vm.count("end")) throw InputError("--end", "this option is required with --start", hint);
    span.start_utc = astro::parse_utc(vm["start"].as<std::string>(), "--start", &dubious);
    span.end_utc = astro::parse_utc(vm["end"].as<std::string>(), "--end", &dubious);
    if (!(astro::seconds_between(span.start_utc, span.end_utc) > 0))
      throw InputError("--end", "must be later than --start", hint);
    span.label = astro::format_utc(span.start_utc) + " to " + astro::format_utc(span.end_utc);
  }
  double length_s = astro::seconds_between(span.start_utc, span.end_utc);
  if (length_s > 31 * astro::kSecondsPerDay)
    throw InputError("--end", "the span is longer than 31 days", "split it into shorter spans");
  if (length_s / span.step_s > 200000)
    throw InputError("--step-min", "more than 200000 time steps", "use a larger step or a shorter span");
  warn_dubious_year(dubious);
  return span;
}

std::vector<astro::JulianDate> sample_times(astro::JulianDate start_utc, astro::JulianDate end_utc, double step_s,
                                            SampleGrid grid) {
  std::vector<astro::JulianDate> out;
  // jd1 is a whole day + 0.5 (0h UTC) for our instants
  const astro::JulianDate origin = grid == SampleGrid::RoundTimes ? astro::JulianDate{start_utc.jd1, 0.0} : start_utc;
  double from = astro::seconds_between(origin, start_utc), to = astro::seconds_between(origin, end_utc);
  for (double k = std::ceil(from / step_s - 1e-9); k * step_s <= to + 1e-6; ++k)
    out.push_back(astro::add_seconds(origin, k * step_s));
  if (out.empty()) out.push_back(start_utc);
  return out;
}

SampleGrid sample_grid(const TimeSpan& span) { return span.night ? SampleGrid::RoundTimes : SampleGrid::FromStart; }

std::string describe_no_dark(const astro::NightSummary& night) {
  std::string low = io::format_number(night.sun_min_alt_rad * astro::kRadToDeg, 3);
  if (night.sun_down.kind == astro::Interval::Kind::None)
    return "the Sun does not set (midnight sun; its lowest altitude is " + low + " deg)";
  return "the Sun never gets below -18 deg (twilight all night; its lowest altitude is " + low + " deg)";
}

void warn_dubious_year(bool dubious) {
  static bool warned = false;
  if (!dubious || warned) return;
  warned = true;
  warn("the date lies beyond the leap-second table built into ERFA (\"dubious year\"); times are computed "
       "assuming no leap second after the table's last entry, which may be off by a second if one is announced");
}

}  // namespace siiplan::cli
