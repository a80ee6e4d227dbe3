#include "io/ini.hpp"

#include <sstream>

#include "astro/errors.hpp"
#include "io/csv.hpp"

namespace siiplan::io {

IniFile IniFile::read(const std::filesystem::path& path) { return parse(read_file_text(path), path.string()); }

IniFile IniFile::parse(const std::string& text, const std::string& source) {
  IniFile ini;
  ini.source_ = source;
  const bool bom = text.rfind("\xEF\xBB\xBF", 0) == 0;   // UTF-8 byte-order mark
  std::istringstream in(bom ? text.substr(3) : text);
  std::string line, section;
  int n = 0;
  while (std::getline(in, line)) {
    ++n;
    const std::string at = source + ":" + std::to_string(n);
    if (std::size_t bad = invalid_utf8_at(line); bad != std::string::npos)
      throw InputError(at, "byte " + std::to_string(bad + 1) + " of the line is not valid UTF-8 text",
                       "save the file as UTF-8 (or plain ASCII)");
    // A '#' or ';' at the start of the line or after a blank starts a comment.
    for (std::size_t p = 0; p < line.size(); ++p)
      if ((line[p] == '#' || line[p] == ';') && (p == 0 || line[p - 1] == ' ' || line[p - 1] == '\t')) {
        line.resize(p);
        break;
      }
    std::string t = trimmed(line);
    if (t.empty()) continue;
    if (t.front() == '[') {
      if (t.back() != ']')
        throw InputError(at, "section header '" + t + "' is not closed", "write it as [name]");
      section = trimmed(t.substr(1, t.size() - 2));
      ini.sections_.insert(section);
      continue;
    }
    auto eq = t.find('=');
    if (eq == std::string::npos)
      throw InputError(at, "line '" + t + "' is not 'key = value'",
                       "write one 'key = value' per line, or comment the line out with '#'");
    std::string name = trimmed(t.substr(0, eq));
    if (name.empty()) throw InputError(at, "line '" + t + "' has no key before '='", "write it as 'key = value'");
    std::string key = (section.empty() ? "" : section + ".") + name;
    if (ini.values_.count(key))
      throw InputError(at, "key '" + key + "' is given twice", "keep one of the two lines");
    ini.values_[key] = {trimmed(t.substr(eq + 1)), n};
  }
  if (ini.values_.empty() && ini.sections_.empty())
    throw InputError(source, "the file is empty", "see the README for the keys it needs");
  return ini;
}

bool IniFile::has_section(const std::string& section) const { return sections_.count(section) != 0; }

std::optional<std::string> IniFile::text(const std::string& key) const {
  auto it = values_.find(key);
  if (it == values_.end()) return std::nullopt;
  return it->second.first;
}

std::string IniFile::where(const std::string& key) const {
  auto it = values_.find(key);
  if (it == values_.end() || it->second.second == 0) return source_;
  return source_ + ":" + std::to_string(it->second.second);
}

double IniFile::number(const std::string& key, const std::string& hint) const {
  auto it = values_.find(key);
  if (it == values_.end()) {
    auto dot = key.find('.');
    std::string section = dot == std::string::npos ? "" : key.substr(0, dot);
    std::string name = dot == std::string::npos ? key : key.substr(dot + 1);
    throw InputError(source_, "missing key '" + name + "'" + (section.empty() ? "" : " in [" + section + "]"), hint);
  }
  if (auto v = parse_number(it->second.first)) return *v;
  throw InputError(where(key), "'" + key + " = " + it->second.first + "' is not a finite number", hint);
}

double IniFile::number_or(const std::string& key, double fallback) const {
  return has(key) ? number(key, "write a plain decimal number") : fallback;
}

std::vector<std::string> IniFile::unknown_keys(const std::string& section, const std::set<std::string>& known) const {
  std::vector<std::string> out;
  std::string prefix = section + ".";
  for (auto& [key, value] : values_)
    if (key.rfind(prefix, 0) == 0 && !known.count(key.substr(prefix.size()))) out.push_back(key);
  return out;
}

}  // namespace siiplan::io
