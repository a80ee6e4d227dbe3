#include <doctest/doctest.h>

#include "astro/errors.hpp"
#include "io/csv.hpp"
#include "io/table.hpp"

#include <sstream>

using siiplan::InputError;
using siiplan::io::parse_csv;

TEST_SUITE("io/csv") {
  TEST_CASE("header, comments, CRLF, BOM and quotes") {
    auto t = parse_csv("\xEF\xBB\xBF# comment\r\nname, ra ,dec\r\n\r\n\"a, b\",10.5, -3\r\nc,1,2", "x.csv");
    REQUIRE(t.rows().size() == 2);
    CHECK(t.header_line() == 2);
    CHECK(t.rows()[0].line == 4);
    CHECK(t.text(t.rows()[0], 0) == "a, b");
    CHECK(t.number(t.rows()[0], *t.find("RA")) == 10.5);
    CHECK(t.number(t.rows()[1], *t.find("dec")) == 2);
  }
  TEST_CASE("errors name file and line") {
    CHECK_THROWS_WITH_AS(parse_csv("", "e.csv"), "e.csv: the file is empty (no header row) (the first line must name the columns)", InputError);
    auto t = parse_csv("a,b\n1,x\n", "f.csv");
    CHECK_THROWS_WITH_AS(t.number(t.rows()[0], 1), doctest::Contains("f.csv:2: column 'b': 'x' is not a finite number"), InputError);
    CHECK_THROWS_WITH_AS(parse_csv("a\n1,2\n", "g.csv"), doctest::Contains("g.csv:2: the record has 2 fields"), InputError);
    CHECK_THROWS_WITH_AS(parse_csv("a\n\xff\n", "h.csv"), doctest::Contains("h.csv:2: byte 1"), InputError);
    CHECK_THROWS_AS(t.require("c", "add it"), InputError);
  }
  TEST_CASE("numbers reject NaN, Inf and trailing junk") {
    using siiplan::io::parse_number;
    CHECK(parse_number(" 1e3 ").value() == 1000);
    CHECK(parse_number("+2").value() == 2);
    CHECK_FALSE(parse_number("nan"));
    CHECK_FALSE(parse_number("inf"));
    CHECK_FALSE(parse_number("1.5x"));
    CHECK_FALSE(parse_number(""));
  }
  TEST_CASE("table output in both forms") {
    siiplan::io::Table t;
    t.add_column("pair");
    t.add_column("baseline_m", 4);
    t.add_row({std::string("T1-T2"), 123.456789012345});
    std::ostringstream csv, table;
    t.write(csv, siiplan::io::Format::Csv);
    t.write(table, siiplan::io::Format::Table);
    CHECK(csv.str() == "pair,baseline_m\nT1-T2,123.456789012345\n");
    CHECK(table.str().find("123.5") != std::string::npos);
  }
}
