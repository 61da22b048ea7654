#include "bandstack/atmosphere/tropopause.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <vector>

namespace bandstack::atmosphere {

namespace {

// WMO (1957) thresholds (from memory, as restated in Holton, An Introduction to Dynamic Meteorology).
constexpr double critical_lapse_rate_k_m = 2e-3;
constexpr double test_depth_m = 2000.0;

void check(const Column& column) {
  const std::size_t n = column.layer_count();
  if (n < 3)
    throw InputError(InputPlace::of("pressure_layer"),
                     fmt::format("the tropopause needs a column of at least 3 layers, got {}", n));
  if (column.pressure_level_pa.size() != n + 1 || column.temperature_layer_k.size() != n)
    throw InputError(InputPlace::of("temperature_layer"), "column needs N layer temperatures and N+1 level pressures");
  if (!(std::isfinite(column.gravity_m_s2) && column.gravity_m_s2 > 0.0))
    throw InputError(InputPlace::of("gravity"), "must be finite and > 0");
  for (std::size_t i = 0; i < n; ++i) {
    const double t = column.temperature_layer_k[i];
    if (!(std::isfinite(t) && t > 0.0))
      throw InputError(InputPlace::of("temperature_layer", i), fmt::format("{} K must be finite and > 0", t));
    const double above = column.pressure_level_pa[i], p = column.pressure_layer_pa[i];
    const double below = column.pressure_level_pa[i + 1];
    // The top level may be 0 Pa; every other pressure must be positive and in order.
    if (!(std::isfinite(p) && std::isfinite(below) && above >= 0.0 && above < p && p < below))
      throw InputError(
          InputPlace::of("pressure_layer", i),
          fmt::format("layer pressure {} Pa must lie strictly between its levels {} and {} Pa", p, above, below));
  }
}

// Heights (m above the surface level) of the layer centres, from the hypsometric equation with each
// layer's own temperature between its lower level and its centre (dry air).
std::vector<double> layer_heights_m(const Column& column) {
  const std::size_t n = column.layer_count();
  const double scale = constants::gas_constant_dry_air_j_kg_k / column.gravity_m_s2;
  std::vector<double> z(n);
  double z_below = 0.0; // height of level i+1
  for (std::size_t i = n; i-- > 0;) {
    const double h = scale * column.temperature_layer_k[i];
    z[i] = z_below + h * std::log(column.pressure_level_pa[i + 1] / column.pressure_layer_pa[i]);
    if (i > 0) z_below += h * std::log(column.pressure_level_pa[i + 1] / column.pressure_level_pa[i]);
  }
  return z;
}

} // namespace

std::size_t lapse_rate_tropopause_level(const Column& column) {
  check(column);
  const std::size_t n = column.layer_count();
  const auto& t = column.temperature_layer_k;
  const std::vector<double> z = layer_heights_m(column);
  // Lapse rate -dT/dz at level k (1..N-1), between the centres of layers k (below) and k-1 (above).
  const auto lapse = [&](std::size_t k) { return (t[k] - t[k - 1]) / (z[k - 1] - z[k]); };

  // "Decreases to 2 K/km": the search starts above the lowest level where the lapse rate exceeds
  // the threshold, so that a surface-based inversion (negative lapse rate) is not taken for the
  // tropopause.
  std::size_t k = n - 1;
  while (k >= 1 && lapse(k) <= critical_lapse_rate_k_m)
    --k;
  for (; k >= 1; --k) {
    if (lapse(k) > critical_lapse_rate_k_m) continue;
    // The candidate point is the centre of layer k, the base of the low-lapse-rate segment; the mean
    // lapse rate from it to every layer centre within the next 2 km must stay at or below 2 K/km.
    bool holds = true;
    for (std::size_t j = k; j-- > 0 && z[j] - z[k] <= test_depth_m;)
      if ((t[k] - t[j]) / (z[j] - z[k]) > critical_lapse_rate_k_m) {
        holds = false;
        break;
      }
    if (holds) return k;
  }
  const std::size_t coldest = static_cast<std::size_t>(std::min_element(t.begin(), t.end()) - t.begin());
  return std::clamp<std::size_t>(coldest, 1, n - 1);
}

} // namespace bandstack::atmosphere
