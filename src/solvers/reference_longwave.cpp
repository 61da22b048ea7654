// GCC keeps floating-point selects out of vectorised loops while it assumes floating-point
// operations may trap (its default); bandstack never enables traps. See longwave_many.cpp.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/solvers/reference_longwave.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/longwave_many.hpp"
#include "solvers/vector_math.hpp"
#include "spectral/planck_detail.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <string>
#include <vector>

namespace bandstack::solvers {

namespace {

using spectral::Absorber;

// Points per chunk: large enough to amortise the per-call cost of the absorber source (its set-up
// per state), small enough to bound memory (the kernel keeps 2 x directions x layers x chunk
// doubles). 1024 was the fastest of 64..4096 in benchmarks/band_longwave_bench.cpp.
constexpr std::size_t chunk_points = 1024;

[[noreturn]] void fail(const char* item, const std::string& message) {
  InputPlace place;
  place.item = item;
  throw InputError(place, message);
}

void check_inputs(const spectral::WavenumberGrid& grid, std::span<const double> edges,
                  std::span<const double> emissivity) {
  if (grid.count == 0 || !(grid.step_cm1 > 0.0) || !std::isfinite(grid.step_cm1) || !(grid.start_cm1 >= 0.0) ||
      !std::isfinite(grid.end_cm1()))
    fail("wavenumber_grid", fmt::format("needs at least one interval, a finite start >= 0 and a step > 0 cm-1 (got "
                                        "start {}, step {}, {} intervals)",
                                        grid.start_cm1, grid.step_cm1, grid.count));
  if (edges.size() < 2) fail("band_edges", "needs at least two edges (one band)");
  for (std::size_t b = 0; b < edges.size(); ++b) {
    if (!std::isfinite(edges[b]) || edges[b] < 0.0) fail("band_edges", fmt::format("edge {} ({} cm-1) must be finite and >= 0", b, edges[b]));
    if (b > 0 && !(edges[b] > edges[b - 1]))
      fail("band_edges", fmt::format("edges must increase strictly: edge {} ({} cm-1) follows {} cm-1", b, edges[b], edges[b - 1]));
  }
  // The grid's own rounding (start + count * step) may overshoot an edge by a few ulp.
  const double slack = 1e-9 * grid.step_cm1;
  if (grid.start_cm1 < edges.front() - slack || grid.end_cm1() > edges.back() + slack)
    fail("wavenumber_grid", fmt::format("[{}, {}] cm-1 must lie within the band edges [{}, {}] cm-1", grid.start_cm1,
                                        grid.end_cm1(), edges.front(), edges.back()));
  const std::size_t n_band = edges.size() - 1;
  if (!emissivity.empty() && emissivity.size() != n_band)
    fail("surface_emissivity_by_band", fmt::format("has {} values, expected one per band ({})", emissivity.size(), n_band));
  for (std::size_t b = 0; b < emissivity.size(); ++b)
    if (!(emissivity[b] >= 0.0 && emissivity[b] <= 1.0))
      fail("surface_emissivity_by_band", fmt::format("band {}: emissivity {} must lie in [0, 1]", b, emissivity[b]));
}

// Planck radiance of each interval at temperature t_k: B_nu(nu_q) * d_nu. `weight` holds
// c1 nu^3 d_nu and `x_per_inverse_t` c2 nu for the chunk's points.
BANDSTACK_VECTOR_CLONES
void interval_planck(std::size_t count, const double* __restrict weight, const double* __restrict x_per_inverse_t,
                     double t_k, double* __restrict out) {
  const double inverse_t = 1.0 / t_k;
  for (std::size_t q = 0; q < count; ++q)
    out[q] = weight[q] / detail::vector_expm1(x_per_inverse_t[q] * inverse_t);
}

BANDSTACK_VECTOR_CLONES
void add_scaled(std::size_t count, double factor, const double* __restrict values, double* __restrict sum) {
  for (std::size_t q = 0; q < count; ++q)
    sum[q] += factor * values[q];
}

struct Scratch {
  std::vector<double> kappa, tau, source, source_layer, surface, emissivity, weight, x_per_inverse_t, up, down;
  std::vector<std::size_t> segment_band, segment_end; // bands met in a chunk and where each ends
  LongwaveManyWorkspace kernel;
};

} // namespace

LongwaveResult solve_reference_longwave(const atmosphere::Column& column, const spectral::AbsorberSource& source,
                                        const spectral::WavenumberGrid& grid, std::span<const double> band_edges_cm1,
                                        const AngularQuadrature& angles,
                                        std::span<const double> surface_emissivity_by_band) {
  atmosphere::validate(column);
  validate(angles);
  check_inputs(grid, band_edges_cm1, surface_emissivity_by_band);
  const std::size_t n = column.layer_count();
  const std::size_t levels = n + 1;
  const std::size_t n_band = band_edges_cm1.size() - 1;

  // Absorbers the source provides, with their amount per layer (as in the band optics).
  std::vector<Absorber> absorbers;
  std::vector<double> amount;
  for (Absorber a : spectral::all_absorbers) {
    if (!source.provides(a)) continue;
    std::vector<double> m = atmosphere::layer_gas_mass_kg_m2(column, spectral::absorber_gas(a));
    if (spectral::scales_with_vapour_pressure(a))
      for (std::size_t i = 0; i < n; ++i) m[i] *= column.gas(Gas::h2o)[i] * column.pressure_layer_pa[i];
    absorbers.push_back(a);
    amount.insert(amount.end(), m.begin(), m.end());
  }

  LongwaveResult result;
  result.band_lower_cm1.assign(band_edges_cm1.begin(), band_edges_cm1.end() - 1);
  result.band_upper_cm1.assign(band_edges_cm1.begin() + 1, band_edges_cm1.end());
  result.flux_up_by_band.assign(n_band * levels, 0.0);
  result.flux_down_by_band.assign(n_band * levels, 0.0);

  Scratch s;
  std::size_t band = 0;
  for (std::size_t first = 0; first < grid.count; first += chunk_points) {
    const std::size_t len = std::min(chunk_points, grid.count - first);
    const spectral::WavenumberGrid sub{grid.start_cm1 + static_cast<double>(first) * grid.step_cm1, grid.step_cm1, len};

    // Optical depths: every absorber once per layer state for the whole chunk.
    s.tau.assign(n * len, 0.0);
    s.kappa.resize(len);
    for (std::size_t ai = 0; ai < absorbers.size(); ++ai)
      for (std::size_t i = 0; i < n; ++i) {
        const double m = amount[ai * n + i];
        if (m == 0.0) continue;
        try {
          source.absorption(absorbers[ai], spectral::AbsorberState{column.pressure_layer_pa[i], column.temperature_layer_k[i]},
                            sub, s.kappa);
        } catch (const InputError& e) {
          InputPlace place;
          place.item = std::string(spectral::absorber_name(absorbers[ai])) + " absorption";
          place.level = static_cast<long>(i);
          throw InputError(place, fmt::format("layer {} ({} Pa, {} K): {}", i, column.pressure_layer_pa[i],
                                              column.temperature_layer_k[i], e.what()));
        }
        add_scaled(len, m, s.kappa.data(), s.tau.data() + i * len);
      }

    // Planck radiances of the intervals (midpoint rule) at the levels, layers and surface, and the
    // emissivity of their bands.
    s.weight.resize(len);
    s.x_per_inverse_t.resize(len);
    s.emissivity.resize(len);
    for (std::size_t q = 0; q < len; ++q) {
      const double nu = sub.at(q);
      s.weight[q] = spectral::detail::radiance_factor * nu * nu * nu * grid.step_cm1;
      s.x_per_inverse_t[q] = spectral::detail::second_radiation_cm_k * nu;
    }
    s.source.resize(levels * len);
    s.surface.resize(len);
    for (std::size_t k = 0; k < levels; ++k)
      interval_planck(len, s.weight.data(), s.x_per_inverse_t.data(), column.temperature_level_k[k],
                      s.source.data() + k * len);
    s.source_layer.resize(n * len);
    for (std::size_t i = 0; i < n; ++i)
      interval_planck(len, s.weight.data(), s.x_per_inverse_t.data(), column.temperature_layer_k[i],
                      s.source_layer.data() + i * len);
    interval_planck(len, s.weight.data(), s.x_per_inverse_t.data(), column.surface_temperature_k, s.surface.data());

    // Band of each point: the midpoints increase, so the band index only moves forward.
    s.segment_band.clear();
    s.segment_end.clear();
    for (std::size_t q = 0; q < len; ++q) {
      const double nu = sub.at(q);
      while (band + 1 < n_band && nu >= band_edges_cm1[band + 1]) ++band;
      if (s.segment_band.empty() || s.segment_band.back() != band) {
        if (!s.segment_band.empty()) s.segment_end.push_back(q);
        s.segment_band.push_back(band);
      }
      s.emissivity[q] = surface_emissivity_by_band.empty() ? column.surface_emissivity : surface_emissivity_by_band[band];
    }
    s.segment_end.push_back(len);

    s.up.resize(levels * len);
    s.down.resize(levels * len);
    longwave_fluxes_many(len, s.tau, s.source, s.source_layer, s.surface, s.emissivity, angles, s.up, s.down,
                         s.kernel);

    // Chunk sums per band segment, then added to the band totals: a fixed order.
    std::size_t begin = 0;
    for (std::size_t seg = 0; seg < s.segment_band.size(); ++seg) {
      const std::size_t b = s.segment_band[seg], end = s.segment_end[seg];
      for (std::size_t k = 0; k < levels; ++k) {
        double sum_up = 0.0, sum_down = 0.0;
        for (std::size_t q = begin; q < end; ++q) {
          sum_up += s.up[k * len + q];
          sum_down += s.down[k * len + q];
        }
        result.flux_up_by_band[b * levels + k] += sum_up;
        result.flux_down_by_band[b * levels + k] += sum_down;
      }
      begin = end;
    }
  }
  finish_longwave_result(column, result);
  return result;
}

} // namespace bandstack::solvers
