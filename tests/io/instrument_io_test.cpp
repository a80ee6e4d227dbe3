// Tests of io/instrument_io: the [instrument] INI reader.
#include "io/instrument_io.hpp"

#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "support/close.hpp"

using namespace siiplan;
using siiplan::test::check_close;

TEST_SUITE("io/instrument_io") {

TEST_CASE("efficiency from its parts, defaults, nearest band and warnings") {
  const std::string text =
      "[instrument]\nmode = photon-counting\nwavelength_nm = 656\nbandwidth_nm = 1\nprofile = gaussian\n"
      "mirror_reflectivity = 0.8\nfilter_transmission = 0.9\ncoupling = 0.5\nquantum_efficiency = 0.6\n"
      "timing_fwhm_ps = 400\nelectronic_bandwidth_mhz = 100\nfov_arcsec = 4\nmax_rate_mhz = 15\ndark_rate_hz = 250\n"
      "zero_baseline = free\ncolour = red\n";
  std::vector<std::string> warnings;
  astro::Instrument inst = io::parse_instrument(text, "t.ini", &warnings);
  check_close(inst.efficiency, 0.8 * 0.9 * 0.5 * 0.6, 1e-15, 0, "alpha = product of the parts");
  check_close(inst.timing_fwhm_s, 400e-12, 1e-15, 0, "timing");
  check_close(inst.fov_rad, 4 * astro::kArcsecToRad, 1e-15, 0, "fov");
  check_close(inst.max_rate_hz, 15e6, 1e-15, 0, "max rate");
  CHECK(inst.mode == astro::DetectionMode::PhotonCounting);
  CHECK(inst.profile == astro::FilterProfile::Gaussian);
  CHECK(inst.zero_baseline == astro::ZeroBaseline::Free);
  CHECK(inst.band == astro::Band::R);           // 656 nm: nearest Bessell centre is R (640 nm)
  CHECK(inst.excess_noise == 1);                // defaults
  CHECK(inst.correlator_efficiency == 1);
  CHECK(inst.channels == 1);
  REQUIRE(warnings.size() == 2);                // electronic_bandwidth_mhz unused, colour unknown
  CHECK(warnings[0].find("t.ini:11") == 0);
  CHECK(warnings[1].find("unknown key 'colour'") != std::string::npos);
}

TEST_CASE("range errors name file:line") {
  const std::string head = "[instrument]\nmode = analog\nwavelength_nm = 420\nbandwidth_nm = 10\nelectronic_bandwidth_mhz = 100\n"
                           "fov_arcsec = 60\nmax_rate_mhz = none\ndark_rate_hz = 0\nzero_baseline = calibrated\n";
  CHECK_NOTHROW(io::parse_instrument(head + "efficiency = 1\n", "t.ini"));
  try {
    io::parse_instrument(head + "efficiency = 1.2\n", "t.ini");
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(e.where() == "t.ini:10");
  }
  CHECK_THROWS_AS(io::parse_instrument(head + "efficiency = 0.2\nchannels = 2.5\n", "t.ini"), InputError);
  CHECK_THROWS_AS(io::parse_instrument(head + "efficiency = 0.2\nexcess_noise = 0.9\n", "t.ini"), InputError);
  CHECK_THROWS_AS(io::parse_instrument(head + "efficiency = 0.2\nquantum_efficiency = 0.3\n", "t.ini"), InputError);
  CHECK_THROWS_AS(io::parse_instrument(head + "efficiency = 0.2\nband = Q\n", "t.ini"), InputError);
}

}  // TEST_SUITE
