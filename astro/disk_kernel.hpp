// Squared visibility of the uniform disk and the linearly limb-darkened disk, and its derivative with
// respect to the diameter, over arrays of projected baselines: the planner's inner loop.
//
// The same functions as astro::Model::vis2_and_gradient for these two models (models.md §1.1, §1.2),
// evaluated branch-free so that the compiler vectorises the loop:
//   uniform disk  V = 2 J1(x)/x                                                       (models.md §1.1)
//   linear LD     V = [(1-u) J1(x)/x + u (sin x - x cos x)/x^3] / [(1-u)/2 + u/3]     (models.md §1.2;
//                 Hanbury Brown, Davis, Lake & Thompson 1974, MNRAS 167, 475)
//   x = pi theta q, q = sqrt(u^2 + v^2) / lambda (projected baseline in wavelengths);
//   d|V|^2/dtheta = 2 V (x dV/dx) / theta with x dV/dx = -2 J2(x) (UD) and
//   x dV/dx = -x^2 [(1-u) J2(x)/x^2 + u sinc5(x)] / den (LD), sinc5 as in astro/bessel.hpp.
//
// Numerics (disk_kernel.cpp):
//   J0, J1: the rational approximations of the Cephes Math Library 2.8 (S. L. Moshier, j0.c, j1.c;
//           models.md §4.1): x <= 5: (z - r1)(z - r2) P(z)/Q(z), z = x^2, with the first two zeros
//           factored out; x > 5: Hankel's form sqrt(2/(pi x)) [P(25/x^2) cos(x - phi) - (5/x) Q(25/x^2)
//           sin(x - phi)] with rational P, Q. Both branches are computed for every element and one is
//           selected (no branch), with the divisions of each merged into one.
//   sin, cos: Cody-Waite reduction by pi/2 (three-part constant) and Taylor polynomials to degree
//           15 and 16 on |r| <= pi/4 (truncation below 5e-17); valid for x < 1e6.
//   J2/x^2, sinc3, sinc5: their power series (DLMF 10.2.2 normalised, models.md §4.4) for x < 2, the
//           closed forms (J2 = 2 J1/x - J0, DLMF 10.6.1) for x >= 2 -- the same split as astro/bessel.hpp.
// Accuracy (tests/astro/disk_kernel_test.cpp): |V|^2 and theta d|V|^2/dtheta agree with mpmath
// (tests/data/disk_kernel_reference.csv) and with the libm-based astro::Model to better than 1e-13
// absolute over 0 <= x <= 1000.
//
// Speed: the translation unit is compiled with -O3 -fno-math-errno -fno-trapping-math; the loops are cloned for x86-64-v4
// (AVX-512), x86-64-v3 (AVX2 + FMA) and baseline x86-64, chosen at run time from the CPU (GCC
// target_clones, which checks the CPU the way __builtin_cpu_supports does). bench/kernel_bench.cpp
// measures it. Results can differ between the clones in the last bits (FMA contraction), never between
// threads.
#pragma once

#include <span>

namespace siiplan::astro {

enum class DiskLaw { Uniform, LinearLimbDarkened };

// Given:    law           uniform disk, or linear limb darkening with coefficient limb_u in [0, 1]
//           theta_rad     disk diameter (> 0); for the LD law the limb-darkened diameter
//           limb_u        linear limb-darkening coefficient (ignored for the uniform disk)
//           u_lambda, v_lambda  projected baselines in wavelengths (equal sizes), with
//                         pi theta sqrt(u^2 + v^2) < 1e6
// Returned: vis2          |V|^2 (same size)
//           dvis2_dtheta  d|V|^2/dtheta in 1/rad (same size, or empty: then it is not computed)
void disk_vis2(DiskLaw law, double theta_rad, double limb_u, std::span<const double> u_lambda,
               std::span<const double> v_lambda, std::span<double> vis2, std::span<double> dvis2_dtheta);

// The same as a function of x = pi theta q directly: vis2[k] = |V(x[k])|^2 and, when x_dvis2_dx is not
// empty, x_dvis2_dx[k] = x d|V|^2/dx = theta d|V|^2/dtheta (dimensionless). For benchmarks and tests.
void disk_vis2_x(DiskLaw law, double limb_u, std::span<const double> x, std::span<double> vis2,
                 std::span<double> x_dvis2_dx);

// J1(x) over an array with the kernel's numerics (Cephes rational forms, branch-free): the piece that
// sets the kernel's cost, exposed for the benchmark's floor comparison. x >= 0 and < 1e6.
void bessel_j1_array(std::span<const double> x, std::span<double> j1);
// Multiply-adds (FMA or multiply) in one evaluation of bessel_j1_array's J1, counted in the source: the
// benchmark's floor runs this many dependent-free multiply-adds per element.
inline constexpr int kBesselJ1MultiplyAdds = 76;   // sin/cos 23, the two Cephes branches 52, x J1/x 1

}  // namespace siiplan::astro
