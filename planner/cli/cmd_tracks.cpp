// siiplan tracks: projected baselines, altitude and delays of one target over a night, per telescope pair.
#include <algorithm>
#include <cmath>
#include <ostream>
#include <sstream>

#include "astro/errors.hpp"
#include "astro/geometry.hpp"
#include "astro/night.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/catalog.hpp"
#include "io/svg_plot.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/observing_options.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

struct PairInfo {
  std::string label;
  int i, j;
  double limit_rad;   // the higher of the two telescopes' altitude limits
  double length_m;
};

struct Step {
  JulianDate utc;
  Apparent where;
};

int run_tracks(const po::variables_map& vm) {
  Site site = load_site(vm);
  auto tels = load_array(vm, site);
  if (tels.size() < 2)
    throw InputError("--array", "the array has only one telescope", "an intensity interferometer needs at least two");
  Target target = load_target(vm);
  TimeSpan span = load_time_span(vm, site);
  io::Format format = output_format(vm);

  std::vector<PairInfo> pairs;
  for (auto p : all_pairs(tels.size())) {
    auto lim = [&](const Telescope& t) { return std::isnan(t.min_altitude_rad) ? site.min_altitude_rad : t.min_altitude_rad; };
    const auto& a = tels[p.i];
    const auto& b = tels[p.j];
    pairs.push_back({a.name + "-" + b.name, p.i, p.j, std::max(lim(a), lim(b)),
                     std::hypot(b.east_m - a.east_m, b.north_m - a.north_m, b.up_m - a.up_m)});
  }

  // With --night: the dark window (Sun below -18 deg); with --start/--end: exactly that span.
  std::ostringstream notes;
  JulianDate from = span.start_utc, to = span.end_utc;
  if (span.night) {
    NightSummary night = night_summary(site, *span.night);
    warn_dubious_year(night.dubious_year);
    if (night.astronomical.kind == Interval::Kind::None) {
      notes << "No dark time at " << site.name << " on the " << span.label << ": " << describe_no_dark(night)
            << ".\nNothing to compute; use --start/--end to follow the target through twilight or daylight.\n";
    } else {
      from = night.astronomical.begin;
      to = night.astronomical.end;
      notes << "Dark time (Sun below -18 deg): " << format_utc(from) << " to " << format_utc(to)
            << (night.astronomical.kind == Interval::Kind::Whole ? " (polar night: dark all through the window)" : "")
            << '\n';
    }
    if (night.astronomical.kind == Interval::Kind::None) from = to;   // no samples
  }

  std::vector<Step> steps;
  bool dubious = false;
  if (seconds_between(from, to) > 0)
    for (auto t : sample_times(from, to, span.step_s, sample_grid(span))) {
      Epoch e(site, t);
      dubious = dubious || e.dubious_year();
      steps.push_back({t, e.star(target.position)});
    }
  warn_dubious_year(dubious);

  io::Table rows;
  for (auto [name, p] : {std::pair{"time_utc", 0}, {"mjd_utc", 12}, {"pair", 0}, {"alt_deg", 4}, {"az_deg", 4},
                         {"ha_h", 5}, {"airmass", 4}, {"u_m", 6}, {"v_m", 6}, {"w_m", 6}, {"baseline_m", 6},
                         {"pa_deg", 5}, {"delay_ns", 6}, {"delay_rate_ns_per_s", 5}})
    rows.add_column(name, p);
  struct Range {
    int n = 0;
    double bmin = INFINITY, bmax = -INFINITY, dmin = INFINITY, dmax = -INFINITY, rate_max = 0;
    JulianDate first, last;
  };
  std::vector<Range> ranges(pairs.size());
  // Plot data: (u,v) per pair, altitude over the span.
  std::vector<std::vector<double>> plot_u(pairs.size()), plot_v(pairs.size());
  for (const auto& s : steps) {
    for (std::size_t k = 0; k < pairs.size(); ++k) {
      const auto& p = pairs[k];
      if (s.where.alt_refracted_rad < p.limit_rad) continue;
      Uvw uvw = baseline_uvw(tels[p.i], tels[p.j], site.lat_rad, s.where.ha_rad, s.where.dec_rad);
      double delay_ns = uvw.delay_s() * 1e9, rate = delay_rate(uvw, s.where.dec_rad) * 1e9;
      rows.add_row({format_utc(s.utc), s.utc.mjd(), p.label, s.where.alt_rad * kRadToDeg, s.where.az_rad * kRadToDeg,
                    s.where.ha_rad / kHourToRad, s.where.airmass, uvw.u_m, uvw.v_m, uvw.w_m, uvw.projected_m(),
                    uvw.pa_rad() * kRadToDeg, delay_ns, rate});
      auto& r = ranges[k];
      if (r.n++ == 0) r.first = s.utc;
      r.last = s.utc;
      r.bmin = std::min(r.bmin, uvw.projected_m());
      r.bmax = std::max(r.bmax, uvw.projected_m());
      r.dmin = std::min(r.dmin, delay_ns);
      r.dmax = std::max(r.dmax, delay_ns);
      r.rate_max = std::max(r.rate_max, std::fabs(rate));
      plot_u[k].push_back(uvw.u_m);
      plot_v[k].push_back(uvw.v_m);
    }
  }

  // Where the target stands over the span.
  const Step* highest = nullptr;
  for (const auto& s : steps)
    if (!highest || s.where.alt_rad > highest->where.alt_rad) highest = &s;
  std::ostringstream where_text;
  where_text << "Target: " << target.name << " (ICRS J2000 RA " << io::format_ra(target.position.ra_rad) << ", Dec "
             << io::format_dec(target.position.dec_rad) << ")\nSite: " << site.name << ", " << span.label << '\n'
             << notes.str();
  if (highest) {
    where_text << "Highest in the span: " << io::format_number(highest->where.alt_rad * kRadToDeg, 4) << " deg at "
               << format_utc(highest->utc) << " (hour angle " << io::format_number(highest->where.ha_rad / kHourToRad, 3)
               << " h)\n";
  }
  if (!steps.empty() && rows.rows() == 0)
    where_text << "The target never rises above the telescopes' altitude limit ("
               << io::format_number(site.min_altitude_rad * kRadToDeg, 3) << " deg at the site) in this span.\n";

  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (format == io::Format::Csv) {
      rows.write(out, io::Format::Csv);
      return;
    }
    out << where_text.str() << '\n';
    io::Table summary;
    for (auto [name, p] : {std::pair{"pair", 0}, {"length_m", 6}, {"steps", 0}, {"first_utc", 0}, {"last_utc", 0},
                           {"baseline_min_m", 5}, {"baseline_max_m", 5}, {"delay_min_ns", 5}, {"delay_max_ns", 5},
                           {"max_rate_ns_per_s", 4}})
      summary.add_column(name, p);
    for (std::size_t k = 0; k < pairs.size(); ++k) {
      const auto& r = ranges[k];
      if (r.n == 0)
        summary.add_row({pairs[k].label, pairs[k].length_m, 0LL, std::string("-"), std::string("-"), std::string("-"),
                         std::string("-"), std::string("-"), std::string("-"), std::string("-")});
      else
        summary.add_row({pairs[k].label, pairs[k].length_m, (long long)r.n, format_utc(r.first), format_utc(r.last),
                         r.bmin, r.bmax, r.dmin, r.dmax, r.rate_max});
    }
    summary.write(out, io::Format::Table);
    out << "\nSteps of " << io::format_number(span.step_s / 60, 4)
        << " min while the target is above both telescopes' altitude limits; baseline = projected length "
           "sqrt(u^2+v^2); delay = w/c, positive when the wavefront reaches the second telescope first. "
           "Use --format csv for every step.\n";
    if (rows.rows() > 0) out << '\n' << kSafetyNotice << '\n';
  });

  if (auto plot = plot_path(vm)) {
    io::Plot uv;
    uv.title = "(u,v) tracks: " + target.name;
    uv.x_label = "u (m, East)";
    uv.y_label = "v (m, North)";
    uv.equal_aspect = true;
    for (std::size_t k = 0; k < pairs.size(); ++k) {
      if (plot_u[k].empty()) continue;
      std::string color = io::palette_color(k);
      io::PlotSeries plus{pairs[k].label, plot_u[k], plot_v[k], {}, io::PlotSeries::Style::Line, color, false};
      io::PlotSeries minus{"", {}, {}, {}, io::PlotSeries::Style::Line, color, true};
      for (std::size_t n = 0; n < plot_u[k].size(); ++n) {
        minus.x.push_back(-plot_u[k][n]);
        minus.y.push_back(-plot_v[k][n]);
      }
      uv.series.push_back(std::move(plus));
      uv.series.push_back(std::move(minus));
    }
    io::Plot alt;
    alt.title = "Altitude: " + target.name;
    JulianDate day0{steps.empty() ? span.start_utc.jd1 : steps.front().utc.jd1, 0.0};
    alt.x_label = "hours UTC from " + format_utc(day0).substr(0, 10) + " 0h";
    alt.y_label = "altitude (deg)";
    io::PlotSeries curve{"geometric altitude", {}, {}, {}, io::PlotSeries::Style::Line, "", false};
    for (const auto& s : steps) {
      curve.x.push_back(seconds_between(day0, s.utc) / 3600);
      curve.y.push_back(s.where.alt_rad * kRadToDeg);
    }
    alt.series.push_back(std::move(curve));
    alt.markers.push_back({site.min_altitude_rad * kRadToDeg, "site limit", false});
    alt.y_min = 0;
    alt.y_max = 90;
    std::string svg = io::combine_svgs({uv.render(560, 520), alt.render(560, 520)}, 560, 520, 2);
    io::write_text_atomically(*plot, [&](std::ostream& out) { out << svg; });
  }
  return 0;
}

