// Correlation functions: expected bunching peak, noise, amplitude fit, run geometry (astro/correlation.hpp).
#include "astro/correlation.hpp"

#include <algorithm>
#include <cassert>

#include "astro/units.hpp"

namespace siiplan::astro {

namespace {
constexpr double kFwhmPerSigma = 2.3548200450309493;   // 2 sqrt(2 ln 2)

double normal_cdf(double x) { return 0.5 * std::erfc(-x / std::numbers::sqrt2); }
}  // namespace

double equivalent_timing_fwhm_s(double electronic_bandwidth_hz) {
  // sensitivity.md §2.2c: df_eq = sqrt(2 ln2/pi)/(2 tau_el), inverted.
  return std::sqrt(2.0 * std::numbers::ln2 / kPi) / (2.0 * electronic_bandwidth_hz);
}

double bunching_area_s(double vis2, double coherence_time_s, double zero_baseline_factor) {
  return 0.5 * vis2 * coherence_time_s * zero_baseline_factor;   // models.md §1.9, p = 1/2
}

void binned_response(const DelayAxis& axis, double peak_s, double fwhm_s, std::span<double> out) {
  assert(out.size() == std::size_t(axis.bins));
  const double sigma = fwhm_s / kFwhmPerSigma;
  const double half = 0.5 * axis.step_s;
  for (int k = 0; k < axis.bins; ++k) {
    double t = axis.center_s(k) - peak_s;
    // Far tails: exactly zero beyond 12 sigma (Phi difference below 1e-32).
    if (std::fabs(t) > 12.0 * sigma + half) {
      out[std::size_t(k)] = 0.0;
      continue;
    }
    out[std::size_t(k)] = (normal_cdf((t + half) / sigma) - normal_cdf((t - half) / sigma)) / axis.step_s;
  }
}

void ResponseMixture::add(double peak_s, double w) {
  if (!(w > 0)) return;
  long key = std::lround((peak_s - axis_.start_s) / axis_.step_s * kSubBinClasses);
  weight_[key] += w;
  total_ += w;
}

void ResponseMixture::evaluate(double offset_s, std::span<double> out) const {
  std::fill(out.begin(), out.end(), 0.0);
  if (!(total_ > 0)) return;
  std::vector<double> one(out.size());
  for (const auto& [key, w] : weight_) {
    double peak = axis_.start_s + double(key) * axis_.step_s / kSubBinClasses + offset_s;
    binned_response(axis_, peak, fwhm_s_, one);
    for (std::size_t k = 0; k < out.size(); ++k) out[k] += w * one[k];
  }
  for (auto& x : out) x /= total_;
}

double correlation_bin_variance(const Instrument& inst, double rate_1_hz, double rate_2_hz, double frame_s, double bin_s) {
  double factor = inst.excess_noise / inst.correlator_efficiency;
  return factor * factor / (double(std::max(inst.channels, 1)) * rate_1_hz * rate_2_hz * frame_s * bin_s);
}

void draw_correlation(std::mt19937_64& rng, const Instrument& inst, double rate_1_hz, double rate_2_hz, double frame_s,
                      double bin_s, std::span<const double> expected, std::span<float> out) {
  assert(expected.size() == out.size());
  const bool exact_poisson = inst.mode == DetectionMode::PhotonCounting && inst.excess_noise == 1.0 &&
                             inst.correlator_efficiency == 1.0 && inst.channels <= 1;
  if (exact_poisson) {
    const double mu = rate_1_hz * rate_2_hz * frame_s * bin_s;   // accidentals per bin (sensitivity.md §2.2)
    std::poisson_distribution<long long> accidentals(mu);
    for (std::size_t k = 0; k < out.size(); ++k) {
      double n = double(accidentals(rng));
      if (expected[k] > 0) n += double(std::poisson_distribution<long long>(mu * expected[k])(rng));
      out[k] = float(n / mu - 1.0);
    }
    return;
  }
  const double sigma = std::sqrt(correlation_bin_variance(inst, rate_1_hz, rate_2_hz, frame_s, bin_s));
  std::normal_distribution<double> noise(0.0, sigma);
  for (std::size_t k = 0; k < out.size(); ++k) out[k] = float(expected[k] + noise(rng));
}

AmplitudeFit fit_amplitude(std::span<const double> c, std::span<const double> weight, std::span<const double> shape,
                           double peak_fraction, double offpeak_fraction) {
  assert(c.size() == weight.size() && c.size() == shape.size());
  AmplitudeFit fit;
  double hmax = 0;
  for (std::size_t k = 0; k < c.size(); ++k)
    if (weight[k] > 0) hmax = std::max(hmax, shape[k]);
  if (!(hmax > 0)) return fit;
  // Baseline level and scatter from the off-peak bins.
  double sw = 0, swc = 0;
  int n_off = 0;
  for (std::size_t k = 0; k < c.size(); ++k)
    if (weight[k] > 0 && shape[k] <= offpeak_fraction * hmax) {
      sw += weight[k];
      swc += weight[k] * c[k];
      ++n_off;
    }
  fit.offpeak_bins = n_off;
  if (n_off < 3) return fit;
  fit.baseline = swc / sw;
  // The correlation is normalised by the accidentals, so its level far from the peak is 0 by
  // construction: the scatter is taken about 0 and nothing is subtracted (one free parameter only).
  double ss = 0;
  for (std::size_t k = 0; k < c.size(); ++k)
    if (weight[k] > 0 && shape[k] <= offpeak_fraction * hmax) ss += weight[k] * c[k] * c[k];
  fit.scatter = std::sqrt(ss / n_off);
  // One-parameter weighted least squares with the known shape.
  double num = 0, den = 0;
  for (std::size_t k = 0; k < c.size(); ++k) {
    num += weight[k] * c[k] * shape[k];
    den += weight[k] * shape[k] * shape[k];
  }
  fit.area_s = num / den;
  fit.area_err_s = fit.scatter / std::sqrt(den);
  double chi2 = 0;
  int n_peak = 0;
  for (std::size_t k = 0; k < c.size(); ++k)
    if (weight[k] > 0 && shape[k] >= peak_fraction * hmax) {
      double r = c[k] - fit.area_s * shape[k];
      chi2 += weight[k] * r * r;
      ++n_peak;
    }
  fit.peak_bins = n_peak;
  fit.peak_chi2 = chi2 / (fit.scatter * fit.scatter);
  return fit;
}

std::vector<Uvw> pair_uvw_at(const Site& site, const Telescope& a, const Telescope& b, const SkyPosition& position,
                             std::span<const double> mjd_utc, bool* dubious, double step_s) {
  std::vector<Uvw> out;
  out.reserve(mjd_utc.size());
  if (mjd_utc.empty()) return out;
  const BaselineXyz xyz = baseline_xyz(a, b, site.lat_rad);
  // Knots at most step_s apart covering [first, last].
  const double t0 = mjd_utc.front(), t1 = mjd_utc.back();
  const double span_s = (t1 - t0) * kSecondsPerDay;
  const int n_knots = std::max(2, int(std::ceil(span_s / step_s)) + 1);
  const std::size_t nk = std::size_t(n_knots);
  std::vector<double> knot_mjd(nk), ha(nk), dec(nk);
  for (int i = 0; i < n_knots; ++i) {
    double t = t0 + (t1 - t0) * double(i) / double(n_knots - 1);
    Epoch epoch(site, utc_from_mjd(t));
    if (dubious && epoch.dubious_year()) *dubious = true;
    Apparent s = epoch.star(position);
    knot_mjd[std::size_t(i)] = t;
    ha[std::size_t(i)] = s.ha_rad;
    dec[std::size_t(i)] = s.dec_rad;
    if (i > 0) {   // unwrap the hour angle so that it is continuous between knots
      double d = ha[std::size_t(i)] - ha[std::size_t(i - 1)];
      ha[std::size_t(i)] -= kTwoPi * std::round(d / kTwoPi);
    }
  }
  std::size_t j = 0;
  for (double t : mjd_utc) {
    while (j + 2 < knot_mjd.size() && t > knot_mjd[j + 1]) ++j;
    double span = knot_mjd[j + 1] - knot_mjd[j];
    double f = span > 0 ? (t - knot_mjd[j]) / span : 0.0;
    double h = ha[j] + f * (ha[j + 1] - ha[j]);
    double d = dec[j] + f * (dec[j + 1] - dec[j]);
    out.push_back(uvw_from_xyz(xyz, h, d));
  }
  return out;
}

}  // namespace siiplan::astro
