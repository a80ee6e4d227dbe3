#include "planner/scheduler.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>
#include <thread>

#include "astro/units.hpp"

namespace siiplan::planner {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kRelTol = 1e-12;   // objective ties: sums of the same terms in different order

bool less_tol(double a, double b) { return a < b - kRelTol * std::max({std::fabs(a), std::fabs(b), 1e-300}); }

// Prefix sums of the per-slot Fisher entries, so that any block's information costs O(1).
struct Prefix {
  std::vector<std::vector<double>> tt, tc, cc;   // [target][n_slots + 1]
  explicit Prefix(const std::vector<TargetSlots>& targets) {
    for (const auto& t : targets) {
      auto sum = [](const std::vector<double>& f) {
        std::vector<double> p(f.size() + 1, 0.0);
        for (std::size_t k = 0; k < f.size(); ++k) p[k + 1] = p[k] + f[k];
        return p;
      };
      tt.push_back(sum(t.f_tt));
      tc.push_back(sum(t.f_tc));
      cc.push_back(sum(t.f_cc));
    }
  }
};

struct Fisher {
  double tt = 0, tc = 0, cc = 0;
  Fisher& operator+=(const Fisher& o) {
    tt += o.tt;
    tc += o.tc;
    cc += o.cc;
    return *this;
  }
};

// Information of target t over slots [a, a + n) when the block pays `overhead` seconds at its start.
Fisher block_info(const TargetSlots& t, int a, int n, double overhead, double slot_s) {
  Fisher f;
  for (int k = 0; k < n; ++k) {
    double e = exposure_fraction(k, overhead, slot_s);
    if (e <= 0) continue;
    f.tt += e * t.f_tt[std::size_t(a + k)];
    f.tc += e * t.f_tc[std::size_t(a + k)];
    f.cc += e * t.f_cc[std::size_t(a + k)];
  }
  return f;
}

// The same in O(1) with prefix sums: slots before floor(q) get nothing, slot floor(q) gets 1 - frac(q).
Fisher block_info_fast(const Prefix& p, const TargetSlots& t, int ti, int a, int n, double overhead, double slot_s) {
  double q = overhead / slot_s;
  int m = int(std::floor(q));
  if (m >= n) return {};
  double first = 1.0 - (q - m);
  auto range = [&](const std::vector<double>& pre, const std::vector<double>& f) {
    return first * f[std::size_t(a + m)] + (pre[std::size_t(a + n)] - pre[std::size_t(a + m + 1)]);
  };
  return {range(p.tt[std::size_t(ti)], t.f_tt), range(p.tc[std::size_t(ti)], t.f_tc),
          range(p.cc[std::size_t(ti)], t.f_cc)};
}

double sigma_fraction(const TargetSlots& t, const Fisher& f, astro::ZeroBaseline zb) {
  return sigma_theta_from_fisher(f.tt, f.tc, f.cc, zb) / t.theta_rad;
}

// A target's share of the objective.
Objective contribution(const TargetSlots& t, double sigma_frac) {
  if (sigma_frac <= t.goal_fraction) return {t.priority, 0};
  double r = t.goal_fraction / sigma_frac;
  return {0, t.priority * std::min(1.0, r * r)};
}

std::vector<Block> normalise(std::vector<Block> blocks) {
  std::sort(blocks.begin(), blocks.end(), [](const Block& a, const Block& b) { return a.first_slot < b.first_slot; });
  std::vector<Block> out;
  for (const auto& b : blocks) {
    if (b.n_slots <= 0) continue;
    if (!out.empty() && out.back().target == b.target && out.back().end_slot() == b.first_slot)
      out.back().n_slots += b.n_slots;
    else
      out.push_back(b);
  }
  return out;
}

// Candidate placement in the greedy search.
struct Candidate {
  double gain_met = 0, gain_info = 0;   // per slot
  int target = -1, start = 0, length = 0;
  bool valid() const { return target >= 0; }
};

// True when a is a better candidate than b (higher gain per slot; ties: lower target, start, length).
bool better(const Candidate& a, const Candidate& b) {
  if (!b.valid()) return a.valid();
  if (!a.valid()) return false;
  if (less_tol(b.gain_met, a.gain_met)) return true;
  if (less_tol(a.gain_met, b.gain_met)) return false;
  if (less_tol(b.gain_info, a.gain_info)) return true;
  if (less_tol(a.gain_info, b.gain_info)) return false;
  if (a.target != b.target) return a.target < b.target;
  if (a.start != b.start) return a.start < b.start;
  return a.length < b.length;
}

class Greedy {
 public:
  Greedy(const std::vector<TargetSlots>& targets, const SchedulerOptions& options)
      : targets_(targets), options_(options), prefix_(targets) {}

