// Building band sets from bands/ with the embedded analytic absorber recipe. The goal: the
// default set in under 10 s. Measured on one thread (tbb::task_arena(1)) and on all threads.
//
//   build/release/benchmarks/band_builder_bench
#include "bandstack/spectral/band_builder.hpp"

#include <benchmark/benchmark.h>
#include <filesystem>
#include <tbb/task_arena.h>

namespace {

namespace bs = bandstack::spectral;

std::filesystem::path bands_folder() { return std::filesystem::path(__FILE__).parent_path().parent_path() / "bands"; }

void build(benchmark::State& state, const char* recipe_file, int threads) {
  const bs::BuildRecipe recipe = bs::load_build_recipe(bands_folder() / recipe_file);
  const auto source = bs::open_absorber_source(recipe);
  tbb::task_arena arena(threads > 0 ? threads : tbb::task_arena::automatic);
  std::size_t gpoints = 0;
  for (auto _ : state) {
    arena.execute([&] {
      const bs::BandSet set = bs::build_band_set(recipe, *source);
      gpoints = set.gpoint_count();
      benchmark::DoNotOptimize(set.absorption_coefficient.data());
    });
  }
  const double points = (recipe.bands.back().upper_cm1 - recipe.bands.front().lower_cm1) / recipe.wavenumber_step_cm1;
  state.counters["gpoints"] = static_cast<double>(gpoints);
  state.counters["fine_grid_points"] = points;
  state.counters["tables"] = static_cast<double>(recipe.ref_pressure_pa.size() * recipe.ref_temperature_k.size());
}

void BM_BuildDefaultOneThread(benchmark::State& state) { build(state, "default_lw.toml", 1); }
void BM_BuildDefaultAllThreads(benchmark::State& state) { build(state, "default_lw.toml", 0); }
void BM_BuildFineOneThread(benchmark::State& state) { build(state, "fine_lw.toml", 1); }

BENCHMARK(BM_BuildDefaultOneThread)->Unit(benchmark::kSecond)->Iterations(2);
BENCHMARK(BM_BuildDefaultAllThreads)->Unit(benchmark::kSecond)->Iterations(2);
BENCHMARK(BM_BuildFineOneThread)->Unit(benchmark::kSecond)->Iterations(1);

} // namespace
