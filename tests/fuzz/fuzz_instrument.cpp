// Fuzz the instrument INI reader: arbitrary bytes -> an Instrument (with warnings) or an InputError.
#include "fuzz_support.hpp"
#include "io/instrument_io.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::expect_result_or_input_error([&] {
    std::vector<std::string> warnings;
    (void)siiplan::io::parse_instrument(siiplan::fuzz::text(data, size), "fuzz.ini", &warnings);
  });
  return 0;
}
