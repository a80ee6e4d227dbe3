// siiplan sky: the night at a site: Sun and Moon events, twilight, dark time, and altitudes through the night.
#include <algorithm>
#include <cmath>
#include <ostream>
#include <sstream>

#include "astro/errors.hpp"
#include "astro/geometry.hpp"
#include "astro/night.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/svg_plot.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/observing_options.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

// "Dark", "astronomical", ... for a solar altitude (geometric).
const char* sky_phase(double sun_alt_rad) {
  if (sun_alt_rad >= kSunriseAltitude_rad) return "day";
  if (sun_alt_rad >= kCivilTwilight_rad) return "civil";
  if (sun_alt_rad >= kNauticalTwilight_rad) return "nautical";
  if (sun_alt_rad >= kAstronomicalTwilight_rad) return "astronomical";
  return "dark";
}

std::string local_hhmm(const Site& site, JulianDate t) {
  return format_utc(add_seconds(t, site.utc_offset_h * 3600)).substr(11, 5);
}

std::string utc_offset_text(double h) {
  if (h == 0) return "UTC";
  std::ostringstream o;
  o << "UTC" << (h > 0 ? "+" : "") << io::format_number(h, 4);
  return o.str();
}

// Events in time order, and statements for thresholds the Sun never (or always) crosses.
struct Events {
  std::vector<std::pair<JulianDate, std::string>> timed;
  std::vector<std::string> statements;
  void add_interval(const Interval& iv, const std::string& begins, const std::string& ends, const std::string& never,
                    const std::string& always) {
    if (iv.kind == Interval::Kind::None) statements.push_back(never);
    if (iv.kind == Interval::Kind::Whole) statements.push_back(always);
    if (iv.kind != Interval::Kind::Part) return;
    if (!iv.begin_is_edge) timed.push_back({iv.begin, begins});
    if (!iv.end_is_edge) timed.push_back({iv.end, ends});
  }
  void write(std::ostream& out, const Site& site) {
    std::stable_sort(timed.begin(), timed.end(),
                     [](auto& a, auto& b) { return seconds_between(b.first, a.first) < 0; });
    for (auto& [t, what] : timed)
      out << "  " << what << std::string(what.size() < 34 ? 34 - what.size() : 1, ' ') << format_utc(t) << "  ("
          << local_hhmm(site, t) << " local)\n";
    for (const auto& s : statements) out << "  " << s << '\n';
  }
};

