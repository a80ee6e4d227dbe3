// siiplan simulate: correlation data (CORR.h5) from a night plan or from explicit options, with faults.
#include <iostream>
#include <sstream>

#include "astro/correlation_sim.hpp"
#include "astro/errors.hpp"
#include "astro/sensitivity.hpp"
#include "astro/units.hpp"
#include "io/correlation_h5.hpp"
#include "io/instrument_io.hpp"
#include "io/plan_h5.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/model_options.hpp"
#include "planner/cli/observing_options.hpp"
#include "planner/cli/values.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

double telescope_area(const Telescope& t) { return t.area_m2 > 0 ? t.area_m2 : kPi * t.diameter_m * t.diameter_m / 4.0; }

// "A:B:C" -> fields.
std::vector<std::string> fields(const std::string& text, std::size_t n, const std::string& option, const std::string& form) {
  std::vector<std::string> out;
  std::stringstream ss(text);
  std::string item;
  while (std::getline(ss, item, ':')) out.push_back(item);
  if (out.size() != n) throw InputError("--" + option, "'" + text + "' is not " + form, "see 'siiplan help simulate'");
  return out;
}
double field_number(const std::string& text, const std::string& option) {
  try {
    std::size_t used = 0;
    double v = std::stod(text, &used);
    if (used == text.size() && std::isfinite(v)) return v;
  } catch (const std::exception&) {
  }
  throw InputError("--" + option, "'" + text + "' is not a number", "see 'siiplan help simulate'");
}
std::vector<std::string> texts(const po::variables_map& vm, const std::string& name) {
  return vm.count(name) ? vm[name].as<std::vector<std::string>>() : std::vector<std::string>{};
}

// Faults from the options; times in minutes from t0_mjd.
Faults read_faults(const po::variables_map& vm, double t0_mjd) {
  Faults f;
  const double min = 60.0 / kSecondsPerDay;
  for (const auto& s : texts(vm, "drop-telescope")) {
    auto x = fields(s, 3, "drop-telescope", "NAME:START_MIN:END_MIN");
    f.outages.push_back({x[0], t0_mjd + field_number(x[1], "drop-telescope") * min, t0_mjd + field_number(x[2], "drop-telescope") * min});
  }
  for (const auto& s : texts(vm, "cloud")) {
    auto x = fields(s, 3, "cloud", "START_MIN:END_MIN:TRANSMISSION");
    double tr = field_number(x[2], "cloud");
    if (!(tr >= 0 && tr < 1)) throw InputError("--cloud", "transmission '" + x[2] + "' is not in [0, 1)", "e.g. --cloud 60:90:0.2");
    f.clouds.push_back({t0_mjd + field_number(x[0], "cloud") * min, t0_mjd + field_number(x[1], "cloud") * min, tr});
  }
  for (const auto& s : texts(vm, "timing-offset")) {
    auto x = fields(s, 2, "timing-offset", "NAME:NS");
    f.timing_offsets.push_back({x[0], field_number(x[1], "timing-offset") * 1e-9});
  }
  for (const auto& s : texts(vm, "spurious")) {
    auto x = fields(s, 3, "spurious", "PAIR:DELAY_NS:AREA_PS (PAIR = T1-T2 or all)");
    f.spurious.push_back({x[0] == "all" ? "" : x[0], field_number(x[1], "spurious") * 1e-9, field_number(x[2], "spurious") * 1e-12});
  }
  return f;
}

// Runs of every usable pair of every block of a plan; the light per telescope is rebuilt from the
// plan's sigma_vis2 (the plan stores no magnitudes): star_flux_for_sigma at each sample.
std::vector<SimRun> runs_from_plan(const io::PlanFile& plan, const po::variables_map& vm) {
  std::optional<std::string> override_target;
  if (given(vm, "target")) override_target = text_option(vm, "target", "");
  else if (given(vm, "model") || given(vm, "diameter-mas"))
    throw InputError("--model", "with a plan, model options change one target only", "name it with --target NAME");
  bool found = !override_target;
  std::vector<SimRun> runs;
  for (const auto& block : plan.blocks) {
    const io::PlanTarget& pt = plan.targets.at(std::size_t(block.target_index));
    Model model = pt.target.model;
    if (override_target && *override_target == pt.target.name) {
      model = model_from_options(vm);
      found = true;
    }
    const std::size_t n = block.samples();
    for (std::size_t p = 0; p < plan.pairs.size(); ++p) {
      const Telescope& t1 = plan.telescopes[std::size_t(plan.pairs[p].i)];
      const Telescope& t2 = plan.telescopes[std::size_t(plan.pairs[p].j)];
      SimRun r;
      r.meta.telescope_1 = t1;
      r.meta.telescope_2 = t2;
      r.meta.target_name = pt.target.name;
      r.meta.target_position = pt.target.position;
      r.meta.expected_diameter_rad = pt.target.model.diameter_rad();
      r.model = model;
      for (std::size_t k = 0; k < n; ++k) {
        std::size_t i = p * n + k;
        if (!block.usable[i] || !std::isfinite(block.sigma_vis2[i]) || !(block.exposure_s[k] > 0)) continue;
        double sigma_1s = block.sigma_vis2[i] * std::sqrt(block.exposure_s[k]);
        r.knot_mjd.push_back(block.mjd_utc[k]);
        double nstar = star_flux_for_sigma(plan.instrument, telescope_area(t1), telescope_area(t2), 0, 0, sigma_1s, 1.0);
        r.n_star_1.push_back(nstar);
        r.n_star_2.push_back(nstar);
      }
      if (r.knot_mjd.empty()) continue;
      // The usable part of the block: from the first to the last usable sample, within the block.
      const double half = 0.5 * plan.slot_s / kSecondsPerDay;
      r.start_mjd = std::max(block.start_mjd_utc + block.overhead_s / kSecondsPerDay, r.knot_mjd.front() - half);
      r.end_mjd = std::min(block.end_mjd_utc, r.knot_mjd.back() + half);
      if (r.end_mjd > r.start_mjd) runs.push_back(std::move(r));
    }
  }
  if (!found)
    throw InputError("--target", "no block of the plan observes '" + *override_target + "'", "name a scheduled target of the plan");
  return runs;
}

