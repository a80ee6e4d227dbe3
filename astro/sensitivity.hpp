// Sensitivity of an intensity interferometer: photon flux, sky background, detected rates,
// saturation, SNR and sigma(|V|^2).
// (sensitivity.md §1-3; Hanbury Brown 1974, The Intensity Interferometer, ch. 5 and 9.)
//
// Conventions used throughout:
//   * n (photons m^-2 s^-1 Hz^-1) is the SPECTRAL PHOTON FLUX DENSITY of the light, counted in both
//     polarisations. "n_star" is the star at the telescope (after extinction); "n_sky" is the sky light
//     that enters the field of view, expressed in the same unit (per m^2 of mirror).
//   * Rates (Hz) are detected photo-electron rates per detector, i.e. already multiplied by the area,
//     the detection efficiency alpha and the filter's equivalent width.
//   * sigma(|V|^2) is the rms noise of the normalised correlation in units of |V|^2 (the zero-baseline
//     correlation c(0) divided out). It does not depend on |V|^2 (models.md §1.9), so
//     SNR(|V|^2) = |V|^2 / sigma(|V|^2).
//
// Hot path for the night planner: pair_noise() / sigma_vis2() (no allocation, a few dozen flops).
#pragma once

#include <string_view>

#include "astro/site.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

enum class DetectionMode { Analog, PhotonCounting };
enum class FilterProfile { TopHat, Gaussian };
enum class ZeroBaseline { Calibrated, Free };

// What the instrument file describes (io/instrument_io fills it; every field documented in the README).
struct Instrument {
  DetectionMode mode = DetectionMode::Analog;
  double lambda_m = 0;              // filter central wavelength
  double bandwidth_m = 0;           // filter width (FWHM for a Gaussian profile)
  FilterProfile profile = FilterProfile::TopHat;
  double efficiency = 0;            // total detection efficiency alpha in (0,1] (at the filter peak)
  double electronic_bandwidth_hz = 0;   // analog mode
  double timing_fwhm_s = 0;             // photon-counting mode: Gaussian timing response FWHM
  double excess_noise = 1;          // F (amplitude factor), >= 1
  double correlator_efficiency = 1; // eta_corr in (0,1]
  int channels = 1;                 // independent spectral channels M (SNR x sqrt(M))
  double fov_rad = 0;               // diameter of the field of view on the sky (for the background)
  double max_rate_hz = 0;           // maximum usable detected rate per detector (0 = no limit)
  double dark_rate_hz = 0;          // detector dark counts (or equivalent dark current) per detector
  ZeroBaseline zero_baseline = ZeroBaseline::Calibrated;
  Band band = Band::B;              // photometric band whose magnitudes feed this filter
};

// ---------------------------------------------------------------------------------------------------
// Photometry
// ---------------------------------------------------------------------------------------------------

// A photometric band: central wavelength, relative width and zero-magnitude flux density.
struct BandZeroPoint {
  double lambda_m;            // central wavelength
  double width_over_lambda;   // FWHM / lambda
  double flux_jy;             // F_nu of a 0 mag star
};
// Bessell (1979), PASP 91, 589, as tabulated on J. Huchra's Ay145 "mags" page (sensitivity.md §3.1):
// U 360 nm 1810 Jy, B 440 nm 4260 Jy, V 550 nm 3640 Jy, R 640 nm 3080 Jy, I 790 nm 2550 Jy.
const BandZeroPoint& bessell1979(Band band);
std::string_view band_name(Band band);          // "U", "B", ...
bool band_from_name(std::string_view name, Band& band);   // case-insensitive single letter

// Default extinction (mag per airmass) at a good dry site, per band: U 0.45, B 0.22, V 0.12, R 0.08,
// I 0.05. References: Patat (2003), A&A 400, 1183, Table A.1 (Paranal), rounded as recommended in
// geometry.md §4.2. Used when neither a site file nor --extinction says otherwise.
double default_extinction(Band band);

// Spectral photon flux density of a star above the atmosphere, both polarisations.
//
// Given:    magnitude   apparent magnitude in `band` (Vega system)
//           band        U/B/V/R/I (Bessell 1979 zero points)
//           lambda_m    the filter's central wavelength
//           teff_k      effective temperature for the colour correction, or NaN for none
// Returns:  n in photons m^-2 s^-1 Hz^-1 at the filter's central frequency nu = c/lambda_m.
// Notes:    1) n = F_nu/(h nu), F_nu = F_nu,0 10^(-0.4 m) (sensitivity.md §3.1, §3.2).
//           2) With teff_k given, F_nu is carried from the band centre lambda_b to lambda_m with the
//              Planck ratio B_nu(T, lambda_m)/B_nu(T, lambda_b) (a blackbody colour correction; it is
//              exactly 1 when lambda_m = lambda_b). Without it F_nu is taken as flat across the band.
// Tested in: tests/astro/sensitivity_test.cpp (n(B=0) = 9.44e-5, n(V=0) = 1.01e-4, sensitivity.md §3.2).
double photon_flux_density(double magnitude, Band band, double lambda_m, double teff_k);

