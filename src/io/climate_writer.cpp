// The climate variables of a result file (docs/output-file.md): equilibrium diagnostics, experiment
// results and the greenhouse attribution.
#include <cmath>
#include <limits>
#include <vector>

#include "bandstack/core/error.hpp"
#include "io/netcdf_put.hpp"

namespace bandstack::io::detail {

namespace {

constexpr double missing = std::numeric_limits<double>::quiet_NaN();

// A double variable whose missing values are NaN (the CF _FillValue), with extra coordinates.
Variable& add_with_fill(Table& t, const std::string& name, std::vector<std::string> dims, const Attributes& a,
                        const std::string& coordinates) {
  Variable& v = t.add(name, std::move(dims), a, coordinates);
  v.fill_nan = true;
  return v;
}

// The table's coordinates plus one more.
std::string with_coordinate(const Table& t, const std::string& name) {
  return t.coordinates.empty() ? name : t.coordinates + " " + name;
}

} // namespace

void describe_equilibrium(Table& t, const R& sample) {
  if (!sample.equilibrium) return;
  t.scalar("equilibrium_newton_iterations", {"1", "Newton iterations taken to reach equilibrium", nullptr},
           [](const R& r) { return static_cast<double>(r.equilibrium->newton_iterations); });
  t.scalar("equilibrium_time_steps", {"1", "time-marching steps taken (0 when Newton's method converged)", nullptr},
           [](const R& r) { return static_cast<double>(r.equilibrium->time_steps); });
  t.scalar("equilibrium_radiative_calls", {"1", "radiative evaluations of the column used to reach equilibrium", nullptr},
           [](const R& r) { return static_cast<double>(r.equilibrium->radiative_calls); });
  t.scalar("equilibrium_max_heating_residual", {"K day-1", "largest absolute radiative heating rate left in a radiative layer", nullptr},
           [](const R& r) { return r.equilibrium->max_radiative_heating_k_day; });
  t.scalar("equilibrium_toa_net_residual", {"W m-2", "net downward flux left at the top of the atmosphere", nullptr},
           [](const R& r) { return r.equilibrium->toa_net_w_m2; });
  t.scalar("equilibrium_convective_region_residual", {"W m-2", "net radiative flux left into the convective region and the ground", nullptr},
           [](const R& r) { return r.equilibrium->region_net_w_m2; });
  t.scalar("convective_top_pressure", {"Pa", "pressure at the top of the convective region (the surface pressure when there is none)", nullptr},
           [](const R& r) { return r.equilibrium->convective_top_pressure_pa(); });
  Variable flag;
  flag.name = "convective_layer";
  flag.storage = Storage::i8;
  flag.dims = {"layer"};
  flag.values_per_column = t.dim_size("layer");
  flag.attributes.emplace_back("long_name", "1 where the layer belongs to the convective region of the equilibrium, else 0");
  if (!t.coordinates.empty()) flag.attributes.emplace_back("coordinates", t.coordinates);
  flag.get = [n = flag.values_per_column](const R& r, double* out) {
    if (r.equilibrium->convective.size() != n) throw InternalError("convective_layer length mismatch");
    for (std::size_t i = 0; i < n; ++i) out[i] = r.equilibrium->convective[i] ? 1.0 : 0.0;
  };
  t.variables.push_back(std::move(flag));
}

void describe_experiments(Table& t, const R& sample, const std::vector<std::string>& experiment_names) {
  if (experiment_names.empty()) return;
  const std::size_t n_exp = experiment_names.size();
  if (sample.experiments.size() != n_exp) throw InternalError("every column needs one result per experiment");
  t.names("experiment", "experiment_name", experiment_names, "experiment label from the study");
  const std::string coordinates = with_coordinate(t, "experiment_name");
  using E = climate::ExperimentResult;
  const auto put = [&](const std::string& name, const Attributes& a, std::function<double(const E&)> get) {
    add_with_fill(t, name, {"experiment"}, a, coordinates).get = [get = std::move(get), n_exp](const R& r, double* out) {
      for (std::size_t e = 0; e < n_exp; ++e) out[e] = get(r.experiments[e]);
    };
  };
  add_with_fill(t, "tropopause_pressure", {"experiment"},
                {"Pa", "pressure at the tropopause level used for the forcing and the feedback split", "tropopause_air_pressure"}, coordinates)
      .get = [n_exp](const R& r, double* out) {
    for (std::size_t e = 0; e < n_exp; ++e) out[e] = r.column.pressure_level_pa[r.experiments[e].tropopause_level];
  };
  put("forcing_toa_instantaneous", {"W m-2", "instantaneous radiative forcing at the top of the atmosphere (change of net downward flux, temperatures fixed)", nullptr},
      [](const E& e) { return e.forcing.toa_instantaneous_w_m2; });
  put("forcing_tropopause_instantaneous", {"W m-2", "instantaneous radiative forcing at the tropopause", nullptr},
      [](const E& e) { return e.forcing.tropopause_instantaneous_w_m2; });
  put("forcing_adjusted", {"W m-2", "stratosphere-adjusted radiative forcing at the tropopause (fixed dynamical heating)", nullptr},
      [](const E& e) { return e.forcing.adjusted_w_m2; });
  put("forcing_adjusted_toa", {"W m-2", "stratosphere-adjusted radiative forcing at the top of the atmosphere (equals forcing_adjusted once the stratosphere has adjusted)", nullptr},
      [](const E& e) { return e.forcing.adjusted_toa_w_m2; });
  const std::size_t n_layer = t.dim_size("layer");
  add_with_fill(t, "temperature_layer_adjusted", {"experiment", "layer"},
                {"K", "layer temperature with the stratosphere adjusted to the perturbation (troposphere unchanged)", "air_temperature"}, coordinates)
      .get = [n_layer](const R& r, double* out) {
    for (const E& e : r.experiments) {
      if (e.forcing.adjusted_temperature_layer_k.size() != n_layer) throw InternalError("temperature_layer_adjusted length mismatch");
      out = std::copy(e.forcing.adjusted_temperature_layer_k.begin(), e.forcing.adjusted_temperature_layer_k.end(), out);
    }
  };
  if (!sample.equilibrium) return;
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
  add_with_fill(t, "temperature_layer_perturbed", {"experiment", "layer"},
                {"K", "layer temperature of the perturbed equilibrium", "air_temperature"}, coordinates)
      .get = [n_layer](const R& r, double* out) {
    for (const E& e : r.experiments) {
      if (e.equilibrium) {
        if (e.equilibrium->column.temperature_layer_k.size() != n_layer) throw InternalError("temperature_layer_perturbed length mismatch");
        out = std::copy(e.equilibrium->column.temperature_layer_k.begin(), e.equilibrium->column.temperature_layer_k.end(), out);
      } else {
        out = std::fill_n(out, n_layer, missing);
      }
    }
  };
}

void describe_attribution(Table& t, const R& sample) {
  if (!sample.attribution) return;
  std::vector<std::string> names;
  for (Gas g : all_gases) names.emplace_back(gas_name(g));
  t.names("gas", "gas_name", names, "radiatively active gas (h2o includes its continuum)");
  t.scalar("greenhouse_effect", {"W m-2", "surface emission sigma Ts^4 minus the outgoing longwave flux", nullptr},
           [](const R& r) { return r.attribution->greenhouse_effect_w_m2; });
  const auto put_gases = [&](const std::string& name, const char* long_name, bool removal) {
    add_with_fill(t, name, {"gas"}, {"W m-2", long_name, nullptr}, with_coordinate(t, "gas_name")).get = [removal](const R& r, double* out) {
      const auto& v = removal ? r.attribution->gas_removal_w_m2 : r.attribution->gas_addition_w_m2;
      for (std::size_t g = 0; g < gas_count; ++g) out[g] = v[g];
    };
  };
  put_gases("greenhouse_by_gas_removal", "greenhouse effect lost when only this gas is removed", true);
  put_gases("greenhouse_by_gas_addition", "greenhouse effect of this gas alone", false);
  const std::size_t n_band = sample.attribution->band_removal_w_m2.size();
  if (n_band == 0) return;
  if (!t.has_dim("band_lw") || t.dim_size("band_lw") != n_band) throw InternalError("band attribution needs the band_lw dimension");
  const auto put_bands = [&](const std::string& name, const char* long_name, bool removal) {
    add_with_fill(t, name, {"band_lw"}, {"W m-2", long_name, nullptr}, t.coordinates).get = [removal, n_band](const R& r, double* out) {
      const auto& v = removal ? r.attribution->band_removal_w_m2 : r.attribution->band_addition_w_m2;
      if (v.size() != n_band) throw InternalError("band attribution length mismatch");
      std::copy(v.begin(), v.end(), out);
    };
  };
  put_bands("greenhouse_by_band_removal", "greenhouse effect lost when only this longwave band is made transparent", true);
  put_bands("greenhouse_by_band_addition", "greenhouse effect of this longwave band alone (all others transparent)", false);
}

} // namespace bandstack::io::detail
