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

}  // namespace siiplan::astro
