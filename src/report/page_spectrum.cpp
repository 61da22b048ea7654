// The outgoing longwave spectrum by band against blackbody curves.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/constants.hpp"
#include "bandstack/report/svg.hpp"
#include "bandstack/spectral/planck.hpp"
#include "report/page.hpp"

namespace bandstack::report {

namespace {

// Hemispheric blackbody flux density pi B_nu(T) in W m-2 (cm-1)-1 on a regular wavenumber grid.
Series blackbody(double t_k, double nu_max_cm1, std::size_t style) {
  Series s;
  s.name = fmt::format("blackbody {} K", format_number(t_k, 4));
  s.style = style;
  s.width = 1.2;
  s.points = false;
  const int n = 160;
  for (int i = 1; i <= n; ++i) {
    const double nu = nu_max_cm1 * i / n;
    s.x.push_back(nu);
    s.y.push_back(constants::pi * spectral::planck_radiance(nu, t_k));
  }
  return s;
}

std::string spectrum_chart(const ResultData& data, const ColumnProfile& p, std::size_t k) {
  const BandEdges& bands = data.lw_bands;
  LineChart c;
  c.id = fmt::format("spectrum-{}", k);
  c.title = "Outgoing longwave by band: " + short_label(p);
  c.x = {"wavenumber", "cm-1"};
  c.y = {"flux per wavenumber", "W m-2 (cm-1)-1"};
  c.y.include_zero = true;
  const double nu_max = std::min(bands.upper_cm1.back(), 2500.0);
  std::vector<double> temperatures = {200.0, 240.0, 280.0};
  if (std::isfinite(p.surface_temperature_k)) temperatures.push_back(p.surface_temperature_k);
  std::sort(temperatures.begin(), temperatures.end());
  std::size_t style = 1;
  for (const double t : temperatures) c.series.push_back(blackbody(t, nu_max, style++));
  Series olr;
  olr.name = "OLR by band (band mean)";
  olr.steps = true;
  olr.style = 0;
  olr.width = 2.4;
  for (std::size_t b = 0; b < bands.size(); ++b) {
    const double width = bands.upper_cm1[b] - bands.lower_cm1[b];
    if (bands.lower_cm1[b] >= nu_max) break;
    olr.x_edges.push_back(bands.lower_cm1[b]);
    olr.x.push_back(0.5 * (bands.lower_cm1[b] + std::min(bands.upper_cm1[b], nu_max)));
    olr.y.push_back(p.olr_by_band_w_m2[b] / width);
  }
  olr.x_edges.push_back(std::min(bands.upper_cm1[olr.y.size() - 1], nu_max));
  c.series.push_back(std::move(olr));
  return figure(render_line_chart(c),
                fmt::format("Where the black steps fall below the {} K surface curve, the bands' gases absorb the surface's "
                            "emission and emit from colder air. OLR {} W m-2.",
                            format_number(p.surface_temperature_k, 4), format_number(p.olr_w_m2, 4)));
}

} // namespace

std::string section_spectrum(const ResultData& data) {
  if (data.lw_bands.size() == 0 || data.profiles.empty()) return "";
  std::string body;
  for (std::size_t k = 0; k < data.profiles.size() && k < 3; ++k)
    if (data.profiles[k].olr_by_band_w_m2.size() == data.lw_bands.size()) body += spectrum_chart(data, data.profiles[k], k);
  if (body.empty()) return "";
  return section("spectrum", "Outgoing longwave spectrum",
                 "Upward longwave flux at the top of the atmosphere in each band, divided by the band width, with "
                 "blackbody curves (pi times the Planck radiance) at several temperatures.",
                 "<div class=\"plots\">" + body + "</div>");
}

} // namespace bandstack::report
