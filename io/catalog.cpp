#include "io/catalog.hpp"

#include <erfa.h>

#include <cmath>
#include <cstdio>
#include <map>
#include <optional>
#include <set>

#include "astro/errors.hpp"
#include "astro/models.hpp"
#include "astro/units.hpp"
#include "io/csv.hpp"
#include "io/table.hpp"

namespace siiplan::io {

namespace {

using astro::kDegToRad;


// "a:b:c" or "a b c" (2 or 3 fields) -> the fields and the leading sign; nullopt when not sexagesimal.
struct Sexagesimal {
  char sign = '+';
  int first = 0, second = 0;
  double third = 0;
};
std::optional<Sexagesimal> split_sexagesimal(std::string_view text, bool& malformed) {
  std::string s = trimmed(text);
  malformed = false;
  if (s.find_first_of(": ") == std::string::npos) return std::nullopt;
  Sexagesimal out;
  if (!s.empty() && (s[0] == '+' || s[0] == '-')) {
    out.sign = s[0];
    s = trimmed(s.substr(1));
  }
  std::vector<std::string> parts;
  std::string cur;
  for (char c : s) {
    if (c == ':' || c == ' ') {
      if (!cur.empty() || c == ':') parts.push_back(cur);
      cur.clear();
    } else {
      cur += c;
    }
  }
  parts.push_back(cur);
  if (parts.size() < 2 || parts.size() > 3) {
    malformed = true;
    return std::nullopt;
  }
  auto whole = [&](const std::string& p, int& v) {
    // at most 9 digits, so that std::stoi cannot overflow (fuzzing found "11111111111111111111:23:57")
    if (p.empty() || p.size() > 9 || p.find_first_not_of("0123456789") != std::string::npos) return false;
    v = std::stoi(p);
    return true;
  };
  std::optional<double> last = parse_number(parts.back());
  bool ok = whole(parts[0], out.first) && last && *last >= 0 && (parts.size() == 2 || whole(parts[1], out.second));
  if (!ok) {
    malformed = true;
    return std::nullopt;
  }
  if (parts.size() == 2) {   // "hh:mm.m": minutes with a fraction
    // 60 or more minutes is out of range (ERFA says so below); never convert a huge value to int
    // (fuzzing found "06:2344444444444444444444444")
    out.second = *last < 60 ? int(std::floor(*last)) : 60;
    out.third = *last < 60 ? (*last - out.second) * 60 : 0;
  } else {
    out.third = *last;
  }
  return out;
}

}  // namespace

double parse_ra_rad(std::string_view text, const std::string& where) {
  const std::string hint = "write RA as hours hh:mm:ss.s (e.g. 05:35:17.3) or as degrees 0..360 (e.g. 83.82)";
  bool malformed = false;
  if (auto sx = split_sexagesimal(text, malformed)) {
    double rad = 0;
    if (sx->sign == '-' || eraTf2a('+', sx->first, sx->second, sx->third, &rad) != 0)
      throw InputError(where, "RA '" + trimmed(text) + "' is out of range (hours 0-23, minutes and seconds 0-59)", hint);
    return rad;
  }
  if (malformed) throw InputError(where, "RA '" + trimmed(text) + "' is not an angle", hint);
  auto deg = parse_number(text);
  if (!deg) throw InputError(where, "RA '" + trimmed(text) + "' is not an angle", hint);
  if (*deg < 0 || *deg >= 360) throw InputError(where, "RA " + trimmed(text) + " deg is outside 0 .. 360", hint);
  return *deg * kDegToRad;
}

double parse_dec_rad(std::string_view text, const std::string& where) {
  const std::string hint = "write Dec as degrees +-dd:mm:ss.s (e.g. -05:23:28) or as decimal degrees -90..90";
  bool malformed = false;
  double rad = 0;
  if (auto sx = split_sexagesimal(text, malformed)) {
    if (eraAf2a(sx->sign, sx->first, sx->second, sx->third, &rad) != 0)
      throw InputError(where, "Dec '" + trimmed(text) + "' is out of range (minutes and seconds 0-59)", hint);
  } else {
    if (malformed) throw InputError(where, "Dec '" + trimmed(text) + "' is not an angle", hint);
    auto deg = parse_number(text);
    if (!deg) throw InputError(where, "Dec '" + trimmed(text) + "' is not an angle", hint);
    rad = *deg * kDegToRad;
  }
  if (std::fabs(rad) > astro::kPi / 2 * (1 + 1e-15))
    throw InputError(where, "Dec '" + trimmed(text) + "' is beyond +-90 degrees", hint);
  return rad;
}

std::string format_ra(double ra_rad) {
  char sign;
  int hmsf[4];
  eraA2tf(2, eraAnp(ra_rad), &sign, hmsf);
  char buf[32];
  std::snprintf(buf, sizeof buf, "%02dh%02dm%02d.%02ds", hmsf[0], hmsf[1], hmsf[2], hmsf[3]);
  return buf;
}

std::string format_dec(double dec_rad) {
  char sign;
  int dmsf[4];
  eraA2af(1, dec_rad, &sign, dmsf);
  char buf[32];
  std::snprintf(buf, sizeof buf, "%c%02dd%02dm%02d.%01ds", sign, dmsf[0], dmsf[1], dmsf[2], dmsf[3]);
  return buf;
}

std::vector<astro::Target> parse_catalog(const std::string& text, const std::string& source) {
  CsvTable t = parse_csv(text, source);
  auto name_col = t.require("name", "the catalog needs name, ra and dec columns");
  auto ra_col = t.require("ra", "the catalog needs name, ra and dec columns (ICRS J2000)");
  auto dec_col = t.require("dec", "the catalog needs name, ra and dec columns (ICRS J2000)");
  auto pmra_col = t.find("pmra_mas_per_yr"), pmdec_col = t.find("pmdec_mas_per_yr");
  const char* const mag_names[astro::kBandCount] = {"mag_u", "mag_b", "mag_v", "mag_r", "mag_i"};
  std::optional<std::size_t> mag_cols[astro::kBandCount];
  for (int b = 0; b < astro::kBandCount; ++b) mag_cols[b] = t.find(mag_names[b]);
  auto model_col = t.find("model"), teff_col = t.find("teff_k"), prio_col = t.find("priority"),
       goal_col = t.find("goal_pct");

  // Parameter columns of every model ("diameter_mas", "limb_u", ...): known, and checked per row.
  std::set<std::string> param_columns;
  for (auto name : {"ud", "ld-linear", "ld-quadratic", "ld-power", "gaussian", "ring", "ellipse", "binary"})
    if (auto kind = astro::model_from_name(name))
      for (const auto& spec : astro::model_params(*kind)) param_columns.insert(std::string(spec.name));
  param_columns.insert("diameter_mas");
  std::set<std::string> known{"name", "ra", "dec", "pmra_mas_per_yr", "pmdec_mas_per_yr", "model", "teff_k", "priority",
                              "goal_pct"};
  for (auto* m : mag_names) known.insert(m);
  auto lower = [](std::string s) {
    for (auto& c : s) c = char(std::tolower(static_cast<unsigned char>(c)));
    return s;
  };

  std::vector<astro::Target> out;
  std::map<std::string, std::string> seen;
  for (const auto& row : t.rows()) {
    const std::string where = t.where(row);
    astro::Target tg;
    tg.name = t.text(row, name_col);
    if (tg.name.empty()) throw InputError(where, "empty target name", "give every target a name");
    if (auto it = seen.find(tg.name); it != seen.end())
      throw InputError(where, "target name '" + tg.name + "' is used twice (also at " + it->second + ")",
                       "give every target its own name");
    seen[tg.name] = where;
    tg.position.ra_rad = parse_ra_rad(t.text(row, ra_col), where + ": column 'ra'");
    tg.position.dec_rad = parse_dec_rad(t.text(row, dec_col), where + ": column 'dec'");
    tg.position.pmra_cosdec_rad_per_yr = t.number_or(row, pmra_col, 0) * astro::kMasToRad;
    tg.position.pmdec_rad_per_yr = t.number_or(row, pmdec_col, 0) * astro::kMasToRad;
    for (int b = 0; b < astro::kBandCount; ++b) tg.mag[b] = t.number_or(row, mag_cols[b], NAN);
    tg.teff_k = t.number_or(row, teff_col, NAN);
    if (!std::isnan(tg.teff_k) && !(tg.teff_k >= 1000 && tg.teff_k <= 100000))
      throw InputError(where, "teff_k = " + format_number(tg.teff_k, 10) + " must lie within 1000 .. 100000",
                       "effective temperature in kelvin");
    tg.priority = t.number_or(row, prio_col, 1);
    if (!(tg.priority > 0)) throw InputError(where, "priority must be greater than 0", "1 is normal, larger is more important");
    double goal_pct = t.number_or(row, goal_col, 5);
    if (!(goal_pct > 0 && goal_pct <= 100))
      throw InputError(where, "goal_pct = " + format_number(goal_pct, 10) + " must lie within 0 .. 100 (exclusive of 0)",
                       "wanted relative precision on the diameter, in percent");
    tg.goal_fraction = goal_pct / 100;

    // The model and its parameters.
    std::string model_text = model_col ? t.text(row, *model_col) : std::string();
    if (model_text.empty()) model_text = "ud";
    auto kind = astro::model_from_name(model_text);
    if (!kind)
      throw InputError(where, "unknown model '" + model_text + "'", "use one of ud, ld-linear, ld-quadratic, ld-power, gaussian, ring, ellipse, binary");
    auto specs = astro::model_params(*kind);
    std::set<std::string> used;
    std::vector<double> params;
    for (std::size_t p = 0; p < specs.size(); ++p) {
      std::string pname(specs[p].name);
      used.insert(pname);
      auto col = t.find(pname);
      double value = t.number_or(row, col, NAN);
      if (std::isnan(value)) {
        if (p == 0) {
          tg.diameter_estimated = true;
          tg.diameter_note = kNoDiameterNote;
          params.push_back(1e-9);   // placeholder (internal units); the planner replaces it by an estimate
          continue;
        }
        throw InputError(where, "model '" + model_text + "' needs column '" + pname + "'",
                         "add the column and a value for this row");
      }
      params.push_back(value / specs[p].user_per_internal);
    }
    try {
      tg.model = astro::Model(*kind, params);
    } catch (const InputError& e) {
      throw InputError(where, e.problem(), e.hint());
    }
    for (std::size_t c = 0; c < t.header().size(); ++c) {
      std::string col = lower(t.header()[c]);
      if (known.count(col) || used.count(col)) continue;
      if (param_columns.count(col)) {
        if (!t.text(row, c).empty())
          throw InputError(where, "column '" + col + "' does not apply to model '" + model_text + "'",
                           "leave it empty for this row or choose the model that has this parameter");
        continue;
      }
      tg.extra.emplace_back(t.header()[c], t.text(row, c));
    }
    out.push_back(std::move(tg));
  }
  if (out.empty()) throw InputError(source, "the catalog has no targets", "add one row per target below the header");
  return out;
}

std::vector<astro::Target> read_catalog(const std::filesystem::path& path) {
  return parse_catalog(read_file_text(path), path.string());
}

}  // namespace siiplan::io
