#pragma once
// What the report reads from a result file (docs/output-file.md): the attributes, the leading
// dimensions, a bounded sample of the per-column results and a few whole columns. Memory does not
// grow beyond ReportOptions' limits, whatever the number of columns.
#include <cstddef>
#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "bandstack/report/report.hpp"

namespace bandstack::report {

// One leading dimension of the per-column variables: "column", a sweep axis or a profile file's
// dimension.
struct LeadingAxis {
  std::string name;
  std::size_t size = 0;
  std::string units;                 // of the coordinate variable, or empty
  std::string long_name;             // of the coordinate variable, or empty
  std::vector<double> values;        // numeric coordinate values, or empty
  std::vector<std::string> labels;   // column names (for "column"), or empty
};

// Spectral bands of a band set, wavenumbers in cm-1.
struct BandEdges {
  std::vector<double> lower_cm1;
  std::vector<double> upper_cm1;
  [[nodiscard]] std::size_t size() const noexcept { return lower_cm1.size(); }
};

// A per-column result over the sampled columns (row-major over the sampled leading axes).
struct ScalarField {
  std::string name;                  // netCDF variable name
  std::string experiment;            // experiment name for per-experiment results, else empty
  std::string units;                 // UDUNITS string from the file
  std::vector<double> values;        // NaN where the file has no value
};

// One column read whole.
struct ColumnProfile {
  std::size_t flat_index = 0;        // row-major index over all leading axes
  std::string label;                 // column name and swept values
  std::string why;                   // why it was chosen ("lowest OLR"), empty when all are shown
  std::vector<double> pressure_layer_pa, temperature_layer_k;
  std::vector<double> pressure_level_pa, temperature_level_k;
  // The column before it was driven to equilibrium (rebuilt from the stored study text), Pa and K;
  // empty without [equilibrium] or when it cannot be rebuilt (e.g. a profile file).
  std::vector<double> initial_pressure_layer_pa, initial_temperature_layer_k;
  std::vector<double> lw_heating_k_day, sw_heating_k_day;              // per layer, or empty
  std::vector<std::vector<double>> lw_heating_by_band_k_day;           // [band][layer], or empty
  std::vector<std::vector<double>> sw_heating_by_band_k_day;
  std::vector<double> olr_by_band_w_m2;                                // upward LW flux at the top per band
  double surface_temperature_k = 0.0;
  double olr_w_m2 = 0.0;
  std::optional<double> tropopause_pressure_pa;  // the file's (first experiment), else the lapse-rate tropopause
  bool tropopause_from_file = false;
  std::optional<double> convective_top_pressure_pa;
  std::map<std::string, std::vector<double>> by_experiment;  // variable -> one value per experiment
  std::map<std::string, std::vector<double>> by_gas;         // greenhouse_by_gas_* -> one per gas
  std::map<std::string, std::vector<double>> by_band;        // greenhouse_by_band_* -> one per LW band
  std::optional<double> greenhouse_effect_w_m2;
};

struct ResultData {
  std::filesystem::path path;
  std::map<std::string, std::string> attributes;   // global text attributes
  std::vector<LeadingAxis> axes;
  std::size_t column_count = 0;                    // product of the leading axes' sizes
  std::vector<std::size_t> sample_stride;          // per leading axis (1 = every value)
  std::vector<std::size_t> sample_count;           // sampled values per leading axis
  std::size_t sampled_count = 0;                   // product of sample_count
  std::size_t layer_count = 0;
  BandEdges lw_bands, sw_bands;
  std::vector<std::string> experiments;
  std::vector<std::string> gases;
  std::vector<ScalarField> scalars;
  std::vector<ColumnProfile> profiles;

  // The scalar field of that name (and experiment), or nullptr.
  [[nodiscard]] const ScalarField* scalar(const std::string& name, const std::string& experiment = "") const;
  // Flat index over all leading axes of sampled index s.
  [[nodiscard]] std::size_t flat_index_of_sample(std::size_t s) const;
  // "name" for the column axis, "key=value" for the others, joined by ", ".
  [[nodiscard]] std::string column_label(std::size_t flat_index) const;
};

// Reads what the report shows. FileError if the file cannot be opened as netCDF; InputError naming
// the file and the variable if a variable every result file has is missing.
[[nodiscard]] ResultData read_result_data(const std::filesystem::path& result_nc, const ReportOptions& options);

} // namespace bandstack::report
