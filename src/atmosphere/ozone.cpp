#include "bandstack/atmosphere/ozone.hpp"

#include <cmath>
#include <string>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::atmosphere {

namespace {

[[noreturn]] void bad(const char* item, const std::string& message) { throw InputError(InputPlace::of(item), message); }

void check(const GreenOzone& o) {
  if (!std::isfinite(o.total_column_cm_ntp) || o.total_column_cm_ntp < 0.0)
    bad("ozone_total_column", "must be finite and >= 0 cm NTP, got " + std::to_string(o.total_column_cm_ntp));
  if (!std::isfinite(o.peak_altitude_m) || !(o.peak_altitude_m > 0.0))
    bad("ozone_peak_altitude", "must be finite and > 0 m, got " + std::to_string(o.peak_altitude_m));
  if (!std::isfinite(o.shape_length_m) || !(o.shape_length_m > 0.0))
    bad("ozone_shape_length", "must be finite and > 0 m, got " + std::to_string(o.shape_length_m));
}

double molar_mass_moist_air(double water_mole_fraction) {
  return (1.0 - water_mole_fraction) * constants::molar_mass_dry_air_kg_mol +
         water_mole_fraction * constants::molar_mass_h2o_kg_mol;
}

} // namespace

double green_ozone_above_cm(double altitude_m, const GreenOzone& ozone) {
  check(ozone);
  if (!std::isfinite(altitude_m)) bad("altitude", "must be finite, got " + std::to_string(altitude_m));
  const double b = ozone.peak_altitude_m;
  const double c = ozone.shape_length_m;
  const double arg = (altitude_m - b) / c;
  // exp overflows only far above any grid top (h - b > 700 c); the amount above is then 0.
  if (arg > 700.0) return 0.0;
  return ozone.total_column_cm_ntp * (1.0 + std::exp(-b / c)) / (1.0 + std::exp(arg));
}

std::vector<double> green_ozone_mole_fraction(const std::vector<double>& level_altitude_m,
                                              const std::vector<double>& level_pressure_pa,
                                              const std::vector<double>& layer_water_mole_fraction,
                                              double gravity_m_s2, double scale, const GreenOzone& ozone) {
  const std::size_t n = layer_water_mole_fraction.size();
  if (level_altitude_m.size() != n + 1)
    bad("level_altitude", "has " + std::to_string(level_altitude_m.size()) + " values, expected " + std::to_string(n + 1));
  if (level_pressure_pa.size() != n + 1)
    bad("pressure_level", "has " + std::to_string(level_pressure_pa.size()) + " values, expected " + std::to_string(n + 1));
  if (!std::isfinite(scale) || scale < 0.0) bad("ozone_scale", "must be finite and >= 0, got " + std::to_string(scale));
  if (!std::isfinite(gravity_m_s2) || !(gravity_m_s2 > 0.0)) bad("gravity", "must be finite and > 0 m s-2");

  std::vector<double> x(n);
  double u_above = green_ozone_above_cm(level_altitude_m[0], ozone);
  for (std::size_t i = 0; i < n; ++i) {
    const double u_below = green_ozone_above_cm(level_altitude_m[i + 1], ozone);
    if (!(level_altitude_m[i + 1] < level_altitude_m[i])) bad("level_altitude", "must decrease strictly downward");
    const double dp = level_pressure_pa[i + 1] - level_pressure_pa[i];
    if (!(dp > 0.0)) bad("pressure_level", "must increase strictly downward");
    // cm NTP -> molecules m-2 via the Loschmidt constant; moles of moist air per m2 = Δp / (g M).
    const double ozone_molecules = scale * (u_below - u_above) * 1e-2 * loschmidt_per_m3;
    const double air_molecules =
        dp / (gravity_m_s2 * molar_mass_moist_air(layer_water_mole_fraction[i])) * constants::avogadro_per_mol;
    x[i] = ozone_molecules / air_molecules;
    u_above = u_below;
  }
  return x;
}

double ozone_column_dobson(const Column& column) {
  const std::vector<double> air = layer_air_mass_kg_m2(column);
  const std::vector<double>& x_o3 = column.gas(Gas::o3);
  const std::vector<double>& x_h2o = column.gas(Gas::h2o);
  double molecules = 0.0;
  for (std::size_t i = 0; i < air.size(); ++i)
    molecules += x_o3[i] * air[i] / molar_mass_moist_air(x_h2o[i]) * constants::avogadro_per_mol;
  return molecules / molecules_per_m2_per_dobson;
}

} // namespace bandstack::atmosphere
