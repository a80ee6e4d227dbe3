// Fuzz the target catalog CSV reader (angles, models and their parameters, extra columns).
#include "fuzz_support.hpp"
#include "io/catalog.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::expect_result_or_input_error([&] {
    (void)siiplan::io::parse_catalog(siiplan::fuzz::text(data, size), "fuzz.csv");
  });
  return 0;
}
