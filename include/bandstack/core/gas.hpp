#pragma once
// The radiatively active gases bandstack knows, with their molar masses.
#include <array>
#include <cstddef>
#include <optional>
#include <string_view>

namespace bandstack {

enum class Gas : std::size_t { h2o = 0, co2, o3, ch4, n2o };
inline constexpr std::size_t gas_count = 5;
inline constexpr std::array<Gas, gas_count> all_gases{Gas::h2o, Gas::co2, Gas::o3, Gas::ch4, Gas::n2o};

// Lower-case chemical formula as used in file keys and variable names: "h2o", "co2", ...
[[nodiscard]] std::string_view gas_name(Gas gas) noexcept;
// Inverse of gas_name (case-sensitive); nullopt for an unknown name.
[[nodiscard]] std::optional<Gas> gas_from_name(std::string_view name) noexcept;
// Molar mass in kg/mol (see constants.hpp for the sources).
[[nodiscard]] double gas_molar_mass_kg_mol(Gas gas) noexcept;

constexpr std::size_t index(Gas gas) noexcept { return static_cast<std::size_t>(gas); }

} // namespace bandstack
