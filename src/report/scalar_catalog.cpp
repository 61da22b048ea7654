#include "report/scalar_catalog.hpp"

namespace bandstack::report {

std::vector<ShownScalar> shown_scalars(const ResultData& data, std::size_t max_experiments) {
  static const std::vector<std::pair<std::string, std::string>> plain = {
      {"olr", "OLR"}, {"surface_temperature", "surface temperature"}, {"absorbed_solar", "absorbed sunlight"},
      {"toa_net_flux", "net flux at the top"}, {"greenhouse_effect", "greenhouse effect"}};
  static const std::vector<std::pair<std::string, std::string>> per_experiment = {
      {"forcing_adjusted", "adjusted forcing"}, {"surface_temperature_change", "surface temperature change"}};
  std::vector<ShownScalar> out;
  for (const auto& [name, title] : plain)
    if (const ScalarField* f = data.scalar(name)) out.push_back({f, title, {title, f->units}, name});
  for (std::size_t e = 0; e < data.experiments.size() && e < max_experiments; ++e)
    for (const auto& [name, title] : per_experiment)
      if (const ScalarField* f = data.scalar(name, data.experiments[e]))
        out.push_back({f, title + ", " + data.experiments[e], {title, f->units}, name + "-" + std::to_string(e)});
  return out;
}

} // namespace bandstack::report
