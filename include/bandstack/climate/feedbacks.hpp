#pragma once
// Feedback terms from two equilibria by partial radiative perturbation (Wetherald & Manabe 1988,
// J. Atmos. Sci. 45, 1397-1415), two-sided (Colman & McAvaney 1997, J. Geophys. Res. 102,
// 19383-19402; from memory): each field's change is substituted into the base state (forward) and
// the field's base value into the perturbed state (backward), and the two TOA net-flux changes are
// averaged. Terms are W m-2 K-1 per kelvin of surface warming; negative terms stabilise, and
// equilibrium requires F + sum(terms) dTs = 0, so sum(terms) ~ -F_adjusted / dTs.
#include <cstddef>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/forcing.hpp"
#include "bandstack/climate/radiation.hpp"

namespace bandstack::climate {

struct FeedbackTerms {
  double planck_w_m2_k = 0.0;                     // surface and troposphere warmed uniformly by dTs
  double lapse_rate_w_m2_k = 0.0;                 // tropospheric warming minus the uniform dTs
  double water_vapour_w_m2_k = 0.0;               // the change of h2o (0 with fixed mixing ratio)
  double stratospheric_temperature_w_m2_k = 0.0;  // temperature change above the tropopause
  double total_w_m2_k = 0.0;                      // -F_adjusted / dTs (the climate feedback parameter)
  double residual_w_m2_k = 0.0;                   // total - sum of the four terms (nonlinearity)
};

// base / perturbed: the two equilibrium states (same grid); base_radiation / perturbed_radiation:
// their radiations (they differ when the experiment removed bands; the gases and sun are in the
// columns). tropopause_level: the base state's tropopause level; layers i >= tropopause_level are
// the troposphere. adjusted_forcing_w_m2: F_adjusted of the experiment. Throws InputError for
// mismatched columns or |dTs| < 1e-6 K (feedbacks undefined).
[[nodiscard]] FeedbackTerms partial_radiative_perturbation(const atmosphere::Column& base, const NetHeating& base_radiation,
                                                           const atmosphere::Column& perturbed,
                                                           const NetHeating& perturbed_radiation,
                                                           std::size_t tropopause_level, double adjusted_forcing_w_m2);

// The same with the experiment's forcing (compute_forcing of the same base, perturbation and
// tropopause level): total = -forcing.adjusted_w_m2 / dTs, and the stratospheric-temperature and
// water-vapour terms count only the changes beyond forcing.adjusted_column (the stratosphere as it
// adjusted, the water as the perturbation set it), since those belong to the adjusted forcing
// already; counted from the base state they would appear twice and the residual would take them
// back (for doubled CO2, the stratospheric cooling of a few W m-2). Forward, the change beyond the
// adjusted state is added to the base state (water clipped at 0); backward, the adjusted state's
// values are substituted into the perturbed state. Used by run_experiment.
[[nodiscard]] FeedbackTerms partial_radiative_perturbation(const atmosphere::Column& base, const NetHeating& base_radiation,
                                                           const atmosphere::Column& perturbed,
                                                           const NetHeating& perturbed_radiation,
                                                           std::size_t tropopause_level, const ForcingResult& forcing);

} // namespace bandstack::climate
