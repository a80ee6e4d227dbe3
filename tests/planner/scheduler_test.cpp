// The scheduler core on constructed information tables (no geometry, no photometry).
#include <doctest/doctest.h>

#include <random>

#include "planner/scheduler.hpp"
#include "support/close.hpp"

using namespace siiplan::planner;
using siiplan::astro::ZeroBaseline;
using siiplan::test::check_close;

namespace {

// A target with constant information per slot over [from, to).
TargetSlots flat_target(int n_slots, int from, int to, double f_per_slot, double priority = 1) {
  TargetSlots t;
  t.theta_rad = 1;
  t.goal_fraction = 0.05;
  t.priority = priority;
  t.observable.assign(std::size_t(n_slots), 0);
  t.f_tt.assign(std::size_t(n_slots), 0);
  t.f_tc.assign(std::size_t(n_slots), 0);
  t.f_cc.assign(std::size_t(n_slots), 0);
  for (int s = from; s < to; ++s) {
    t.observable[std::size_t(s)] = 1;
    t.f_tt[std::size_t(s)] = f_per_slot;
    t.f_tc[std::size_t(s)] = 0.3 * f_per_slot;
    t.f_cc[std::size_t(s)] = f_per_slot;
  }
  return t;
}

SchedulerOptions options(int n_slots) {
  SchedulerOptions o;
  o.n_slots = n_slots;
  o.slot_s = 600;
  o.min_block_slots = 2;
  o.setup_s = 0;
  o.slew_deg_per_s = 1;
  return o;
}

}  // namespace

