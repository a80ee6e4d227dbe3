// Gauss-Legendre quadrature rules, computed once and shared read-only.
#pragma once

#include <span>

namespace siiplan::astro {

// Nodes and weights of the n-point Gauss-Legendre rule on [-1, 1] (exact for polynomials of degree
// 2n-1). Nodes are the roots of P_n found by Newton's method from Tricomi's initial guesses; accurate to
// ~1e-15. n in {8, 16, 32, 64}; the rules are built on first use (thread-safe static initialisation)
// and never change afterwards.
// References: Abramowitz & Stegun 25.4.29; Press et al., Numerical Recipes 3rd ed., §4.6.
struct GaussRule {
  std::span<const double> x;
  std::span<const double> w;
};
GaussRule gauss_legendre(int n);

// Integral of f over [a, b] split into `panels` equal panels, each with the n-point rule.
template <class F>
double integrate_panels(F&& f, double a, double b, int panels, int n = 16) {
  const GaussRule g = gauss_legendre(n);
  const double h = (b - a) / panels;
  double sum = 0;
  for (int p = 0; p < panels; ++p) {
    const double mid = a + (p + 0.5) * h, half = 0.5 * h;
    for (std::size_t i = 0; i < g.x.size(); ++i) sum += g.w[i] * half * f(mid + half * g.x[i]);
  }
  return sum;
}

}  // namespace siiplan::astro
