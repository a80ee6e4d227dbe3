#include "io/fits_check.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>

#include "astro/errors.hpp"

namespace fs = std::filesystem;

namespace {

std::string read_bytes(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

std::string message_of(const fs::path& path) {
  try {
    siiplan::io::check_fits_headers(path);
  } catch (const siiplan::InputError& e) {
    return e.what();
  }
  return "(no error)";
}

}  // namespace

TEST_SUITE("io/fits_check") {
  TEST_CASE("the walk reaches the last HDU of an OIFITS file and names the card") {
    // tests/data/astropy_v2.oifits has six HDUs; astropy 5.2.1 (HDUList.fileinfo) puts the header of the
    // sixth, OI_T3, at byte 31680 and its last TTYPE card ("TTYPE2  = 'T3PHI   '") at byte 32480,
    // i.e. card 11 of that header. Reaching it needs every earlier HDU's data size from its header.
    const fs::path good = fs::path(SIIPLAN_TEST_DATA_DIR) / "astropy_v2.oifits";
    CHECK(message_of(good) == "(no error)");
    std::string bytes = read_bytes(good);
    REQUIRE(bytes.compare(32480, 20, "TTYPE2  = 'T3PHI   '") == 0);
    bytes.replace(32480, 80, "TTYPE2  = " + std::string(70, 'x'));
    const fs::path bad = fs::temp_directory_path() / "siiplan_unquoted_ttype.oifits";
    std::ofstream(bad, std::ios::binary) << bytes;
    CHECK(message_of(bad).find(bad.string() + ": HDU 6, header card 11: the value of TTYPE2 is not a quoted character string") == 0);
    fs::remove(bad);
  }

  TEST_CASE("files that are not FITS, or end inside a header, are left to cfitsio") {
    const fs::path data = SIIPLAN_TEST_DATA_DIR;
    CHECK(message_of(data / "not_fits.fits") == "(no error)");
    const fs::path cut = fs::temp_directory_path() / "siiplan_cut_header.fits";
    std::ofstream(cut, std::ios::binary) << read_bytes(data / "astropy_v2.oifits").substr(0, 2880 + 400);
    CHECK(message_of(cut) == "(no error)");
    fs::remove(cut);
  }
}
