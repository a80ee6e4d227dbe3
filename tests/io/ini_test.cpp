#include <doctest/doctest.h>

#include <string>

#include "astro/errors.hpp"
#include "io/ini.hpp"

using siiplan::InputError;
using siiplan::io::IniFile;

TEST_SUITE("io/ini") {
  TEST_CASE("sections, comments, CRLF, byte-order mark and line numbers") {
    auto ini = IniFile::parse("\xEF\xBB\xBF# site\r\n[site]\r\nname = Cerro-#2 ; the second\r\nlatitude_deg=-24.5  # south\r\n"
                              "\r\n; note\r\n[array]\r\nurl = http://x/a#b\r\n",
                              "s.ini");
    CHECK(ini.has_section("site"));
    CHECK(ini.has_section("array"));
    CHECK(*ini.text("site.name") == "Cerro-#2");
    CHECK(ini.number("site.latitude_deg", "") == -24.5);
    CHECK(ini.where("site.latitude_deg") == "s.ini:4");
    CHECK(*ini.text("array.url") == "http://x/a#b");   // '#' inside a word is text
    CHECK(ini.number_or("site.height_m", 7.0) == 7.0);
    CHECK(ini.unknown_keys("site", {"name"}) == std::vector<std::string>{"site.latitude_deg"});
  }

  TEST_CASE("malformed lines name the line") {
    auto message = [](const std::string& text) {
      try {
        (void)IniFile::parse(text, "b.ini");
      } catch (const InputError& e) {
        return std::string(e.what());
      }
      return std::string("no error");
    };
    CHECK(message("[site\nx = 1\n").find("b.ini:1: section header '[site' is not closed") != std::string::npos);
    CHECK(message("[site]\njust words\n").find("b.ini:2: line 'just words' is not 'key = value'") != std::string::npos);
    CHECK(message("[site]\n = 3\n").find("b.ini:2: line '= 3' has no key") != std::string::npos);
    CHECK(message("[a]\nx=1\nx = 2\n").find("b.ini:3: key 'a.x' is given twice") != std::string::npos);
    CHECK(message("[a]\nx=\xFF\n").find("b.ini:2: byte 3 of the line is not valid UTF-8") != std::string::npos);
    CHECK(message(" \n\t\n# only a comment\n").find("b.ini: the file is empty") != std::string::npos);
    CHECK_THROWS_AS((void)IniFile::parse("[a]\nx = abc\n", "c.ini").number("a.x", "hint"), InputError);
  }

  TEST_CASE("percent signs are plain text (fuzz regression: a former parser looped forever on them)") {
    auto ini = IniFile::parse("s%%%%%%&%%%%%%%invalid_line%1%%#ss=s\n[x]\ny = %canonical_option%\n", "p.ini");
    CHECK(*ini.text("s%%%%%%&%%%%%%%invalid_line%1%%#ss") == "s");
    CHECK(*ini.text("x.y") == "%canonical_option%");
  }
}
