// Fuzz the measurement CSV reader, as calibrated |V|^2 and as raw correlations, then the cross-checks.
#include "fuzz_support.hpp"
#include "io/vis2_csv.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::TempFile file(data, size, ".csv");
  for (bool raw : {false, true})
    siiplan::fuzz::expect_result_or_input_error([&] {
      auto vis2 = siiplan::io::read_vis2_csv(file.path(), raw);
      vis2.validate("fuzz.csv");
    });
  return 0;
}
