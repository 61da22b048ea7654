#pragma once
// Private to io: the variables of a result file as a table of descriptions (name, dimensions,
// attributes, and how to get each column's values from a ColumnResult). The table is built once from
// one sample result; the file is defined from it, then filled block of columns by block of columns.
#include <cstddef>
#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "bandstack/batch/column_result.hpp"

namespace bandstack::io::detail {

using R = batch::ColumnResult;

enum class Storage { f64, i8, text };

// One netCDF variable. A per-column variable has the leading dimensions (one per output axis) first,
// then `dims`; a fixed one (a coordinate such as band_lw) only `dims` and its values in `values`
// (f64) or `text` (text, already padded to the last dimension's length).
struct Variable {
  std::string name;
  Storage storage = Storage::f64;
  bool per_column = true;
  std::vector<std::string> dims;                                  // names, after the leading ones
  std::vector<std::pair<std::string, std::string>> attributes;   // text attributes, in order
  bool fill_nan = false;                                          // _FillValue = NaN (missing values)
  std::size_t values_per_column = 1;                              // product of the sizes of `dims`
  std::function<void(const R&, double*)> get;                     // writes values_per_column values
  bool of_failed_columns = false; // `get` also works for failed columns (others get missing values)
  std::vector<signed char> flag_values;                           // CF flag_values of an i8 variable
  std::vector<double> values;
  std::string text;
};

struct Attributes {
  const char* units;
  const char* long_name;
  const char* standard_name; // nullptr where CF has none
};

// The dimensions other than the leading ones (in definition order) and every variable.
struct Table {
  std::vector<std::pair<std::string, std::size_t>> dims;
  std::vector<Variable> variables;
  std::string coordinates; // `coordinates` attribute of per-column variables ("column_name" or "")

  // Size of a dimension added before; InternalError if there is none.
  [[nodiscard]] std::size_t dim_size(const std::string& name) const;
  [[nodiscard]] bool has_dim(const std::string& name) const;
  void add_dim(const std::string& name, std::size_t size); // no-op if it exists with that size
  // A per-column double variable with units, long_name, standard_name and `coordinates`
  // (the table's, or `coordinates` when given); values_per_column from `dims`.
  Variable& add(const std::string& name, std::vector<std::string> dims, const Attributes& a,
                const std::string& coordinates = "");
  // One value per column.
  void scalar(const std::string& name, const Attributes& a, std::function<double(const R&)> get);
  // One profile per column along `dim` (level, layer); InternalError on a length mismatch.
  void profile(const std::string& name, const std::string& dim, const Attributes& a,
               std::function<const std::vector<double>&(const R&)> get);
  // Names of items as a text variable <var_name>(<dim>, <dim>_name_length); adds both dimensions.
  void names(const std::string& dim, const std::string& var_name, const std::vector<std::string>& names,
             const char* long_name);
};

// Names padded with NUL to a common length (at least 1): the text of a char variable (n, length).
[[nodiscard]] std::string padded_names(const std::vector<std::string>& names, std::size_t& length);

// The flux variables: longwave (always) and shortwave (when the sample has it), each with its band
// coordinate and by-band variables when the method is band-resolved.
void describe_longwave(Table& table, const R& sample);
void describe_shortwave(Table& table, const R& sample);

// The climate variables (docs/output-file.md), each only when the sample has them: equilibrium
// diagnostics, experiment results on an `experiment` dimension, greenhouse attribution on a `gas`
// dimension (and band_lw, added before by describe_longwave).
void describe_equilibrium(Table& table, const R& sample);
void describe_experiments(Table& table, const R& sample, const std::vector<std::string>& experiment_names);
void describe_attribution(Table& table, const R& sample);

} // namespace bandstack::io::detail
