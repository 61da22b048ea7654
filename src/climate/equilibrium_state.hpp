#pragma once
// Private to climate: what the Newton solver and the time march share.
#include <cstddef>
#include <string>
#include <vector>

#include "bandstack/climate/equilibrium.hpp"

namespace bandstack::climate::detail {

// Checks settings and the starting column; throws InputError naming the item.
void check_inputs(const atmosphere::Column& start, const EquilibriumSettings& settings);

// One radiative evaluation of a column, counted.
using Evaluation = RadiationOutput;

class Evaluator {
public:
  explicit Evaluator(const NetHeating& radiation) : radiation_(radiation) {}
  void operator()(const atmosphere::Column& column, Evaluation& out);
  [[nodiscard]] long calls() const noexcept { return calls_; }

private:
  const NetHeating& radiation_;
  long calls_ = 0;
};

// Writes layer temperatures `t` and surface temperature `ts` into `column`, then its level
// temperatures (surface air = skin if the lowest layer is convective) and its water.
void set_state(atmosphere::Column& column, const std::vector<double>& t, double ts, bool lowest_layer_convective,
               const WaterSettings& water);

// Net radiative flux (W m-2) into the layers flagged convective that reach the ground, plus the
// ground: surface_net + sum c_p dp/g H / 86400 over them.
[[nodiscard]] double region_net_w_m2(const atmosphere::Column& column, const Evaluation& e,
                                     const std::vector<bool>& convective);

// Fills the diagnostics of a result and tests the convergence criteria (equilibrium.hpp).
bool finish(EquilibriumResult& result, const atmosphere::Column& column, const Evaluation& e,
            const std::vector<bool>& convective, const EquilibriumSettings& settings);

// "max |H| = ... K/day in radiative layers, TOA net = ... W m-2, region net = ... W m-2"
[[nodiscard]] std::string describe_residuals(const EquilibriumResult& result);

} // namespace bandstack::climate::detail