// Runs of every pair for one target over --start/--end, the star's light from its magnitude.
std::vector<SimRun> runs_from_options(const Site& site, const std::vector<Telescope>& tel, const Instrument& inst,
                                      const Target& target, const Model& model, const TimeSpan& span, bool* dubious) {
  const double mag = target.mag[std::size_t(inst.band)];
  if (!std::isfinite(mag))
    throw InputError("--target", "no " + std::string(band_name(inst.band)) + " magnitude for '" + target.name + "'",
                     "give --mag or a catalog with that band (the instrument's band)");
  const double n_top = photon_flux_density(mag, inst.band, inst.lambda_m, target.teff_k);
  const double k = site.extinction_mag_per_airmass[std::size_t(inst.band)];
  const double n_sky = sky_photon_flux_density(inst, dark_zenith_sky_mag_arcsec2(inst.band));
  std::vector<double> knots, nstar;
  double t0 = span.start_utc.mjd(), t1 = span.end_utc.mjd();
  for (double t = t0;; t += 300.0 / kSecondsPerDay) {
    t = std::min(t, t1);
    Epoch e(site, utc_from_mjd(t));
    if (e.dubious_year()) *dubious = true;
    Apparent a = e.star(target.position);
    if (a.alt_rad <= 0) throw InputError("--start", "'" + target.name + "' is below the horizon at MJD " + std::to_string(t), "choose a span when it is up");
    knots.push_back(t);
    nstar.push_back(n_top * extinction_transmission(k, a.airmass));
    if (t >= t1) break;
  }
  std::vector<SimRun> runs;
  for (auto p : all_pairs(tel.size())) {
    SimRun r;
    r.meta.telescope_1 = tel[std::size_t(p.i)];
    r.meta.telescope_2 = tel[std::size_t(p.j)];
    r.meta.target_name = target.name;
    r.meta.target_position = target.position;
    r.meta.expected_diameter_rad = model.diameter_rad();
    r.model = model;
    r.start_mjd = t0;
    r.end_mjd = t1;
    r.knot_mjd = knots;
    r.n_star_1 = r.n_star_2 = nstar;
    r.n_sky_1 = r.n_sky_2 = n_sky;
    runs.push_back(std::move(r));
  }
  return runs;
}

int run_simulate(const po::variables_map& vm) {
  const std::string out = text_option(vm, "output", "give the correlation file to write, e.g. -o corr.h5");
  SimOptions so;
  const double seed = number_or(vm, "seed", 1);
  if (!(seed >= 0) || seed != std::floor(seed)) throw InputError("--seed", "must be a whole number >= 0", "e.g. --seed 42");
  so.seed = std::uint64_t(seed);
  so.frame_s = positive_or(vm, "frame-s", 1.0);
  if (given(vm, "bin-ps")) so.bin_s = positive_option(vm, "bin-ps", "") * 1e-12;
  so.window_bins = int(positive_or(vm, "bins", 64));
  so.zero_baseline_factor = positive_or(vm, "zero-baseline-factor", 1.0);
  so.zero_baseline_error = number_or(vm, "zero-baseline-error-pct", 0.0) / 100.0;
  so.track_delay_online = !vm.count("untracked");
  bool dubious = false;
  Site site;
  Instrument inst;
  std::vector<SimRun> runs;
  if (given(vm, "plan")) {
    io::PlanFile plan = io::read_plan_h5(text_option(vm, "plan", ""));
    site = plan.site;
    inst = plan.instrument;
    runs = runs_from_plan(plan, vm);
  } else {
    site = load_site(vm);
    auto tel = load_array(vm, site);
    std::vector<std::string> warnings;
    inst = io::read_instrument(text_option(vm, "instrument", "give the instrument file (or a PLAN.h5)"), &warnings);
    for (const auto& w : warnings) warn(w);
    Target target = load_target(vm);
    if (given(vm, "mag")) target.mag[std::size_t(inst.band)] = number_option(vm, "mag", "");
    Model model = given(vm, "model") || given(vm, "diameter-mas") ? model_from_options(vm) : target.model;
    TimeSpan span = load_time_span(vm, site);
    runs = runs_from_options(site, tel, inst, target, model, span, &dubious);
  }
  if (runs.empty()) throw InputError("simulate", "nothing to simulate: no usable block or pair", "check the plan or the time span");
  // An instrument without a zero-baseline calibration (zero_baseline = free) records none, unless asked.
  const bool uncalibrated = inst.zero_baseline == ZeroBaseline::Free && !given(vm, "zero-baseline-error-pct");
  if (uncalibrated) so.zero_baseline_error = -1;
  so.faults = read_faults(vm, runs.front().start_mjd);
  CorrelationSet set = simulate_correlations(site, inst, runs, so, &dubious);
  warn_dubious_year(dubious);
  set.creator = std::string("siiplan ") + SIIPLAN_VERSION + " simulate (seed " + std::to_string(so.seed) + ")";
  io::write_correlation_h5(out, set);
  long frames = 0;
  for (const auto& r : set.runs) frames += long(r.frames());
  std::cout << "wrote " << out << ": " << set.runs.size() << " runs (pair x target), " << frames << " frames of "
            << so.frame_s << " s, " << (set.runs.empty() ? 0 : set.runs.front().delay.bins) << " delay bins"
            << (so.track_delay_online ? " (delay tracked online)" : "") << "\n";
  if (uncalibrated)
    std::cout << "no zero-baseline correlation recorded (instrument: zero_baseline = free): reduce with "
                 "--zero-baseline-nominal and fit with --free-norm\n";
  return 0;
}

