// Fuzz the night-plan HDF5 reader: the bytes go through a temporary file.
#include "fuzz_support.hpp"
#include "io/plan_h5.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::TempFile file(data, size, ".h5");
  siiplan::fuzz::expect_result_or_input_error([&] { (void)siiplan::io::read_plan_h5(file.path()); });
  return 0;
}
