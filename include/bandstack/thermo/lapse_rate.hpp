#pragma once
// Adiabatic lapse rates (positive when temperature falls with height), K m-1, and temperatures
// along dry adiabats and saturated pseudo-adiabats.
namespace bandstack::thermo {

// Dry adiabatic lapse rate g / c_pd, K m-1 (9.761e-3 K m-1 for standard gravity).
// Throws InputError for g <= 0.
[[nodiscard]] double dry_adiabatic_lapse_rate_k_m(double gravity_m_s2);

// Latent heat of vaporisation at temperature T, J kg-1: (2.501 − 0.00237 (T − 273.15)) 1e6,
// Bolton (1980), Mon. Wea. Rev. 108, eq. (2).
[[nodiscard]] double latent_heat_vaporisation_j_kg(double temperature_k);

// Saturated pseudo-adiabatic lapse rate at (T, p), K m-1: all condensate falls out at once.
// AMS Glossary of Meteorology, "pseudoadiabatic lapse rate":
//   Γ = g (1 + r) (1 + L r / (R_d T)) / (c_pd + r c_pv + L² r (eps + r) / (R_d T²)),
// with r the saturation mixing ratio over liquid (Murphy & Koop 2005; vapour pressure capped as in
// humidity.hpp), L from latent_heat_vaporisation_j_kg (no ice phase). Below 123 K (the liquid
// formula's limit) the vapour is negligible and the dry rate is returned. Throws InputError for
// T >= 332 K, p <= 0 or g <= 0.
[[nodiscard]] double moist_pseudoadiabatic_lapse_rate_k_m(double temperature_k, double pressure_pa,
                                                          double gravity_m_s2);

// Temperature along the saturated pseudo-adiabat through (t0, p0) at pressure p, K, integrating
// dT/dln p = Γ R_d T_v / g (Γ as above, T_v of the saturated air; g cancels) with the classical
// fourth-order Runge-Kutta scheme, steps of at most 0.02 in ln p (truncation error below 1e-7 K
// from 1000 hPa to 100 hPa). Works upward (p < p0) and downward (p > p0). Throws InputError for
// non-positive pressures, t0 <= 0, or if the path reaches 332 K.
[[nodiscard]] double moist_pseudoadiabat_temperature_k(double t0_k, double p0_pa, double p_pa);
// Same with a fixed number of RK4 steps (>= 1), for convergence studies.
[[nodiscard]] double moist_pseudoadiabat_temperature_k(double t0_k, double p0_pa, double p_pa, int steps);

// Temperature along the dry adiabat through (t0, p0) at p, K: Poisson's equation
// T0 (p/p0)^(R_d/c_pd). Throws InputError for non-positive input.
[[nodiscard]] double dry_adiabat_temperature_k(double t0_k, double p0_pa, double p_pa);

} // namespace bandstack::thermo
