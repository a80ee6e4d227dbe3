// Spatial coherence of light from a star: coherence radius and area (van Cittert-Zernike theorem), and
// the characteristic baselines of any model: first null and half power of |V|^2.
//
// For a uniformly bright disk of angular diameter theta, the complex degree of coherence between two
// points a distance d apart is gamma(d) = 2 J1(x)/x, x = pi theta d / lambda (models.md §1.1, §3). There
// is no single "coherence area"; two definitions are in use and both are given here:
//   circle:   the circle inside which |gamma| >= 0.880101 (x <= 1): radius lambda/(pi theta),
//             area lambda^2/(pi theta^2)  (Born & Wolf, Principles of Optics, §10.4.2, the "12 % drop"
//             criterion, usually written d = 0.16 lambda/alpha with alpha the angular RADIUS).
//   integral: A_c = ∫∫ |gamma|^2 dA = lambda^2/Omega_s for any uniformly bright source (Parseval;
//             Goodman, Statistical Optics, §5.6), for a disk 4 lambda^2/(pi theta^2), four times the
//             circle; its equivalent radius sqrt(A_c/pi) = 2 lambda/(pi theta).
// Example (common practice): the Sun, theta = 0.53 deg, at 500 nm: circle area 930 um^2, 34.4 um across.
// Tested in: tests/astro/coherence_test.cpp
#pragma once

#include "astro/models.hpp"

namespace siiplan::astro {

// Circle definition: radius (m) and area (m^2). theta_rad > 0, lambda_m > 0 (not checked).
double coherence_radius_circle_m(double theta_rad, double lambda_m);
double coherence_area_circle_m2(double theta_rad, double lambda_m);
// Integral definition: area (m^2) and the radius (m) of the circle of that area.
double coherence_area_integral_m2(double theta_rad, double lambda_m);
double coherence_radius_integral_m(double theta_rad, double lambda_m);
// |gamma| at the edge of the circle definition: 2 J1(1)/1 = 0.880101171490.
double coherence_circle_gamma();

// Baseline length (m) along position angle baseline_pa_rad (from North through East) at which |V|^2
// first reaches `level` (0 < level < 1) coming from zero baseline. +infinity when it does not happen
// before x = pi * scale * B / lambda = 200 (scale = angular_scale_rad(model)).
// Notes: the model is scanned outward in steps of 0.02 in x (or finer for a binary's fringes), then the
//        crossing is refined by bisection to ~1e-15 relative.
double baseline_at_vis2_m(const Model& model, double lambda_m, double level, double baseline_pa_rad = 0);

// The half-power baseline: |V|^2 = 0.5. UD: x = 1.61633994831 (models.md §3), B = 44.5715007872 m for
// theta = 1 mas at 420 nm.
double half_power_baseline_m(const Model& model, double lambda_m, double baseline_pa_rad = 0);

// The first null of |V|^2 (m), along position angle baseline_pa_rad.
//   Models with real V (all but the binary): the first sign change of V, found by bisection to
//   ~1e-15 relative: UD x = j_{1,1} = 3.83170597021 (B = 105.661488999 m for 1 mas at 420 nm), ring
//   x = j_{0,1}, LD laws larger (models.md §3).
//   Binary (complex V): the first local minimum of |V|^2 with |V|^2 < 0.05, refined by golden section
//   (~1e-8 relative, the minimum is flat).
//   +infinity when there is none before x = 200 (Gaussian; binaries whose minima stay above 0.05).
double first_null_baseline_m(const Model& model, double lambda_m, double baseline_pa_rad = 0);

}  // namespace siiplan::astro
