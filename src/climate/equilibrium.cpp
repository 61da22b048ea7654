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
          const Eigen::VectorXd x0 = full_state(), f0 = full_response(eval_);
          apply_region();
          if (!evaluate_state(column_, eval_)) {
            failure = "the revised convective region cannot be evaluated (" + last_error_ + ")";
            return false;
          }
          moved(x0, f0);
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
    } catch (const InputError& error) {
      last_error_ = error.what();
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

  // Full state x = (T_0 .. T_{N-1}, T_s) and full response f = (H_0 .. H_{N-1}, surface net flux).
  Eigen::VectorXd full_state() const {
    Eigen::VectorXd x(static_cast<Eigen::Index>(n_ + 1));
    for (std::size_t i = 0; i < n_; ++i) x[static_cast<Eigen::Index>(i)] = t_[i];
    x[static_cast<Eigen::Index>(n_)] = ts_;
    return x;
  }

  Eigen::VectorXd full_response(const detail::Evaluation& e) const {
    Eigen::VectorXd f(static_cast<Eigen::Index>(n_ + 1));
    for (std::size_t i = 0; i < n_; ++i) f[static_cast<Eigen::Index>(i)] = e.heating_k_day[i];
    f[static_cast<Eigen::Index>(n_)] = e.surface_net_w_m2();
    return f;
  }

  // The Jacobian is kept for the full map x -> f, so that it stays meaningful when the convective
  // region (and with it the set of unknowns) changes; the Newton matrix is A J B, with B the
  // derivative of x with respect to the unknowns (convective layers follow T_s on the critical
  // profile) and A the rows of the residual (F_region sums the convective layers' heating).
  Eigen::MatrixXd newton_matrix() const {
    const auto m = static_cast<Eigen::Index>(unknown_count());
    const auto k = static_cast<Eigen::Index>(first_convective_);
    const auto n = static_cast<Eigen::Index>(n_);
    Eigen::MatrixXd b = Eigen::MatrixXd::Zero(n + 1, m);
    Eigen::MatrixXd a = Eigen::MatrixXd::Zero(m, n + 1);
    for (Eigen::Index i = 0; i < k; ++i) b(i, i) = a(i, i) = 1.0;
    if (seb_) {
      const double h = 1e-3; // K; the critical profile is smooth in T_s, no radiative call involved
      const double cp = constants::specific_heat_dry_air_j_kg_k;
      b(n, m - 1) = a(m - 1, n) = 1.0;
      for (Eigen::Index i = k; i < n; ++i) {
        const double p = column_.pressure_layer_pa[static_cast<std::size_t>(i)];
        b(i, m - 1) = (critical_profile_temperature_k(s_.convection, ts_ + h, surface_p_, p, column_.gravity_m_s2) -
                       critical_profile_temperature_k(s_.convection, ts_ - h, surface_p_, p, column_.gravity_m_s2)) / (2.0 * h);
        a(m - 1, i) = cp * (column_.pressure_level_pa[static_cast<std::size_t>(i) + 1] - column_.pressure_level_pa[static_cast<std::size_t>(i)]) /
                      column_.gravity_m_s2 / constants::seconds_per_day;
      }
    }
    return a * jacobian_ * b;
  }

  // Forward differences of the full map at the current state: N + 1 radiative calls.
  bool refresh_jacobian(std::string& failure) {
    const Eigen::VectorXd f0 = full_response(eval_);
    const std::vector<double> t0 = t_;
    const double ts0 = ts_;
    jacobian_ = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n_ + 1), static_cast<Eigen::Index>(n_ + 1));
    atmosphere::Column trial_column = column_;
    detail::Evaluation trial;
    for (std::size_t j = 0; j <= n_; ++j) {
      if (j < n_)
        t_[j] += s_.jacobian_step_k;
      else
        ts_ += s_.jacobian_step_k;
      const bool ok = evaluate_state(trial_column, trial);
      t_ = t0;
      ts_ = ts0;
      if (!ok) {
        failure = fmt::format("the finite-difference Jacobian left the radiation's range (unknown {}: {})", j, last_error_);
        return false;
      }
      jacobian_.col(static_cast<Eigen::Index>(j)) = (full_response(trial) - f0) / s_.jacobian_step_k;
    }
    have_jacobian_ = true;
    fresh_jacobian_ = true;
    return true;
  }

  // The current state moved from (x0, f0) to (x_, f_): Broyden's "good" rank-one update
  // J += (df - J dx) dx^T / (dx^T dx) (Broyden 1965, Math. Comp. 19, eq. 4.12; from memory), the
  // least change of J in the Frobenius norm that satisfies the secant condition J dx = df.
  void moved(const Eigen::VectorXd& x0, const Eigen::VectorXd& f0) {
    const Eigen::VectorXd x1 = full_state(), f1 = full_response(eval_);
    if (!have_jacobian_ || !s_.broyden_update) {
      have_jacobian_ = false;
      return;
    }
    const Eigen::VectorXd dx = x1 - x0;
    const double dx2 = dx.squaredNorm();
    if (!(dx2 > 0.0)) return;
    jacobian_ += ((f1 - f0) - jacobian_ * dx) * (dx.transpose() / dx2);
    fresh_jacobian_ = false;
  }

  // One Newton step with a backtracking line search on the merit. With an updated (not freshly
  // differenced) Jacobian a step that fails the sufficient-decrease test after two halvings counts
  // as a stalled update: the Jacobian is recomputed by differences and the step redone.
  bool step(double& merit0, std::string& failure) {
    if (!have_jacobian_) {
      if (!refresh_jacobian(failure)) return false;
      have_jacobian_ = true;
    }
    const std::vector<double> y0 = unknowns();
    const Eigen::VectorXd r0 = residual(eval_);
    const Eigen::VectorXd x0 = full_state(), f0 = full_response(eval_);
    const std::size_t m = y0.size();
    atmosphere::Column trial_column = column_;
    detail::Evaluation trial;
    for (;;) {
      const bool fresh = fresh_jacobian_;
      Eigen::VectorXd dy = newton_matrix().partialPivLu().solve(-r0);
      if (!dy.allFinite()) {
        if (!fresh) {
          if (!refresh_jacobian(failure)) return false;
          continue;
        }
        failure = "the Jacobian is singular";
        return false;
      }
      const double largest = dy.cwiseAbs().maxCoeff();
      if (largest > s_.max_step_k) dy *= s_.max_step_k / largest;
      // With a fresh Jacobian, a step that does not decrease the merit after 8 halvings is still
      // taken (far from equilibrium the merit can rise before it falls), at most 4 times in a row.
      const int halvings = fresh ? 8 : 2;
      double lambda = 1.0;
      for (int halving = 0; halving <= halvings; ++halving, lambda *= 0.5) {
        std::vector<double> y = y0;
        for (std::size_t j = 0; j < m; ++j) y[j] += lambda * dy[static_cast<Eigen::Index>(j)];
        set_unknowns(y);
        if (!evaluate_state(trial_column, trial)) continue;
        const double mt = merit(residual(trial));
        const bool decrease = mt < (1.0 - 1e-4 * lambda) * merit0;
        if (decrease || (fresh && halving == 8)) {
          if (!(mt < merit0) && ++uphill_ > 4) {
            failure = "the line search found no decrease of the residual";
            return false;
          }
          if (mt < merit0) uphill_ = 0;
          column_ = trial_column;
          eval_ = trial;
          merit0 = mt;
          moved(x0, f0);
          return true;
        }
      }
      set_unknowns(y0);
      if (fresh) break;
      if (!refresh_jacobian(failure)) return false;
    }
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
  Eigen::MatrixXd jacobian_;     // d(H_0 .. H_{N-1}, surface net)/d(T_0 .. T_{N-1}, T_s)
  bool have_jacobian_ = false;
  bool fresh_jacobian_ = false;  // differenced at the current state, not updated since
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
