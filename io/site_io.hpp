// Site (INI) and telescope-array (CSV) files.
//
// Site file, section [site] (other sections, e.g. [constraints], are left to their readers):
//   name            text, required
//   latitude_deg    geodetic WGS84 latitude, north positive, -90..90, required
//   longitude_deg   east positive, -180..360 (stored in -180..180), required
//   height_m        above the WGS84 ellipsoid, -500..9000, required
//   pressure_hpa    0..1100, default 0 = no refraction (refraction only affects altitude limits)
//   temperature_c   -90..60, default 10;  humidity  relative 0..1, default 0.5
//   dut1_s          UT1 - UTC in s (IERS Bulletin A), -1..1, default 0
//   utc_offset_h    local civil time - UTC for display, -14..14, default 0
//   min_altitude_deg  lowest usable altitude of the telescopes, -5..89, default 20
//   extinction_u, extinction_b, extinction_v, extinction_r, extinction_i   mag per airmass, 0..5
// Unknown keys in [site] give a warning (through the `warnings` list), not an error.
//
// Array file (CSV, one telescope per row; '#' comment lines allowed):
//   name, then EITHER east_m,north_m,up_m (local ENU from the site's reference point) OR
//   latitude_deg,longitude_deg,height_m (WGS84, converted to the site's ENU frame), diameter_m (> 0),
//   optional area_m2 (effective collecting area, default pi D^2 / 4), optional min_altitude_deg.
// Errors (InputError with file:line): missing columns, both coordinate kinds, non-numeric or out-of-range
// values, empty or duplicate names, two telescopes closer than 1 cm, no telescope at all.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "astro/site.hpp"

namespace siiplan::io {

// `warnings` receives one line per ignored key (may be null).
astro::Site read_site(const std::filesystem::path& path, std::vector<std::string>* warnings = nullptr);
astro::Site parse_site(const std::string& text, const std::string& source, std::vector<std::string>* warnings = nullptr);

std::vector<astro::Telescope> read_array(const std::filesystem::path& path, const astro::Site& site);
std::vector<astro::Telescope> parse_array(const std::string& text, const std::string& source, const astro::Site& site);

}  // namespace siiplan::io
