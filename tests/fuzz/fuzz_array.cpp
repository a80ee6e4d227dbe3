// Fuzz the telescope-array CSV reader (both coordinate forms) against a fixed site.
#include "fuzz_support.hpp"
#include "io/site_io.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::astro::Site site;
  site.name = "fuzz";
  site.lat_rad = -0.4767;
  site.lon_east_rad = -1.2015;
  site.height_m = 2710;
  siiplan::fuzz::expect_result_or_input_error([&] {
    (void)siiplan::io::parse_array(siiplan::fuzz::text(data, size), "fuzz.csv", site);
  });
  return 0;
}
