#pragma once
// Adiabatic lapse rates (positive when temperature falls with height), K m-1.
namespace bandstack::thermo {

// Dry adiabatic lapse rate g / c_pd.
[[nodiscard]] double dry_adiabatic_lapse_rate_k_m(double gravity_m_s2);

// Saturated pseudo-adiabatic lapse rate at (T, p): all condensate falls out at once.
// Liquid saturation and latent heat of vaporisation (no ice phase).
[[nodiscard]] double moist_pseudoadiabatic_lapse_rate_k_m(double temperature_k, double pressure_pa,
                                                          double gravity_m_s2);

// Temperature along the saturated pseudo-adiabat through (t0, p0) at pressure p, K, by integrating
// dT/dln p with an adaptive or fixed-step Runge-Kutta scheme accurate to 1e-6 K.
[[nodiscard]] double moist_pseudoadiabat_temperature_k(double t0_k, double p0_pa, double p_pa);

// Temperature along the dry adiabat through (t0, p0) at p: Poisson's equation T0 (p/p0)^(R_d/c_pd).
[[nodiscard]] double dry_adiabat_temperature_k(double t0_k, double p0_pa, double p_pa);

} // namespace bandstack::thermo
