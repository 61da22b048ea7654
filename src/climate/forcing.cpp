#include "bandstack/climate/forcing.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <Eigen/Dense>
#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "equilibrium_state.hpp"

namespace bandstack::climate {

namespace {

void positive(double value, const char* item, const char* unit) {
  if (!std::isfinite(value) || !(value > 0.0))
    throw InputError(InputPlace::of(item), fmt::format("must be finite and > 0 {}", unit));
}

void check_inputs(const atmosphere::Column& base, const NetHeating& base_radiation, const atmosphere::Column& perturbed,
                  const NetHeating& perturbed_radiation, std::size_t tropopause_level, const AdjustmentSettings& s) {
  atmosphere::validate(base, InputPlace::of("base column"));
  atmosphere::validate(perturbed, InputPlace::of("perturbed column"));
  if (perturbed.pressure_level_pa != base.pressure_level_pa || perturbed.pressure_layer_pa != base.pressure_layer_pa)
    throw InputError(InputPlace::of("perturbed column"), "must have the pressure grid of the base column");
  const std::size_t n = base.layer_count();
  if (tropopause_level < 1 || tropopause_level >= n)
    throw InputError(InputPlace::of("tropopause_level"),
                     fmt::format("must be in 1..{} for a column of {} layers, got {}", n - 1, n, tropopause_level));
  if (!base_radiation || !perturbed_radiation)
    throw InputError(InputPlace::of("radiation"), "no radiation callback given");
  positive(s.heating_tolerance_k_day, "heating_tolerance", "K/day");
  positive(s.jacobian_step_k, "jacobian_step", "K");
  positive(s.max_step_k, "max_step", "K");
  if (s.max_iterations < 0) throw InputError(InputPlace::of("max_iterations"), "must be >= 0");
}

// Newton's method for the stratospheric temperatures under fixed dynamical heating (forcing.hpp).
class StratosphericAdjustment {
public:
  StratosphericAdjustment(const atmosphere::Column& perturbed, const NetHeating& radiation,
                          std::vector<double> target_k_day, const AdjustmentSettings& s)
      : s_(s), start_(perturbed), column_(perturbed), evaluate_(radiation), m_(target_k_day.size()),
        target_(std::move(target_k_day)) {}

  // Adjusts; returns the evaluation of the adjusted column. Throws ConvergenceError on failure.
  detail::Evaluation run(int& iterations) {
    evaluate_(column_, eval_);
    Eigen::VectorXd r = residual(eval_);
    for (iterations = 0; r.cwiseAbs().maxCoeff() > s_.heating_tolerance_k_day; ++iterations) {
      if (iterations >= s_.max_iterations) fail(fmt::format("did not converge in {} iterations", iterations), r);
      step(r);
    }
    return eval_;
  }

  [[nodiscard]] const atmosphere::Column& column() const noexcept { return column_; }
  [[nodiscard]] long calls() const noexcept { return evaluate_.calls(); }

private:
  Eigen::VectorXd residual(const detail::Evaluation& e) const {
    Eigen::VectorXd r(static_cast<Eigen::Index>(m_));
    for (std::size_t i = 0; i < m_; ++i)
      r[static_cast<Eigen::Index>(i)] = e.heating_k_day[i] - target_[i];
    return r;
  }

  [[noreturn]] void fail(const std::string& why, const Eigen::VectorXd& r) const {
    Eigen::Index worst = 0;
    r.cwiseAbs().maxCoeff(&worst);
    throw ConvergenceError(fmt::format("stratospheric adjustment {}: max |H - H_base| = {:.3g} K/day (layer {}), "
                                       "tolerance {:.3g} K/day{}",
                                       why, std::abs(r[worst]), worst, s_.heating_tolerance_k_day,
                                       last_rejection_.empty() ? "" : "; a trial step was rejected by the radiation: " +
                                                                          last_rejection_));
  }

  // Writes the stratospheric layer temperatures t and moves the levels down to the tropopause by
  // the change of the layers interpolated as set_level_temperatures interpolates temperatures (top
  // level with the top layer, interior levels linear in ln p; the layer below the tropopause does
  // not change); levels below the tropopause keep their values. Interpolating the change rather
  // than the temperatures leaves the unadjusted column exactly as given (a column whose levels did
  // not come from set_level_temperatures would otherwise jump at the first step, and the layers
  // would answer the jump with a layer-to-layer zigzag). The tropopause level moves too: pinned,
  // it would fix one side of the lowest stratospheric layer's source, and a uniform warming could
  // then restore the heating only as a zigzag.
  void set_temperatures(atmosphere::Column& c, const Eigen::VectorXd& t) const {
    const std::size_t m = m_;
    const auto& p = c.pressure_layer_pa;
    std::vector<double> dt(m + 1, 0.0);
    for (std::size_t i = 0; i < m; ++i) {
      const double ti = t[static_cast<Eigen::Index>(i)];
      if (!(ti > 0.0) || !std::isfinite(ti))
        throw InputError(InputPlace::of("temperature_layer", i),
                         "temperature left the physical range during the adjustment");
      c.temperature_layer_k[i] = ti;
      dt[i] = ti - start_.temperature_layer_k[i];
    }
    c.temperature_level_k[0] = start_.temperature_level_k[0] + dt[0];
    for (std::size_t k = 1; k <= m; ++k) {
      const double w = std::log(c.pressure_level_pa[k] / p[k - 1]) / std::log(p[k] / p[k - 1]);
      c.temperature_level_k[k] = start_.temperature_level_k[k] + dt[k - 1] + w * (dt[k] - dt[k - 1]);
    }
  }

