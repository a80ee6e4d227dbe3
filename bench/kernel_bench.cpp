// The |V|^2 kernel (astro/disk_kernel.hpp): |V|^2 and d|V|^2/dtheta of the uniform and the linearly
// limb-darkened disk over 10^7 points x ~ U[0, 40] (the distribution of models.md §4.3), single thread,
// ns per element; the libm-based scalar path (astro::Model) for comparison; and the floor: as many
// multiply-adds per element as the kernel's J1 (astro::kBesselJ1MultiplyAdds) in a plain vectorised loop.
// Run: build-bench/bench/kernel_bench   (scripts/bench.sh runs everything)
#include <benchmark/benchmark.h>

#include <array>
#include <random>
#include <utility>
#include <vector>

#include "astro/disk_kernel.hpp"
#include "astro/models.hpp"

namespace {

using namespace siiplan::astro;

constexpr std::size_t kPoints = 10'000'000;

const std::vector<double>& points() {
  static const std::vector<double> x = [] {
    std::vector<double> v(kPoints);
    std::mt19937_64 rng(20261201);
    std::uniform_real_distribution<double> uni(0.0, 40.0);
    for (auto& e : v) e = uni(rng);
    return v;
  }();
  return x;
}

// items_per_second in the output; ns per element = 1e9 / items_per_second (scripts/bench.sh prints it).
void per_element(benchmark::State& state, std::size_t n) { state.SetItemsProcessed(state.iterations() * std::int64_t(n)); }

void Kernel(benchmark::State& state) {
  const auto law = state.range(0) == 0 ? DiskLaw::Uniform : DiskLaw::LinearLimbDarkened;
  const bool derivative = state.range(1) != 0;
  const auto& x = points();
  std::vector<double> v2(x.size()), d(derivative ? x.size() : 0);
  for (auto _ : state) {
    disk_vis2_x(law, 0.6, x, v2, d);
    benchmark::DoNotOptimize(v2.data());
    benchmark::DoNotOptimize(d.data());
    benchmark::ClobberMemory();
  }
  per_element(state, x.size());
  state.SetLabel(std::string(law == DiskLaw::Uniform ? "uniform disk" : "linear LD u=0.6") +
                 (derivative ? ", |V|^2 and d|V|^2/dtheta" : ", |V|^2 only"));
}

void KernelJ1(benchmark::State& state) {
  const auto& x = points();
  std::vector<double> j(x.size());
  for (auto _ : state) {
    bessel_j1_array(x, j);
    benchmark::DoNotOptimize(j.data());
    benchmark::ClobberMemory();
  }
  per_element(state, x.size());
  state.SetLabel("J1 alone");
}

// The scalar path the planner used before: astro::Model (glibc j0/j1 per point), |V|^2 and gradient.
void ScalarModel(benchmark::State& state) {
  const bool ld = state.range(0) != 0;
  const Model model = ld ? Model(ModelKind::LinearLD, {1.0, 0.6}) : Model(ModelKind::UniformDisk, {1.0});
  const auto& x = points();
  const std::size_t n = x.size() / 10;   // 10^6 points: the scalar path is slow
  std::array<double, 2> grad{};
  for (auto _ : state) {
    double sum = 0;
    for (std::size_t k = 0; k < n; ++k)   // theta = 1 rad, so u = x / pi gives x
      sum += model.vis2_and_gradient(x[k] / 3.141592653589793, 0.0, std::span<double>(grad.data(), ld ? 2 : 1)) + grad[0];
    benchmark::DoNotOptimize(sum);
  }
  per_element(state, n);
  state.SetLabel(ld ? "astro::Model linear LD (libm), |V|^2 and gradient" : "astro::Model uniform disk (libm), |V|^2 and gradient");
}

// The floor: kBesselJ1MultiplyAdds multiply-adds per element, as four independent Horner chains (the
// kernel evaluates several polynomials side by side), straight-line code the compiler vectorises.
template <std::size_t... I>
inline double chains(double x, std::index_sequence<I...>) {
  double a = x, b = x + 1.0, c = x + 2.0, d = x + 3.0;
  ((a = a * x + (0.5 + 1e-3 * double(I)), b = b * x - (0.25 + 1e-3 * double(I)), c = c * x + (0.125 - 1e-3 * double(I)),
    d = d * x - (0.0625 - 1e-3 * double(I))),
   ...);
  return (a + b) + (c + d);
}
constexpr std::size_t kChainLength = std::size_t(kBesselJ1MultiplyAdds) / 4;

__attribute__((target_clones("arch=x86-64-v4", "arch=x86-64-v3", "default"))) void floor_loop(const double* x, std::size_t n,
                                                                                            double* out) {
  for (std::size_t k = 0; k < n; ++k) out[k] = chains(x[k] * 0.01, std::make_index_sequence<kChainLength>());
}

void Floor(benchmark::State& state) {
  const auto& x = points();
  std::vector<double> out(x.size());
  for (auto _ : state) {
    floor_loop(x.data(), x.size(), out.data());
    benchmark::DoNotOptimize(out.data());
    benchmark::ClobberMemory();
  }
  per_element(state, x.size());
  state.counters["multiply_adds"] = double(4 * kChainLength);
  state.SetLabel("floor: the J1 approximation's multiply-adds, nothing else");
}

}  // namespace

BENCHMARK(Kernel)->Args({0, 0})->Args({0, 1})->Args({1, 0})->Args({1, 1})->Unit(benchmark::kMillisecond);
BENCHMARK(KernelJ1)->Unit(benchmark::kMillisecond);
BENCHMARK(Floor)->Unit(benchmark::kMillisecond);
BENCHMARK(ScalarModel)->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