int run_sky(const po::variables_map& vm) {
  Site site = load_site(vm);
  TimeSpan span = load_time_span(vm, site);
  std::optional<Target> target;
  if (vm.count("ra") || vm.count("dec") || vm.count("target")) target = load_target(vm);
  io::Format format = output_format(vm);

  NightSummary night = span.night ? night_summary(site, *span.night)
                                  : night_summary(site, NightWindow{span.start_utc, span.end_utc});
  warn_dubious_year(night.dubious_year);

  io::Table table;
  std::vector<std::pair<std::string, int>> cols{{"time_utc", 0}, {"mjd_utc", 12}, {"local", 0}, {"sky", 0},
                                                {"sun_alt_deg", 4}, {"moon_alt_deg", 4}, {"moon_illuminated", 3}};
  if (target)
    for (auto c : {std::pair<std::string, int>{"target_alt_deg", 4}, {"target_airmass", 4}, {"moon_sep_deg", 4}})
      cols.push_back(c);
  for (auto& [name, p] : cols) table.add_column(name, p);
  io::PlotSeries sun_curve{"Sun", {}, {}, {}, io::PlotSeries::Style::Line, "#b08800", false};
  io::PlotSeries moon_curve{"Moon", {}, {}, {}, io::PlotSeries::Style::Line, "#777777", true};
  io::PlotSeries target_curve{target ? target->name : "", {}, {}, {}, io::PlotSeries::Style::Line, "#1f5fa8", false};
  JulianDate day0{span.start_utc.jd1, 0.0};
  bool dubious = false;
  for (auto t : sample_times(night.window.start_utc, night.window.end_utc, span.step_s, SampleGrid::RoundTimes)) {
    Epoch e(site, t);
    dubious = dubious || e.dubious_year();
    Apparent sun = e.sun(), moon = e.moon();
    std::vector<io::Table::Cell> row{format_utc(t), t.mjd(), local_hhmm(site, t), std::string(sky_phase(sun.alt_rad)),
                                     sun.alt_rad * kRadToDeg, moon.alt_rad * kRadToDeg, e.moon_illuminated_fraction()};
    double hours = seconds_between(day0, t) / 3600;
    sun_curve.x.push_back(hours);
    sun_curve.y.push_back(sun.alt_rad * kRadToDeg);
    moon_curve.x.push_back(hours);
    moon_curve.y.push_back(moon.alt_rad * kRadToDeg);
    if (target) {
      Apparent a = e.star(target->position);
      row.push_back(a.alt_rad * kRadToDeg);
      row.push_back(a.airmass);
      row.push_back(e.moon_separation_rad(target->position) * kRadToDeg);
      target_curve.x.push_back(hours);
      target_curve.y.push_back(a.alt_rad * kRadToDeg);
    }
    table.add_row(std::move(row));
  }
  warn_dubious_year(dubious);

  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (format == io::Format::Csv) {
      table.write(out, io::Format::Csv);
      return;
    }
    out << "Site: " << site.name << " (latitude " << io::format_number(site.lat_rad * kRadToDeg, 8) << " deg, longitude "
        << io::format_number(site.lon_east_rad * kRadToDeg, 8) << " deg east, " << io::format_number(site.height_m, 6)
        << " m), " << span.label << "\nWindow " << format_utc(night.window.start_utc) << " to "
        << format_utc(night.window.end_utc) << "; times in UTC, local = " << utc_offset_text(site.utc_offset_h) << "\n\n";
    Events events;
    events.add_interval(night.sun_down, "sunset", "sunrise",
                        "The Sun does not set (midnight sun; lowest altitude " +
                            io::format_number(night.sun_min_alt_rad * kRadToDeg, 3) + " deg).",
                        "The Sun does not rise (polar night; highest altitude " +
                            io::format_number(night.sun_max_alt_rad * kRadToDeg, 3) + " deg).");
    events.add_interval(night.civil, "civil twilight ends (-6 deg)", "civil twilight begins",
                        "The Sun never gets below -6 deg.", "The Sun stays below -6 deg all through the window.");
    events.add_interval(night.nautical, "nautical twilight ends (-12 deg)", "nautical twilight begins",
                        "The Sun never gets below -12 deg.", "The Sun stays below -12 deg all through the window.");
    events.add_interval(night.astronomical, "dark time begins (-18 deg)", "dark time ends (-18 deg)",
                        "No dark time: " + describe_no_dark(night) + ".",
                        "Dark all through the window (the Sun stays below -18 deg).");
    for (const auto& c : night.moon) events.timed.push_back({c.utc, c.rising ? "moonrise" : "moonset"});
    if (night.moon.empty())
      events.statements.push_back(Epoch(site, night.middle_utc).moon().alt_rad > kMoonriseAltitude_rad
                                      ? "The Moon is up all through the window."
                                      : "The Moon stays below the horizon all through the window.");
    events.write(out, site);
    if (night.astronomical.kind != Interval::Kind::None)
      out << "  dark time                         "
          << io::format_number(seconds_between(night.astronomical.begin, night.astronomical.end) / 3600, 3) << " h\n";
    out << "  Moon illuminated                  " << io::format_number(100 * night.moon_illuminated_fraction, 3)
        << " % (at " << format_utc(night.middle_utc) << ")\n\n";
    table.write(out, io::Format::Table);
    out << "\nAltitudes are geometric (no refraction); sunrise/sunset and moonrise/moonset refer to the upper limb "
           "with standard refraction (centre at -0 deg 50'), twilights to the Sun's centre.\n";
    if (night.astronomical.kind != Interval::Kind::None) out << '\n' << kSafetyNotice << '\n';
  });

  if (auto plot = plot_path(vm)) {
    io::Plot p;
    p.title = "Sky over " + site.name + ", " + span.label;
    p.x_label = "hours UTC from " + format_utc(day0).substr(0, 10) + " 0h";
    p.y_label = "altitude (deg)";
    p.y_min = -60;
    p.y_max = 90;
    auto hours = [&](JulianDate t) { return seconds_between(day0, t) / 3600; };
    auto shade = [&](const Interval& iv, const char* color, const char* label) {
      if (iv.kind != Interval::Kind::None) p.shades.push_back({hours(iv.begin), hours(iv.end), color, label});
    };
    shade(night.civil, "#e4e4ee", "civil");
    shade(night.nautical, "#c8c8dc", "nautical");
    shade(night.astronomical, "#a0a0c0", "dark");
    p.series.push_back(std::move(sun_curve));
    p.series.push_back(std::move(moon_curve));
    if (target) p.series.push_back(std::move(target_curve));
    p.markers.push_back({0.0, "horizon", false});
    p.markers.push_back({site.min_altitude_rad * kRadToDeg, "limit", false, "#2b8a3e"});
    for (const auto& c : night.moon) p.markers.push_back({hours(c.utc), c.rising ? "moonrise" : "moonset", true});
    std::string svg = p.render(900, 460);
    io::write_text_atomically(*plot, [&](std::ostream& out) { out << svg; });
  }
  return 0;
}

const Register reg{Command{
    "sky",
    "sunset, twilights, dark time, Moon rise/set and illumination, and altitudes through a night",
    "siiplan sky --site FILE (--night YYYY-MM-DD | --start UTC --end UTC) [--ra RA --dec DEC | --target NAME "
    "--catalog FILE] [options]",
    "The Sun's and Moon's events for the night that begins on the local evening of --night (local mean noon to\n"
    "noon), or for the --start/--end span: sunset and sunrise (upper limb, -0 deg 50'), the ends of civil,\n"
    "nautical and astronomical twilight (-6/-12/-18 deg), the dark time (Sun below -18 deg), moonrise and\n"
    "moonset, and the Moon's illuminated fraction (Meeus eq. 48.1). A table follows with the Sun's and Moon's\n"
    "geometric altitude every --step-min minutes and, with a target, its altitude, airmass and distance from\n"
    "the Moon. Polar night and midnight sun are stated as such.\n\n"
    "Example:\n  siiplan sky --site catalogs-demo/site.ini --night 2026-03-14 --target Kelvane \\\n"
    "      --catalog catalogs-demo/targets.csv --plot sky.svg",
    {},
    [](po::options_description& desc) {
      add_site_option(desc);
      add_time_options(desc, 30);
      add_target_options(desc);
      add_output_options(desc, true);
    },
    run_sky}};

}  // namespace
}  // namespace siiplan::cli
