#include "astro/disk_kernel.hpp"

#include <cmath>
#include <cstddef>

#include "astro/units.hpp"

namespace siiplan::astro {

namespace {

// Horner's rule with the coefficients highest degree first; N is a compile-time constant, so the
// loop is unrolled and the caller's element loop vectorises.
template <std::size_t N>
[[gnu::always_inline]] inline double horner(double z, const double (&c)[N]) {
  double p = c[0];
  for (std::size_t k = 1; k < N; ++k) p = p * z + c[k];
  return p;
}

// Cephes Math Library 2.8 (S. L. Moshier 1984-2000), j0.c and j1.c: coefficients of the rational
// approximations (models.md §4.1), as distributed in Eigen 3.4 (unsupported/Eigen/src/SpecialFunctions/
// BesselFunctionsImpl.h). Stated accuracy on [0, 30]: peak absolute error 4.2e-16 (J0), 2.6e-16 (J1).
// x <= 5: J0 = (z - DR1)(z - DR2) RP0(z)/RQ0(z), J1 = x (z - Z1)(z - Z2) RP1(z)/RQ1(z), z = x^2.
constexpr double kDR1 = 5.78318596294678452118E0, kDR2 = 3.04712623436620863991E1;   // j0,1^2, j0,2^2
constexpr double kZ1 = 1.46819706421238932572E1, kZ2 = 4.92184563216946036703E1;     // j1,1^2, j1,2^2
constexpr double kRP0[] = {-4.79443220978201773821E9, 1.95617491946556577543E12, -2.49248344360967716204E14,
                           9.70862251047306323952E15};
constexpr double kRQ0[] = {1.0, 4.99563147152651017219E2, 1.73785401676374683123E5, 4.84409658339962045305E7,
                           1.11855537045356834862E10, 2.11277520115489217587E12, 3.10518229857422583814E14,
                           3.18121955943204943306E16, 1.71086294081043136091E18};
constexpr double kRP1[] = {-8.99971225705559398224E8, 4.52228297998194034323E11, -7.27494245221818276015E13,
                           3.68295732863852883286E15};
constexpr double kRQ1[] = {1.0, 6.20836478118054335476E2, 2.56987256757748830383E5, 8.35146791431949253037E7,
                           2.21511595479792499675E10, 4.74914122079991414898E12, 7.84369607876235854894E14,
                           8.95222336184627338078E16, 5.32278620332680085395E18};
// x > 5: J_n = sqrt(2/(pi x)) [P(s) cos(x - phi_n) - (5/x) Q(s) sin(x - phi_n)], s = 25/x^2,
// P = PP/PQ, Q = QP/QQ, phi_0 = pi/4, phi_1 = 3 pi/4.
constexpr double kPP0[] = {7.96936729297347051624E-4, 8.28352392107440799803E-2, 1.23953371646414299388E0,
                           5.44725003058768775090E0, 8.74716500199817011941E0, 5.30324038235394892183E0,
                           9.99999999999999997821E-1};
constexpr double kPQ0[] = {9.24408810558863637013E-4, 8.56288474354474431428E-2, 1.25352743901058953537E0,
                           5.47097740330417105182E0, 8.76190883237069594232E0, 5.30605288235394617618E0,
                           1.00000000000000000218E0};
constexpr double kQP0[] = {-1.13663838898469149931E-2, -1.28252718670509318512E0, -1.95539544257735972385E1,
                           -9.32060152123768231369E1, -1.77681167980488050595E2, -1.47077505154951170175E2,
                           -5.14105326766599330220E1, -6.05014350600728481186E0};
constexpr double kQQ0[] = {1.0, 6.43178256118178023184E1, 8.56430025976980587198E2, 3.88240183605401609683E3,
                           7.24046774195652478189E3, 5.93072701187316984827E3, 2.06209331660327847417E3,
                           2.42005740240291393179E2};
constexpr double kPP1[] = {7.62125616208173112003E-4, 7.31397056940917570436E-2, 1.12719608129684925192E0,
                           5.11207951146807644818E0, 8.42404590141772420927E0, 5.21451598682361504063E0,
                           1.00000000000000000254E0};
constexpr double kPQ1[] = {5.71323128072548699714E-4, 6.88455908754495404082E-2, 1.10514232634061696926E0,
                           5.07386386128601488557E0, 8.39985554327604159757E0, 5.20982848682361821619E0,
                           9.99999999999999997461E-1};
constexpr double kQP1[] = {5.10862594750176621635E-2, 4.98213872951233449420E0, 7.58238284132545283818E1,
                           3.66779609360150777800E2, 7.10856304998926107277E2, 5.97489612400613639965E2,
                           2.11688757100572135698E2, 2.52070205858023719784E1};
constexpr double kQQ1[] = {1.0, 7.42373277035675149943E1, 1.05644886038262816351E3, 4.98641058337653607651E3,
                           9.56231892404756170795E3, 7.99704160447350683650E3, 2.82619278517639096600E3,
                           3.36093607810698293419E2};

// 1/sqrt(pi): sqrt(2/(pi x)) times the 1/sqrt(2) of cos(x - pi/4) = (cos x + sin x)/sqrt(2) etc.
constexpr double kInvSqrtPi = 0.5641895835477563;

// sin and cos. Cody & Waite (1980, Software Manual for the Elementary Functions) reduction
// r = x - n pi/2 with pi/2 split into C1 + C2 + C3 (C1, C2 with 33 significant bits, so n C1 and n C2 are
// exact for n < 2^20; computed with mpmath), then Taylor series on |r| <= pi/4: sin to r^15 (next term
// < 8e-20 there), cos to r^16 (next term < 3e-21).
constexpr double kTwoOverPi = 0.6366197723675814;
constexpr double kPio2C1 = 1.5707963267341256, kPio2C2 = 6.077100506303966e-11, kPio2C3 = 2.0222662487959506e-21;
constexpr double kRound = 6755399441055744.0;   // 1.5 * 2^52: (a + kRound) - kRound = a rounded to an integer

template <int N>
struct Coeffs {
  double c[N];
};
// sin r = r + r^3 S(r^2): S's coefficients (-1)^k / (2k+1)!, k = 1..7, highest first.
constexpr Coeffs<7> sin_coeffs() {
  Coeffs<7> s{};
  double f = 1;
  for (int k = 1; k <= 7; ++k) {
    f *= -1.0 / ((2 * k) * (2 * k + 1));
    s.c[7 - k] = f;
  }
  return s;
}
// cos r = 1 + r^2 C(r^2): C's coefficients (-1)^k / (2k)!, k = 1..8, highest first.
constexpr Coeffs<8> cos_coeffs() {
  Coeffs<8> s{};
  double f = 1;
  for (int k = 1; k <= 8; ++k) {
    f *= -1.0 / ((2 * k - 1) * (2 * k));
    s.c[8 - k] = f;
  }
  return s;
}
constexpr Coeffs<7> kSin = sin_coeffs();
constexpr Coeffs<8> kCos = cos_coeffs();

struct SinCos {
  double s, c;
};

[[gnu::always_inline]] inline SinCos sin_cos(double x) {
  const double n = (x * kTwoOverPi + kRound) - kRound;
  const double r = ((x - n * kPio2C1) - n * kPio2C2) - n * kPio2C3;
  const double r2 = r * r;
  const double sr = r + r * r2 * horner(r2, kSin.c);
  const double cr = 1.0 + r2 * horner(r2, kCos.c);
  const double m = n - 4.0 * ((0.25 * n + kRound) - kRound);   // n mod 4, in {-2, -1, 0, 1, 2}
  // Bitwise | rather than ||: no short-circuit branch, so the loops if-convert without AVX-512 masks too.
  const bool odd = std::fabs(m) == 1.0;
  const double a = odd ? cr : sr, b = odd ? sr : cr;
  const double sign_s = ((m < 0.0) | (m > 1.5)) ? -1.0 : 1.0, sign_c = ((m > 0.5) | (m < -1.5)) ? -1.0 : 1.0;
  return {sign_s * a, sign_c * b};
}

// Power series of Lambda_nu(x)/scale in z = x^2 (DLMF 10.2.2 divided by its first term, models.md §1.0):
// coefficients (-1/4)^k / (k! (nu+1)_k) / scale, k = 0..11, highest first. For z < 4 the first omitted
// term is below 1e-18.
constexpr Coeffs<12> lambda_series(double nu, double scale) {
  Coeffs<12> s{};
  double t = 1.0 / scale;
  for (int k = 0; k < 12; ++k) {
    s.c[11 - k] = t;
    t *= -0.25 / ((k + 1) * (nu + k + 1));
  }
  return s;
}
constexpr Coeffs<12> kJ2OverX2 = lambda_series(2.0, 8.0);    // J2(x)/x^2 = Lambda_2/8
constexpr Coeffs<12> kSinc3 = lambda_series(1.5, 3.0);       // (sin x - x cos x)/x^3 = Lambda_{3/2}/3
constexpr Coeffs<12> kSinc5 = lambda_series(2.5, 15.0);      // sinc5 = Lambda_{5/2}/15
constexpr double kSeriesBelow = 2.0;   // as astro/bessel.hpp: below, the closed forms cancel

// J1(x)/x and, when kJ0, J0(x), for x >= 0. Both Cephes branches are evaluated (the small one at
// min(z, 25), the large one at max(x, 2) so neither overflows) and the right one selected; the
// divisions are merged into one. sc = sin_cos(x), r = 1 / max(x, 2).
struct J01 {
  double j1_over_x, j0;
};
template <bool kJ0>
[[gnu::always_inline]] inline J01 bessel_j01(double x, const SinCos& sc, double r) {
  const double z = x * x;
  const double zs = z < 25.0 ? z : 25.0;
  const double s = 25.0 * r * r, w = 5.0 * r;
  const double amp = std::sqrt(r) * kInvSqrtPi;
  const double spc = sc.s + sc.c, smc = sc.s - sc.c;
  const bool small = x <= 5.0;
  // J1/x. Large: sqrt(2/(pi x)) [P cos(x - 3pi/4) - w Q sin(x - 3pi/4)] / x with
  // cos(x - 3pi/4) = (sin x - cos x)/sqrt2, sin(x - 3pi/4) = -(sin x + cos x)/sqrt2.
  const double pp1 = horner(s, kPP1), pq1 = horner(s, kPQ1), qp1 = horner(s, kQP1), qq1 = horner(s, kQQ1);
  // Both branches are computed and one is selected. The file is compiled with -fno-trapping-math, which
  // lets the compiler evaluate both unconditionally; otherwise only the AVX-512 clone (masked
  // instructions) vectorises.
  const double n1_small = (zs - kZ1) * (zs - kZ2) * horner(zs, kRP1), d1_small = horner(zs, kRQ1);
  const double n1_large = amp * r * (pp1 * qq1 * smc + w * qp1 * pq1 * spc), d1_large = pq1 * qq1;
  const double n1 = small ? n1_small : n1_large, d1 = small ? d1_small : d1_large;
  if constexpr (!kJ0) {
    return {n1 / d1, 0.0};
  } else {
    // J0. Large: cos(x - pi/4) = (cos x + sin x)/sqrt2, sin(x - pi/4) = (sin x - cos x)/sqrt2.
    const double pp0 = horner(s, kPP0), pq0 = horner(s, kPQ0), qp0 = horner(s, kQP0), qq0 = horner(s, kQQ0);
    const double n0_small = (zs - kDR1) * (zs - kDR2) * horner(zs, kRP0), d0_small = horner(zs, kRQ0);
    const double n0_large = amp * (pp0 * qq0 * spc - w * qp0 * pq0 * smc), d0_large = pq0 * qq0;
    const double n0 = small ? n0_small : n0_large, d0 = small ? d0_small : d0_large;
    const double inv = 1.0 / (d1 * d0);
    return {n1 * d0 * inv, n0 * d1 * inv};
  }
}

// One point: |V|^2 and x d|V|^2/dx at x.
template <DiskLaw kLaw, bool kDeriv>
[[gnu::always_inline]] inline void disk_point(double x, double limb_u, double inv_den, double& vis2, double& x_dvis2_dx) {
  const SinCos sc = sin_cos(x);
  const double r = 1.0 / (x > kSeriesBelow ? x : kSeriesBelow);
  const double z = x * x;
  const bool series = x < kSeriesBelow;
  constexpr bool kNeedJ0 = kDeriv;
  const J01 j = bessel_j01<kNeedJ0>(x, sc, r);
  double v = 0, x_dv_dx = 0;
  if constexpr (kLaw == DiskLaw::Uniform) {
    v = 2.0 * j.j1_over_x;                                                      // models.md §1.1
    if constexpr (kDeriv) {
      const double j2x2_series = horner(z, kJ2OverX2.c), j2x2_closed = (2.0 * j.j1_over_x - j.j0) * r * r;   // DLMF 10.6.1
      x_dv_dx = -2.0 * z * (series ? j2x2_series : j2x2_closed);               // x dV/dx = -2 J2(x)
    }
  } else {
    const double sinc3_series = horner(z, kSinc3.c), sinc3_closed = (sc.s - x * sc.c) * r * r * r;
    const double sinc3 = series ? sinc3_series : sinc3_closed;
    v = ((1.0 - limb_u) * j.j1_over_x + limb_u * sinc3) * inv_den;             // models.md §1.2
    if constexpr (kDeriv) {
      const double j2x2_series = horner(z, kJ2OverX2.c), j2x2_closed = (2.0 * j.j1_over_x - j.j0) * r * r;
      const double sinc5_series = horner(z, kSinc5.c);
      const double sinc5_closed = (3.0 * (sc.s - x * sc.c) - z * sc.s) * (r * r) * (r * r) * r;
      const double j2x2 = series ? j2x2_series : j2x2_closed, sinc5 = series ? sinc5_series : sinc5_closed;
      x_dv_dx = -z * ((1.0 - limb_u) * j2x2 + limb_u * sinc5) * inv_den;       // d sinc3/dx = -x sinc5
    }
  }
  vis2 = v * v;
  if constexpr (kDeriv) x_dvis2_dx = 2.0 * v * x_dv_dx;
}

// The element loops, cloned per instruction set (chosen once at load time by the CPU's features).
#define SIIPLAN_KERNEL_CLONES __attribute__((target_clones("arch=x86-64-v4", "arch=x86-64-v3", "default")))

// x = scale * sqrt(u^2 + v^2) (kUv), or x = scale * u; out_d[k] = x d|V|^2/dx * dscale.
template <DiskLaw kLaw, bool kDeriv, bool kUv>
[[gnu::always_inline]] inline void disk_loop(const double* u, const double* v, std::size_t n, double scale, double limb_u,
                                             double dscale, double* out_v, double* out_d) {
  const double inv_den = 1.0 / ((1.0 - limb_u) / 2.0 + limb_u / 3.0);
  for (std::size_t k = 0; k < n; ++k) {
    double v2, xd = 0;
    double q = u[k];
    if constexpr (kUv) q = std::sqrt(u[k] * u[k] + v[k] * v[k]);
    disk_point<kLaw, kDeriv>(q * scale, limb_u, inv_den, v2, xd);
    out_v[k] = v2;
    if constexpr (kDeriv) out_d[k] = xd * dscale;
  }
}

// One clone set per (law, derivative or not, input (u,v) or x).
#define SIIPLAN_DISK_LOOP(name, law, deriv, uv)                                                                          \
  SIIPLAN_KERNEL_CLONES void name(const double* u, const double* v, std::size_t n, double scale, double limb_u,          \
                                  double dscale, double* out_v, double* out_d) {                                          \
    disk_loop<law, deriv, uv>(u, v, n, scale, limb_u, dscale, out_v, out_d);                                             \
  }
SIIPLAN_DISK_LOOP(ud_uv, DiskLaw::Uniform, true, true)
SIIPLAN_DISK_LOOP(ud_uv_value, DiskLaw::Uniform, false, true)
SIIPLAN_DISK_LOOP(ld_uv, DiskLaw::LinearLimbDarkened, true, true)
SIIPLAN_DISK_LOOP(ld_uv_value, DiskLaw::LinearLimbDarkened, false, true)
SIIPLAN_DISK_LOOP(ud_x, DiskLaw::Uniform, true, false)
SIIPLAN_DISK_LOOP(ud_x_value, DiskLaw::Uniform, false, false)
SIIPLAN_DISK_LOOP(ld_x, DiskLaw::LinearLimbDarkened, true, false)
SIIPLAN_DISK_LOOP(ld_x_value, DiskLaw::LinearLimbDarkened, false, false)
#undef SIIPLAN_DISK_LOOP

SIIPLAN_KERNEL_CLONES void j1_loop(const double* x, std::size_t n, double* out) {
  for (std::size_t k = 0; k < n; ++k) {
    const double r = 1.0 / (x[k] > kSeriesBelow ? x[k] : kSeriesBelow);
    out[k] = x[k] * bessel_j01<false>(x[k], sin_cos(x[k]), r).j1_over_x;
  }
}

void run(DiskLaw law, const double* u, const double* v, std::size_t n, double scale, double limb_u, double dscale,
         std::span<double> vis2, std::span<double> deriv) {
  using Loop = void (*)(const double*, const double*, std::size_t, double, double, double, double*, double*);
  // [law][derivative][input is (u,v)]
  static constexpr Loop kLoops[2][2][2] = {{{ud_x_value, ud_uv_value}, {ud_x, ud_uv}},
                                           {{ld_x_value, ld_uv_value}, {ld_x, ld_uv}}};
  kLoops[law == DiskLaw::Uniform ? 0 : 1][deriv.empty() ? 0 : 1][v ? 1 : 0](u, v, n, scale, limb_u, dscale, vis2.data(),
                                                                              deriv.data());
}

}  // namespace

void disk_vis2(DiskLaw law, double theta_rad, double limb_u, std::span<const double> u_lambda,
               std::span<const double> v_lambda, std::span<double> vis2, std::span<double> dvis2_dtheta) {
  // x = pi theta sqrt(u^2 + v^2); d|V|^2/dtheta = (x d|V|^2/dx) / theta.
  run(law, u_lambda.data(), v_lambda.data(), u_lambda.size(), kPi * theta_rad, limb_u, 1.0 / theta_rad, vis2, dvis2_dtheta);
}

void disk_vis2_x(DiskLaw law, double limb_u, std::span<const double> x, std::span<double> vis2,
                 std::span<double> x_dvis2_dx) {
  run(law, x.data(), nullptr, x.size(), 1.0, limb_u, 1.0, vis2, x_dvis2_dx);
}

void bessel_j1_array(std::span<const double> x, std::span<double> j1) { j1_loop(x.data(), x.size(), j1.data()); }

}  // namespace siiplan::astro