  // Slots [from, to) that `target` may not use during one fill (the relocation move); none by default.
  struct Bar {
    int target, from, to;   // target -1: nothing barred
    bool bars(int t, int s) const { return t == target && s >= from && s < to; }
  };

  std::vector<Block> fill(std::vector<Block> blocks, Bar bar = Bar{-1, 0, 0}) const {
    Evaluation current = evaluate(targets_, options_, std::move(blocks));
    std::set<std::pair<int, int>> set_aside;
    for (;;) {
      Candidate best = search(current, set_aside, bar);
      if (!best.valid() || !(best.gain_met > 0 || best.gain_info > 0)) break;
      auto trial_blocks = current.blocks;
      trial_blocks.push_back(Block{best.target, best.start, best.length, 0});
      trial_blocks = normalise(std::move(trial_blocks));
      const bool valid = schedule_problems(targets_, options_, trial_blocks).empty();
      Evaluation trial = evaluate(targets_, options_, std::move(trial_blocks));
      if (valid && current.objective < trial.objective) {
        current = std::move(trial);
        set_aside.clear();
      } else {
        set_aside.insert({best.target, best.start});
      }
    }
    return current.blocks;
  }

 private:
  Candidate search(const Evaluation& current, const std::set<std::pair<int, int>>& set_aside, const Bar& bar) const {
    const int n = options_.n_slots;
    // occupancy and, per slot, the last block ending at or before it
    std::vector<int> occupied(std::size_t(n), -1), previous(std::size_t(n) + 1, -1);
    for (std::size_t b = 0; b < current.blocks.size(); ++b)
      for (int s = current.blocks[b].first_slot; s < current.blocks[b].end_slot(); ++s) occupied[std::size_t(s)] = int(b);
    int last = -1;
    for (int s = 0; s <= n; ++s) {
      previous[std::size_t(s)] = last;
      if (s < n && occupied[std::size_t(s)] >= 0 && current.blocks[std::size_t(occupied[std::size_t(s)])].end_slot() == s + 1)
        last = occupied[std::size_t(s)];
    }
    // per-target information already gathered
    std::vector<Fisher> have(targets_.size());
    for (const auto& b : current.blocks)
      have[std::size_t(b.target)] += block_info_fast(prefix_, targets_[std::size_t(b.target)], b.target, b.first_slot,
                                                     b.n_slots, b.overhead_s, options_.slot_s);

    const int nt = int(targets_.size());
    const int threads = std::max(1, std::min(options_.threads, nt));
    std::vector<Candidate> best(static_cast<std::size_t>(threads));
    auto work = [&](int w) {
      for (int t = w; t < nt; t += threads) {
        Candidate c = best_for_target(t, current, occupied, previous, have[std::size_t(t)], set_aside, bar);
        if (better(c, best[std::size_t(w)])) best[std::size_t(w)] = c;
      }
    };
    if (threads == 1) {
      work(0);
    } else {
      std::vector<std::thread> pool;
      for (int w = 0; w < threads; ++w) pool.emplace_back(work, w);
      for (auto& th : pool) th.join();
    }
    Candidate overall;
    for (const auto& c : best)
      if (better(c, overall)) overall = c;
    return overall;
  }

