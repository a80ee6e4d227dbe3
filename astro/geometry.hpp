// Earth-rotation geometry of a site and its telescope pairs (ERFA-based).
//
// Conventions (geometry.md §0): longitude east positive; azimuth from North through East; hour angle
// positive West; baseline B = r_j - r_i (telescope i to j); (u,v,w) in metres with u East, v North on
// the sky and w towards the source (Thompson, Moran & Swenson 2017, §4.1, eq. 4.1); baseline position
// angle = atan2(u, v) east of north; geometric delay tau = w / c (w > 0: the wavefront reaches j first).
#pragma once

#include <memory>
#include <string>

#include "astro/site.hpp"
#include "astro/time.hpp"

namespace siiplan::astro {

// Where a body stands at one instant for one site.
struct Apparent {
  double ha_rad = 0;          // apparent (CIRS) hour angle, unrefracted
  double dec_rad = 0;         // apparent (CIRS) declination
  double alt_rad = 0;         // geometric altitude (no refraction)
  double alt_refracted_rad = 0;  // with the site's refraction (= alt_rad when pressure is 0)
  double az_rad = 0;          // azimuth, N through E
  double airmass = 0;         // from the geometric altitude; +inf below the horizon
  double parallactic_rad = 0;
};

// Star-independent context for one site and one UTC instant (one eraApco13 call). Cheap per-star
// transforms follow. Immutable after construction.
class Epoch {
 public:
  Epoch(const Site& site, JulianDate utc);
  JulianDate utc() const;
  bool dubious_year() const;   // ERFA status +1: leap-second table cannot vouch for this date
  Apparent star(const SkyPosition& position) const;
  Apparent sun() const;
  Apparent moon() const;
  double moon_illuminated_fraction() const;   // Meeus eq. 48.1
  double moon_separation_rad(const SkyPosition& position) const;
  double sun_separation_rad(const SkyPosition& position) const;
 private:
  struct Impl;
  std::shared_ptr<const Impl> impl_;
};

struct Uvw {
  double u_m = 0, v_m = 0, w_m = 0;
  double projected_m() const;    // sqrt(u^2 + v^2)
  double pa_rad() const;         // atan2(u, v), east of north
};

// (u,v,w) of the baseline from telescope a to telescope b for a source at (ha, dec), site latitude lat
// (TMS eq. 4.1 with the ENU->XYZ rotation of geometry.md §1.3).
Uvw baseline_uvw(const Telescope& a, const Telescope& b, double lat_rad, double ha_rad, double dec_rad);
// Geometric delay rate dtau/dt in s/s: -omega_E u cos(dec) / c (geometry.md §1.4).
double delay_rate(const Uvw& uvw, double dec_rad);

}  // namespace siiplan::astro
