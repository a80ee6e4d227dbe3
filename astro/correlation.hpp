// Correlation functions of intensity interferometry: the data a team records per telescope pair and
// time frame (g2(tau) - 1 over a range of relative delays), the expected bunching peak, the noise of a
// measured correlation, and the optimal amplitude fit of the peak.
//
// Conventions:
//   * A "run" is one telescope pair observing one target over a contiguous span of frames.
//   * The stored correlation is the normalised excess c(tau) = g2(tau) - 1 = <n1(t) n2(t+tau)>/(<n1><n2>) - 1
//     averaged over a delay bin, dimensionless. The delay tau is the arrival time at telescope 1 minus
//     the arrival time at telescope 2 of the pair (geometry.hpp Uvw::delay_s sign: tau_g = w/c > 0 when
//     the wavefront reaches telescope 2 first), so the bunching peak sits at tau = +w/c when the delay is
//     not compensated online, and at tau = 0 (plus any instrumental offset) when it is.
//   * Peak AREA (integral of c over tau, seconds) = p |V|^2 tau_c c0, with p = 1/2 for unpolarised light
//     (models.md §1.9; sensitivity.md §2.1), tau_c the optical coherence time of the filter, and c0 the
//     zero-baseline factor (1 for an ideal instrument). The zero-baseline correlation is that area at
//     |V|^2 = 1: A0 = c0 tau_c / 2.
//   * The peak SHAPE is the timing response, a Gaussian of FWHM tau_el (photon counting), or for an analog
//     chain the Gaussian equivalent to its electronic bandwidth (tau_el = sqrt(2 ln2/pi)/(2 df),
//     sensitivity.md §2.2c).
#pragma once

#include <cmath>
#include <cstdint>
#include <map>
#include <optional>
#include <random>
#include <span>
#include <string>
#include <vector>

#include "astro/geometry.hpp"
#include "astro/sensitivity.hpp"
#include "astro/site.hpp"

namespace siiplan::astro {

// Uniform delay axis: bin k is centred on start_s + k step_s and covers +-step_s/2 around it.
struct DelayAxis {
  double start_s = 0;
  double step_s = 0;
  int bins = 0;
  double center_s(int k) const { return start_s + k * step_s; }
};

// Everything a reader needs to interpret one run, besides its data.
struct RunMetadata {
  Telescope telescope_1, telescope_2;   // names, ENU positions (m) relative to the site, diameters, areas
  std::string target_name;
  SkyPosition target_position;          // ICRS, J2000.0
  double expected_diameter_rad = NAN;   // a uniform-disk size known beforehand (catalog), NaN if none;
                                        // used only to choose the default chunk length
  double lambda_m = 0, bandwidth_m = 0; // filter centre and width (FWHM for a Gaussian profile)
  FilterProfile profile = FilterProfile::TopHat;
  double timing_fwhm_s = 0;             // Gaussian response FWHM (analog: the equivalent one)
  DetectionMode mode = DetectionMode::PhotonCounting;
  bool delay_tracked_online = true;     // true: the correlator followed the geometric delay
  double background_1_hz = 0, background_2_hz = 0;  // known uncorrelated part of each rate (dark + sky)
  double zero_baseline_s = NAN;         // zero-baseline correlation A0 (peak area at |V|^2=1) if known
  double zero_baseline_err_s = NAN;     // its 1-sigma error
};

// One run: metadata and per-frame data.
struct CorrelationRun {
  RunMetadata meta;
  double frame_s = 0;                   // frame length
  std::vector<double> frame_start_mjd;  // [frames], UTC
  DelayAxis delay;
  std::vector<float> correlation;       // [frames][bins] row-major, c = g2 - 1
  std::vector<double> rate_1_hz, rate_2_hz;   // [frames] mean detected rate per telescope
  std::size_t frames() const { return frame_start_mjd.size(); }
  const float* frame(std::size_t f) const { return correlation.data() + f * std::size_t(delay.bins); }
};

struct CorrelationSet {
  Site site;
  std::string creator;                  // program and version that wrote the data
  std::vector<CorrelationRun> runs;
};

// ---------------------------------------------------------------------------------------------------
// Peak shape and expected correlation
// ---------------------------------------------------------------------------------------------------

// Gaussian FWHM equivalent, for the optimal amplitude fit, to an analog chain of flat electronic
// bandwidth df_hz: tau_el = sqrt(2 ln2/pi)/(2 df) (sensitivity.md §2.2c: the photon-counting and analog
// SNR formulas coincide for this pair).
double equivalent_timing_fwhm_s(double electronic_bandwidth_hz);

// Area of the bunching peak (s): p |V|^2 tau_c c0 with p = 1/2, unpolarised light.
// References: models.md §1.9 (Siegert relation, p = 1/2 for two unpolarised detectors, Mandel & Wolf
// 1995); sensitivity.md §2.1 (area = 1/2 |V|^2 tau_c).
double bunching_area_s(double vis2, double coherence_time_s, double zero_baseline_factor);

// Bin-averaged unit-area Gaussian response centred on peak_s:
//   h_k = [Phi((t_k + step/2 - peak)/sigma) - Phi((t_k - step/2 - peak)/sigma)] / step     (1/s)
// with sigma = fwhm/(2 sqrt(2 ln 2)). sum_k h_k step -> 1 when the axis covers the peak.
// Writes into out[k] for every bin (out.size() == axis.bins).
void binned_response(const DelayAxis& axis, double peak_s, double fwhm_s, std::span<double> out);

// The mean response of a set of frames whose peaks sit at slightly different positions (delay
// tracking in whole bins leaves a sub-bin residual per frame): the weighted mixture of their binned
// responses, normalised by the total weight. Positions are grouped on a grid of step/kSubBinClasses
// (a shift of at most step/128 of a response at least 2 steps wide: shape change < 1e-4 of its peak).
class ResponseMixture {
 public:
  static constexpr int kSubBinClasses = 64;
  ResponseMixture(const DelayAxis& axis, double fwhm_s) : axis_(axis), fwhm_s_(fwhm_s) {}
  // A frame whose peak is at peak_s on the axis, with weight w.
  void add(double peak_s, double w);
  // The mean response, shifted by offset_s, into out (size axis.bins). No weight -> zeros.
  void evaluate(double offset_s, std::span<double> out) const;
  double total_weight() const { return total_; }

