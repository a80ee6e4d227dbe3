// Fuzz the CSV reader: arbitrary bytes -> a table or an InputError, and every cell number-parsed.
#include "fuzz_support.hpp"
#include "io/csv.hpp"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  siiplan::fuzz::expect_result_or_input_error([&] {
    auto table = siiplan::io::parse_csv(std::string_view(reinterpret_cast<const char*>(data), size), "fuzz.csv");
    for (const auto& row : table.rows())
      for (std::size_t c = 0; c < row.cells.size(); ++c) (void)siiplan::io::parse_number(row.cells[c]);
  });
  return 0;
}
