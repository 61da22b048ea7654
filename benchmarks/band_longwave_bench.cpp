// Cost of the band longwave solve (optics + fluxes + band sums + heating rates) on one thread for a
// 60-layer column and a synthetic band set of 128 g-points (16 bands x 8), 6 absorbers and a
// 20 x 15 (p, T) reference grid, against a "limit kernel" of the same size: for each direction and
// g-point, a vectorised t = exp(-tau/mu) over the layers, then the recurrence I = I t + s. Counters:
//   per_cell        time per column x layer x g-point (issue 3 target: <= 10 ns)
//   limit_per_cell  the same for the limit kernel, measured in the same run
//   ratio           per_cell / limit_per_cell (aim: <= 8)
// Also the line-resolved reference (60 layers, 10-3000 cm-1, 4 Gauss angles) in seconds per column
// at 1, 0.1 and 0.01 cm-1, with the embedded analytic recipe if it loads, else a synthetic source.
// Same compilation assumption as the library's kernels (see src/solvers/longwave_many.cpp), so
// that the limit kernel's exp loop vectorises as theirs do.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/reference_longwave.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "solvers/vector_math.hpp"

#include <algorithm>
#include <benchmark/benchmark.h>
#include <chrono>
#include <cmath>
#include <filesystem>
#include <memory>
#include <vector>

