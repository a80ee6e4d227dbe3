// One night at one site: when the Sun and Moon cross the usual altitudes, and a general crossing finder.
//
// "The night of YYYY-MM-DD" is the night that begins on the local evening of that date: the window from
// local mean noon of that date to local mean noon of the next day, local mean time being UTC + longitude
// / 15 deg per hour (so daylight-saving rules and time-zone borders do not move the window).
//
// Altitude thresholds (geometry.md §3.2; USNO "Rise, Set, and Twilight Definitions"; Astronomical
// Almanac glossary), all on the geometric (unrefracted) altitude of the body's centre:
//   sunset/sunrise -0 deg 50' (34' standard refraction + 16' semidiameter), civil -6, nautical -12,
//   astronomical -18 deg; dark time = Sun below -18 deg.
//   Moonrise/moonset: topocentric centre at -0 deg 50' (34' refraction + a mean semidiameter of 15.5';
//   the real semidiameter varies 14.7'-16.8', which moves the times by well under a minute at mid
//   latitudes).
#pragma once

#include <functional>
#include <optional>
#include <vector>

#include "astro/geometry.hpp"
#include "astro/site.hpp"
#include "astro/time.hpp"

namespace siiplan::astro {

inline constexpr double kSunriseAltitude_rad = -(50.0 / 60.0) * (3.14159265358979323846 / 180.0);
inline constexpr double kMoonriseAltitude_rad = kSunriseAltitude_rad;
inline constexpr double kCivilTwilight_rad = -6.0 * (3.14159265358979323846 / 180.0);
inline constexpr double kNauticalTwilight_rad = -12.0 * (3.14159265358979323846 / 180.0);
inline constexpr double kAstronomicalTwilight_rad = -18.0 * (3.14159265358979323846 / 180.0);

// The local-noon-to-next-local-noon window of the night of `date` at `site` (see above).
struct NightWindow {
  JulianDate start_utc, end_utc;
};
NightWindow night_window(const Site& site, const CalendarDate& date);

// An instant where a body's altitude crosses a threshold, upward (rising) or downward (setting).
struct Crossing {
  JulianDate utc;
  bool rising = false;
};

// Numerical accuracy knobs of the crossing finder.
struct CrossingSearch {
  double step_s = 600;       // sampling step; crossings closer together than this may be missed
  double tolerance_s = 0.5;  // bisection stops when the bracket is shorter than this
};

// Every crossing of altitude_rad(t) = threshold_rad in [start, end], in time order: the altitude is
// sampled every search.step_s, each sign change is refined by bisection to search.tolerance_s.
std::vector<Crossing> find_crossings(const std::function<double(JulianDate)>& altitude_rad, JulianDate start_utc,
                                     JulianDate end_utc, double threshold_rad, const CrossingSearch& search = {});

// The part of a window in which a body is below (or above) a threshold, for one threshold.
struct Interval {
  enum class Kind {
    None,      // never: e.g. no dark time at all (midnight sun, or twilight all night)
    Whole,     // the whole window (polar night for "Sun below", circumpolar star for "above")
    Part,      // from `begin` to `end` (either may be the window's own edge, see begin_is_edge/end_is_edge)
  } kind = Kind::None;
  JulianDate begin, end;
  bool begin_is_edge = false, end_is_edge = false;
};

// The longest stretch of [start, end] with altitude below (below = true) or above the threshold,
// from find_crossings. A window with several separate stretches (rare: a Moon that sets and rises again)
// gives the longest.
Interval interval_of(const std::function<double(JulianDate)>& altitude_rad, JulianDate start_utc,
                     JulianDate end_utc, double threshold_rad, bool below, const CrossingSearch& search = {});

// The night at a glance.
struct NightSummary {
  NightWindow window;
  Interval sun_down;             // Sun below -0 deg 50': sunset (begin) to sunrise (end)
  Interval civil, nautical, astronomical;   // Sun below -6/-12/-18 deg; astronomical = the dark window
  std::vector<Crossing> moon;    // moonrises (rising) and moonsets in the window
  double moon_illuminated_fraction = 0;  // at the middle of the Sun-down interval (or of the window)
  JulianDate middle_utc;         // that instant
  double sun_min_alt_rad = 0, sun_max_alt_rad = 0;   // extremes over the window (samples)
  bool dubious_year = false;     // ERFA status +1 anywhere in the computation
};
NightSummary night_summary(const Site& site, const CalendarDate& date, const CrossingSearch& search = {});
// The same for any window (e.g. an explicit --start/--end span).
NightSummary night_summary(const Site& site, const NightWindow& window, const CrossingSearch& search = {});

}  // namespace siiplan::astro
