#pragma once
// Private to io: one variable of a profile file, its shape and units checked once against the layout
// (FieldPlan), then read box by box (a block of columns) with its values converted to SI
// (docs/profile-file.md, "Units" and "Dimensions").
#include "io/flat_range.hpp"
#include "io/profile_netcdf.hpp"
#include "io/profile_sources.hpp"
#include "io/profile_units.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace bandstack::io::detail {

// How a variable is read: found once per file.
struct FieldPlan {
  Source source;
  std::string units;                  // as written in the file
  AmountKind kind = AmountKind::none; // for h2o and gases: what the file holds
  UnitConversion conversion;          // to Pa, K, or kg/kg / mol/mol (by kind)
  std::vector<std::size_t> shape;     // positions into Layout::dims of the variable's dimensions, in order
};

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
  // Index in the file of the first value along each of the layout's dimensions (the box read).
  std::vector<std::size_t> origin;

  // Offset of the column whose leading indices (in the whole file) are `index` (one per
  // Layout::leading entry); the column must lie in the box read.
  [[nodiscard]] std::size_t column_offset(const Layout& layout, const std::vector<std::size_t>& index) const;
  [[nodiscard]] std::size_t vertical_stride(const Layout& layout) const { return stride[layout.vertical]; }
};

// Checks the variable `source` for quantity `q`. Shapes allowed (dimension names in the order of the
// temperature's): pressure full or vertical only; temperature full; surface values leading or scalar;
// gases full, vertical only, leading or scalar. InputError naming the file and variable for a wrong
// shape or a missing or unknown units attribute.
[[nodiscard]] FieldPlan plan_field(const NetcdfFile& nc, Quantity q, const Source& source, const Layout& layout);

// Reads the part of the variable inside `box` (start and count per Layout::dims entry; dimensions the
// variable lacks are ignored). InputError naming the file, the variable and the index for NaN or
// missing values and values out of range.
[[nodiscard]] Field read_field(const NetcdfFile& nc, Quantity q, const FieldPlan& plan, const Layout& layout,
                               const Hyperslab& box);

// "co2 <- xco2 (ppmv)", "h2o <- q (g kg-1, specific humidity)": a line of ProfileFile::used_variables.
[[nodiscard]] std::string describe_use(Quantity q, const FieldPlan& field);

} // namespace bandstack::io::detail
