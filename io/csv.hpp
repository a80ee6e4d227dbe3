// Reading comma-separated tables written by people: a header row, then one record per line.
//
// Accepted: '#' comment lines and blank lines anywhere, CRLF line endings, a UTF-8 byte-order mark,
// double-quoted fields (with "" for a quote), spaces around fields. Rejected with file:line: a missing
// or empty file, no header, a record with more fields than the header, bytes that are not UTF-8.
// Column look-up is case-insensitive. Unknown columns are kept (callers pass them through).
#pragma once

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace siiplan::io {

class CsvTable {
 public:
  struct Row {
    int line = 0;                     // 1-based line number in the file
    std::vector<std::string> cells;   // same length as the header (short records are padded with "")
  };

  const std::string& source() const { return source_; }
  int header_line() const { return header_line_; }
  const std::vector<std::string>& header() const { return header_; }
  const std::vector<Row>& rows() const { return rows_; }

  std::optional<std::size_t> find(std::string_view column) const;
  // Throws InputError "<file>:<header line>: missing column 'x' (hint)".
  std::size_t require(std::string_view column, std::string_view hint) const;

  std::string where(const Row& row) const;   // "<file>:<line>"
  const std::string& text(const Row& row, std::size_t column) const { return row.cells[column]; }
  // A finite number; throws InputError naming file:line, the column and the bad text.
  double number(const Row& row, std::size_t column) const;
  // As number(), but an empty cell (or an absent column) gives `fallback`.
  double number_or(const Row& row, std::optional<std::size_t> column, double fallback) const;

 private:
  friend CsvTable parse_csv(std::string_view text, std::string source);
  std::string source_;
  int header_line_ = 0;
  std::vector<std::string> header_;
  std::vector<Row> rows_;
};

CsvTable parse_csv(std::string_view text, std::string source);
CsvTable read_csv(const std::filesystem::path& path);

// Read a whole file as bytes; InputError when it is missing, a directory or unreadable.
std::string read_file_text(const std::filesystem::path& path);

// Index of the first byte of `text` that is not valid UTF-8, or npos (shared with the INI reader).
std::size_t invalid_utf8_at(std::string_view text);

// `text` without leading blanks (space, tab) and trailing blanks (space, tab, carriage return).
std::string trimmed(std::string_view text);

// Parse a finite double from the whole of `text` (surrounding spaces allowed); nullopt otherwise.
std::optional<double> parse_number(std::string_view text);

}  // namespace siiplan::io
