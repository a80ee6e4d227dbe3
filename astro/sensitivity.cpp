#include "astro/sensitivity.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <limits>

namespace siiplan::astro {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kBoltzmann_J_per_K = 1.380649e-23;          // exact (SI 2019)
constexpr double kStefanBoltzmann_W_m2_K4 = 5.670374419e-8;  // CODATA 2018
constexpr double kLn2 = 0.69314718055994530942;

// Bessell (1979), PASP 91, 589: lambda_c, dlambda/lambda, F_nu(0 mag) (sensitivity.md §3.1).
constexpr std::array<BandZeroPoint, kBandCount> kBessell1979{{
    {360e-9, 0.15, 1810},
    {440e-9, 0.22, 4260},
    {550e-9, 0.16, 3640},
    {640e-9, 0.23, 3080},
    {790e-9, 0.19, 2550},
}};
constexpr std::array<std::string_view, kBandCount> kBandNames{"U", "B", "V", "R", "I"};
// Patat (2003), A&A 400, 1183, abstract: Paranal dark zenith sky (sensitivity.md §7.1).
constexpr std::array<double, kBandCount> kDarkZenithSky{22.3, 22.6, 21.6, 20.9, 19.7};
// Solar colours m_band - V (U-B 0.17 + B-V 0.65; B-V 0.65; V-R_C 0.36; V-I_C 0.70), from memory.
constexpr std::array<double, kBandCount> kSolarColourMinusV{0.82, 0.65, 0.0, -0.36, -0.70};

// Planck B_nu up to constants: nu^3/(exp(h nu/kT) - 1).
double planck_nu_shape(double lambda_m, double teff_k) {
  double nu = kSpeedOfLight_m_per_s / lambda_m;
  return nu * nu * nu / std::expm1(kPlanck_J_s * nu / (kBoltzmann_J_per_K * teff_k));
}

double filter_width_hz_tophat(const Instrument& inst) {
  return kSpeedOfLight_m_per_s * inst.bandwidth_m / (inst.lambda_m * inst.lambda_m);
}

// Krisciunas & Schaefer (1991) scattering airmass X(Z) = (1 - 0.96 sin^2 Z)^-1/2 (geometry.md §5.3).
double ks_airmass(double zenith_rad) {
  double s = std::sin(zenith_rad);
  return 1.0 / std::sqrt(1.0 - 0.96 * s * s);
}

}  // namespace

const BandZeroPoint& bessell1979(Band band) { return kBessell1979[static_cast<int>(band)]; }
std::string_view band_name(Band band) { return kBandNames[static_cast<int>(band)]; }
bool band_from_name(std::string_view name, Band& band) {
  if (name.size() != 1) return false;
  char c = static_cast<char>(std::toupper(static_cast<unsigned char>(name[0])));
  for (int i = 0; i < kBandCount; ++i)
    if (kBandNames[i][0] == c) {
      band = static_cast<Band>(i);
      return true;
    }
  return false;
}

double default_extinction(Band band) { return Site{}.extinction_mag_per_airmass[static_cast<int>(band)]; }

double photon_flux_density(double magnitude, Band band, double lambda_m, double teff_k) {
  const BandZeroPoint& zp = bessell1979(band);
  // sensitivity.md §3.1: F_nu = F_nu,0 10^(-0.4 m); n = F_nu/(h nu) = F_nu lambda/(h c).
  double f_nu = zp.flux_jy * kJansky_W_per_m2_Hz * std::pow(10.0, -0.4 * magnitude);
  if (std::isfinite(teff_k)) f_nu *= planck_nu_shape(lambda_m, teff_k) / planck_nu_shape(zp.lambda_m, teff_k);
  return f_nu * lambda_m / (kPlanck_J_s * kSpeedOfLight_m_per_s);
}

double extinction_transmission(double k_mag_per_airmass, double airmass) {
  return std::pow(10.0, -0.4 * k_mag_per_airmass * airmass);
}

double coherence_time_s(const Instrument& inst) {
  double tau = 1.0 / filter_width_hz_tophat(inst);
  // Gaussian S(nu) of FWHM dnu: ∫S^2/(∫S)^2 = sqrt(2 ln2/pi)/dnu (sensitivity.md §2.1).
  if (inst.profile == FilterProfile::Gaussian) tau *= std::sqrt(2 * kLn2 / kPi);
  return tau;
}

