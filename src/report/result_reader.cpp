#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "bandstack/report/result_data.hpp"
#include "report/netcdf_reader.hpp"
#include "report/reader_parts.hpp"

namespace bandstack::report {

namespace {

// Variables every result file has (docs/output-file.md).
constexpr const char* required_variables[] = {"surface_temperature", "pressure_level", "temperature_level",
                                              "pressure_layer", "temperature_layer"};
// Per-column results summarised over all columns, and per-column-and-experiment ones.
constexpr const char* column_scalars[] = {"olr", "surface_temperature", "absorbed_solar", "toa_net_flux",
                                          "surface_lw_flux_down", "greenhouse_effect"};
constexpr const char* experiment_scalars[] = {"forcing_adjusted", "surface_temperature_change",
                                              "climate_feedback_parameter"};

std::vector<LeadingAxis> read_axes(const NetcdfReader& file) {
  std::vector<LeadingAxis> axes;
  const std::vector<std::string> names = file.dimension_names("surface_temperature");
  const std::vector<std::size_t> sizes = file.dimension_sizes("surface_temperature");
  for (std::size_t d = 0; d < names.size(); ++d) {
    LeadingAxis axis;
    axis.name = names[d];
    axis.size = sizes[d];
    if (file.has_variable(axis.name) && file.dimension_names(axis.name) == std::vector<std::string>{axis.name}) {
      axis.values = file.read_all(axis.name);
      axis.units = file.text_attribute(axis.name, "units");
      axis.long_name = file.text_attribute(axis.name, "long_name");
    }
    if (axis.name == "column" && file.has_variable("column_name") &&
        file.dimension_names("column_name").front() == "column")
      axis.labels = file.read_strings("column_name");
    axes.push_back(std::move(axis));
  }
  return axes;
}

BandEdges read_bands(const NetcdfReader& file, const std::string& bounds) {
  BandEdges bands;
  if (!file.has_variable(bounds)) return bands;
  const std::vector<double> edges = file.read_all(bounds);
  for (std::size_t b = 0; b + 1 < edges.size(); b += 2) {
    bands.lower_cm1.push_back(edges[b]);
    bands.upper_cm1.push_back(edges[b + 1]);
  }
  return bands;
}

// Strides that keep the sample at most `limit` columns: the axis with most sampled values is
// thinned first, so large sweeps keep their shape.
void choose_sample(ResultData& data, std::size_t limit) {
  const std::size_t n = data.axes.size();
  data.sample_stride.assign(n, 1);
  data.sample_count.resize(n);
  for (std::size_t d = 0; d < n; ++d) data.sample_count[d] = data.axes[d].size;
  const auto product = [&] {
    std::size_t p = 1;
    for (std::size_t c : data.sample_count) p *= c;
    return p;
  };
  while (product() > std::max<std::size_t>(limit, 1)) {
    const auto widest = std::max_element(data.sample_count.begin(), data.sample_count.end()) - data.sample_count.begin();
    const auto d = static_cast<std::size_t>(widest);
    ++data.sample_stride[d];
    data.sample_count[d] = (data.axes[d].size + data.sample_stride[d] - 1) / data.sample_stride[d];
  }
  data.sampled_count = product();
}

void read_scalars(const NetcdfReader& file, ResultData& data) {
  const std::size_t n = data.axes.size();
  std::vector<std::string> leading;
  for (const LeadingAxis& axis : data.axes) leading.push_back(axis.name);
  std::vector<std::ptrdiff_t> stride(data.sample_stride.begin(), data.sample_stride.end());
  for (const char* name : column_scalars) {
    if (!file.has_variable(name) || file.dimension_names(name) != leading) continue;
    data.scalars.push_back({name, "", file.text_attribute(name, "units"),
                            file.read(name, std::vector<std::size_t>(n, 0), data.sample_count, stride)});
  }
  if (data.experiments.empty()) return;
  std::vector<std::string> with_experiment = leading;
  with_experiment.push_back("experiment");
  std::vector<std::size_t> count = data.sample_count;
  count.push_back(data.experiments.size());
  stride.push_back(1);
  for (const char* name : experiment_scalars) {
    if (!file.has_variable(name) || file.dimension_names(name) != with_experiment) continue;
    const std::vector<double> values = file.read(name, std::vector<std::size_t>(n + 1, 0), count, stride);
    const std::size_t e_count = data.experiments.size();
    for (std::size_t e = 0; e < e_count; ++e) {
      ScalarField field{name, data.experiments[e], file.text_attribute(name, "units"), {}};
      field.values.reserve(data.sampled_count);
      for (std::size_t s = 0; s < data.sampled_count; ++s) field.values.push_back(values[s * e_count + e]);
      data.scalars.push_back(std::move(field));
    }
  }
}

} // namespace

const ScalarField* ResultData::scalar(const std::string& name, const std::string& experiment) const {
  for (const ScalarField& field : scalars)
    if (field.name == name && field.experiment == experiment) return &field;
  return nullptr;
}

std::size_t ResultData::flat_index_of_sample(std::size_t s) const {
  std::size_t flat = 0;
  std::size_t rest = s;
  std::size_t sampled_below = sampled_count;
  for (std::size_t d = 0; d < axes.size(); ++d) {
    sampled_below /= sample_count[d];
    const std::size_t i = rest / sampled_below;
    rest %= sampled_below;
    flat = flat * axes[d].size + i * sample_stride[d];
  }
  return flat;
}

std::string ResultData::column_label(std::size_t flat_index) const {
  std::vector<std::size_t> index(axes.size());
  for (std::size_t d = axes.size(); d-- > 0;) {
    index[d] = flat_index % axes[d].size;
    flat_index /= axes[d].size;
  }
  std::string label;
  for (std::size_t d = 0; d < axes.size(); ++d) {
    if (!label.empty()) label += ", ";
    const LeadingAxis& axis = axes[d];
    if (index[d] < axis.labels.size()) label += axis.labels[index[d]];
    else if (index[d] < axis.values.size()) label += fmt::format("{} = {:.6g}", axis.name, axis.values[index[d]]);
    else label += fmt::format("{} {}", axis.name, index[d]);
  }
  return label;
}

ResultData read_result_data(const std::filesystem::path& result_nc, const ReportOptions& options) {
  const NetcdfReader file(result_nc.string());
  for (const char* name : required_variables) file.require(name);
  ResultData data;
  data.path = result_nc;
  for (auto& [name, value] : file.global_text_attributes()) data.attributes[name] = value;
  data.axes = read_axes(file);
  data.column_count = 1;
  for (const LeadingAxis& axis : data.axes) data.column_count *= axis.size;
  data.layer_count = file.dimension_size("layer").value_or(0);
  data.lw_bands = read_bands(file, "band_lw_bounds");
  data.sw_bands = read_bands(file, "band_sw_bounds");
  if (file.has_variable("experiment_name")) data.experiments = file.read_strings("experiment_name");
  if (file.has_variable("gas_name")) data.gases = file.read_strings("gas_name");
  choose_sample(data, options.max_sampled_columns);
  read_scalars(file, data);
  std::vector<std::size_t> chosen;
  std::vector<std::string> why;
  choose_profiles(data, options.max_profiles, chosen, why);
  read_profiles(file, data, chosen, why);
  add_initial_states(data);
  return data;
}

} // namespace bandstack::report
