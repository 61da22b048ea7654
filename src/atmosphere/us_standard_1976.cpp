#include "bandstack/atmosphere/us_standard_1976.hpp"

#include <array>
#include <cmath>
#include <string>

#include "bandstack/core/error.hpp"

namespace bandstack::atmosphere::us_standard_1976 {

namespace {

// U.S. Standard Atmosphere 1976, Table 4 (defining base heights and gradients of T_M), from memory;
// base temperatures follow from the gradients, base pressures from the hydrostatic equation below.
struct Layer {
  double base_height_m;
  double lapse_k_m; // dT_M/dH, positive when warming with height
};
constexpr std::array<Layer, 7> layers{{{0.0, -0.0065},
                                       {11000.0, 0.0},
                                       {20000.0, 0.001},
                                       {32000.0, 0.0028},
                                       {47000.0, 0.0},
                                       {51000.0, -0.0028},
                                       {71000.0, -0.002}}};
constexpr double top_height_m = 84852.0;

// g0 M0 / R*, K per m: the constant of the standard's hydrostatic pressure formulas.
constexpr double hydrostatic_k_m = gravity_m_s2 * molar_mass_air_kg_mol / gas_constant_j_mol_k;

struct Base {
  double height_m, temperature_k, pressure_pa, lapse_k_m;
};

constexpr std::size_t base_count = layers.size() + 1; // plus the isothermal extension above 84.852 km

double layer_pressure(const Base& b, double h) {
  const double dh = h - b.height_m;
  if (b.lapse_k_m == 0.0) return b.pressure_pa * std::exp(-hydrostatic_k_m * dh / b.temperature_k);
  const double t = b.temperature_k + b.lapse_k_m * dh;
  return b.pressure_pa * std::pow(b.temperature_k / t, hydrostatic_k_m / b.lapse_k_m);
}

// Layer bases from the definitions, recomputed per call (a few pow/exp; no global state).
std::array<Base, base_count> bases() {
  std::array<Base, base_count> out{};
  double t = sea_level_temperature_k;
  double p = sea_level_pressure_pa;
  for (std::size_t i = 0; i < layers.size(); ++i) {
    out[i] = {layers[i].base_height_m, t, p, layers[i].lapse_k_m};
    const double next_h = (i + 1 < layers.size()) ? layers[i + 1].base_height_m : top_height_m;
    p = layer_pressure(out[i], next_h);
    t += layers[i].lapse_k_m * (next_h - layers[i].base_height_m);
  }
  out[layers.size()] = {top_height_m, t, p, 0.0};
  return out;
}

std::size_t layer_of_height(const std::array<Base, base_count>& b, double h) {
  std::size_t i = 0;
  while (i + 1 < b.size() && h >= b[i + 1].height_m) ++i;
  return i;
}

void require_finite(const char* item, double value) {
  if (!std::isfinite(value)) {
    InputPlace place;
    place.item = item;
    throw InputError(place, "must be finite, got " + std::to_string(value));
  }
}

} // namespace

double temperature_k(double geopotential_height_m) {
  require_finite("geopotential_height", geopotential_height_m);
  const auto b = bases();
  const Base& base = b[layer_of_height(b, geopotential_height_m)];
  return base.temperature_k + base.lapse_k_m * (geopotential_height_m - base.height_m);
}

double pressure_pa(double geopotential_height_m) {
  require_finite("geopotential_height", geopotential_height_m);
  const auto b = bases();
  return layer_pressure(b[layer_of_height(b, geopotential_height_m)], geopotential_height_m);
}

double geopotential_height_m(double pressure_pa) {
  if (!std::isfinite(pressure_pa) || !(pressure_pa > 0.0)) {
    InputPlace place;
    place.item = "pressure";
    throw InputError(place, "must be finite and > 0 Pa, got " + std::to_string(pressure_pa));
  }
  const auto b = bases();
  std::size_t i = 0;
  while (i + 1 < b.size() && pressure_pa <= b[i + 1].pressure_pa) ++i;
  const Base& base = b[i];
  // Analytic inverses of layer_pressure: isothermal and constant-gradient layers.
  if (base.lapse_k_m == 0.0)
    return base.height_m + base.temperature_k / hydrostatic_k_m * std::log(base.pressure_pa / pressure_pa);
  const double t = base.temperature_k * std::pow(pressure_pa / base.pressure_pa, -base.lapse_k_m / hydrostatic_k_m);
  return base.height_m + (t - base.temperature_k) / base.lapse_k_m;
}

double temperature_at_pressure_k(double pressure_pa) { return temperature_k(geopotential_height_m(pressure_pa)); }

double geopotential_from_geometric_m(double geometric_height_m) {
  require_finite("geometric_height", geometric_height_m);
  return earth_radius_m * geometric_height_m / (earth_radius_m + geometric_height_m);
}

double geometric_from_geopotential_m(double geopotential_height_m) {
  require_finite("geopotential_height", geopotential_height_m);
  return earth_radius_m * geopotential_height_m / (earth_radius_m - geopotential_height_m);
}

} // namespace bandstack::atmosphere::us_standard_1976
