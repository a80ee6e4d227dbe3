// Time scales: UTC instants as two-part Julian Dates (ERFA convention, geometry.md §2).
//
// A UTC instant is a "quasi-JD" as ERFA's eraDtf2d makes it: on a day with a leap second the day
// fraction is stretched over 86401 s, so calendar <-> JD round trips are exact (ERFA dtf2d.c, Notes).
// Functions that call ERFA report its status +1 ("dubious year": the date lies beyond the built-in
// leap-second table, for this liberfa build from 2027 on) through an optional `dubious` flag that they
// set to true, never clear, and never turn into an error; a negative ERFA status (an impossible date)
// is an InputError naming `where`.
#pragma once

#include <string>
#include <string_view>

namespace siiplan::astro {

// Two-part (quasi-)JD in UTC as ERFA's eraDtf2d makes it: jd1 + jd2; keep the day and its fraction apart.
struct JulianDate {
  double jd1 = 0, jd2 = 0;
  double mjd() const { return (jd1 - 2400000.5) + jd2; }
};

// A civil date (Gregorian calendar).
struct CalendarDate {
  int year = 2000, month = 1, day = 1;
};

// UTC instant at MJD (UTC) mjd_utc; jd1 = 2400000.5 + the integer day, jd2 = the fraction.
JulianDate utc_from_mjd(double mjd_utc);

// UTC calendar date and time -> quasi-JD (eraDtf2d "UTC"). second may reach 60.x on a leap-second day.
JulianDate utc_from_calendar(const CalendarDate& date, int hour, int minute, double second,
                             std::string_view where, bool* dubious = nullptr);

// "YYYY-MM-DD" -> CalendarDate, validated through eraCal2jd; InputError naming `where` otherwise.
CalendarDate parse_date(std::string_view text, std::string_view where);

// ISO 8601 UTC instant: "YYYY-MM-DDThh:mm[:ss[.sss]]" with an optional trailing 'Z' (a space may stand
// for the 'T'); a bare "YYYY-MM-DD" means 00:00 UTC. InputError naming `where` when malformed.
JulianDate parse_utc(std::string_view text, std::string_view where, bool* dubious = nullptr);

// ISO 8601 "YYYY-MM-DDThh:mm:ss[.f...]Z" with `decimals` digits of the second (eraD2dtf, correct on
// leap-second days).
std::string format_utc(JulianDate utc, int decimals = 0);
// The calendar date (UTC) of an instant.
CalendarDate utc_date(JulianDate utc);

// `seconds` later (negative: earlier), counted in quasi-JD days of 86400 s (planning resolution;
// across a leap second the result is 1 s off in elapsed time, ERFA's quasi-JD convention).
JulianDate add_seconds(JulianDate utc, double seconds);
// (b - a) in seconds, same convention.
double seconds_between(JulianDate a, JulianDate b);

// UTC -> TT: TAI = UTC + (TAI-UTC) from eraDat's table (eraUtctai), TT = TAI + 32.184 s (eraTaitt).
JulianDate tt_from_utc(JulianDate utc, bool* dubious = nullptr);
// UTC -> UT1 = UTC + dut1_s (eraUtcut1).
JulianDate ut1_from_utc(JulianDate utc, double dut1_s, bool* dubious = nullptr);

// Greenwich apparent sidereal time (IAU 2006/2000A, eraGst06a) at a UTC instant, radians in [0, 2pi).
// References: IERS Conventions (2010) ch. 5; Capitaine, Wallace & Chapront 2005, A&A 432, 355.
double gast_rad(JulianDate utc, double dut1_s, bool* dubious = nullptr);
// Greenwich mean sidereal time (IAU 2006, eraGmst06), radians in [0, 2pi).
double gmst_rad(JulianDate utc, double dut1_s, bool* dubious = nullptr);

}  // namespace siiplan::astro
