// The night plan as an HDF5 file (plan.h5): written by `siiplan night`, read by `siiplan simulate`.
//
// Layout (HDF5 1.10 C API; every angle in radians, lengths in metres, times as MJD UTC; strings are
// variable-length UTF-8; 2-D datasets are row-major [n_pairs][n_samples]):
//
//   /                       attributes: format = "siiplan-plan", format_version = 1 (int),
//                           date (text YYYY-MM-DD, the evening the night begins),
//                           night_start_mjd_utc, night_end_mjd_utc (the dark window planned),
//                           slot_s (slot length), siiplan_version (text)
//   /site                   attributes: name, lat_rad, lon_east_rad, height_m, pressure_hpa,
//                           temperature_c, humidity, dut1_s, utc_offset_h, min_altitude_rad,
//                           extinction_mag_per_airmass (double[5], bands U,B,V,R,I)
//   /array                  datasets [n_telescopes]: name (text), east_m, north_m, up_m, diameter_m,
//                           area_m2, min_altitude_rad (NaN = the site's limit)
//   /array/pairs            int32 [n_pairs][2]: telescope indices (i, j), baseline from i to j; the
//                           pair order of every per-pair dataset below
//   /instrument             attributes: mode ("analog"|"photon-counting"), lambda_m, bandwidth_m,
//                           profile ("top-hat"|"gaussian"), efficiency, electronic_bandwidth_hz,
//                           timing_fwhm_s, excess_noise, correlator_efficiency, channels (int),
//                           fov_rad, max_rate_hz, dark_rate_hz, zero_baseline ("calibrated"|"free"),
//                           band ("U".."I")
//   /targets                datasets [n_targets]: name (text), ra_rad, dec_rad, model (text, the
//                           models.hpp name: "ud", "ld-linear", ...), diameter_rad,
//                           diameter_estimated (int 0/1), diameter_note (text), priority,
//                           goal_fraction (sigma_theta/theta goal), predicted_sigma_theta_fraction
//                           (after the planned night; NaN when not scheduled), scheduled (int 0/1);
//                           params [n_targets][kMaxModelParams] (internal units, models.hpp order,
//                           NaN-padded), n_params (int)
//   /blocks                 attribute count (int); one group per scheduled block, in time order:
//   /blocks/block_NNNN      (NNNN = 0000, 0001, ...) attributes: target (text), target_index (int,
//                           row of /targets), start_mjd_utc, end_mjd_utc, overhead_s (setup + slew
//                           charged at the block start);
//                           datasets: mjd_utc [n_samples] (sample mid-times), exposure_s [n_samples]
//                           (integration represented by each sample; the first is shortened by the
//                           overhead), u_m, v_m, w_m, vis2, sigma_vis2 [n_pairs][n_samples],
//                           usable uint8 [n_pairs][n_samples] (0 when a telescope of the pair is
//                           below its own altitude limit; sigma_vis2 is NaN there)
//
// sigma_vis2 is the predicted standard deviation of one |V|^2 measurement integrated for exposure_s at
// that sample (same convention as astro/sensitivity.hpp); vis2 the model's |V|^2 there.
#pragma once

#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "astro/sensitivity.hpp"
#include "astro/site.hpp"

namespace siiplan::io {

inline constexpr int kPlanFormatVersion = 1;
inline constexpr int kMaxModelParams = 8;   // width of /targets/params

struct PlanTarget {
  astro::Target target;                        // name, position, model (kind + params), priority, goal
  double predicted_sigma_theta_fraction = NAN; // NaN when not scheduled
  bool scheduled = false;
};

struct PlanBlock {
  std::string target;
  int target_index = 0;
  double start_mjd_utc = 0, end_mjd_utc = 0;
  double overhead_s = 0;
  std::vector<double> mjd_utc;      // [n_samples]
  std::vector<double> exposure_s;   // [n_samples]
  // [n_pairs * n_samples], index p * n_samples + k
  std::vector<double> u_m, v_m, w_m, vis2, sigma_vis2;
  std::vector<std::uint8_t> usable;
  std::size_t samples() const { return mjd_utc.size(); }
};

struct PlanFile {
  std::string date;                 // YYYY-MM-DD
  double night_start_mjd_utc = 0, night_end_mjd_utc = 0;
  double slot_s = 0;
  std::string siiplan_version;
  astro::Site site;
  std::vector<astro::Telescope> telescopes;
  std::vector<astro::TelescopePair> pairs;
  astro::Instrument instrument;
  std::vector<PlanTarget> targets;
  std::vector<PlanBlock> blocks;
};

// Write atomically (io/atomic_file.hpp); RuntimeFailure when HDF5 fails.
void write_plan_h5(const std::filesystem::path& path, const PlanFile& plan);
// Read back; InputError naming the file and the missing/malformed object when it is not a plan file.
// Target positions come back without proper motion (the plan is for one night); magnitudes and the
// extra catalog columns are not stored.
PlanFile read_plan_h5(const std::filesystem::path& path);

}  // namespace siiplan::io
