#include "batch/column_cache.hpp"

#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <tuple>

namespace bandstack::batch {

namespace {

// Everything make_column's profiles depend on (not the well-mixed gases or the surface properties).
using Key = std::tuple<int, std::optional<double>, double, double, double, std::size_t, double, double, int>;

Key key_of(const atmosphere::ProfileSettings& s, const atmosphere::GridSpec& g) {
  return {static_cast<int>(s.profile), s.surface_temperature_k, s.surface_relative_humidity,
          s.stratospheric_h2o_mole_fraction, s.ozone_scale, g.layers, g.top_pressure_pa, g.surface_pressure_pa,
          static_cast<int>(g.spacing)};
}

constexpr std::size_t max_entries = 256; // the cache is emptied when full

} // namespace

atmosphere::Column cached_make_column(const atmosphere::ProfileSettings& settings, const atmosphere::GridSpec& grid,
                                      const std::string& name) {
  static std::mutex mutex;
  static std::map<Key, std::shared_ptr<const atmosphere::Column>> cache;
  const Key key = key_of(settings, grid);
  std::shared_ptr<const atmosphere::Column> base;
  {
    const std::lock_guard lock(mutex);
    if (const auto found = cache.find(key); found != cache.end()) base = found->second;
  }
  if (!base) {
    // Built with the settings themselves, so that their checks (and errors) are make_column's own.
    auto built = std::make_shared<const atmosphere::Column>(atmosphere::make_column(settings, grid, name));
    const std::lock_guard lock(mutex);
    if (cache.size() >= max_entries) cache.clear();
    cache.emplace(key, built);
    return *built;
  }
  // The parts make_column merely assigns from the settings (atmosphere::validate checks their ranges).
  atmosphere::Column c = *base;
  c.name = name.empty() ? std::string(atmosphere::profile_name(settings.profile)) : name;
  const std::size_t n = c.layer_count();
  c.gas(Gas::co2).assign(n, settings.co2_mole_fraction);
  c.gas(Gas::ch4).assign(n, settings.ch4_mole_fraction);
  c.gas(Gas::n2o).assign(n, settings.n2o_mole_fraction);
  c.surface_emissivity = settings.surface_emissivity;
  c.surface_albedo = settings.surface_albedo;
  atmosphere::validate(c);
  return c;
}

} // namespace bandstack::batch