  Candidate best_for_target(int ti, const Evaluation& current, const std::vector<int>& occupied,
                            const std::vector<int>& previous, const Fisher& have,
                            const std::set<std::pair<int, int>>& set_aside, const Bar& bar) const {
    const auto& t = targets_[std::size_t(ti)];
    const auto zb = options_.zero_baseline;
    Candidate best;
    const double sigma_now = current.sigma_fraction[std::size_t(ti)];
    if (sigma_now <= t.goal_fraction) return best;
    const Objective before = contribution(t, sigma_now);
    const int n = options_.n_slots;
    auto usable = [&](int s) { return occupied[std::size_t(s)] < 0 && t.observable[std::size_t(s)] && !bar.bars(ti, s); };
    int run_end = -1;   // end of the free observable run containing the current start
    for (int a = 0; a < n; ++a) {
      if (!usable(a)) continue;
      if (set_aside.count({ti, a})) continue;
      if (run_end <= a) {
        run_end = a;
        while (run_end < n && usable(run_end)) ++run_end;
      }
      const int run = run_end - a;
      const int prev = previous[std::size_t(a)];
      const bool extends = prev >= 0 && current.blocks[std::size_t(prev)].target == ti &&
                           current.blocks[std::size_t(prev)].end_slot() == a;
      double overhead = 0;
      int min_len = 1;
      if (!extends) {
        overhead = overhead_s(targets_, options_, prev >= 0 ? current.blocks[std::size_t(prev)].target : -1, ti);
        min_len = std::max(options_.min_block_slots, int(std::floor(overhead / options_.slot_s)) + 1);
      }
      if (min_len > run) continue;
      auto gain_of = [&](int len) {
        Fisher f = have;
        f += block_info_fast(prefix_, t, ti, a, len, overhead, options_.slot_s);
        Objective after = contribution(t, sigma_fraction(t, f, zb));
        return Candidate{(after.met - before.met) / len, (after.info - before.info) / len, ti, a, len};
      };
      auto met_at = [&](int len) {
        Fisher f = have;
        f += block_info_fast(prefix_, t, ti, a, len, overhead, options_.slot_s);
        return sigma_fraction(t, f, zb) <= t.goal_fraction;
      };
      std::vector<int> lengths{min_len, run};
      if (met_at(run)) {   // the shortest block reaching the goal (information grows with length)
        int lo = min_len, hi = run;
        while (lo < hi) {
          int mid = lo + (hi - lo) / 2;
          if (met_at(mid)) hi = mid;
          else lo = mid + 1;
        }
        lengths.push_back(lo);
      }
      for (int len : lengths) {
        Candidate c = gain_of(len);
        if (better(c, best)) best = c;
      }
    }
    return best;
  }

  const std::vector<TargetSlots>& targets_;
  const SchedulerOptions& options_;
  Prefix prefix_;
};

}  // namespace

bool Objective::operator<(const Objective& o) const {
  if (less_tol(met, o.met)) return true;
  if (less_tol(o.met, met)) return false;
  return less_tol(info, o.info);
}

double sigma_theta_from_fisher(double f_tt, double f_tc, double f_cc, astro::ZeroBaseline zero_baseline) {
  double info = f_tt;
  if (zero_baseline == astro::ZeroBaseline::Free) info = f_cc > 0 ? f_tt - f_tc * f_tc / f_cc : 0;
  return info > 0 ? 1.0 / std::sqrt(info) : kInf;
}

double angular_separation_rad(double lon1_rad, double lat1_rad, double lon2_rad, double lat2_rad) {
  double c1 = std::cos(lat1_rad), c2 = std::cos(lat2_rad), s1 = std::sin(lat1_rad), s2 = std::sin(lat2_rad);
  double d = lon2_rad - lon1_rad;
  double x = c2 * std::sin(d), y = c1 * s2 - s1 * c2 * std::cos(d), z = s1 * s2 + c1 * c2 * std::cos(d);
  return std::atan2(std::hypot(x, y), z);
}

