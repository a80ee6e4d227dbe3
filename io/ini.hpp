// INI files written by people (site, instrument): "[section]" headers and "key = value" lines; a '#' or
// ';' at the start of a line or after a blank starts a comment. Every key remembers its line for error
// messages; a key given twice, a line without '=' or an unclosed header is an InputError naming the line.
// Unknown keys are not fatal: unknown_keys() lists them so the caller can warn.
#pragma once

#include <filesystem>
#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

namespace siiplan::io {

class IniFile {
 public:
  static IniFile read(const std::filesystem::path& path);
  static IniFile parse(const std::string& text, const std::string& source);

  const std::string& source() const { return source_; }
  bool has_section(const std::string& section) const;
  bool has(const std::string& key) const { return values_.count(key) != 0; }   // key = "section.name"
  std::optional<std::string> text(const std::string& key) const;
  // Required number: InputError "<file>: missing key 'name' in [section]" or "<file>:<line>: ... not a number".
  double number(const std::string& key, const std::string& hint) const;
  double number_or(const std::string& key, double fallback) const;
  // "<file>:<line>" of a key, or "<file>" when absent.
  std::string where(const std::string& key) const;
  // Keys present in `section` but not in `known` (as "section.name").
  std::vector<std::string> unknown_keys(const std::string& section, const std::set<std::string>& known) const;

 private:
  std::string source_;
  std::map<std::string, std::pair<std::string, int>> values_;  // key -> (value, line)
  std::set<std::string> sections_;
};

}  // namespace siiplan::io