// Atmospheric transmission 10^(-0.4 k X) for extinction k (mag per airmass) at airmass X.
double extinction_transmission(double k_mag_per_airmass, double airmass);

// ---------------------------------------------------------------------------------------------------
// Filter
// ---------------------------------------------------------------------------------------------------

// Optical coherence time tau_c = ∫S(nu)^2 dnu / (∫S(nu) dnu)^2 of the filter (seconds).
// Top hat of width dlambda: lambda^2/(c dlambda); Gaussian of FWHM dlambda: sqrt(2 ln2/pi) lambda^2/(c dlambda)
// (sensitivity.md §2.1).
double coherence_time_s(const Instrument& inst);

// Equivalent width ∫T(nu) dnu / T_peak of the filter (Hz): the detected rate is A alpha n times this.
// Top hat: c dlambda/lambda^2; Gaussian: sqrt(pi/(4 ln2)) c dlambda/lambda^2.
double filter_equivalent_width_hz(const Instrument& inst);

// ---------------------------------------------------------------------------------------------------
// Sky background
// ---------------------------------------------------------------------------------------------------

// Where the Moon and the target are, for the Krisciunas & Schaefer (1991) moonlit-sky model.
struct SkyGeometry {
  double moon_phase_angle_rad = kPi;        // Sun-Moon-Earth angle: 0 = full Moon, pi = new Moon
  double moon_separation_rad = 0;           // Moon-target angle on the sky
  double moon_altitude_rad = -1;            // <= 0: Moon below the horizon, no moonlight
  double target_altitude_rad = kPi / 2;
};

// Sky surface brightness in magnitudes per square arcsecond in `band`, with `k_mag_per_airmass` the
// extinction in that band.
//
// Notes:  1) Krisciunas & Schaefer (1991), PASP 103, 1033, as written out in geometry.md §5.3: moon term
//            B_moon = f(rho) I* 10^(-0.4 k X(Z_m)) [1 - 10^(-0.4 k X(Z))], dark term
//            B_0 = B_zen 10^(-0.4 k (X(Z) - 1)) X(Z), X(Z) = (1 - 0.96 sin^2 Z)^-1/2, B in nanolamberts,
//            B[nL] = 34.08 exp(20.7233 - 0.92104 V).
//         2) The model is fitted in V. For another band we use that band's extinction k (the scattering
//            term grows with k, which makes the moonlit sky bluer) and shift the Moon's illuminance by
//            the solar colour (U-V 0.82, B-V 0.65, V-R 0.36, V-I 0.70; Cousins R, I; from memory) —
//            an approximation of ours, good to a few tenths of a magnitude.
//         3) Dark zenith sky, mag/arcsec^2: U 22.3, B 22.6, V 21.6, R 20.9, I 19.7 (Paranal, Patat 2003,
//            A&A 400, 1183, abstract; sensitivity.md §7.1). Pass dark_zenith_mag_arcsec2 to override.
// Tested in: tests/astro/sensitivity_test.cpp (the V-band scenarios of geometry.md §5.3).
double sky_brightness_mag_arcsec2(Band band, double k_mag_per_airmass, const SkyGeometry& geometry,
                                  double dark_zenith_mag_arcsec2);
double dark_zenith_sky_mag_arcsec2(Band band);
// Phase angle i from the Moon's illuminated fraction k = (1 + cos i)/2 (Meeus 1998, eq. 48.1).
double moon_phase_angle_from_illumination(double illuminated_fraction);
// nanolamberts <-> V mag/arcsec^2 (Krisciunas & Schaefer 1991, geometry.md §5.3).
double nanolambert_from_mag_arcsec2(double mag_arcsec2);
double mag_arcsec2_from_nanolambert(double nl);

// Spectral photon flux density of the sky entering a circular field of view of diameter fov_rad, in
// the instrument's band (photons m^-2 s^-1 Hz^-1, like n_star): n0(band) 10^(-0.4 mu) Omega_arcsec2.
double sky_photon_flux_density(const Instrument& inst, double sky_mag_arcsec2);

// ---------------------------------------------------------------------------------------------------
// Detected rates, saturation and noise of one telescope pair (the planner's inner loop)
// ---------------------------------------------------------------------------------------------------

// What one detector sees.
struct DetectorRates {
  double star_hz = 0;        // detected star rate after any attenuation
  double sky_hz = 0;         // detected sky rate after any attenuation
  double dark_hz = 0;        // dark rate (not attenuated)
  double attenuation = 1;    // neutral-density transmission needed to stay at max_rate_hz (1 = none)
  bool saturated = false;    // the unattenuated rate exceeded max_rate_hz
  bool blinded = false;      // even full attenuation cannot help (dark rate alone >= max_rate_hz)
  double total_hz() const { return star_hz + sky_hz + dark_hz; }
  double dilution() const { return total_hz() > 0 ? star_hz / total_hz() : 0; }  // n_s/(n_s+n_b)
  double nd_mag() const;     // the attenuation in magnitudes, -2.5 log10(attenuation)
};