  Eigen::VectorXd unknowns() const {
    Eigen::VectorXd t(static_cast<Eigen::Index>(m_));
    for (std::size_t i = 0; i < m_; ++i)
      t[static_cast<Eigen::Index>(i)] = column_.temperature_layer_k[i];
    return t;
  }

  // Forward-difference Jacobian dH_i/dT_j over the stratospheric layers: m radiative calls.
  Eigen::MatrixXd jacobian(const Eigen::VectorXd& t0, const Eigen::VectorXd& r0) {
    const auto m = static_cast<Eigen::Index>(m_);
    Eigen::MatrixXd j(m, m);
    atmosphere::Column trial = column_;
    detail::Evaluation e;
    for (Eigen::Index col = 0; col < m; ++col) {
      Eigen::VectorXd t = t0;
      t[col] += s_.jacobian_step_k;
      set_temperatures(trial, t);
      evaluate_(trial, e);
      j.col(col) = (residual(e) - r0) / s_.jacobian_step_k;
    }
    return j;
  }

  // One Newton step, capped at max_step_k and halved until the sum of squared residuals decreases.
  void step(Eigen::VectorXd& r) {
    const Eigen::VectorXd t0 = unknowns();
    Eigen::VectorXd dt = jacobian(t0, r).partialPivLu().solve(-r);
    if (!dt.allFinite()) fail("stopped: the Jacobian is singular", r);
    const double largest = dt.cwiseAbs().maxCoeff();
    if (largest > s_.max_step_k) dt *= s_.max_step_k / largest;
    const double merit0 = r.squaredNorm();
    atmosphere::Column trial = column_;
    detail::Evaluation e;
    double lambda = 1.0;
    for (int halving = 0; halving <= 10; ++halving, lambda *= 0.5) {
      try {
        set_temperatures(trial, t0 + lambda * dt);
        evaluate_(trial, e);
      } catch (const InputError& error) {
        last_rejection_ = error.what();
        continue; // outside what the radiation accepts: shorten the step
      }
      const Eigen::VectorXd rt = residual(e);
      if (rt.squaredNorm() < merit0) {
        column_ = trial;
        eval_ = e;
        r = rt;
        return;
      }
    }
    fail("stopped: the line search found no decrease of the residual", r);
  }

  const AdjustmentSettings& s_;
  std::string last_rejection_;      // why the radiation last refused a trial state, if it did
  const atmosphere::Column& start_; // the perturbed column before adjustment
  atmosphere::Column column_;
  detail::Evaluator evaluate_;
  std::size_t m_;
  std::vector<double> target_;
  detail::Evaluation eval_;
};

} // namespace

ForcingResult compute_forcing(const atmosphere::Column& base, const NetHeating& base_radiation,
                              const atmosphere::Column& perturbed, const NetHeating& perturbed_radiation,
                              std::size_t tropopause_level, const AdjustmentSettings& settings) {
  check_inputs(base, base_radiation, perturbed, perturbed_radiation, tropopause_level, settings);
  const std::size_t k = tropopause_level;
  detail::Evaluator base_evaluate(base_radiation), perturbed_evaluate(perturbed_radiation);
  detail::Evaluation base_eval, perturbed_eval;
  base_evaluate(base, base_eval);
  perturbed_evaluate(perturbed, perturbed_eval);

  ForcingResult result;
  result.toa_instantaneous_w_m2 = perturbed_eval.net_flux_w_m2[0] - base_eval.net_flux_w_m2[0];
  result.tropopause_instantaneous_w_m2 = perturbed_eval.net_flux_w_m2[k] - base_eval.net_flux_w_m2[k];

  std::vector<double> target(base_eval.heating_k_day.begin(), base_eval.heating_k_day.begin() + static_cast<long>(k));
  StratosphericAdjustment adjustment(perturbed, perturbed_radiation, std::move(target), settings);
  const detail::Evaluation adjusted = adjustment.run(result.adjustment_iterations);
  result.adjusted_w_m2 = adjusted.net_flux_w_m2[k] - base_eval.net_flux_w_m2[k];
  result.adjusted_toa_w_m2 = adjusted.net_flux_w_m2[0] - base_eval.net_flux_w_m2[0];
  result.adjusted_column = adjustment.column();
  result.adjusted_temperature_layer_k = result.adjusted_column.temperature_layer_k;
  result.radiative_calls = base_evaluate.calls() + perturbed_evaluate.calls() + adjustment.calls();
  return result;
}

} // namespace bandstack::climate
