#pragma once
// Private to io: one variable of a profile file read whole, its shape checked against the layout and
// its values converted to SI (docs/profile-file.md, "Units" and "Dimensions").
#include "io/profile_netcdf.hpp"
#include "io/profile_sources.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace bandstack::io::detail {

struct Field {
  Source source;
  std::string units;                  // as written in the file
  AmountKind kind = AmountKind::none; // for h2o and gases: what the file holds
  // Pa, K, or mol/mol — except gases of kind mass_fraction, kept in kg per kg of moist air until the
  // column's water is known. Water of every kind is already converted to mole fraction.
  std::vector<double> values;
  // Row-major stride of each of the layout's dimensions in `values`; 0 for a dimension the variable
  // lacks (the values are repeated along it).
  std::vector<std::size_t> stride;

  // Offset of the column whose leading indices are `index` (one per Layout::leading entry).
  [[nodiscard]] std::size_t column_offset(const Layout& layout, const std::vector<std::size_t>& index) const;
  [[nodiscard]] std::size_t vertical_stride(const Layout& layout) const { return stride[layout.vertical]; }
};

// Reads the variable `source` for quantity `q`. Shapes allowed (dimension names in the order of the
// temperature's): pressure full or vertical only; temperature full; surface values leading or scalar;
// gases full, vertical only, leading or scalar. InputError naming the file and variable for a wrong
// shape, a missing or unknown units attribute, NaN or missing values, values out of range.
[[nodiscard]] Field read_field(const NetcdfFile& nc, Quantity q, const Source& source, const Layout& layout);

// "co2 <- xco2 (ppmv)", "h2o <- q (g kg-1, specific humidity)": a line of ProfileFile::used_variables.
[[nodiscard]] std::string describe_use(Quantity q, const Field& field);

} // namespace bandstack::io::detail
