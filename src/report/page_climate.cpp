// Greenhouse-effect attribution and experiment results (tables and bars).
#include <cmath>

#include <fmt/format.h>

#include "bandstack/report/svg.hpp"
#include "report/page.hpp"

namespace bandstack::report {

namespace {

constexpr std::size_t max_bar_columns = 4; // columns side by side in one bar chart

const std::vector<double>* find(const std::map<std::string, std::vector<double>>& m, const std::string& key) {
  const auto it = m.find(key);
  return it == m.end() ? nullptr : &it->second;
}

std::string cell(double v, int digits = 4) { return std::isfinite(v) ? format_number(v, digits) : "-"; }

// Bars of a per-column vector (per gas, band or experiment): categories, one series per column.
std::string column_bars(const ResultData& data, const std::string& id, const std::string& title, const AxisSpec& axis,
                        const std::vector<std::string>& categories,
                        const std::map<std::string, std::vector<double>> ColumnProfile::*member, const std::string& key) {
  BarChart c;
  c.id = id;
  c.title = title;
  c.value_axis = axis;
  c.categories = categories;
  for (std::size_t k = 0; k < data.profiles.size() && k < max_bar_columns; ++k) {
    const std::vector<double>* v = find(data.profiles[k].*member, key);
    if (!v || v->size() != categories.size()) continue;
    c.series_names.push_back(short_label(data.profiles[k]));
    c.values.push_back(*v);
  }
  return c.values.empty() ? "" : figure(render_bar_chart(c), "");
}

std::vector<std::string> band_names(const BandEdges& bands) {
  std::vector<std::string> names;
  for (std::size_t b = 0; b < bands.size(); ++b) names.push_back(band_label(bands, b));
  return names;
}

} // namespace

std::string section_attribution(const ResultData& data) {
  if (data.gases.empty() && data.profiles.empty()) return "";
  const AxisSpec axis{"greenhouse effect", "W m-2"};
  std::string body = column_bars(data, "greenhouse-gas-removal", "Greenhouse effect lost when one gas is removed", axis,
                                 data.gases, &ColumnProfile::by_gas, "greenhouse_by_gas_removal");
  body += column_bars(data, "greenhouse-gas-addition", "Greenhouse effect of each gas alone", axis, data.gases,
                      &ColumnProfile::by_gas, "greenhouse_by_gas_addition");
  body += column_bars(data, "greenhouse-band-removal", "Greenhouse effect lost when one band is made transparent", axis,
                      band_names(data.lw_bands), &ColumnProfile::by_band, "greenhouse_by_band_removal");
  if (body.empty()) return "";
  std::vector<std::vector<std::string>> rows;
  for (const ColumnProfile& p : data.profiles)
    if (p.greenhouse_effect_w_m2) rows.push_back({short_label(p), cell(p.surface_temperature_k), cell(p.olr_w_m2), cell(*p.greenhouse_effect_w_m2)});
  const std::string totals = table({"column", "surface temperature (K)", "OLR (W m-2)", "greenhouse effect (W m-2)"}, rows);
  return section("attribution", "Greenhouse effect by gas and by band",
                 "The greenhouse effect is the surface's blackbody emission minus the OLR. Removal and addition "
                 "attributions differ because the absorbers overlap.",
                 totals + "<div class=\"plots\">" + body + "</div>");
}

std::string section_experiments(const ResultData& data) {
  if (data.experiments.empty() || data.profiles.empty()) return "";
  static const std::vector<std::pair<std::string, std::string>> columns = {
      {"forcing_toa_instantaneous", "instantaneous forcing, top (W m-2)"},
      {"forcing_tropopause_instantaneous", "instantaneous forcing, tropopause (W m-2)"},
      {"forcing_adjusted", "adjusted forcing (W m-2)"},
      {"surface_temperature_change", "surface temperature change (K)"},
      {"warming_per_co2_doubling", "warming per CO2 doubling (K)"},
      {"climate_feedback_parameter", "feedback parameter (W m-2 K-1)"}};
  std::vector<std::string> header = {"column", "experiment"};
  for (const auto& [name, title] : columns) header.push_back(title);
  std::vector<std::vector<std::string>> rows;
  for (const ColumnProfile& p : data.profiles)
    for (std::size_t e = 0; e < data.experiments.size(); ++e) {
      std::vector<std::string> row = {short_label(p), data.experiments[e]};
      for (const auto& [name, title] : columns) {
        const std::vector<double>* v = find(p.by_experiment, name);
        row.push_back(cell(v && e < v->size() ? (*v)[e] : std::nan("")));
      }
      rows.push_back(std::move(row));
    }
  std::string body = column_bars(data, "forcing-adjusted", "Adjusted forcing", {"forcing", "W m-2"}, data.experiments,
                                 &ColumnProfile::by_experiment, "forcing_adjusted");
  body += column_bars(data, "surface-temperature-change", "Surface temperature change", {"surface temperature change", "K"},
                      data.experiments, &ColumnProfile::by_experiment, "surface_temperature_change");
  // Feedback terms of each experiment, for the first column drawn.
  const ColumnProfile& first = data.profiles.front();
  static const std::vector<std::pair<std::string, std::string>> terms = {
      {"feedback_planck", "Planck"}, {"feedback_lapse_rate", "lapse rate"}, {"feedback_water_vapour", "water vapour"},
      {"feedback_stratospheric_temperature", "stratospheric temperature"}, {"feedback_residual", "residual"},
      {"climate_feedback_parameter", "total (feedback parameter)"}};
  BarChart feedbacks;
  feedbacks.id = "feedbacks";
  feedbacks.title = "Feedbacks: " + short_label(first);
  feedbacks.value_axis = {"feedback", "W m-2 K-1"};
  for (const auto& [name, title] : terms) feedbacks.categories.push_back(title);
  bool any = false;
  for (std::size_t e = 0; e < data.experiments.size(); ++e) {
    std::vector<double> values;
    for (const auto& [name, title] : terms) {
      const std::vector<double>* v = find(first.by_experiment, name);
      values.push_back(v && e < v->size() ? (*v)[e] : std::nan(""));
      any = any || std::isfinite(values.back());
    }
    feedbacks.series_names.push_back(data.experiments[e]);
    feedbacks.values.push_back(std::move(values));
  }
  if (any) body += figure(render_bar_chart(feedbacks), "Partial radiative perturbation terms; negative values stabilise.");
  return section("experiments", "Experiments",
                 "Forcing is the change of the net downward flux, positive when it warms; '-' marks values the "
                 "experiment does not define.",
                 table(header, rows, 2) + "<div class=\"plots\">" + body + "</div>");
}

} // namespace bandstack::report
