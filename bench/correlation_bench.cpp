// Simulation and reduction of one night of correlation data: 4 telescopes (6 pairs) of the demo large
// array, 10 h of 1-s frames, 64 delay bins (216,000 frames x 64 bins), photon counting (instrument-small,
// Poisson accidentals) or analog (instrument-large, Gaussian noise). Run:
//   build-bench/bench/correlation_bench --benchmark_min_time=1
#include <benchmark/benchmark.h>

#include "astro/correlation_sim.hpp"
#include "astro/reduction.hpp"
#include "astro/units.hpp"
#include "io/instrument_io.hpp"
#include "io/site_io.hpp"

namespace {

using namespace siiplan;

struct Night {
  astro::Site site;
  astro::Instrument instrument;
  std::vector<astro::SimRun> runs;
};

Night night(bool photon_counting) {
  const std::string demo = SIIPLAN_DEMO_DIR;
  Night n;
  n.site = io::read_site(demo + "/site.ini");
  n.instrument = io::read_instrument(demo + (photon_counting ? "/instrument-small.ini" : "/instrument-large.ini"));
  auto tel = io::read_array(demo + "/array-large.csv", n.site);
  tel.resize(4);
  const astro::Model model(astro::ModelKind::UniformDisk, {0.5 * astro::kMasToRad});
  for (auto p : astro::all_pairs(tel.size())) {
    astro::SimRun r;
    r.meta.telescope_1 = tel[std::size_t(p.i)];
    r.meta.telescope_2 = tel[std::size_t(p.j)];
    r.meta.target_name = "bench star";
    r.meta.target_position = {120 * astro::kDegToRad, -60 * astro::kDegToRad, 0, 0};
    r.meta.expected_diameter_rad = model.diameter_rad();
    r.model = model;
    r.start_mjd = 61114.0;
    r.end_mjd = 61114.0 + 10.0 / 24.0;
    r.knot_mjd = {r.start_mjd};
    r.n_star_1 = r.n_star_2 = {2e-5};
    n.runs.push_back(r);
  }
  return n;
}

void Simulate(benchmark::State& state) {
  const Night n = night(state.range(0) == 1);
  astro::SimOptions so;
  for (auto _ : state) {
    auto set = astro::simulate_correlations(n.site, n.instrument, n.runs, so);
    benchmark::DoNotOptimize(set.runs.data());
  }
}
BENCHMARK(Simulate)->Arg(1)->Arg(0)->Unit(benchmark::kMillisecond);

void Reduce(benchmark::State& state) {
  const Night n = night(state.range(0) == 1);
  const auto set = astro::simulate_correlations(n.site, n.instrument, n.runs, astro::SimOptions{});
  for (auto _ : state) {
    auto red = astro::reduce_correlations(set, astro::ReduceOptions{}, astro::ZeroBaselineSpec{});
    benchmark::DoNotOptimize(red.points.data());
  }
}
BENCHMARK(Reduce)->Arg(1)->Arg(0)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