double overhead_s(const std::vector<TargetSlots>& targets, const SchedulerOptions& options, int from, int to) {
  if (from < 0) return options.setup_s;
  if (from == to) return options.setup_s;
  if (options.fixed_slew_s >= 0) return options.setup_s + options.fixed_slew_s;
  const auto& a = targets[std::size_t(from)];
  const auto& b = targets[std::size_t(to)];
  double sep = angular_separation_rad(a.ra_rad, a.dec_rad, b.ra_rad, b.dec_rad);
  return options.setup_s + sep * astro::kRadToDeg / options.slew_deg_per_s;
}

double exposure_fraction(int k, double overhead, double slot_s) {
  return std::clamp(double(k + 1) - overhead / slot_s, 0.0, 1.0);
}

Evaluation evaluate(const std::vector<TargetSlots>& targets, const SchedulerOptions& options, std::vector<Block> blocks) {
  Evaluation ev;
  ev.blocks = normalise(std::move(blocks));
  std::vector<Fisher> f(targets.size());
  int prev = -1;
  for (auto& b : ev.blocks) {
    b.overhead_s = overhead_s(targets, options, prev, b.target);
    f[std::size_t(b.target)] += block_info(targets[std::size_t(b.target)], b.first_slot, b.n_slots, b.overhead_s, options.slot_s);
    prev = b.target;
  }
  for (std::size_t t = 0; t < targets.size(); ++t) {
    double s = sigma_fraction(targets[t], f[t], options.zero_baseline);
    ev.sigma_fraction.push_back(s);
    Objective c = contribution(targets[t], s);
    ev.objective.met += c.met;
    ev.objective.info += c.info;
  }
  return ev;
}

std::vector<std::string> schedule_problems(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                                           const std::vector<Block>& blocks) {
  std::vector<std::string> problems;
  int prev_end = 0, prev_target = -1;
  for (std::size_t i = 0; i < blocks.size(); ++i) {
    const auto& b = blocks[i];
    std::string id = "block " + std::to_string(i);
    if (b.target < 0 || std::size_t(b.target) >= targets.size()) {
      problems.push_back(id + ": no such target");
      continue;
    }
    if (b.first_slot < prev_end) problems.push_back(id + ": overlaps or is out of order");
    if (b.first_slot < 0 || b.end_slot() > options.n_slots) problems.push_back(id + ": outside the night");
    if (b.n_slots < options.min_block_slots) problems.push_back(id + ": shorter than the minimum block");
    double o = overhead_s(targets, options, prev_target, b.target);
    if (o >= b.n_slots * options.slot_s) problems.push_back(id + ": overhead uses the whole block");
    for (int s = std::max(0, b.first_slot); s < std::min(options.n_slots, b.end_slot()); ++s)
      if (!targets[std::size_t(b.target)].observable[std::size_t(s)])
        problems.push_back(id + ": target not observable in slot " + std::to_string(s));
    prev_end = b.end_slot();
    prev_target = b.target;
  }
  return problems;
}

std::vector<Block> greedy_fill(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                               std::vector<Block> start) {
  return Greedy(targets, options).fill(std::move(start));
}

std::vector<Block> baseline_schedule(const std::vector<TargetSlots>& targets, const SchedulerOptions& options) {
  std::vector<Block> blocks;
  std::vector<Fisher> f(targets.size());
  auto met = [&](int t) {
    return sigma_fraction(targets[std::size_t(t)], f[std::size_t(t)], options.zero_baseline) <=
           targets[std::size_t(t)].goal_fraction;
  };
  int s = 0;
  while (s < options.n_slots) {
    if (!blocks.empty()) {
      Block& cur = blocks.back();
      const auto& t = targets[std::size_t(cur.target)];
      if (cur.end_slot() == s && t.observable[std::size_t(s)] && !met(cur.target)) {
        double e = exposure_fraction(cur.n_slots, cur.overhead_s, options.slot_s);
        f[std::size_t(cur.target)] += Fisher{e * t.f_tt[std::size_t(s)], e * t.f_tc[std::size_t(s)], e * t.f_cc[std::size_t(s)]};
        ++cur.n_slots;
        ++s;
        continue;
      }
    }
    const int prev = blocks.empty() ? -1 : blocks.back().target;
    int chosen = -1, chosen_len = 0;
    double chosen_overhead = 0;
    for (int t = 0; t < int(targets.size()); ++t) {
      if (met(t)) continue;
      double o = overhead_s(targets, options, prev, t);
      int len = std::max(options.min_block_slots, int(std::floor(o / options.slot_s)) + 1);
      if (s + len > options.n_slots) continue;
      bool ok = true;
      for (int k = s; k < s + len && ok; ++k) ok = targets[std::size_t(t)].observable[std::size_t(k)] != 0;
      if (!ok) continue;
      if (chosen < 0 || targets[std::size_t(t)].priority > targets[std::size_t(chosen)].priority) {
        chosen = t;
        chosen_len = len;
        chosen_overhead = o;
      }
    }
    if (chosen < 0) {
      ++s;
      continue;
    }
    blocks.push_back(Block{chosen, s, chosen_len, chosen_overhead});
    f[std::size_t(chosen)] += block_info(targets[std::size_t(chosen)], s, chosen_len, chosen_overhead, options.slot_s);
    s += chosen_len;
  }
  return evaluate(targets, options, blocks).blocks;
}

