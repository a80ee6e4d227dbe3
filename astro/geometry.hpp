// Earth-rotation geometry of a site and its telescope pairs (ERFA-based).
//
// Conventions (geometry.md §0): longitude east positive; azimuth from North through East; hour angle
// positive West; baseline B = r_j - r_i (telescope i to j); (u,v,w) in metres with u East, v North on
// the sky and w towards the source (Thompson, Moran & Swenson 2017, §4.1, eq. 4.1); baseline position
// angle = atan2(u, v) east of north; geometric delay tau = w / c (w > 0: the wavefront reaches j first).
#pragma once

#include <memory>
#include <span>
#include <string>
#include <vector>

#include "astro/site.hpp"
#include "astro/time.hpp"

namespace siiplan::astro {

// Where a body stands at one instant for one site.
//
// ha/dec are the topocentric apparent place without refraction: CIRS (precession, nutation, annual
// aberration, light deflection) rotated by the Earth rotation angle and the site longitude, with
// diurnal aberration (ERFA eraAtioq with refraction constants zero). They differ from ERA + lon - RA_CIRS
// by about 0.1" (diurnal aberration), geometry.md §2.4. This is the direction (u,v,w) needs (§1.4).
struct Apparent {
  double ha_rad = 0;          // apparent (CIRS) hour angle, unrefracted, positive west, in (-pi, pi]
  double dec_rad = 0;         // apparent (CIRS) declination
  double alt_rad = 0;         // geometric altitude (no refraction)
  double alt_refracted_rad = 0;  // with the site's refraction (= alt_rad when pressure is 0)
  double az_rad = 0;          // azimuth, N through E, [0, 2pi)
  double airmass = 0;         // Kasten & Young 1989 from the geometric altitude; +inf below the horizon
  double parallactic_rad = 0; // eraHd2pa: angle from the direction of the pole to the zenith, (-pi, pi]
};

// Azimuth (N through E) and altitude from hour angle, declination and latitude (eraHd2ae; Meeus
// eq. 13.5-13.6 with the azimuth from North instead of South).
struct Horizontal {
  double az_rad = 0, alt_rad = 0;
};
Horizontal horizontal_from_hadec(double ha_rad, double dec_rad, double lat_rad);

// Angular distance between two directions given as (longitude-like, latitude-like) angle pairs: (RA, Dec)
// or (azimuth, altitude). ERFA eraSeps, atan2(|a x b|, a.b), accurate at all separations (Meeus ch. 17
// gives the cosine formula, which loses precision below 1').
double separation_rad(double lon1_rad, double lat1_rad, double lon2_rad, double lat2_rad);

// Relative air mass for a geometric (true, unrefracted) altitude.
// Given:    alt_rad   altitude of the body's centre (radians)
// Returns:  X = 1 / [sin h + 0.50572 (h + 6.07995 deg)^-1.6364] with h in degrees; 0.9997 at the zenith,
//           about 38 at the horizon; +inf for h < 0 (below the horizon).
// References: F. Kasten & A. T. Young 1989, Applied Optics 28, 4735, eq. (3) (formula as given in
//           geometry.md §4.1; the equation number is from memory).
double airmass_kasten_young(double alt_rad);

// Star-independent context for one site and one UTC instant (one eraApco13 call). Cheap per-star
// transforms follow. Immutable after construction.
//
// Notes: 1) ERFA eraApco13 with polar motion zero and refraction off builds the context; per star
//           eraAtciq (ICRS -> CIRS with proper motion to the date) and eraAtioq (CIRS -> observed) follow
//           (geometry.md §2.4 fast path). Refracted altitudes use a second eraAtioq with eraRefco's
//           constants for the site's pressure, temperature and humidity at 0.55 um.
//        2) sun() and moon() follow geometry.md §2.5: eraEpv00 and eraMoon98 (TT), topocentric vector
//           from astrom.eb, light time, aberration with eraAb, GCRS -> CIRS, eraAtioq. moon98 is good to
//           about 3" rms (its documentation).
//        3) Sun and Moon are computed on demand (each call costs an eraEpv00 and eraMoon98).
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
  // Geometric delay tau = w / c (s). Sign: tau > 0 when the wavefront reaches telescope b (the second
  // of the pair) first, by tau; telescope b's signal must then be delayed by tau to line up with a's.
  double delay_s() const;
};

