#include "bandstack/climate/perturbation.hpp"

#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"

namespace bandstack::climate {

namespace {

// "experiment 'name': message" (or just the message for an unnamed perturbation).
std::string named(const Perturbation& p, const std::string& message) {
  return p.name.empty() ? message : fmt::format("experiment '{}': {}", p.name, message);
}

void fail(const Perturbation& p, const std::string& item, const std::string& message) {
  throw InputError(InputPlace::of(item), named(p, message));
}

bool is_fraction(double x) { return x >= 0.0 && x < 1.0; } // false for NaN

} // namespace

void validate(const Perturbation& p, const WaterSettings& water) {
  for (std::size_t i = 0; i < p.gas_changes.size(); ++i) {
    const GasChange& change = p.gas_changes[i];
    const std::string item = fmt::format("gas_changes[{}]", i);
    const auto gas = gas_name(change.gas);
    switch (change.kind) {
    case GasChangeKind::scale:
      if (!std::isfinite(change.value) || change.value < 0.0)
        fail(p, item, fmt::format("scale factor of {} must be finite and >= 0, got {}", gas, change.value));
      break;
    case GasChangeKind::set:
      if (!is_fraction(change.value))
        fail(p, item, fmt::format("mole fraction of {} must be in [0, 1) mol/mol, got {}", gas, change.value));
      if (change.gas == Gas::h2o && water.treatment == WaterTreatment::fixed_relative_humidity)
        fail(p, item,
             "h2o cannot be set with water at fixed relative humidity (the relative humidity decides "
             "it); scale or remove it instead");
      break;
    case GasChangeKind::remove:
      break;
    }
  }
  if (!std::isfinite(p.insolation_scale) || p.insolation_scale < 0.0)
    fail(p, "insolation_scale", fmt::format("must be finite and >= 0, got {}", p.insolation_scale));
  if (p.surface_albedo && !(*p.surface_albedo >= 0.0 && *p.surface_albedo <= 1.0))
    fail(p, "surface_albedo", fmt::format("must be in [0, 1], got {}", *p.surface_albedo));
  if (p.stratospheric_h2o_mole_fraction && !is_fraction(*p.stratospheric_h2o_mole_fraction))
    fail(p, "stratospheric_h2o", fmt::format("must be in [0, 1) mol/mol, got {}", *p.stratospheric_h2o_mole_fraction));
}

void apply_perturbation(const Perturbation& p, std::size_t tropopause_level, atmosphere::Column& column,
                        WaterSettings& water) {
  validate(p, water);
  const std::size_t n = column.layer_count();
  if (p.stratospheric_h2o_mole_fraction && (tropopause_level < 1 || tropopause_level >= n))
    fail(p, "tropopause_level",
         fmt::format("must be in 1..{} for a column of {} layers, got {}", n - 1, n, tropopause_level));
  const bool relative_humidity = water.treatment == WaterTreatment::fixed_relative_humidity;
  for (const GasChange& change : p.gas_changes) {
    std::vector<double>& x = column.gas(change.gas);
    switch (change.kind) {
    case GasChangeKind::scale:
      for (double& v : x)
        v *= change.value;
      break;
    case GasChangeKind::set:
      x.assign(n, change.value);
      break;
    case GasChangeKind::remove:
      x.assign(n, 0.0);
      break;
    }
    if (change.gas == Gas::h2o && relative_humidity) {
      // The stratospheric value is scaled as well, so that the water the equilibrium re-evaluates
      // from the temperatures agrees with the column changed here.
      const double factor = change.kind == GasChangeKind::scale ? change.value : 0.0;
      water.h2o_scale *= factor;
      water.stratospheric_mole_fraction *= factor;
    }
  }
  column.sun.distance_factor *= p.insolation_scale;
  if (p.surface_albedo) column.surface_albedo = *p.surface_albedo;
  if (p.stratospheric_h2o_mole_fraction && relative_humidity) {
    // Where the equilibrium's own water rule puts the stratosphere (above the cold point), so that
    // the forcing and the new equilibrium see the same change.
    water.stratospheric_mole_fraction = *p.stratospheric_h2o_mole_fraction;
    update_water(column, water);
  } else if (p.stratospheric_h2o_mole_fraction) {
    std::vector<double>& h2o = column.gas(Gas::h2o);
    h2o.resize(n, 0.0);
    for (std::size_t i = 0; i < tropopause_level; ++i)
      h2o[i] = *p.stratospheric_h2o_mole_fraction;
    water.stratospheric_mole_fraction = *p.stratospheric_h2o_mole_fraction;
  }
}

std::optional<double> co2_doublings(const Perturbation& p) {
  if (p.gas_changes.empty() || p.removes_bands() || p.insolation_scale != 1.0 || p.surface_albedo ||
      p.stratospheric_h2o_mole_fraction)
    return std::nullopt;
  double factor = 1.0;
  for (const GasChange& change : p.gas_changes) {
    if (change.gas != Gas::co2 || change.kind != GasChangeKind::scale) return std::nullopt;
    factor *= change.value;
  }
  if (!(factor > 0.0) || factor == 1.0 || !std::isfinite(factor)) return std::nullopt;
  return std::log2(factor);
}

} // namespace bandstack::climate
