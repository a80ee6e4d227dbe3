// Geometry of the planner's grid: (u,v) for N targets x M pairs x K times with the trigonometry taken
// once per (target, time) (astro::UvwProjection + astro::project_uv, what the planner does) versus once
// per pair (astro::uvw_from_xyz per pair, the previous planner loop); and the per-time ERFA context
// (astro::Epoch: eraApco13) versus the per-star transform that reuses it (Epoch::star: eraAtciq + eraAtioq).
// Run: build-bench/bench/geometry_bench   (scripts/bench.sh runs everything)
#include <benchmark/benchmark.h>

#include <random>
#include <vector>

#include "astro/geometry.hpp"
#include "astro/units.hpp"
#include "io/site_io.hpp"

namespace {

using namespace siiplan;

struct Grid {
  astro::BaselineArrays xyz;
  std::vector<astro::BaselineXyz> pairs;
  std::vector<double> ha, dec;   // [targets * times], [targets]
};

Grid make_grid(int n_targets, int n_telescopes, int n_times) {
  Grid g;
  std::mt19937_64 rng(50);
  std::uniform_real_distribution<double> uni(0, 1);
  std::vector<astro::Telescope> tel(static_cast<std::size_t>(n_telescopes));
  for (auto& t : tel) {
    t.east_m = 600 * (uni(rng) - 0.5);
    t.north_m = 600 * (uni(rng) - 0.5);
  }
  for (int i = 0; i < n_telescopes; ++i)
    for (int j = i + 1; j < n_telescopes; ++j) {
      g.pairs.push_back(astro::baseline_xyz(tel[std::size_t(i)], tel[std::size_t(j)], -27 * astro::kDegToRad));
      g.xyz.push_back(g.pairs.back());
    }
  for (int t = 0; t < n_targets; ++t) {
    g.dec.push_back(std::asin(-1 + 1.64 * uni(rng)));
    const double ha0 = astro::kTwoPi * uni(rng);
    for (int k = 0; k < n_times; ++k) g.ha.push_back(ha0 + k * 600 * astro::kEarthRotation_rad_per_s);
  }
  return g;
}

void set_counters(benchmark::State& state, const Grid& g, int n_targets, int n_times) {
  const double n = double(n_targets) * double(g.pairs.size()) * n_times;
  state.counters["uv_points"] = n;
  state.SetItemsProcessed(state.iterations() * std::int64_t(n));   // ns per (u,v) = 1e9 / items_per_second
}

// What the planner does: UvwProjection once per (target, time), then project_uv over all pairs.
void UvProjected(benchmark::State& state) {
  const int nt = int(state.range(0)), nk = int(state.range(2));
  const Grid g = make_grid(nt, int(state.range(1)), nk);
  std::vector<double> u(g.pairs.size()), v(g.pairs.size());
  for (auto _ : state) {
    for (int t = 0; t < nt; ++t)
      for (int k = 0; k < nk; ++k) {
        astro::project_uv(astro::UvwProjection(g.ha[std::size_t(t * nk + k)], g.dec[std::size_t(t)]), g.xyz, u, v);
        benchmark::DoNotOptimize(u.data());
        benchmark::DoNotOptimize(v.data());
      }
  }
  set_counters(state, g, nt, nk);
}

// The previous planner loop: uvw_from_xyz per pair (sin/cos of H and dec for every pair).
void UvPerPair(benchmark::State& state) {
  const int nt = int(state.range(0)), nk = int(state.range(2));
  const Grid g = make_grid(nt, int(state.range(1)), nk);
  std::vector<double> u(g.pairs.size()), v(g.pairs.size());
  for (auto _ : state) {
    for (int t = 0; t < nt; ++t)
      for (int k = 0; k < nk; ++k) {
        for (std::size_t p = 0; p < g.pairs.size(); ++p) {
          const astro::Uvw uvw = astro::uvw_from_xyz(g.pairs[p], g.ha[std::size_t(t * nk + k)], g.dec[std::size_t(t)]);
          u[p] = uvw.u_m;
          v[p] = uvw.v_m;
        }
        benchmark::DoNotOptimize(u.data());
        benchmark::DoNotOptimize(v.data());
      }
  }
  set_counters(state, g, nt, nk);
}

// One ERFA context per instant (eraApco13), built once per slot and shared by all targets.
void EpochContext(benchmark::State& state) {
  const auto site = io::read_site(std::string(SIIPLAN_DEMO_DIR) + "/site.ini");
  double jd = 0;
  for (auto _ : state) {
    astro::Epoch e(site, astro::JulianDate{2461114.5, jd});
    jd += 1e-3;
    benchmark::DoNotOptimize(e);
  }
  state.SetLabel("astro::Epoch (eraApco13) per instant");
}

// The per-star transform that reuses the context (eraAtciq + eraAtioq, twice with refraction).
void EpochStar(benchmark::State& state) {
  const auto site = io::read_site(std::string(SIIPLAN_DEMO_DIR) + "/site.ini");
  const astro::Epoch e(site, astro::JulianDate{2461114.5, 0.2});
  astro::SkyPosition pos;
  pos.dec_rad = -0.5;
  for (auto _ : state) {
    pos.ra_rad += 1e-3;
    benchmark::DoNotOptimize(e.star(pos));
  }
  state.SetLabel("Epoch::star per target and instant (context reused)");
}

}  // namespace

// N targets x M telescopes (M(M-1)/2 pairs) x K times
BENCHMARK(UvProjected)->Args({100, 50, 54})->Args({400, 50, 54})->Args({100, 25, 54})->Args({100, 50, 216})->Unit(benchmark::kMillisecond);
BENCHMARK(UvPerPair)->Args({100, 50, 54})->Unit(benchmark::kMillisecond);
BENCHMARK(EpochContext)->Unit(benchmark::kMicrosecond);
BENCHMARK(EpochStar)->Unit(benchmark::kMicrosecond);
BENCHMARK_MAIN();
