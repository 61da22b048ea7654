// The climate variables of a result file (docs/output-file.md): equilibrium diagnostics, experiment
// results and the greenhouse attribution.
#include <cmath>
#include <limits>
#include <vector>

#include "bandstack/core/error.hpp"
#include "io/netcdf_put.hpp"

namespace bandstack::io::detail {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcVar;
using R = batch::ColumnResult;

namespace {

constexpr double missing = std::numeric_limits<double>::quiet_NaN();

// A double variable whose missing values are NaN (the CF _FillValue), with extra coordinates.
NcVar add_with_fill(NcFile& file, const std::string& name, const std::vector<NcDim>& dims, const Attributes& a,
                    const std::string& coordinates) {
  NcVar var = file.addVar(name, netCDF::ncDouble, dims);
  var.setFill(true, missing);
  var.putAtt("units", a.units);
  var.putAtt("long_name", a.long_name);
  if (a.standard_name) var.putAtt("standard_name", a.standard_name);
  if (!coordinates.empty()) var.putAtt("coordinates", coordinates);
  return var;
}

// One value per (column, item) from get(result, item).
void put_table(NcVar var, std::span<const R> results, std::size_t items,
               const std::function<double(const R&, std::size_t)>& get) {
  std::vector<double> data;
  data.reserve(results.size() * items);
  for (const R& r : results)
    for (std::size_t i = 0; i < items; ++i) data.push_back(get(r, i));
  var.putVar(data.data());
}

// The lead's coordinates plus one more.
std::string with_coordinate(const Lead& lead, const std::string& name) {
  return lead.coordinates.empty() ? name : lead.coordinates + " " + name;
}

} // namespace

NcDim write_names(NcFile& file, const std::string& dim, const std::string& var_name, const std::vector<std::string>& names,
                  const char* long_name) {
  std::size_t length = 1;
  for (const std::string& n : names) length = std::max(length, n.size());
  const NcDim items = file.addDim(dim, names.size());
  const NcDim chars_dim = file.addDim(dim + "_name_length", length);
  NcVar var = file.addVar(var_name, netCDF::ncChar, {items, chars_dim});
  var.putAtt("long_name", long_name);
  std::vector<char> chars(names.size() * length, '\0');
  for (std::size_t i = 0; i < names.size(); ++i)
    std::copy(names[i].begin(), names[i].end(), chars.begin() + static_cast<long>(i * length));
  var.putVar(chars.data());
  return items;
}

void write_equilibrium(NcFile& file, std::span<const R> results, const Lead& lead, const NcDim& layer) {
  if (!results.front().equilibrium) return;
  const std::vector<NcDim> scalar = lead.dims;
  put_per_column(add_variable(file, "equilibrium_newton_iterations", scalar, {"1", "Newton iterations taken to reach equilibrium", nullptr}, lead.coordinates),
                 results, [](const R& r) { return static_cast<double>(r.equilibrium->newton_iterations); });
  put_per_column(add_variable(file, "equilibrium_time_steps", scalar, {"1", "time-marching steps taken (0 when Newton's method converged)", nullptr}, lead.coordinates),
                 results, [](const R& r) { return static_cast<double>(r.equilibrium->time_steps); });
  put_per_column(add_variable(file, "equilibrium_radiative_calls", scalar, {"1", "radiative evaluations of the column used to reach equilibrium", nullptr}, lead.coordinates),
                 results, [](const R& r) { return static_cast<double>(r.equilibrium->radiative_calls); });
  put_per_column(add_variable(file, "equilibrium_max_heating_residual", scalar, {"K day-1", "largest absolute radiative heating rate left in a radiative layer", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.equilibrium->max_radiative_heating_k_day; });
  put_per_column(add_variable(file, "equilibrium_toa_net_residual", scalar, {"W m-2", "net downward flux left at the top of the atmosphere", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.equilibrium->toa_net_w_m2; });
  put_per_column(add_variable(file, "equilibrium_convective_region_residual", scalar, {"W m-2", "net radiative flux left into the convective region and the ground", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.equilibrium->region_net_w_m2; });
  put_per_column(add_variable(file, "convective_top_pressure", scalar, {"Pa", "pressure at the top of the convective region (the surface pressure when there is none)", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.equilibrium->convective_top_pressure_pa(); });
  NcVar flag = file.addVar("convective_layer", netCDF::ncByte, lead.with({layer}));
  flag.putAtt("long_name", "1 where the layer belongs to the convective region of the equilibrium, else 0");
  if (!lead.coordinates.empty()) flag.putAtt("coordinates", lead.coordinates);
  std::vector<signed char> data;
  for (const R& r : results)
    for (bool b : r.equilibrium->convective) data.push_back(b ? 1 : 0);
  flag.putVar(data.data());
}

void write_experiments(NcFile& file, std::span<const R> results, const std::vector<std::string>& experiment_names,
                       const Lead& lead, const NcDim& layer) {
  if (experiment_names.empty()) return;
  const std::size_t n_exp = experiment_names.size();
  for (const R& r : results)
    if (r.experiments.size() != n_exp) throw InternalError("every column needs one result per experiment");
  const NcDim experiment = write_names(file, "experiment", "experiment_name", experiment_names, "experiment label from the study");
  const std::vector<NcDim> dims = lead.with({experiment});
  const std::string coordinates = with_coordinate(lead, "experiment_name");
  using E = climate::ExperimentResult;
  const auto put = [&](const std::string& name, const Attributes& a, const std::function<double(const E&)>& get) {
    put_table(add_with_fill(file, name, dims, a, coordinates), results, n_exp,
              [&](const R& r, std::size_t e) { return get(r.experiments[e]); });
  };
  put_table(add_with_fill(file, "tropopause_pressure", dims,
                          {"Pa", "pressure at the tropopause level used for the forcing and the feedback split", "tropopause_air_pressure"},
                          coordinates),
            results, n_exp, [](const R& r, std::size_t e) { return r.column.pressure_level_pa[r.experiments[e].tropopause_level]; });
  put("forcing_toa_instantaneous", {"W m-2", "instantaneous radiative forcing at the top of the atmosphere (change of net downward flux, temperatures fixed)", nullptr},
      [](const E& e) { return e.forcing.toa_instantaneous_w_m2; });
  put("forcing_tropopause_instantaneous", {"W m-2", "instantaneous radiative forcing at the tropopause", nullptr},
      [](const E& e) { return e.forcing.tropopause_instantaneous_w_m2; });
  put("forcing_adjusted", {"W m-2", "stratosphere-adjusted radiative forcing at the tropopause (fixed dynamical heating)", nullptr},
      [](const E& e) { return e.forcing.adjusted_w_m2; });
  put("forcing_adjusted_toa", {"W m-2", "stratosphere-adjusted radiative forcing at the top of the atmosphere (equals forcing_adjusted once the stratosphere has adjusted)", nullptr},
      [](const E& e) { return e.forcing.adjusted_toa_w_m2; });
  {
    NcVar var = add_with_fill(file, "temperature_layer_adjusted", lead.with({experiment, layer}),
                              {"K", "layer temperature with the stratosphere adjusted to the perturbation (troposphere unchanged)", "air_temperature"},
                              coordinates);
    std::vector<double> data;
    for (const R& r : results)
      for (const E& e : r.experiments) data.insert(data.end(), e.forcing.adjusted_temperature_layer_k.begin(), e.forcing.adjusted_temperature_layer_k.end());
    var.putVar(data.data());
  }
  if (!results.front().equilibrium) return;
  put("surface_temperature_change", {"K", "equilibrium surface temperature change", nullptr},
      [](const E& e) { return e.surface_temperature_change_k; });
  put("warming_per_co2_doubling", {"K", "equilibrium surface warming per doubling of CO2 (experiments that only scale CO2)", nullptr},
      [](const E& e) { return e.warming_per_co2_doubling_k; });
  put("surface_temperature_perturbed", {"K", "surface temperature of the perturbed equilibrium", "surface_temperature"},
      [](const E& e) { return e.equilibrium ? e.equilibrium->column.surface_temperature_k : missing; });
  put("climate_feedback_parameter", {"W m-2 K-1", "minus the adjusted forcing over the surface temperature change", nullptr},
      [](const E& e) { return e.feedbacks.total_w_m2_k; });
  put("feedback_planck", {"W m-2 K-1", "Planck feedback: surface and troposphere warmed uniformly (two-sided partial radiative perturbation)", nullptr},
      [](const E& e) { return e.feedbacks.planck_w_m2_k; });
  put("feedback_lapse_rate", {"W m-2 K-1", "lapse-rate feedback: tropospheric warming departing from uniform", nullptr},
      [](const E& e) { return e.feedbacks.lapse_rate_w_m2_k; });
  put("feedback_water_vapour", {"W m-2 K-1", "water-vapour feedback", nullptr},
      [](const E& e) { return e.feedbacks.water_vapour_w_m2_k; });
  put("feedback_stratospheric_temperature", {"W m-2 K-1", "feedback from the temperature change above the tropopause", nullptr},
      [](const E& e) { return e.feedbacks.stratospheric_temperature_w_m2_k; });
  put("feedback_residual", {"W m-2 K-1", "climate_feedback_parameter minus the sum of the feedback terms (nonlinearity)", nullptr},
      [](const E& e) { return e.feedbacks.residual_w_m2_k; });
  put("experiment_newton_iterations", {"1", "Newton iterations taken to reach the perturbed equilibrium", nullptr},
      [](const E& e) { return e.equilibrium ? static_cast<double>(e.equilibrium->newton_iterations) : missing; });
  put("experiment_radiative_calls", {"1", "radiative evaluations used for the perturbed equilibrium", nullptr},
      [](const E& e) { return e.equilibrium ? static_cast<double>(e.equilibrium->radiative_calls) : missing; });
  {
    NcVar var = add_with_fill(file, "temperature_layer_perturbed", lead.with({experiment, layer}),
                              {"K", "layer temperature of the perturbed equilibrium", "air_temperature"}, coordinates);
    std::vector<double> data;
    for (const R& r : results)
      for (const E& e : r.experiments) {
        if (e.equilibrium) data.insert(data.end(), e.equilibrium->column.temperature_layer_k.begin(), e.equilibrium->column.temperature_layer_k.end());
        else data.insert(data.end(), r.column.layer_count(), missing);
      }
    var.putVar(data.data());
  }
}

void write_attribution(NcFile& file, std::span<const R> results, const Lead& lead) {
  if (!results.front().attribution) return;
  std::vector<std::string> names;
  for (Gas g : all_gases) names.emplace_back(gas_name(g));
  const NcDim gas = write_names(file, "gas", "gas_name", names, "radiatively active gas (h2o includes its continuum)");
  const std::vector<NcDim> scalar = lead.dims;
  put_per_column(add_variable(file, "greenhouse_effect", scalar, {"W m-2", "surface emission sigma Ts^4 minus the outgoing longwave flux", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.attribution->greenhouse_effect_w_m2; });
  const auto put_gases = [&](const std::string& name, const char* long_name, bool removal) {
    put_table(add_with_fill(file, name, lead.with({gas}), {"W m-2", long_name, nullptr}, with_coordinate(lead, "gas_name")), results, gas_count,
              [removal](const R& r, std::size_t g) {
                return removal ? r.attribution->gas_removal_w_m2[g] : r.attribution->gas_addition_w_m2[g];
              });
  };
  put_gases("greenhouse_by_gas_removal", "greenhouse effect lost when only this gas is removed", true);
  put_gases("greenhouse_by_gas_addition", "greenhouse effect of this gas alone", false);
  const std::size_t n_band = results.front().attribution->band_removal_w_m2.size();
  if (n_band == 0) return;
  const NcDim band = file.getDim("band_lw");
  if (band.isNull() || band.getSize() != n_band) throw InternalError("band attribution needs the band_lw dimension");
  const auto put_bands = [&](const std::string& name, const char* long_name, bool removal) {
    put_table(add_with_fill(file, name, lead.with({band}), {"W m-2", long_name, nullptr}, lead.coordinates), results, n_band,
              [removal](const R& r, std::size_t b) {
                return removal ? r.attribution->band_removal_w_m2[b] : r.attribution->band_addition_w_m2[b];
              });
  };
  put_bands("greenhouse_by_band_removal", "greenhouse effect lost when only this longwave band is made transparent", true);
  put_bands("greenhouse_by_band_addition", "greenhouse effect of this longwave band alone (all others transparent)", false);
}

} // namespace bandstack::io::detail
