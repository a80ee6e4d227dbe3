// Simulated correlation data (astro/correlation_sim.hpp).
#include "astro/correlation_sim.hpp"

#include <algorithm>
#include <random>

#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

double telescope_area_m2(const Telescope& t) { return t.area_m2 > 0 ? t.area_m2 : kPi * t.diameter_m * t.diameter_m / 4.0; }

double interpolate(const std::vector<double>& x, const std::vector<double>& y, double t) {
  if (x.size() == 1 || t <= x.front()) return y.front();
  if (t >= x.back()) return y.back();
  auto it = std::upper_bound(x.begin(), x.end(), t);
  std::size_t j = std::size_t(it - x.begin());
  double f = (t - x[j - 1]) / (x[j] - x[j - 1]);
  return y[j - 1] + f * (y[j] - y[j - 1]);
}

std::string pair_label(const RunMetadata& m) { return m.telescope_1.name + "-" + m.telescope_2.name; }

bool in_interval(double t, double a, double b) { return t >= a && t < b; }

}  // namespace

double star_flux_for_sigma(const Instrument& instrument, double area_1_m2, double area_2_m2, double n_sky_1,
                           double n_sky_2, double sigma_target, double t_s) {
  // sigma_vis2 decreases monotonically with the star flux (until saturation flattens it): bisect in log n.
  double lo = -12, hi = 0;   // log10 n, photons m^-2 s^-1 Hz^-1 (a 0 mag star gives ~1e-4)
  for (int it = 0; it < 100; ++it) {
    double mid = 0.5 * (lo + hi);
    double n = std::pow(10.0, mid);
    double s = sigma_vis2(instrument, area_1_m2, area_2_m2, n, n, n_sky_1, n_sky_2, t_s);
    if (s > sigma_target) lo = mid;
    else hi = mid;
  }
  return std::pow(10.0, hi);
}

