// Instrument files (INI, section [instrument]): the detection chain of an intensity interferometer.
//
// Keys (units in the names; "required" means no default because the trade has no common value):
//   mode                    analog | photon-counting                                      required
//   wavelength_nm           filter central wavelength, 200..2500                          required
//   bandwidth_nm            filter width (FWHM for a Gaussian profile), > 0, < wavelength/2 required
//   profile                 top-hat | gaussian                                            default top-hat
//   efficiency              total detection efficiency alpha at the filter peak, (0, 1]   required, OR
//   mirror_reflectivity, filter_transmission, coupling, quantum_efficiency
//                           its four parts, each (0, 1]; alpha is their product           (all four)
//   electronic_bandwidth_mhz   analog: effective post-detection bandwidth, > 0            required (analog)
//   timing_fwhm_ps          photon counting: FWHM of the Gaussian timing response, > 0    required (photon-counting)
//   excess_noise            detector excess-noise factor F (amplitude), 1..10             default 1
//   correlator_efficiency   eta_corr, (0, 1]                                              default 1
//   channels                independent spectral channels M, integer 1..100000            default 1
//   fov_arcsec              diameter of each detector's field of view on the sky, (0, 3600] required
//   max_rate_mhz            maximum usable detected rate per detector, > 0, or 'none'     required
//   dark_rate_hz            dark counts (or equivalent dark current) per detector, >= 0   required
//   zero_baseline           calibrated | free (whether c(0) must be fitted)               required
//   band                    U|B|V|R|I, whose magnitudes feed this filter                  default: nearest band centre
// Errors are InputError naming file:line (or the file for a missing key), the rule broken and the fix.
// Unknown keys and keys of the other mode are reported through `warnings`.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "astro/sensitivity.hpp"

namespace siiplan::io {

astro::Instrument read_instrument(const std::filesystem::path& path, std::vector<std::string>* warnings = nullptr);
astro::Instrument parse_instrument(const std::string& text, const std::string& source,
                                   std::vector<std::string>* warnings = nullptr);

}  // namespace siiplan::io
