#include "bandstack/climate/equilibrium.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/Dense>
#include <fmt/format.h>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "equilibrium_state.hpp"
#include "grouped_jacobian.hpp"

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
  // grouped: difference the Jacobian in groups of layers (grouped_jacobian.hpp) and revise the
  // convective region within each step from the step's prediction; otherwise full differences and
  // the region revised only between steps.
  Newton(const atmosphere::Column& start, const NetHeating& radiation, const EquilibriumSettings& s, bool grouped)
      : s_(s), grouped_(grouped), column_(start), evaluate_(radiation), n_(start.layer_count()),
        t_(start.temperature_layer_k), ts_(start.surface_temperature_k), first_convective_(n_) {
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
          // A region that shrinks but still reaches the ground leaves every temperature, the
          // levels and the water as they were (its former top layer is already on the critical
          // profile): the column is unchanged and needs no new radiative call.
          const bool unchanged = direction > 0 && first_convective_ < n_;
          if (!unchanged && !evaluate_state(column_, eval_)) {
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

  // Temperature (K) of the critical profile through the surface at layer pressure p (Pa).
  double profile(double p, double ts) const {
    return critical_profile_temperature_k(s_.convection, ts, surface_p_, p, column_.gravity_m_s2);
  }
  double profile(double p) const { return profile(p, ts_); }

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

  Eigen::VectorXd residual(const detail::Evaluation& e) const { return residual_of(full_response(e)); }

  // Residual for the current region from a full response f = (H_0 .. H_{N-1}, surface net): the
  // heating of the radiative layers, then F_region (equilibrium.hpp) with the surface energy balance.
  Eigen::VectorXd residual_of(const Eigen::VectorXd& f) const {
    Eigen::VectorXd r(static_cast<Eigen::Index>(unknown_count()));
    const auto at = [&f](std::size_t i) { return f[static_cast<Eigen::Index>(i)]; };
    for (std::size_t i = 0; i < first_convective_; ++i) r[static_cast<Eigen::Index>(i)] = at(i);
    if (seb_) {
      double net = at(n_);
      for (std::size_t i = first_convective_; i < n_; ++i)
        net += constants::specific_heat_dry_air_j_kg_k *
               (column_.pressure_level_pa[i + 1] - column_.pressure_level_pa[i]) / column_.gravity_m_s2 * at(i) /
               constants::seconds_per_day;
      r[static_cast<Eigen::Index>(first_convective_)] = net;
    }
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

  // The Jacobian of the full map at the current state by forward differences: exact (N + 1
  // radiative calls) or grouped (grouped_jacobian.hpp; 2b + 3 calls).
  bool refresh_jacobian(std::string& failure, bool exact) {
    const Eigen::VectorXd f0 = full_response(eval_);
    const std::vector<double> t0 = t_;
    const double ts0 = ts_;
    atmosphere::Column trial_column = column_;
    detail::Evaluation trial;
    const std::size_t group_count = exact ? n_ : detail::jacobian_group_count(n_, s_.jacobian_half_bandwidth);
    std::vector<Eigen::VectorXd> responses(group_count + 1);
    for (std::size_t g = 0; g <= group_count; ++g) {
      if (g < group_count)
        for (std::size_t j : detail::jacobian_group(g, group_count, n_)) t_[j] += s_.jacobian_step_k;
      else
        ts_ += s_.jacobian_step_k;
      const bool ok = evaluate_state(trial_column, trial);
      t_ = t0;
      ts_ = ts0;
      if (!ok) {
        failure = fmt::format("the finite-difference Jacobian left the radiation's range ({})", last_error_);
        return false;
      }
      responses[g] = (full_response(trial) - f0) / s_.jacobian_step_k;
    }
    const Eigen::VectorXd surface = responses.back();
    responses.pop_back();
    jacobian_ = detail::assemble_grouped_jacobian(responses, surface, s_.jacobian_half_bandwidth, far_weights());
    have_jacobian_ = true;
    fresh_jacobian_ = true;
    exact_jacobian_ = exact || group_count == n_;
    return true;
  }

  // Far-field weights of the layers for grouped differences (grouped_jacobian.hpp): the square root
  // of the layer's pressure thickness (Pa^0.5), between the optically thin limit (exchange with a
  // layer in proportion to its absorber mass) and the thick one (independent of it). Measured on the
  // 60-layer band column from the isothermal start (benchmarks/equilibrium_bench): the Newton
  // matrix's columns for the upper 30 layers then differ from full differences by 3-20 % instead of
  // 20-60 % with equal weights.
  std::vector<double> far_weights() const {
    std::vector<double> w(n_);
    for (std::size_t j = 0; j < n_; ++j) w[j] = std::sqrt(column_.pressure_level_pa[j + 1] - column_.pressure_level_pa[j]);
    return w;
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

  // The Newton step for the current region from the state (t0, ts0) whose full map is (x0, f0),
  // capped at max_step_k: the region applied to that state (its layers onto the critical profile),
  // the residual there predicted with the Jacobian, and the step that zeroes it. Returns the
  // unknowns of the region-applied state in y_ref.
  Eigen::VectorXd solve_step(const std::vector<double>& t0, double ts0, const Eigen::VectorXd& x0,
                             const Eigen::VectorXd& f0, std::vector<double>& y_ref) {
    t_ = t0;
    ts_ = ts0;
    apply_region();
    y_ref = unknowns();
    const Eigen::VectorXd r_ref = residual_of(f0 + jacobian_ * (full_state() - x0));
    Eigen::VectorXd dy = newton_matrix().partialPivLu().solve(-r_ref);
    if (!dy.allFinite()) return dy;
    const double largest = dy.cwiseAbs().maxCoeff();
    capped_ = largest > s_.max_step_k;
    if (capped_) dy *= s_.max_step_k / largest;
    return dy;
  }

  // The region the step predicts: grown upward over the radiative layers that the (capped) step
  // would leave colder than the critical profile through the predicted surface temperature.
  std::size_t predicted_region(const std::vector<double>& y_ref, const Eigen::VectorXd& dy) const {
    const double ts = seb_ ? y_ref.back() + dy[dy.size() - 1] : ts_;
    std::size_t top = first_convective_;
    while (top > 0 &&
           y_ref[top - 1] + dy[static_cast<Eigen::Index>(top - 1)] < profile(column_.pressure_layer_pa[top - 1], ts))
      --top;
    return top;
  }

  // One Newton step with a backtracking line search on the merit. With an updated (not freshly
  // differenced) Jacobian a step that fails the sufficient-decrease test after two halvings counts
  // as a stalled update: the Jacobian is recomputed by differences and the step redone.
  bool step(double& merit0, std::string& failure) {
    if (!have_jacobian_ && !refresh_jacobian(failure, !grouped_)) return false;
    const std::vector<double> t0 = t_;
    const double ts0 = ts_;
    const std::size_t region0 = first_convective_;
    const Eigen::VectorXd x0 = full_state(), f0 = full_response(eval_);
    atmosphere::Column trial_column = column_;
    detail::Evaluation trial;
    for (;;) {
      // Only an exact, fresh Jacobian is trusted to give a direction worth taking without decrease.
      const bool trusted = fresh_jacobian_ && exact_jacobian_;
      // The next Jacobian if this one fails: grouped differences first when this one was updated,
      // exact differences when this one was grouped and fresh.
      const bool next_exact = !grouped_ || fresh_jacobian_;
      first_convective_ = region0;
      std::vector<double> y0;
      Eigen::VectorXd dy = solve_step(t0, ts0, x0, f0, y0);
      // Active set (the convective region) revised from the linear prediction, no radiative call.
      for (std::size_t revision = 0; grouped_ && convection_ && dy.allFinite() && revision < n_; ++revision) {
        const std::size_t top = predicted_region(y0, dy);
        if (top == first_convective_) break;
        first_convective_ = top;
        dy = solve_step(t0, ts0, x0, f0, y0);
      }
      const std::size_t m = y0.size();
      if (!dy.allFinite()) {
        if (!trusted) {
          if (!refresh_jacobian(failure, next_exact)) return false;
          continue;
        }
        failure = "the Jacobian is singular";
        break;
      }
      // With a fresh exact Jacobian, a step that does not decrease the merit after 8 halvings is
      // still taken (far from equilibrium the merit can rise before it falls), at most 4 times in a row.
      const int halvings = trusted ? 8 : 2;
      double lambda = 1.0;
      for (int halving = 0; halving <= halvings; ++halving, lambda *= 0.5) {
        std::vector<double> y = y0;
        for (std::size_t j = 0; j < m; ++j) y[j] += lambda * dy[static_cast<Eigen::Index>(j)];
        set_unknowns(y);
        if (!evaluate_state(trial_column, trial)) continue;
        const double mt = merit(residual(trial));
        const bool decrease = mt < (1.0 - 1e-4 * lambda) * merit0;
        if (decrease || (trusted && halving == 8)) {
          if (!(mt < merit0) && ++uphill_ > 4) {
            failure = "the line search found no decrease of the residual";
            restore(t0, ts0, region0);
            return false;
          }
          if (mt < merit0) uphill_ = 0;
          // An updated Jacobian whose uncapped step did not halve the merit no longer
          // describes the column well (Broyden's updates cannot undo a Jacobian differenced far
          // away, e.g. with quite different water): with grouped differences (2b + 3 calls)
          // differenced afresh before the next step.
          const bool stale = grouped_ && !fresh_jacobian_ && !capped_ && !(mt < 0.5 * merit0);
          column_ = trial_column;
          eval_ = trial;
          merit0 = mt;
          moved(x0, f0);
          if (stale) have_jacobian_ = false;
          return true;
        }
      }
      restore(t0, ts0, region0);
      if (trusted) {
        failure = "every trial step left the radiation's range (" + last_error_ + ")";
        break;
      }
      if (!refresh_jacobian(failure, next_exact)) return false;
    }
    restore(t0, ts0, region0);
    return false;
  }

  void restore(const std::vector<double>& t0, double ts0, std::size_t region) {
    t_ = t0;
    ts_ = ts0;
    first_convective_ = region;
  }

  const EquilibriumSettings& s_;
  bool grouped_;                 // start (and restart) with grouped differences
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
  bool capped_ = false;          // the last step solved was shortened to max_step_k
  bool fresh_jacobian_ = false;  // differenced at the current state, not updated since
  bool exact_jacobian_ = false;  // differenced column by column (not grouped)
};

} // namespace

EquilibriumResult solve_equilibrium(const atmosphere::Column& start, const NetHeating& radiation,
                                    const EquilibriumSettings& settings) {
  detail::check_inputs(start, settings);
  if (!radiation) throw InputError(InputPlace::of("radiation"), "no radiation callback given");
  const std::size_t n = start.layer_count();
  const bool grouped = settings.jacobian == JacobianMethod::grouped_differences &&
                       detail::jacobian_group_count(n, settings.jacobian_half_bandwidth) < n;
  EquilibriumResult result;
  std::string failure;
  Newton newton(start, radiation, settings, grouped);
  bool ok = newton.run(result, failure);
  result.radiative_calls = newton.calls();
  atmosphere::Column best = newton.best_column();
  if (!ok && grouped) {
    // Grouped differences did not get there: Newton's method again from the start with full
    // differences, as robust as it ever was.
    const int steps = result.newton_iterations;
    const long calls = result.radiative_calls;
    Newton full(start, radiation, settings, false);
    std::string full_failure;
    ok = full.run(result, full_failure);
    result.newton_iterations += steps;
    result.radiative_calls = calls + full.calls();
    failure = fmt::format("with grouped differences: {}; with full differences: {}", failure, full_failure);
    best = full.best_column();
  }
  if (ok) {
    result.method = EquilibriumMethod::newton;
    result.converged = true;
    return result;
  }
  if (!settings.time_marching_fallback)
    throw ConvergenceError(fmt::format("column '{}': equilibrium not reached: {} (time marching not allowed)",
                                       start.name, failure));
  const atmosphere::Column& from = best.layer_count() == start.layer_count() ? best : start;
  try {
    EquilibriumResult marched = march_to_equilibrium(from, radiation, settings);
    marched.newton_iterations = result.newton_iterations;
    marched.radiative_calls += result.radiative_calls;
    marched.newton_failure = failure;
    return marched;
  } catch (const ConvergenceError& e) {
    throw ConvergenceError(fmt::format("column '{}': equilibrium not reached: {}; then {}", start.name, failure, e.what()));
  }
}

} // namespace bandstack::climate
