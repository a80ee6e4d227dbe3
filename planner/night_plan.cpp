#include "planner/night_plan.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstdio>
#include <thread>

#include "astro/fisher.hpp"
#include "astro/geometry.hpp"
#include "io/table.hpp"

namespace siiplan::planner {

namespace {

using astro::JulianDate;

std::string fmt(const char* format, double value) { return io::format_printf(format, value); }

// The dark window and the Sun/Moon on the slot grid.
NightGrid make_grid(const NightInputs& in) {
  NightGrid g;
  const auto& c = in.constraints;
  g.summary = astro::night_summary(in.site, in.date);
  g.dubious_year = g.summary.dubious_year;
  g.slot_s = c.slot_s;
  auto sun_alt = [&](JulianDate t) { return astro::Epoch(in.site, t).sun().alt_rad; };
  astro::Interval dark = astro::interval_of(sun_alt, g.summary.window.start_utc, g.summary.window.end_utc,
                                            c.sun_max_altitude_rad, true);
  if (dark.kind == astro::Interval::Kind::None) return g;
  g.dark_start_utc = dark.kind == astro::Interval::Kind::Whole ? g.summary.window.start_utc : dark.begin;
  g.dark_end_utc = dark.kind == astro::Interval::Kind::Whole ? g.summary.window.end_utc : dark.end;
  g.n_slots = int(std::floor(astro::seconds_between(g.dark_start_utc, g.dark_end_utc) / c.slot_s + 1e-9));
  g.has_dark_time = g.n_slots > 0;
  for (int k = 0; k <= g.n_slots; ++k) {
    JulianDate t = astro::add_seconds(g.dark_start_utc, k * c.slot_s);
    g.edges_utc.push_back(t);
    astro::Epoch e(in.site, t);
    g.dubious_year = g.dubious_year || e.dubious_year();
    auto moon = e.moon();
    g.moon_alt_edge_rad.push_back(moon.alt_rad);
    g.moon_az_edge_rad.push_back(moon.az_rad);
    if (k < g.n_slots) g.mids_utc.push_back(astro::add_seconds(t, 0.5 * c.slot_s));
  }
  g.moon_illuminated_fraction = g.summary.moon_illuminated_fraction;
  g.moon_phase_angle_rad = astro::moon_phase_angle_from_illumination(g.moon_illuminated_fraction);
  return g;
}

bool moon_up(double moon_alt_rad) { return moon_alt_rad > astro::kMoonriseAltitude_rad; }

// Everything about the array that does not depend on the target.
struct ArrayContext {
  std::vector<astro::TelescopePair> pairs;
  astro::BaselineArrays xyz;                    // per pair, structure of arrays
  std::vector<double> tel_limit_rad;            // per telescope: max(global, own)
  std::vector<double> pair_limit_rad;           // per pair: the higher of its two telescopes' limits
  std::vector<double> area_m2;                  // per telescope
  std::vector<int> pair_class;                  // per pair: index into classes
  std::vector<std::pair<double, double>> classes;   // distinct (area_i, area_j)
};

ArrayContext make_array(const NightInputs& in) {
  ArrayContext a;
  a.pairs = astro::all_pairs(in.telescopes.size());
  for (const auto& t : in.telescopes) {
    double own = std::isnan(t.min_altitude_rad) ? in.constraints.min_altitude_rad : t.min_altitude_rad;
    a.tel_limit_rad.push_back(std::max(in.constraints.min_altitude_rad, own));
    a.area_m2.push_back(t.area_m2 > 0 ? t.area_m2 : astro::kPi * t.diameter_m * t.diameter_m / 4);
  }
  for (const auto& p : a.pairs) {
    a.xyz.push_back(astro::baseline_xyz(in.telescopes[std::size_t(p.i)], in.telescopes[std::size_t(p.j)], in.site.lat_rad));
    a.pair_limit_rad.push_back(std::max(a.tel_limit_rad[std::size_t(p.i)], a.tel_limit_rad[std::size_t(p.j)]));
    std::pair<double, double> key{a.area_m2[std::size_t(p.i)], a.area_m2[std::size_t(p.j)]};
    auto it = std::find(a.classes.begin(), a.classes.end(), key);
    if (it == a.classes.end()) {
      a.classes.push_back(key);
      it = a.classes.end() - 1;
    }
    a.pair_class.push_back(int(it - a.classes.begin()));
  }
  return a;
}

// Photon flux of the star above the atmosphere in the instrument's band, and how it was obtained.
bool star_flux(const astro::Target& t, const astro::Instrument& inst, double& n_top, std::string& note) {
  const auto band = inst.band;
  double m = t.mag[std::size_t(band)];
  if (!std::isnan(m)) {
    n_top = astro::photon_flux_density(m, band, inst.lambda_m, t.teff_k);
    note = "mag_" + std::string(1, char(std::tolower(astro::band_name(band)[0])));
    return true;
  }
  double v = t.mag[std::size_t(astro::Band::V)];
  if (!std::isnan(v)) {
    n_top = astro::photon_flux_density(v, astro::Band::V, inst.lambda_m, t.teff_k);
    note = std::isnan(t.teff_k) ? "mag_v (flat spectrum assumed)" : "mag_v carried to the filter with a blackbody of teff_k";
    return true;
  }
  return false;
}

// Fills the diameter of a target without one; returns an empty string or the reason it cannot.
std::string settle_diameter(astro::Target& t) {
  if (!t.diameter_estimated) return {};
  double v = t.mag[std::size_t(astro::Band::V)];
  if (std::isnan(v) || std::isnan(t.teff_k))
    return "no diameter: give diameter_mas, or mag_v and teff_k to estimate it";
  double theta = astro::diameter_from_teff_rad(v, t.teff_k);
  auto p = t.model.params();
  p[0] = theta;
  t.model = t.model.with_params(p);
  t.diameter_note = "estimated from mag_v = " + fmt("%.2f", v) + " and teff_k = " + fmt("%.0f", t.teff_k) +
                    " (bolometric flux with the Flower/Torres BC_V, Sun as zero point)";
  return {};
}

struct SlotGeometry {   // one target at the slot grid
  std::vector<astro::Apparent> edge;
  std::vector<astro::Apparent> mid;   // filled only for slots whose edges clear the altitude limit
};

// The star at every slot edge (one Epoch per instant, shared by all targets: geometry.md §2.4 fast path).
SlotGeometry target_geometry(const std::vector<astro::Epoch>& edge_epochs, const astro::SkyPosition& pos) {
  SlotGeometry g;
  for (const auto& e : edge_epochs) g.edge.push_back(e.star(pos));
  g.mid.resize(edge_epochs.empty() ? 0 : edge_epochs.size() - 1);
  return g;
}

double moon_sep_at(const NightGrid& grid, const astro::Apparent& star, int edge) {
  return angular_separation_rad(star.az_rad, star.alt_rad, grid.moon_az_edge_rad[std::size_t(edge)],
                                grid.moon_alt_edge_rad[std::size_t(edge)]);
}

// Sky geometry at a slot's middle (Moon values interpolated between the slot's edges).
astro::SkyGeometry sky_at(const NightGrid& grid, int k, const astro::Apparent& mid, const astro::Apparent& e0,
                          const astro::Apparent& e1) {
  astro::SkyGeometry s;
  s.moon_phase_angle_rad = grid.moon_phase_angle_rad;
  s.moon_altitude_rad = 0.5 * (grid.moon_alt_edge_rad[std::size_t(k)] + grid.moon_alt_edge_rad[std::size_t(k) + 1]);
  s.moon_separation_rad = 0.5 * (moon_sep_at(grid, e0, k) + moon_sep_at(grid, e1, k + 1));
  s.target_altitude_rad = mid.alt_rad;
  return s;
}

// Per-slot star and sky photon flux and the per-class sigma(|V|^2) for a full slot.
struct SlotNoise {
  std::vector<double> sigma_by_class;
};

SlotNoise slot_noise(const NightInputs& in, const ArrayContext& arr, double n_top, double airmass,
                     const astro::SkyGeometry& sky, double t_s) {
  const auto& inst = in.instrument;
  const double k = in.site.extinction_mag_per_airmass[std::size_t(inst.band)];
  const double n_star = n_top * astro::extinction_transmission(k, airmass);
  const double mu = astro::sky_brightness_mag_arcsec2(inst.band, k, sky, astro::dark_zenith_sky_mag_arcsec2(inst.band));
  const double n_sky = astro::sky_photon_flux_density(inst, mu);
  SlotNoise s;
  for (const auto& [a1, a2] : arr.classes) s.sigma_by_class.push_back(astro::sigma_vis2(inst, a1, a2, n_star, n_star, n_sky, n_sky, t_s));
  return s;
}

// Whether each telescope clears its limit over a slot (edges and middle).
double slot_min_alt(const SlotGeometry& g, int k) {
  return std::min({g.edge[std::size_t(k)].alt_rad, g.edge[std::size_t(k) + 1].alt_rad, g.mid[std::size_t(k)].alt_rad});
}

void process_target(const NightInputs& in, const NightGrid& grid, const ArrayContext& arr,
                    const std::vector<astro::Epoch>& edge_epochs, const std::vector<astro::Epoch>& mid_epochs,
                    astro::Target& target, TargetStatus& status, TargetSlots& slots) {
  const auto& c = in.constraints;
  const int n = grid.n_slots;
  slots.observable.assign(std::size_t(n), 0);
  slots.f_tt.assign(std::size_t(n), 0);
  slots.f_tc.assign(std::size_t(n), 0);
  slots.f_cc.assign(std::size_t(n), 0);
  slots.priority = target.priority;
  slots.goal_fraction = target.goal_fraction;
  slots.ra_rad = target.position.ra_rad;
  slots.dec_rad = target.position.dec_rad;

  SlotGeometry g = target_geometry(edge_epochs, target.position);
  for (const auto& e : g.edge) {
    status.alt_edge_rad.push_back(e.alt_rad);
    status.max_alt_rad = std::max(status.max_alt_rad, e.alt_rad);
  }
  std::string diameter_problem = settle_diameter(target);
  slots.theta_rad = target.model.diameter_rad();
  double n_top = 0;
  bool has_flux = star_flux(target, in.instrument, n_top, status.flux_note);

  // sky constraints per slot
  int above = 0, moon_ok = 0, pairs_ok = 0;
  std::vector<std::uint8_t> sky_ok(std::size_t(n), 0);
  for (int k = 0; k < n; ++k) {
    // Cheap rejection first: a slot with an edge below the limit needs neither the middle nor any pair.
    if (std::min(g.edge[std::size_t(k)].alt_rad, g.edge[std::size_t(k) + 1].alt_rad) < c.min_altitude_rad) continue;
    g.mid[std::size_t(k)] = mid_epochs[std::size_t(k)].star(target.position);
    if (slot_min_alt(g, k) < c.min_altitude_rad) continue;
    ++above;
    bool ok = true;
    for (int e : {k, k + 1}) {
      if (!moon_up(grid.moon_alt_edge_rad[std::size_t(e)])) continue;
      if (!c.allow_moonlit) ok = false;
      if (moon_sep_at(grid, g.edge[std::size_t(e)], e) < c.moon_min_separation_rad) ok = false;
    }
    if (!ok) continue;
    ++moon_ok;
    sky_ok[std::size_t(k)] = 1;
  }
  const double lambda = in.instrument.lambda_m;
  const std::size_t np = arr.pairs.size();
  std::vector<double> u(np), v(np), sigma(np);   // per slot: all pairs, then the usable ones packed in front
  for (int k = 0; k < n && has_flux && diameter_problem.empty(); ++k) {
    if (!sky_ok[std::size_t(k)]) continue;
    const double alt_min = slot_min_alt(g, k);
    const auto& mid = g.mid[std::size_t(k)];
    SlotNoise noise = slot_noise(in, arr, n_top, mid.airmass, sky_at(grid, k, mid, g.edge[std::size_t(k)], g.edge[std::size_t(k) + 1]), c.slot_s);
    // The trigonometry once per (target, slot), then a matrix-vector product per pair.
    astro::project_uv(astro::UvwProjection(mid.ha_rad, mid.dec_rad), arr.xyz, u, v);
    std::size_t m = 0;
    for (std::size_t p = 0; p < np; ++p) {
      if (alt_min < arr.pair_limit_rad[p]) continue;
      const double s = noise.sigma_by_class[std::size_t(arr.pair_class[p])];
      if (!(s > 0) || !std::isfinite(s)) continue;
      u[m] = u[p] / lambda;
      v[m] = v[p] / lambda;
      sigma[m] = s;
      ++m;
    }
    if (m == 0) continue;
    astro::DiameterFisher fisher(target.model);
    fisher.add_batch(std::span<const double>(u.data(), m), std::span<const double>(v.data(), m),
                     std::span<const double>(sigma.data(), m));
    ++pairs_ok;
    slots.observable[std::size_t(k)] = 1;
    slots.f_tt[std::size_t(k)] = fisher.f_theta_theta();
    slots.f_tc[std::size_t(k)] = fisher.f_theta_c0();
    slots.f_cc[std::size_t(k)] = fisher.f_c0_c0();
  }
  status.observable_slots = pairs_ok;
  if (!diameter_problem.empty()) status.reason = diameter_problem;
  else if (!has_flux) status.reason = "no magnitude in the instrument's band or in V";
  else if (above == 0)
    status.reason = "never above " + fmt("%.0f", c.min_altitude_rad * astro::kRadToDeg) + " deg in the dark window (highest " +
                    fmt("%.1f", status.max_alt_rad * astro::kRadToDeg) + " deg)";
  else if (moon_ok == 0)
    status.reason = c.allow_moonlit ? "closer than " + fmt("%.0f", c.moon_min_separation_rad * astro::kRadToDeg) +
                                          " deg to the Moon whenever it is up"
                                    : "up only while the Moon is up (moonlit time not allowed)";
  else if (pairs_ok == 0) status.reason = "no telescope pair usable (telescope altitude limits or detectors blinded)";
  else {
    // longest run of observable slots vs the minimum block
    int best = 0, run = 0;
    for (int k = 0; k < n; ++k) {
      run = slots.observable[std::size_t(k)] ? run + 1 : 0;
      best = std::max(best, run);
    }
    int min_slots = int(std::ceil(c.min_block_s / c.slot_s - 1e-9));
    if (best < min_slots)
      status.reason = "observable for " + fmt("%.0f", best * c.slot_s / 60) + " min at most, shorter than the minimum block";
  }
  if (!status.reason.empty()) std::fill(slots.observable.begin(), slots.observable.end(), 0);
}

}  // namespace

std::vector<std::string> validate(const NightConstraints& c) {
  std::vector<std::string> out;
  auto deg = [](double r) { return fmt("%g", r * astro::kRadToDeg); };
  if (!(c.min_altitude_rad >= 0 && c.min_altitude_rad < 89 * astro::kDegToRad))
    out.push_back("min altitude = " + deg(c.min_altitude_rad) + " deg; must lie within 0 .. 89");
  if (!(c.sun_max_altitude_rad >= -30 * astro::kDegToRad && c.sun_max_altitude_rad <= 0))
    out.push_back("sun max altitude = " + deg(c.sun_max_altitude_rad) + " deg; must lie within -30 .. 0");
  if (!(c.moon_min_separation_rad >= 0 && c.moon_min_separation_rad <= astro::kPi))
    out.push_back("moon min separation = " + deg(c.moon_min_separation_rad) + " deg; must lie within 0 .. 180");
  if (!(c.slot_s >= 30 && c.slot_s <= 7200)) out.push_back("slot = " + fmt("%g", c.slot_s / 60) + " min; must lie within 0.5 .. 120");
  if (!(c.min_block_s >= 0 && c.min_block_s <= 86400)) out.push_back("min block = " + fmt("%g", c.min_block_s / 60) + " min; must lie within 0 .. 1440");
  if (!(c.slew_deg_per_s > 0)) out.push_back("slew rate = " + fmt("%g", c.slew_deg_per_s) + " deg/s; must be > 0");
  if (!(c.setup_s >= 0 && c.setup_s <= 7200)) out.push_back("setup = " + fmt("%g", c.setup_s / 60) + " min; must lie within 0 .. 120");
  if (!(c.fixed_slew_s <= 7200)) /* negative = not set; NaN fails */ out.push_back("fixed slew = " + fmt("%g", c.fixed_slew_s) + " s; must be <= 7200");
  return out;
}

NightPlan plan_night(const NightInputs& in, const std::function<void(std::size_t, std::size_t)>& progress) {
  NightPlan plan;
  plan.grid = make_grid(in);
  plan.targets = in.targets;
  const std::size_t nt = plan.targets.size();
  plan.status.resize(nt);
  plan.slots.resize(nt);
  ArrayContext arr = make_array(in);
  plan.pairs = arr.pairs;

  auto& opt = plan.scheduler;
  opt.n_slots = plan.grid.n_slots;
  opt.slot_s = in.constraints.slot_s;
  opt.min_block_slots = std::max(1, int(std::ceil(in.constraints.min_block_s / in.constraints.slot_s - 1e-9)));
  opt.setup_s = in.constraints.setup_s;
  opt.slew_deg_per_s = in.constraints.slew_deg_per_s;
  opt.fixed_slew_s = in.constraints.fixed_slew_s;
  opt.zero_baseline = in.instrument.zero_baseline;
  opt.threads = std::max(1, in.threads);

  std::vector<astro::Epoch> edge_epochs, mid_epochs;
  for (const auto& t : plan.grid.edges_utc) edge_epochs.emplace_back(in.site, t);
  for (const auto& t : plan.grid.mids_utc) mid_epochs.emplace_back(in.site, t);

  std::atomic<std::size_t> done{0};
  const int threads = int(std::min<std::size_t>(std::size_t(opt.threads), std::max<std::size_t>(nt, 1)));
  auto work = [&](int w) {
    for (std::size_t t = std::size_t(w); t < nt; t += std::size_t(threads)) {
      process_target(in, plan.grid, arr, edge_epochs, mid_epochs, plan.targets[t], plan.status[t], plan.slots[t]);
      std::size_t d = ++done;
      if (w == 0 && progress) progress(d, nt);
    }
  };
  if (threads <= 1) {
    work(0);
  } else {
    std::vector<std::thread> pool;
    for (int w = 0; w < threads; ++w) pool.emplace_back(work, w);
    for (auto& th : pool) th.join();
  }
  if (progress) progress(nt, nt);
  plan.result = plan_schedule(plan.slots, opt);
  return plan;
}

BlockSamples block_samples(const NightInputs& in, const NightPlan& plan, const Block& block) {
  BlockSamples s;
  const auto& target = plan.targets[std::size_t(block.target)];
  ArrayContext arr = make_array(in);
  const int n = block.n_slots;
  const std::size_t np = arr.pairs.size();
  for (auto* v : {&s.u_m, &s.v_m, &s.w_m, &s.vis2, &s.sigma_vis2}) v->assign(np * std::size_t(n), NAN);
  s.usable.assign(np * std::size_t(n), 0);
  double n_top = 0;
  std::string note;
  star_flux(target, in.instrument, n_top, note);
  const double lambda = in.instrument.lambda_m;
  for (int k = 0; k < n; ++k) {
    const int slot = block.first_slot + k;
    const double exposure = exposure_fraction(k, block.overhead_s, plan.grid.slot_s) * plan.grid.slot_s;
    astro::Epoch e0(in.site, plan.grid.edges_utc[std::size_t(slot)]), e1(in.site, plan.grid.edges_utc[std::size_t(slot) + 1]);
    astro::Epoch em(in.site, plan.grid.mids_utc[std::size_t(slot)]);
    auto a0 = e0.star(target.position), a1 = e1.star(target.position), mid = em.star(target.position);
    s.mid_utc.push_back(plan.grid.mids_utc[std::size_t(slot)]);
    s.exposure_s.push_back(exposure);
    s.alt_rad.push_back(mid.alt_rad);
    s.airmass.push_back(mid.airmass);
    auto sky = sky_at(plan.grid, slot, mid, a0, a1);
    s.moon_sep_rad.push_back(sky.moon_separation_rad);
    SlotNoise noise = slot_noise(in, arr, n_top, mid.airmass, sky, exposure > 0 ? exposure : plan.grid.slot_s);
    const double alt_min = std::min({a0.alt_rad, a1.alt_rad, mid.alt_rad});
    const astro::UvwProjection projection(mid.ha_rad, mid.dec_rad);
    for (std::size_t p = 0; p < np; ++p) {
      const std::size_t idx = p * std::size_t(n) + std::size_t(k);
      const astro::Uvw uvw = projection(astro::BaselineXyz{arr.xyz.x_m[p], arr.xyz.y_m[p], arr.xyz.z_m[p]});
      s.u_m[idx] = uvw.u_m;
      s.v_m[idx] = uvw.v_m;
      s.w_m[idx] = uvw.w_m;
      s.vis2[idx] = target.model.vis2(uvw.u_m / lambda, uvw.v_m / lambda);
      bool ok = exposure > 0 && alt_min >= arr.pair_limit_rad[p];
      double sigma = noise.sigma_by_class[std::size_t(arr.pair_class[p])];
      if (ok && sigma > 0 && std::isfinite(sigma)) {
        s.usable[idx] = 1;
        s.sigma_vis2[idx] = sigma;
      }
    }
  }
  return s;
}

}  // namespace siiplan::planner
