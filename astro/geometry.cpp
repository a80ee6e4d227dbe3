#include "astro/geometry.hpp"

#include <erfa.h>
#include <erfam.h>

#include <cmath>
#include <limits>

#include "astro/errors.hpp"
#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

constexpr double kRefractionWavelength_um = 0.55;  // V band, for the refraction constants

// Unit vector of a body seen from the observer, GCRS -> CIRS (ri, di), geometry.md §2.5 steps 4-6.
// bary_p, bary_v: the body's barycentric position (au) and velocity (au/day).
void body_cirs(const eraASTROM& astrom, const double bary_p[3], const double bary_v[3], double* ri, double* di) {
  double p[3], dist, u[3];
  eraPmp(const_cast<double*>(bary_p), const_cast<double*>(astrom.eb), p);
  // Light time: the body where it was when the light left it (first-order in tau).
  double tau_day = eraPm(p) * ERFA_AULT / ERFA_DAYSEC;
  for (int k = 0; k < 3; ++k) p[k] = bary_p[k] - tau_day * bary_v[k] - astrom.eb[k];
  eraPn(p, &dist, u);
  double ppr[3], pci[3];
  eraAb(u, const_cast<double*>(astrom.v), astrom.em, astrom.bm1, ppr);
  eraRxp(const_cast<double(*)[3]>(astrom.bpn), ppr, pci);
  eraC2s(pci, ri, di);
  *ri = eraAnp(*ri);
}

}  // namespace

Horizontal horizontal_from_hadec(double ha_rad, double dec_rad, double lat_rad) {
  Horizontal h;
  eraHd2ae(ha_rad, dec_rad, lat_rad, &h.az_rad, &h.alt_rad);
  return h;
}

double separation_rad(double lon1_rad, double lat1_rad, double lon2_rad, double lat2_rad) {
  return eraSeps(lon1_rad, lat1_rad, lon2_rad, lat2_rad);
}

double airmass_kasten_young(double alt_rad) {
  if (alt_rad < 0) return std::numeric_limits<double>::infinity();
  double h_deg = alt_rad * kRadToDeg;
  // Kasten & Young 1989, Appl. Opt. 28, 4735: X = 1 / [sin h + 0.50572 (h + 6.07995)^-1.6364], h in degrees.
  return 1.0 / (std::sin(alt_rad) + 0.50572 * std::pow(h_deg + 6.07995, -1.6364));
}

struct Epoch::Impl {
  Site site;
  JulianDate utc, tt;
  eraASTROM astrom{};      // refraction off: geometric directions
  eraASTROM refracted{};   // same, with the site's refraction constants
  bool dubious = false;

  Apparent observe(double ri, double di) const {
    Apparent a;
    double aob, zob, hob, dob, rob;
    eraAtioq(ri, di, const_cast<eraASTROM*>(&astrom), &aob, &zob, &hob, &dob, &rob);
    a.az_rad = aob;
    a.alt_rad = kPi / 2 - zob;
    a.ha_rad = eraAnpm(hob);
    a.dec_rad = dob;
    a.alt_refracted_rad = a.alt_rad;
    if (site.pressure_hpa > 0) {
      eraAtioq(ri, di, const_cast<eraASTROM*>(&refracted), &aob, &zob, &hob, &dob, &rob);
      a.alt_refracted_rad = kPi / 2 - zob;
    }
    a.airmass = airmass_kasten_young(a.alt_rad);
    a.parallactic_rad = eraHd2pa(a.ha_rad, a.dec_rad, site.lat_rad);
    return a;
  }

  // Barycentric position and velocity of the Sun and Moon at tt (geometry.md §2.5 steps 2-3).
  void sun_moon_bary(double sun_p[3], double sun_v[3], double moon_p[3], double moon_v[3]) const {
    double pvh[2][3], pvb[2][3], pvm[2][3];
    eraEpv00(tt.jd1, tt.jd2, pvh, pvb);   // status +1 outside 1900-2100: accuracy degrades slowly, ignored
    eraMoon98(tt.jd1, tt.jd2, pvm);
    for (int k = 0; k < 3; ++k) {
      sun_p[k] = pvb[0][k] - pvh[0][k];
      sun_v[k] = pvb[1][k] - pvh[1][k];
      moon_p[k] = pvb[0][k] + pvm[0][k];
      moon_v[k] = pvb[1][k] + pvm[1][k];
    }
  }
};

