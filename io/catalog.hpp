// Target catalogs (CSV) and the angle notation shared with the command line (--ra, --dec).
//
// Catalog columns (case-insensitive; '#' comment lines allowed):
//   name                 required, unique
//   ra                   required: degrees 0..360 ("83.633") or hours "hh:mm:ss.s" (ICRS, epoch J2000.0)
//   dec                  required: degrees -90..90 or "+-dd:mm:ss.s"
//   pmra_mas_per_yr      mu_alpha* = mu_alpha cos(dec), mas/yr (default 0)
//   pmdec_mas_per_yr     mas/yr (default 0)
//   mag_u, mag_b, mag_v, mag_r, mag_i    magnitudes (empty = unknown)
//   diameter_mas         the model's size (astro/models.hpp); empty = unknown (the planner estimates it)
//   model                astro::model_from_name name, default "ud"
//   the model's other parameters under their names (limb_u, limb_a, ..., see astro::model_params)
//   teff_k               effective temperature in K
//   priority             > 0, default 1
//   goal_pct             wanted relative precision on the diameter in percent, > 0, default 5
// Any other column (spectral type, notes, ...) is kept in Target::extra.
// Errors (InputError, file:line): empty file, missing required column, duplicate names, angles out of
// range or malformed, non-numeric numbers, unknown model, a parameter column that the row's model does
// not have, a missing parameter that the model needs.
#pragma once

#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "astro/site.hpp"

namespace siiplan::io {

// Right ascension from "hh:mm:ss.s" / "hh mm ss.s" (hours) or a plain number of degrees in [0, 360).
// Returns radians in [0, 2 pi). InputError naming `where` otherwise.
double parse_ra_rad(std::string_view text, const std::string& where);
// Declination from "+-dd:mm:ss.s" / "+-dd mm ss.s" or a plain number of degrees in [-90, 90]. Radians.
double parse_dec_rad(std::string_view text, const std::string& where);

// Sexagesimal text for people: "05h35m17.30s" and "-05d23m28.0s".
std::string format_ra(double ra_rad);
std::string format_dec(double dec_rad);

std::vector<astro::Target> read_catalog(const std::filesystem::path& path);
std::vector<astro::Target> parse_catalog(const std::string& text, const std::string& source);

// The note put in Target::diameter_note when the catalog gives no diameter.
inline constexpr const char* kNoDiameterNote = "no diameter in catalog";

}  // namespace siiplan::io