 private:
  DelayAxis axis_;
  double fwhm_s_;
  std::map<long, double> weight_;   // grid position (units of step/kSubBinClasses) -> weight
  double total_ = 0;
};

// ---------------------------------------------------------------------------------------------------
// Noise
// ---------------------------------------------------------------------------------------------------

// Variance of one bin of the normalised correlation of one frame:
//   var = (F/eta)^2 / (M N1 N2 T delta)
// N1, N2 total detected rates (Hz), T the frame length, delta the bin width, F the excess-noise
// factor, eta the correlator efficiency, M the number of spectral channels combined.
// Photon counting: the accidental coincidences per bin are Poisson with mean N1 N2 T delta
// (sensitivity.md §2.2), so with F = eta = M = 1 the normalised value has exactly this variance.
// Analog: the same (shot noise of the photocurrents, sensitivity.md §1.2), which with the equivalent
// Gaussian width of equivalent_timing_fwhm_s() gives the analog SNR of sensitivity.md §1.1 for the optimal fit.
double correlation_bin_variance(const Instrument& inst, double rate_1_hz, double rate_2_hz, double frame_s, double bin_s);

// Draws one frame of measured correlation: out[k] = expected[k] + noise.
// Photon counting with F = eta = M = 1: coincidences per bin are drawn as Poisson(mu) + Poisson(mu
// expected[k]) (expected[k] >= 0; the sum of independent Poisson variables is Poisson(mu (1 + c_k)),
// exact) with mu = N1 N2 T delta, then normalised, c = counts/mu - 1. Otherwise (analog, or noise
// factors other than 1) Gaussian with correlation_bin_variance(). expected.size() == out.size().
void draw_correlation(std::mt19937_64& rng, const Instrument& inst, double rate_1_hz, double rate_2_hz,
                      double frame_s, double bin_s, std::span<const double> expected, std::span<float> out);

// ---------------------------------------------------------------------------------------------------
// Amplitude fit
// ---------------------------------------------------------------------------------------------------

struct AmplitudeFit {
  double area_s = NAN;         // fitted peak area
  double area_err_s = NAN;     // its 1-sigma error, from the off-peak scatter
  double baseline = NAN;       // mean level of c far from the peak (a diagnostic; 0 when normalised)
  double scatter = NAN;        // rms of c per unit weight in the off-peak bins
  double peak_chi2 = NAN;      // sum over peak bins of weighted squared residuals / scatter^2
  int peak_bins = 0, offpeak_bins = 0;
  double snr() const { return area_s / area_err_s; }
};

// One-parameter weighted least-squares fit of the peak area with a known shape (the optimal estimator
// when shape and position are known; Guerin et al. 2025, arXiv:2503.22446, sensitivity.md §2.2a):
//   a = sum_k W_k c_k h_k / sum_k W_k h_k^2,   err(a) = s / sqrt(sum_k W_k h_k^2)
// where h is the unit-area response (1/s), W_k the relative weight of bin k (0 = masked; the variance of
// c_k is s^2/W_k) and s^2 = sum_off W_k c_k^2 / n_off the off-peak scatter. c is normalised by the
// accidentals (its level is 0 away from the peak), so no baseline is fitted: one parameter only.
// Peak bins are those where h_k >= peak_fraction * max h; off-peak bins those with
// h_k <= offpeak_fraction * max h. Needs >= 3 off-peak bins (else area = NaN).
AmplitudeFit fit_amplitude(std::span<const double> c, std::span<const double> weight, std::span<const double> shape,
                           double peak_fraction = 1e-3, double offpeak_fraction = 1e-6);

// ---------------------------------------------------------------------------------------------------
// Geometry of a run
// ---------------------------------------------------------------------------------------------------

// (u,v,w) of the pair at many instants (MJD UTC, sorted): the source's apparent hour angle and
// declination come from astro::Epoch at instants at most step_s apart and are interpolated linearly in
// between (the hour angle is linear in time to 1e-9 relative over minutes), then baseline_uvw().
// dubious is set when ERFA flagged a date beyond its leap-second table.
std::vector<Uvw> pair_uvw_at(const Site& site, const Telescope& a, const Telescope& b, const SkyPosition& position,
                             std::span<const double> mjd_utc, bool* dubious = nullptr, double step_s = 60.0);

}  // namespace siiplan::astro
