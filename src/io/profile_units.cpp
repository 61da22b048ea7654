// The unit table of profile files (docs/profile-file.md, "Units").
#include "io/profile_units.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/units.hpp"

#include <algorithm>
#include <array>
#include <sstream>
#include <string_view>

namespace bandstack::io::detail {

namespace {

template <class Value, std::size_t N>
std::optional<Value> look_up(const std::array<std::pair<std::string_view, Value>, N>& table, const std::string& units) {
  const std::string key = canonical_units(units);
  const auto it = std::find_if(table.begin(), table.end(), [&](const auto& entry) { return entry.first == key; });
  if (it == table.end()) return std::nullopt;
  return it->second;
}

} // namespace

std::string canonical_units(const std::string& units) {
  std::string text;
  for (std::size_t i = 0; i < units.size(); ++i) {
    if (units[i] == '^') continue;
    if (units[i] == '*' && i + 1 < units.size() && units[i + 1] == '*') {
      ++i;
      continue;
    }
    text += units[i];
  }
  std::istringstream in(text);
  std::string word, out;
  while (in >> word)
    out += (out.empty() ? "" : " ") + word;
  return out;
}

std::optional<UnitConversion> pressure_units(const std::string& units) {
  static constexpr std::array<std::pair<std::string_view, UnitConversion>, 7> table{{
      {"Pa", {1.0, 0.0}},
      {"hPa", {units::pa_per_hpa, 0.0}},
      {"mbar", {units::pa_per_hpa, 0.0}}, // 1 mbar = 1 hPa
      {"mb", {units::pa_per_hpa, 0.0}},
      {"millibar", {units::pa_per_hpa, 0.0}},
      {"millibars", {units::pa_per_hpa, 0.0}}, // as some reanalysis files write their pressure levels
      {"kPa", {1000.0, 0.0}},
  }};
  return look_up(table, units);
}

std::optional<UnitConversion> temperature_units(const std::string& units) {
  static constexpr std::array<std::pair<std::string_view, UnitConversion>, 7> table{{
      {"K", {1.0, 0.0}},
      {"kelvin", {1.0, 0.0}},
      {"degC", {1.0, constants::zero_celsius_k}},
      {"degree_Celsius", {1.0, constants::zero_celsius_k}},
      {"degrees_Celsius", {1.0, constants::zero_celsius_k}},
      {"celsius", {1.0, constants::zero_celsius_k}},
      {"C", {1.0, constants::zero_celsius_k}},
  }};
  return look_up(table, units);
}

std::optional<AmountUnits> amount_units(const std::string& units) {
  static constexpr std::array<std::pair<std::string_view, AmountUnits>, 13> table{{
      {"kg kg-1", {1.0, AmountBasis::mass}},
      {"kg/kg", {1.0, AmountBasis::mass}},
      {"g kg-1", {1e-3, AmountBasis::mass}},
      {"g/kg", {1e-3, AmountBasis::mass}},
      {"mol mol-1", {1.0, AmountBasis::mole}},
      {"mol/mol", {1.0, AmountBasis::mole}},
      {"ppmv", {units::mole_fraction_per_ppmv, AmountBasis::mole}},
      {"ppm", {units::mole_fraction_per_ppmv, AmountBasis::mole}},
      {"1e-6", {units::mole_fraction_per_ppmv, AmountBasis::mole}},
      {"ppbv", {units::mole_fraction_per_ppbv, AmountBasis::mole}},
      {"ppb", {units::mole_fraction_per_ppbv, AmountBasis::mole}},
      {"1e-9", {units::mole_fraction_per_ppbv, AmountBasis::mole}},
      {"1", {1.0, AmountBasis::either}},
  }};
  return look_up(table, units);
}

} // namespace bandstack::io::detail
