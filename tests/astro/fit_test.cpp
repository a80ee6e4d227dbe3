// Tests of astro/fit: recovery of known truths, uncertainty calibration (Monte-Carlo pulls), the Fisher
// values of models.md §5.5, agreement with scipy.optimize.curve_fit on a committed data set, and a
// UD -> LD conversion against Hanbury Brown, Davis & Allen 1974.
#include "astro/fit.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <map>
#include <random>
#include <vector>

#include "astro/errors.hpp"
#include "astro/limb_conversion.hpp"
#include "astro/units.hpp"
#include "io/csv.hpp"
#include "support/close.hpp"

using namespace siiplan::astro;
using siiplan::test::check_close;

namespace {

constexpr double kLambda_m = 420e-9;
constexpr double kTheta_rad = 0.5 * kMasToRad;

// Measurements of `model` (times c0) at the given baselines along PA pa_rad, sigma absolute, noise from rng
// (nullptr = noise-free).
std::vector<Vis2Measurement> simulate(const Model& model, const std::vector<double>& baselines_m, double pa_rad,
                                      double sigma, std::mt19937_64* rng, double c0 = 1.0, double lambda_m = kLambda_m) {
  std::normal_distribution<double> noise(0.0, sigma);
  std::vector<Vis2Measurement> out;
  for (double b : baselines_m) {
    Vis2Measurement m;
    m.u_m = b * std::sin(pa_rad);
    m.v_m = b * std::cos(pa_rad);
    m.lambda_m = lambda_m;
    m.vis2 = c0 * model.vis2(m.u_m / lambda_m, m.v_m / lambda_m) + (rng ? noise(*rng) : 0.0);
    m.vis2_err = sigma;
    out.push_back(m);
  }
  return out;
}

std::vector<double> range(double b0, double b1, double step) {
  std::vector<double> v;
  for (double b = b0; b <= b1 + 1e-9; b += step) v.push_back(b);
  return v;
}

FitOptions ud_options(NormMode mode) {
  FitOptions o;
  o.kind = ModelKind::UniformDisk;
  o.norm.mode = mode;
  return o;
}

}  // namespace

