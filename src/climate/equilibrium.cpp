#include "bandstack/climate/equilibrium.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/Dense>
#include <fmt/format.h>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "equilibrium_state.hpp"

namespace bandstack::climate {

double EquilibriumResult::convective_top_pressure_pa() const {
  std::size_t top = column.layer_count();
  while (top > 0 && convective[top - 1]) --top;
  return column.pressure_level_pa[top];
}

namespace {

// Newton's method on the heating-rate residual with a moving convective region (equilibrium.hpp).
class Newton {
public:
  Newton(const atmosphere::Column& start, const NetHeating& radiation, const EquilibriumSettings& s)
      : s_(s), column_(start), evaluate_(radiation), n_(start.layer_count()), t_(start.temperature_layer_k),
        ts_(start.surface_temperature_k), first_convective_(n_) {
    seb_ = s.surface == SurfaceTreatment::energy_balance;
    convection_ = s.convection.kind != ConvectionKind::none;
    surface_p_ = start.pressure_level_pa[n_];
  }

  // True on success; otherwise `failure` says why and best_column() holds the best state seen.
  bool run(EquilibriumResult& result, std::string& failure) {
    apply_region();
    if (!evaluate_state(column_, eval_)) {
      failure = "the starting column cannot be evaluated (" + last_error_ + ")";
      return false;
    }
    double merit0 = merit(residual(eval_));
    remember_best(merit0);
    int reversals = 0, last_direction = 0;
    for (int iteration = 0;; ++iteration) {
      if (convection_) {
        const int direction = revise_region(reversals < 3);
        if (direction != 0) {
          if (last_direction != 0 && direction != last_direction) ++reversals;
          last_direction = direction;
          apply_region();
          if (!evaluate_state(column_, eval_)) {
            failure = "the revised convective region cannot be evaluated (" + last_error_ + ")";
            return false;
          }
          merit0 = merit(residual(eval_));
        }
      }
      result.newton_iterations = iteration;
      if (detail::finish(result, column_, eval_, flags(), s_)) return true;
      remember_best(merit0);
      if (iteration >= s_.max_newton_iterations) {
        failure = fmt::format("Newton's method did not converge in {} iterations ({})", iteration,
                              detail::describe_residuals(result));
        return false;
      }
      if (!step(merit0, failure)) return false;
    }
  }

  [[nodiscard]] long calls() const noexcept { return evaluate_.calls(); }
  [[nodiscard]] const atmosphere::Column& best_column() const noexcept { return best_; }

private:
  std::size_t unknown_count() const { return first_convective_ + (seb_ ? 1 : 0); }

  std::vector<double> unknowns() const {
    std::vector<double> y(t_.begin(), t_.begin() + static_cast<long>(first_convective_));
    if (seb_) y.push_back(ts_);
    return y;
  }

  double profile(double p) const { return critical_profile_temperature_k(s_.convection, ts_, surface_p_, p, column_.gravity_m_s2); }

  // Convective layers onto the critical profile through the surface.
  void apply_region() {
    for (std::size_t i = first_convective_; i < n_; ++i)
      t_[i] = profile(column_.pressure_layer_pa[i]);
  }

  void set_unknowns(const std::vector<double>& y) {
    std::copy(y.begin(), y.begin() + static_cast<long>(first_convective_), t_.begin());
    if (seb_) ts_ = y.back();
    apply_region();
  }

  std::vector<bool> flags() const {
    std::vector<bool> f(n_, false);
    for (std::size_t i = first_convective_; i < n_; ++i) f[i] = true;
    return f;
  }

  // Builds the column from the current state and evaluates it; false if the state is outside what
  // the radiation (or the humidity formulas) accept.
  bool evaluate_state(atmosphere::Column& column, detail::Evaluation& e) {
    try {
      detail::set_state(column, t_, ts_, first_convective_ < n_, s_.water);
      evaluate_(column, e);
      return true;
    } catch (const InputError& e) {
      last_error_ = e.what();
      return false;
    }
  }

  Eigen::VectorXd residual(const detail::Evaluation& e) const {
    Eigen::VectorXd r(static_cast<Eigen::Index>(unknown_count()));
    for (std::size_t i = 0; i < first_convective_; ++i) r[static_cast<Eigen::Index>(i)] = e.heating_k_day[i];
    if (seb_) r[static_cast<Eigen::Index>(first_convective_)] = detail::region_net_w_m2(column_, e, flags());
    return r;
  }

  double merit(const Eigen::VectorXd& r) const {
    double m = 0.0;
    for (Eigen::Index i = 0; i < r.size(); ++i) {
      const bool flux = seb_ && i + 1 == r.size();
      const double scaled = r[i] / (flux ? s_.flux_tolerance_w_m2 : s_.heating_tolerance_k_day);
      m += scaled * scaled;
    }
    return m;
  }

  void remember_best(double m) {
    if (m < best_merit_) {
      best_merit_ = m;
      best_ = column_;
    }
  }

