#pragma once
// Convective adjustment of a column (Manabe & Strickler 1964, J. Atmos. Sci. 21, 361-385; Manabe &
// Wetherald 1967, J. Atmos. Sci. 24, 241-259): wherever the temperature falls with height faster
// than a critical profile allows, the unstable region is reset to the critical profile, keeping the
// region's enthalpy sum_i c_p T_i dp_i / g (plus C_s T_s when the surface joins) unchanged.
#include <cstddef>
#include <vector>

namespace bandstack::climate {

enum class ConvectionKind {
  none,               // no convection: pure radiative equilibrium
  fixed_lapse_rate,   // a fixed critical lapse rate in height (e.g. 6.5 K/km)
  moist_adiabat       // the saturated pseudo-adiabat (thermo::moist_pseudoadiabat_temperature_k)
};

struct ConvectionSettings {
  ConvectionKind kind = ConvectionKind::fixed_lapse_rate;
  double critical_lapse_rate_k_km = 6.5;  // K per km, > 0 and finite; used by fixed_lapse_rate only
};

// Temperature (K) at pressure p_pa of the critical profile through (t0_k, p0_pa).
// fixed_lapse_rate: T = T0 (p/p0)^(R_d Gamma / g), the hydrostatic (hypsometric) profile of dry air
// whose temperature falls linearly with height at Gamma = critical_lapse_rate_k_km / 1000 K/m
// (virtual-temperature effects neglected). moist_adiabat: the saturated pseudo-adiabat through
// (t0, p0) (gravity unused). Throws InputError for kind none, a bad lapse rate, non-positive input.
[[nodiscard]] double critical_profile_temperature_k(const ConvectionSettings& settings, double t0_k, double p0_pa,
                                                   double p_pa, double gravity_m_s2);

// The ground as a participant in the adjustment (in/out).
struct AdjustedSurface {
  double temperature_k = 288.0;        // skin temperature; on the critical profile at the surface
                                       // pressure after it joins an adjusted region
  double heat_capacity_j_m2_k = 0.0;   // >= 0; 0: the ground stores no heat (it just takes the
                                       // surface-air temperature of the region's profile)
};

struct AdjustmentResult {
  std::vector<bool> layer_adjusted;    // N flags: the layer lies in an adjusted region
  bool surface_adjusted = false;       // the surface joined the lowest adjusted region
  [[nodiscard]] std::size_t adjusted_layer_count() const;
};

// Adjusts layer_temperature_k (N values, K) in place. Layers i (above) and i+1 (below) are unstable
// when T_i < critical_profile(T_{i+1}, p_{i+1}, p_i) by more than a roundoff tolerance (1e-9 K for a
// fixed lapse rate, 1e-6 K for the moist adiabat, whose integration is only that precise);
// the surface (if given) and the lowest layer when T_{N-1} < critical_profile(T_s, p_s, p_{N-1}).
// An unstable pair starts a region, which is set to the critical profile with the enthalpy it had
// and grows up and down while its neighbours are unstable against it; regions that touch merge.
// Surface treatment: the surface air is the skin (the profile passes through (p_s, T_s)), so a
// region that reaches the ground is anchored at the surface pressure and the ground's heat content
// C_s T_s is part of the conserved sum. Layer masses are dp/g from level_pressure_pa (N+1, Pa,
// strictly increasing); layer_pressure_pa (N, Pa) places the layer temperatures.
// Throws InputError for inconsistent sizes or bad settings; InternalError if the regions do not settle.
AdjustmentResult adjust_convectively(const ConvectionSettings& settings, const std::vector<double>& level_pressure_pa,
                                     const std::vector<double>& layer_pressure_pa,
                                     std::vector<double>& layer_temperature_k, double gravity_m_s2,
                                     AdjustedSurface* surface = nullptr);

} // namespace bandstack::climate
