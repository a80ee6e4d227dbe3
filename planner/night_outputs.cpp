#include "planner/night_outputs.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "astro/coherence.hpp"
#include "astro/models.hpp"
#include "astro/resolve.hpp"
#include "astro/time.hpp"
#include "astro/units.hpp"
#include "io/svg_plot.hpp"
#include "io/table.hpp"

namespace siiplan::planner {

namespace {

using astro::kRadToDeg;

std::string fmt(const char* format, double value) { return io::format_printf(format, value); }

std::string hhmm(astro::JulianDate t) { return astro::format_utc(t).substr(11, 5); }

double pct(double fraction) { return std::isfinite(fraction) ? 100 * fraction : NAN; }

// Hours since the start of the dark window (the report's time axis).
double hours_from(astro::JulianDate origin, astro::JulianDate t) { return astro::seconds_between(origin, t) / 3600; }

}  // namespace

std::string pair_label(const std::vector<astro::Telescope>& telescopes, const astro::TelescopePair& pair) {
  return telescopes[std::size_t(pair.i)].name + "-" + telescopes[std::size_t(pair.j)].name;
}

NightProducts make_products(const NightInputs& in, const NightPlan& plan, const std::string& date_text,
                            const std::string& version) {
  NightProducts out;
  const auto& ev = plan.result.plan;
  for (const auto& b : ev.blocks) out.blocks.push_back({b, block_samples(in, plan, b)});

  // schedule.csv
  for (auto [name, p] : {std::pair{"target", 0}, {"start_utc", 0}, {"end_utc", 0}, {"alt_start_deg", 4}, {"alt_end_deg", 4},
                         {"airmass_max", 4}, {"moon_sep_deg", 4}, {"predicted_sigma_theta_pct", 4}})
    out.schedule.add_column(name, p);
  for (const auto& sb : out.blocks) {
    const auto& b = sb.block;
    const auto& st = plan.status[std::size_t(b.target)];
    double airmass_max = 0, moon_sep_min = INFINITY;
    for (std::size_t k = 0; k < sb.samples.airmass.size(); ++k) {
      airmass_max = std::max(airmass_max, sb.samples.airmass[k]);
      moon_sep_min = std::min(moon_sep_min, sb.samples.moon_sep_rad[k]);
    }
    // the edges of a slot may reach a lower altitude than its middle
    for (int e = b.first_slot; e <= b.end_slot(); ++e)
      airmass_max = std::max(airmass_max, astro::airmass_kasten_young(st.alt_edge_rad[std::size_t(e)]));
    out.schedule.add_row({plan.targets[std::size_t(b.target)].name, astro::format_utc(plan.grid.edges_utc[std::size_t(b.first_slot)]),
                          astro::format_utc(plan.grid.edges_utc[std::size_t(b.end_slot())]),
                          st.alt_edge_rad[std::size_t(b.first_slot)] * kRadToDeg, st.alt_edge_rad[std::size_t(b.end_slot())] * kRadToDeg,
                          airmass_max, moon_sep_min * kRadToDeg, pct(ev.sigma_fraction[std::size_t(b.target)])});
  }

  // baselines.csv: per scheduled target and pair, over all the target's blocks
  for (auto [name, p] : {std::pair{"target", 0}, {"pair", 0}, {"baseline_min_m", 6}, {"baseline_max_m", 6}, {"pa_min_deg", 5},
                         {"pa_max_deg", 5}, {"vis2_min", 4}, {"vis2_max", 4}, {"snr", 4}, {"verdict", 0}})
    out.baselines.add_column(name, p);
  std::vector<int> scheduled;
  for (const auto& sb : out.blocks)
    if (std::find(scheduled.begin(), scheduled.end(), sb.block.target) == scheduled.end()) scheduled.push_back(sb.block.target);
  const double lambda = in.instrument.lambda_m;
  for (int t : scheduled) {
    const auto& model = plan.targets[std::size_t(t)].model;
    for (std::size_t p = 0; p < plan.pairs.size(); ++p) {
      PairSummary s;
      s.target = t;
      s.pair = p;
      s.baseline_min_m = s.pa_min_deg = s.vis2_min = INFINITY;
      s.baseline_max_m = s.pa_max_deg = s.vis2_max = -INFINITY;
      double weight = 0, weighted_vis2 = 0, exposure = 0, far_u = 0, far_v = 0;
      for (const auto& sb : out.blocks) {
        if (sb.block.target != t) continue;
        const std::size_t n = sb.samples.mid_utc.size();
        for (std::size_t k = 0; k < n; ++k) {
          std::size_t i = p * n + k;
          if (!sb.samples.usable[i]) continue;
          astro::Uvw uvw{sb.samples.u_m[i], sb.samples.v_m[i], sb.samples.w_m[i]};
          double b = uvw.projected_m(), pa = std::fmod(uvw.pa_rad() * kRadToDeg + 360.0, 180.0);
          if (b > s.baseline_max_m) {
            far_u = uvw.u_m;
            far_v = uvw.v_m;
          }
          s.baseline_min_m = std::min(s.baseline_min_m, b);
          s.baseline_max_m = std::max(s.baseline_max_m, b);
          s.pa_min_deg = std::min(s.pa_min_deg, pa);
          s.pa_max_deg = std::max(s.pa_max_deg, pa);
          s.vis2_min = std::min(s.vis2_min, sb.samples.vis2[i]);
          s.vis2_max = std::max(s.vis2_max, sb.samples.vis2[i]);
          double w = 1 / (sb.samples.sigma_vis2[i] * sb.samples.sigma_vis2[i]);
          weight += w;
          weighted_vis2 += w * sb.samples.vis2[i];
          exposure += sb.samples.exposure_s[k];
          ++s.samples;
        }
      }
      if (s.samples == 0) continue;
      // the pair's whole night as one measurement: inverse-variance mean |V|^2 and its sigma
      double sigma = 1 / std::sqrt(weight), vis2 = weighted_vis2 / weight;
      bool beyond = std::hypot(far_u, far_v) > astro::first_null_baseline_m(model, lambda, std::atan2(far_u, far_v));
      auto a = astro::assess_baseline(vis2, sigma, exposure, beyond);
      s.snr = a.snr;
      s.verdict = std::string(astro::verdict_text(a.verdict));
      s.resolves = a.resolves();
      out.baselines.add_row({plan.targets[std::size_t(t)].name, pair_label(in.telescopes, plan.pairs[p]), s.baseline_min_m,
                             s.baseline_max_m, s.pa_min_deg, s.pa_max_deg, s.vis2_min, s.vis2_max, s.snr, s.verdict});
      out.pairs.push_back(s);
    }
  }

  // stdout summary: every target, scheduled first
  for (auto [name, p] : {std::pair{"target", 0}, {"priority", 3}, {"diameter_mas", 4}, {"goal_pct", 3}, {"planned_min", 4},
                         {"sigma_theta_pct", 3}, {"simple_sigma_pct", 3}, {"status", 0}})
    out.summary.add_column(name, p);
  std::vector<double> minutes(plan.targets.size(), 0);
  for (const auto& b : ev.blocks) minutes[std::size_t(b.target)] += b.n_slots * plan.grid.slot_s / 60;
  std::vector<std::size_t> order(plan.targets.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return minutes[a] > minutes[b]; });
  for (std::size_t i : order) {
    const auto& t = plan.targets[i];
    std::string status;
    if (minutes[i] > 0) status = ev.sigma_fraction[i] <= t.goal_fraction ? "goal met" : "goal not met";
    else status = plan.status[i].reason.empty() ? "observable, no time left" : plan.status[i].reason;
    if (t.diameter_estimated && plan.status[i].reason.rfind("no diameter", 0) != 0) status += "; diameter estimated";
    out.summary.add_row({t.name, t.priority, t.model.diameter_rad() * astro::kRadToMas, 100 * t.goal_fraction, minutes[i],
                         pct(ev.sigma_fraction[i]), pct(plan.result.baseline.sigma_fraction.empty() ? NAN : plan.result.baseline.sigma_fraction[i]),
                         status});
  }

