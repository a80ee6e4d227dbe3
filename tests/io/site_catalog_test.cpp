// Tests of the site INI, array CSV and catalog readers (io/site_io, io/catalog).
#include <doctest/doctest.h>

#include <cmath>

#include "astro/errors.hpp"
#include "astro/units.hpp"
#include "io/catalog.hpp"
#include "io/site_io.hpp"
#include "support/close.hpp"

using siiplan::InputError;
using namespace siiplan::io;
using siiplan::astro::kDegToRad;
using siiplan::test::check_close;

namespace {
const char* const kSite =
    "[site]\nname = Test\nlatitude_deg = -30\nlongitude_deg = -70\nheight_m = 2000\nmin_altitude_deg = 25\n"
    "extinction_v = 0.13\ncolour = blue\n[constraints]\nmax_airmass = 2\n";
}

TEST_SUITE("io/site_catalog") {
  TEST_CASE("site: values, defaults, unknown keys warned, [constraints] left alone") {
    std::vector<std::string> warnings;
    auto s = parse_site(kSite, "s.ini", &warnings);
    CHECK(s.name == "Test");
    check_close(s.lat_rad, -30 * kDegToRad, 0, 1e-15, "lat");
    check_close(s.min_altitude_rad, 25 * kDegToRad, 0, 1e-15, "min alt");
    check_close(s.extinction_mag_per_airmass[2], 0.13, 0, 1e-15, "k_V");
    CHECK(s.pressure_hpa == 0);
    REQUIRE(warnings.size() == 1);
    CHECK(warnings[0] == "s.ini:8: unknown key 'colour' in [site] is ignored");
  }
  TEST_CASE("site: errors name file and line") {
    CHECK_THROWS_WITH_AS(parse_site("[site]\nname = X\nlatitude_deg = 95\nlongitude_deg = 0\nheight_m = 0\n", "b.ini"),
                         doctest::Contains("b.ini:3: latitude_deg = 95 must lie within -90 .. 90"), InputError);
    CHECK_THROWS_WITH_AS(parse_site("[site]\nname = X\nlatitude_deg = 10\nheight_m = 0\n", "c.ini"),
                         doctest::Contains("c.ini: missing key 'longitude_deg' in [site]"), InputError);
    CHECK_THROWS_WITH_AS(parse_site("[site]\nname = X\nlatitude_deg = ten\n", "d.ini"),
                         doctest::Contains("d.ini:3:"), InputError);
    CHECK_THROWS_AS(parse_site("[other]\nx = 1\n", "e.ini"), InputError);
  }
  TEST_CASE("array: ENU and WGS84 rows; geometry.md §1.5 conversion") {
    auto site = parse_site(kSite, "s.ini");
    auto a = parse_array("# c\nname,east_m,north_m,up_m,diameter_m\nA,0,0,0,12\nB,10,5,0.1,12\n", "a.csv", site);
    REQUIRE(a.size() == 2);
    check_close(a[0].area_m2, siiplan::astro::kPi * 36, 1e-15, 0, "default area");
    CHECK(std::isnan(a[0].min_altitude_rad));
    // geometry.md §1.5 [computed]: B at (-29.990, -69.985, 2005 m) from (-30, -70, 2000 m): E 1447.8939 m,
    // N 1108.7788 m, U 4.7391 m.
    auto g = parse_array("name,latitude_deg,longitude_deg,height_m,diameter_m\nB,-29.990,-69.985,2005,1\n", "g.csv", site);
    check_close(g[0].east_m, 1447.8939, 0, 1e-4, "E");
    check_close(g[0].north_m, 1108.7788, 0, 1e-4, "N");
    check_close(g[0].up_m, 4.7391, 0, 1e-4, "U");
  }
  TEST_CASE("array: errors name file and line") {
    auto site = parse_site(kSite, "s.ini");
    const std::string head = "name,east_m,north_m,up_m,diameter_m\n";
    CHECK_THROWS_WITH_AS(parse_array(head + "A,0,0,0,1\nA,5,0,0,1\n", "d.csv", site),
                         doctest::Contains("d.csv:3: telescope name 'A' is used twice"), InputError);
    CHECK_THROWS_WITH_AS(parse_array(head + "A,0,0,0,1\nB,0.005,0,0,1\n", "c.csv", site),
                         doctest::Contains("c.csv:3: telescope 'B' is less than 1 cm from 'A'"), InputError);
    CHECK_THROWS_WITH_AS(parse_array(head + "A,zero,0,0,1\n", "n.csv", site),
                         doctest::Contains("n.csv:2: column 'east_m'"), InputError);
    CHECK_THROWS_WITH_AS(parse_array(head + "A,0,0,0,-1\n", "m.csv", site), doctest::Contains("m.csv:2: diameter_m"),
                         InputError);
    CHECK_THROWS_AS(parse_array("name,diameter_m\nA,1\n", "p.csv", site), InputError);
    CHECK_THROWS_AS(parse_array(head, "e.csv", site), InputError);
  }
  TEST_CASE("angles: sexagesimal and degrees") {
    // 05:35:17.3 h = 83.82208333 deg; -05:23:28 = -5.39111 deg.
    check_close(parse_ra_rad("05:35:17.3", "t"), (5 + 35 / 60.0 + 17.3 / 3600) * 15 * kDegToRad, 0, 1e-14, "RA hms");
    check_close(parse_ra_rad("05 35 17.3", "t"), parse_ra_rad("05:35:17.3", "t"), 0, 1e-15, "RA spaces");
    check_close(parse_ra_rad("83.5", "t"), 83.5 * kDegToRad, 0, 1e-15, "RA deg");
    check_close(parse_dec_rad("-05:23:28", "t"), -(5 + 23 / 60.0 + 28 / 3600.0) * kDegToRad, 0, 1e-14, "Dec dms");
    check_close(parse_dec_rad("-00:30:00", "t"), -0.5 * kDegToRad, 0, 1e-15, "Dec negative zero degrees");
    check_close(parse_dec_rad("+90", "t"), siiplan::astro::kPi / 2, 0, 1e-15, "Dec pole");
    CHECK_THROWS_AS(parse_ra_rad("24:00:00", "t"), InputError);
    CHECK_THROWS_AS(parse_ra_rad("360", "t"), InputError);
    CHECK_THROWS_AS(parse_ra_rad("5h35m", "t"), InputError);
    CHECK_THROWS_AS(parse_dec_rad("91", "t"), InputError);
    CHECK_THROWS_AS(parse_dec_rad("-90:00:01", "t"), InputError);
    CHECK_THROWS_AS(parse_dec_rad("10:61:00", "t"), InputError);
    CHECK(format_ra(parse_ra_rad("05:35:17.3", "t")) == "05h35m17.30s");
    CHECK(format_dec(parse_dec_rad("-05:23:28", "t")) == "-05d23m28.0s");
  }
  TEST_CASE("catalog: columns, defaults, extra columns, missing diameter") {
    auto c = parse_catalog(
        "name,ra,dec,pmra_mas_per_yr,mag_v,diameter_mas,sptype,goal_pct\n"
        "Alpha,05:35:17.3,-05:23:28,10,1.5,2.0,B8,3\nBeta,120,45,,,,K0,\n",
        "cat.csv");
    REQUIRE(c.size() == 2);
    check_close(c[0].position.pmra_cosdec_rad_per_yr, 10 * siiplan::astro::kMasToRad, 1e-15, 0, "pm");
    check_close(c[0].model.diameter_rad(), 2.0 * siiplan::astro::kMasToRad, 1e-15, 0, "diameter");
    CHECK_FALSE(c[0].diameter_estimated);
    check_close(c[0].goal_fraction, 0.03, 1e-15, 0, "goal");
    REQUIRE(c[0].extra.size() == 1);
    CHECK(c[0].extra[0].first == "sptype");
    CHECK(c[0].extra[0].second == "B8");
    CHECK(c[1].diameter_estimated);
    CHECK(c[1].diameter_note == kNoDiameterNote);
    check_close(c[1].goal_fraction, 0.05, 1e-15, 0, "default goal");
    CHECK(std::isnan(c[1].mag[2]));
  }
  TEST_CASE("catalog: errors name file and line") {
    CHECK_THROWS_WITH_AS(parse_catalog("name,ra,dec\nA,10,95\n", "x.csv"), doctest::Contains("x.csv:2: column 'dec'"),
                         InputError);
    CHECK_THROWS_WITH_AS(parse_catalog("name,ra,dec\nA,400,5\n", "x.csv"), doctest::Contains("x.csv:2: column 'ra'"),
                         InputError);
    CHECK_THROWS_WITH_AS(parse_catalog("name,ra,dec\nA,10,5\nA,11,5\n", "x.csv"),
                         doctest::Contains("x.csv:3: target name 'A' is used twice"), InputError);
    CHECK_THROWS_WITH_AS(parse_catalog("name,ra\nA,10\n", "x.csv"), doctest::Contains("x.csv:1: missing column 'dec'"),
                         InputError);
    CHECK_THROWS_WITH_AS(parse_catalog("name,ra,dec,model\nA,10,5,blob\n", "x.csv"),
                         doctest::Contains("x.csv:2: unknown model 'blob'"), InputError);
    CHECK_THROWS_AS(parse_catalog("", "x.csv"), InputError);
    CHECK_THROWS_AS(parse_catalog("name,ra,dec\n", "x.csv"), InputError);
  }
}
