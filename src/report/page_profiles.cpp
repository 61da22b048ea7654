// Temperature profiles and heating rates against pressure (log axis, surface at the bottom).
#include <fmt/format.h>

#include "bandstack/report/svg.hpp"
#include "report/page.hpp"

namespace bandstack::report {

namespace {

constexpr double hpa_per_pa = 0.01;

std::vector<double> to_hpa(const std::vector<double>& pa) {
  std::vector<double> out;
  out.reserve(pa.size());
  for (const double p : pa) out.push_back(p * hpa_per_pa);
  return out;
}

AxisSpec pressure_axis() { return {"pressure", "hPa", Scale::log, true, false}; }

Series series(std::string name, std::vector<double> x, const std::vector<double>& pressure_pa, std::size_t style,
              bool points = true) {
  Series s;
  s.name = std::move(name);
  s.x = std::move(x);
  s.y = to_hpa(pressure_pa);
  s.style = style;
  s.points = points;
  return s;
}

std::string tropopause_name(const ColumnProfile& p) {
  return p.tropopause_from_file ? "tropopause (as used by the experiments)" : "lapse-rate tropopause (WMO)";
}

// One chart per column: the equilibrium against the state it started from.
std::string equilibrium_charts(const ResultData& data) {
  std::string body;
  for (std::size_t k = 0; k < data.profiles.size(); ++k) {
    const ColumnProfile& p = data.profiles[k];
    LineChart c;
    c.id = fmt::format("temperature-{}", k);
    c.title = "Temperature: " + short_label(p);
    c.x = {"temperature", "K"};
    c.y = pressure_axis();
    c.series.push_back(series("equilibrium", p.temperature_layer_k, p.pressure_layer_pa, 0));
    if (!p.initial_temperature_layer_k.empty())
      c.series.push_back(series("initial state (first guess)", p.initial_temperature_layer_k, p.initial_pressure_layer_pa, 1));
    if (p.tropopause_pressure_pa) c.references.push_back({true, *p.tropopause_pressure_pa * hpa_per_pa, tropopause_name(p), 2});
    if (p.convective_top_pressure_pa && data.profiles[k].pressure_level_pa.size() > 1 &&
        *p.convective_top_pressure_pa < p.pressure_level_pa.back())
      c.references.push_back({true, *p.convective_top_pressure_pa * hpa_per_pa, "top of the convective region", 3});
    body += figure(render_line_chart(c), p.why.empty() ? "" : "Shown as the column of " + p.why + ".");
  }
  return body;
}

// All columns on one chart (no equilibrium, so no initial state to compare with).
std::string combined_chart(const ResultData& data) {
  LineChart c;
  c.id = "temperature";
  c.title = "Temperature profiles";
  c.x = {"temperature", "K"};
  c.y = pressure_axis();
  for (std::size_t k = 0; k < data.profiles.size(); ++k) {
    const ColumnProfile& p = data.profiles[k];
    c.series.push_back(series(short_label(p), p.temperature_layer_k, p.pressure_layer_pa, k));
    if (p.tropopause_pressure_pa)
      c.references.push_back({true, *p.tropopause_pressure_pa * hpa_per_pa, "tropopause " + std::to_string(k + 1), k});
  }
  return figure(render_line_chart(c), "Horizontal lines: " + (data.profiles.empty() ? std::string() : tropopause_name(data.profiles[0])) +
                                          " of each column, numbered in legend order.");
}

std::string heating_total(const ResultData& data, bool longwave) {
  LineChart c;
  c.id = longwave ? "lw-heating" : "sw-heating";
  c.title = longwave ? "Longwave heating rate" : "Shortwave heating rate";
  c.x = {"heating rate", "K day-1"};
  c.y = pressure_axis();
  bool any = false;
  for (std::size_t k = 0; k < data.profiles.size(); ++k) {
    const ColumnProfile& p = data.profiles[k];
    const std::vector<double>& h = longwave ? p.lw_heating_k_day : p.sw_heating_k_day;
    if (h.empty()) continue;
    any = true;
    c.series.push_back(series(short_label(p), h, p.pressure_layer_pa, k));
  }
  return any ? figure(render_line_chart(c), "") : "";
}

std::string heating_by_band(const ResultData& data, bool longwave) {
  if (data.profiles.empty()) return "";
  const ColumnProfile& p = data.profiles.front();
  const auto& by_band = longwave ? p.lw_heating_by_band_k_day : p.sw_heating_by_band_k_day;
  const BandEdges& bands = longwave ? data.lw_bands : data.sw_bands;
  if (by_band.empty() || by_band.size() != bands.size()) return "";
  LineChart c;
  c.id = longwave ? "lw-heating-by-band" : "sw-heating-by-band";
  c.title = std::string(longwave ? "Longwave" : "Shortwave") + " heating by band: " + short_label(p);
  c.x = {"heating rate", "K day-1"};
  c.y = pressure_axis();
  for (std::size_t b = 0; b < by_band.size(); ++b) {
    Series s = series(band_label(bands, b), by_band[b], p.pressure_layer_pa, b, false);
    s.width = 1.5;
    c.series.push_back(std::move(s));
  }
  return figure(render_line_chart(c), "Each band's share of the heating; the bands add up to the total. Hover a line for its band.");
}

} // namespace

std::string section_profiles(const ResultData& data) {
  if (data.profiles.empty()) return "";
  bool initial = false;
  for (const ColumnProfile& p : data.profiles) initial = initial || !p.initial_temperature_layer_k.empty();
  const std::string note = data.profiles.size() < data.column_count
                               ? fmt::format("{} of {} columns are drawn, chosen by their OLR.", data.profiles.size(), data.column_count)
                               : "";
  const std::string body = initial ? equilibrium_charts(data) : combined_chart(data);
  return section("profiles", initial ? "Temperature: equilibrium and initial state" : "Temperature profiles", note,
                 "<div class=\"plots\">" + body + "</div>");
}

std::string section_heating(const ResultData& data) {
  const std::string body = heating_total(data, true) + heating_total(data, false) + heating_by_band(data, true) +
                           heating_by_band(data, false);
  if (body.empty()) return "";
  return section("heating", "Heating rates", "Radiative heating of each layer; positive warms.",
                 "<div class=\"plots\">" + body + "</div>");
}

} // namespace bandstack::report