CorrelationSet simulate_correlations(const Site& site, const Instrument& instrument, const std::vector<SimRun>& runs,
                                     const SimOptions& options, bool* dubious) {
  if (!(options.frame_s > 0)) throw InputError("--frame-s", "the frame length must be > 0", "give e.g. --frame-s 1");
  const double fwhm_s = instrument.mode == DetectionMode::Analog
                            ? equivalent_timing_fwhm_s(instrument.electronic_bandwidth_hz)
                            : instrument.timing_fwhm_s;
  if (!(fwhm_s > 0))
    throw InputError("instrument", "the timing response width (photon counting) or electronic bandwidth (analog) is not set",
                     "set timing_fwhm_ps or electronic_bandwidth_mhz in the instrument file");
  const double bin_s = std::isnan(options.bin_s) ? fwhm_s / 4.0 : options.bin_s;
  if (!(bin_s > 0) || bin_s > fwhm_s)
    throw InputError("--bin-ps", "the delay bin must be > 0 and at most the timing FWHM", "use about FWHM/4");
  if (options.window_bins < 16) throw InputError("--window-bins", "at least 16 bins are needed", "use e.g. 64");

  // Faults must name telescopes and pairs that exist.
  auto telescope_known = [&](const std::string& name) {
    for (const auto& r : runs)
      if (r.meta.telescope_1.name == name || r.meta.telescope_2.name == name) return true;
    return false;
  };
  for (const auto& o : options.faults.outages)
    if (!telescope_known(o.telescope)) throw InputError("--drop-telescope", "no telescope '" + o.telescope + "' in the runs", "name one of the array's telescopes");
  for (const auto& o : options.faults.timing_offsets)
    if (!telescope_known(o.telescope)) throw InputError("--timing-offset", "no telescope '" + o.telescope + "' in the runs", "name one of the array's telescopes");
  for (const auto& s : options.faults.spurious) {
    bool found = s.pair.empty();
    for (const auto& r : runs) found = found || pair_label(r.meta) == s.pair;
    if (!found) throw InputError("--spurious", "no pair '" + s.pair + "' in the runs", "write the pair as T1-T2 in array order");
  }

  const double tau_c = coherence_time_s(instrument);
  const double zero_baseline_true = bunching_area_s(1.0, tau_c, options.zero_baseline_factor);
  std::mt19937_64 calibration_rng(options.seed ^ 0x5eedcab1ull);
  double zero_baseline_recorded = zero_baseline_true;
  if (options.zero_baseline_error > 0)
    zero_baseline_recorded *= 1.0 + options.zero_baseline_error * std::normal_distribution<double>(0, 1)(calibration_rng);

  // Size check before any work.
  double values = 0;
  for (const auto& r : runs) values += (r.end_mjd - r.start_mjd) * kSecondsPerDay / options.frame_s * options.window_bins;
  if (values > options.max_values)
    throw InputError("--frame-s", "the simulation would hold " + std::to_string(values) + " correlation values",
                     "use longer frames, fewer bins or a shorter span");

  CorrelationSet out;
  out.site = site;
  for (std::size_t ri = 0; ri < runs.size(); ++ri) {
    const SimRun& spec = runs[ri];
    CorrelationRun run;
    run.meta = spec.meta;
    RunMetadata& m = run.meta;
    m.lambda_m = instrument.lambda_m;
    m.bandwidth_m = instrument.bandwidth_m;
    m.profile = instrument.profile;
    m.timing_fwhm_s = fwhm_s;
    m.mode = instrument.mode;
    m.delay_tracked_online = options.track_delay_online;
    m.zero_baseline_s = options.zero_baseline_error >= 0 ? zero_baseline_recorded : NAN;
    m.zero_baseline_err_s = options.zero_baseline_error >= 0 ? options.zero_baseline_error * zero_baseline_true : NAN;
    run.frame_s = options.frame_s;

    const long n_frames = long(std::floor((spec.end_mjd - spec.start_mjd) * kSecondsPerDay / options.frame_s + 1e-6));
    if (n_frames <= 0) continue;
    std::vector<double> mid(static_cast<std::size_t>(n_frames));
    run.frame_start_mjd.resize(std::size_t(n_frames));
    for (long f = 0; f < n_frames; ++f) {
      run.frame_start_mjd[std::size_t(f)] = spec.start_mjd + double(f) * options.frame_s / kSecondsPerDay;
      mid[std::size_t(f)] = run.frame_start_mjd[std::size_t(f)] + 0.5 * options.frame_s / kSecondsPerDay;
    }
    const std::vector<Uvw> uvw = pair_uvw_at(site, m.telescope_1, m.telescope_2, m.target_position, mid, dubious);

    // Instrumental delay offset of the pair: telescope 1 late by o1 moves the peak by +o1, telescope 2 by -o2.
    double offset_s = 0;
    for (const auto& o : options.faults.timing_offsets) {
      if (o.telescope == m.telescope_1.name) offset_s += o.offset_s;
      if (o.telescope == m.telescope_2.name) offset_s -= o.offset_s;
    }
    // Delay axis.
    const int half = options.window_bins / 2;
    if (options.track_delay_online) {
      run.delay = DelayAxis{-half * bin_s, bin_s, options.window_bins};
    } else {
      double lo = 1e300, hi = -1e300;
      for (const auto& x : uvw) {
        lo = std::min(lo, x.delay_s());
        hi = std::max(hi, x.delay_s());
      }
      long k_lo = long(std::floor(lo / bin_s)) - half, k_hi = long(std::ceil(hi / bin_s)) + half;
      run.delay = DelayAxis{double(k_lo) * bin_s, bin_s, int(k_hi - k_lo)};
    }
    const std::size_t nb = std::size_t(run.delay.bins);
    run.correlation.resize(std::size_t(n_frames) * nb);
    run.rate_1_hz.resize(std::size_t(n_frames));
    run.rate_2_hz.resize(std::size_t(n_frames));

    const double area_1 = telescope_area_m2(m.telescope_1), area_2 = telescope_area_m2(m.telescope_2);
    // Background recorded with the data: sky + dark at the run's start (the sky is constant per run here).
    {
      double n0 = interpolate(spec.knot_mjd, spec.n_star_1, spec.start_mjd);
      DetectorRates d1 = detector_rates(instrument, area_1, n0, spec.n_sky_1);
      DetectorRates d2 = detector_rates(instrument, area_2, interpolate(spec.knot_mjd, spec.n_star_2, spec.start_mjd), spec.n_sky_2);
      m.background_1_hz = d1.sky_hz + d1.dark_hz;
      m.background_2_hz = d2.sky_hz + d2.dark_hz;
    }

    std::seed_seq seq{std::uint64_t(options.seed), std::uint64_t(ri), std::uint64_t(0x51u)};
    std::mt19937_64 rng(seq);
    std::vector<double> expected(nb), spurious(nb);
    // Fixed-delay spurious correlations of this pair.
    std::fill(spurious.begin(), spurious.end(), 0.0);
    for (const auto& s : options.faults.spurious)
      if (s.pair.empty() || s.pair == pair_label(m)) {
        std::vector<double> h(nb);
        binned_response(run.delay, s.delay_s, fwhm_s, h);
        for (std::size_t k = 0; k < nb; ++k) spurious[k] += s.area_s * h[k];
      }

    for (long f = 0; f < n_frames; ++f) {
      const double t = mid[std::size_t(f)];
      double n1 = interpolate(spec.knot_mjd, spec.n_star_1, t), n2 = interpolate(spec.knot_mjd, spec.n_star_2, t);
      DetectorRates d1 = detector_rates(instrument, area_1, n1, spec.n_sky_1);
      DetectorRates d2 = detector_rates(instrument, area_2, n2, spec.n_sky_2);
      for (const auto& c : options.faults.clouds)
        if (in_interval(t, c.start_mjd, c.end_mjd)) {
          for (auto* d : {&d1, &d2}) {
            d->star_hz *= c.transmission;
            d->sky_hz *= c.transmission;
          }
        }
      for (const auto& o : options.faults.outages)
        if (in_interval(t, o.start_mjd, o.end_mjd)) {
          if (o.telescope == m.telescope_1.name) d1.star_hz = d1.sky_hz = 0;
          if (o.telescope == m.telescope_2.name) d2.star_hz = d2.sky_hz = 0;
        }
      const double vis2 = spec.model.vis2(uvw[std::size_t(f)].u_m / m.lambda_m, uvw[std::size_t(f)].v_m / m.lambda_m);
      const double area = bunching_area_s(vis2, tau_c, options.zero_baseline_factor) * d1.dilution() * d2.dilution();
      const double peak = (options.track_delay_online ? 0.0 : uvw[std::size_t(f)].delay_s()) + offset_s;
      binned_response(run.delay, peak, fwhm_s, expected);
      for (std::size_t k = 0; k < nb; ++k) expected[k] = area * expected[k] + spurious[k];
      const double r1 = d1.total_hz(), r2 = d2.total_hz();
      run.rate_1_hz[std::size_t(f)] = r1;
      run.rate_2_hz[std::size_t(f)] = r2;
      std::span<float> row(run.correlation.data() + std::size_t(f) * nb, nb);
      if (r1 > 0 && r2 > 0) draw_correlation(rng, instrument, r1, r2, options.frame_s, bin_s, expected, row);
      else std::fill(row.begin(), row.end(), 0.0f);
    }
    out.runs.push_back(std::move(run));
  }
  return out;
}

}  // namespace siiplan::astro
