// Time scales: UTC instants as two-part Julian Dates (ERFA convention, geometry.md §2).
#pragma once

#include <string>
#include <string_view>

namespace siiplan::astro {

// Two-part (quasi-)JD in UTC as ERFA's eraDtf2d makes it: jd1 + jd2; keep the day and its fraction apart.
struct JulianDate {
  double jd1 = 0, jd2 = 0;
  double mjd() const { return (jd1 - 2400000.5) + jd2; }
};

JulianDate utc_from_mjd(double mjd_utc);

}  // namespace siiplan::astro
