#include "io/catalog_fits.hpp"

#include <fitsio.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <memory>
#include <string>

#include "astro/errors.hpp"
#include "io/csv.hpp"
#include "io/fits_check.hpp"
#include "io/catalog.hpp"
#include "io/table.hpp"

namespace siiplan::io {

namespace {

std::string lower(std::string s) {
  for (auto& c : s) c = char(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

std::string fits_message(int status) {
  char text[FLEN_STATUS] = {0};
  fits_get_errstatus(status, text);
  return text;
}

struct FitsCloser {
  void operator()(fitsfile* f) const {
    int status = 0;
    fits_close_file(f, &status);
  }
};

// Moves to the catalog table: the extension named TARGETS, else the first binary table.
std::string find_table(fitsfile* f, const std::string& file) {
  int status = 0;
  if (fits_movnam_hdu(f, BINARY_TBL, const_cast<char*>("TARGETS"), 0, &status) == 0) return "TARGETS";
  status = 0;
  int n_hdus = 0;
  fits_get_num_hdus(f, &n_hdus, &status);
  for (int h = 2; h <= n_hdus; ++h) {
    int type = 0;
    status = 0;
    if (fits_movabs_hdu(f, h, &type, &status) == 0 && type == BINARY_TBL) {
      char extname[FLEN_VALUE] = {0};
      int s2 = 0;
      if (fits_read_key(f, TSTRING, "EXTNAME", extname, nullptr, &s2) == 0 && extname[0]) return extname;
      return "HDU " + std::to_string(h);
    }
  }
  throw InputError(file, "no binary table in this FITS file", "write the catalog as a BINTABLE extension (or as CSV)");
}


}  // namespace

bool is_fits_path(const std::filesystem::path& path) {
  std::string name = lower(path.filename().string());
  if (name.size() > 3 && name.compare(name.size() - 3, 3, ".gz") == 0) name.resize(name.size() - 3);
  for (const char* ext : {".fits", ".fit", ".fts"}) {
    std::string e(ext);
    if (name.size() > e.size() && name.compare(name.size() - e.size(), e.size(), e) == 0) return true;
  }
  return false;
}

std::vector<astro::Target> read_target_catalog(const std::filesystem::path& path) {
  return is_fits_path(path) ? read_catalog_fits(path) : read_catalog(path);
}

std::vector<astro::Target> read_catalog_fits(const std::filesystem::path& path) {
  const std::string file = path.string();
  if (!std::filesystem::exists(path)) throw InputError(file, "file not found", "check the path given to --catalog");
  check_fits_headers(path);
  fitsfile* raw = nullptr;
  int status = 0;
  if (fits_open_file(&raw, file.c_str(), READONLY, &status))
    throw InputError(file, "cannot read as FITS: " + fits_message(status), "give a FITS binary table or a CSV catalog");
  std::unique_ptr<fitsfile, FitsCloser> f(raw);
  const std::string source = file + "[" + find_table(raw, file) + "]";
  int n_cols = 0;
  long n_rows = 0;
  fits_get_num_cols(raw, &n_cols, &status);
  fits_get_num_rows(raw, &n_rows, &status);
  if (status) throw InputError(source, "unreadable table: " + fits_message(status), "check the file");

  // The table as CSV text, then the CSV catalog rules (one implementation of the checks).
  std::vector<int> type(std::size_t(n_cols) + 1);
  std::vector<long> width(std::size_t(n_cols) + 1);
  std::string text;
  for (int c = 1; c <= n_cols; ++c) {
    char key[FLEN_KEYWORD], name[FLEN_VALUE] = {0};
    fits_make_keyn("TTYPE", c, key, &status);
    fits_read_key(raw, TSTRING, key, name, nullptr, &status);
    long repeat = 0;
    fits_get_eqcoltype(raw, c, &type[std::size_t(c)], &repeat, &width[std::size_t(c)], &status);
    if (status) throw InputError(source, "column " + std::to_string(c) + ": " + fits_message(status), "check the table header");
    const std::string column = lower(trimmed(name));
    if ((column == "name" || column == "model") && type[std::size_t(c)] != TSTRING)
      throw InputError(source + " column '" + trimmed(name) + "'", "is numeric, but it must hold text",
                       "store it as a character column (TFORM nA)");
    text += (c > 1 ? "," : "") + csv_escape(trimmed(name));
  }
  text += '\n';
  for (long r = 1; r <= n_rows; ++r) {
    for (int c = 1; c <= n_cols; ++c) {
      std::string cell;
      if (type[std::size_t(c)] == TSTRING) {
        std::string buf(std::size_t(width[std::size_t(c)]) + 1, '\0');
        char* p = buf.data();
        int anynul = 0;
        fits_read_col(raw, TSTRING, c, r, 1, 1, const_cast<char*>(""), &p, &anynul, &status);
        cell = trimmed(std::string(p));
      } else {
        double value = NAN, nul = NAN;
        int anynul = 0;
        fits_read_col(raw, TDOUBLE, c, r, 1, 1, &nul, &value, &anynul, &status);
        if (!anynul && std::isfinite(value)) cell = format_number(value, 17);
      }
      if (status) throw InputError(source + " row " + std::to_string(r), fits_message(status), "check the table");
      text += (c > 1 ? "," : "") + csv_escape(cell);
    }
    text += '\n';
  }
  try {
    return parse_catalog(text, source);
  } catch (const InputError& e) {
    // "<source>:<line>..." -> "<source> row <line - 1>..." (line 1 is the header)
    std::string where = e.where();
    if (where.rfind(source + ":", 0) == 0) {
      std::size_t pos = source.size() + 1, end = pos;
      while (end < where.size() && std::isdigit(static_cast<unsigned char>(where[end]))) ++end;
      if (end > pos) {
        long line = std::stol(where.substr(pos, end - pos));
        where = source + (line <= 1 ? std::string(" columns") : " row " + std::to_string(line - 1)) + where.substr(end);
      }
    }
    throw InputError(where, e.problem(), e.hint());
  }
}

}  // namespace siiplan::io
