// Correlation functions: peak shape, noise, amplitude fit, and the closure simulate -> reduce -> fit.
#include "astro/correlation.hpp"

#include <doctest/doctest.h>

#include <numeric>

#include "astro/correlation_sim.hpp"
#include "astro/errors.hpp"
#include "astro/fit.hpp"
#include "astro/reduction.hpp"
#include "astro/sensitivity.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {

// An invented observing set-up: a mid-latitude site, three 4 m telescopes on 30-80 m baselines, a
// photon-counting chain at 420 nm with 1 nm filters and 500 ps timing (numbers of the kind in
// sensitivity.md §2.3 and §4.5, not any real instrument).
Site test_site() {
  Site s;
  s.name = "test";
  s.lat_rad = 35 * kDegToRad;
  s.lon_east_rad = -110 * kDegToRad;
  s.height_m = 2000;
  return s;
}
std::vector<Telescope> test_array() {
  return {Telescope{"A", 0, 0, 0, 4, 0, NAN}, Telescope{"B", 30, 10, 0, 4, 0, NAN},
          Telescope{"C", -20, 75, 0, 4, 0, NAN}};
}
Instrument test_instrument() {
  Instrument in;
  in.mode = DetectionMode::PhotonCounting;
  in.lambda_m = 420e-9;
  in.bandwidth_m = 1e-9;
  in.efficiency = 0.3;
  in.timing_fwhm_s = 500e-12;
  in.dark_rate_hz = 1000;
  return in;
}

// Runs for every pair of the test array, observing a star at transit +-1 h on MJD 61000.
std::vector<SimRun> test_runs(const Model& model, double n_star, double hours = 2.0) {
  const Site site = test_site();
  auto tel = test_array();
  SkyPosition pos{0, 20 * kDegToRad, 0, 0};
  // Transit time: hour angle 0 near the middle of the span (found by the geometry module).
  double mjd0 = 61000.0;
  Epoch e(site, utc_from_mjd(mjd0));
  double ha = e.star(pos).ha_rad;   // radians, advance 2 pi per sidereal day
  ha = std::remainder(ha, kTwoPi);
  double transit = mjd0 - ha / kEarthRotation_rad_per_s / kSecondsPerDay;
  std::vector<SimRun> runs;
  for (auto p : all_pairs(tel.size())) {
    SimRun r;
    r.meta.telescope_1 = tel[std::size_t(p.i)];
    r.meta.telescope_2 = tel[std::size_t(p.j)];
    r.meta.target_name = "star";
    r.meta.target_position = pos;
    r.meta.expected_diameter_rad = model.diameter_rad();
    r.model = model;
    r.start_mjd = transit - hours / 48.0;
    r.end_mjd = transit + hours / 48.0;
    r.knot_mjd = {r.start_mjd};
    r.n_star_1 = {n_star};
    r.n_star_2 = {n_star};
    runs.push_back(r);
  }
  return runs;
}

}  // namespace

