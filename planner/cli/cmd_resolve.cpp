// siiplan resolve: which baselines resolve a star with a given instrument, how noisy |V|^2 is on each,
// how long each needs, and the diameter precision over all of them.
#include <cmath>
#include <ostream>
#include <iostream>
#include <sstream>

#include "astro/coherence.hpp"
#include "astro/errors.hpp"
#include "astro/fisher.hpp"
#include "astro/geometry.hpp"
#include "astro/resolve.hpp"
#include "astro/sensitivity.hpp"
#include "astro/units.hpp"
#include "io/atomic_file.hpp"
#include "io/instrument_io.hpp"
#include "io/table.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/model_options.hpp"
#include "planner/cli/observing_options.hpp"
#include "planner/cli/values.hpp"

namespace siiplan::cli {
namespace {

using namespace astro;

// One baseline to assess: a telescope pair (or a length from --baselines-m) with its areas.
struct Baseline {
  std::string label;
  double length_m = 0;
  double pa_rad = 0;      // east of north
  double area1_m2 = 0, area2_m2 = 0;
};

// Where the star and the Moon are, when --site, a target and --time are all given.
struct Sky {
  bool from_ephemeris = false;
  Apparent star;
  double moon_alt_rad = -1, moon_sep_rad = 0, moon_phase_rad = kPi, moon_illuminated = 0;
};

std::string fmt(double v, int digits = 4) { return io::format_number(v, digits); }

Band band_option(const po::variables_map& vm, Band fallback) {
  if (!vm.count("band")) return fallback;
  Band b;
  const std::string text = vm["band"].as<std::string>();
  if (!band_from_name(text, b)) throw InputError("--band", "'" + text + "' is not a photometric band", "one of U, B, V, R, I");
  return b;
}

Model star_model(const po::variables_map& vm, double teff_k, std::string& note) {
  if (vm.count("diameter-mas")) {
    note = "diameter given";
    return model_from_options(vm);
  }
  if (std::isnan(teff_k))
    throw InputError("--diameter-mas", "no diameter given",
                     "give --diameter-mas, or --teff-k (with --magnitude in V, or --vmag) to estimate it");
  const std::string model = vm.count("model") ? vm["model"].as<std::string>() : "ud";
  if (model != "ud")
    throw InputError("--model", "the diameter estimate from --teff-k gives a uniform-disk model only",
                     "give --diameter-mas for model '" + model + "'");
  const std::optional<double> vmag = optional_number(vm, "vmag");
  Band band = band_option(vm, Band::V);
  double v;
  if (vmag)
    v = *vmag;
  else if (vm.count("band") && band == Band::V)
    v = number_option(vm, "magnitude", "");
  else
    throw InputError("--vmag", "the diameter estimate needs the V magnitude",
                     "give --vmag, or --band V with --magnitude");
  const double theta = diameter_from_teff_rad(v, teff_k);
  note = "estimated from V = " + fmt(v) + " and Teff = " + fmt(teff_k, 5) +
         " K via the bolometric flux (BC_V of Flower 1996 / Torres 2010; theta = 2 sqrt(F_bol/(sigma T^4)))";
  return Model(ModelKind::UniformDisk, {theta});
}

int run_resolve(const po::variables_map& vm) {
  const io::Format format = output_format(vm);
  std::vector<std::string> warnings;
  const Instrument inst = io::read_instrument(text_option(vm, "instrument", "give the instrument file, e.g. --instrument catalogs-demo/instrument-large.ini"), &warnings);
  for (const auto& w : warnings) warn(w);

  // --- the star -------------------------------------------------------------------------------------
  const Band band = band_option(vm, inst.band);
  const double magnitude = number_option(vm, "magnitude", "give the star's magnitude in --band (default: the instrument's band)");
  const std::optional<double> teff_opt = optional_number(vm, "teff-k");
  if (teff_opt && (*teff_opt < 2000 || *teff_opt > 60000))
    throw InputError("--teff-k", "must lie within 2000 .. 60000 K, got " + vm["teff-k"].as<std::string>(),
                     "give the effective temperature in kelvin");
  const double teff_k = teff_opt ? *teff_opt : NAN;
  std::string diameter_note;
  const Model model = star_model(vm, teff_k, diameter_note);
  const double hours = positive_or(vm, "hours", 1.0);
  const double t_s = hours * 3600;
  const double goal = positive_or(vm, "goal-percent", 5.0) / 100;

  // --- baselines ------------------------------------------------------------------------------------
  const bool by_list = vm.count("baselines-m") != 0, by_array = vm.count("array") != 0;
  if (by_list == by_array)
    throw InputError(by_list ? "--baselines-m" : "--array", by_list ? "given together with --array" : "no baselines given",
                     "give either --baselines-m LIST (with --mirror-diameter-m) or --array FILE (with --site)");
  std::vector<Baseline> baselines;
  std::optional<Site> site;
  Sky sky;
  std::string geometry_note;
  if (by_list) {
    const double d = positive_option(vm, "mirror-diameter-m", "give the mirror diameter for --baselines-m, e.g. --mirror-diameter-m 12");
    const double area = kPi * d * d / 4;
    const double pa = number_or(vm, "baseline-pa-deg", 0.0) * kDegToRad;
    for (double b : parse_number_list(vm["baselines-m"].as<std::string>(), "baselines-m", 100000)) {
      if (b < 0) throw InputError("--baselines-m", "baseline " + fmt(b, 6) + " m is negative", "give lengths >= 0");
      baselines.push_back({"-", b, pa, area, area});
    }
    geometry_note = "baselines from --baselines-m, position angle " + fmt(pa * kRadToDeg) + " deg, mirrors " + fmt(d) + " m";
  } else {
    if (vm.count("mirror-diameter-m"))
      throw InputError("--mirror-diameter-m", "given with --array", "mirror sizes come from the array file (diameter_m, area_m2)");
    site = load_site(vm);
    const auto tels = load_array(vm, *site);
    if (tels.size() < 2) throw InputError("--array", "the array has only one telescope", "an intensity interferometer needs at least two");
    const bool has_target = vm.count("ra") || vm.count("dec") || vm.count("target");
    if (vm.count("time") != has_target)
      throw InputError(vm.count("time") ? "--time" : "--ra", "projected baselines need both a target and --time",
                       "give --ra/--dec (or --target with --catalog) and --time, or neither for the unprojected pair lengths");
    if (has_target) {
      const Target target = load_target(vm);
      bool dubious = false;
      const JulianDate utc = parse_utc(vm["time"].as<std::string>(), "--time", &dubious);
      warn_dubious_year(dubious);
      const Epoch epoch(*site, utc);
      warn_dubious_year(epoch.dubious_year());
      sky.from_ephemeris = true;
      sky.star = epoch.star(target.position);
      if (sky.star.alt_rad <= 0)
        throw InputError("--time", "the target is below the horizon at " + format_utc(utc),
                         "choose a time when it is up (see 'siiplan tracks')");
      const Apparent moon = epoch.moon();
      sky.moon_alt_rad = moon.alt_rad;
      sky.moon_sep_rad = epoch.moon_separation_rad(target.position);
      sky.moon_illuminated = epoch.moon_illuminated_fraction();
      sky.moon_phase_rad = moon_phase_angle_from_illumination(sky.moon_illuminated);
      geometry_note = "projected baselines for " + (target.name.empty() ? std::string("the target") : target.name) + " at " +
                      format_utc(utc) + " (altitude " + fmt(sky.star.alt_rad * kRadToDeg) + " deg, HA " +
                      fmt(sky.star.ha_rad / kHourToRad) + " h)";
    } else {
      geometry_note = "unprojected pair lengths from the array file (no target/time: the star at the zenith of a flat array)";
    }
    for (const auto& p : all_pairs(tels.size())) {
      const Telescope &a = tels[p.i], &b = tels[p.j];
      Baseline bl{a.name + "-" + b.name, 0, 0, a.area_m2, b.area_m2};
      if (sky.from_ephemeris) {
        const Uvw uvw = baseline_uvw(a, b, site->lat_rad, sky.star.ha_rad, sky.star.dec_rad);
        bl.length_m = uvw.projected_m();
        bl.pa_rad = uvw.pa_rad();
      } else {
        const double de = b.east_m - a.east_m, dn = b.north_m - a.north_m, du = b.up_m - a.up_m;
        bl.length_m = std::sqrt(de * de + dn * dn + du * du);
        bl.pa_rad = std::atan2(de, dn);
      }
      baselines.push_back(bl);
    }
  }

  // --- atmosphere and sky -----------------------------------------------------------------------------
  const int bi = static_cast<int>(band);
  double airmass = 1;
  if (vm.count("airmass")) {
    airmass = number_option(vm, "airmass", "");
    if (airmass < 1 || airmass > 40) throw InputError("--airmass", "must lie within 1 .. 40, got " + vm["airmass"].as<std::string>(), "1 = zenith");
  } else if (sky.from_ephemeris) {
    airmass = sky.star.airmass;
  }
  double k = site ? site->extinction_mag_per_airmass[bi] : default_extinction(band);
  std::string k_source = site ? "site file" : "good-site default, Patat 2003";
  if (vm.count("extinction")) {
    k = number_option(vm, "extinction", "");
    if (k < 0 || k > 5) throw InputError("--extinction", "must lie within 0 .. 5 mag per airmass, got " + vm["extinction"].as<std::string>(), "");
    k_source = "--extinction";
  }
  double mu_sky;
  std::string sky_note;
  if (vm.count("sky-mag-arcsec2")) {
    mu_sky = number_option(vm, "sky-mag-arcsec2", "");
    sky_note = "given";
  } else {
    SkyGeometry g;
    g.target_altitude_rad = sky.from_ephemeris ? sky.star.alt_rad : std::asin(1 / airmass);
    if (sky.from_ephemeris) {
      g.moon_altitude_rad = sky.moon_alt_rad;
      g.moon_separation_rad = sky.moon_sep_rad;
      g.moon_phase_angle_rad = sky.moon_phase_rad;
    }
    mu_sky = sky_brightness_mag_arcsec2(band, k, g, dark_zenith_sky_mag_arcsec2(band));
    sky_note = !sky.from_ephemeris ? "dark sky with the Moon down, Krisciunas & Schaefer 1991; --time or --sky-mag-arcsec2 for moonlight"
               : sky.moon_alt_rad > 0
                   ? "Krisciunas & Schaefer 1991: Moon " + fmt(100 * sky.moon_illuminated, 3) + "% lit, altitude " +
                         fmt(sky.moon_alt_rad * kRadToDeg, 3) + " deg, " + fmt(sky.moon_sep_rad * kRadToDeg, 3) + " deg away"
                   : "Krisciunas & Schaefer 1991: Moon below the horizon";
  }
  const double n_star = photon_flux_density(magnitude, band, inst.lambda_m, teff_k) * extinction_transmission(k, airmass);
  const double n_sky = sky_photon_flux_density(inst, mu_sky);

  // --- per baseline -----------------------------------------------------------------------------------
  io::Table table;
  for (auto [name, p] : {std::pair{"pair", 0}, {"baseline_m", 6}, {"vis2", 4}, {"sigma_vis2", 3}, {"snr", 4},
                         {"hours_to_3sigma", 3}, {"beyond_first_null", 0}, {"sigma_theta_mas", 3}, {"verdict", 0}})
    table.add_column(name, p);
  DiameterFisher fisher(model);
  int resolving = 0;
  for (const auto& b : baselines) {
    const double u = b.length_m * std::sin(b.pa_rad) / inst.lambda_m, v = b.length_m * std::cos(b.pa_rad) / inst.lambda_m;
    const double vis2 = model.vis2(u, v);
    const double sigma = sigma_vis2(inst, b.area1_m2, b.area2_m2, n_star, n_star, n_sky, n_sky, t_s);
    const bool beyond = b.length_m > first_null_baseline_m(model, inst.lambda_m, b.pa_rad);
    const BaselineAssessment a = assess_baseline(vis2, sigma, t_s, beyond);
    resolving += a.resolves();
    fisher.add(u, v, sigma);
    table.add_row({b.label, b.length_m, vis2, sigma, a.snr, a.time_to_criterion_s / 3600, std::string(beyond ? "yes" : "no"),
                   single_point_sigma_theta_rad(model, u, v, sigma) * kRadToMas, std::string(verdict_text(a.verdict))});
  }
  const double theta_mas = model.diameter_rad() * kRadToMas;
  const DiameterPrecision fixed = fisher.precision(ZeroBaseline::Calibrated);
  const DiameterPrecision free = fisher.precision(ZeroBaseline::Free);
  const DiameterPrecision& used = inst.zero_baseline == ZeroBaseline::Free ? free : fixed;
  const double hours_goal = time_to_goal_s(used.sigma_theta_rad, t_s, goal * model.diameter_rad()) / 3600;

  // Detected rates per distinct telescope area.
  std::ostringstream rates;
  std::vector<double> seen;
  for (const auto& b : baselines)
    for (double area : {b.area1_m2, b.area2_m2}) {
      bool dup = false;
      for (double s : seen) dup |= std::fabs(s - area) < 1e-9 * area;
      if (dup) continue;
      seen.push_back(area);
      const DetectorRates r = detector_rates(inst, area, n_star, n_sky);
      rates << "  A = " << fmt(area) << " m^2: star " << fmt(r.star_hz) << " Hz, sky " << fmt(r.sky_hz) << " Hz, dark "
            << fmt(r.dark_hz) << " Hz; dilution n_s/(n_s+n_b) = " << fmt(r.dilution());
      if (r.blinded)
        rates << "; DARK RATE ALONE EXCEEDS max_rate: no measurement";
      else if (r.saturated)
        rates << "; SATURATED: needs a neutral-density filter of " << fmt(r.nd_mag(), 3) << " mag (transmission "
              << fmt(r.attenuation, 3) << "); SNR computed with the attenuated rate";
      rates << '\n';
      if (r.saturated)
        warn("detector rate above max_rate_mhz on A = " + fmt(area) + " m^2: a neutral-density filter of " +
             fmt(r.nd_mag(), 3) + " mag is assumed");
    }

  io::write_text_output(output_path(vm), [&](std::ostream& out) {
    if (format == io::Format::Csv) {
      table.write(out, io::Format::Csv);
      return;
    }
    out << "Star: " << band_name(band) << " = " << fmt(magnitude) << (std::isnan(teff_k) ? "" : ", Teff " + fmt(teff_k, 5) + " K")
        << "; model " << describe_model(model) << " (" << diameter_note << ")\n";
    out << "Instrument: " << (inst.mode == DetectionMode::Analog ? "analog, " + fmt(inst.electronic_bandwidth_hz / 1e6) + " MHz"
                                                                  : "photon counting, " + fmt(inst.timing_fwhm_s * 1e12) + " ps FWHM")
        << ", " << fmt(inst.lambda_m / kNmToM) << " nm / " << fmt(inst.bandwidth_m / kNmToM) << " nm "
        << (inst.profile == FilterProfile::Gaussian ? "gaussian" : "top-hat") << ", alpha " << fmt(inst.efficiency, 3)
        << ", F " << fmt(inst.excess_noise, 3) << ", eta " << fmt(inst.correlator_efficiency, 3) << ", " << inst.channels
        << " channel(s)\n";
    out << "Geometry: " << geometry_note << "\n";
    out << "Atmosphere: airmass " << fmt(airmass) << ", extinction " << fmt(k, 3) << " mag/airmass (" << k_source
        << "); sky " << fmt(mu_sky) << " mag/arcsec^2 in " << band_name(band) << " (" << sky_note << ")\n";
    out << "Flux: n = " << fmt(n_star) << " photons m^-2 s^-1 Hz^-1 at the telescope (both polarisations; Bessell 1979 "
        << band_name(band) << " zero point" << (std::isnan(teff_k) ? "" : ", blackbody colour correction") << ")\n";
    out << "Detected rates per detector:\n" << rates.str();
    out << "Integration: " << fmt(hours) << " h per baseline\n\n";
    table.write(out, io::Format::Table);
    out << "\nResolves: " << resolve_criterion_text() << ". " << resolving << " of " << baselines.size()
        << " baselines resolve the star in " << fmt(hours) << " h each.\n";
    out << "hours_to_3sigma: time for the criterion to hold; sigma_theta_mas: diameter error from that baseline alone "
           "(zero-baseline correlation calibrated).\n\n";
    auto pct = [&](double s) { return std::isfinite(s) ? fmt(100 * s * kRadToMas / theta_mas, 3) + "%" : std::string("-"); };
    out << "Diameter precision over all " << baselines.size() << " baselines (Fisher matrix, " << fmt(hours) << " h each), theta = "
        << fmt(theta_mas, 5) << " mas:\n";
    out << "  zero-baseline correlation calibrated: sigma_theta = " << fmt(fixed.sigma_theta_rad * kRadToMas, 3) << " mas ("
        << pct(fixed.sigma_theta_rad) << ")" << (inst.zero_baseline == ZeroBaseline::Calibrated ? "   <- this instrument" : "") << "\n";
    out << "  zero-baseline correlation free:       sigma_theta = " << fmt(free.sigma_theta_rad * kRadToMas, 3) << " mas ("
        << pct(free.sigma_theta_rad) << ")" << (inst.zero_baseline == ZeroBaseline::Free ? "   <- this instrument" : "");
    if (std::isfinite(free.sigma_theta_rad)) out << ", corr(theta, c0) = " << fmt(free.corr_theta_c0, 3);
    out << "\n  goal sigma_theta/theta = " << fmt(100 * goal, 3) << "%: "
        << (std::isfinite(hours_goal) ? fmt(hours_goal, 3) + " h on each baseline" : std::string("not reachable with these baselines"))
        << "\n\n" << kSafetyNotice << '\n';
  });
  if (format == io::Format::Csv) std::cerr << kSafetyNotice << '\n';
  return 0;
}

const Register reg{Command{
    "resolve",
    "which baselines resolve a star with a given instrument: sigma(|V|^2), SNR, hours needed, diameter precision",
    "siiplan resolve --instrument FILE --magnitude M [--band B] (--diameter-mas D [model options] | --teff-k T [--vmag V])\n"
    "                (--baselines-m LIST --mirror-diameter-m D | --array FILE --site FILE [--ra RA --dec DEC --time UTC])\n"
    "                [--hours H] [--airmass X] [--extinction K] [options]",
    "Predicts, for one star and one instrument (an [instrument] INI file, see the README), the noise of the\n"
    "squared visibility on each baseline and whether the baseline resolves the star.\n"
    "  Flux: n = F_nu 10^(-0.4 m)/(h nu) at the filter's central wavelength with the Bessell (1979) zero point\n"
    "  of --band (default: the instrument's band), both polarisations, times the atmospheric transmission\n"
    "  10^(-0.4 k X). --teff-k adds a blackbody colour correction from the band centre to the filter.\n"
    "  Noise: analog SNR = sqrt(A1 A2) alpha n |V|^2 sqrt(df T/2) eta/F (Hanbury Brown 1974), photon counting\n"
    "  SNR = 0.408 sqrt(A1 A2) alpha n |V|^2 sqrt(T/tau_el) eta/F for a Gaussian timing response, both times\n"
    "  the background dilution n_s/(n_s+n_b) of each telescope and sqrt(channels); sigma(|V|^2) = 1/SNR(|V|^2=1).\n"
    "  A detector above max_rate_mhz is assumed behind a neutral-density filter; its strength is reported.\n"
    "  Sky: dark sky plus moonlight (Krisciunas & Schaefer 1991) when --site, a target and --time are given;\n"
    "  otherwise a dark sky, or --sky-mag-arcsec2.\n"
    "Resolves: a baseline resolves the star when, in the planned time (--hours), the drop 1-|V|^2 exceeds\n"
    "  3 sigma(|V|^2) AND |V|^2 itself exceeds 3 sigma(|V|^2) (the lobe has not collapsed into noise).\n"
    "  Beyond the model's first null the verdict says '2nd lobe'. The night planner uses the same rule.\n"
    "Diameter: without --diameter-mas, --teff-k and the V magnitude give theta = 2 sqrt(F_bol/(sigma T^4)),\n"
    "  F_bol from V and the bolometric correction of Flower (1996) as corrected by Torres (2010), the Sun as\n"
    "  zero point (V_sun = -26.76, 1361 W/m^2, 5772 K); a uniform disk of that size is used.\n"
    "  The diameter precision over all baselines comes from the Fisher matrix with the zero-baseline\n"
    "  correlation calibrated or free (both shown; the instrument file says which applies).\n"
    "Baselines: --baselines-m (list or START:STOP:STEP, with --mirror-diameter-m), or every pair of --array\n"
    "  (needs --site): projected for the target at --time, else the pair's full length.\n"
    "|V|^2 is the monochromatic value at the filter's central wavelength.\n\n"
    "Example:\n"
    "  siiplan resolve --instrument catalogs-demo/instrument-large.ini --magnitude 2.3 --diameter-mas 0.8 \\\n"
    "      --baselines-m 20:200:30 --mirror-diameter-m 12 --hours 2",
    {},
    [](po::options_description& desc) {
      desc.add_options()
          ("instrument", po::value<std::string>(), "instrument INI file ([instrument] section)")
          ("magnitude", po::value<std::string>(), "apparent magnitude of the star in --band")
          ("band", po::value<std::string>(), "photometric band of --magnitude: U, B, V, R or I (default: the instrument's band)")
          ("teff-k", po::value<std::string>(), "effective temperature (K): colour correction, and the diameter estimate without --diameter-mas")
          ("vmag", po::value<std::string>(), "V magnitude for the diameter estimate (default --magnitude when --band is V)");
      add_model_options(desc);
      desc.add_options()
          ("baselines-m", po::value<std::string>(), "baseline lengths in m: a list '20,45,80' or START:STOP:STEP")
          ("mirror-diameter-m", po::value<std::string>(), "mirror diameter with --baselines-m (area pi D^2/4)")
          ("baseline-pa-deg", po::value<std::string>(), "position angle of --baselines-m, North through East (default 0)");
      add_site_option(desc);
      add_array_option(desc);
      add_target_options(desc);
      desc.add_options()
          ("time", po::value<std::string>(), "UTC instant for projected baselines, airmass and moonlight, ISO 8601")
          ("hours", po::value<std::string>(), "integration time per baseline in hours (default 1)")
          ("airmass", po::value<std::string>(), "airmass X (default 1, or the target's at --time)")
          ("extinction", po::value<std::string>(), "extinction in mag per airmass (default: the site's, else a good site: U 0.45 B 0.22 V 0.12 R 0.08 I 0.05, Patat 2003)")
          ("sky-mag-arcsec2", po::value<std::string>(), "sky surface brightness in the band, mag/arcsec^2 (default: computed)")
          ("goal-percent", po::value<std::string>(), "diameter precision goal sigma_theta/theta in percent (default 5)");
      add_output_options(desc, false);
    },
    run_resolve,
}};

}  // namespace
}  // namespace siiplan::cli
