#pragma once
// Absorbers and absorber sources: where absorption on a fine wavenumber grid comes from.
//
// An absorber is a gas, or the water-vapour self-continuum, which scales differently:
//   gases:           tau = kappa(nu; p, T) * m_gas                    kappa in m2 kg-1
//   h2o self-cont.:  tau = kappa(nu; T)    * m_h2o * e_h2o            kappa in m2 kg-1 Pa-1
// where m is the layer mass of the gas per unit area (kg m-2) and e_h2o the water vapour partial
// pressure (Pa). Any pressure dependence of a gas's kappa (pressure broadening) is inside kappa.
#include <array>
#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <string_view>

#include "bandstack/core/gas.hpp"

namespace bandstack::spectral {

enum class Absorber : std::size_t { h2o = 0, co2, o3, ch4, n2o, h2o_self_continuum };
inline constexpr std::size_t absorber_count = 6;
inline constexpr std::array<Absorber, absorber_count> all_absorbers{
    Absorber::h2o, Absorber::co2, Absorber::o3, Absorber::ch4, Absorber::n2o, Absorber::h2o_self_continuum};

constexpr std::size_t index(Absorber a) noexcept { return static_cast<std::size_t>(a); }
// "h2o", "co2", "o3", "ch4", "n2o", "h2o_self_continuum" (used in files).
[[nodiscard]] std::string_view absorber_name(Absorber a) noexcept;
[[nodiscard]] std::optional<Absorber> absorber_from_name(std::string_view name) noexcept;
// The gas whose mass multiplies kappa (h2o for the self-continuum).
[[nodiscard]] Gas absorber_gas(Absorber a) noexcept;
// True for absorbers whose tau also scales with the water vapour partial pressure.
[[nodiscard]] constexpr bool scales_with_vapour_pressure(Absorber a) noexcept { return a == Absorber::h2o_self_continuum; }

// A uniform wavenumber grid: nu_i = start_cm1 + (i + 0.5) * step_cm1, i = 0..count-1, i.e. the
// midpoints of `count` intervals of width step_cm1 tiling [start_cm1, start_cm1 + count*step_cm1].
struct WavenumberGrid {
  double start_cm1 = 10.0;
  double step_cm1 = 0.01;
  std::size_t count = 0;
  [[nodiscard]] double at(std::size_t i) const noexcept { return start_cm1 + (static_cast<double>(i) + 0.5) * step_cm1; }
  [[nodiscard]] double end_cm1() const noexcept { return start_cm1 + static_cast<double>(count) * step_cm1; }
};
// The grid of intervals of width step_cm1 covering [lower_cm1, upper_cm1] (upper - lower must be a
// whole number of steps to 1e-9 relative). Throws InputError otherwise.
[[nodiscard]] WavenumberGrid make_wavenumber_grid(double lower_cm1, double upper_cm1, double step_cm1);

// The thermodynamic state an absorption coefficient is evaluated at.
struct AbsorberState {
  double pressure_pa = 101325.0;
  double temperature_k = 288.0;
};

// A source of absorption coefficients on a fine wavenumber grid: the embedded analytic recipe or a
// user's cross-section file. The band builder and the line-resolved reference treat all sources alike.
class AbsorberSource {
public:
  virtual ~AbsorberSource() = default;
  // One line saying where the numbers come from (file name, recipe name and version): provenance.
  [[nodiscard]] virtual std::string description() const = 0;
  // Whether this source has any absorption for `a` (if not, absorption() fills zeros).
  [[nodiscard]] virtual bool provides(Absorber a) const = 0;
  // kappa of absorber `a` at `state` at every point of `grid` (units as in the header comment),
  // written to out (size grid.count). Throws InputError if the state is outside what the source covers.
  virtual void absorption(Absorber a, const AbsorberState& state, const WavenumberGrid& grid, std::span<double> out) const = 0;
};

} // namespace bandstack::spectral