  // plan.h5
  auto& pf = out.plan_file;
  pf.date = date_text;
  pf.night_start_mjd_utc = plan.grid.has_dark_time ? plan.grid.dark_start_utc.mjd() : NAN;
  pf.night_end_mjd_utc = plan.grid.has_dark_time ? plan.grid.dark_end_utc.mjd() : NAN;
  pf.slot_s = plan.grid.slot_s;
  pf.siiplan_version = version;
  pf.site = in.site;
  pf.site.min_altitude_rad = in.constraints.min_altitude_rad;
  pf.telescopes = in.telescopes;
  pf.pairs = plan.pairs;
  pf.instrument = in.instrument;
  for (std::size_t i = 0; i < plan.targets.size(); ++i) {
    io::PlanTarget pt;
    pt.target = plan.targets[i];
    pt.scheduled = minutes[i] > 0;
    pt.predicted_sigma_theta_fraction = pt.scheduled ? ev.sigma_fraction[i] : NAN;
    pf.targets.push_back(std::move(pt));
  }
  for (const auto& sb : out.blocks) {
    io::PlanBlock pb;
    pb.target = plan.targets[std::size_t(sb.block.target)].name;
    pb.target_index = sb.block.target;
    pb.start_mjd_utc = plan.grid.edges_utc[std::size_t(sb.block.first_slot)].mjd();
    pb.end_mjd_utc = plan.grid.edges_utc[std::size_t(sb.block.end_slot())].mjd();
    pb.overhead_s = sb.block.overhead_s;
    for (const auto& t : sb.samples.mid_utc) pb.mjd_utc.push_back(t.mjd());
    pb.exposure_s = sb.samples.exposure_s;
    pb.u_m = sb.samples.u_m;
    pb.v_m = sb.samples.v_m;
    pb.w_m = sb.samples.w_m;
    pb.vis2 = sb.samples.vis2;
    pb.sigma_vis2 = sb.samples.sigma_vis2;
    pb.usable = sb.samples.usable;
    pf.blocks.push_back(std::move(pb));
  }
  return out;
}

