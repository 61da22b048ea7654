// Cost of the longwave kernel per layer and g-point: a 60-layer column solved for 128 g-points
// whose optical depths range from very thin to opaque, with 1 or 4 angles (or the diffusivity
// direction). Reports the cpu time per layer-g-point in the counter `time_per_layer_gpoint`.
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/longwave.hpp"

#include <benchmark/benchmark.h>
#include <cmath>
#include <vector>

namespace {

constexpr int layers = 60;
constexpr int gpoints = 128;

struct Problem {
  std::vector<std::vector<double>> tau;    // per g-point, per layer
  std::vector<std::vector<double>> source; // per g-point, per level
  std::vector<std::vector<double>> source_layer; // per g-point, per layer
  std::vector<double> source_surface;
};

Problem make_problem() {
  Problem p;
  for (int g = 0; g < gpoints; ++g) {
    // Column optical depths from 1e-4 to 1e4, spread over layers like pressure thickness.
    const double column_tau = std::pow(10.0, -4.0 + 8.0 * g / (gpoints - 1));
    const double weight = 1.0 / gpoints;
    std::vector<double> tau(layers), source(layers + 1), source_layer(layers);
    for (int k = 0; k <= layers; ++k) {
      const double s = static_cast<double>(k) / layers;
      const double t_k = 200.0 + 90.0 * s;
      source[k] = weight * 5.670374419e-8 * std::pow(t_k, 4) / 3.141592653589793;
      if (k > 0) {
        tau[k - 1] = column_tau * (s * s - std::pow(static_cast<double>(k - 1) / layers, 2));
        const double t_layer = t_k - 45.0 / layers;
        source_layer[k - 1] = weight * 5.670374419e-8 * std::pow(t_layer, 4) / 3.141592653589793;
      }
    }
    p.tau.push_back(tau);
    p.source.push_back(source);
    p.source_layer.push_back(source_layer);
    p.source_surface.push_back(weight * 5.670374419e-8 * std::pow(292.0, 4) / 3.141592653589793);
  }
  return p;
}

void run(benchmark::State& state, const bandstack::solvers::AngularQuadrature& angles) {
  const Problem p = make_problem();
  bandstack::solvers::LongwaveWorkspace workspace;
  std::vector<double> up(layers + 1), down(layers + 1), olr(gpoints);
  for (auto _ : state) {
    for (int g = 0; g < gpoints; ++g) {
      bandstack::solvers::longwave_fluxes(p.tau[g], p.source[g], p.source_layer[g], p.source_surface[g], 0.98, angles,
                                          up, down, workspace);
      olr[g] = up[0];
    }
    benchmark::DoNotOptimize(olr.data());
    benchmark::ClobberMemory();
  }
  // Inverted iteration-invariant rate: cpu time / (layers * g-points * iterations), in seconds
  // (printed with an SI prefix, e.g. "10.2ns").
  state.counters["time_per_layer_gpoint"] =
      benchmark::Counter(layers * gpoints, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
  state.counters["angles"] = static_cast<double>(angles.size());
  state.SetItemsProcessed(state.iterations() * layers * gpoints);
}

void BM_LongwaveKernel_Gauss(benchmark::State& state) {
  run(state, bandstack::solvers::gauss_quadrature(static_cast<int>(state.range(0))));
}
BENCHMARK(BM_LongwaveKernel_Gauss)->Arg(1)->Arg(4)->Unit(benchmark::kMicrosecond);

void BM_LongwaveKernel_Diffusivity(benchmark::State& state) {
  run(state, bandstack::solvers::diffusivity_quadrature(1.66));
}
BENCHMARK(BM_LongwaveKernel_Diffusivity)->Unit(benchmark::kMicrosecond);

} // namespace
