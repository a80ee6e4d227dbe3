// The correlation data file (CORR.h5): written by `siiplan simulate`, read by `siiplan reduce`.
//
// Layout (HDF5 1.10 C API; strings variable-length UTF-8; times MJD UTC; angles in radians, lengths
// in metres, delays and durations in seconds unless the name says otherwise):
//
//   /                      attributes: format = "siiplan-correlation", format_version = 1 (int),
//                          creator (text, program and version)
//   /site                  attributes: name (text), lat_rad, lon_east_rad, height_m, dut1_s
//   /runs                  attribute count (int); one group per run (one telescope pair observing one
//                          target over a contiguous span of frames):
//   /runs/run_NNNN         (NNNN = 0000, 0001, ...)
//     attributes (metadata; every one required):
//       telescope_1, telescope_2 (text)          the pair; delay = arrival time at 1 minus at 2
//       telescope_1_enu_m, telescope_2_enu_m      double[3]: east, north, up relative to the site
//       telescope_1_diameter_m, telescope_2_diameter_m
//       target (text), target_ra_rad, target_dec_rad   ICRS, J2000.0
//       lambda_m, bandwidth_m, filter_profile ("top-hat"|"gaussian")
//       timing_fwhm_s                             Gaussian timing response FWHM (analog: equivalent)
//       detection_mode ("photon-counting"|"analog")
//       delay_tracked_online (int 0/1)            1: the correlator followed the geometric delay
//       frame_s                                   frame length
//       background_1_hz, background_2_hz          uncorrelated (dark + sky) part of each rate
//     optional attributes:
//       zero_baseline_s, zero_baseline_err_s      zero-baseline correlation (peak area at |V|^2 = 1)
//       expected_diameter_rad                     a uniform-disk size known beforehand
//     datasets:
//       frame_start_mjd   double [n_frames]       frame start times
//       delay_s           double [n_bins]         bin centres, uniform spacing
//       correlation       float  [n_frames][n_bins]  g2 - 1 per frame and bin
//       rate_hz           double [n_frames][2]    detected rate of telescope 1 and 2 per frame
//                                                 (analog: photo-electron rate = current/(e gain))
//
// Reading checks everything: a missing object or attribute is an InputError naming it with its path
// ("/runs/run_0002: missing attribute 'target'"); a file that is not HDF5 (or is truncated or
// corrupted), or an HDF5 file from another program, is an InputError naming the file.
#pragma once

#include <filesystem>

#include "astro/correlation.hpp"

namespace siiplan::io {

inline constexpr int kCorrelationFormatVersion = 1;

// Writes atomically (io/atomic_file.hpp); RuntimeFailure when HDF5 fails.
void write_correlation_h5(const std::filesystem::path& path, const astro::CorrelationSet& data);
// Reads the whole file; InputError as described above.
astro::CorrelationSet read_correlation_h5(const std::filesystem::path& path);

}  // namespace siiplan::io