namespace {

std::vector<Block> improve(const std::vector<TargetSlots>& targets, const SchedulerOptions& options,
                           std::vector<Block> blocks, int& passes) {
  Greedy greedy(targets, options);
  Evaluation best = evaluate(targets, options, std::move(blocks));
  for (passes = 0; passes < kMaxImprovementPasses;) {
    ++passes;
    bool changed = false;
    auto try_blocks = [&](std::vector<Block> trial_blocks) {
      trial_blocks = normalise(std::move(trial_blocks));
      if (!schedule_problems(targets, options, trial_blocks).empty()) return false;
      Evaluation trial = evaluate(targets, options, std::move(trial_blocks));
      if (!(best.objective < trial.objective)) return false;
      best = std::move(trial);
      changed = true;
      return true;
    };
    // (i) boundary moves between touching blocks
    for (std::size_t b = 0; b + 1 < best.blocks.size(); ++b) {
      if (best.blocks[b].end_slot() != best.blocks[b + 1].first_slot) continue;
      for (int d : {+1, -1}) {
        auto trial = best.blocks;
        trial[b].n_slots += d;
        trial[b + 1].first_slot += d;
        trial[b + 1].n_slots -= d;
        if (try_blocks(std::move(trial))) break;
      }
    }
    // (ii) remove one block and refill greedily
    for (std::size_t b = 0; b < best.blocks.size(); ++b) {
      auto trial = best.blocks;
      trial.erase(trial.begin() + std::ptrdiff_t(b));
      try_blocks(greedy.fill(std::move(trial)));
    }
    // (iii) relocate one block: remove it, refill with its target barred from its old slots, then
    // refill once more without the bar
    for (std::size_t b = 0; b < best.blocks.size(); ++b) {
      auto trial = best.blocks;
      const Block old = trial[b];
      trial.erase(trial.begin() + std::ptrdiff_t(b));
      trial = greedy.fill(std::move(trial), Greedy::Bar{old.target, old.first_slot, old.end_slot()});
      try_blocks(greedy.fill(std::move(trial)));
    }
    if (!changed) break;
  }
  return best.blocks;
}

}  // namespace

PlanResult plan_schedule(const std::vector<TargetSlots>& targets, const SchedulerOptions& options) {
  PlanResult result;
  auto greedy_blocks = greedy_fill(targets, options, {});
  result.greedy = evaluate(targets, options, greedy_blocks);
  auto base_blocks = baseline_schedule(targets, options);
  result.baseline = evaluate(targets, options, base_blocks);
  int passes_a = 0, passes_b = 0;
  Evaluation a = evaluate(targets, options, improve(targets, options, greedy_blocks, passes_a));
  Evaluation b = evaluate(targets, options, improve(targets, options, base_blocks, passes_b));
  result.plan = (a.objective < b.objective) ? std::move(b) : std::move(a);
  result.improvement_passes = passes_a + passes_b;
  return result;
}

}  // namespace siiplan::planner