TEST_SUITE("planner/scheduler") {
  TEST_CASE("sigma_theta from the Fisher entries (2x2 inverse by hand)") {
    // F = [[4, 1], [1, 2]]: F^-1_tt = 2 / (8 - 1) = 2/7 (cofactor formula for a 2x2 inverse)
    check_close(sigma_theta_from_fisher(4, 1, 2, ZeroBaseline::Free), std::sqrt(2.0 / 7.0), 1e-15, 0, "free c0");
    check_close(sigma_theta_from_fisher(4, 1, 2, ZeroBaseline::Calibrated), 0.5, 1e-15, 0, "calibrated");
    CHECK(std::isinf(sigma_theta_from_fisher(0, 0, 0, ZeroBaseline::Calibrated)));
  }

  TEST_CASE("overhead eats the first slots of a block") {
    CHECK(exposure_fraction(0, 900, 600) == 0.0);
    check_close(exposure_fraction(1, 900, 600), 0.5, 1e-15, 0, "second slot");
    CHECK(exposure_fraction(2, 900, 600) == 1.0);
    CHECK(exposure_fraction(0, 0, 600) == 1.0);
  }

  TEST_CASE("one obvious best answer is found, and the simple schedule misses it") {
    // A is up only in the first half of the night, B all night; each needs exactly 5 slots (F >= 400
    // for sigma/theta <= 0.05 with theta = 1). B has the higher priority, so the simple schedule spends
    // the first half on B and A sets unobserved. The only way to meet both goals: A first, then B.
    std::vector<TargetSlots> t{flat_target(10, 0, 5, 80.001 / 0.91), flat_target(10, 0, 10, 80.001 / 0.91, 2)};
    auto o = options(10);
    o.zero_baseline = ZeroBaseline::Free;   // f_tc = 0.3 f: the Schur complement is 0.91 f
    auto r = plan_schedule(t, o);
    REQUIRE(r.plan.blocks.size() == 2);
    CHECK(r.plan.blocks[0].target == 0);
    CHECK(r.plan.blocks[0].first_slot == 0);
    CHECK(r.plan.blocks[0].n_slots == 5);
    CHECK(r.plan.blocks[1].target == 1);
    CHECK(r.plan.blocks[1].n_slots == 5);
    check_close(r.plan.objective.met, 3, 0, 1e-12, "both goals met");
    check_close(r.baseline.objective.met, 2, 0, 1e-12, "simple schedule meets only B");
    CHECK(r.plan.sigma_fraction[0] <= 0.05);
    CHECK(r.plan.sigma_fraction[1] <= 0.05);
  }

  TEST_CASE("slews and setups are charged and respected") {
    std::vector<TargetSlots> t{flat_target(12, 0, 12, 50), flat_target(12, 0, 12, 50)};
    t[1].ra_rad = 1.0;   // 57.3 deg away
    auto o = options(12);
    o.setup_s = 120;
    o.slew_deg_per_s = 0.5;
    check_close(overhead_s(t, o, 0, 1), 120 + 57.29577951308232 / 0.5, 1e-12, 0, "setup + slew");
    check_close(overhead_s(t, o, -1, 1), 120, 0, 0, "first block: setup only");
    o.fixed_slew_s = 30;
    check_close(overhead_s(t, o, 0, 1), 150, 0, 0, "fixed slew");
    auto r = plan_schedule(t, o);
    CHECK(schedule_problems(t, o, r.plan.blocks).empty());
    for (const auto& b : r.plan.blocks) CHECK(b.overhead_s >= 120);
  }

  TEST_CASE("random nights: valid, never worse than the simple schedule, same with 1 and 2 threads") {
    std::mt19937_64 rng(20260314);
    std::uniform_real_distribution<double> uni(0, 1);
    for (int trial = 0; trial < 30; ++trial) {
      CAPTURE(trial);
      const int n = 20 + int(uni(rng) * 40);
      std::vector<TargetSlots> t;
      const int nt = 3 + int(uni(rng) * 25);
      for (int k = 0; k < nt; ++k) {
        int from = int(uni(rng) * n), len = 1 + int(uni(rng) * n);
        auto x = flat_target(n, from, std::min(n, from + len), 5 + 100 * uni(rng), 1 + int(uni(rng) * 3));
        for (int s = 0; s < n; ++s) x.f_tt[std::size_t(s)] *= 0.5 + uni(rng);   // uneven information
        x.ra_rad = uni(rng) * 6.28;
        x.dec_rad = uni(rng) * 2 - 1;
        x.goal_fraction = 0.02 + 0.08 * uni(rng);
        t.push_back(x);
      }
      auto o = options(n);
      o.setup_s = 200 * uni(rng);
      o.min_block_slots = 1 + int(uni(rng) * 3);
      o.zero_baseline = trial % 2 ? ZeroBaseline::Free : ZeroBaseline::Calibrated;
      o.threads = 1;
      auto r1 = plan_schedule(t, o);
      o.threads = 2;
      auto r2 = plan_schedule(t, o);
      CHECK(schedule_problems(t, o, r1.plan.blocks).empty());
      CHECK(schedule_problems(t, o, r1.baseline.blocks).empty());
      CHECK_FALSE(r1.plan.objective < r1.baseline.objective);
      CHECK_FALSE(r1.plan.objective < r1.greedy.objective);
      REQUIRE(r1.plan.blocks.size() == r2.plan.blocks.size());
      for (std::size_t b = 0; b < r1.plan.blocks.size(); ++b) {
        CHECK(r1.plan.blocks[b].target == r2.plan.blocks[b].target);
        CHECK(r1.plan.blocks[b].first_slot == r2.plan.blocks[b].first_slot);
        CHECK(r1.plan.blocks[b].n_slots == r2.plan.blocks[b].n_slots);
      }
      CHECK(r1.plan.objective.met == r2.plan.objective.met);
      CHECK(r1.plan.objective.info == r2.plan.objective.info);
    }
  }

  TEST_CASE("nothing observable: empty plan") {
    std::vector<TargetSlots> t{flat_target(8, 0, 0, 10)};
    auto r = plan_schedule(t, options(8));
    CHECK(r.plan.blocks.empty());
    CHECK(std::isinf(r.plan.sigma_fraction[0]));
  }
}
