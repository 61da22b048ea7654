#pragma once
// Private to io: which variable of a profile file holds each quantity, and the layout of the columns
// (vertical dimension, leading dimensions) — docs/profile-file.md, "Variables" and "Dimensions".
#include "bandstack/io/profile_file.hpp"
#include "io/profile_netcdf.hpp"

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace bandstack::io::detail {

enum class Quantity : std::size_t {
  pressure,
  temperature,
  surface_temperature,
  surface_pressure,
  h2o,
  co2,
  o3,
  ch4,
  n2o
};
inline constexpr std::size_t quantity_count = 9;

// "pressure", "temperature", "surface_temperature", ..., "h2o", "co2": the names used in messages
// and in ProfileFile::used_variables (the fields of ProfileVariables).
[[nodiscard]] std::string_view quantity_name(Quantity q) noexcept;

// What an amount in the file measures. mass_fraction and specific_humidity: kg per kg of moist air;
// mixing_ratio: kg of water per kg of dry air (CF humidity_mixing_ratio).
enum class AmountKind { none, mole_fraction, mass_fraction, specific_humidity, mixing_ratio };

// One CF standard_name that identifies a quantity, with the kind of amount it implies.
struct StandardName {
  std::string_view name;
  AmountKind kind = AmountKind::none;
};

// The standard names that identify `q` (e.g. air_temperature; for h2o: specific_humidity,
// humidity_mixing_ratio, mole_fraction_of_water_vapor_in_air).
[[nodiscard]] std::vector<StandardName> standard_names(Quantity q);

// The variable chosen for one quantity.
struct Source {
  int varid = -1;
  std::string name;                          // the variable's name in the file
  std::optional<StandardName> standard_name; // its standard_name when it is one of the quantity's
};

// One entry per quantity, nullopt where the file has none. A name given in `variables` must exist;
// otherwise the quantity is found by standard_name: two candidates are an error asking for a name,
// and a missing pressure or temperature is an error.
[[nodiscard]] std::array<std::optional<Source>, quantity_count> find_sources(const NetcdfFile& nc,
                                                                             const ProfileVariables& variables);

// How the columns lie in the file: the temperature variable's dimensions, one of them vertical.
struct Layout {
  std::vector<int> dims;            // temperature's dimension ids, file order
  std::size_t vertical = 0;         // position of the vertical dimension in dims
  std::vector<std::size_t> leading; // positions of the other (leading) dimensions in dims, file order
  std::size_t vertical_size = 0;    // number of vertical points (layers)
  std::size_t column_count = 1;     // product of the leading dimensions' sizes
};

// The layout of the file: the vertical dimension is the 1-D pressure coordinate's dimension; for a
// full pressure field, the dimension named in `vertical_dimension`, else the one of temperature's
// dimensions whose coordinate variable has axis = "Z" or a `positive` attribute.
[[nodiscard]] Layout find_layout(const NetcdfFile& nc, const Source& pressure, const Source& temperature,
                                 const std::string& vertical_dimension);

} // namespace bandstack::io::detail