double filter_equivalent_width_hz(const Instrument& inst) {
  double w = filter_width_hz_tophat(inst);
  // Gaussian of unit peak and FWHM dnu: area = sqrt(pi/(4 ln2)) dnu = 1.0645 dnu.
  if (inst.profile == FilterProfile::Gaussian) w *= std::sqrt(kPi / (4 * kLn2));
  return w;
}

// --- sky ---------------------------------------------------------------------------------------------

double nanolambert_from_mag_arcsec2(double mag_arcsec2) {
  return 34.08 * std::exp(20.7233 - 0.92104 * mag_arcsec2);   // Krisciunas & Schaefer 1991
}
double mag_arcsec2_from_nanolambert(double nl) { return (20.7233 - std::log(nl / 34.08)) / 0.92104; }

double dark_zenith_sky_mag_arcsec2(Band band) { return kDarkZenithSky[static_cast<int>(band)]; }

double moon_phase_angle_from_illumination(double illuminated_fraction) {
  return std::acos(std::clamp(2 * illuminated_fraction - 1, -1.0, 1.0));   // Meeus eq. 48.1 inverted
}

double sky_brightness_mag_arcsec2(Band band, double k, const SkyGeometry& g, double dark_zenith_mag_arcsec2) {
  double z = std::clamp(kPi / 2 - g.target_altitude_rad, 0.0, kPi / 2);
  double x = ks_airmass(z);
  // Dark sky: B0(Z) = B_zen 10^(-0.4 k (X - 1)) X.
  double b_dark = nanolambert_from_mag_arcsec2(dark_zenith_mag_arcsec2) * std::pow(10.0, -0.4 * k * (x - 1)) * x;
  double b_moon = 0;
  if (g.moon_altitude_rad > 0) {
    double alpha_deg = std::fabs(g.moon_phase_angle_rad) * kRadToDeg;
    double rho_deg = g.moon_separation_rad * kRadToDeg;
    // Moon illuminance outside the atmosphere, I* = 10^(-0.4 (3.84 + 0.026|a| + 4e-9 a^4)), shifted to
    // the band by the solar colour (our extension, see the header).
    double i_star = std::pow(10.0, -0.4 * (3.84 + 0.026 * alpha_deg + 4e-9 * std::pow(alpha_deg, 4) +
                                           kSolarColourMinusV[static_cast<int>(band)]));
    // Scattering function: Rayleigh 10^5.36 (1.06 + cos^2 rho) + Mie 10^(6.15 - rho/40), the Mie term
    // replaced by 6.2e7 rho^-2 below 10 degrees.
    double cos_rho = std::cos(g.moon_separation_rad);
    double mie = rho_deg < 10 ? 6.2e7 / (std::max(rho_deg, 0.25) * std::max(rho_deg, 0.25))
                              : std::pow(10.0, 6.15 - rho_deg / 40);
    double f = std::pow(10.0, 5.36) * (1.06 + cos_rho * cos_rho) + mie;
    double x_moon = ks_airmass(kPi / 2 - g.moon_altitude_rad);
    b_moon = f * i_star * std::pow(10.0, -0.4 * k * x_moon) * (1 - std::pow(10.0, -0.4 * k * x));
  }
  return mag_arcsec2_from_nanolambert(b_dark + b_moon);
}

double sky_photon_flux_density(const Instrument& inst, double sky_mag_arcsec2) {
  double r_arcsec = 0.5 * inst.fov_rad / kArcsecToRad;
  double omega_arcsec2 = kPi * r_arcsec * r_arcsec;
  // sensitivity.md §7.3: the field acts as a point source of magnitude mu - 2.5 log10(Omega).
  return photon_flux_density(sky_mag_arcsec2, inst.band, inst.lambda_m, NAN) * omega_arcsec2;
}

// --- rates and noise ---------------------------------------------------------------------------------

double DetectorRates::nd_mag() const { return attenuation > 0 ? -2.5 * std::log10(attenuation) : kInf; }

DetectorRates detector_rates(const Instrument& inst, double area_m2, double n_star, double n_sky) {
  double per_n = area_m2 * inst.efficiency * filter_equivalent_width_hz(inst);
  DetectorRates r;
  r.star_hz = per_n * n_star;
  r.sky_hz = per_n * n_sky;
  r.dark_hz = inst.dark_rate_hz;
  if (inst.max_rate_hz > 0 && r.total_hz() > inst.max_rate_hz) {
    r.saturated = true;
    double optical = r.star_hz + r.sky_hz;
    if (r.dark_hz >= inst.max_rate_hz || optical <= 0) {
      r.blinded = true;
      r.attenuation = 0;
    } else {
      r.attenuation = (inst.max_rate_hz - r.dark_hz) / optical;
    }
    r.star_hz *= r.attenuation;
    r.sky_hz *= r.attenuation;
  }
  return r;
}