Epoch::Epoch(const Site& site, JulianDate utc) {
  auto impl = std::make_shared<Impl>();
  impl->site = site;
  impl->utc = utc;
  impl->tt = tt_from_utc(utc, &impl->dubious);
  double eo;
  int status = eraApco13(utc.jd1, utc.jd2, site.dut1_s, site.lon_east_rad, site.lat_rad, site.height_m, 0.0, 0.0,
                         0.0, site.temperature_c, site.humidity, kRefractionWavelength_um, &impl->astrom, &eo);
  if (status < 0)
    throw InputError("UTC " + format_utc(utc), "ERFA cannot compute the Earth's orientation for this date",
                     "use a date between 1960 and 2100");
  if (status == 1) impl->dubious = true;
  impl->refracted = impl->astrom;
  if (site.pressure_hpa > 0)
    eraRefco(site.pressure_hpa, site.temperature_c, site.humidity, kRefractionWavelength_um, &impl->refracted.refa,
             &impl->refracted.refb);
  impl_ = std::move(impl);
}

JulianDate Epoch::utc() const { return impl_->utc; }
bool Epoch::dubious_year() const { return impl_->dubious; }

Apparent Epoch::star(const SkyPosition& position) const {
  // dRA/dt (rad/yr) = mu_alpha* / cos(dec) (ERFA's pr is not multiplied by cos dec; geometry.md §2.4).
  double cosd = std::cos(position.dec_rad);
  double pr = cosd > 1e-12 ? position.pmra_cosdec_rad_per_yr / cosd : 0.0;
  double ri, di;
  eraAtciq(position.ra_rad, position.dec_rad, pr, position.pmdec_rad_per_yr, 0.0, 0.0,
           const_cast<eraASTROM*>(&impl_->astrom), &ri, &di);
  return impl_->observe(ri, di);
}

Apparent Epoch::sun() const {
  double sp[3], sv[3], mp[3], mv[3], ri, di;
  impl_->sun_moon_bary(sp, sv, mp, mv);
  body_cirs(impl_->astrom, sp, sv, &ri, &di);
  return impl_->observe(ri, di);
}

Apparent Epoch::moon() const {
  double sp[3], sv[3], mp[3], mv[3], ri, di;
  impl_->sun_moon_bary(sp, sv, mp, mv);
  body_cirs(impl_->astrom, mp, mv, &ri, &di);
  return impl_->observe(ri, di);
}

double Epoch::moon_illuminated_fraction() const {
  // Phase angle i = angle Sun-Moon-Earth from geocentric vectors; k = (1 + cos i) / 2 (Meeus eq. 48.1).
  double sp[3], sv[3], mp[3], mv[3];
  impl_->sun_moon_bary(sp, sv, mp, mv);
  double pvh[2][3], pvb[2][3];
  eraEpv00(impl_->tt.jd1, impl_->tt.jd2, pvh, pvb);
  double to_sun[3], to_earth[3];
  for (int k = 0; k < 3; ++k) {
    to_sun[k] = sp[k] - mp[k];
    to_earth[k] = pvb[0][k] - mp[k];
  }
  double i = eraSepp(to_sun, to_earth);
  return 0.5 * (1.0 + std::cos(i));
}

double Epoch::moon_separation_rad(const SkyPosition& position) const {
  Apparent s = star(position), m = moon();
  return separation_rad(s.az_rad, s.alt_rad, m.az_rad, m.alt_rad);
}

double Epoch::sun_separation_rad(const SkyPosition& position) const {
  Apparent s = star(position), m = sun();
  return separation_rad(s.az_rad, s.alt_rad, m.az_rad, m.alt_rad);
}

double Uvw::projected_m() const { return std::hypot(u_m, v_m); }
double Uvw::pa_rad() const { return std::atan2(u_m, v_m); }
double Uvw::delay_s() const { return w_m / kSpeedOfLight_m_per_s; }

