#include "bandstack/climate/feedbacks.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "equilibrium_state.hpp"

namespace bandstack::climate {

namespace {

// The fields a substitution replaces: the troposphere's temperatures (layers i >= k, levels
// l >= k, the surface), the stratosphere's temperatures (layers i < k, levels l < k), water vapour.
enum class Field { troposphere, stratosphere, water_vapour };

// The value a field takes:
//   reference        the reference state's (the base state's, or for the stratosphere and water
//                    the adjusted state's when the forcing is given)
//   planck           troposphere only: the base temperatures + dTs
//   perturbed        the perturbed state's
//   base_plus_change the base state's plus (perturbed - reference): the forward substitution
enum class Value { reference, planck, perturbed, base_plus_change };

// TOA net flux (W m-2) of a background state with one field replaced.
class Substitution {
public:
  Substitution(const atmosphere::Column& base, const atmosphere::Column& perturbed, const atmosphere::Column& reference,
               std::size_t k)
      : base_(base), perturbed_(perturbed), reference_(reference), k_(k),
        dts_(perturbed.surface_temperature_k - base.surface_temperature_k) {}

  double toa_net(const atmosphere::Column& background, const NetHeating& radiation, Field field, Value value) {
    atmosphere::Column c = background;
    const std::size_t n = c.layer_count();
    switch (field) {
    case Field::troposphere: {
      const atmosphere::Column& from = value == Value::perturbed ? perturbed_ : base_;
      const double offset = value == Value::planck ? dts_ : 0.0;
      for (std::size_t i = k_; i < n; ++i)
        c.temperature_layer_k[i] = from.temperature_layer_k[i] + offset;
      for (std::size_t l = k_; l <= n; ++l)
        c.temperature_level_k[l] = from.temperature_level_k[l] + offset;
      c.surface_temperature_k = from.surface_temperature_k + offset;
      break;
    }
    case Field::stratosphere:
      for (std::size_t i = 0; i < k_; ++i)
        c.temperature_layer_k[i] = pick(value, &atmosphere::Column::temperature_layer_k, i, 0.0);
      for (std::size_t l = 0; l < k_; ++l)
        c.temperature_level_k[l] = pick(value, &atmosphere::Column::temperature_level_k, l, 0.0);
      break;
    case Field::water_vapour: {
      std::vector<double>& h2o = c.gas(Gas::h2o);
      for (std::size_t i = 0; i < n; ++i)
        h2o[i] = pick_h2o(value, i);
      break;
    }
    }
    detail::Evaluator evaluate(radiation);
    evaluate(c, eval_);
    return eval_.toa_net_w_m2();
  }

private:
  double pick(Value value, std::vector<double> atmosphere::Column::*member, std::size_t i, double floor) const {
    switch (value) {
    case Value::reference:
      return (reference_.*member)[i];
    case Value::perturbed:
      return (perturbed_.*member)[i];
    case Value::base_plus_change:
      // With the base state as reference this is exactly the perturbed value.
      if (&reference_ == &base_) return (perturbed_.*member)[i];
      return std::max(floor, (base_.*member)[i] + ((perturbed_.*member)[i] - (reference_.*member)[i]));
    case Value::planck:
      break;
    }
    throw InternalError("feedbacks: a Planck substitution outside the troposphere");
  }

  double pick_h2o(Value value, std::size_t i) const {
    const auto gas = [i](const atmosphere::Column& c) { return c.gas(Gas::h2o)[i]; };
    switch (value) {
    case Value::reference:
      return gas(reference_);
    case Value::perturbed:
      return gas(perturbed_);
    case Value::base_plus_change:
      if (&reference_ == &base_) return gas(perturbed_);
      return std::max(0.0, gas(base_) + (gas(perturbed_) - gas(reference_)));
    case Value::planck:
      break;
    }
    throw InternalError("feedbacks: a Planck substitution of water vapour");
  }

