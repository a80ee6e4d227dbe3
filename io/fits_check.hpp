// A look at a FITS file's headers before cfitsio parses them. cfitsio 4.2 (Debian 12) copies the value of
// an unquoted column keyword such as "TTYPE3  = xxxx..." (70 or more characters) into a 70-byte buffer,
// which the fortified C library turns into an abort: a damaged catalog would kill the program instead of
// getting a message. The FITS standard (4.0, §7.3.2 and §4.2.1) makes these values character strings,
// i.e. quoted, so an unquoted one is refused here with the HDU and card that hold it.
#pragma once

#include <filesystem>

namespace siiplan::io {

// Walks the headers of every HDU (cards up to END, then the data size from BITPIX, NAXISn, PCOUNT and
// GCOUNT) and throws InputError naming "<file>: HDU n, card k" for a table keyword (TTYPEn, TFORMn, TUNITn,
// TDISPn, TDIMn) or EXTNAME whose value is not a quoted string. Files that do not start like FITS, and
// headers it cannot follow (no END, impossible sizes), are left to cfitsio, which reports them.
void check_fits_headers(const std::filesystem::path& path);

}  // namespace siiplan::io
