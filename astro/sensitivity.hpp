// Sensitivity of an intensity interferometer: photon flux, background, SNR and sigma(|V|^2).
// (sensitivity.md §1-3, §7; Hanbury Brown 1974, The Intensity Interferometer, ch. 5 and 9.)
#pragma once

#include <string>

#include "astro/site.hpp"

namespace siiplan::astro {

enum class DetectionMode { Analog, PhotonCounting };
enum class FilterProfile { TopHat, Gaussian };
enum class ZeroBaseline { Calibrated, Free };

// What the instrument file describes (io/ fills it; every field documented in the README).
struct Instrument {
  DetectionMode mode = DetectionMode::Analog;
  double lambda_m = 0;              // filter central wavelength
  double bandwidth_m = 0;           // filter width (FWHM for a Gaussian profile)
  FilterProfile profile = FilterProfile::TopHat;
  double efficiency = 0;            // total detection efficiency alpha in (0,1]
  double electronic_bandwidth_hz = 0;   // analog mode
  double timing_fwhm_s = 0;             // photon-counting mode: Gaussian timing response FWHM
  double excess_noise = 1;          // F (amplitude factor), >= 1
  double correlator_efficiency = 1; // eta_corr in (0,1]
  int channels = 1;                 // independent spectral channels M (SNR x sqrt(M))
  double fov_rad = 0;               // diameter of the field of view on the sky (for the background)
  double max_rate_hz = 0;           // maximum usable detected rate per detector (0 = no limit)
  double dark_rate_hz = 0;          // detector dark counts (or equivalent dark current) per detector
  ZeroBaseline zero_baseline = ZeroBaseline::Calibrated;
  Band band = Band::B;              // photometric band whose magnitudes feed this filter
};

}  // namespace siiplan::astro
