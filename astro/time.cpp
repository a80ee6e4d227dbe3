#include "astro/time.hpp"

#include <erfa.h>

#include <cmath>
#include <cstdio>
#include <string>

#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

// ERFA status: negative = error (InputError), +1 = dubious year (flag), other positive values are
// function-specific and handled by the caller.
void note_status(int status, bool* dubious) {
  if (status == 1 || status == 3) {
    if (dubious) *dubious = true;
  }
}

bool parse_int(std::string_view s, int& out) {
  if (s.empty()) return false;
  int v = 0;
  for (char c : s) {
    if (c < '0' || c > '9') return false;
    v = v * 10 + (c - '0');
  }
  out = v;
  return true;
}

std::string quoted(std::string_view s) { return "'" + std::string(s) + "'"; }

// UTC, and ERFA's table of TAI-UTC (eraDat), begin in 1960; eraDat flags earlier dates as "dubious"
// and gives TAI-UTC = 0 for them, which is not a leap-second question but a date outside ERFA's range.
constexpr int kFirstUtcYear = 1960;
void require_utc_year(int year, std::string_view where, const std::string& shown) {
  if (year < kFirstUtcYear)
    throw InputError(std::string(where), shown + " lies before 1960, where UTC and ERFA's leap-second table begin",
                     "give a date from 1960 on");
}

}  // namespace

JulianDate utc_from_mjd(double mjd_utc) {
  double day = std::floor(mjd_utc);
  return {kMjdZero_jd + day, mjd_utc - day};
}

JulianDate utc_from_calendar(const CalendarDate& date, int hour, int minute, double second,
                             std::string_view where, bool* dubious) {
  JulianDate t;
  int status = eraDtf2d("UTC", date.year, date.month, date.day, hour, minute, second, &t.jd1, &t.jd2);
  if (status < 0 || status == 2 || status == 3) {
    // -1..-6: bad year/month/day/hour/minute/second; +2: second >= 60 on a day without a leap second.
    char buf[96];
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02d %02d:%02d:%06.3f", date.year, date.month, date.day, hour, minute,
                  second);
    const char* what = status == -1 ? "the year is out of range"
                       : status == -2 ? "the month is not 1..12"
                       : status == -3 ? "the day does not exist in that month"
                       : status == -4 ? "the hour is not 0..23"
                       : status == -5 ? "the minute is not 0..59"
                                      : "the second is out of range";
    throw InputError(std::string(where), std::string(buf) + ": " + what,
                     "write a valid UTC date and time such as 2026-03-14T21:30:00");
  }
  require_utc_year(date.year, where, "the date " + std::to_string(date.year) + "-" + std::to_string(date.month) + "-" +
                                         std::to_string(date.day));
  note_status(status, dubious);
  return t;
}

CalendarDate parse_date(std::string_view text, std::string_view where) {
  const std::string hint = "write the date as YYYY-MM-DD, e.g. 2026-03-14";
  CalendarDate d;
  if (text.size() != 10 || text[4] != '-' || text[7] != '-' || !parse_int(text.substr(0, 4), d.year) ||
      !parse_int(text.substr(5, 2), d.month) || !parse_int(text.substr(8, 2), d.day))
    throw InputError(std::string(where), quoted(text) + " is not a date", hint);
  double djm0, djm;
  if (eraCal2jd(d.year, d.month, d.day, &djm0, &djm) != 0)
    throw InputError(std::string(where), quoted(text) + " is not a valid calendar date", hint);
  require_utc_year(d.year, where, quoted(text));
  return d;
}