  const atmosphere::Column& base_;
  const atmosphere::Column& perturbed_;
  const atmosphere::Column& reference_;
  std::size_t k_;
  double dts_;
  detail::Evaluation eval_;
};

void check_grid(const atmosphere::Column& base, const atmosphere::Column& other, const char* item) {
  atmosphere::validate(other, InputPlace::of(item));
  if (other.pressure_level_pa != base.pressure_level_pa || other.pressure_layer_pa != base.pressure_layer_pa)
    throw InputError(InputPlace::of(item), "must have the pressure grid of the base column");
}

void check_inputs(const atmosphere::Column& base, const atmosphere::Column& perturbed, std::size_t k, double forcing,
                  const NetHeating& base_radiation, const NetHeating& perturbed_radiation) {
  atmosphere::validate(base, InputPlace::of("base column"));
  check_grid(base, perturbed, "perturbed column");
  const std::size_t n = base.layer_count();
  if (k < 1 || k >= n)
    throw InputError(InputPlace::of("tropopause_level"),
                     fmt::format("must be in 1..{} for a column of {} layers, got {}", n - 1, n, k));
  if (!std::isfinite(forcing)) throw InputError(InputPlace::of("adjusted_forcing"), "must be finite");
  if (!base_radiation || !perturbed_radiation)
    throw InputError(InputPlace::of("radiation"), "no radiation callback given");
  const double dts = perturbed.surface_temperature_k - base.surface_temperature_k;
  if (!(std::abs(dts) >= 1e-6))
    throw InputError(InputPlace::of("surface_temperature"),
                     fmt::format("feedbacks need a surface temperature change, got {:.3g} K", dts));
}

FeedbackTerms decompose(const atmosphere::Column& base, const NetHeating& rb, const atmosphere::Column& p,
                        const NetHeating& rp, const atmosphere::Column& reference, std::size_t k, double forcing) {
  const double dts = p.surface_temperature_k - base.surface_temperature_k;
  Substitution s(base, p, reference, k);
  const atmosphere::Column& b = base;
  // Forward half, in the base state (base gases and radiation): N(base with the field changed) -
  // N(base). Backward half, in the perturbed state (perturbed gases and radiation): N(perturbed) -
  // N(perturbed with the field's reference value). The tropospheric temperature change is split
  // at the Planck state "base troposphere + dTs", in both halves alike:
  //   planck     = N(troposphere = base + dTs) - N(troposphere = base)
  //   lapse rate = N(troposphere = perturbed)  - N(troposphere = base + dTs)
  const double nb = s.toa_net(b, rb, Field::troposphere, Value::reference); // N(base)
  const double np = s.toa_net(p, rp, Field::troposphere, Value::perturbed); // N(perturbed)

  const double b_planck = s.toa_net(b, rb, Field::troposphere, Value::planck);
  const double b_trop = s.toa_net(b, rb, Field::troposphere, Value::perturbed);
  const double b_strat = s.toa_net(b, rb, Field::stratosphere, Value::base_plus_change);
  const double b_water = s.toa_net(b, rb, Field::water_vapour, Value::base_plus_change);

  const double p_planck = s.toa_net(p, rp, Field::troposphere, Value::planck);
  const double p_trop = s.toa_net(p, rp, Field::troposphere, Value::reference);
  const double p_strat = s.toa_net(p, rp, Field::stratosphere, Value::reference);
  const double p_water = s.toa_net(p, rp, Field::water_vapour, Value::reference);

  FeedbackTerms t;
  t.planck_w_m2_k = 0.5 * ((b_planck - nb) + (p_planck - p_trop)) / dts;
  t.lapse_rate_w_m2_k = 0.5 * ((b_trop - b_planck) + (np - p_planck)) / dts;
  t.stratospheric_temperature_w_m2_k = 0.5 * ((b_strat - nb) + (np - p_strat)) / dts;
  t.water_vapour_w_m2_k = 0.5 * ((b_water - nb) + (np - p_water)) / dts;
  t.total_w_m2_k = -forcing / dts;
  t.residual_w_m2_k = t.total_w_m2_k - (t.planck_w_m2_k + t.lapse_rate_w_m2_k + t.water_vapour_w_m2_k +
                                        t.stratospheric_temperature_w_m2_k);
  return t;
}

} // namespace

FeedbackTerms partial_radiative_perturbation(const atmosphere::Column& base, const NetHeating& base_radiation,
                                             const atmosphere::Column& perturbed, const NetHeating& perturbed_radiation,
                                             std::size_t tropopause_level, double adjusted_forcing_w_m2) {
  check_inputs(base, perturbed, tropopause_level, adjusted_forcing_w_m2, base_radiation, perturbed_radiation);
  return decompose(base, base_radiation, perturbed, perturbed_radiation, base, tropopause_level, adjusted_forcing_w_m2);
}

FeedbackTerms partial_radiative_perturbation(const atmosphere::Column& base, const NetHeating& base_radiation,
                                             const atmosphere::Column& perturbed, const NetHeating& perturbed_radiation,
                                             std::size_t tropopause_level, const ForcingResult& forcing) {
  check_inputs(base, perturbed, tropopause_level, forcing.adjusted_w_m2, base_radiation, perturbed_radiation);
  check_grid(base, forcing.adjusted_column, "adjusted column");
  return decompose(base, base_radiation, perturbed, perturbed_radiation, forcing.adjusted_column, tropopause_level,
                   forcing.adjusted_w_m2);
}

} // namespace bandstack::climate