// Rates for one telescope of effective area area_m2.
// Given: n_star and n_sky in photons m^-2 s^-1 Hz^-1 (both at the telescope; see the conventions above).
// Notes: rate = A alpha n W (W = filter_equivalent_width_hz). If star+sky+dark exceeds
//        inst.max_rate_hz (> 0), a neutral-density filter of transmission
//        t = (max_rate - dark)/(star + sky) is assumed in front of the detector (dark counts pass
//        unattenuated); the returned rates are the attenuated ones.
DetectorRates detector_rates(const Instrument& inst, double area_m2, double n_star, double n_sky);

// Noise of the pair's |V|^2 measurement.
struct PairNoise {
  double sigma_vis2 = 0;     // 1/SNR(|V|^2 = 1) in time t_s, all channels combined
  DetectorRates det1, det2;
};

// sigma(|V|^2) for one telescope pair integrating for t_s seconds.
//
// Given:    inst                 detection chain (mode, filter, alpha, bandwidth or timing, F, eta, M)
//           area1_m2, area2_m2   effective collecting areas
//           n_star_1, n_star_2   star's spectral photon flux density at each telescope (after extinction)
//           n_sky_1, n_sky_2     sky's spectral photon flux density through each field of view
//           t_s                  integration time
// Returns:  sigma(|V|^2) = 1/SNR(|V|^2 = 1); SNR(|V|^2) = |V|^2/sigma.
// Notes:    With N_k the detected star rates, d_k = N_k/(N_k + sky + dark) the dilution,
//           tau_c the coherence time (all after attenuation):
//           analog (Hanbury Brown 1974 ch. 5, 9; sensitivity.md §1.3):
//             SNR = sqrt(N1 N2) tau_c |V|^2 sqrt(df T/2) eta/F sqrt(d1 d2) sqrt(M)
//           which for a top-hat filter is sqrt(A1A2) alpha n |V|^2 sqrt(df T/2) eta/F ... (N tau_c = A alpha n);
//           photon counting, Gaussian timing response of FWHM tau_el (sensitivity.md §2.2a, optimal
//           one-parameter fit of the bunching peak):
//             SNR = (2 ln2/pi)^(1/4) (1/2) |V|^2 tau_c sqrt(N1 N2 T/tau_el) eta/F sqrt(d1 d2) sqrt(M)
//           The two coincide for df = (2 ln2/pi)^(1/2)/(2 tau_el) = 0.332/tau_el (§2.2c).
//           Returns +inf when no light reaches a detector (blinded or zero flux).
// Tested in: tests/astro/sensitivity_test.cpp
PairNoise pair_noise(const Instrument& inst, double area1_m2, double area2_m2, double n_star_1, double n_star_2,
                     double n_sky_1, double n_sky_2, double t_s);
// Just the number (the planner's call).
double sigma_vis2(const Instrument& inst, double area1_m2, double area2_m2, double n_star_1, double n_star_2,
                  double n_sky_1, double n_sky_2, double t_s);

// Analog bandwidth equivalent to a Gaussian timing response of FWHM tau_el:
// df_eq = sqrt(2 ln2/pi)/(2 tau_el) ≈ 0.332/tau_el (sensitivity.md §2.2c).
double equivalent_analog_bandwidth_hz(double timing_fwhm_s);

// ---------------------------------------------------------------------------------------------------
// Diameter estimate for stars without a measured diameter
// ---------------------------------------------------------------------------------------------------

// Bolometric correction BC_V(Teff): Flower (1996), ApJ 469, 355, polynomial in log10 Teff with the
// corrected coefficients of Torres (2010), AJ 140, 1158, Table 1 (valid 3.5 <= log Teff <= 4.7).
double bolometric_correction_v(double teff_k);

// Angular diameter (radians) of a star from its V magnitude and effective temperature.
// Notes:  theta = 2 sqrt(F_bol/(sigma_SB Teff^4)) with F_bol the bolometric flux at the Earth,
//         F_bol = S_sun 10^(-0.4[(V + BC_V(Teff)) - (V_sun + BC_V(T_sun))]): the Sun as the zero point,
//         as Torres (2010) §2 insists, with V_sun = -26.76 (Torres 2010), S_sun = 1361 W m^-2 and
//         T_sun = 5772 K (IAU 2015 Resolution B3 nominal values). No reddening correction: meant for
//         nearby bright stars. The result is the limb-darkened (photospheric) diameter.
// Tested in: tests/astro/sensitivity_test.cpp (Sun, Sirius, beta UMa).
double diameter_from_teff_rad(double v_magnitude, double teff_k);

}  // namespace siiplan::astro
