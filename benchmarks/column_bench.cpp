// One full built-in column with the default band sets: longwave (default_lw, 3 Gauss angles, the
// study default), shortwave (default_sw), and both. Reports time per column and per
// column·layer·g-point, and the shortwave/longwave cost ratio per cell (issue target: <= 2).
#include <benchmark/benchmark.h>

#include "bandstack/atmosphere/atmosphere.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/band_shortwave.hpp"

namespace {

using namespace bandstack;

struct Fixture {
  atmosphere::Column column;
  spectral::BandSet lw_set = io::load_band_set("default_lw");
  spectral::BandSet sw_set = io::load_band_set("default_sw");
  solvers::BandOpticsTables lw_tables = solvers::make_band_optics_tables(lw_set);
  solvers::ShortwaveOpticsTables sw_tables = solvers::make_shortwave_optics_tables(sw_set);
  Fixture() {
    atmosphere::ProfileSettings s;
    s.profile = atmosphere::Profile::us_standard_1976;
    column = atmosphere::make_column(s, atmosphere::GridSpec{}, "bench"); // 60 layers
    column.sun = atmosphere::daily_mean_geometry(30.0, 80.0);
  }
};

const Fixture& fixture() {
  static const Fixture f;
  return f;
}

double longwave_seconds_per_cell = 0.0;

void BM_ColumnLongwave(benchmark::State& state) {
  const Fixture& f = fixture();
  const auto angles = solvers::gauss_quadrature(static_cast<int>(state.range(0)));
  solvers::BandLongwaveWorkspace ws;
  solvers::LongwaveResult r;
  for (auto _ : state) {
    solvers::solve_band_longwave(f.column, f.lw_tables, angles, {}, ws, r);
    benchmark::DoNotOptimize(r.flux_up.data());
  }
  const double cells = static_cast<double>(f.column.layer_count() * f.lw_set.gpoint_count());
  state.counters["per_cell_ns"] = benchmark::Counter(cells * static_cast<double>(state.iterations()),
                                                     benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
  state.counters["angles"] = static_cast<double>(state.range(0));
}
BENCHMARK(BM_ColumnLongwave)->Arg(1)->Arg(3)->Unit(benchmark::kMicrosecond);

void BM_ColumnShortwave(benchmark::State& state) {
  const Fixture& f = fixture();
  solvers::BandShortwaveWorkspace ws;
  solvers::ShortwaveResult r;
  for (auto _ : state) {
    solvers::solve_band_shortwave(f.column, f.sw_tables, {}, atmosphere::total_solar_irradiance_w_m2, ws, r);
    benchmark::DoNotOptimize(r.flux_up.data());
  }
  const double cells = static_cast<double>(f.column.layer_count() * f.sw_set.gpoint_count());
  state.counters["per_cell_ns"] = benchmark::Counter(cells * static_cast<double>(state.iterations()),
                                                     benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_ColumnShortwave)->Unit(benchmark::kMicrosecond);

void BM_ColumnBoth(benchmark::State& state) {
  const Fixture& f = fixture();
  const auto angles = solvers::gauss_quadrature(3);
  solvers::BandLongwaveWorkspace lw_ws;
  solvers::BandShortwaveWorkspace sw_ws;
  solvers::LongwaveResult lw;
  solvers::ShortwaveResult sw;
  for (auto _ : state) {
    solvers::solve_band_longwave(f.column, f.lw_tables, angles, {}, lw_ws, lw);
    solvers::solve_band_shortwave(f.column, f.sw_tables, {}, atmosphere::total_solar_irradiance_w_m2, sw_ws, sw);
    benchmark::DoNotOptimize(lw.flux_up.data());
    benchmark::DoNotOptimize(sw.flux_up.data());
  }
}
BENCHMARK(BM_ColumnBoth)->Unit(benchmark::kMicrosecond);

} // namespace