std::string summary_header(const NightInputs& in, const NightPlan& plan) {
  std::ostringstream s;
  const auto& g = plan.grid;
  if (!g.has_dark_time) {
    s << "No dark time at " << in.site.name << " on this night: the Sun stays above "
      << fmt("%.1f", in.constraints.sun_max_altitude_rad * kRadToDeg) << " deg (lowest "
      << fmt("%.1f", g.summary.sun_min_alt_rad * kRadToDeg) << " deg). Nothing was scheduled.\n";
    return s.str();
  }
  const auto& r = plan.result;
  int met_plan = 0, met_simple = 0, observable = 0;
  for (std::size_t i = 0; i < plan.targets.size(); ++i) {
    met_plan += r.plan.sigma_fraction[i] <= plan.targets[i].goal_fraction;
    met_simple += r.baseline.sigma_fraction[i] <= plan.targets[i].goal_fraction;
    observable += plan.status[i].reason.empty();
  }
  s << "Dark window (Sun below " << fmt("%.0f", in.constraints.sun_max_altitude_rad * kRadToDeg) << " deg): "
    << astro::format_utc(g.dark_start_utc) << " to " << astro::format_utc(g.dark_end_utc) << ", " << g.n_slots << " slots of "
    << fmt("%g", g.slot_s / 60) << " min; Moon " << fmt("%.0f", 100 * g.moon_illuminated_fraction) << "% illuminated.\n"
    << observable << " of " << plan.targets.size() << " targets observable; " << r.plan.blocks.size() << " blocks planned.\n"
    << "Goals met: plan " << met_plan << " (priority-weighted " << fmt("%g", r.plan.objective.met) << ", partial progress on unmet goals "
    << fmt("%.3f", r.plan.objective.info) << "); simple schedule " << met_simple << " (priority-weighted "
    << fmt("%g", r.baseline.objective.met) << ", partial progress on unmet goals " << fmt("%.3f", r.baseline.objective.info) << ").\n";
  return s.str();
}

namespace {

std::string esc(const std::string& s) { return io::xml_escape(s); }

// Every n-th index so that at most `limit` are kept (deterministic thinning for the charts).
std::size_t stride_for(std::size_t n, std::size_t limit) { return n <= limit ? 1 : (n + limit - 1) / limit; }

}  // namespace