namespace {

namespace bs = bandstack::solvers;
namespace sp = bandstack::spectral;

constexpr std::size_t layers = 60;
constexpr std::size_t bands = 16;
constexpr std::size_t per_band = 8;
constexpr std::size_t gpoints = bands * per_band;

bandstack::atmosphere::Column bench_column() {
  bandstack::atmosphere::ProfileSettings settings;
  settings.profile = bandstack::atmosphere::Profile::midlatitude_summer;
  bandstack::atmosphere::GridSpec grid;
  grid.layers = layers;
  grid.top_pressure_pa = 10.0;
  return bandstack::atmosphere::make_column(settings, grid);
}

sp::BandSet bench_set() {
  sp::BandSet s;
  s.name = "benchmark";
  for (std::size_t b = 0; b < bands; ++b) {
    s.band_lower_cm1.push_back(10.0 + 186.875 * static_cast<double>(b));
    s.band_upper_cm1.push_back(10.0 + 186.875 * static_cast<double>(b + 1));
    for (std::size_t j = 0; j < per_band; ++j) {
      s.gpoint_band.push_back(b);
      s.gpoint_weight.push_back(1.0 / per_band);
    }
  }
  for (std::size_t p = 0; p < 20; ++p) s.ref_pressure_pa.push_back(1.0 * std::pow(1.1e5, static_cast<double>(p) / 19.0));
  for (std::size_t t = 0; t < 15; ++t) s.ref_temperature_k.push_back(150.0 + 15.0 * static_cast<double>(t));
  for (std::size_t t = 0; t < 61; ++t) s.planck_temperature_k.push_back(100.0 + 5.0 * static_cast<double>(t));
  const std::size_t n_p = 20, n_t = 15, n_pt = 61;
  // Column optical depths from about 1e-4 to 1e4 across the g-points of each band.
  const double base[sp::absorber_count] = {3e-2, 1e-1, 5e1, 3e1, 5e1, 1e-6};
  s.absorption_coefficient.resize(sp::absorber_count * gpoints * n_t * n_p);
  for (sp::Absorber a : sp::all_absorbers) {
    s.absorber_present[sp::index(a)] = true;
    for (std::size_t g = 0; g < gpoints; ++g)
      for (std::size_t t = 0; t < n_t; ++t)
        for (std::size_t p = 0; p < n_p; ++p)
          s.absorption_coefficient[((sp::index(a) * gpoints + g) * n_t + t) * n_p + p] =
              base[sp::index(a)] * std::pow(10.0, -3.0 + 6.0 * static_cast<double>(g % per_band) / (per_band - 1)) *
              (s.ref_pressure_pa[p] / 5e4) * (1.0 + 2e-3 * (s.ref_temperature_k[t] - 250.0));
  }
  s.planck_fraction.assign(gpoints * n_pt, 1.0 / per_band);
  return s;
}

bs::AngularQuadrature angles_for(std::int64_t arg) {
  return arg == 0 ? bs::diffusivity_quadrature(1.66) : bs::gauss_quadrature(static_cast<int>(arg));
}

// The limit kernel's data, in its natural layout (per g-point, per layer).
struct LimitProblem {
  std::vector<double> tau, source, t, up;
};

LimitProblem limit_problem(const bs::BandOptics& optics) {
  LimitProblem p;
  p.tau.resize(gpoints * layers);
  p.source.resize(gpoints * layers);
  p.t.resize(layers);
  p.up.resize(gpoints);
  for (std::size_t g = 0; g < gpoints; ++g)
    for (std::size_t i = 0; i < layers; ++i) {
      p.tau[g * layers + i] = optics.optical_depth[i * gpoints + g];
      p.source[g * layers + i] = optics.source_level[i * gpoints + g];
    }
  return p;
}

// Compiled like the library's kernels (BANDSTACK_VECTOR_CLONES), so both use the same instructions.
BANDSTACK_VECTOR_CLONES
void run_limit_kernel(LimitProblem& p, const bs::AngularQuadrature& angles) {
  for (std::size_t j = 0; j < angles.size(); ++j) {
    const double inv_mu = 1.0 / angles.mu[j];
    for (std::size_t g = 0; g < gpoints; ++g) {
      const double* tau = p.tau.data() + g * layers;
      const double* s = p.source.data() + g * layers;
      double* t = p.t.data();
      for (std::size_t i = 0; i < layers; ++i) t[i] = 1.0 + bs::detail::vector_expm1(-tau[i] * inv_mu);
      double radiance = 0.0;
      for (std::size_t i = 0; i < layers; ++i) radiance = radiance * t[i] + s[i];
      p.up[g] += angles.weight[j] * radiance;
    }
  }
}

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

// Best of several timed batches, seconds per call.
double time_limit_kernel(LimitProblem& p, const bs::AngularQuadrature& angles) {
  double best = 1e30;
  for (int batch = 0; batch < 7; ++batch) {
    const auto start = std::chrono::steady_clock::now();
    for (int r = 0; r < 200; ++r) {
      run_limit_kernel(p, angles);
      benchmark::DoNotOptimize(p.up.data());
      benchmark::ClobberMemory();
    }
    best = std::min(best, seconds_since(start) / 200.0);
  }
  return best;
}

void BM_BandLongwave(benchmark::State& state) {
  const auto column = bench_column();
  const auto tables = bs::make_band_optics_tables(bench_set());
  const auto angles = angles_for(state.range(0));
  bs::BandLongwaveWorkspace ws;
  bs::LongwaveResult result;
  bs::solve_band_longwave(column, tables, angles, {}, ws, result); // warm up, grow buffers
  LimitProblem limit = limit_problem(ws.optics);
  const double limit_seconds = time_limit_kernel(limit, angles);

  const auto start = std::chrono::steady_clock::now();
  for (auto _ : state) {
    bs::solve_band_longwave(column, tables, angles, {}, ws, result);
    benchmark::DoNotOptimize(result.flux_up.data());
  }
  const double seconds = seconds_since(start) / static_cast<double>(state.iterations());
  const double cells = static_cast<double>(layers * gpoints);
  state.counters["per_cell_ns"] = 1e9 * seconds / cells;
  state.counters["limit_per_cell_ns"] = 1e9 * limit_seconds / cells;
  state.counters["ratio"] = seconds / limit_seconds;
  state.counters["angles"] = static_cast<double>(angles.size());
}
BENCHMARK(BM_BandLongwave)->Arg(0)->Arg(1)->Arg(2)->Arg(4)->Unit(benchmark::kMicrosecond);

// The optics alone (tables to optical depths and Planck sources), per column x layer x g-point.
void BM_BandOptics(benchmark::State& state) {
  const auto column = bench_column();
  const auto tables = bs::make_band_optics_tables(bench_set());
  bs::BandOptics optics;
  bs::BandOpticsWorkspace ws;
  for (auto _ : state) {
    bs::compute_band_optics(column, tables, optics, ws);
    benchmark::DoNotOptimize(optics.optical_depth.data());
  }
  state.counters["per_cell"] = benchmark::Counter(static_cast<double>(layers * gpoints),
                                                  benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_BandOptics)->Unit(benchmark::kMicrosecond);

// The limit kernel on its own.
void BM_LimitKernel(benchmark::State& state) {
  const auto column = bench_column();
  const auto tables = bs::make_band_optics_tables(bench_set());
  bs::BandOptics optics;
  bs::BandOpticsWorkspace ws;
  bs::compute_band_optics(column, tables, optics, ws);
  LimitProblem limit = limit_problem(optics);
  const auto angles = angles_for(state.range(0));
  for (auto _ : state) {
    run_limit_kernel(limit, angles);
    benchmark::DoNotOptimize(limit.up.data());
    benchmark::ClobberMemory();
  }
  state.counters["per_cell"] = benchmark::Counter(static_cast<double>(layers * gpoints),
                                                  benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_LimitKernel)->Arg(0)->Arg(1)->Arg(2)->Arg(4)->Unit(benchmark::kMicrosecond);

// Six exponential bands and a continuum, in the spirit of the embedded recipe, for when the
// recipe file cannot be loaded.
class SyntheticSource : public sp::AbsorberSource {
public:
  [[nodiscard]] std::string description() const override { return "benchmark synthetic source"; }
  [[nodiscard]] bool provides(sp::Absorber) const override { return true; }
  void absorption(sp::Absorber a, const sp::AbsorberState& state, const sp::WavenumberGrid& grid,
                  std::span<double> out) const override {
    static constexpr double centre[] = {150.0, 667.5, 1042.0, 1306.0, 1285.0, 1000.0};
    static constexpr double width[] = {55.0, 10.2, 20.0, 25.0, 25.0, 1e9};
    static constexpr double strength[] = {165.0, 110.0, 300.0, 50.0, 50.0, 1e-7};
    const std::size_t k = sp::index(a);
    const double scale = a == sp::Absorber::h2o_self_continuum ? 1.0 : state.pressure_pa / 5e4;
    for (std::size_t q = 0; q < grid.count; ++q)
      out[q] = strength[k] * scale * std::exp(-std::abs(grid.at(q) - centre[k]) / width[k]);
  }
};

std::unique_ptr<sp::AbsorberSource> reference_source(bool& analytic) {
  try {
    const auto path = std::filesystem::path(__FILE__).parent_path().parent_path() / "bands" / "earth_idealised_absorbers.toml";
    auto source = std::make_unique<sp::AnalyticAbsorber>(sp::load_absorber_recipe(path));
    analytic = true;
    return source;
  } catch (const std::exception&) {
    analytic = false;
    return std::make_unique<SyntheticSource>();
  }
}

void BM_ReferenceLongwave(benchmark::State& state) {
  const double step = state.range(0) == 0 ? 1.0 : (state.range(0) == 1 ? 0.1 : 0.01);
  const auto column = bench_column();
  bool analytic = false;
  const auto source = reference_source(analytic);
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, step);
  const std::vector<double> edges{10.0, 350.0, 500.0, 630.0, 700.0, 820.0, 980.0, 1080.0, 1180.0, 1390.0, 1480.0,
                                  1800.0, 2080.0, 3000.0};
  const auto angles = bs::gauss_quadrature(4);
  for (auto _ : state) {
    auto r = bs::solve_reference_longwave(column, *source, grid, edges, angles);
    benchmark::DoNotOptimize(r.flux_up.data());
  }
  state.counters["step_cm1"] = step;
  state.counters["analytic_recipe"] = analytic ? 1.0 : 0.0;
  state.counters["per_point_layer_ns"] =
      benchmark::Counter(static_cast<double>(grid.count * layers),
                         benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_ReferenceLongwave)->Arg(0)->Arg(1)->Arg(2)->Iterations(2)->Unit(benchmark::kSecond);

} // namespace
