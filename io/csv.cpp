#include "io/csv.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <fstream>
#include <sstream>

#include "astro/errors.hpp"

namespace siiplan::io {

namespace {

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
  return s;
}

bool iequal(std::string_view a, std::string_view b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return std::tolower(static_cast<unsigned char>(x)) == std::tolower(static_cast<unsigned char>(y));
         });
}

// Split one CSV record (no embedded newlines) into trimmed fields.
std::vector<std::string> split_record(std::string_view line, const std::string& where) {
  std::vector<std::string> out;
  std::string field;
  bool quoted = false, was_quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    char c = line[i];
    if (quoted) {
      if (c == '"') {
        if (i + 1 < line.size() && line[i + 1] == '"') {
          field += '"';
          ++i;
        } else {
          quoted = false;
        }
      } else {
        field += c;
      }
    } else if (c == '"' && trim(field).empty()) {
      quoted = was_quoted = true;
      field.clear();
    } else if (c == ',') {
      out.emplace_back(was_quoted ? field : std::string(trim(field)));
      field.clear();
      was_quoted = false;
    } else {
      field += c;
    }
  }
  if (quoted) throw InputError(where, "a quoted field is not closed", "add the closing '\"'");
  out.emplace_back(was_quoted ? field : std::string(trim(field)));
  return out;
}

}  // namespace

std::size_t invalid_utf8_at(std::string_view s) {
  std::size_t i = 0;
  while (i < s.size()) {
    auto c = static_cast<unsigned char>(s[i]);
    std::size_t n = c < 0x80 ? 1 : (c >> 5) == 0x6 ? 2 : (c >> 4) == 0xE ? 3 : (c >> 3) == 0x1E ? 4 : 0;
    if (n == 0 || i + n > s.size()) return i;
    for (std::size_t k = 1; k < n; ++k)
      if ((static_cast<unsigned char>(s[i + k]) >> 6) != 0x2) return i;
    i += n;
  }
  return std::string_view::npos;
}

std::string trimmed(std::string_view text) { return std::string(trim(text)); }

std::optional<double> parse_number(std::string_view text) {
  text = trim(text);
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  if (text.empty()) return std::nullopt;
  double value = 0;
  auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec != std::errc() || ptr != text.data() + text.size() || !std::isfinite(value)) return std::nullopt;
  return value;
}

std::string read_file_text(const std::filesystem::path& path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec))
    throw InputError(path.string(), "no such file", "check the path");
  if (std::filesystem::is_directory(path, ec))
    throw InputError(path.string(), "is a directory, not a file", "give the path of a file");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path.string(), "cannot open the file", "check its permissions");
  std::ostringstream buffer;
  buffer << in.rdbuf();
  return buffer.str();
}

CsvTable read_csv(const std::filesystem::path& path) { return parse_csv(read_file_text(path), path.string()); }

CsvTable parse_csv(std::string_view text, std::string source) {
  CsvTable table;
  table.source_ = std::move(source);
  if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  int line_no = 0;
  std::size_t pos = 0;
  while (pos < text.size()) {
    std::size_t end = text.find('\n', pos);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(pos, end - pos);
    pos = end + 1;
    ++line_no;
    std::string where = table.source_ + ":" + std::to_string(line_no);
    if (std::size_t bad = invalid_utf8_at(line); bad != std::string_view::npos)
      throw InputError(where, "byte " + std::to_string(bad + 1) + " of the line is not valid UTF-8 text",
                       "save the file as UTF-8 (or plain ASCII)");
    std::string_view content = trim(line);
    if (content.empty() || content.front() == '#') continue;
    auto fields = split_record(line, where);
    if (table.header_.empty()) {
      for (auto& f : fields) {
        if (f.empty()) throw InputError(where, "the header has an empty column name", "name every column");
        for (const auto& g : table.header_)
          if (iequal(f, g)) throw InputError(where, "column '" + f + "' appears twice in the header", "remove one");
        table.header_.push_back(f);
      }
      table.header_line_ = line_no;
      continue;
    }
    if (fields.size() > table.header_.size())
      throw InputError(where,
                       "the record has " + std::to_string(fields.size()) + " fields but the header has " +
                           std::to_string(table.header_.size()),
                       "remove the extra fields or quote fields that contain commas");
    fields.resize(table.header_.size());
    table.rows_.push_back({line_no, std::move(fields)});
  }
  if (table.header_.empty())
    throw InputError(table.source_, "the file is empty (no header row)", "the first line must name the columns");
  return table;
}

std::optional<std::size_t> CsvTable::find(std::string_view column) const {
  for (std::size_t i = 0; i < header_.size(); ++i)
    if (iequal(header_[i], column)) return i;
  return std::nullopt;
}

std::size_t CsvTable::require(std::string_view column, std::string_view hint) const {
  if (auto i = find(column)) return *i;
  throw InputError(source_ + ":" + std::to_string(header_line_), "missing column '" + std::string(column) + "'",
                   std::string(hint));
}

std::string CsvTable::where(const Row& row) const { return source_ + ":" + std::to_string(row.line); }

double CsvTable::number(const Row& row, std::size_t column) const {
  const std::string& cell = row.cells[column];
  if (auto v = parse_number(cell)) return *v;
  throw InputError(where(row),
                   "column '" + header_[column] + "': " + (cell.empty() ? std::string("value is missing")
                                                                         : "'" + cell + "' is not a finite number"),
                   "write a plain decimal number");
}

double CsvTable::number_or(const Row& row, std::optional<std::size_t> column, double fallback) const {
  if (!column || trim(row.cells[*column]).empty()) return fallback;
  return number(row, *column);
}

}  // namespace siiplan::io