JulianDate parse_utc(std::string_view text, std::string_view where, bool* dubious) {
  const std::string hint = "write an ISO 8601 UTC time such as 2026-03-14T21:30:00 (or ...Z)";
  std::string_view s = text;
  while (!s.empty() && s.front() == ' ') s.remove_prefix(1);
  while (!s.empty() && s.back() == ' ') s.remove_suffix(1);
  if (!s.empty() && (s.back() == 'Z' || s.back() == 'z')) s.remove_suffix(1);
  if (s.size() < 10) throw InputError(std::string(where), quoted(text) + " is not an ISO 8601 time", hint);
  CalendarDate date = parse_date(s.substr(0, 10), where);
  int hour = 0, minute = 0;
  double second = 0;
  if (s.size() > 10) {
    std::string_view t = s.substr(11);
    bool ok = (s[10] == 'T' || s[10] == 't' || s[10] == ' ') && t.size() >= 5 && t[2] == ':' &&
              parse_int(t.substr(0, 2), hour) && parse_int(t.substr(3, 2), minute);
    if (ok && t.size() > 5) {
      std::string_view sec = t.substr(6);
      // Seconds with an optional fraction: digits, then '.' and digits.
      ok = t[5] == ':' && sec.size() >= 2;
      if (ok) {
        int whole = 0;
        ok = parse_int(sec.substr(0, 2), whole);
        double frac = 0, scale = 0.1;
        if (ok && sec.size() > 2) {
          ok = sec[2] == '.' && sec.size() > 3;
          for (std::size_t i = 3; ok && i < sec.size(); ++i) {
            ok = sec[i] >= '0' && sec[i] <= '9';
            frac += (sec[i] - '0') * scale;
            scale /= 10;
          }
        }
        second = whole + frac;
      }
    }
    if (!ok) throw InputError(std::string(where), quoted(text) + " is not an ISO 8601 time", hint);
  }
  return utc_from_calendar(date, hour, minute, second, where, dubious);
}

std::string format_utc(JulianDate utc, int decimals) {
  int iy, im, id, ihmsf[4];
  if (eraD2dtf("UTC", decimals, utc.jd1, utc.jd2, &iy, &im, &id, ihmsf) < 0) return "invalid-date";
  char buf[64];
  if (decimals > 0)
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02dT%02d:%02d:%02d.%0*dZ", iy, im, id, ihmsf[0], ihmsf[1], ihmsf[2],
                  decimals, ihmsf[3]);
  else
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02dT%02d:%02d:%02dZ", iy, im, id, ihmsf[0], ihmsf[1], ihmsf[2]);
  return buf;
}

CalendarDate utc_date(JulianDate utc) {
  int iy, im, id, ihmsf[4];
  eraD2dtf("UTC", 0, utc.jd1, utc.jd2, &iy, &im, &id, ihmsf);
  return {iy, im, id};
}

JulianDate add_seconds(JulianDate utc, double seconds) {
  JulianDate out{utc.jd1, utc.jd2 + seconds / kSecondsPerDay};
  // Keep jd2 a fraction of a day so the two-part precision stays.
  double shift = std::floor(out.jd2);
  out.jd1 += shift;
  out.jd2 -= shift;
  return out;
}

double seconds_between(JulianDate a, JulianDate b) {
  return ((b.jd1 - a.jd1) + (b.jd2 - a.jd2)) * kSecondsPerDay;
}

JulianDate tt_from_utc(JulianDate utc, bool* dubious) {
  JulianDate tai, tt;
  int status = eraUtctai(utc.jd1, utc.jd2, &tai.jd1, &tai.jd2);
  if (status < 0) throw InputError("UTC " + format_utc(utc), "the date is outside ERFA's range", "use a date after 1960");
  note_status(status, dubious);
  eraTaitt(tai.jd1, tai.jd2, &tt.jd1, &tt.jd2);
  return tt;
}

JulianDate ut1_from_utc(JulianDate utc, double dut1_s, bool* dubious) {
  JulianDate ut1;
  int status = eraUtcut1(utc.jd1, utc.jd2, dut1_s, &ut1.jd1, &ut1.jd2);
  if (status < 0) throw InputError("UTC " + format_utc(utc), "the date is outside ERFA's range", "use a date after 1960");
  note_status(status, dubious);
  return ut1;
}

double gast_rad(JulianDate utc, double dut1_s, bool* dubious) {
  JulianDate ut1 = ut1_from_utc(utc, dut1_s, dubious);
  JulianDate tt = tt_from_utc(utc, dubious);
  return eraGst06a(ut1.jd1, ut1.jd2, tt.jd1, tt.jd2);
}

double gmst_rad(JulianDate utc, double dut1_s, bool* dubious) {
  JulianDate ut1 = ut1_from_utc(utc, dut1_s, dubious);
  JulianDate tt = tt_from_utc(utc, dubious);
  return eraGmst06(ut1.jd1, ut1.jd2, tt.jd1, tt.jd2);
}

}  // namespace siiplan::astro
