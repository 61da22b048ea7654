// The few columns the report reads whole: which ones, and reading them.
#include <algorithm>
#include <cmath>
#include <numeric>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/tropopause.hpp"
#include "report/reader_parts.hpp"

namespace bandstack::report {

namespace {

// Index of each leading dimension for a flat (row-major) column index.
std::vector<std::size_t> unravel(const ResultData& data, std::size_t flat) {
  std::vector<std::size_t> index(data.axes.size());
  for (std::size_t d = data.axes.size(); d-- > 0;) {
    index[d] = flat % data.axes[d].size;
    flat /= data.axes[d].size;
  }
  return index;
}

// The variable's values of one column: all of its dimensions after the leading ones, row-major.
// Empty if the variable is missing or not per column.
std::vector<double> read_column(const NetcdfReader& file, const ResultData& data, const std::string& name,
                                std::size_t flat, std::vector<std::size_t>* trailing_sizes = nullptr) {
  if (!file.has_variable(name)) return {};
  const std::vector<std::string> dims = file.dimension_names(name);
  const std::size_t n = data.axes.size();
  if (dims.size() < n) return {};
  for (std::size_t d = 0; d < n; ++d)
    if (dims[d] != data.axes[d].name) return {};
  std::vector<std::size_t> start = unravel(data, flat);
  std::vector<std::size_t> count(n, 1);
  const std::vector<std::size_t> sizes = file.dimension_sizes(name);
  for (std::size_t d = n; d < dims.size(); ++d) {
    start.push_back(0);
    count.push_back(sizes[d]);
  }
  if (trailing_sizes) trailing_sizes->assign(sizes.begin() + static_cast<long>(n), sizes.end());
  return file.read(name, start, count);
}

// [band][layer] from a (band, layer) block.
std::vector<std::vector<double>> split_bands(const std::vector<double>& values, const std::vector<std::size_t>& sizes) {
  std::vector<std::vector<double>> out;
  if (sizes.size() != 2 || values.empty()) return out;
  for (std::size_t b = 0; b < sizes[0]; ++b)
    out.emplace_back(values.begin() + static_cast<long>(b * sizes[1]), values.begin() + static_cast<long>((b + 1) * sizes[1]));
  return out;
}

double scalar_of(const NetcdfReader& file, const ResultData& data, const std::string& name, std::size_t flat) {
  const std::vector<double> v = read_column(file, data, name, flat);
  return v.size() == 1 ? v[0] : std::nan("");
}

} // namespace

void choose_profiles(const ResultData& data, std::size_t max_profiles, std::vector<std::size_t>& flat_indices,
                     std::vector<std::string>& why) {
  flat_indices.clear();
  why.clear();
  if (data.column_count <= std::max<std::size_t>(max_profiles, 1)) {
    flat_indices.resize(data.column_count);
    std::iota(flat_indices.begin(), flat_indices.end(), std::size_t{0});
    why.assign(data.column_count, "");
    return;
  }
  const ScalarField* field = data.scalar("olr");
  std::string what = "OLR";
  if (!field) {
    field = data.scalar("surface_temperature");
    what = "surface temperature";
  }
  std::vector<std::size_t> order;
  for (std::size_t s = 0; s < field->values.size(); ++s)
    if (std::isfinite(field->values[s])) order.push_back(s);
  if (order.empty()) {
    flat_indices = {0};
    why = {"first column"};
    return;
  }
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return field->values[a] < field->values[b]; });
  const std::pair<std::size_t, const char*> picks[] = {
      {order.front(), "lowest "}, {order[order.size() / 2], "median "}, {order.back(), "highest "}};
  for (const auto& [s, label] : picks) {
    const std::size_t flat = data.flat_index_of_sample(s);
    if (std::find(flat_indices.begin(), flat_indices.end(), flat) != flat_indices.end()) continue;
    if (flat_indices.size() >= std::max<std::size_t>(max_profiles, 1)) break;
    flat_indices.push_back(flat);
    why.push_back(std::string(label) + what);
  }
}

