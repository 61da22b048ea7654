#include "bandstack/core/constants.hpp"

#include <cmath>

#include <gtest/gtest.h>

namespace bandstack {
namespace {

using namespace constants;

// CODATA 2018 (NIST SP 961): the derived constants follow from the exact defining ones.
TEST(Constants, DerivedFromDefiningConstantsCodata2018) {
  const double sigma = 2.0 * std::pow(pi, 5) * std::pow(boltzmann_j_k, 4) /
                       (15.0 * std::pow(planck_j_s, 3) * std::pow(speed_of_light_m_s, 2));
  EXPECT_NEAR(sigma / stefan_boltzmann_w_m2_k4, 1.0, 1e-9);
  EXPECT_NEAR(planck_j_s * speed_of_light_m_s / boltzmann_j_k / second_radiation_m_k, 1.0, 1e-9);
  EXPECT_NEAR(avogadro_per_mol * boltzmann_j_k / molar_gas_j_mol_k, 1.0, 1e-9);
}

// U.S. Standard Atmosphere 1976: R* = 8.31432 J/(mol K) with M0 = 28.9644 g/mol gives
// R_d = 287.053 J/(kg K). With CODATA 2018 R the value is 287.058; both round to 287.05.
TEST(Constants, DryAirGasConstant) { EXPECT_NEAR(gas_constant_dry_air_j_kg_k, 287.05, 0.01); }

} // namespace
} // namespace bandstack