TEST_SUITE("astro/correlation") {

TEST_CASE("binned response has unit area and the Gaussian peak height") {
  DelayAxis axis{-16e-9, 0.05e-9, 640};
  std::vector<double> h(640);
  binned_response(axis, 0.013e-9, 0.5e-9, h);
  double area = std::accumulate(h.begin(), h.end(), 0.0) * axis.step_s;
  check_close(area, 1.0, 1e-12, 0, "sum h delta");
  // Peak height of a unit-area Gaussian of FWHM tau: 1/(1.0645 tau) with 1.0645 = sqrt(pi/(4 ln 2))
  // (sensitivity.md §2.1); averaging over a bin of width d lowers it by d^2/(24 sigma^2) = 0.23 %
  // (second-order Taylor expansion of the Gaussian).
  binned_response(axis, 0.0, 0.5e-9, h);
  double hmax = *std::max_element(h.begin(), h.end());
  const double sigma = 0.5e-9 / (2 * std::sqrt(2 * std::log(2.0)));
  check_close(hmax, (1 - 0.05e-9 * 0.05e-9 / (24 * sigma * sigma)) / (std::sqrt(kPi / (4 * std::log(2.0))) * 0.5e-9), 2e-5, 0,
              "peak height");
}

TEST_CASE("equivalent timing FWHM of an analog chain") {
  // sensitivity.md §2.2c: 1 ns FWHM is equivalent to about 330 MHz.
  check_close(equivalent_timing_fwhm_s(332.1e6), 1e-9, 1e-3, 0, "tau_el(332 MHz)");
}

TEST_CASE("Poisson accidentals: the normalised correlation has variance 1/(N1 N2 T delta)") {
  Instrument in = test_instrument();
  std::mt19937_64 rng(7);
  std::vector<double> expected(20000, 0.0);
  std::vector<float> out(20000);
  draw_correlation(rng, in, 2e6, 3e6, 1.0, 125e-12, expected, out);
  double mean = 0, var = 0;
  for (float x : out) mean += x;
  mean /= double(out.size());
  for (float x : out) var += (x - mean) * (x - mean);
  var /= double(out.size() - 1);
  // Poisson statistics (sensitivity.md §2.2); 20000 draws: relative error of the variance 1 %.
  check_close(var, correlation_bin_variance(in, 2e6, 3e6, 1.0, 125e-12), 0.04, 0, "variance");
  check_close(mean, 0.0, 0, 4 * std::sqrt(var / 20000.0), "mean");
}

TEST_CASE("one-parameter amplitude fit: unbiased, error equal to its scatter, SNR of sensitivity.md §2.2a") {
  // Many frames at one |V|^2: the spread of fitted areas equals the reported error and the SNR equals
  // (2 ln2/pi)^(1/4) * A * sqrt(N1 N2 T/tau_el) (sensitivity.md §2.2a).
  Instrument in = test_instrument();
  DelayAxis axis{-8e-9, 125e-12, 128};
  std::vector<double> h(128), w(128, 1.0), c(128);
  binned_response(axis, 0.0, in.timing_fwhm_s, h);
  const double area = 2e-13, n1 = 1e7, n2 = 1e7, t = 1.0;
  std::vector<double> expected(128);
  for (int k = 0; k < 128; ++k) expected[std::size_t(k)] = area * h[std::size_t(k)];
  std::mt19937_64 rng(11);
  std::vector<float> out(128);
  const int n = 2000;
  double s = 0, s2 = 0, err = 0;
  for (int i = 0; i < n; ++i) {
    draw_correlation(rng, in, n1, n2, t, axis.step_s, expected, out);
    for (int k = 0; k < 128; ++k) c[std::size_t(k)] = out[std::size_t(k)];
    AmplitudeFit f = fit_amplitude(c, w, h);
    s += f.area_s;
    s2 += f.area_s * f.area_s;
    err += f.area_err_s;
  }
  double mean = s / n, sd = std::sqrt(s2 / n - mean * mean);
  double snr_analytic = std::pow(2 * std::log(2.0) / kPi, 0.25) * area * std::sqrt(n1 * n2 * t / in.timing_fwhm_s);
  check_close(mean, area, 0, 4 * sd / std::sqrt(double(n)), "mean fitted area");
  check_close(sd, err / n, 0.06, 0, "scatter vs reported error");
  check_close(area / sd, snr_analytic, 0.06, 0, "SNR vs sensitivity.md §2.2a");
}

TEST_CASE("closure: simulate -> reduce -> fit recovers the diameter, pulls ~ N(0,1) over 50 seeds") {
  // A 1.0 mas uniform disk (|V|^2 from 0.9 to 0.3 on these baselines at 420 nm); the zero-baseline
  // correlation recorded exactly, so the diameter error is purely statistical.
  const Model truth(ModelKind::UniformDisk, {1.0 * kMasToRad});
  const Site site = test_site();
  const Instrument in = test_instrument();
  auto runs = test_runs(truth, 1.5e-5, 1.0);
  SimOptions so;
  so.frame_s = 10;
  so.window_bins = 48;
  std::vector<double> pulls;
  for (std::uint64_t seed = 1; seed <= 50; ++seed) {
    so.seed = seed;
    CorrelationSet data = simulate_correlations(site, in, runs, so);
    ReduceOptions ro;
    ro.chunk_s = 600;
    Reduction red = reduce_correlations(data, ro, ZeroBaselineSpec{});
    std::vector<Vis2Measurement> m;
    for (const auto& p : red.points) {
      INFO("seed " << seed << ": " << p.flag << " run " << p.run << " offset " << red.runs[p.run].offset_s << " applied " << red.runs[p.run].offset_applied << " snr " << red.runs[p.run].offset_snr << " spurious " << red.runs[p.run].spurious_delay_s << " vis2 " << p.vis2 << " +- " << p.vis2_err);
      CHECK(p.flag.empty());
      m.push_back({p.u_m, p.v_m, in.lambda_m, p.vis2, p.vis2_err, p.mjd});
    }
    FitOptions fo;
    FitResult fit = fit_vis2(m, fo);
    REQUIRE(fit.usable());
    pulls.push_back((fit.params[0].value - truth.diameter_rad()) / fit.params[0].error);
  }
  double mean = std::accumulate(pulls.begin(), pulls.end(), 0.0) / double(pulls.size());
  double var = 0;
  for (double p : pulls) var += (p - mean) * (p - mean);
  double sd = std::sqrt(var / double(pulls.size() - 1));
  INFO("pull mean " << mean << " sd " << sd);
  CHECK(std::fabs(mean) <= 0.2);   // acceptance of the closure requirement (N(0,1) pulls)
  CHECK(sd >= 0.8);
  CHECK(sd <= 1.2);
}

TEST_CASE("uncalibrated data (zero_baseline = free): nominal normalisation, c0 fitted with the diameter") {
  // True zero-baseline factor 0.7, none recorded. Dividing by the filter's tau_c/2 (models.md §1.9) gives
  // c0 |V|^2, and a fit with c0 free recovers both; the file alone cannot be calibrated.
  const Model truth(ModelKind::UniformDisk, {1.0 * kMasToRad});
  const Instrument in = test_instrument();
  SimOptions so;
  so.frame_s = 10;
  so.window_bins = 48;
  so.seed = 11;
  so.zero_baseline_factor = 0.7;
  so.zero_baseline_error = -1;
  const CorrelationSet data = simulate_correlations(test_site(), in, test_runs(truth, 1.5e-5, 1.0), so);
  ReduceOptions ro;
  ro.chunk_s = 600;
  CHECK_THROWS_AS(reduce_correlations(data, ro, ZeroBaselineSpec{}), siiplan::InputError);
  ZeroBaselineSpec nominal;
  nominal.source = ZeroBaselineSpec::Source::Nominal;
  const Reduction red = reduce_correlations(data, ro, nominal);
  REQUIRE(!red.runs.empty());
  check_close(red.runs[0].zero_baseline_s, 0.5 * coherence_time_s(in), 1e-15, 0, "A0 = tau_c/2");
  std::vector<Vis2Measurement> m;
  for (const auto& p : red.points) m.push_back({p.u_m, p.v_m, in.lambda_m, p.vis2, p.vis2_err, p.mjd});
  FitOptions fo;
  fo.norm.mode = NormMode::Free;
  const FitResult fit = fit_vis2(m, fo);
  REQUIRE(fit.usable());
  INFO("theta " << fit.params[0].value / kMasToRad << " +- " << fit.params[0].error / kMasToRad << " mas, c0 "
                << fit.norm() << " +- " << fit.params.back().error);
  CHECK(std::fabs(fit.params[0].value - truth.diameter_rad()) <= 4 * fit.params[0].error);
  CHECK(std::fabs(fit.norm() - 0.7) <= 4 * fit.params.back().error);
  CHECK(fit.params.back().error < 0.1);
}

TEST_CASE("closure: the reduced SNR matches astro::sigma_vis2 within 10 %") {
  // Unresolved star (|V|^2 = 1); sky-free, so the only dilution is the dark rate, as in sigma_vis2.
  const Model truth(ModelKind::UniformDisk, {0.01 * kMasToRad});
  const Site site = test_site();
  const Instrument in = test_instrument();
  auto runs = test_runs(truth, 1.0e-5, 1.0);
  runs.resize(1);
  SimOptions so;
  so.frame_s = 5;
  so.seed = 3;
  CorrelationSet data = simulate_correlations(site, in, runs, so);
  ReduceOptions ro;
  ro.chunk_s = 10;
  Reduction red = reduce_correlations(data, ro, ZeroBaselineSpec{});
  REQUIRE(red.points.size() >= 300);
  const auto& m = runs[0].meta;
  const double area_tel = kPi * 4.0 * 4.0 / 4.0;
  double sigma = sigma_vis2(in, area_tel, area_tel, 1.0e-5, 1.0e-5, 0, 0, 10.0);
  double s = 0, s2 = 0, err = 0;
  for (const auto& p : red.points) {
    s += p.vis2;
    s2 += p.vis2 * p.vis2;
    err += p.vis2_err;
  }
  const double n = double(red.points.size());
  double mean = s / n, sd = std::sqrt((s2 - n * mean * mean) / (n - 1));
  (void)m;
  check_close(sd, sigma, 0.10, 0, "scatter of the reduced |V|^2 vs sigma_vis2");
  check_close(err / n, sigma, 0.10, 0, "reported error vs sigma_vis2");
  check_close(mean, 1.0, 0, 4 * sd / std::sqrt(n), "mean |V|^2 of an unresolved star");
}

TEST_CASE("faults are detected or flagged and do not bias |V|^2") {
  const Model truth(ModelKind::UniformDisk, {0.01 * kMasToRad});
  const Site site = test_site();
  const Instrument in = test_instrument();
  auto runs = test_runs(truth, 1.5e-5, 1.0);
  SimOptions so;
  so.frame_s = 5;
  so.seed = 5;
  const double t0 = runs[0].start_mjd;
  ReduceOptions ro;
  ro.chunk_s = 300;

  auto mean_vis2 = [](const Reduction& red) {
    double sw = 0, swy = 0;
    for (const auto& p : red.points)
      if (p.flag.empty()) {
        sw += 1 / (p.vis2_err * p.vis2_err);
        swy += p.vis2 / (p.vis2_err * p.vis2_err);
      }
    return std::pair{swy / sw, 1 / std::sqrt(sw)};
  };

  SUBCASE("timing offset on one telescope: found, applied, |V|^2 unbiased") {
    so.faults.timing_offsets = {{"B", 1.5e-9}};
    Reduction red = reduce_correlations(simulate_correlations(site, in, runs, so), ro, ZeroBaselineSpec{});
    // Pair A-B: telescope 2 late by 1.5 ns -> peak at -1.5 ns; B-C: telescope 1 -> +1.5 ns.
    check_close(red.runs[0].offset_s, -1.5e-9, 0, 0.05e-9, "A-B offset");
    CHECK(red.runs[0].offset_applied);
    check_close(red.runs[2].offset_s, 1.5e-9, 0, 0.05e-9, "B-C offset");
    CHECK_FALSE(red.runs[1].offset_applied);   // A-C unaffected
    auto [v, e] = mean_vis2(red);
    check_close(v, 1.0, 0, 4 * e, "mean |V|^2");
  }
  SUBCASE("spurious correlation at a fixed delay: reported, masked, |V|^2 unbiased") {
    so.window_bins = 96;
    so.faults.spurious = {{"A-C", 3e-9, 5e-14}};   // 17 % of the star peak
    Reduction red = reduce_correlations(simulate_correlations(site, in, runs, so), ro, ZeroBaselineSpec{});
    check_close(red.runs[1].spurious_delay_s, 3e-9, 0, 0.1e-9, "spurious delay found");
    CHECK(std::isnan(red.runs[0].spurious_delay_s));
    auto [v, e] = mean_vis2(red);
    check_close(v, 1.0, 0, 4 * e, "mean |V|^2");
  }
  SUBCASE("telescope drop-out: frames rejected, chunks flagged, |V|^2 unbiased") {
    so.faults.outages = {{"C", t0 + 600 / kSecondsPerDay, t0 + 1500 / kSecondsPerDay}};
    Reduction red = reduce_correlations(simulate_correlations(site, in, runs, so), ro, ZeroBaselineSpec{});
    CHECK(red.runs[1].frames_rate_drop == 180);   // 900 s / 5 s frames on A-C
    CHECK(red.runs[2].frames_rate_drop == 180);
    CHECK(red.runs[0].frames_rate_drop == 0);
    CHECK(red.runs[1].chunks_flagged + red.runs[1].chunks_empty >= 2);
    auto [v, e] = mean_vis2(red);
    check_close(v, 1.0, 0, 4 * e, "mean |V|^2");
  }
  SUBCASE("cloud: heavy part rejected, thin part corrected for dilution, |V|^2 unbiased") {
    so.faults.clouds = {{t0 + 600 / kSecondsPerDay, t0 + 1200 / kSecondsPerDay, 0.1},
                        {t0 + 1800 / kSecondsPerDay, t0 + 2400 / kSecondsPerDay, 0.7}};
    Reduction red = reduce_correlations(simulate_correlations(site, in, runs, so), ro, ZeroBaselineSpec{});
    for (const auto& r : red.runs) CHECK(r.frames_rate_drop == 120);
    auto [v, e] = mean_vis2(red);
    check_close(v, 1.0, 0, 4 * e, "mean |V|^2");
  }
}

TEST_CASE("untracked delays: peaks follow w/c and are realigned") {
  const Model truth(ModelKind::UniformDisk, {1.0 * kMasToRad});
  const Site site = test_site();
  const Instrument in = test_instrument();
  auto runs = test_runs(truth, 1.5e-5, 0.5);
  SimOptions so;
  so.frame_s = 10;
  so.seed = 9;
  so.track_delay_online = false;
  CorrelationSet data = simulate_correlations(site, in, runs, so);
  CHECK(data.runs[2].delay.bins > 200);   // the window follows ~90 ns of delay change
  ReduceOptions ro;
  ro.chunk_s = 300;
  Reduction red = reduce_correlations(data, ro, ZeroBaselineSpec{});
  double chi2 = 0;
  for (const auto& p : red.points) {
    double model = truth.vis2(p.u_m / in.lambda_m, p.v_m / in.lambda_m);
    chi2 += std::pow((p.vis2 - model) / p.vis2_err, 2);
    CHECK_FALSE(red.runs[p.run].offset_applied);
  }
  double n = double(red.points.size());
  CHECK(chi2 < n + 4 * std::sqrt(2 * n));
}

TEST_CASE("calibration on an unresolved calibrator star carries its error as a correlated error") {
  const Site site = test_site();
  const Instrument in = test_instrument();
  auto sci = test_runs(Model(ModelKind::UniformDisk, {1.0 * kMasToRad}), 1.5e-5, 1.0);
  auto cal = test_runs(Model(ModelKind::UniformDisk, {0.05 * kMasToRad}), 1.5e-5, 1.0);
  for (auto& r : cal) {
    r.meta.target_name = "cal";
    r.start_mjd += 0.05;
    r.end_mjd += 0.05;
  }
  sci.insert(sci.end(), cal.begin(), cal.end());
  SimOptions so;
  so.frame_s = 10;
  so.seed = 21;
  so.zero_baseline_factor = 0.8;
  so.zero_baseline_error = -1;   // nothing recorded: must be measured
  CorrelationSet data = simulate_correlations(site, in, sci, so);
  ReduceOptions ro;
  ro.chunk_s = 600;
  CHECK_THROWS_AS(reduce_correlations(data, ro, ZeroBaselineSpec{}), siiplan::InputError);
  ZeroBaselineSpec z;
  z.source = ZeroBaselineSpec::Source::Calibrator;
  z.calibrator = "cal";
  z.calibrator_model = Model(ModelKind::UniformDisk, {0.05 * kMasToRad});
  Reduction red = reduce_correlations(data, ro, z);
  const double a0_true = 0.8 * 0.5 * coherence_time_s(in);
  const auto& r0 = red.runs[0];
  check_close(r0.zero_baseline_s, a0_true, 0, 4 * r0.zero_baseline_err_s, "A0 from the calibrator");
  for (const auto& p : red.points) check_close(p.vis2_cal_err, std::fabs(p.vis2) * r0.zero_baseline_err_s / r0.zero_baseline_s, 1e-12, 0, "correlated error");
}

}  // TEST_SUITE
