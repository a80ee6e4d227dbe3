#include "io/site_io.hpp"

#include <cmath>
#include <map>
#include <set>

#include "astro/errors.hpp"
#include "astro/geometry.hpp"
#include "astro/units.hpp"
#include "io/csv.hpp"
#include "io/ini.hpp"
#include "io/table.hpp"

namespace siiplan::io {

namespace {

using astro::kDegToRad;

// A number from [site] within [lo, hi]; `fallback` when absent (required when fallback is NaN).
double site_number(const IniFile& ini, const std::string& name, double lo, double hi, double fallback,
                   const std::string& hint) {
  const std::string key = "site." + name;
  double v = (std::isnan(fallback) || ini.has(key)) ? ini.number(key, hint) : fallback;
  if (v < lo || v > hi)
    throw InputError(ini.where(key), name + " = " + format_number(v, 10) + " must lie within " + format_number(lo, 10) +
                                         " .. " + format_number(hi, 10),
                     hint);
  return v;
}

const char* const kBandKeys[astro::kBandCount] = {"extinction_u", "extinction_b", "extinction_v", "extinction_r",
                                                  "extinction_i"};

}  // namespace

astro::Site parse_site(const std::string& text, const std::string& source, std::vector<std::string>* warnings) {
  IniFile ini = IniFile::parse(text, source);
  if (!ini.has_section("site"))
    throw InputError(source, "no [site] section", "start the file with a [site] line followed by name, latitude_deg, ...");
  astro::Site s;
  auto name = ini.text("site.name");
  if (!name || name->empty())
    throw InputError(ini.where("site.name"), "missing key 'name' in [site]", "give the site a name, e.g. name = Cerro Example");
  s.name = *name;
  const double req = NAN;
  s.lat_rad = site_number(ini, "latitude_deg", -90, 90, req, "geodetic latitude in degrees, north positive") * kDegToRad;
  double lon = site_number(ini, "longitude_deg", -180, 360, req, "longitude in degrees, EAST positive (west is negative)");
  s.lon_east_rad = std::remainder(lon, 360.0) * kDegToRad;
  s.height_m = site_number(ini, "height_m", -500, 9000, req, "height above the WGS84 ellipsoid in metres");
  s.pressure_hpa = site_number(ini, "pressure_hpa", 0, 1100, 0, "air pressure in hPa, 0 to switch refraction off");
  s.temperature_c = site_number(ini, "temperature_c", -90, 60, s.temperature_c, "air temperature in degrees Celsius");
  s.humidity = site_number(ini, "humidity", 0, 1, s.humidity, "relative humidity as a fraction 0..1");
  s.dut1_s = site_number(ini, "dut1_s", -1, 1, 0, "UT1-UTC in seconds from IERS Bulletin A; |DUT1| < 0.9 s");
  s.utc_offset_h = site_number(ini, "utc_offset_h", -14, 14, 0, "local civil time minus UTC in hours");
  s.min_altitude_rad = site_number(ini, "min_altitude_deg", -5, 89, s.min_altitude_rad / kDegToRad,
                                   "lowest altitude the telescopes can point to, in degrees") *
                       kDegToRad;
  for (int b = 0; b < astro::kBandCount; ++b)
    s.extinction_mag_per_airmass[b] = site_number(ini, kBandKeys[b], 0, 5, s.extinction_mag_per_airmass[b],
                                                  "atmospheric extinction in magnitudes per airmass");
  std::set<std::string> known{"name", "latitude_deg", "longitude_deg", "height_m", "pressure_hpa", "temperature_c",
                              "humidity", "dut1_s", "utc_offset_h", "min_altitude_deg"};
  for (auto* k : kBandKeys) known.insert(k);
  if (warnings)
    for (const auto& key : ini.unknown_keys("site", known))
      warnings->push_back(ini.where(key) + ": unknown key '" + key.substr(5) + "' in [site] is ignored");
  return s;
}

astro::Site read_site(const std::filesystem::path& path, std::vector<std::string>* warnings) {
  return parse_site(read_file_text(path), path.string(), warnings);
}

std::vector<astro::Telescope> parse_array(const std::string& text, const std::string& source, const astro::Site& site) {
  CsvTable t = parse_csv(text, source);
  const std::string header_where = source + ":" + std::to_string(t.header_line());
  auto name_col = t.require("name", "the first column names each telescope");
  bool enu = t.find("east_m") || t.find("north_m") || t.find("up_m");
  bool geo = t.find("latitude_deg") || t.find("longitude_deg") || t.find("height_m");
  if (enu && geo)
    throw InputError(header_where, "both east_m/north_m/up_m and latitude_deg/longitude_deg/height_m columns",
                     "give each telescope's position one way only");
  if (!enu && !geo)
    throw InputError(header_where, "no position columns",
                     "add east_m,north_m,up_m (metres from the site reference) or latitude_deg,longitude_deg,height_m");
  std::size_t c1, c2, c3;
  if (enu) {
    c1 = t.require("east_m", "give east_m, north_m and up_m together");
    c2 = t.require("north_m", "give east_m, north_m and up_m together");
    c3 = t.require("up_m", "give east_m, north_m and up_m together");
  } else {
    c1 = t.require("latitude_deg", "give latitude_deg, longitude_deg and height_m together");
    c2 = t.require("longitude_deg", "give latitude_deg, longitude_deg and height_m together");
    c3 = t.require("height_m", "give latitude_deg, longitude_deg and height_m together");
  }
  auto diam_col = t.require("diameter_m", "add the mirror diameter of each telescope in metres");
  auto area_col = t.find("area_m2");
  auto alt_col = t.find("min_altitude_deg");

  std::vector<astro::Telescope> out;
  std::map<std::string, std::string> seen;   // name -> where
  for (const auto& row : t.rows()) {
    const std::string where = t.where(row);
    astro::Telescope tel;
    tel.name = t.text(row, name_col);
    if (tel.name.empty()) throw InputError(where, "empty telescope name", "give every telescope a name");
    if (tel.name.find_first_of(" \t") != std::string::npos)
      throw InputError(where, "telescope name '" + tel.name + "' contains a space", "use letters, digits, '_' or '.'");
    if (auto it = seen.find(tel.name); it != seen.end())
      throw InputError(where, "telescope name '" + tel.name + "' is used twice (also at " + it->second + ")",
                       "give every telescope its own name");
    seen[tel.name] = where;
    double a = t.number(row, c1), b = t.number(row, c2), c = t.number(row, c3);
    if (enu) {
      tel.east_m = a;
      tel.north_m = b;
      tel.up_m = c;
      if (std::hypot(a, b, c) > 1e6)
        throw InputError(where, "telescope '" + tel.name + "' is more than 1000 km from the site reference point",
                         "east_m, north_m, up_m are metres from the site given by --site");
    } else {
      if (a < -90 || a > 90)
        throw InputError(where, "latitude_deg = " + format_number(a, 10) + " must lie within -90 .. 90",
                         "geodetic latitude in degrees");
      auto p = astro::enu_from_geodetic(site, a * kDegToRad, b * kDegToRad, c);
      tel.east_m = p.east_m;
      tel.north_m = p.north_m;
      tel.up_m = p.up_m;
      if (std::hypot(p.east_m, p.north_m, p.up_m) > 1e6)
        throw InputError(where, "telescope '" + tel.name + "' is more than 1000 km from the site '" + site.name + "'",
                         "check the longitude sign (east positive) and that the array belongs to this site");
    }
    tel.diameter_m = t.number(row, diam_col);
    if (!(tel.diameter_m > 0) || tel.diameter_m > 100)
      throw InputError(where, "diameter_m = " + format_number(tel.diameter_m, 10) + " must lie within 0 .. 100 (exclusive of 0)",
                       "mirror diameter in metres");
    tel.area_m2 = t.number_or(row, area_col, astro::kPi * tel.diameter_m * tel.diameter_m / 4);
    if (!(tel.area_m2 > 0))
      throw InputError(where, "area_m2 must be greater than 0", "effective collecting area in square metres");
    double alt = t.number_or(row, alt_col, NAN);
    if (!std::isnan(alt) && (alt < -5 || alt > 89))
      throw InputError(where, "min_altitude_deg = " + format_number(alt, 10) + " must lie within -5 .. 89",
                       "lowest altitude this telescope can point to, in degrees");
    tel.min_altitude_rad = alt * kDegToRad;
    for (std::size_t k = 0; k < out.size(); ++k) {
      const auto& o = out[k];
      if (std::hypot(o.east_m - tel.east_m, o.north_m - tel.north_m, o.up_m - tel.up_m) < 0.01)
        throw InputError(where, "telescope '" + tel.name + "' is less than 1 cm from '" + o.name + "' (" + seen[o.name] + ")",
                         "two telescopes cannot stand at the same place; check the coordinates");
    }
    out.push_back(tel);
  }
  if (out.empty()) throw InputError(source, "the array has no telescopes", "add one row per telescope below the header");
  return out;
}

std::vector<astro::Telescope> read_array(const std::filesystem::path& path, const astro::Site& site) {
  return parse_array(read_file_text(path), path.string(), site);
}

}  // namespace siiplan::io
