#include "io/table.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <ostream>

#include "astro/errors.hpp"

namespace siiplan::io {

Format parse_format(std::string_view text) {
  if (text == "table") return Format::Table;
  if (text == "csv") return Format::Csv;
  throw InputError("--format", "unknown format '" + std::string(text) + "'", "use 'table' or 'csv'");
}

std::string format_number(double value, int significant_digits) {
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", significant_digits, value);
  return buf;
}

std::string format_printf(const char* printf_format, double value) {
  char buf[64];
  std::snprintf(buf, sizeof buf, printf_format, value);
  return buf;
}

std::string csv_escape(std::string_view text) {
  if (text.find_first_of(",\"\n\r") == std::string_view::npos) return std::string(text);
  std::string out = "\"";
  for (char c : text) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

void Table::add_column(std::string name, int precision) { columns_.push_back({std::move(name), precision}); }

void Table::add_row(std::vector<Cell> cells) {
  cells.resize(columns_.size(), std::string());
  rows_.push_back(std::move(cells));
}

void Table::write(std::ostream& out, Format format) const {
  auto render = [&](const Cell& cell, int precision) -> std::string {
    if (auto* d = std::get_if<double>(&cell)) return format_number(*d, precision);
    if (auto* i = std::get_if<long long>(&cell)) return std::to_string(*i);
    return std::get<std::string>(cell);
  };
  if (format == Format::Csv) {
    for (std::size_t c = 0; c < columns_.size(); ++c) out << (c ? "," : "") << columns_[c].name;
    out << '\n';
    for (auto& row : rows_) {
      for (std::size_t c = 0; c < columns_.size(); ++c) out << (c ? "," : "") << csv_escape(render(row[c], 15));
      out << '\n';
    }
    return;
  }
  std::vector<std::vector<std::string>> text(rows_.size());
  std::vector<std::size_t> width(columns_.size());
  for (std::size_t c = 0; c < columns_.size(); ++c) width[c] = columns_[c].name.size();
  for (std::size_t r = 0; r < rows_.size(); ++r)
    for (std::size_t c = 0; c < columns_.size(); ++c) {
      text[r].push_back(render(rows_[r][c], columns_[c].precision));
      width[c] = std::max(width[c], text[r][c].size());
    }
  auto is_text = [&](std::size_t c) {
    return !rows_.empty() && std::holds_alternative<std::string>(rows_.front()[c]);
  };
  auto pad = [&](const std::string& s, std::size_t c) {
    std::string fill(width[c] - s.size(), ' ');
    return is_text(c) ? s + fill : fill + s;
  };
  for (std::size_t c = 0; c < columns_.size(); ++c) out << (c ? "  " : "") << pad(columns_[c].name, c);
  out << '\n';
  for (std::size_t c = 0; c < columns_.size(); ++c) out << (c ? "  " : "") << std::string(width[c], '-');
  out << '\n';
  for (auto& row : text) {
    for (std::size_t c = 0; c < columns_.size(); ++c) out << (c ? "  " : "") << pad(row[c], c);
    out << '\n';
  }
}

}  // namespace siiplan::io
