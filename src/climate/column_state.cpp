#include "bandstack/climate/column_state.hpp"

#include <algorithm>
#include <cmath>

#include "bandstack/atmosphere/humidity_profile.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::climate {

namespace {

// Value at x of the polynomial through the points (xs[j], ys[j]) (Lagrange form).
double lagrange(const double* xs, const double* ys, std::size_t count, double x) {
  double sum = 0.0;
  for (std::size_t j = 0; j < count; ++j) {
    double term = ys[j];
    for (std::size_t m = 0; m < count; ++m)
      if (m != j) term *= (x - xs[m]) / (xs[j] - xs[m]);
    sum += term;
  }
  return sum;
}

// Extrapolation in ln p from the `count` (<= 3) layers starting at `first` to pressure p_pa, kept
// within a factor 0.8-1.25 of the nearest layer.
double extrapolate(const atmosphere::Column& column, std::size_t first, std::size_t count, std::size_t nearest, double p_pa) {
  double xs[3], ys[3];
  for (std::size_t j = 0; j < count; ++j) {
    xs[j] = std::log(column.pressure_layer_pa[first + j]);
    ys[j] = column.temperature_layer_k[first + j];
  }
  const double t = column.temperature_layer_k[nearest];
  return std::clamp(lagrange(xs, ys, count, std::log(p_pa)), 0.8 * t, 1.25 * t);
}

} // namespace

void set_level_temperatures(atmosphere::Column& column, bool surface_air_is_skin) {
  const std::size_t n = column.layer_count();
  if (n == 0 || column.temperature_layer_k.size() != n || column.pressure_level_pa.size() != n + 1)
    throw InputError(InputPlace::of("temperature_layer"), "column needs N >= 1 layers with N layer temperatures and N+1 levels");
  const auto& p = column.pressure_layer_pa;
  const auto& t = column.temperature_layer_k;
  auto& level = column.temperature_level_k;
  level.resize(n + 1);
  for (std::size_t k = 1; k < n; ++k) {
    const double w = std::log(column.pressure_level_pa[k] / p[k - 1]) / std::log(p[k] / p[k - 1]);
    level[k] = t[k - 1] + w * (t[k] - t[k - 1]);
  }
  // The top level is isothermal with the top layer: extrapolating into the thin upper layers, where
  // the Newton steps are largest, made the source there swing wildly.
  level[0] = t[0];
  // The surface level by quadratic extrapolation: a linear one leaves an O(dlnp^2) mismatch that the
  // equilibrium answers with a layer-to-layer zigzag (levels averaging two layers hardly see it).
  const std::size_t count = std::min<std::size_t>(n, 3);
  level[n] = surface_air_is_skin ? column.surface_temperature_k
                                 : extrapolate(column, n - count, count, n - 1, column.pressure_level_pa[n]);
}

void update_water(atmosphere::Column& column, const WaterSettings& water) {
  if (!std::isfinite(water.h2o_scale) || water.h2o_scale < 0.0)
    throw InputError(InputPlace::of("h2o_scale"), "must be finite and >= 0");
  if (water.treatment != WaterTreatment::fixed_relative_humidity) return;
  const std::size_t n = column.layer_count();
  if (n == 0 || column.temperature_layer_k.size() != n || column.pressure_level_pa.size() != n + 1)
    throw InputError(InputPlace::of("temperature_layer"), "column needs N >= 1 layers with N layer temperatures and N+1 levels");
  const auto& t = column.temperature_layer_k;
  const std::size_t cold_point = static_cast<std::size_t>(std::min_element(t.begin(), t.end()) - t.begin());
  auto& h2o = column.gas(Gas::h2o);
  h2o = atmosphere::water_vapour_mole_fraction(column.pressure_layer_pa, t, column.pressure_level_pa[n],
                                               water.surface_relative_humidity, column.pressure_layer_pa[cold_point],
                                               water.stratospheric_mole_fraction);
  // The troposphere is the cold point and the layers below it (water_vapour_mole_fraction takes
  // layer pressures >= the tropopause pressure as tropospheric); the stratospheric value stays.
  if (water.h2o_scale != 1.0)
    for (std::size_t i = cold_point; i < n; ++i) h2o[i] *= water.h2o_scale;
}

} // namespace bandstack::climate
