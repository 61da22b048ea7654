#include "bandstack/climate/convective_adjustment.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/lapse_rate.hpp"

namespace bandstack::climate {

std::size_t AdjustmentResult::adjusted_layer_count() const {
  return static_cast<std::size_t>(std::count(layer_adjusted.begin(), layer_adjusted.end(), true));
}

namespace {

void check_settings(const ConvectionSettings& settings) {
  if (settings.kind == ConvectionKind::none)
    throw InputError(InputPlace::of("convection"), "a critical profile needs a convection kind other than none");
  if (settings.kind == ConvectionKind::fixed_lapse_rate &&
      (!std::isfinite(settings.critical_lapse_rate_k_km) || settings.critical_lapse_rate_k_km <= 0.0))
    throw InputError(InputPlace::of("critical_lapse_rate"), "must be finite and > 0 K/km");
}

struct Region {
  std::size_t top = 0;     // first layer
  std::size_t bottom = 0;  // last layer
  bool surface = false;
};

class Adjuster {
public:
  Adjuster(const ConvectionSettings& settings, const std::vector<double>& level_p, const std::vector<double>& layer_p,
           std::vector<double>& t, double g, AdjustedSurface* surface)
      : s_(settings), layer_p_(layer_p), t_(t), g_(g), surface_(surface), mass_(t.size()) {
    for (std::size_t i = 0; i < t.size(); ++i)
      mass_[i] = (level_p[i + 1] - level_p[i]) / g;
    surface_p_ = level_p.back();
    tolerance_k_ = settings.kind == ConvectionKind::moist_adiabat ? 1e-6 : 1e-9;
  }

  double profile(double t0, double p0, double p) const { return critical_profile_temperature_k(s_, t0, p0, p, g_); }

  // Layer `upper` is unstable against layer upper + 1.
  bool pair_unstable(std::size_t upper) const {
    return t_[upper] < profile(t_[upper + 1], layer_p_[upper + 1], layer_p_[upper]) - tolerance_k_;
  }
  bool surface_unstable() const {
    const std::size_t n = t_.size();
    return surface_ != nullptr && t_[n - 1] < profile(surface_->temperature_k, surface_p_, layer_p_[n - 1]) - tolerance_k_;
  }

  // Sets the region to the critical profile through its anchor (bottom layer or surface) with the
  // anchor temperature that keeps the region's enthalpy.
  void adjust(const Region& r) {
    const double cp = constants::specific_heat_dry_air_j_kg_k;
    const double cs = r.surface ? surface_->heat_capacity_j_m2_k : 0.0;
    double enthalpy = r.surface ? cs * surface_->temperature_k : 0.0;
    for (std::size_t i = r.top; i <= r.bottom; ++i)
      enthalpy += cp * mass_[i] * t_[i];
    const double anchor_p = r.surface ? surface_p_ : layer_p_[r.bottom];
    auto region_enthalpy = [&](double anchor_t) {
      double e = cs * anchor_t;
      for (std::size_t i = r.top; i <= r.bottom; ++i)
        e += cp * mass_[i] * profile(anchor_t, anchor_p, layer_p_[i]);
      return e;
    };
    double anchor_t;
    if (s_.kind == ConvectionKind::fixed_lapse_rate) {
      // The profile is proportional to its anchor temperature: the enthalpy is linear in it.
      anchor_t = enthalpy / region_enthalpy(1.0);
    } else {
      anchor_t = solve_anchor(region_enthalpy, enthalpy, r);
    }
    for (std::size_t i = r.top; i <= r.bottom; ++i)
      t_[i] = profile(anchor_t, anchor_p, layer_p_[i]);
    if (r.surface) {
      surface_->temperature_k = anchor_t;
      surface_adjusted_ = true;
    }
    for (std::size_t i = r.top; i <= r.bottom; ++i)
      adjusted_[i] = true;
  }

  template <class F> double solve_anchor(F&& region_enthalpy, double enthalpy, const Region& r) const {
    // Enthalpy grows monotonically with the anchor temperature: bracket, then secant steps kept
    // inside the bracket (bisection when a step leaves it), to roundoff.
    double lo = t_[r.bottom] - 5.0, hi = t_[r.bottom] + 5.0;
    for (int k = 0; k < 60 && region_enthalpy(lo) > enthalpy; ++k) lo -= 10.0;
    for (int k = 0; k < 60 && region_enthalpy(hi) < enthalpy; ++k) hi += 10.0;
    double f_lo = region_enthalpy(lo) - enthalpy, f_hi = region_enthalpy(hi) - enthalpy;
    if (f_lo > 0.0 || f_hi < 0.0) throw InternalError("convective adjustment: cannot bracket the moist-adiabat anchor");
    double best = std::abs(f_lo) < std::abs(f_hi) ? lo : hi;
    double best_f = std::min(std::abs(f_lo), std::abs(f_hi));
    for (int k = 0; k < 300 && hi - lo > 4e-16 * hi; ++k) {
      // Secant inside the bracket; every third step a bisection so that neither end sticks.
      double x = k % 3 == 2 ? 0.5 * (lo + hi) : lo - f_lo * (hi - lo) / (f_hi - f_lo);
      if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
      const double f = region_enthalpy(x) - enthalpy;
      if (std::abs(f) < best_f) { best_f = std::abs(f); best = x; }
      if (f == 0.0) break;
      if (f < 0.0) { lo = x; f_lo = f; } else { hi = x; f_hi = f; }
    }
    return best;
  }

