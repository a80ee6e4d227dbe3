// Plain data describing where and with what a team observes, and what it observes.
// Filled by io/ readers (site INI, array CSV, catalogs); used by geometry, sensitivity and the planner.
#pragma once

#include <array>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include "astro/models.hpp"

namespace siiplan::astro {

// Photometric bands with published zero points (Bessell 1979): U, B, V, R, I.
enum class Band { U = 0, B = 1, V = 2, R = 3, I = 4 };
inline constexpr int kBandCount = 5;

struct Site {
  std::string name;
  double lat_rad = 0;          // geodetic latitude (WGS84), north positive
  double lon_east_rad = 0;     // longitude, east positive
  double height_m = 0;         // height above the WGS84 ellipsoid
  double pressure_hpa = 0;     // for refraction of altitude limits only; 0 = refraction off
  double temperature_c = 10;
  double humidity = 0.5;       // relative, 0..1
  double dut1_s = 0;           // UT1 - UTC
  double utc_offset_h = 0;     // local civil time - UTC, for display and for "the night of DATE"
  double min_altitude_rad = 20 * 3.14159265358979323846 / 180;  // horizon / telescope limit
  // Atmospheric extinction (mag per airmass) per band U,B,V,R,I. Default: a good dry site, Patat (2003),
  // A&A 400, 1183, Table A.1 (Paranal), rounded as recommended in geometry.md §4.2.
  std::array<double, kBandCount> extinction_mag_per_airmass{0.45, 0.22, 0.12, 0.08, 0.05};
};

struct Telescope {
  std::string name;
  double east_m = 0, north_m = 0, up_m = 0;  // relative to the site reference point (local ENU)
  double diameter_m = 0;                     // mirror diameter
  double area_m2 = 0;                        // effective collecting area (default pi D^2/4)
  double min_altitude_rad = NAN;             // NaN: use the site's limit
};

// A telescope pair (indices into the array), baseline from telescope i to telescope j.
struct TelescopePair {
  int i = 0, j = 0;
};
inline std::vector<TelescopePair> all_pairs(std::size_t n_telescopes) {
  std::vector<TelescopePair> out;
  for (std::size_t i = 0; i < n_telescopes; ++i)
    for (std::size_t j = i + 1; j < n_telescopes; ++j) out.push_back({int(i), int(j)});
  return out;
}

// A star's catalogue place: ICRS, epoch J2000.0.
struct SkyPosition {
  double ra_rad = 0, dec_rad = 0;
  double pmra_cosdec_rad_per_yr = 0;  // mu_alpha* = dRA/dt cos(dec)
  double pmdec_rad_per_yr = 0;
};

// One catalogue entry for planning.
struct Target {
  std::string name;
  SkyPosition position;
  std::array<double, kBandCount> mag{NAN, NAN, NAN, NAN, NAN};  // NaN = not given
  Model model{ModelKind::UniformDisk, {1e-9}};                  // diameter from the catalog or estimated
  bool diameter_estimated = false;  // true when the diameter was estimated (say how in diameter_note)
  std::string diameter_note;
  double teff_k = NAN;
  double priority = 1;
  double goal_fraction = 0.05;      // sigma_theta / theta goal
  std::vector<std::pair<std::string, std::string>> extra;  // unknown catalog columns, passed through
};

}  // namespace siiplan::astro
