// Tabular output in two forms: an aligned table for people, CSV for scripts.
//
// CSV: a header of snake_case names that carry units (baseline_m, vis2, delay_ns), numbers printed
// with 15 significant digits (round-trips to ~1e-15 relative), text quoted when it needs it.
// Table: right-aligned numbers at each column's display precision, text left-aligned.
#pragma once

#include <iosfwd>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

namespace siiplan::io {

enum class Format { Table, Csv };
// "table" or "csv"; throws InputError naming --format otherwise.
Format parse_format(std::string_view text);

class Table {
 public:
  using Cell = std::variant<double, long long, std::string>;
  // precision: significant digits in the human table (CSV always uses full precision).
  void add_column(std::string name, int precision = 6);
  void add_row(std::vector<Cell> cells);   // one cell per column, in order
  std::size_t rows() const { return rows_.size(); }
  void write(std::ostream& out, Format format) const;

 private:
  struct Column {
    std::string name;
    int precision;
  };
  std::vector<Column> columns_;
  std::vector<std::vector<Cell>> rows_;
};

// Number formatting shared by every writer: %.15g for machine output, %.<p>g for people.
std::string format_number(double value, int significant_digits = 15);
// One number through a printf format ("%.2f", "%g"), for prose and HTML.
std::string format_printf(const char* printf_format, double value);
// CSV field quoting (RFC 4180): quote when the text holds a comma, quote or newline.
std::string csv_escape(std::string_view text);

}  // namespace siiplan::io
