#include "bandstack/core/error.hpp"

#include <gtest/gtest.h>

#include "bandstack/core/gas.hpp"
#include "bandstack/core/units.hpp"

namespace bandstack {
namespace {

TEST(InputError, NamesFileVariableAndPlace) {
  InputPlace place;
  place.file = "profiles.nc";
  place.item = "temperature";
  place.column_index = 3;
  place.level = 17;
  const InputError e(place, "value is NaN");
  EXPECT_STREQ(e.what(), "profiles.nc: 'temperature' (column 3, level 17): value is NaN");
  EXPECT_EQ(e.exit_code(), ExitCode::bad_input);
}

TEST(InputError, TextFileLineAndColumn) {
  InputPlace place;
  place.file = "study.toml";
  place.line = 12;
  place.column_in_line = 5;
  place.item = "grid.layers";
  EXPECT_STREQ(InputError(place, "expected a whole number").what(),
               "study.toml:12:5: 'grid.layers': expected a whole number");
}

TEST(InputError, WithoutPlaceIsJustTheMessage) { EXPECT_STREQ(InputError("plain").what(), "plain"); }

TEST(ErrorTree, ExitCodesAndBase) {
  EXPECT_EQ(FileError("out.nc", "not writable").exit_code(), ExitCode::bad_input);
  EXPECT_EQ(InternalError("bug").exit_code(), ExitCode::internal_error);
  EXPECT_EQ(static_cast<int>(ExitCode::bad_input), 2);
  EXPECT_THROW(throw InputError("x"), std::runtime_error);
}

TEST(Assert, ThrowsInternalError) {
  EXPECT_THROW(BANDSTACK_ASSERT(1 + 1 == 3), InternalError);
  EXPECT_NO_THROW(BANDSTACK_ASSERT(1 + 1 == 2));
}

TEST(Gas, NamesRoundTripAndMolarMasses) {
  for (Gas g : all_gases) EXPECT_EQ(gas_from_name(gas_name(g)), g);
  EXPECT_FALSE(gas_from_name("H2O").has_value());
  // IUPAC standard atomic weights (common practice): CO2 = 12.011 + 2 * 15.999 = 44.009 g/mol.
  EXPECT_NEAR(gas_molar_mass_kg_mol(Gas::co2), 44.009e-3, 1e-6);
  // H2O = 2 * 1.008 + 15.999 = 18.015 g/mol.
  EXPECT_NEAR(gas_molar_mass_kg_mol(Gas::h2o), 18.015e-3, 1e-6);
}

TEST(Units, Conversions) {
  EXPECT_DOUBLE_EQ(units::hpa_to_pa(1013.25), 101325.0);            // standard atmosphere, ISO 2533
  EXPECT_DOUBLE_EQ(units::celsius_to_kelvin(0.0), 273.15);          // SI definition of the Celsius scale
  EXPECT_DOUBLE_EQ(units::ppmv_to_mole_fraction(400.0), 400e-6);
  EXPECT_DOUBLE_EQ(units::wavenumber_cm1_to_wavelength_um(1000.0), 10.0);
}

} // namespace
} // namespace bandstack
