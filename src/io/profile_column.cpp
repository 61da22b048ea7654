// Levels for the layers of a profile file (docs/profile-file.md, "Levels").
#include "io/profile_column.hpp"

#include "bandstack/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>

namespace bandstack::io::detail {

namespace {

// Linear in ln p through (p1, t1) and (p2, t2), evaluated at p.
double log_linear(double p1, double t1, double p2, double t2, double p) {
  return t1 + (t2 - t1) * std::log(p / p1) / std::log(p2 / p1);
}

} // namespace

atmosphere::Column make_column(ColumnLayers layers, const ProfileDefaults& defaults, const InputPlace& where,
                               const std::string& surface_pressure_item) {
  const std::size_t n = layers.pressure_pa.size();
  BANDSTACK_ASSERT(n >= 2 && layers.temperature_k.size() == n);
  const std::vector<double>& p = layers.pressure_pa;
  const std::vector<double>& t = layers.temperature_k;

  atmosphere::Column column;
  column.pressure_level_pa.resize(n + 1);
  column.temperature_level_k.resize(n + 1);
  for (std::size_t i = 1; i < n; ++i) {
    column.pressure_level_pa[i] = std::sqrt(p[i - 1] * p[i]);
    // Midway in ln p, so linear interpolation in ln p is the mean of the two layers' temperatures.
    column.temperature_level_k[i] = 0.5 * (t[i - 1] + t[i]);
  }
  // Above the top layer by half the top spacing in ln p, p0 (p0/p1)^(1/2), floored at 1e-3 Pa (a
  // coarse top spacing would otherwise put the top level at a meaninglessly small pressure).
  const double top = p[0] * std::sqrt(p[0] / p[1]);
  column.pressure_level_pa[0] = std::max(top, std::min(min_top_level_pressure_pa, 0.5 * p[0]));
  column.temperature_level_k[0] = t[0];

  const double lowest = p[n - 1];
  if (layers.surface_pressure_pa) {
    if (!(*layers.surface_pressure_pa > lowest)) {
      InputPlace place = where;
      place.item = surface_pressure_item;
      throw InputError(place,
                       fmt::format("surface pressure {} Pa must be greater than the lowest layer's pressure {} Pa",
                                   *layers.surface_pressure_pa, lowest));
    }
    column.pressure_level_pa[n] = *layers.surface_pressure_pa;
  } else {
    column.pressure_level_pa[n] = lowest * std::sqrt(lowest / p[n - 2]);
  }
  column.temperature_level_k[n] = layers.surface_temperature_k
                                      ? *layers.surface_temperature_k
                                      : log_linear(p[n - 2], t[n - 2], lowest, t[n - 1], column.pressure_level_pa[n]);
  column.surface_temperature_k = column.temperature_level_k[n];

  column.pressure_layer_pa = std::move(layers.pressure_pa);
  column.temperature_layer_k = std::move(layers.temperature_k);
  column.mole_fraction = std::move(layers.mole_fraction);
  column.surface_emissivity = defaults.surface_emissivity;
  column.surface_albedo = defaults.surface_albedo;
  return column;
}

} // namespace bandstack::io::detail
