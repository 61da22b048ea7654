// Cost of the shortwave kernel (delta-Eddington layers + adding) for one 60-layer column and 128
// g-points, next to the longwave kernel (longwave_fluxes_many) on the same size, on one thread.
// Counters:
//   per_cell_ns             time per column x layer x g-point
//   longwave_per_cell_ns    the longwave kernel on the same cells (measured in the same run), with
//                           the angle set given by the argument: 0 = diffusivity (one direction),
//                           n = n Gauss angles (3 is the study-file default)
//   ratio_to_longwave       per_cell / longwave_per_cell (issue 4 target: <= 2)
// Inputs span what a shortwave band set produces: optical depths from 1e-4 to 1e2, single-scattering
// albedos from 0 to 1 (including both ends), asymmetry factors from 0 to 0.85.
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/longwave_many.hpp"
#include "bandstack/solvers/shortwave.hpp"

#include <algorithm>
#include <benchmark/benchmark.h>
#include <chrono>
#include <cmath>
#include <random>
#include <vector>

namespace {

namespace bs = bandstack::solvers;

constexpr std::size_t layers = 60;
constexpr std::size_t points = 128;
constexpr std::size_t cells = layers * points;
constexpr double cos_zenith = 0.5;

struct Problem {
  std::vector<double> tau, omega, g;          // [i * points + q]
  std::vector<double> toa, albedo_dir, albedo_dif;
  std::vector<double> up, direct, diffuse;    // [k * points + q]
};

Problem make_problem() {
  std::mt19937_64 rng(42);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  Problem p;
  for (std::size_t i = 0; i < layers; ++i)
    for (std::size_t q = 0; q < points; ++q) {
      p.tau.push_back(std::pow(10.0, -4.0 + 6.0 * unit(rng)));
      const double pick = unit(rng);
      p.omega.push_back(pick < 0.1 ? 0.0 : (pick < 0.2 ? 1.0 : unit(rng)));
      p.g.push_back(0.85 * unit(rng));
    }
  p.toa.assign(points, 1361.0 / points);
  p.albedo_dir.assign(points, 0.15);
  p.albedo_dif.assign(points, 0.2);
  p.up.resize((layers + 1) * points);
  p.direct.resize((layers + 1) * points);
  p.diffuse.resize((layers + 1) * points);
  return p;
}

// The longwave kernel's inputs on the same cells.
struct LongwaveProblem {
  std::vector<double> tau, source, source_layer, surface, emissivity, up, down;
};

LongwaveProblem make_longwave(const Problem& p) {
  LongwaveProblem l;
  l.tau = p.tau;
  l.source.resize((layers + 1) * points);
  for (std::size_t k = 0; k <= layers; ++k)
    for (std::size_t q = 0; q < points; ++q)
      l.source[k * points + q] = 50.0 + 0.5 * static_cast<double>(k);
  l.source_layer.resize(layers * points);
  for (std::size_t i = 0; i < layers; ++i)
    for (std::size_t q = 0; q < points; ++q)
      l.source_layer[i * points + q] = 50.25 + 0.5 * static_cast<double>(i);
  l.surface.assign(points, 85.0);
  l.emissivity.assign(points, 0.98);
  l.up.resize((layers + 1) * points);
  l.down.resize((layers + 1) * points);
  return l;
}

bs::AngularQuadrature angles_for(std::int64_t arg) {
  return arg == 0 ? bs::diffusivity_quadrature(1.66) : bs::gauss_quadrature(static_cast<int>(arg));
}

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

// Best of several timed batches, seconds per call.
template <class F>
double best_time(F&& call) {
  call();
  double best = 1e30;
  for (int batch = 0; batch < 7; ++batch) {
    const auto start = std::chrono::steady_clock::now();
    for (int r = 0; r < 50; ++r) call();
    best = std::min(best, seconds_since(start) / 50.0);
  }
  return best;
}

double longwave_seconds(std::int64_t arg, const Problem& p) {
  LongwaveProblem l = make_longwave(p);
  const bs::AngularQuadrature angles = angles_for(arg);
  bs::LongwaveManyWorkspace ws;
  return best_time([&] {
    bs::longwave_fluxes_many(points, l.tau, l.source, l.source_layer, l.surface, l.emissivity, angles, l.up, l.down,
                             ws);
    benchmark::DoNotOptimize(l.up.data());
    benchmark::ClobberMemory();
  });
}

void report(benchmark::State& state, double seconds, double lw_seconds) {
  const double n = static_cast<double>(cells);
  state.counters["per_cell_ns"] = 1e9 * seconds / n;
  state.counters["longwave_per_cell_ns"] = 1e9 * lw_seconds / n;
  state.counters["ratio_to_longwave"] = seconds / lw_seconds;
}

// All g-points at once (what the band solver calls).
void BM_ShortwaveMany(benchmark::State& state) {
  Problem p = make_problem();
  bs::ShortwaveWorkspace ws;
  auto call = [&] {
    bs::shortwave_fluxes_many(points, p.tau, p.omega, p.g, cos_zenith, p.toa, p.albedo_dir, p.albedo_dif, p.up,
                              p.direct, p.diffuse, ws);
    benchmark::DoNotOptimize(p.up.data());
    benchmark::ClobberMemory();
  };
  const double lw = longwave_seconds(state.range(0), p);
  call();
  const auto start = std::chrono::steady_clock::now();
  for (auto _ : state) call();
  report(state, seconds_since(start) / static_cast<double>(state.iterations()), lw);
}
BENCHMARK(BM_ShortwaveMany)->Arg(0)->Arg(3)->Unit(benchmark::kMicrosecond);

// One g-point at a time (shortwave_fluxes), for each of the 128 g-points.
void BM_ShortwaveOnePointAtATime(benchmark::State& state) {
  const Problem p = make_problem();
  std::vector<std::vector<double>> tau(points), omega(points), g(points);
  for (std::size_t q = 0; q < points; ++q)
    for (std::size_t i = 0; i < layers; ++i) {
      tau[q].push_back(p.tau[i * points + q]);
      omega[q].push_back(p.omega[i * points + q]);
      g[q].push_back(p.g[i * points + q]);
    }
  std::vector<double> up(layers + 1), direct(layers + 1), diffuse(layers + 1);
  bs::ShortwaveWorkspace ws;
  auto call = [&] {
    for (std::size_t q = 0; q < points; ++q) {
      bs::shortwave_fluxes(tau[q], omega[q], g[q], cos_zenith, p.toa[q], 0.15, 0.2, up, direct, diffuse, ws);
      benchmark::DoNotOptimize(up.data());
    }
    benchmark::ClobberMemory();
  };
  const double lw = longwave_seconds(state.range(0), p);
  call();
  const auto start = std::chrono::steady_clock::now();
  for (auto _ : state) call();
  report(state, seconds_since(start) / static_cast<double>(state.iterations()), lw);
}
BENCHMARK(BM_ShortwaveOnePointAtATime)->Arg(0)->Arg(3)->Unit(benchmark::kMicrosecond);

} // namespace
