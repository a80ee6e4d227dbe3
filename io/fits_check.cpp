#include "io/fits_check.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <fstream>
#include <optional>
#include <string>

#include "astro/errors.hpp"
#include "io/csv.hpp"

namespace siiplan::io {
namespace {

constexpr std::size_t kCard = 80, kBlock = 2880;
constexpr long long kMaxBytes = 1LL << 50;   // beyond any real file: the header is nonsense

// Whether `keyword` is `stem` followed by a column number 1..999.
bool is_indexed(const std::string& keyword, const std::string& stem) {
  if (keyword.size() <= stem.size() || keyword.size() > stem.size() + 3 || keyword.compare(0, stem.size(), stem) != 0)
    return false;
  for (std::size_t i = stem.size(); i < keyword.size(); ++i)
    if (!std::isdigit(static_cast<unsigned char>(keyword[i]))) return false;
  return true;
}

bool must_be_text(const std::string& keyword) {
  for (const char* stem : {"TTYPE", "TFORM", "TUNIT", "TDISP", "TDIM"})
    if (is_indexed(keyword, stem)) return true;
  return keyword == "EXTNAME";
}

// The integer value of a card ("KEY     =                  123 / comment"), if it is one.
std::optional<long long> integer_value(const std::string& value) {
  std::string v = trimmed(value.substr(0, value.find('/')));
  if (v.empty() || v.size() > 18) return std::nullopt;
  std::size_t i = (v[0] == '-' || v[0] == '+') ? 1 : 0;
  if (i == v.size()) return std::nullopt;
  for (std::size_t k = i; k < v.size(); ++k)
    if (!std::isdigit(static_cast<unsigned char>(v[k]))) return std::nullopt;
  return std::stoll(v);
}

}  // namespace

void check_fits_headers(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::array<char, kCard> card{};
  if (!in.read(card.data(), kCard) || std::string(card.data(), 6) != "SIMPLE") return;
  in.seekg(0);
  const std::string file = path.string();
  long long offset = 0;
  for (int hdu = 1;; ++hdu) {
    long long bitpix = 0, naxis = -1, pcount = 0, gcount = 1, product = 1;
    bool unreadable_size = false;   // a size keyword without an integer: cfitsio will refuse the HDU
    int n = 0;
    for (;;) {
      if (!in.read(card.data(), kCard)) return;   // EOF inside a header: cfitsio reports it
      ++n;
      const std::string text(card.data(), kCard);
      if (trimmed(text.substr(0, 8)) == "END") break;
      // As cfitsio takes them: the keyword ends at the 8th column or at an earlier '='; the value follows
      // the first '=' wherever it stands (a non-standard card is judged as cfitsio might read it).
      const std::size_t eq = text.find('=');
      if (eq == std::string::npos) continue;
      const std::string keyword = trimmed(text.substr(0, std::min<std::size_t>(eq, 8)));
      const std::string value = text.substr(eq + 1);
      if (must_be_text(keyword) && trimmed(value).rfind('\'', 0) != 0)
        throw InputError(file + ": HDU " + std::to_string(hdu) + ", header card " + std::to_string(n),
                         "the value of " + keyword + " is not a quoted character string",
                         "such a file is not valid FITS, see the FITS standard 4.0 §7.3.2; write it again with a FITS library");
      const auto number = integer_value(value);
      const bool size_keyword = keyword == "BITPIX" || keyword == "NAXIS" || keyword == "PCOUNT" ||
                                keyword == "GCOUNT" || is_indexed(keyword, "NAXIS");
      if (size_keyword && !number) unreadable_size = true;
      if (keyword == "BITPIX" && number) bitpix = *number;
      else if (keyword == "NAXIS" && number) naxis = *number;
      else if (keyword == "PCOUNT" && number) pcount = *number;
      else if (keyword == "GCOUNT" && number) gcount = *number;
      else if (is_indexed(keyword, "NAXIS") && number) {
        if (*number < 0 || (*number > 0 && product > kMaxBytes / *number)) return;
        product *= *number;
      }
    }
    if (unreadable_size || naxis < 0) return;   // the next HDU cannot be found; cfitsio reports this one
    const long long header_bytes = (static_cast<long long>(n) * kCard + kBlock - 1) / kBlock * kBlock;
    if (naxis == 0) product = 0;
    const long long word = (bitpix < 0 ? -bitpix : bitpix) / 8;
    if (word == 0 || pcount < 0 || gcount < 0 || product + pcount > kMaxBytes / word / (gcount > 0 ? gcount : 1)) return;
    const long long data_bytes = (word * gcount * (pcount + product) + kBlock - 1) / kBlock * kBlock;
    offset += header_bytes + data_bytes;
    in.clear();
    if (!in.seekg(offset) || in.peek() == std::char_traits<char>::eof()) return;
  }
}

}  // namespace siiplan::io
