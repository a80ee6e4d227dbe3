// Fuzz the INI reader: arbitrary bytes -> key/values or an InputError.
#include "fuzz_support.hpp"
#include "io/ini.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::expect_result_or_input_error([&] {
    auto ini = siiplan::io::IniFile::parse(siiplan::fuzz::text(data, size), "fuzz.ini");
    (void)ini.number_or("site.latitude_deg", 0);
  });
  return 0;
}