std::string night_report_html(const NightInputs& in, const NightPlan& plan, const NightProducts& products,
                              const std::string& date_text, const std::string& safety_notice) {
  std::ostringstream h;
  const auto& g = plan.grid;
  const auto& ev = plan.result.plan;
  h << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>siiplan night plan: " << esc(in.site.name)
    << ", " << esc(date_text) << "</title>\n<style>\nbody{font-family:sans-serif;max-width:1100px;margin:1em auto;color:#222}"
       "table{border-collapse:collapse;font-size:90%}td,th{border:1px solid #bbb;padding:2px 6px;text-align:right}"
       "td.l,th.l{text-align:left}.note{background:#fff6dd;border:1px solid #e0c070;padding:0.6em}"
       ".res{background:#dff0d8}.nores{background:#f5f5f5}\n</style>\n</head>\n<body>\n";
  h << "<h1>Night plan: " << esc(in.site.name) << ", night of " << esc(date_text) << "</h1>\n";
  h << "<p class=\"note\">" << esc(safety_notice) << "</p>\n";
  h << "<h2>Summary</h2>\n<pre>" << esc(summary_header(in, plan)) << "</pre>\n";
  h << "<p>Instrument: " << fmt("%.0f", in.instrument.lambda_m * 1e9) << " nm, " << in.telescopes.size() << " telescopes, "
    << plan.pairs.size() << " pairs; zero-baseline correlation "
    << (in.instrument.zero_baseline == astro::ZeroBaseline::Free ? "free (fitted with the diameter)" : "calibrated (fixed)")
    << ". Constraints: altitude &ge; " << fmt("%.0f", in.constraints.min_altitude_rad * kRadToDeg) << "&deg;, Moon separation &ge; "
    << fmt("%.0f", in.constraints.moon_min_separation_rad * kRadToDeg) << "&deg;, moonlit time "
    << (in.constraints.allow_moonlit ? "allowed" : "not allowed") << ", minimum block " << fmt("%g", in.constraints.min_block_s / 60)
    << " min, setup " << fmt("%g", in.constraints.setup_s / 60) << " min per target change, slew "
    << (in.constraints.fixed_slew_s >= 0 ? fmt("%g s fixed", in.constraints.fixed_slew_s)
                                         : fmt("%g deg/s", in.constraints.slew_deg_per_s))
    << ".</p>\n";

  if (g.has_dark_time) {
    // Timeline
    io::Plot p;
    p.title = "Night timeline (hours after the start of the dark window, " + hhmm(g.dark_start_utc) + " UTC)";
    p.x_label = "hours";
    p.y_label = "altitude (deg)";
    p.y_min = 0;
    p.y_max = 90;
    p.x_min = 0;
    p.x_max = hours_from(g.dark_start_utc, g.edges_utc.back());
    std::vector<int> shown;
    for (const auto& b : ev.blocks)
      if (std::find(shown.begin(), shown.end(), b.target) == shown.end()) shown.push_back(b.target);
    for (int t : shown) {
      io::PlotSeries s;
      s.label = plan.targets[std::size_t(t)].name;
      for (std::size_t e = 0; e < g.edges_utc.size(); ++e) {
        s.x.push_back(hours_from(g.dark_start_utc, g.edges_utc[e]));
        s.y.push_back(plan.status[std::size_t(t)].alt_edge_rad[e] * kRadToDeg);
      }
      p.series.push_back(std::move(s));
    }
    io::PlotSeries moon;
    moon.label = "Moon (" + fmt("%.0f", 100 * g.moon_illuminated_fraction) + "% lit)";
    moon.dashed = true;
    moon.color = "#888";
    for (std::size_t e = 0; e < g.edges_utc.size(); ++e) {
      moon.x.push_back(hours_from(g.dark_start_utc, g.edges_utc[e]));
      moon.y.push_back(g.moon_alt_edge_rad[e] * kRadToDeg);
    }
    p.series.push_back(std::move(moon));
    for (const auto& b : ev.blocks)
      p.shades.push_back({hours_from(g.dark_start_utc, g.edges_utc[std::size_t(b.first_slot)]),
                          hours_from(g.dark_start_utc, g.edges_utc[std::size_t(b.end_slot())]), "#dde8f6",
                          plan.targets[std::size_t(b.target)].name});
    p.markers.push_back({in.constraints.min_altitude_rad * kRadToDeg, "altitude limit", false, "#c33"});
    auto twilight = [&](const astro::Interval& iv, const std::string& what) {
      if (iv.kind != astro::Interval::Kind::Part) return;
      for (auto [t, label] : {std::pair{iv.begin, what + " begins"}, {iv.end, what + " ends"}}) {
        double x = hours_from(g.dark_start_utc, t);
        if (x > -1.5 && x < *p.x_max + 1.5) p.markers.push_back({x, label, true, "#777"});
      }
    };
    twilight(g.summary.nautical, "nautical night");
    for (const auto& c : g.summary.moon) {
      double x = hours_from(g.dark_start_utc, c.utc);
      if (x >= 0 && x <= *p.x_max) p.markers.push_back({x, c.rising ? "moonrise" : "moonset", true, "#999"});
    }
    h << "<h2>Timeline</h2>\n<p>Shaded: scheduled blocks. Dark window " << esc(astro::format_utc(g.dark_start_utc)) << " to "
      << esc(astro::format_utc(g.dark_end_utc)) << ".</p>\n"
      << p.render(1000, 460) << "\n";

    // Schedule table
    h << "<h2>Schedule</h2>\n<table>\n<tr><th class=\"l\">target</th><th>start (UTC)</th><th>end (UTC)</th><th>alt start</th>"
         "<th>alt end</th><th>overhead (min)</th><th>predicted &sigma;&theta;/&theta; (%)</th></tr>\n";
    for (const auto& b : ev.blocks) {
      const auto& st = plan.status[std::size_t(b.target)];
      h << "<tr><td class=\"l\">" << esc(plan.targets[std::size_t(b.target)].name) << "</td><td>"
        << esc(astro::format_utc(g.edges_utc[std::size_t(b.first_slot)])) << "</td><td>"
        << esc(astro::format_utc(g.edges_utc[std::size_t(b.end_slot())])) << "</td><td>"
        << fmt("%.1f", st.alt_edge_rad[std::size_t(b.first_slot)] * kRadToDeg) << "</td><td>"
        << fmt("%.1f", st.alt_edge_rad[std::size_t(b.end_slot())] * kRadToDeg) << "</td><td>" << fmt("%.1f", b.overhead_s / 60)
        << "</td><td>" << fmt("%.2f", pct(ev.sigma_fraction[std::size_t(b.target)])) << "</td></tr>\n";
    }
    h << "</table>\n";
  }

  // Per target
  std::vector<int> shown;
  for (const auto& b : ev.blocks)
    if (std::find(shown.begin(), shown.end(), b.target) == shown.end()) shown.push_back(b.target);
  const double lambda = in.instrument.lambda_m;
  for (int t : shown) {
    const auto& tg = plan.targets[std::size_t(t)];
    h << "<h2>" << esc(tg.name) << "</h2>\n<p>Model " << esc(std::string(astro::model_name(tg.model.kind()))) << ", diameter "
      << fmt("%.3f", tg.model.diameter_rad() * astro::kRadToMas) << " mas"
      << (tg.diameter_estimated ? " (" + esc(tg.diameter_note) + ")" : "") << "; priority " << fmt("%g", tg.priority) << ", goal "
      << fmt("%g", 100 * tg.goal_fraction) << "%; predicted &sigma;&theta;/&theta; = " << fmt("%.2f", pct(ev.sigma_fraction[std::size_t(t)]))
      << "% (simple schedule: "
      << (std::isfinite(plan.result.baseline.sigma_fraction[std::size_t(t)])
              ? fmt("%.2f", pct(plan.result.baseline.sigma_fraction[std::size_t(t)])) + "%"
              : std::string("not observed"))
      << "). Flux from "
      << esc(plan.status[std::size_t(t)].flux_note) << ".</p>\n";
    io::Plot uv, curve;
    uv.title = "(u,v) coverage";
    uv.x_label = "u (m, East)";
    uv.y_label = "v (m, North)";
    uv.equal_aspect = true;
    curve.title = "predicted |V|^2 with planned points";
    curve.x_label = "projected baseline (m)";
    curve.y_label = "|V|^2";
    curve.y_min = std::min(0.0, curve.y_min.value_or(0.0));
    curve.y_max = 1.05;
    io::PlotSeries uvp, pts;
    uvp.style = io::PlotSeries::Style::Points;
    pts.style = io::PlotSeries::Style::PointsWithErrors;
    pts.label = "planned (1 sigma)";
    std::size_t total = 0;
    for (const auto& sb : products.blocks)
      if (sb.block.target == t) total += sb.samples.usable.size();
    const std::size_t stride = stride_for(total, 600);
    std::size_t counter = 0;
    double bmax = 0, pa_sum = 0;
    int pa_n = 0;
    for (const auto& sb : products.blocks) {
      if (sb.block.target != t) continue;
      for (std::size_t i = 0; i < sb.samples.usable.size(); ++i) {
        if (!sb.samples.usable[i] || (counter++ % stride) != 0) continue;
        astro::Uvw uvw{sb.samples.u_m[i], sb.samples.v_m[i], sb.samples.w_m[i]};
        uvp.x.push_back(uvw.u_m);
        uvp.y.push_back(uvw.v_m);
        uvp.x.push_back(-uvw.u_m);
        uvp.y.push_back(-uvw.v_m);
        pts.x.push_back(uvw.projected_m());
        pts.y.push_back(sb.samples.vis2[i]);
        pts.y_err.push_back(sb.samples.sigma_vis2[i]);
        bmax = std::max(bmax, uvw.projected_m());
        pa_sum += uvw.pa_rad();
        ++pa_n;
      }
    }
    uvp.label = "planned samples (and their mirror)";
    uv.series.push_back(std::move(uvp));
    io::PlotSeries model_line;
    model_line.label = "model";
    const double pa = pa_n ? pa_sum / pa_n : 0;
    for (int k = 0; k <= 200; ++k) {
      double b = 1.2 * std::max(bmax, 1.0) * k / 200;
      model_line.x.push_back(b);
      model_line.y.push_back(tg.model.vis2(b * std::sin(pa) / lambda, b * std::cos(pa) / lambda));
    }
    curve.series.push_back(std::move(model_line));
    curve.series.push_back(std::move(pts));
    h << io::combine_svgs({uv.render(480, 440), curve.render(560, 440)}, 560, 440, 2) << "\n";
    // resolution table
    h << "<table>\n<tr><th class=\"l\">pair</th><th>baseline (m)</th><th>PA (deg)</th><th>|V|&sup2;</th><th>SNR</th>"
         "<th class=\"l\">verdict</th></tr>\n";
    int rows = 0, hidden = 0;
    for (const auto& ps : products.pairs) {
      if (ps.target != t) continue;
      if (rows >= 60) {
        ++hidden;
        continue;
      }
      ++rows;
      h << "<tr class=\"" << (ps.resolves ? "res" : "nores") << "\"><td class=\"l\">" << esc(pair_label(in.telescopes, plan.pairs[ps.pair]))
        << "</td><td>" << fmt("%.1f", ps.baseline_min_m) << " &ndash; " << fmt("%.1f", ps.baseline_max_m) << "</td><td>"
        << fmt("%.0f", ps.pa_min_deg) << " &ndash; " << fmt("%.0f", ps.pa_max_deg) << "</td><td>" << fmt("%.3f", ps.vis2_min)
        << " &ndash; " << fmt("%.3f", ps.vis2_max) << "</td><td>" << fmt("%.1f", ps.snr) << "</td><td class=\"l\">"
        << esc(ps.verdict) << "</td></tr>\n";
    }
    h << "</table>\n";
    if (hidden) h << "<p>" << hidden << " more pairs in baselines.csv.</p>\n";
  }
  h << "<p>Verdict: " << esc(std::string(astro::resolve_criterion_text())) << "</p>\n";

  // Unobservable and unscheduled targets
  h << "<h2>Targets without time</h2>\n<table>\n<tr><th class=\"l\">target</th><th>max altitude (deg)</th><th class=\"l\">reason</th></tr>\n";
  for (std::size_t i = 0; i < plan.targets.size(); ++i) {
    if (std::find(shown.begin(), shown.end(), int(i)) != shown.end()) continue;
    std::string reason = plan.status[i].reason.empty() ? "observable, but the plan found better use of the time" : plan.status[i].reason;
    h << "<tr><td class=\"l\">" << esc(plan.targets[i].name) << "</td><td>"
      << (g.has_dark_time ? fmt("%.1f", plan.status[i].max_alt_rad * kRadToDeg) : std::string("-")) << "</td><td class=\"l\">"
      << esc(reason) << "</td></tr>\n";
  }
  h << "</table>\n<p>Written by siiplan. Predictions assume the instrument file's efficiencies and the sky model; "
       "check them against your own calibration runs.</p>\n</body>\n</html>\n";
  return h.str();
}

}  // namespace siiplan::planner
