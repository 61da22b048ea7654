#pragma once
// Private to io: the units a profile file may use (docs/profile-file.md, "Units"), converted to SI.
// A small fixed table instead of a units library: every spelling accepted is listed and tested.
#include <optional>
#include <string>

namespace bandstack::io::detail {

// A linear conversion to SI: si = value * factor + offset.
struct UnitConversion {
  double factor = 1.0;
  double offset = 0.0;
  [[nodiscard]] double apply(double value) const { return value * factor + offset; }
};

// What an amount of a gas is measured against: its mass (kg per kg of air), its moles (mol per mol of
// air), or either ("1": dimensionless, meaning only known from the standard_name).
enum class AmountBasis { mass, mole, either };

struct AmountUnits {
  double factor = 1.0; // to kg/kg (mass) or mol/mol (mole)
  AmountBasis basis = AmountBasis::either;
};

// Units text with blanks collapsed and the power signs "^" and "**" removed: "kg kg^-1" -> "kg kg-1".
[[nodiscard]] std::string canonical_units(const std::string& units);

// To Pa from Pa, hPa, mbar, mb, millibar, millibars, kPa; nullopt for anything else.
[[nodiscard]] std::optional<UnitConversion> pressure_units(const std::string& units);

// To K from K, kelvin, degC, degree_Celsius, degrees_Celsius, celsius, C; nullopt for anything else.
[[nodiscard]] std::optional<UnitConversion> temperature_units(const std::string& units);

// Amounts: kg kg-1, kg/kg, g kg-1, g/kg (mass); mol mol-1, mol/mol, ppmv, ppm, 1e-6, ppbv, ppb, 1e-9
// (mole); 1 (either). nullopt for anything else.
[[nodiscard]] std::optional<AmountUnits> amount_units(const std::string& units);

// The accepted spellings, for error messages.
inline constexpr const char* accepted_pressure_units =
    "\"Pa\", \"hPa\", \"mbar\", \"mb\", \"millibar\", \"millibars\" or \"kPa\"";
inline constexpr const char* accepted_temperature_units =
    "\"K\", \"kelvin\", \"degC\", \"degree_Celsius\", \"degrees_Celsius\", \"celsius\" or \"C\"";
inline constexpr const char* accepted_amount_units =
    "\"kg kg-1\", \"kg/kg\", \"g kg-1\", \"g/kg\" (mass based), \"mol mol-1\", \"mol/mol\", \"ppmv\", \"ppm\", "
    "\"1e-6\", \"ppbv\", \"ppb\", \"1e-9\" (mole based) or \"1\"";

} // namespace bandstack::io::detail
