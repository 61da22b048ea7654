#include "bandstack/spectral/absorber.hpp"

#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"

namespace bandstack::spectral {

namespace {
constexpr std::array<std::string_view, absorber_count> names{"h2o", "co2", "o3", "ch4", "n2o", "h2o_self_continuum"};
constexpr std::array<Gas, absorber_count> gases{Gas::h2o, Gas::co2, Gas::o3, Gas::ch4, Gas::n2o, Gas::h2o};

InputPlace place_of(const char* item) {
  InputPlace place;
  place.item = item;
  return place;
}
} // namespace

std::string_view absorber_name(Absorber a) noexcept { return names[index(a)]; }

std::optional<Absorber> absorber_from_name(std::string_view name) noexcept {
  for (Absorber a : all_absorbers)
    if (names[index(a)] == name) return a;
  return std::nullopt;
}

Gas absorber_gas(Absorber a) noexcept { return gases[index(a)]; }

WavenumberGrid make_wavenumber_grid(double lower_cm1, double upper_cm1, double step_cm1) {
  const auto describe = [&] { return fmt::format("[{}, {}] cm-1 with step {} cm-1", lower_cm1, upper_cm1, step_cm1); };
  if (!std::isfinite(lower_cm1) || !std::isfinite(upper_cm1) || !std::isfinite(step_cm1))
    throw InputError(place_of("wavenumber grid"), "bounds and step must be finite numbers, got " + describe());
  if (!(step_cm1 > 0.0)) throw InputError(place_of("wavenumber grid"), "step must be > 0, got " + describe());
  if (!(lower_cm1 >= 0.0)) throw InputError(place_of("wavenumber grid"), "lower bound must be >= 0, got " + describe());
  if (!(upper_cm1 > lower_cm1))
    throw InputError(place_of("wavenumber grid"), "upper bound must exceed the lower bound, got " + describe());
  const double steps = (upper_cm1 - lower_cm1) / step_cm1;
  const double whole = std::round(steps);
  // 1e-9 relative to the number of steps: 0.01 cm-1 steps over 10..3000 cm-1 pass despite rounding
  // of the decimal inputs; a step that does not tile the range does not.
  if (whole < 1.0 || std::abs(steps - whole) > 1e-9 * whole)
    throw InputError(place_of("wavenumber grid"),
                     fmt::format("the range is not a whole number of steps ({} steps): {}", steps, describe()));
  if (whole > 1e9) throw InputError(place_of("wavenumber grid"), "more than 1e9 grid points: " + describe());
  return WavenumberGrid{lower_cm1, step_cm1, static_cast<std::size_t>(whole)};
}

} // namespace bandstack::spectral