const Register reg{Command{
    "tracks",
    "projected baselines (u,v,w), altitude and delays of a target over a night, per telescope pair",
    "siiplan tracks --site FILE --array FILE (--ra RA --dec DEC | --target NAME --catalog FILE) "
    "(--night YYYY-MM-DD | --start UTC --end UTC) [options]",
    "For every time step and every telescope pair the target is above both telescopes' altitude limits\n"
    "(refracted altitude against min_altitude_deg): the projected baseline (u,v,w) in metres (u East, v North,\n"
    "w towards the target; Thompson, Moran & Swenson 2017, eq. 4.1) from the unrefracted apparent hour angle\n"
    "and declination, its length and position angle (east of north), the geometric delay w/c and its rate.\n"
    "The pair A-B is the baseline from A to B; a positive delay means the wavefront reaches B first.\n"
    "--night uses the dark time of that night (Sun below -18 deg); --start/--end use exactly that span.\n"
    "--format csv gives one row per step and pair: time_utc, mjd_utc, pair, alt_deg (geometric), az_deg\n"
    "(north through east), ha_h, airmass (Kasten & Young 1989), u_m, v_m, w_m, baseline_m, pa_deg, delay_ns,\n"
    "delay_rate_ns_per_s. The table form summarises each pair.\n\n"
    "Example:\n  siiplan tracks --site catalogs-demo/site.ini --array catalogs-demo/array-large.csv \\\n"
    "      --target Kelvane --catalog catalogs-demo/targets.csv --night 2026-03-14 --plot tracks.svg\n"
    "  (or give the position directly: --ra 06:15:21.5 --dec -56:54:19.1)",
    {},
    [](po::options_description& desc) {
      add_site_option(desc);
      add_array_option(desc);
      add_target_options(desc);
      add_time_options(desc, 10);
      add_output_options(desc, true);
    },
    run_tracks}};

}  // namespace
}  // namespace siiplan::cli
