// The night scheduler: which target to observe in which time slot, on one shared timeline (the whole
// array points at one target at a time).
//
// Input is abstract: for every target and slot, whether the target may be observed during the whole
// slot, and the Fisher information on (theta, c0) that one full slot of integration would bring
// (summed over the usable telescope pairs; astro/fisher.hpp). Information is additive over slots and
// proportional to integration time, so a block's information is the sum over its slots, each weighted
// by the fraction of the slot left after the block's start-up overhead.
//
// Objective (compared lexicographically; higher is better):
//   1) met  = sum of priority over targets whose predicted sigma_theta/theta <= goal;
//   2) info = sum over the other targets of priority * min(1, (goal / (sigma_theta/theta))^2), i.e. the
//             fraction of the information each still needed that the night gathers.
//
// Algorithm (deterministic; ties broken by target index, then start slot, then shorter block):
//   A. Greedy marginal gain. Repeatedly, over every target not yet at its goal and every free slot
//      where it is observable, consider placing a block there: of the shortest allowed length, of the
//      shortest length that reaches the goal, and of the longest run of free observable slots. A block
//      that directly extends the same target's block needs no overhead and may be shorter than the
//      minimum block. Score each candidate by its gain per slot (met gain first, then info gain) and
//      place the best. The placement is then evaluated exactly (the following block's slew changes
//      too); if the exact objective does not improve, that (target, start) is set aside and the next
//      best candidate is tried. Stop when no candidate gains anything.
//   B. Local improvement, until a whole pass changes nothing (at most kMaxImprovementPasses passes):
//      (i) move each boundary between two touching blocks by one slot either way; (ii) remove each
//      block in turn and refill the freed time greedily as in A; (iii) relocate each block: remove it,
//      refill greedily with its target barred from the slots it held, then refill again without the
//      bar. A change is kept only if it strictly improves the objective (exact evaluation, overheads
//      included).
//   C. The simple schedule (below) is improved the same way, and the better of the two results is the
//      plan, so the plan is never worse than the simple schedule.
// The simple ("baseline") schedule: from the start of the night, keep observing the current target
// while it is observable and short of its goal; otherwise start the highest-priority target (catalog
// order on ties) that is short of its goal and observable for at least the minimum block.
//
// Overheads: every block pays setup_s, plus the slew from the previous block's target (the great-circle
// distance between the two catalogue positions divided by slew_deg_per_s, or fixed_slew_s when set).
// The night's first block pays setup only. The overhead removes integration time from the block's first
// slots.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "astro/sensitivity.hpp"

namespace siiplan::planner {

// Information that one target would collect in each slot.
struct TargetSlots {
  double theta_rad = 0;        // the diameter whose precision is wanted
  double goal_fraction = 0.05; // sigma_theta/theta goal
  double priority = 1;
  double ra_rad = 0, dec_rad = 0;   // for slews
  std::vector<std::uint8_t> observable;   // [n_slots]
  std::vector<double> f_tt, f_tc, f_cc;  // [n_slots] Fisher entries for one full slot (theta in radians)
};

struct SchedulerOptions {
  int n_slots = 0;
  double slot_s = 300;
  int min_block_slots = 1;
  double setup_s = 0;
  double slew_deg_per_s = 1;
  double fixed_slew_s = -1;        // >= 0: every slew takes this long, whatever the angle
  astro::ZeroBaseline zero_baseline = astro::ZeroBaseline::Calibrated;
  int threads = 1;                 // candidate search only; results do not depend on it
};

struct Block {
  int target = 0;
  int first_slot = 0;
  int n_slots = 0;
  double overhead_s = 0;   // filled by evaluate()
  int end_slot() const { return first_slot + n_slots; }
};

struct Objective {
  double met = 0, info = 0;
  bool operator<(const Objective& o) const;   // lexicographic with a relative tolerance of 1e-12
  bool operator==(const Objective& o) const { return !(*this < o) && !(o < *this); }
};

struct Evaluation {
  Objective objective;
  std::vector<double> sigma_fraction;   // predicted sigma_theta/theta per target (+inf: no data)
  std::vector<Block> blocks;            // with overheads
};

// sigma_theta from the summed Fisher entries: 1/sqrt(F_tt) with c0 calibrated, 1/sqrt(F_tt - F_tc^2/F_cc)
// with c0 free (the Schur complement, i.e. (F^-1)_tt; models.md §5.3). +inf without information.
double sigma_theta_from_fisher(double f_tt, double f_tc, double f_cc, astro::ZeroBaseline zero_baseline);

// Great-circle angle between two directions given as (longitude-like, latitude-like) angles, atan2 form
// (well conditioned at all angles; geometry.md §5.1, as ERFA's eraSeps).
double angular_separation_rad(double lon1_rad, double lat1_rad, double lon2_rad, double lat2_rad);

// Slew plus setup time charged when `to` follows `from` (from < 0: the night's first block).
double overhead_s(const std::vector<TargetSlots>& targets, const SchedulerOptions& options, int from, int to);

// Fraction of slot k (0-based within a block) left for integration after an overhead of overhead_s.
double exposure_fraction(int k, double overhead_s, double slot_s);

// Exact objective of a schedule (blocks sorted by time, non-overlapping, adjacent same-target blocks merged).
Evaluation evaluate(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                    std::vector<Block> blocks);

struct PlanResult {
  Evaluation plan;         // the schedule to observe
  Evaluation baseline;     // the simple schedule, for comparison
  Evaluation greedy;       // step A alone (for the report's explanation)
  int improvement_passes = 0;
};

inline constexpr int kMaxImprovementPasses = 20;

std::vector<Block> baseline_schedule(const std::vector<TargetSlots>& targets, const SchedulerOptions& options);
// Step A from a given start (empty for a fresh night).
std::vector<Block> greedy_fill(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                               std::vector<Block> start);
PlanResult plan_schedule(const std::vector<TargetSlots>& targets, const SchedulerOptions& options);

// Checks a schedule against the rules (order, overlap, observability of every slot, minimum block,
// overhead shorter than the block); returns the problems found (empty = valid).
std::vector<std::string> schedule_problems(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                                           const std::vector<Block>& blocks);

}  // namespace siiplan::planner
