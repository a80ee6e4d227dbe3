// Target catalogs as FITS binary tables (cfitsio), and the one place that picks the reader by extension.
//
// A FITS catalog is the first binary-table extension of the file (or the one named TARGETS when there
// are several), with the same columns as the CSV catalog (io/catalog.hpp), matched case-insensitively:
// name and model as character columns (TFORM nA); ra and dec either as numbers (degrees) or as text
// (sexagesimal); every other column numeric or text. Null values (TNULL, NaN) and blank strings count
// as empty cells. Rows are checked exactly as in a CSV catalog; errors name "<file>[<extname>] row N".
#pragma once

#include <filesystem>
#include <vector>

#include "astro/site.hpp"

namespace siiplan::io {

std::vector<astro::Target> read_catalog_fits(const std::filesystem::path& path);

// .fits, .fit, .fts (any case, optionally followed by .gz): FITS; anything else: CSV (io/catalog.hpp).
std::vector<astro::Target> read_target_catalog(const std::filesystem::path& path);
bool is_fits_path(const std::filesystem::path& path);

}  // namespace siiplan::io