double equivalent_analog_bandwidth_hz(double timing_fwhm_s) {
  // (2 ln2/pi)^(1/4) (1/2) sqrt(T/tau) = sqrt(df T/2)  =>  df = sqrt(2 ln2/pi)/(2 tau).
  return std::sqrt(2 * kLn2 / kPi) / (2 * timing_fwhm_s);
}

PairNoise pair_noise(const Instrument& inst, double area1_m2, double area2_m2, double n_star_1, double n_star_2,
                     double n_sky_1, double n_sky_2, double t_s) {
  PairNoise out;
  out.det1 = detector_rates(inst, area1_m2, n_star_1, n_sky_1);
  out.det2 = detector_rates(inst, area2_m2, n_star_2, n_sky_2);
  double n1 = out.det1.star_hz, n2 = out.det2.star_hz;
  if (!(n1 > 0 && n2 > 0 && t_s > 0)) {
    out.sigma_vis2 = kInf;
    return out;
  }
  // Correlated signal ∝ N1 N2, noise ∝ sqrt(N1,tot N2,tot): sqrt(N1 N2) sqrt(d1 d2) (sensitivity.md §1.3, §2.2d).
  double rate_factor = std::sqrt(n1 * n2) * std::sqrt(out.det1.dilution() * out.det2.dilution());
  double tau_c = coherence_time_s(inst);
  double time_factor = inst.mode == DetectionMode::Analog
                           ? std::sqrt(inst.electronic_bandwidth_hz * t_s / 2)                      // §1.3
                           : std::pow(2 * kLn2 / kPi, 0.25) * 0.5 * std::sqrt(t_s / inst.timing_fwhm_s);  // §2.2a
  double snr_unit = rate_factor * tau_c * time_factor * inst.correlator_efficiency / inst.excess_noise *
                    std::sqrt(static_cast<double>(inst.channels));
  out.sigma_vis2 = snr_unit > 0 ? 1.0 / snr_unit : kInf;
  return out;
}

double sigma_vis2(const Instrument& inst, double area1_m2, double area2_m2, double n_star_1, double n_star_2,
                  double n_sky_1, double n_sky_2, double t_s) {
  return pair_noise(inst, area1_m2, area2_m2, n_star_1, n_star_2, n_sky_1, n_sky_2, t_s).sigma_vis2;
}

// --- diameter estimate -------------------------------------------------------------------------------

double bolometric_correction_v(double teff_k) {
  // Flower (1996) with the coefficients as corrected by Torres (2010), AJ 140, 1158, Table 1.
  double lt = std::log10(teff_k);
  static constexpr double kCool[] = {-0.190537291496456e5, 0.155144866764412e5, -0.421278819301717e4,
                                     0.381476328422343e3};
  static constexpr double kMid[] = {-0.370510203809015e5, 0.385672629965804e5, -0.150651486316025e5,
                                    0.261724637119416e4, -0.170623810323864e3};
  static constexpr double kHot[] = {-0.118115450538963e6, 0.137145973583929e6, -0.636233812100225e5,
                                    0.147412923562646e5, -0.170587278406872e4, 0.788731721804990e2};
  auto poly = [lt](const double* c, int n) {
    double s = 0;
    for (int i = n - 1; i >= 0; --i) s = s * lt + c[i];
    return s;
  };
  if (lt < 3.70) return poly(kCool, 4);
  if (lt < 3.90) return poly(kMid, 5);
  return poly(kHot, 6);
}

double diameter_from_teff_rad(double v_magnitude, double teff_k) {
  // The Sun as the zero point (Torres 2010 §2): V_sun = -26.76; IAU 2015 B3: S_sun = 1361 W m^-2,
  // T_sun = 5772 K.
  constexpr double kVSun = -26.76, kSSun_W_m2 = 1361.0, kTSun_K = 5772.0;
  double m_bol = v_magnitude + bolometric_correction_v(teff_k);
  double m_bol_sun = kVSun + bolometric_correction_v(kTSun_K);
  double f_bol = kSSun_W_m2 * std::pow(10.0, -0.4 * (m_bol - m_bol_sun));
  // F_bol = sigma T^4 (theta/2)^2  =>  theta = 2 sqrt(F_bol/(sigma T^4)).
  double t2 = teff_k * teff_k;
  return 2.0 * std::sqrt(f_bol / (kStefanBoltzmann_W_m2_K4 * t2 * t2));
}

}  // namespace siiplan::astro
