// Fuzz the FITS catalog reader (cfitsio): the bytes go through a temporary file.
#include "fuzz_support.hpp"
#include "io/catalog_fits.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::TempFile file(data, size, ".fits");
  siiplan::fuzz::expect_result_or_input_error([&] { (void)siiplan::io::read_catalog_fits(file.path()); });
  return 0;
}