void add_lapse_rate_tropopause(ColumnProfile& profile) {
  atmosphere::Column column;
  column.pressure_level_pa = profile.pressure_level_pa;
  column.temperature_level_k = profile.temperature_level_k;
  column.pressure_layer_pa = profile.pressure_layer_pa;
  column.temperature_layer_k = profile.temperature_layer_k;
  for (auto& gas : column.mole_fraction) gas.assign(column.layer_count(), 0.0);
  column.surface_temperature_k = profile.surface_temperature_k;
  try {
    const std::size_t level = atmosphere::lapse_rate_tropopause_level(column);
    profile.tropopause_pressure_pa = column.pressure_level_pa.at(level);
  } catch (const std::exception&) {
    // Too few layers or an odd profile: the plot simply has no tropopause mark.
  }
}

void read_profiles(const NetcdfReader& file, ResultData& data, const std::vector<std::size_t>& flat_indices,
                   const std::vector<std::string>& why) {
  for (std::size_t k = 0; k < flat_indices.size(); ++k) {
    const std::size_t flat = flat_indices[k];
    ColumnProfile p;
    p.flat_index = flat;
    p.label = data.column_label(flat);
    p.why = why[k];
    p.pressure_layer_pa = read_column(file, data, "pressure_layer", flat);
    p.temperature_layer_k = read_column(file, data, "temperature_layer", flat);
    p.pressure_level_pa = read_column(file, data, "pressure_level", flat);
    p.temperature_level_k = read_column(file, data, "temperature_level", flat);
    p.lw_heating_k_day = read_column(file, data, "lw_heating_rate", flat);
    p.sw_heating_k_day = read_column(file, data, "sw_heating_rate", flat);
    std::vector<std::size_t> sizes;
    p.lw_heating_by_band_k_day = split_bands(read_column(file, data, "lw_heating_rate_by_band", flat, &sizes), sizes);
    p.sw_heating_by_band_k_day = split_bands(read_column(file, data, "sw_heating_rate_by_band", flat, &sizes), sizes);
    const auto up_by_band = split_bands(read_column(file, data, "lw_flux_up_by_band", flat, &sizes), sizes);
    for (const auto& band : up_by_band) p.olr_by_band_w_m2.push_back(band.front()); // level 0 = top
    p.surface_temperature_k = scalar_of(file, data, "surface_temperature", flat);
    p.olr_w_m2 = scalar_of(file, data, "olr", flat);
    if (const double ct = scalar_of(file, data, "convective_top_pressure", flat); std::isfinite(ct))
      p.convective_top_pressure_pa = ct;
    if (const double g = scalar_of(file, data, "greenhouse_effect", flat); std::isfinite(g)) p.greenhouse_effect_w_m2 = g;
    for (const char* name : {"tropopause_pressure", "forcing_toa_instantaneous", "forcing_tropopause_instantaneous",
                             "forcing_adjusted", "surface_temperature_change", "warming_per_co2_doubling",
                             "climate_feedback_parameter", "feedback_planck", "feedback_lapse_rate",
                             "feedback_water_vapour", "feedback_stratospheric_temperature", "feedback_residual"})
      if (std::vector<double> v = read_column(file, data, name, flat); !v.empty()) p.by_experiment[name] = std::move(v);
    for (const char* name : {"greenhouse_by_gas_removal", "greenhouse_by_gas_addition"})
      if (std::vector<double> v = read_column(file, data, name, flat); !v.empty()) p.by_gas[name] = std::move(v);
    for (const char* name : {"greenhouse_by_band_removal", "greenhouse_by_band_addition"})
      if (std::vector<double> v = read_column(file, data, name, flat); !v.empty()) p.by_band[name] = std::move(v);
    if (auto it = p.by_experiment.find("tropopause_pressure"); it != p.by_experiment.end())
      for (double v : it->second)
        if (std::isfinite(v)) {
          p.tropopause_pressure_pa = v;
          p.tropopause_from_file = true;
          break;
        }
    if (!p.tropopause_pressure_pa) add_lapse_rate_tropopause(p);
    data.profiles.push_back(std::move(p));
  }
}

} // namespace bandstack::report