TEST_SUITE("astro/fit") {

TEST_CASE("noise-free uniform disk: truth recovered, errors equal the Fisher values of models.md §5.5") {
  Model ud(ModelKind::UniformDisk, {kTheta_rad});
  auto data = simulate(ud, range(20, 200, 20), 0.3, 0.02, nullptr);  // 10 points, sigma = 0.02 absolute
  auto fixed = fit_vis2(data, ud_options(NormMode::Fixed));
  CHECK(fixed.status == FitStatus::Converged);
  INFO(fixed.status_text);
  check_close(fixed.params[0].value, kTheta_rad, 1e-9, 0, "theta, c0 fixed");
  check_close(fixed.chi2, 0, 0, 1e-15, "chi2 of exact data");
  // models.md §5.5 (Fisher, computed with mpmath): 0.005971 mas with c0 fixed, 0.007409 with c0 free.
  check_close(fixed.params[0].error * kRadToMas, 0.005971, 2e-4, 0, "sigma_theta, c0 fixed");
  CHECK(std::isnan(fixed.params[1].error));  // norm is fixed: no error

  auto free = fit_vis2(data, ud_options(NormMode::Free));
  CHECK(free.status == FitStatus::Converged);
  check_close(free.params[0].value, kTheta_rad, 1e-9, 0, "theta, c0 free");
  check_close(free.norm(), 1.0, 1e-9, 0, "c0 free");
  check_close(free.params[0].error * kRadToMas, 0.007409, 2e-4, 0, "sigma_theta, c0 free");
  check_close(free.params[1].error, 0.0147, 5e-3, 0, "sigma_c0 (models.md §5.5)");
  check_close(free.correlation(0, 1), 0.592, 2e-3, 0, "corr(theta, c0) (models.md §5.5)");
  CHECK(free.n_free == 2);
  CHECK(free.dof == 8);
  check_close(free.aic, free.chi2 + 4, 1e-12, 0, "AIC = chi2 + 2k");
}

TEST_CASE("a c0 prior sits between fixed and free, and counts as one datum") {
  Model ud(ModelKind::UniformDisk, {kTheta_rad});
  auto data = simulate(ud, range(20, 200, 20), 0.0, 0.02, nullptr);
  FitOptions o = ud_options(NormMode::Prior);
  o.norm.error = 0.01;
  auto r = fit_vis2(data, o);
  CHECK(r.usable());
  CHECK(r.n_data == 11);
  CHECK(r.dof == 9);
  // Information adds: 1/sigma_c0^2 = 1/0.0147^2 + 1/0.01^2, so sigma_theta lies strictly between.
  CHECK(r.params[0].error * kRadToMas > 0.005971);
  CHECK(r.params[0].error * kRadToMas < 0.007409);
  check_close(r.params[1].error, 1 / std::sqrt(1 / (0.0147 * 0.0147) + 1 / (0.01 * 0.01)), 1e-2, 0,
              "sigma_c0 combines data and prior");
}

TEST_CASE("Monte-Carlo: 500 seeded realisations give pulls with mean 0 and standard deviation 1") {
  // models.md §5.5 set-up: UD 0.5 mas, 420 nm, 10 baselines 20..200 m, sigma = 0.02 absolute.
  Model ud(ModelKind::UniformDisk, {kTheta_rad});
  for (NormMode mode : {NormMode::Fixed, NormMode::Free}) {
    CAPTURE(int(mode));
    std::mt19937_64 rng(20240611);
    constexpr int kRuns = 500;
    double sum = 0, sum2 = 0, sum_theta = 0, sum_theta2 = 0;
    int usable = 0;
    for (int k = 0; k < kRuns; ++k) {
      auto data = simulate(ud, range(20, 200, 20), 0.0, 0.02, &rng);
      auto r = fit_vis2(data, ud_options(mode));
      if (!r.usable()) continue;
      ++usable;
      double pull = (r.params[0].value - kTheta_rad) / r.params[0].error;
      sum += pull;
      sum2 += pull * pull;
      sum_theta += r.params[0].value;
      sum_theta2 += r.params[0].value * r.params[0].value;
    }
    CHECK(usable == kRuns);
    double mean = sum / usable, sd = std::sqrt(sum2 / usable - mean * mean);
    double sd_theta = std::sqrt(sum_theta2 / usable - std::pow(sum_theta / usable, 2)) * kRadToMas;
    MESSAGE("pull mean " << mean << ", pull std " << sd << ", std(theta) " << sd_theta << " mas");
    // Mean: 3 standard errors of the mean of 500 unit pulls (3/sqrt(500) = 0.134).
    check_close(mean, 0, 0, 0.134, "pull mean");
    check_close(sd, 1, 0, 0.07, "pull standard deviation (1 +- 0.07, issue requirement)");
    // models.md §5.5 Monte-Carlo (4000 sets, curve_fit): std(theta) 0.00584 fixed / 0.00731 free; with 500
    // sets the standard deviation is known to ~3.2 % (1/sqrt(2*500)), so allow 10 %.
    check_close(sd_theta, mode == NormMode::Fixed ? 0.00584 : 0.00731, 0.10, 0, "std(theta) against models.md §5.5");
  }
}

TEST_CASE("same best values and errors as scipy.optimize.curve_fit (scripts/make_ref_curvefit.py)") {
  // tests/data/curvefit_data.csv and tests/data/curvefit_ref.csv, computed with scipy 1.10.1
  // curve_fit (method 'lm', tolerances 1e-15) by scripts/make_ref_curvefit.py.
  auto data_table = siiplan::io::read_csv(std::string(SIIPLAN_TEST_DATA_DIR) + "/curvefit_data.csv");
  std::vector<Vis2Measurement> data;
  auto cb = data_table.require("baseline_m", ""), cl = data_table.require("wavelength_nm", ""),
       cv = data_table.require("vis2", ""), ce = data_table.require("vis2_err", "");
  for (const auto& row : data_table.rows())
    data.push_back({0.0, data_table.number(row, cb), data_table.number(row, cl) * kNmToM, data_table.number(row, cv),
                    data_table.number(row, ce)});
  auto ref_table = siiplan::io::read_csv(std::string(SIIPLAN_TEST_DATA_DIR) + "/curvefit_ref.csv");
  std::map<std::string, std::vector<double>> ref;  // "case/parameter" -> value, error unscaled, error scaled
  auto rc = ref_table.require("case", ""), rp = ref_table.require("parameter", ""), rv = ref_table.require("value", ""),
       ru = ref_table.require("error_unscaled", ""), rs = ref_table.require("error_scaled", "");
  for (const auto& row : ref_table.rows())
    ref[ref_table.text(row, rc) + "/" + ref_table.text(row, rp)] = {
        ref_table.number(row, rv), ref_table.number(row, ru), ref_table.number(row, rs)};
  REQUIRE(ref.size() == 5);

  struct Case {
    const char* name;
    FitOptions options;
  };
  FitOptions ud = ud_options(NormMode::Free);
  FitOptions ld;
  ld.kind = ModelKind::LinearLD;
  ld.norm.mode = NormMode::Free;
  ld.start = {std::nullopt, 0.6};
  ld.fixed = {false, true};
  FitOptions ud_fixed = ud_options(NormMode::Fixed);
  for (const Case& c : {Case{"ud_free_norm", ud}, Case{"ld_linear_u0.6_free_norm", ld}, Case{"ud_fixed_norm", ud_fixed}}) {
    CAPTURE(c.name);
    auto r = fit_vis2(data, c.options);
    INFO(r.status_text);
    CHECK(r.status == FitStatus::Converged);
    for (const auto& p : r.params) {
      if (!p.free) continue;
      auto it = ref.find(std::string(c.name) + "/" + p.name);
      REQUIRE(it != ref.end());
      double scale = p.user_per_internal;
      check_close(p.value * scale, it->second[0], 1e-6, 0, p.name + " value");
      check_close(p.error * scale, it->second[1], 1e-3, 0, p.name + " error (absolute_sigma=True)");
      check_close(p.error_scaled * scale, it->second[2], 1e-3, 0, p.name + " error (absolute_sigma=False)");
    }
  }
}

TEST_CASE("UD fit converted to LD reproduces Hanbury Brown, Davis & Allen 1974 for Sirius") {
  // Hanbury Brown, Davis & Allen 1974 (MNRAS 167, 121), alpha CMa: theta_UD = 5.60 mas, theta_LD =
  // 5.89 +- 0.16 mas (sensitivity.md §5.2, marked there as from memory; the ratio 1.052 implies a
  // linear coefficient u ~ 0.6 at 443 nm through the Hanbury Brown et al. 1974b formula, §5.3). The
  // test simulates Narrabri-like first-lobe data of a linear-LD star (theta_LD = 5.89 mas, u = 0.6,
  // 443 nm, baselines 4-18 m, sigma 0.01), fits a UD and converts it back with the HB74 formula.
  const double lambda = 443e-9, u = 0.6;
  Model star(ModelKind::LinearLD, {5.89 * kMasToRad, u});
  std::mt19937_64 rng(1974);
  auto data = simulate(star, range(4, 18, 1), 0.0, 0.01, &rng, 1.0, lambda);
  auto r = fit_vis2(data, ud_options(NormMode::Fixed));
  REQUIRE(r.usable());
  Model law(ModelKind::LinearLD, {kMasToRad, u});
  double theta_ud = r.params[0].value;
  double theta_ld = ld_model_from_ud(theta_ud, law, LimbCriterion::ShortBaseline).diameter_rad();
  double published_ratio = 5.89 / 5.60;
  MESSAGE("theta_UD " << theta_ud * kRadToMas << " mas, theta_LD " << theta_ld * kRadToMas << " mas, ratio "
                      << theta_ld / theta_ud << " (HB74 u=0.6: " << hb74_ld_over_ud_ratio(u) << ")");
  check_close(theta_ld * kRadToMas, 5.89, 0, 0.16, "theta_LD within the published error");
  check_close(theta_ld / theta_ud, published_ratio, 0.16 / 5.89, 0, "LD/UD ratio within the published relative error");
  check_close(theta_ud * kRadToMas, 5.60, 0, 0.16, "theta_UD near the published UD value");
}

TEST_CASE("limb-darkened fit with a fixed coefficient, and bounds by reparameterisation") {
  Model star(ModelKind::LinearLD, {0.8 * kMasToRad, 0.45});
  auto data = simulate(star, range(10, 150, 10), 0.0, 0.01, nullptr);
  FitOptions o;
  o.kind = ModelKind::LinearLD;
  o.start = {std::nullopt, 0.45};
  o.fixed = {false, true};
  auto r = fit_vis2(data, o);
  CHECK(r.status == FitStatus::Converged);
  check_close(r.params[0].value, 0.8 * kMasToRad, 1e-9, 0, "theta_LD");
  CHECK(r.params[1].value == 0.45);
  CHECK(!r.params[1].free);
}

TEST_CASE("ellipse: axis ratio and position angle from a grid start") {
  Model star(ModelKind::Ellipse, {1.0 * kMasToRad, 0.7, 30 * kDegToRad});
  std::vector<Vis2Measurement> data;
  for (double pa = 0; pa < 180; pa += 20) {
    auto part = simulate(star, range(15, 120, 15), pa * kDegToRad, 0.01, nullptr);
    data.insert(data.end(), part.begin(), part.end());
  }
  FitOptions o;
  o.kind = ModelKind::Ellipse;
  auto r = fit_vis2(data, o);
  INFO(r.status_text);
  CHECK(r.status == FitStatus::Converged);
  check_close(r.params[0].value * kRadToMas, 1.0, 1e-8, 0, "major axis");
  check_close(r.params[1].value, 0.7, 1e-8, 0, "axis ratio");
  check_close(r.params[2].value * kRadToDeg, 30, 1e-8, 0, "major-axis PA, wrapped into [0, 180)");
  // Fixing the axis ratio at 1 leaves the PA unconstrained: said, with no errors.
  Model round(ModelKind::Ellipse, {1.0 * kMasToRad, 1.0, 0.0});
  auto round_data = simulate(round, range(15, 120, 15), 0.2, 0.01, nullptr);
  o.start = {std::nullopt, 1.0, 10 * kDegToRad};
  o.fixed = {false, true, false};
  auto d = fit_vis2(round_data, o);
  CHECK(d.status == FitStatus::ConvergedDegenerate);
  CHECK(d.status_text.find("major_pa_deg") != std::string::npos);
  CHECK(std::isnan(d.params[2].error));
}

TEST_CASE("binary: separation found by the grid (up to the 180 degree ambiguity of |V|^2)") {
  Model star(ModelKind::Binary, {0.4 * kMasToRad, 0.2 * kMasToRad, 0.4, 3.0 * kMasToRad, 50 * kDegToRad});
  std::vector<Vis2Measurement> data;
  for (double pa = 0; pa < 180; pa += 15) {
    auto part = simulate(star, range(10, 200, 10), pa * kDegToRad, 0.005, nullptr);
    data.insert(data.end(), part.begin(), part.end());
  }
  FitOptions o;
  o.kind = ModelKind::Binary;
  auto r = fit_vis2(data, o);
  INFO(r.status_text);
  CHECK(r.usable());
  check_close(r.chi2, 0, 0, 1e-8, "exact data fitted");
  check_close(r.params[3].value * kRadToMas, 3.0, 1e-6, 0, "separation");
  double pa = r.params[4].value * kRadToDeg;
  CHECK((std::abs(pa - 50) < 1e-4 || std::abs(pa - 230) < 1e-4));
  check_close(r.params[2].value, 0.4, 1e-6, 0, "flux ratio");
}

TEST_CASE("a fit stopped by the iteration limit says so in words") {
  Model ud(ModelKind::UniformDisk, {kTheta_rad});
  std::mt19937_64 rng(7);
  auto data = simulate(ud, range(20, 200, 20), 0.0, 0.02, &rng);
  FitOptions o = ud_options(NormMode::Free);
  o.start = {2.0 * kMasToRad};  // far from the truth, beyond the first null
  o.max_iterations = 1;
  auto r = fit_vis2(data, o);
  CHECK(r.status == FitStatus::IterationLimit);
  CHECK(!r.usable());
  CHECK(r.status_text.find("NOT converged") != std::string::npos);
}

TEST_CASE("bad requests are InputErrors; the bootstrap is reproducible and close to the covariance") {
  Model ud(ModelKind::UniformDisk, {kTheta_rad});
  std::mt19937_64 rng(11);
  auto data = simulate(ud, range(20, 200, 10), 0.0, 0.02, &rng);
  FitOptions fixed_without_value;
  fixed_without_value.fixed = {true};
  CHECK_THROWS_AS(fit_vis2(data, fixed_without_value), siiplan::InputError);
  FitOptions bad_prior = ud_options(NormMode::Prior);
  bad_prior.norm.error = 0;
  CHECK_THROWS_AS(fit_vis2(data, bad_prior), siiplan::InputError);
  CHECK_THROWS_AS(fit_vis2(std::vector<Vis2Measurement>{}, ud_options(NormMode::Fixed)), siiplan::InputError);

  FitOptions o = ud_options(NormMode::Free);
  auto r1 = fit_vis2(data, o);
  auto r2 = r1;
  auto s1 = bootstrap_fit(data, o, r1, {400, 99, false});
  CHECK(bootstrap_fit(data, o, r2, {400, 99, false}).samples == 400);
  CHECK(s1.samples == 400);
  CHECK(r1.params[0].bootstrap_error == r2.params[0].bootstrap_error);  // same seed, same answer
  // Resampling points measures the scatter actually present, like the chi2-scaled covariance error
  // (models.md §5.3 example: 0.01270 bootstrap against 0.01333 scaled). For 19 points the two agree to
  // ~20 % (the spread of a 19-point bootstrap is itself uncertain by ~1/sqrt(2*19) = 16 %).
  MESSAGE("bootstrap " << r1.params[0].bootstrap_error * kRadToMas << " mas, scaled " << r1.params[0].error_scaled * kRadToMas
                       << " mas, unscaled " << r1.params[0].error * kRadToMas << " mas");
  check_close(r1.params[0].bootstrap_error, r1.params[0].error_scaled, 0.3, 0, "bootstrap vs scaled covariance");
  // Nights: every point needs an MJD.
  CHECK_THROWS_AS(bootstrap_fit(data, o, r1, {50, 1, true}), siiplan::InputError);
  for (std::size_t i = 0; i < data.size(); ++i) data[i].mjd = 60000.1 + double(i % 4);  // four nights
  auto s3 = bootstrap_fit(data, o, r1, {100, 3, true});
  CHECK(s3.groups == 4);
  CHECK(s3.samples + s3.failed == 100);
}

}  // TEST_SUITE
