#include "bandstack/spectral/band_set_summary.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <fmt/format.h>
#include <iterator>

namespace bandstack::spectral {

namespace {

std::size_t nearest(const std::vector<double>& grid, double value, bool logarithmic) {
  std::size_t best = 0;
  const auto distance = [&](double x) { return logarithmic ? std::abs(std::log(x / value)) : std::abs(x - value); };
  for (std::size_t i = 1; i < grid.size(); ++i)
    if (distance(grid[i]) < distance(grid[best])) best = i;
  return best;
}

const char* units_of(Absorber a) { return scales_with_vapour_pressure(a) ? "m2 kg-1 Pa-1" : "m2 kg-1"; }

// Amounts of a nominal column that turn kappa into an optical depth, only to decide which absorbers
// are worth listing in a band (kg m-2; the self-continuum's amount is m_h2o * e_h2o in kg m-2 Pa).
// Well-mixed gases: mole fraction (400, 1.8, 0.32 ppmv) x M_gas / M_air x 101325 Pa / g; water: 25 kg m-2,
// about the global-mean precipitable water; ozone: 300 Dobson units; vapour pressure: 1000 Pa.
constexpr std::array<double, absorber_count> nominal_amount{25.0, 6.3, 6.4e-3, 1.0e-2, 5.0e-3, 25.0 * 1000.0};
constexpr double listed_optical_depth = 1e-3;

} // namespace

std::string describe_band_set(const BandSet& set) {
  std::string out;
  auto line = std::back_inserter(out);
  const std::size_t n_band = set.band_count();
  fmt::format_to(line, "band set       {}\n", set.name);
  fmt::format_to(line, "source         {}\n", set.source_description);
  fmt::format_to(line, "built by       bandstack {}\n", set.builder_version);
  if (n_band == 0 || set.ref_pressure_pa.empty() || set.ref_temperature_k.empty()) return out + "(empty band set)\n";
  fmt::format_to(line, "spectrum       {:g} - {:g} cm-1 in {} bands, {} g-points in total\n",
                 set.band_lower_cm1.front(), set.band_upper_cm1.back(), n_band, set.gpoint_count());
  fmt::format_to(line, "tables         pressure {:g} - {:g} Pa ({} values), temperature {:g} - {:g} K ({} values)\n",
                 set.ref_pressure_pa.front(), set.ref_pressure_pa.back(), set.ref_pressure_pa.size(),
                 set.ref_temperature_k.front(), set.ref_temperature_k.back(), set.ref_temperature_k.size());
  if (!set.planck_temperature_k.empty())
    fmt::format_to(line, "Planck table   {:g} - {:g} K ({} values)\n", set.planck_temperature_k.front(),
                   set.planck_temperature_k.back(), set.planck_temperature_k.size());
  std::vector<Absorber> present;
  for (Absorber a : all_absorbers)
    if (set.absorber_present[index(a)]) present.push_back(a);
  fmt::format_to(line, "absorbers     ");
  for (Absorber a : present)
    fmt::format_to(line, " {} ({}){}", absorber_name(a), units_of(a), a == present.back() ? "" : ",");
  fmt::format_to(line, "{}\n", present.empty() ? " none" : "");

  const std::size_t p = nearest(set.ref_pressure_pa, 50000.0, true);
  const std::size_t t = nearest(set.ref_temperature_k, 260.0, false);
  fmt::format_to(line,
                 "\nabsorption coefficient over the g-points of each band at {:g} Pa, {:g} K (table node nearest to "
                 "500 hPa, 260 K):\n",
                 set.ref_pressure_pa[p], set.ref_temperature_k[t]);
  fmt::format_to(line,
                 "(listed: absorbers whose optical depth in a nominal column reaches {:g} somewhere in the band)\n",
                 listed_optical_depth);
  fmt::format_to(line, "{:>5}  {:>17}  {:>8}  {:<19} {:>10}    {:>10}\n", "band", "wavenumber (cm-1)", "g-points",
                 "absorber", "min", "max");
  std::size_t first = 0;
  for (std::size_t b = 0; b < n_band; ++b) {
    std::size_t last = first;
    while (last < set.gpoint_count() && set.gpoint_band[last] == b)
      ++last;
    const std::string edges = fmt::format("{:g} - {:g}", set.band_lower_cm1[b], set.band_upper_cm1[b]);
    bool any = false;
    for (Absorber a : present) {
      double lo = INFINITY, hi = 0.0;
      for (std::size_t g = first; g < last; ++g) {
        lo = std::min(lo, set.kappa(a, g, t, p));
        hi = std::max(hi, set.kappa(a, g, t, p));
      }
      if (!(hi * nominal_amount[index(a)] >= listed_optical_depth)) continue;
      if (!any)
        fmt::format_to(line, "{:>5}  {:>17}  {:>8}  ", b, edges, last - first);
      else
        fmt::format_to(line, "{:36}", "");
      fmt::format_to(line, "{:<19} {:>10.3e} .. {:>10.3e}\n", absorber_name(a), lo, hi);
      any = true;
    }
    if (!any) fmt::format_to(line, "{:>5}  {:>17}  {:>8}  (none)\n", b, edges, last - first);
    first = last;
  }
  return out;
}

} // namespace bandstack::spectral
