// The verdict "does this baseline resolve this star?": one criterion used by `siiplan resolve` and by
// the night planner.
//
// Criterion (ours; stated in the help and output of every command that uses it):
//   a baseline RESOLVES the target in the planned time when
//     (1) the drop of the squared visibility is significant:   1 - |V|^2 > 3 sigma(|V|^2), and
//     (2) the lobe has not collapsed into noise:               |V|^2     > 3 sigma(|V|^2).
//   (1) alone would also be met far beyond the first null, where |V|^2 ~ 0 says only "larger than some
//   size". A baseline beyond the first null of the model along its direction (first_null_baseline_m,
//   astro/coherence.hpp) is flagged; if (1) and (2) hold there it measures a secondary lobe (it
//   resolves, with the ambiguity of which lobe).
// Both tests scale as sqrt(T), so the time to satisfy them is T (3 sigma/min(drop, |V|^2))^2.
#pragma once

#include <string_view>


namespace siiplan::astro {

enum class Verdict {
  Resolves,            // (1) and (2), on the first lobe
  ResolvesSecondLobe,  // (1) and (2), beyond the first null
  Unresolved,          // drop not significant: |V|^2 consistent with 1
  LostInNoise,         // drop significant but |V|^2 itself not detected (over-resolved or too faint)
};

struct BaselineAssessment {
  double vis2 = 1;
  double sigma_vis2 = 0;
  double snr = 0;                   // |V|^2 / sigma(|V|^2)
  double drop_sigma = 0;            // (1 - |V|^2) / sigma(|V|^2)
  bool beyond_first_null = false;
  double time_to_criterion_s = 0;   // time for (1) and (2) to hold (+inf if |V|^2 = 0 or 1)
  Verdict verdict = Verdict::Unresolved;
  bool resolves() const { return verdict == Verdict::Resolves || verdict == Verdict::ResolvesSecondLobe; }
};

// The 3-sigma threshold of the criterion.
inline constexpr double kResolveSigmas = 3.0;

// Apply the criterion. sigma_vis2 is the noise reached in t_s seconds.
BaselineAssessment assess_baseline(double vis2, double sigma_vis2, double t_s, bool beyond_first_null);

// Short words for tables: "resolves", "resolves (2nd lobe)", "unresolved", "lost in noise".
std::string_view verdict_text(Verdict verdict);
// The criterion in one sentence, for help texts and report footers.
std::string_view resolve_criterion_text();

}  // namespace siiplan::astro
