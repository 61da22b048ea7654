#include "bandstack/core/gas.hpp"

#include "bandstack/core/constants.hpp"

namespace bandstack {

namespace {
constexpr std::array<std::string_view, gas_count> names{"h2o", "co2", "o3", "ch4", "n2o"};
constexpr std::array<double, gas_count> molar_masses{
    constants::molar_mass_h2o_kg_mol, constants::molar_mass_co2_kg_mol, constants::molar_mass_o3_kg_mol,
    constants::molar_mass_ch4_kg_mol, constants::molar_mass_n2o_kg_mol};
} // namespace

std::string_view gas_name(Gas gas) noexcept { return names[index(gas)]; }

std::optional<Gas> gas_from_name(std::string_view name) noexcept {
  for (Gas gas : all_gases)
    if (names[index(gas)] == name) return gas;
  return std::nullopt;
}

double gas_molar_mass_kg_mol(Gas gas) noexcept { return molar_masses[index(gas)]; }

} // namespace bandstack
