// Whole runs (batch::run_study: build, compute, stream into the result file) of swept studies with
// the default band sets (default_lw, default_sw, 60 layers): columns per second with and without an
// [equilibrium], on 1 and 2 threads, for 1,000 and 10,000 columns (issue targets: 2 threads >= 1.8x
// one thread for 1,000 columns; parallel efficiency >= 90 % on 2 cores). Flux-only runs are bound by
// writing the result (54 kB per column); runs with an equilibrium per column are compute-bound.
// Peak memory against the column count is measured by benchmarks/batch_memory.py (separate processes).
#include <benchmark/benchmark.h>

#include <filesystem>
#include <string>
#include <unistd.h>

#include <fmt/format.h>

#include "bandstack/batch/run.hpp"

namespace {

using namespace bandstack;

// A study of `count` columns: one tropical column with CO2 swept; with a radiative-convective
// equilibrium (Manabe & Wetherald 1967 settings) when asked.
io::Study swept_study(std::size_t count, bool equilibrium) {
  std::string text = fmt::format(R"toml(
title = "batch benchmark (invented scenario)"
[[sweeps]]
key = "co2_ppmv"
from = 200
to = 1200
count = {}
[[columns]]
name = "bench"
profile = "tropical"
[output]
file = "batch_bench.nc"
)toml",
                                 count);
  if (equilibrium)
    text += "[equilibrium]\nconvection = \"fixed_lapse_rate\"\ncritical_lapse_rate_k_per_km = 6.5\n"
            "water = \"fixed_relative_humidity\"\nsurface_temperature = \"energy_balance\"\n";
  return io::parse_study(text, "batch_bench.toml");
}

void run(benchmark::State& state, bool equilibrium) {
  const std::size_t columns = static_cast<std::size_t>(state.range(0));
  const io::Study study = swept_study(columns, equilibrium);
  batch::RunOptions options;
  options.threads = static_cast<std::size_t>(state.range(1));
  options.output_directory = std::filesystem::temp_directory_path() / fmt::format("bandstack_batch_bench_{}", ::getpid());
  options.resume = false;
  std::filesystem::create_directories(options.output_directory);
  for (auto _ : state) benchmark::DoNotOptimize(batch::run_study(study, options).column_count);
  state.counters["columns_per_s"] = benchmark::Counter(static_cast<double>(columns * state.iterations()), benchmark::Counter::kIsRate);
  std::filesystem::remove_all(options.output_directory);
}

void BM_RunColumns(benchmark::State& state) { run(state, false); }
void BM_RunEquilibriumColumns(benchmark::State& state) { run(state, true); }

} // namespace

BENCHMARK(BM_RunColumns)->Args({1000, 1})->Args({1000, 2})->Unit(benchmark::kMillisecond)->UseRealTime()->MinTime(2.0);
// The issue-8 batch: 10,000 columns with their result file, once each (a few seconds per run).
BENCHMARK(BM_RunColumns)->Args({10000, 1})->Args({10000, 2})->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);
BENCHMARK(BM_RunEquilibriumColumns)->Args({1000, 1})->Args({1000, 2})->Unit(benchmark::kMillisecond)->UseRealTime()->Iterations(1);
