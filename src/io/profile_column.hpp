#pragma once
// Private to io: a Column from the layers of one profile-file column (docs/profile-file.md, "Levels").
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/io/profile_file.hpp"

#include <array>
#include <optional>
#include <string>
#include <vector>

namespace bandstack::io::detail {

// One column of the file in bandstack's order (index 0 at the top, pressure strictly increasing).
struct ColumnLayers {
  std::vector<double> pressure_pa;                          // N >= 2 layer pressures
  std::vector<double> temperature_k;                        // N layer temperatures
  std::array<std::vector<double>, gas_count> mole_fraction; // N values per gas (mol/mol of moist air)
  std::optional<double> surface_pressure_pa;                // from the file, if it has one
  std::optional<double> surface_temperature_k;              // skin temperature from the file, if it has one
};

// Lowest top-of-atmosphere level pressure placed by extrapolation (Pa), unless the top layer itself
// lies at or below twice this pressure (docs/profile-file.md).
inline constexpr double min_top_level_pressure_pa = 1e-3;

// Places the levels: between layers at the geometric mean of their pressures (midway in ln p); above
// the top layer and below the lowest by half the neighbouring layer spacing in ln p (the surface level
// at the file's surface pressure when given). Level temperatures: linear in ln p between layers; the
// top level takes the top layer's; the surface level the skin temperature if given, else linear
// extrapolation in ln p from the two lowest layers. Surface temperature default: the surface level's.
// `where` (file, column index) and `surface_pressure_item` name the column in errors: InputError when
// the surface pressure is not greater than the lowest layer's.
[[nodiscard]] atmosphere::Column make_column(ColumnLayers layers, const ProfileDefaults& defaults,
                                             const InputPlace& where, const std::string& surface_pressure_item);

} // namespace bandstack::io::detail
