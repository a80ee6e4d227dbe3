#include "astro/resolve.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace siiplan::astro {

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
}

BaselineAssessment assess_baseline(double vis2, double sigma_vis2, double t_s, bool beyond_first_null) {
  BaselineAssessment a;
  a.vis2 = vis2;
  a.sigma_vis2 = sigma_vis2;
  a.beyond_first_null = beyond_first_null;
  double drop = 1 - vis2;
  a.snr = sigma_vis2 > 0 ? vis2 / sigma_vis2 : kInf;
  a.drop_sigma = sigma_vis2 > 0 ? drop / sigma_vis2 : kInf;
  // Both (1) 1 - |V|^2 > 3 sigma and (2) |V|^2 > 3 sigma; sigma ∝ 1/sqrt(T).
  double limiting = std::min(drop, vis2);
  a.time_to_criterion_s =
      (limiting > 0 && std::isfinite(sigma_vis2)) ? t_s * std::pow(kResolveSigmas * sigma_vis2 / limiting, 2) : kInf;
  bool dropped = drop > kResolveSigmas * sigma_vis2;
  bool detected = vis2 > kResolveSigmas * sigma_vis2;
  if (!dropped)
    a.verdict = Verdict::Unresolved;
  else if (!detected)
    a.verdict = Verdict::LostInNoise;
  else
    a.verdict = beyond_first_null ? Verdict::ResolvesSecondLobe : Verdict::Resolves;
  return a;
}

std::string_view verdict_text(Verdict verdict) {
  switch (verdict) {
    case Verdict::Resolves: return "resolves";
    case Verdict::ResolvesSecondLobe: return "resolves (2nd lobe)";
    case Verdict::Unresolved: return "unresolved";
    case Verdict::LostInNoise: return "lost in noise";
  }
  return "";
}

std::string_view resolve_criterion_text() {
  return "a baseline resolves the star when, in the planned time, the drop 1-|V|^2 exceeds 3 sigma(|V|^2) "
         "AND |V|^2 itself exceeds 3 sigma(|V|^2) (the lobe has not collapsed into noise); beyond the "
         "model's first null it is reported as '2nd lobe'";
}

double first_null_lambda(const Model& model, double pa_rad) {
  const double theta = model.diameter_rad();
  const double su = std::sin(pa_rad), sv = std::cos(pa_rad);   // unit vector towards PA (u East, v North)
  auto v2 = [&](double r) { return model.vis2(r * su, r * sv); };
  const double step = 0.01 / theta, r_max = 6.0 / theta;
  double r_prev = 0, f_prev = 1;
  double r = step, f = v2(r);
  for (double r_next = 2 * step; r_next <= r_max; r_next += step) {
    double f_next = v2(r_next);
    if (f <= f_prev && f <= f_next && f < 0.05) {
      // Golden-section refinement of the minimum on [r_prev, r_next].
      double a = r_prev, b = r_next;
      const double g = 0.5 * (std::sqrt(5.0) - 1);
      double c = b - g * (b - a), d = a + g * (b - a);
      double fc = v2(c), fd = v2(d);
      for (int i = 0; i < 60 && (b - a) > 1e-12 * b; ++i) {
        if (fc < fd) {
          b = d, d = c, fd = fc, c = b - g * (b - a), fc = v2(c);
        } else {
          a = c, c = d, fc = fd, d = a + g * (b - a), fd = v2(d);
        }
      }
      return 0.5 * (a + b);
    }
    r_prev = r, f_prev = f, r = r_next, f = f_next;
  }
  return kInf;
}

}  // namespace siiplan::astro