  AdjustmentResult run() {
    const std::size_t n = t_.size();
    adjusted_.assign(n, false);
    const std::size_t max_rounds = 4 * n * n + 16;
    for (std::size_t round = 0;; ++round) {
      if (round > max_rounds) throw InternalError("convective adjustment did not settle");
      Region r;
      bool found = false;
      if (surface_unstable()) {
        r = Region{n - 1, n - 1, true};
        found = true;
      } else {
        for (std::size_t k = n - 1; k-- > 0;) {
          if (pair_unstable(k)) {
            r = Region{k, k + 1, false};
            found = true;
            break;
          }
        }
      }
      if (!found) break;
      for (std::size_t grow = 0;; ++grow) {
        if (grow > 2 * n + 4) throw InternalError("convective adjustment region did not settle");
        adjust(r);
        if (r.top > 0 && pair_unstable(r.top - 1)) { --r.top; continue; }
        if (r.bottom + 1 < n && pair_unstable(r.bottom)) { ++r.bottom; continue; }
        if (r.bottom + 1 == n && !r.surface && surface_unstable()) { r.surface = true; continue; }
        break;
      }
    }
    AdjustmentResult result;
    result.layer_adjusted = adjusted_;
    result.surface_adjusted = surface_adjusted_;
    return result;
  }

private:
  const ConvectionSettings& s_;
  const std::vector<double>& layer_p_;
  std::vector<double>& t_;
  double g_;
  AdjustedSurface* surface_;
  std::vector<double> mass_;
  double surface_p_ = 0.0;
  double tolerance_k_ = 1e-9;
  std::vector<bool> adjusted_;
  bool surface_adjusted_ = false;
};

} // namespace

double critical_profile_temperature_k(const ConvectionSettings& settings, double t0_k, double p0_pa, double p_pa,
                                      double gravity_m_s2) {
  check_settings(settings);
  if (!(t0_k > 0.0) || !(p0_pa > 0.0) || !(p_pa > 0.0) || !(gravity_m_s2 > 0.0))
    throw InputError(InputPlace::of("critical_profile"), "temperature, pressures and gravity must be > 0");
  if (settings.kind == ConvectionKind::moist_adiabat) return thermo::moist_pseudoadiabat_temperature_k(t0_k, p0_pa, p_pa);
  // dT/dz = -Gamma with dz = -(R_d T / g) d ln p gives d ln T / d ln p = R_d Gamma / g.
  const double exponent = constants::gas_constant_dry_air_j_kg_k * settings.critical_lapse_rate_k_km * 1e-3 / gravity_m_s2;
  return t0_k * std::pow(p_pa / p0_pa, exponent);
}

AdjustmentResult adjust_convectively(const ConvectionSettings& settings, const std::vector<double>& level_pressure_pa,
                                     const std::vector<double>& layer_pressure_pa,
                                     std::vector<double>& layer_temperature_k, double gravity_m_s2,
                                     AdjustedSurface* surface) {
  const std::size_t n = layer_temperature_k.size();
  if (n == 0 || level_pressure_pa.size() != n + 1 || layer_pressure_pa.size() != n)
    throw InputError(InputPlace::of("layer_temperature"),
                     "convective adjustment needs N >= 1 layer temperatures, N layer pressures and N+1 level pressures");
  if (!(gravity_m_s2 > 0.0)) throw InputError(InputPlace::of("gravity"), "must be > 0 m s-2");
  for (std::size_t k = 0; k < n; ++k)
    if (!(level_pressure_pa[k + 1] > level_pressure_pa[k]) || !(level_pressure_pa[k] >= 0.0))
      throw InputError(InputPlace::of("pressure_level", k), "level pressures must increase strictly downward");
  for (std::size_t i = 0; i < n; ++i)
    if (!(layer_temperature_k[i] > 0.0) || !std::isfinite(layer_temperature_k[i]))
      throw InputError(InputPlace::of("temperature_layer", i), "must be finite and > 0 K");
  if (surface != nullptr && (!(surface->heat_capacity_j_m2_k >= 0.0) || !std::isfinite(surface->heat_capacity_j_m2_k)))
    throw InputError(InputPlace::of("surface_heat_capacity"), "must be finite and >= 0 J m-2 K-1");
  if (settings.kind == ConvectionKind::none) {
    AdjustmentResult none;
    none.layer_adjusted.assign(n, false);
    return none;
  }
  check_settings(settings);
  return Adjuster(settings, level_pressure_pa, layer_pressure_pa, layer_temperature_k, gravity_m_s2, surface).run();
}

} // namespace bandstack::climate
