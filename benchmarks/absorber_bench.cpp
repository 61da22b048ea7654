// Absorber sources on the fine longwave grid (10-3000 cm-1 at 0.01 cm-1, 299,000 points): ns per
// grid point of one absorption() call, for the analytic recipe (per absorber) and for a
// cross-section file holding the same recipe (interpolation between table states).
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

#include <benchmark/benchmark.h>
#include <filesystem>
#include <string>
#include <vector>

namespace {

namespace bs = bandstack::spectral;

const bs::AnalyticAbsorber& analytic() {
  static const bs::AnalyticAbsorber a(
      bs::load_absorber_recipe(std::filesystem::path(__FILE__).parent_path().parent_path() / "bands" / "earth_idealised_absorbers.toml"));
  return a;
}

const bs::WavenumberGrid& fine_grid() {
  static const bs::WavenumberGrid g = bs::make_wavenumber_grid(10.0, 3000.0, 0.01);
  return g;
}

void per_point(benchmark::State& state, const bs::AbsorberSource& source, bs::Absorber a) {
  const bs::WavenumberGrid& g = fine_grid();
  std::vector<double> out(g.count);
  double p = 30000.0;
  for (auto _ : state) {
    source.absorption(a, bs::AbsorberState{p, 250.0}, g, out);
    benchmark::DoNotOptimize(out.data());
    p = p == 30000.0 ? 30001.0 : 30000.0; // a different state each call
  }
  // kIsRate | kInvert turns points per second into seconds per point (printed as e.g. "1.2n").
  state.counters["seconds_per_point"] = benchmark::Counter(
      static_cast<double>(state.iterations()) * static_cast<double>(g.count),
      benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}

void analytic_absorption(benchmark::State& state) {
  per_point(state, analytic(), static_cast<bs::Absorber>(state.range(0)));
  state.SetLabel(std::string(bs::absorber_name(static_cast<bs::Absorber>(state.range(0)))));
}
BENCHMARK(analytic_absorption)->DenseRange(0, bs::absorber_count - 1)->Unit(benchmark::kMicrosecond);

void cross_section_absorption(benchmark::State& state) {
  static const bs::CrossSectionAbsorber file = [] {
    const auto path = std::filesystem::temp_directory_path() / "bandstack_absorber_bench.nc";
    bs::write_cross_section_file(path, analytic(), fine_grid(), {1000.0, 10000.0, 50000.0, 101325.0}, {200.0, 300.0},
                                 "benchmark table");
    bs::CrossSectionAbsorber loaded(path);
    std::filesystem::remove(path);
    return loaded;
  }();
  per_point(state, file, bs::Absorber::h2o);
}
BENCHMARK(cross_section_absorption)->Unit(benchmark::kMicrosecond);

} // namespace
