// The unit table of profile files (src/io/profile_units.hpp): every accepted spelling against
// textbook factors, and the spellings that must be refused.
#include "io/profile_units.hpp"

#include <gtest/gtest.h>
#include <string>

using namespace bandstack::io::detail;

namespace {

double to_pa(const std::string& units, double value) { return pressure_units(units)->apply(value); }
double to_k(const std::string& units, double value) { return temperature_units(units)->apply(value); }

} // namespace

TEST(ProfileUnits, Pressure) {
  EXPECT_EQ(to_pa("Pa", 500.0), 500.0);
  EXPECT_EQ(to_pa("hPa", 1.0), 100.0);       // hecto = 1e2 (SI Brochure 9th ed. Table 7)
  EXPECT_EQ(to_pa("mbar", 1.0), 100.0);      // 1 bar = 1e5 Pa (SI Brochure 9th ed. Table 8), milli = 1e-3
  EXPECT_EQ(to_pa("mb", 1013.25), 101325.0); // standard atmosphere 101325 Pa = 1013.25 hPa (3rd CGPM 1954)
  EXPECT_EQ(to_pa("millibar", 2.0), 200.0);
  EXPECT_EQ(to_pa("millibars", 2.0), 200.0);
  EXPECT_EQ(to_pa("kPa", 1.0), 1000.0);  // kilo = 1e3 (SI Brochure 9th ed. Table 7)
  EXPECT_EQ(to_pa(" hPa ", 1.0), 100.0); // surrounding blanks do not matter
  for (const char* refused : {"hpa", "Pascal", "bar", "atm", "psi", "Pa m", ""})
    EXPECT_FALSE(pressure_units(refused).has_value()) << refused;
}

TEST(ProfileUnits, Temperature) {
  EXPECT_EQ(to_k("K", 250.0), 250.0);
  EXPECT_EQ(to_k("kelvin", 250.0), 250.0);
  // t/°C = T/K − 273.15 (SI Brochure 9th ed. §2.3.1).
  for (const char* celsius : {"degC", "degree_Celsius", "degrees_Celsius", "celsius", "C"}) {
    EXPECT_EQ(to_k(celsius, 0.0), 273.15) << celsius;
    EXPECT_DOUBLE_EQ(to_k(celsius, -40.0), 233.15) << celsius;
  }
  for (const char* refused : {"degF", "F", "k", "Celsius degrees", "R", ""})
    EXPECT_FALSE(temperature_units(refused).has_value()) << refused;
}

TEST(ProfileUnits, Amounts) {
  const auto check = [](const std::string& units, double factor, AmountBasis basis) {
    const auto u = amount_units(units);
    ASSERT_TRUE(u.has_value()) << units;
    EXPECT_EQ(u->factor, factor) << units;
    EXPECT_EQ(u->basis, basis) << units;
  };
  check("kg kg-1", 1.0, AmountBasis::mass);
  check("kg/kg", 1.0, AmountBasis::mass);
  check("kg kg^-1", 1.0, AmountBasis::mass);
  check("kg kg**-1", 1.0, AmountBasis::mass);
  check("g kg-1", 1e-3, AmountBasis::mass); // 1 g = 1e-3 kg
  check("g/kg", 1e-3, AmountBasis::mass);
  check("mol mol-1", 1.0, AmountBasis::mole);
  check("mol/mol", 1.0, AmountBasis::mole);
  check("ppmv", 1e-6, AmountBasis::mole); // parts per million by volume = µmol/mol for an ideal gas (common practice)
  check("ppm", 1e-6, AmountBasis::mole);
  check("1e-6", 1e-6, AmountBasis::mole);
  check("ppbv", 1e-9, AmountBasis::mole);
  check("ppb", 1e-9, AmountBasis::mole);
  check("1e-9", 1e-9, AmountBasis::mole);
  check("1", 1.0, AmountBasis::either);
  for (const char* refused : {"%", "percent", "g/g", "kg m-3", "ppt", "mol m-3", ""})
    EXPECT_FALSE(amount_units(refused).has_value()) << refused;
}

TEST(ProfileUnits, CanonicalSpelling) {
  EXPECT_EQ(canonical_units("  kg   kg^-1 "), "kg kg-1");
  EXPECT_EQ(canonical_units("mol mol**-1"), "mol mol-1");
  EXPECT_EQ(canonical_units("K"), "K");
}
