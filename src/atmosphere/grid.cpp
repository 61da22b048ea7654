#include "bandstack/atmosphere/grid.hpp"

#include <cmath>
#include <string>

#include "bandstack/core/error.hpp"

namespace bandstack::atmosphere {

namespace {

[[noreturn]] void bad(const char* item, const std::string& message) { throw InputError(InputPlace::of(item), message); }

} // namespace

std::vector<double> level_pressures_pa(const GridSpec& grid) {
  if (grid.layers < 1) bad("layers", "a grid needs at least 1 layer, got 0");
  const double top = grid.top_pressure_pa;
  const double surface = grid.surface_pressure_pa;
  if (!std::isfinite(top) || !(top > 0.0))
    bad("top_pressure", "must be finite and > 0 Pa, got " + std::to_string(top));
  if (!std::isfinite(surface) || !(surface > top))
    bad("surface_pressure", "must be finite and greater than the top pressure (" + std::to_string(top) +
                                " Pa), got " + std::to_string(surface));

  const std::size_t n = grid.layers;
  std::vector<double> p(n + 1);
  const double steps = static_cast<double>(n);
  if (grid.spacing == Spacing::log_pressure) {
    const double ln_top = std::log(top);
    const double ln_span = std::log(surface) - ln_top;
    for (std::size_t k = 0; k <= n; ++k) p[k] = std::exp(ln_top + ln_span * (static_cast<double>(k) / steps));
  } else {
    const double span = surface - top;
    for (std::size_t k = 0; k <= n; ++k) p[k] = top + span * (static_cast<double>(k) / steps);
  }
  // The ends are part of the contract: set them exactly, free of rounding in exp/log.
  p.front() = top;
  p.back() = surface;
  for (std::size_t k = 1; k <= n; ++k)
    if (!(p[k] > p[k - 1]))
      bad("layers", std::to_string(n) + " layers are too many to resolve between " + std::to_string(top) +
                        " and " + std::to_string(surface) + " Pa in double precision");
  return p;
}

std::vector<double> layer_pressures_pa(const std::vector<double>& level_pressure_pa) {
  std::vector<double> p;
  if (level_pressure_pa.size() < 2) return p;
  p.resize(level_pressure_pa.size() - 1);
  for (std::size_t i = 0; i + 1 < level_pressure_pa.size(); ++i)
    p[i] = 0.5 * (level_pressure_pa[i] + level_pressure_pa[i + 1]);
  return p;
}

} // namespace bandstack::atmosphere
