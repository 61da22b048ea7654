#pragma once
// Radiative and radiative-convective equilibrium of one column.
//
// Unknowns: the temperatures of the radiative layers, plus the surface temperature when it comes
// from the surface energy balance. Convective layers form one region reaching the ground (the only
// kind an equilibrium has in practice; detached unstable layers are not represented by Newton's
// method): they sit on the critical profile through the surface (surface air = skin temperature,
// convective_adjustment.hpp) and so follow the surface temperature.
// Residual: the radiative heating rate (K/day) of every radiative layer, and, with the surface
// energy balance, the net radiative flux (W m-2) into the convective region plus the ground,
//   F_region = surface_net + sum over convective layers c_p dp/g H / 86400,
// which is the surface net flux when there is no convective layer (Manabe & Strickler 1964: the
// convective region and the ground, which stores no heat, are in balance together).
//
// Newton's method: the Jacobian of all layer heating rates and the surface net flux with respect to
// all layer temperatures and the surface temperature, by forward finite differences, then, with
// broyden_update, corrected after every move by Broyden's rank-one update (no extra call) and
// differenced afresh only when a step with the updated Jacobian fails to decrease the merit after
// two halvings, or (grouped differences) when such a step, not capped, fails to halve it;
// without it, differenced every step. The Newton matrix for the current unknowns
// follows from it by the chain rule, so a change of the convective region costs no new Jacobian.
// Solved by Eigen's dense LU with partial pivoting; each step is capped at max_step_k and shortened
// by halving until a weighted sum of squared residuals (heating over its tolerance, fluxes over
// theirs) decreases. After each step the convective region is revised: it grows upward over every
// radiative layer colder than the critical profile (unstable), and shrinks from its top while the
// top layer would be radiatively heated once the region as a whole is in balance (upward
// convective flux cannot be negative).
// Jacobian by grouped_differences (the default): layers perturbed in 2b+2 groups (Curtis, Powell &
// Reid 1974, J. Inst. Math. Appl. 13, 117-119; from memory), 2b+3 radiative calls (7 for the
// default b = 2) instead of N+1 (61 for 60 layers); band entries exact, the slowly varying far exchange
// approximated in proportion to the square root of each layer's mass (src/climate/grouped_jacobian.hpp)
// and then corrected by Broyden's updates. A convective region that only shrinks costs no radiative
// call. A fresh grouped Jacobian whose step fails is replaced by full differences. Each step also predicts the
// convective region: the region is grown over the layers the step would leave unstable and the
// step solved again for it (no radiative call) before the line search. If this fails, Newton's
// method starts again from `start` with full differences (N+1 calls) and the region revised only
// between steps, as with full_differences.
// If Newton fails, an explicit time march with an adaptive stable step takes over from its best
// state (march_to_equilibrium).
//
// Converged when, in the final convective region, max |H| over radiative layers <= heating
// tolerance and, with the surface energy balance, |TOA net flux| and |F_region| <= flux tolerance.
// With a fixed surface temperature the TOA net flux is whatever the ground supplies and is not
// tested. A column that does not converge raises ConvergenceError, never a silent answer.
#include <cstddef>
#include <string>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/column_state.hpp"
#include "bandstack/climate/convective_adjustment.hpp"
#include "bandstack/climate/radiation.hpp"

namespace bandstack::climate {

enum class SurfaceTreatment {
  energy_balance, // surface temperature solved for (net flux into the ground = 0)
  fixed           // surface temperature kept at the starting column's value
};

struct TimeMarchingSettings {
  long max_steps = 200000;
  double initial_time_step_s = 21600.0;           // halved whenever a layer oscillates with growing amplitude
  double max_time_step_s = 4.0 * 86400.0;
  double surface_heat_capacity_j_m2_k = 4.2e6;    // the ground while marching (about 1 m of water)
};

// How Newton's method differences the Jacobian (see the comment at the top of this file).
enum class JacobianMethod {
  full_differences,    // one radiative call per layer plus one for the surface: N + 1 calls
  grouped_differences  // layers j = g (mod 2b+2) perturbed together (Curtis, Powell & Reid 1974):
                       // 2b + 3 calls, exact within the band |i - j| <= b, the rest approximated
};

struct EquilibriumSettings {
  ConvectionSettings convection;                  // kind none: pure radiative equilibrium
  SurfaceTreatment surface = SurfaceTreatment::energy_balance;
  WaterSettings water;
  double heating_tolerance_k_day = 1e-3;          // max |H| in radiative layers
  double flux_tolerance_w_m2 = 0.01;              // |TOA net flux| and |F_region|
  int max_newton_iterations = 40;                 // Newton steps
  double jacobian_step_k = 1e-3;                  // forward-difference perturbation
  JacobianMethod jacobian = JacobianMethod::grouped_differences;
  std::size_t jacobian_half_bandwidth = 2;        // b of grouped_differences: layers each side of
                                                  // the diagonal differenced exactly
  bool broyden_update = true;                     // rank-one updates instead of a new Jacobian each step
  double max_step_k = 30.0;                       // largest temperature change of one Newton step
  bool time_marching_fallback = true;
  TimeMarchingSettings marching;
};

enum class EquilibriumMethod { newton, time_marching };

struct EquilibriumResult {
  atmosphere::Column column;            // the equilibrium state (levels, water and surface set)
  std::vector<double> heating_k_day;    // radiative heating of each layer at equilibrium, K/day
  std::vector<bool> convective;         // per layer: in the convective region
  double toa_net_w_m2 = 0.0;            // net downward flux at the top, W m-2
  double surface_net_w_m2 = 0.0;        // net radiative flux into the ground, W m-2
  double region_net_w_m2 = 0.0;         // F_region above, W m-2
  double max_radiative_heating_k_day = 0.0; // max |H| over radiative layers
  EquilibriumMethod method = EquilibriumMethod::newton;
  int newton_iterations = 0;            // Newton steps taken
  long time_steps = 0;                  // steps of the time march (0 if Newton succeeded)
  long radiative_calls = 0;             // NetHeating calls, all methods together
  bool converged = false;               // always true in a returned result (failures throw)
  std::string newton_failure;           // why Newton handed over to the time march, if it did

  // Pressure (Pa) of the top of the convective region (the level above its highest layer), or the
  // surface pressure if there is no convective layer.
  [[nodiscard]] double convective_top_pressure_pa() const;
};

// Equilibrium from `start` (its pressures, gases, surface properties and sun; its temperatures as
// the first guess) with radiative heating from `radiation`. Throws InputError for bad settings or
// column; ConvergenceError (naming the iterations and the residuals reached) if neither Newton nor
// the time march (when allowed) converges.
[[nodiscard]] EquilibriumResult solve_equilibrium(const atmosphere::Column& start, const NetHeating& radiation,
                                                  const EquilibriumSettings& settings);

// The time march alone: explicit steps T += dt H, T_s += dt F_s / C_s, then convective adjustment
// (convective_adjustment.hpp, the ground joining with heat capacity C_s), until the same criteria
// hold. Used as the fallback and as the yardstick in the benchmark. Throws like solve_equilibrium.
[[nodiscard]] EquilibriumResult march_to_equilibrium(const atmosphere::Column& start, const NetHeating& radiation,
                                                     const EquilibriumSettings& settings);

} // namespace bandstack::climate