// Local east, north, up (m) of a point given in WGS84 geodetic coordinates, relative to the site's
// reference point (lat_rad, lon_east_rad, height_m of `site`): eraGd2gc for both, then the ECEF -> ENU
// rotation at the reference point (geometry.md §1.1-1.2; NIMA TR8350.2 for WGS84).
struct Enu {
  double east_m = 0, north_m = 0, up_m = 0;
};
Enu enu_from_geodetic(const Site& site, double lat_rad, double lon_east_rad, double height_m);

// Earth-centred, Earth-fixed (ITRS/WGS84) coordinates in metres, as OIFITS's FRAME = 'GEOCENTRIC' wants.
struct Geocentric {
  double x_m = 0, y_m = 0, z_m = 0;
};
// The site's reference point (eraGd2gc, WGS84; geometry.md §1.1).
Geocentric site_geocentric(const Site& site);
// A local east-north-up offset at the site turned into an ECEF offset: the transpose of the ECEF -> ENU
// rotation of geometry.md §1.2 (so enu_from_geodetic of the resulting point gives the offset back).
Geocentric geocentric_offset_from_enu(const Site& site, const Enu& enu);

// Baseline b - a in the TMS equatorial frame (X to H=0,dec=0; Y to H=-6h,dec=0 (East); Z to the pole):
// X = -sin(lat) N + cos(lat) U, Y = E, Z = cos(lat) N + sin(lat) U (geometry.md §1.3; Thompson, Moran &
// Swenson 2017, §4.1).
struct BaselineXyz {
  double x_m = 0, y_m = 0, z_m = 0;
};
BaselineXyz baseline_xyz(const Telescope& a, const Telescope& b, double lat_rad);

// The projection of TMS eq. (4.1) for one source direction: sin and cos of the hour angle and the
// declination, computed once per (source, instant) and applied to any number of baselines (the
// trigonometry is the same for every pair of an array; only the matrix-vector product is per pair).
//
//   | u |   |  sin H          cos H         0     | | X |
//   | v | = | -sin d cos H    sin d sin H   cos d | | Y |     (metres; Thompson, Moran & Swenson 2017,
//   | w |   |  cos d cos H   -cos d sin H   sin d | | Z |      §4.1, eq. 4.1; geometry.md §1.4)
struct UvwProjection {
  double sin_ha = 0, cos_ha = 1, sin_dec = 0, cos_dec = 1;
  UvwProjection() = default;
  UvwProjection(double ha_rad, double dec_rad);
  Uvw operator()(const BaselineXyz& b) const {
    return {sin_ha * b.x_m + cos_ha * b.y_m, -sin_dec * cos_ha * b.x_m + sin_dec * sin_ha * b.y_m + cos_dec * b.z_m,
            cos_dec * cos_ha * b.x_m - cos_dec * sin_ha * b.y_m + sin_dec * b.z_m};
  }
};

// Many baselines in structure-of-arrays form, for projecting a whole array at once.
struct BaselineArrays {
  std::vector<double> x_m, y_m, z_m;
  void push_back(const BaselineXyz& b);
  std::size_t size() const { return x_m.size(); }
};

// u and v (metres) of every baseline of `b` for one source direction: UvwProjection applied to each
// (w is not needed for |V|^2). u_m and v_m must hold b.size() values.
void project_uv(const UvwProjection& projection, const BaselineArrays& b, std::span<double> u_m, std::span<double> v_m);

// TMS eq. (4.1): (u,v,w) of an equatorial baseline for a source at hour angle ha, declination dec
// (UvwProjection(ha, dec) applied to b).
Uvw uvw_from_xyz(const BaselineXyz& b, double ha_rad, double dec_rad);

// (u,v,w) of the baseline from telescope a to telescope b for a source at (ha, dec), site latitude lat
// (TMS eq. 4.1 with the ENU->XYZ rotation of geometry.md §1.3).
Uvw baseline_uvw(const Telescope& a, const Telescope& b, double lat_rad, double ha_rad, double dec_rad);
// Geometric delay rate dtau/dt in s/s: -omega_E u cos(dec) / c, omega_E the Earth rotation rate
// (dH/dt; units.hpp), from dw/dH = -u cos(dec) (TMS §4.1; geometry.md §1.4). Same sign convention as
// Uvw::delay_s.
double delay_rate(const Uvw& uvw, double dec_rad);

}  // namespace siiplan::astro
