#include "planner/cli/values.hpp"

#include <cmath>
#include <sstream>

#include "astro/errors.hpp"
#include "io/csv.hpp"

namespace siiplan::cli {

namespace {
double number(const std::string& item, const std::string& option) {
  if (auto v = io::parse_number(item)) return *v;
  throw InputError("--" + option, "'" + item + "' is not a finite number",
                   "write START:STOP:STEP (e.g. 0:200:5) or a comma list (e.g. 20,50,120)");
}
std::vector<std::string> split(const std::string& text, char sep) {
  std::vector<std::string> out;
  std::stringstream ss(text);
  std::string item;
  while (std::getline(ss, item, sep)) out.push_back(item);
  if (!text.empty() && text.back() == sep) out.emplace_back();
  return out;
}
}  // namespace

std::vector<double> parse_number_list(const std::string& text, const std::string& option, std::size_t max_count) {
  const std::string hint = "write START:STOP:STEP (e.g. 0:200:5) or a comma list (e.g. 20,50,120)";
  if (text.find(':') != std::string::npos) {
    auto parts = split(text, ':');
    if (parts.size() != 3) throw InputError("--" + option, "range '" + text + "' needs three parts", hint);
    double start = number(parts[0], option), stop = number(parts[1], option), step = number(parts[2], option);
    if (!(step > 0)) throw InputError("--" + option, "the step of '" + text + "' must be greater than zero", hint);
    if (stop < start) throw InputError("--" + option, "range '" + text + "' ends before it starts", hint);
    double n = std::floor((stop - start) / step * (1 + 1e-12)) + 1;
    if (n > double(max_count))
      throw InputError("--" + option, "range '" + text + "' has more than " + std::to_string(max_count) + " values",
                       "use a larger step");
    std::vector<double> out;
    for (std::size_t i = 0; i < std::size_t(n); ++i) out.push_back(start + double(i) * step);
    return out;
  }
  std::vector<double> out;
  for (const auto& item : split(text, ',')) out.push_back(number(item, option));
  if (out.empty()) throw InputError("--" + option, "no values given", hint);
  if (out.size() > max_count)
    throw InputError("--" + option, "more than " + std::to_string(max_count) + " values", "give fewer values");
  return out;
}

std::vector<std::string> parse_word_list(const std::string& text, const std::string& option) {
  std::vector<std::string> out;
  for (auto& item : split(text, ',')) {
    auto b = item.find_first_not_of(' '), e = item.find_last_not_of(' ');
    if (b == std::string::npos) throw InputError("--" + option, "empty item in '" + text + "'", "separate items with single commas");
    out.push_back(item.substr(b, e - b + 1));
  }
  if (out.empty()) throw InputError("--" + option, "no items given", "give a comma-separated list");
  return out;
}

}  // namespace siiplan::cli
