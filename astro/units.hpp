// Unit conversions and physical constants used across siiplan.
//
// Internally everything is SI and radians; conversions to mas, degrees, hours and nm happen only at
// the edges (io/ and the CLI). Values are the exact definitions (CODATA 2018 / IAU) and match ERFA's
// erfam.h constants (ERFA_DPI, ERFA_DAS2R, ERFA_CMPS, ERFA_DJM0).
#pragma once

#include <numbers>

namespace siiplan::astro {

inline constexpr double kPi = std::numbers::pi;
inline constexpr double kTwoPi = 2.0 * std::numbers::pi;
inline constexpr double kDegToRad = kPi / 180.0;                    // degrees -> radians
inline constexpr double kRadToDeg = 180.0 / kPi;                    // radians -> degrees
inline constexpr double kArcsecToRad = kPi / (180.0 * 3600.0);      // arcseconds -> radians (ERFA_DAS2R)
inline constexpr double kMasToRad = kArcsecToRad / 1000.0;          // milliarcseconds -> radians (ERFA_DMAS2R)
inline constexpr double kRadToMas = 1.0 / kMasToRad;                // radians -> milliarcseconds
inline constexpr double kHourToRad = kPi / 12.0;                    // hours of angle -> radians
inline constexpr double kNmToM = 1e-9;                              // nanometres -> metres
inline constexpr double kSpeedOfLight_m_per_s = 299792458.0;        // exact (ERFA_CMPS)
inline constexpr double kPlanck_J_s = 6.62607015e-34;               // exact (SI 2019)
inline constexpr double kJansky_W_per_m2_Hz = 1e-26;                // 1 Jy
inline constexpr double kSecondsPerDay = 86400.0;                   // (ERFA_DAYSEC)
inline constexpr double kMjdZero_jd = 2400000.5;                    // JD of MJD 0 (ERFA_DJM0)
inline constexpr double kJ2000_jd = 2451545.0;                      // JD of J2000.0 TT (ERFA_DJ00)
// Earth rotation rate dERA/dt (rad/s of UT1): 2*pi*1.00273781191135448/86400 (IERS Conventions 2010 eq. 5.15).
inline constexpr double kEarthRotation_rad_per_s = kTwoPi * 1.00273781191135448 / kSecondsPerDay;

}  // namespace siiplan::astro