void describe_simulate(po::options_description& desc) {
  desc.add_options()
      ("plan", po::value<std::string>(), "night plan (PLAN.h5 from 'siiplan night'); or give --site/--array/--instrument/target/--start/--end")
      ("output,o", po::value<std::string>(), "correlation file to write (HDF5)")
      ("seed", po::value<std::string>(), "random seed (default 1): same seed, same data")
      ("frame-s", po::value<std::string>(), "frame length in seconds (default 1)")
      ("bins", po::value<std::string>(), "delay bins around the peak (default 64)")
      ("bin-ps", po::value<std::string>(), "delay bin width in ps (default: timing FWHM / 4)")
      ("untracked", "record without online delay tracking: the peak follows the geometric delay")
      ("zero-baseline-factor", po::value<std::string>(), "true zero-baseline correlation relative to tau_c/2 (default 1)")
      ("zero-baseline-error-pct", po::value<std::string>(), "1-sigma error of the recorded zero-baseline value in % (default 0; negative: record none; default with zero_baseline = free: none)")
      ("mag", po::value<std::string>(), "without a plan: the star's magnitude in the instrument's band")
      ("instrument", po::value<std::string>(), "without a plan: instrument file (INI)")
      ("drop-telescope", po::value<std::vector<std::string>>()->composing(), "fault: NAME:START_MIN:END_MIN, the telescope loses the star (repeatable)")
      ("cloud", po::value<std::vector<std::string>>()->composing(), "fault: START_MIN:END_MIN:TRANSMISSION at every telescope (repeatable)")
      ("timing-offset", po::value<std::vector<std::string>>()->composing(), "fault: NAME:NS, the telescope's time tags are late (repeatable)")
      ("spurious", po::value<std::vector<std::string>>()->composing(), "fault: PAIR:DELAY_NS:AREA_PS spurious correlation at a fixed delay, PAIR = T1-T2 or all (repeatable)");
  add_site_option(desc);
  add_array_option(desc);
  add_target_options(desc);
  add_time_options(desc, 5);
  add_model_options(desc);
}

const Register reg{Command{
    "simulate",
    "simulate correlation data (HDF5) from a night plan or explicit options, with optional faults",
    "siiplan simulate PLAN.h5 --seed N -o CORR.h5 [--target NAME model options] [faults]\n"
    "       siiplan simulate --site F --array F --instrument F (--ra/--dec | --target/--catalog) --start T --end T -o CORR.h5",
    "For each block of the plan (or the given span), each telescope pair and each frame: the expected bunching\n"
    "peak g2 - 1 (area |V|^2 tau_c/2 times the zero-baseline factor, Gaussian timing response, at tau = 0 when\n"
    "the delay is tracked online or at the geometric delay w/c otherwise) plus noise with the statistics the\n"
    "sensitivity model predicts: Poisson accidentals per bin when counting photons, Gaussian with the\n"
    "equivalent variance for analog chains. From a plan, each target's model and diameter come from the plan\n"
    "(--target NAME with --model/--diameter-mas overrides one) and the light per telescope is set so that\n"
    "the noise equals the plan's predicted sigma(|V|^2). Times of faults are minutes from the first frame.\n\n"
    "Example:\n"
    "  siiplan simulate plan.h5 --seed 1 -o corr.h5 --timing-offset T2:1.5 --cloud 60:75:0.3\n"
    "The file layout is described in the README (correlation data file).",
    {"plan"},
    describe_simulate,
    run_simulate}};

}  // namespace
}  // namespace siiplan::cli
