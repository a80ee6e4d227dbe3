// End-to-end planning benchmark: a synthetic catalog of 2,000 stars, a 50-telescope array (1,225 pairs),
// 10-minute slots, the demo site on the night of 2026-03-14 (plan_night: grid, per-target information,
// scheduler). Run:  build-bench/bench/night_bench --benchmark_min_time=1
// Memory: /usr/bin/time -v build-bench/bench/night_bench --benchmark_filter=NightPlan/2000/50/2
// Arguments: targets / telescopes / threads / slot length in s. The four single-thread cases 500/25/1/600,
// 2000/25/1/600, 500/50/1/600 and 500/25/1/150 vary targets, pairs (300 -> 1225) and slots (54 -> 218) by
// about 4x each; scripts/bench.sh fits the scaling exponents from them.
#include <benchmark/benchmark.h>

#include <random>

#include "astro/units.hpp"
#include "io/instrument_io.hpp"
#include "io/site_io.hpp"
#include "planner/night_plan.hpp"

namespace {

using namespace siiplan;

planner::NightInputs synthetic(int n_targets, int n_telescopes, int threads, double slot_s) {
  const std::string demo = SIIPLAN_DEMO_DIR;
  planner::NightInputs in;
  in.site = io::read_site(demo + "/site.ini");
  in.instrument = io::read_instrument(demo + "/instrument-large.ini");
  std::mt19937_64 rng(2000);
  std::uniform_real_distribution<double> uni(0, 1);
  for (int k = 0; k < n_telescopes; ++k) {   // a random layout within 600 m
    astro::Telescope t;
    t.name = "T" + std::to_string(k);
    t.east_m = 600 * (uni(rng) - 0.5);
    t.north_m = 600 * (uni(rng) - 0.5);
    t.diameter_m = 12;
    t.area_m2 = 100;
    in.telescopes.push_back(t);
  }
  for (int k = 0; k < n_targets; ++k) {   // uniform on the sky south of +40 deg, B = 1..6, 0.2..3 mas
    astro::Target t;
    t.name = "S" + std::to_string(k);
    t.position.ra_rad = astro::kTwoPi * uni(rng);
    t.position.dec_rad = std::asin(-1 + 1.64 * uni(rng));
    t.mag[std::size_t(astro::Band::B)] = 1 + 5 * uni(rng);
    t.model = astro::Model(astro::ModelKind::UniformDisk, {(0.2 + 2.8 * uni(rng)) * astro::kMasToRad});
    t.priority = 1 + int(3 * uni(rng));
    in.targets.push_back(t);
  }
  in.date = astro::CalendarDate{2026, 3, 14};
  in.constraints.slot_s = slot_s;
  in.constraints.min_block_s = 1200;
  in.threads = threads;
  return in;
}

void NightPlan(benchmark::State& state) {
  auto in = synthetic(int(state.range(0)), int(state.range(1)), int(state.range(2)), double(state.range(3)));
  std::size_t blocks = 0;
  int slots = 0;
  for (auto _ : state) {
    auto plan = planner::plan_night(in);
    blocks = plan.result.plan.blocks.size();
    slots = plan.grid.n_slots;
    benchmark::DoNotOptimize(blocks);
  }
  state.counters["blocks"] = double(blocks);
  state.counters["pairs"] = double(in.telescopes.size() * (in.telescopes.size() - 1) / 2);
  state.counters["slots"] = double(slots);
}

}  // namespace

BENCHMARK(NightPlan)
    ->Args({2000, 50, 1, 600})->Args({2000, 50, 2, 600})->Args({200, 4, 2, 600})
    ->Args({500, 25, 1, 600})->Args({2000, 25, 1, 600})->Args({500, 50, 1, 600})->Args({500, 25, 1, 150})
    ->Unit(benchmark::kMillisecond)->UseRealTime();
BENCHMARK_MAIN();
