#include "io/instrument_io.hpp"

#include <cmath>
#include <set>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/csv.hpp"
#include "io/ini.hpp"
#include "io/table.hpp"

namespace siiplan::io {

namespace {

constexpr const char* kSection = "instrument";
constexpr double kRequired = NAN;

std::string key_of(const std::string& name) { return std::string(kSection) + "." + name; }

// A number within [lo, hi] (lo excluded when lo_open); `fallback` when absent, required when it is NaN.
double number_in(const IniFile& ini, const std::string& name, double lo, bool lo_open, double hi, double fallback,
                 const std::string& hint) {
  const std::string key = key_of(name);
  double v = (std::isnan(fallback) || ini.has(key)) ? ini.number(key, hint) : fallback;
  bool low_ok = lo_open ? v > lo : v >= lo;
  if (!low_ok || v > hi)
    throw InputError(ini.where(key),
                     name + " = " + format_number(v, 10) + " must lie within " + (lo_open ? "(" : "[") +
                         format_number(lo, 10) + ", " + format_number(hi, 10) + "]",
                     hint);
  return v;
}

// One of a few words; `fallback` when absent (required when empty).
std::string word(const IniFile& ini, const std::string& name, const std::set<std::string>& allowed,
                 const std::string& fallback, const std::string& hint) {
  auto v = ini.text(key_of(name));
  if (!v) {
    if (fallback.empty())
      throw InputError(ini.source(), "missing key '" + name + "' in [instrument]", hint);
    return fallback;
  }
  if (!allowed.count(*v)) throw InputError(ini.where(key_of(name)), name + " = '" + *v + "' is not allowed", hint);
  return *v;
}

}  // namespace

astro::Instrument parse_instrument(const std::string& text, const std::string& source, std::vector<std::string>* warnings) {
  IniFile ini = IniFile::parse(text, source);
  if (!ini.has_section(kSection))
    throw InputError(source, "no [instrument] section", "start the file with an [instrument] line followed by mode, wavelength_nm, ...");
  astro::Instrument inst;
  const std::string mode = word(ini, "mode", {"analog", "photon-counting"}, "",
                                "mode = analog (photocurrent correlation) or mode = photon-counting (time-tagged photons)");
  inst.mode = mode == "analog" ? astro::DetectionMode::Analog : astro::DetectionMode::PhotonCounting;

  double lambda_nm = number_in(ini, "wavelength_nm", 200, false, 2500, kRequired, "filter central wavelength in nm, 200..2500");
  inst.lambda_m = lambda_nm * astro::kNmToM;
  inst.bandwidth_m = number_in(ini, "bandwidth_nm", 0, true, lambda_nm / 2, kRequired,
                               "filter width in nm: positive and less than half the wavelength") *
                     astro::kNmToM;
  inst.profile = word(ini, "profile", {"top-hat", "gaussian"}, "top-hat",
                      "profile = top-hat (flat-topped interference filter) or gaussian (bandwidth_nm is then the FWHM)") == "gaussian"
                     ? astro::FilterProfile::Gaussian
                     : astro::FilterProfile::TopHat;

  // Efficiency: the total, or its four parts (not both).
  const char* parts[] = {"mirror_reflectivity", "filter_transmission", "coupling", "quantum_efficiency"};
  int parts_given = 0;
  for (auto* p : parts) parts_given += ini.has(key_of(p));
  const std::string eff_hint = "a fraction in (0, 1], e.g. 0.25 (not a percentage)";
  if (ini.has(key_of("efficiency"))) {
    if (parts_given)
      throw InputError(ini.where(key_of("efficiency")), "efficiency is given together with its parts",
                       "give either efficiency (the product) or all four of mirror_reflectivity, filter_transmission, coupling, quantum_efficiency");
    inst.efficiency = number_in(ini, "efficiency", 0, true, 1, kRequired, eff_hint);
  } else if (parts_given) {
    inst.efficiency = 1;
    for (auto* p : parts)
      inst.efficiency *= number_in(ini, p, 0, true, 1, kRequired,
                                   std::string(eff_hint) + "; with the parts, all four of mirror_reflectivity, filter_transmission, coupling, quantum_efficiency are needed");
  } else {
    throw InputError(source, "missing key 'efficiency' in [instrument]",
                     "give efficiency (total detection efficiency in (0, 1]) or its four parts mirror_reflectivity, filter_transmission, coupling, quantum_efficiency");
  }

  const bool analog = inst.mode == astro::DetectionMode::Analog;
  if (analog)
    inst.electronic_bandwidth_hz = number_in(ini, "electronic_bandwidth_mhz", 0, true, 1e5, kRequired,
                                             "effective bandwidth of the correlated photocurrents in MHz (analog mode)") * 1e6;
  else
    inst.timing_fwhm_s = number_in(ini, "timing_fwhm_ps", 0, true, 1e6, kRequired,
                                   "FWHM of the detector + time-tagger timing response in ps (photon-counting mode)") * 1e-12;
  if (warnings) {
    const char* other = analog ? "timing_fwhm_ps" : "electronic_bandwidth_mhz";
    if (ini.has(key_of(other)))
      warnings->push_back(ini.where(key_of(other)) + ": '" + other + "' is not used in " + mode + " mode and is ignored");
  }
  inst.excess_noise = number_in(ini, "excess_noise", 1, false, 10, 1, "excess-noise factor F >= 1 (amplitude; 1 for counting detectors)");
  inst.correlator_efficiency = number_in(ini, "correlator_efficiency", 0, true, 1, 1, "correlator efficiency in (0, 1]");
  double channels = number_in(ini, "channels", 1, false, 1e5, 1, "number of independent spectral channels, a whole number >= 1");
  if (channels != std::floor(channels))
    throw InputError(ini.where(key_of("channels")), "channels = " + format_number(channels, 10) + " is not a whole number",
                     "number of independent spectral channels, a whole number >= 1");
  inst.channels = static_cast<int>(channels);
  inst.fov_rad = number_in(ini, "fov_arcsec", 0, true, 3600, kRequired,
                           "diameter of the detector's field of view on the sky in arcsec (for the sky background)") *
                 astro::kArcsecToRad;
  if (ini.text(key_of("max_rate_mhz")) == std::optional<std::string>("none"))
    inst.max_rate_hz = 0;
  else
    inst.max_rate_hz = number_in(ini, "max_rate_mhz", 0, true, 1e6, kRequired,
                                 "highest usable detected rate per detector in MHz (saturation, dead time), or 'none'") * 1e6;
  inst.dark_rate_hz = number_in(ini, "dark_rate_hz", 0, false, 1e10, kRequired,
                                "dark counts per detector per second (0 if negligible)");
  inst.zero_baseline = word(ini, "zero_baseline", {"calibrated", "free"}, "",
                            "zero_baseline = calibrated (c(0) measured separately) or free (fitted with the diameter)") == "free"
                           ? astro::ZeroBaseline::Free
                           : astro::ZeroBaseline::Calibrated;
  if (auto b = ini.text(key_of("band"))) {
    if (!astro::band_from_name(*b, inst.band))
      throw InputError(ini.where(key_of("band")), "band = '" + *b + "' is not a photometric band",
                       "one of U, B, V, R, I: the band whose magnitudes describe the stars in this filter");
  } else {
    double best = INFINITY;
    for (int i = 0; i < astro::kBandCount; ++i) {
      auto band = static_cast<astro::Band>(i);
      double d = std::fabs(astro::bessell1979(band).lambda_m - inst.lambda_m);
      if (d < best) best = d, inst.band = band;
    }
  }

  if (warnings) {
    std::set<std::string> known{"mode", "wavelength_nm", "bandwidth_nm", "profile", "efficiency", "electronic_bandwidth_mhz",
                                "timing_fwhm_ps", "excess_noise", "correlator_efficiency", "channels", "fov_arcsec",
                                "max_rate_mhz", "dark_rate_hz", "zero_baseline", "band"};
    for (auto* p : parts) known.insert(p);
    for (const auto& key : ini.unknown_keys(kSection, known))
      warnings->push_back(ini.where(key) + ": unknown key '" + key.substr(std::string(kSection).size() + 1) +
                          "' in [instrument] is ignored");
  }
  return inst;
}

astro::Instrument read_instrument(const std::filesystem::path& path, std::vector<std::string>* warnings) {
  return parse_instrument(read_file_text(path), path.string(), warnings);
}

}  // namespace siiplan::io
