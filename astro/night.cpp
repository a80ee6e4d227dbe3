#include "astro/night.hpp"

#include <algorithm>
#include <cmath>

#include "astro/units.hpp"

namespace siiplan::astro {

NightWindow night_window(const Site& site, const CalendarDate& date) {
  JulianDate midnight = utc_from_calendar(date, 0, 0, 0.0, "night date");
  // Local mean noon = 12 h UTC - east longitude / (15 deg per hour).
  double lon = std::remainder(site.lon_east_rad, kTwoPi);
  JulianDate start = add_seconds(midnight, 12 * 3600.0 - lon / kTwoPi * kSecondsPerDay);
  return {start, add_seconds(start, kSecondsPerDay)};
}

std::vector<Crossing> find_crossings(const std::function<double(JulianDate)>& altitude_rad, JulianDate start_utc,
                                     JulianDate end_utc, double threshold_rad, const CrossingSearch& search) {
  std::vector<Crossing> out;
  double span_s = seconds_between(start_utc, end_utc);
  if (!(span_s > 0)) return out;
  int n = std::max(1, int(std::ceil(span_s / search.step_s)));
  double dt = span_s / n;
  JulianDate t0 = start_utc;
  double f0 = altitude_rad(t0) - threshold_rad;
  for (int k = 1; k <= n; ++k) {
    JulianDate t1 = k == n ? end_utc : add_seconds(start_utc, k * dt);
    double f1 = altitude_rad(t1) - threshold_rad;
    if ((f0 < 0) != (f1 < 0)) {
      // Bisection on the bracket [a, b] with the sign change.
      JulianDate a = t0, b = t1;
      double fa = f0;
      while (seconds_between(a, b) > search.tolerance_s) {
        JulianDate m = add_seconds(a, 0.5 * seconds_between(a, b));
        double fm = altitude_rad(m) - threshold_rad;
        if ((fm < 0) == (fa < 0)) {
          a = m;
          fa = fm;
        } else {
          b = m;
        }
      }
      out.push_back({add_seconds(a, 0.5 * seconds_between(a, b)), f1 >= 0});
    }
    t0 = t1;
    f0 = f1;
  }
  return out;
}

Interval interval_of(const std::function<double(JulianDate)>& altitude_rad, JulianDate start_utc,
                     JulianDate end_utc, double threshold_rad, bool below, const CrossingSearch& search) {
  auto crossings = find_crossings(altitude_rad, start_utc, end_utc, threshold_rad, search);
  bool state = (altitude_rad(start_utc) < threshold_rad) == below;   // wanted state at the start?
  Interval best;
  if (crossings.empty()) {
    best.kind = state ? Interval::Kind::Whole : Interval::Kind::None;
    if (state) {
      best.begin = start_utc;
      best.end = end_utc;
      best.begin_is_edge = best.end_is_edge = true;
    }
    return best;
  }
  // Boundaries: start, crossings..., end; the wanted state alternates between them.
  std::vector<JulianDate> edges{start_utc};
  for (auto& c : crossings) edges.push_back(c.utc);
  edges.push_back(end_utc);
  double longest = -1;
  for (std::size_t k = 0; k + 1 < edges.size(); ++k, state = !state) {
    if (!state) continue;
    double len = seconds_between(edges[k], edges[k + 1]);
    if (len > longest) {
      longest = len;
      best.kind = Interval::Kind::Part;
      best.begin = edges[k];
      best.end = edges[k + 1];
      best.begin_is_edge = k == 0;
      best.end_is_edge = k + 2 == edges.size();
    }
  }
  return best;
}

NightSummary night_summary(const Site& site, const CalendarDate& date, const CrossingSearch& search) {
  return night_summary(site, night_window(site, date), search);
}

NightSummary night_summary(const Site& site, const NightWindow& window, const CrossingSearch& search) {
  NightSummary s;
  s.window = window;
  bool dubious = false;
  auto sun_alt = [&](JulianDate t) {
    Epoch e(site, t);
    dubious = dubious || e.dubious_year();
    return e.sun().alt_rad;
  };
  auto moon_alt = [&](JulianDate t) {
    Epoch e(site, t);
    dubious = dubious || e.dubious_year();
    return e.moon().alt_rad;
  };
  const JulianDate a = s.window.start_utc, b = s.window.end_utc;
  s.sun_down = interval_of(sun_alt, a, b, kSunriseAltitude_rad, true, search);
  s.civil = interval_of(sun_alt, a, b, kCivilTwilight_rad, true, search);
  s.nautical = interval_of(sun_alt, a, b, kNauticalTwilight_rad, true, search);
  s.astronomical = interval_of(sun_alt, a, b, kAstronomicalTwilight_rad, true, search);
  s.moon = find_crossings(moon_alt, a, b, kMoonriseAltitude_rad, search);
  // Extremes of the Sun's altitude, sampled (for "how far below/above" messages in polar cases).
  s.sun_min_alt_rad = 10;
  s.sun_max_alt_rad = -10;
  double span = seconds_between(a, b);
  for (int k = 0; k <= 96; ++k) {
    double h = sun_alt(add_seconds(a, span * k / 96.0));
    s.sun_min_alt_rad = std::min(s.sun_min_alt_rad, h);
    s.sun_max_alt_rad = std::max(s.sun_max_alt_rad, h);
  }
  s.middle_utc = s.sun_down.kind == Interval::Kind::Part
                     ? add_seconds(s.sun_down.begin, 0.5 * seconds_between(s.sun_down.begin, s.sun_down.end))
                     : add_seconds(a, 0.5 * span);
  Epoch mid(site, s.middle_utc);
  s.moon_illuminated_fraction = mid.moon_illuminated_fraction();
  s.dubious_year = dubious || mid.dubious_year();
  return s;
}

}  // namespace siiplan::astro
