// Planck band integrals: ns per call of the fast series path against the Boost.Math quadrature
// reference. Each fast benchmark also times the reference (outside the measured loop) and
// reports reference_ns and speedup = reference_ns / fast_ns as counters.
#include "bandstack/spectral/planck.hpp"

#include <benchmark/benchmark.h>
#include <chrono>
#include <limits>

namespace {

namespace bs = bandstack::spectral;
using Clock = std::chrono::steady_clock;
constexpr double inf = std::numeric_limits<double>::infinity();

template <class F> double nanoseconds_per_call(F&& f, int calls) {
  const auto start = Clock::now();
  for (int i = 0; i < calls; ++i)
    benchmark::DoNotOptimize(f());
  return std::chrono::duration<double, std::nano>(Clock::now() - start).count() / calls;
}

void fast_band(benchmark::State& state, double nu1, double nu2, double t_k) {
  const double reference_ns =
      nanoseconds_per_call([&] { return bs::planck_band_radiance_reference(nu1, nu2, t_k); }, 200);
  const auto start = Clock::now();
  for (auto _ : state) {
    benchmark::DoNotOptimize(nu1);
    benchmark::DoNotOptimize(bs::planck_band_radiance(nu1, nu2, t_k));
  }
  const double fast_ns =
      std::chrono::duration<double, std::nano>(Clock::now() - start).count() / static_cast<double>(state.iterations());
  state.counters["fast_ns"] = fast_ns;
  state.counters["reference_ns"] = reference_ns;
  state.counters["speedup"] = reference_ns / fast_ns;
}

void reference_band(benchmark::State& state, double nu1, double nu2, double t_k) {
  for (auto _ : state) {
    benchmark::DoNotOptimize(nu1);
    benchmark::DoNotOptimize(bs::planck_band_radiance_reference(nu1, nu2, t_k));
  }
}

void fast_band_derivative(benchmark::State& state, double nu1, double nu2, double t_k) {
  for (auto _ : state) {
    benchmark::DoNotOptimize(nu1);
    benchmark::DoNotOptimize(bs::planck_band_radiance_derivative(nu1, nu2, t_k));
  }
}

void spectral_radiance(benchmark::State& state) {
  double nu = 667.5;
  for (auto _ : state) {
    benchmark::DoNotOptimize(nu);
    benchmark::DoNotOptimize(bs::planck_radiance(nu, 288.0));
  }
}

} // namespace

BENCHMARK_CAPTURE(fast_band, typical_500_600cm1_250K, 500.0, 600.0, 250.0);
BENCHMARK_CAPTURE(reference_band, typical_500_600cm1_250K, 500.0, 600.0, 250.0);
BENCHMARK_CAPTURE(fast_band, narrow_667_667p01cm1_288K, 667.0, 667.01, 288.0);
BENCHMARK_CAPTURE(reference_band, narrow_667_667p01cm1_288K, 667.0, 667.01, 288.0);
BENCHMARK_CAPTURE(fast_band, wide_10_3000cm1_288K, 10.0, 3000.0, 288.0);
BENCHMARK_CAPTURE(reference_band, wide_10_3000cm1_288K, 10.0, 3000.0, 288.0);
BENCHMARK_CAPTURE(fast_band, to_infinity_2000cm1_288K, 2000.0, inf, 288.0);
BENCHMARK_CAPTURE(reference_band, to_infinity_2000cm1_288K, 2000.0, inf, 288.0);
BENCHMARK_CAPTURE(fast_band_derivative, typical_500_600cm1_250K, 500.0, 600.0, 250.0);
BENCHMARK(spectral_radiance);
