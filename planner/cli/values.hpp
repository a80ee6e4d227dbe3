// Parsing of list-valued command-line options.
#pragma once

#include <string>
#include <vector>

namespace siiplan::cli {

// "START:STOP:STEP" (inclusive of STOP within rounding) or a comma list "10,20,35.5".
// Throws InputError naming --<option> for malformed text, a zero/negative step, STOP < START, or more
// than max_count values.
std::vector<double> parse_number_list(const std::string& text, const std::string& option, std::size_t max_count = 10'000'000);

// A comma-separated list of words ("ud,ld-linear"), empty items rejected.
std::vector<std::string> parse_word_list(const std::string& text, const std::string& option);

}  // namespace siiplan::cli
