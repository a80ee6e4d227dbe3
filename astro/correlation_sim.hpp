// Simulated correlation data: for each run, frame and delay bin, the expected bunching peak of a star
// model plus noise with the statistics of the detection chain, and faults a real night has.
//
// Model of one frame of one run (astro/correlation.hpp conventions):
//   * (u,v,w) at the frame's mid-time from the geometry module; |V|^2 = model.vis2(u/lambda, v/lambda).
//   * Detected rates per telescope from astro::detector_rates (star and sky spectral flux densities at
//     the telescope, area, efficiency, filter, neutral density to stay below max_rate_hz); the
//     uncorrelated part (sky + dark) dilutes the normalised correlation by d1 d2, d = star/total
//     (sensitivity.md §1.3).
//   * Peak area c0 d1 d2 |V|^2 tau_c / 2 (bunching_area_s), Gaussian response of FWHM tau_el (analog:
//     the equivalent FWHM), at tau = 0 when the delay is tracked online, at the geometric delay w/c
//     otherwise, plus the timing offsets of the two telescopes.
//   * Noise: draw_correlation (photon counting: Poisson accidentals per bin; analog: Gaussian with the
//     equivalent variance).
// The result reproduces the sensitivity module's sigma(|V|^2) for an optimal amplitude fit.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "astro/correlation.hpp"
#include "astro/models.hpp"
#include "astro/sensitivity.hpp"

namespace siiplan::astro {

// A telescope loses the star (and sky) light from start to end: its rate falls to the dark rate.
struct TelescopeOutage {
  std::string telescope;
  double start_mjd = 0, end_mjd = 0;
};
// A cloud dims star and sky at every telescope by `transmission` from start to end.
struct Cloud {
  double start_mjd = 0, end_mjd = 0;
  double transmission = 0.2;
};
// A telescope's time tags are late by offset_s for the whole night (a cable or clock error).
struct TimingOffset {
  std::string telescope;
  double offset_s = 0;
};
// A spurious correlation (e.g. electronic crosstalk) of peak area area_s at a fixed instrumental delay,
// on the pair "T1-T2" (or on every pair when pair is empty), with the shape of the timing response.
struct SpuriousCorrelation {
  std::string pair;
  double delay_s = 0;
  double area_s = 0;
};
struct Faults {
  std::vector<TelescopeOutage> outages;
  std::vector<Cloud> clouds;
  std::vector<TimingOffset> timing_offsets;
  std::vector<SpuriousCorrelation> spurious;
};

// What to simulate for one run.
struct SimRun {
  RunMetadata meta;                  // telescopes, target, filter and mode fields are used; the rest is filled in
  Model model{ModelKind::UniformDisk, {1e-9}};
  double start_mjd = 0, end_mjd = 0;
  // Star spectral photon flux density at each telescope (after extinction), at knots sorted in time
  // (photons m^-2 s^-1 Hz^-1, both polarisations; linear interpolation in between, the end values outside).
  std::vector<double> knot_mjd, n_star_1, n_star_2;
  double n_sky_1 = 0, n_sky_2 = 0;   // sky spectral flux density through each field of view (constant)
};

struct SimOptions {
  std::uint64_t seed = 1;
  double frame_s = 1.0;
  double bin_s = NAN;                 // NaN: timing FWHM / 4
  int window_bins = 64;               // bins around the peak (tracked) or around the delay track
  double zero_baseline_factor = 1.0;  // c0: the true zero-baseline correlation is c0 tau_c / 2
  double zero_baseline_error = 0.0;   // relative 1-sigma error of the recorded zero-baseline value
                                      // (the recorded value is drawn from it); < 0: do not record one
  bool track_delay_online = true;
  Faults faults;
  double max_values = 2e9;            // refuse to make more than this many correlation values
};

// Simulates every run. Throws InputError naming the fault or option when a fault names a telescope
// or pair absent from all runs, a frame length does not fit, or the data would exceed max_values.
CorrelationSet simulate_correlations(const Site& site, const Instrument& instrument, const std::vector<SimRun>& runs,
                                     const SimOptions& options, bool* dubious = nullptr);

// The star spectral photon flux density (same at both telescopes) for which astro::sigma_vis2 of the
// pair equals sigma_target in t_s seconds, by bisection over 12 decades (returns the largest value
// tried when sigma_target is below the instrument's saturation floor).
// Used to rebuild the light of a plan's blocks, which store sigma_vis2 but no magnitudes.
double star_flux_for_sigma(const Instrument& instrument, double area_1_m2, double area_2_m2, double n_sky_1,
                           double n_sky_2, double sigma_target, double t_s);

}  // namespace siiplan::astro
