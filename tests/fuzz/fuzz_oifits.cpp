// Fuzz the OIFITS reader (cfitsio): the bytes go through a temporary file.
#include "fuzz_support.hpp"
#include "io/oifits.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::TempFile file(data, size, ".oifits");
  siiplan::fuzz::expect_result_or_input_error([&] {
    auto vis2 = siiplan::io::read_oifits(file.path());
    vis2.validate("fuzz.oifits");
  });
  return 0;
}