Enu enu_from_geodetic(const Site& site, double lat_rad, double lon_east_rad, double height_m) {
  double ref[3], p[3];
  if (eraGd2gc(ERFA_WGS84, site.lon_east_rad, site.lat_rad, site.height_m, ref) != 0 ||
      eraGd2gc(ERFA_WGS84, lon_east_rad, lat_rad, height_m, p) != 0)
    throw InputError("WGS84 position", "latitude or height out of range", "give a latitude within +-90 degrees");
  double dx = p[0] - ref[0], dy = p[1] - ref[1], dz = p[2] - ref[2];
  double sl = std::sin(site.lon_east_rad), cl = std::cos(site.lon_east_rad);
  double sp = std::sin(site.lat_rad), cp = std::cos(site.lat_rad);
  // ECEF difference -> local East-North-Up at the reference point (geometry.md §1.2).
  return {-sl * dx + cl * dy, -sp * cl * dx - sp * sl * dy + cp * dz, cp * cl * dx + cp * sl * dy + sp * dz};
}

Geocentric site_geocentric(const Site& site) {
  double p[3];
  if (eraGd2gc(ERFA_WGS84, site.lon_east_rad, site.lat_rad, site.height_m, p) != 0)
    throw InputError("site", "latitude or height out of range", "give a latitude within +-90 degrees");
  return {p[0], p[1], p[2]};
}

Geocentric geocentric_offset_from_enu(const Site& site, const Enu& enu) {
  double sl = std::sin(site.lon_east_rad), cl = std::cos(site.lon_east_rad);
  double sp = std::sin(site.lat_rad), cp = std::cos(site.lat_rad);
  const double e = enu.east_m, n = enu.north_m, u = enu.up_m;
  return {-sl * e - sp * cl * n + cp * cl * u, cl * e - sp * sl * n + cp * sl * u, cp * n + sp * u};
}

BaselineXyz baseline_xyz(const Telescope& a, const Telescope& b, double lat_rad) {
  double e = b.east_m - a.east_m, n = b.north_m - a.north_m, u = b.up_m - a.up_m;
  double sp = std::sin(lat_rad), cp = std::cos(lat_rad);
  // geometry.md §1.3 (TMS §4.1 frame).
  return {-sp * n + cp * u, e, cp * n + sp * u};
}

UvwProjection::UvwProjection(double ha_rad, double dec_rad)
    : sin_ha(std::sin(ha_rad)), cos_ha(std::cos(ha_rad)), sin_dec(std::sin(dec_rad)), cos_dec(std::cos(dec_rad)) {}

void BaselineArrays::push_back(const BaselineXyz& b) {
  x_m.push_back(b.x_m);
  y_m.push_back(b.y_m);
  z_m.push_back(b.z_m);
}

void project_uv(const UvwProjection& projection, const BaselineArrays& b, std::span<double> u_m, std::span<double> v_m) {
  const std::size_t n = b.size();
  const double* x = b.x_m.data();
  const double* y = b.y_m.data();
  const double* z = b.z_m.data();
  for (std::size_t k = 0; k < n; ++k) {   // the compiler drops w and vectorises the loop
    const Uvw uvw = projection(BaselineXyz{x[k], y[k], z[k]});
    u_m[k] = uvw.u_m;
    v_m[k] = uvw.v_m;
  }
}

Uvw uvw_from_xyz(const BaselineXyz& b, double ha_rad, double dec_rad) { return UvwProjection(ha_rad, dec_rad)(b); }

Uvw baseline_uvw(const Telescope& a, const Telescope& b, double lat_rad, double ha_rad, double dec_rad) {
  return uvw_from_xyz(baseline_xyz(a, b, lat_rad), ha_rad, dec_rad);
}

double delay_rate(const Uvw& uvw, double dec_rad) {
  // dw/dH = -u cos(dec) (TMS §4.1), dH/dt = Earth rotation rate.
  return -kEarthRotation_rad_per_s * uvw.u_m * std::cos(dec_rad) / kSpeedOfLight_m_per_s;
}

}  // namespace siiplan::astro