  // Moves the top of the convective region: up over unstable radiative layers (returns -1), else
  // down while the top convective layer would be heated with the region in balance (returns +1).
  int revise_region(bool allow_shrink) {
    const double tolerance = s_.convection.kind == ConvectionKind::moist_adiabat ? 1e-6 : 1e-9;
    const std::size_t old = first_convective_;
    while (first_convective_ > 0 && t_[first_convective_ - 1] < profile(column_.pressure_layer_pa[first_convective_ - 1]) - tolerance)
      --first_convective_;
    if (first_convective_ != old) return -1;
    if (!allow_shrink || first_convective_ == n_) return 0;
    const double cp = constants::specific_heat_dry_air_j_kg_k;
    const std::vector<bool> f = flags();
    const double region_mass = (surface_p_ - column_.pressure_level_pa[first_convective_]) / column_.gravity_m_s2;
    // With a fixed surface temperature the ground supplies any imbalance: no correction.
    const double uniform = seb_ ? detail::region_net_w_m2(column_, eval_, f) * constants::seconds_per_day / (cp * region_mass) : 0.0;
    while (first_convective_ < n_ && eval_.heating_k_day[first_convective_] - uniform > 0.0)
      ++first_convective_;
    return first_convective_ != old ? 1 : 0;
  }

  bool step(double& merit0, std::string& failure) {
    const std::vector<double> y0 = unknowns();
    const Eigen::VectorXd r0 = residual(eval_);
    const std::size_t m = y0.size();
    Eigen::MatrixXd jacobian(static_cast<Eigen::Index>(m), static_cast<Eigen::Index>(m));
    atmosphere::Column trial_column = column_;
    detail::Evaluation trial;
    for (std::size_t j = 0; j < m; ++j) {
      std::vector<double> y = y0;
      y[j] += s_.jacobian_step_k;
      set_unknowns(y);
      if (!evaluate_state(trial_column, trial)) {
        set_unknowns(y0);
        failure = fmt::format("the finite-difference Jacobian left the radiation's range (unknown {}: {})", j, last_error_);
        return false;
      }
      jacobian.col(static_cast<Eigen::Index>(j)) = (residual(trial) - r0) / s_.jacobian_step_k;
    }
    set_unknowns(y0);
    Eigen::VectorXd dy = jacobian.partialPivLu().solve(-r0);
    if (!dy.allFinite()) {
      failure = "the Jacobian is singular";
      return false;
    }
    const double largest = dy.cwiseAbs().maxCoeff();
    if (largest > s_.max_step_k) dy *= s_.max_step_k / largest;
    // Backtracking on the merit; a step that does not decrease it after 8 halvings is still taken
    // (far from equilibrium the merit can rise before it falls), at most 4 times in a row.
    double lambda = 1.0;
    for (int halving = 0; halving <= 8; ++halving, lambda *= 0.5) {
      std::vector<double> y = y0;
      for (std::size_t j = 0; j < m; ++j) y[j] += lambda * dy[static_cast<Eigen::Index>(j)];
      set_unknowns(y);
      if (!evaluate_state(trial_column, trial)) continue;
      const double mt = merit(residual(trial));
      if (mt < (1.0 - 1e-4 * lambda) * merit0 || halving == 8) {
        if (!(mt < merit0) && ++uphill_ > 4) {
          failure = "the line search found no decrease of the residual";
          return false;
        }
        if (mt < merit0) uphill_ = 0;
        column_ = trial_column;
        eval_ = trial;
        merit0 = mt;
        return true;
      }
    }
    set_unknowns(y0);
    failure = "every trial step left the radiation's range (" + last_error_ + ")";
    return false;
  }

  const EquilibriumSettings& s_;
  atmosphere::Column column_;
  detail::Evaluator evaluate_;
  std::size_t n_;
  std::vector<double> t_;
  double ts_;
  std::size_t first_convective_; // n_: no convective layer
  bool seb_ = true;
  bool convection_ = true;
  double surface_p_ = 0.0;
  detail::Evaluation eval_;
  atmosphere::Column best_;
  double best_merit_ = std::numeric_limits<double>::infinity();
  int uphill_ = 0;
  std::string last_error_;
};

} // namespace

EquilibriumResult solve_equilibrium(const atmosphere::Column& start, const NetHeating& radiation,
                                    const EquilibriumSettings& settings) {
  detail::check_inputs(start, settings);
  if (!radiation) throw InputError(InputPlace::of("radiation"), "no radiation callback given");
  Newton newton(start, radiation, settings);
  EquilibriumResult result;
  std::string failure;
  const bool ok = newton.run(result, failure);
  result.radiative_calls = newton.calls();
  if (ok) {
    result.method = EquilibriumMethod::newton;
    result.converged = true;
    return result;
  }
  if (!settings.time_marching_fallback)
    throw ConvergenceError(fmt::format("column '{}': equilibrium not reached: {} (time marching not allowed)",
                                       start.name, failure));
  const atmosphere::Column& from = newton.best_column().layer_count() == start.layer_count() ? newton.best_column() : start;
  try {
    EquilibriumResult marched = march_to_equilibrium(from, radiation, settings);
    marched.newton_iterations = result.newton_iterations;
    marched.radiative_calls += newton.calls();
    marched.newton_failure = failure;
    return marched;
  } catch (const ConvergenceError& e) {
    throw ConvergenceError(fmt::format("column '{}': equilibrium not reached: {}; then {}", start.name, failure, e.what()));
  }
}

} // namespace bandstack::climate
