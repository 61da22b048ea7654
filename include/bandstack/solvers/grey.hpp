#pragma once
// Grey (wavelength-independent) longwave optics and a one-call grey column solve. The grey case
// is the general longwave kernel with a single "g-point" covering the whole spectrum, with
// source sigma T^4 / pi.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/core/gas.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/longwave_result.hpp"

#include <array>
#include <vector>

namespace bandstack::solvers {

struct GreyOptics {
  // Constant mass absorption coefficient of each gas (m2 per kg of that gas), indexed by
  // bandstack::index(Gas). Each finite and >= 0.
  std::array<double, gas_count> mass_absorption_m2_kg{};
  // Extra absorber with optical depth proportional to the layer's pressure thickness
  // (tau = extra_tau_per_pa * dp, Pa-1), finite and >= 0. A whole column of surface pressure p_s
  // then has optical depth extra_tau_per_pa * p_s from this term.
  double extra_tau_per_pa = 0.0;
};

// Vertical optical depth of each layer (N values):
//   tau_i = sum_gas kappa_gas * m_gas,i + extra_tau_per_pa * (p_{i+1} - p_i),
// with m_gas,i from atmosphere::layer_gas_mass_kg_m2 (kg m-2). Validates the column and the
// optics; throws InputError otherwise.
[[nodiscard]] std::vector<double> grey_optical_depth(const atmosphere::Column& column, const GreyOptics& optics);

// Grey Planck radiance sigma T^4 / pi (W m-2 sr-1) of temperature t_k (K).
[[nodiscard]] double grey_source_w_m2_sr(double t_k) noexcept;

// Grey longwave fluxes and heating rates of a column. The source is sigma T^4 / pi at the levels
// (column.temperature_level_k) and the layers (column.temperature_layer_k), combined inside each
// layer as longwave.hpp describes, and sigma T_s^4 / pi at the surface (column.surface_temperature_k)
// with column.surface_emissivity. Throws InputError for an invalid column, optics or angles.
[[nodiscard]] LongwaveResult solve_grey_longwave(const atmosphere::Column& column, const GreyOptics& optics,
                                                 const AngularQuadrature& angles);

} // namespace bandstack::solvers
