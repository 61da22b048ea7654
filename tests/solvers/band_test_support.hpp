#pragma once
// Synthetic inputs shared by the band optics, band solver and reference solver tests: a column,
// a hand-made band set and an absorber source with simple formulas.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <cmath>
#include <functional>
#include <span>
#include <string>
#include <vector>

namespace band_test {

using bandstack::Gas;
using bandstack::spectral::Absorber;

// N layers between p_top_pa and p_surface_pa (levels equally spaced in p), layer pressures at the
// middle, temperature linear in p from t_top_k to t_surface_k (levels and layers), surface at
// t_surface_k. Water vapour 1e-3 at the top to 1.5e-2 at the surface, CO2 4e-4, others 0.
inline bandstack::atmosphere::Column make_column(std::size_t layers, double p_top_pa, double p_surface_pa,
                                                 double t_top_k, double t_surface_k) {
  bandstack::atmosphere::Column c;
  c.name = "synthetic";
  const auto temperature = [&](double p) {
    return t_top_k + (t_surface_k - t_top_k) * (p - p_top_pa) / (p_surface_pa - p_top_pa);
  };
  for (std::size_t k = 0; k <= layers; ++k) {
    const double p = p_top_pa + (p_surface_pa - p_top_pa) * static_cast<double>(k) / static_cast<double>(layers);
    c.pressure_level_pa.push_back(p);
    c.temperature_level_k.push_back(temperature(p));
  }
  for (auto& x : c.mole_fraction) x.assign(layers, 0.0);
  for (std::size_t i = 0; i < layers; ++i) {
    const double p = 0.5 * (c.pressure_level_pa[i] + c.pressure_level_pa[i + 1]);
    c.pressure_layer_pa.push_back(p);
    c.temperature_layer_k.push_back(temperature(p));
    c.gas(Gas::h2o)[i] = 1e-3 + 1.4e-2 * (p - p_top_pa) / (p_surface_pa - p_top_pa);
    c.gas(Gas::co2)[i] = 4e-4;
  }
  c.surface_temperature_k = t_surface_k;
  c.surface_emissivity = 1.0;
  return c;
}

// A band set with the given edges (n_band + 1), `per_band` g-points per band of equal weight,
// reference nodes p_nodes x t_nodes, Planck temperatures planck_nodes, and
//   kappa(a, g, p, T) = kappa_of(a, g, p, T) for the absorbers listed in `present`,
//   planck_fraction(g, T) = fraction_of(g, T) (should sum to 1 per band).
inline bandstack::spectral::BandSet make_band_set(
    const std::vector<double>& edges, std::size_t per_band, const std::vector<double>& p_nodes,
    const std::vector<double>& t_nodes, const std::vector<double>& planck_nodes, const std::vector<Absorber>& present,
    const std::function<double(Absorber, std::size_t, double, double)>& kappa_of,
    const std::function<double(std::size_t, double)>& fraction_of = {}) {
  bandstack::spectral::BandSet s;
  s.name = "synthetic";
  const std::size_t n_band = edges.size() - 1;
  for (std::size_t b = 0; b < n_band; ++b) {
    s.band_lower_cm1.push_back(edges[b]);
    s.band_upper_cm1.push_back(edges[b + 1]);
    for (std::size_t j = 0; j < per_band; ++j) {
      s.gpoint_band.push_back(b);
      s.gpoint_weight.push_back(1.0 / static_cast<double>(per_band));
    }
  }
  s.ref_pressure_pa = p_nodes;
  s.ref_temperature_k = t_nodes;
  s.planck_temperature_k = planck_nodes;
  const std::size_t n_g = s.gpoint_count(), n_t = t_nodes.size(), n_p = p_nodes.size();
  s.absorption_coefficient.assign(bandstack::spectral::absorber_count * n_g * n_t * n_p, 0.0);
  for (Absorber a : present) {
    s.absorber_present[bandstack::spectral::index(a)] = true;
    for (std::size_t g = 0; g < n_g; ++g)
      for (std::size_t t = 0; t < n_t; ++t)
        for (std::size_t p = 0; p < n_p; ++p)
          s.absorption_coefficient[((bandstack::spectral::index(a) * n_g + g) * n_t + t) * n_p + p] =
              kappa_of(a, g, p_nodes[p], t_nodes[t]);
  }
  const std::size_t n_pt = planck_nodes.size();
  s.planck_fraction.assign(n_g * n_pt, 0.0);
  for (std::size_t g = 0; g < n_g; ++g)
    for (std::size_t t = 0; t < n_pt; ++t)
      s.planck_fraction[g * n_pt + t] = fraction_of ? fraction_of(g, planck_nodes[t]) : 1.0 / static_cast<double>(per_band);
  return s;
}

// Nodes lo * (hi/lo)^(k/(n-1)), k = 0..n-1.
inline std::vector<double> log_nodes(double lo, double hi, std::size_t n) {
  std::vector<double> v;
  for (std::size_t k = 0; k < n; ++k)
    v.push_back(lo * std::pow(hi / lo, static_cast<double>(k) / static_cast<double>(n - 1)));
  return v;
}

inline std::vector<double> linear_nodes(double lo, double hi, std::size_t n) {
  std::vector<double> v;
  for (std::size_t k = 0; k < n; ++k)
    v.push_back(lo + (hi - lo) * static_cast<double>(k) / static_cast<double>(n - 1));
  return v;
}

// An absorber source given by a formula kappa(a, nu, p, T) for the listed absorbers; it rejects
// temperatures outside [t_min_k, t_max_k] as a real source outside its coverage would.
class FormulaSource : public bandstack::spectral::AbsorberSource {
public:
  using Formula = std::function<double(Absorber, double, double, double)>;
  FormulaSource(std::vector<Absorber> absorbers, Formula formula, double t_min_k = 100.0, double t_max_k = 400.0)
      : absorbers_(std::move(absorbers)), formula_(std::move(formula)), t_min_(t_min_k), t_max_(t_max_k) {}
  [[nodiscard]] std::string description() const override { return "test formula"; }
  [[nodiscard]] bool provides(Absorber a) const override {
    for (Absorber b : absorbers_)
      if (a == b) return true;
    return false;
  }
  void absorption(Absorber a, const bandstack::spectral::AbsorberState& state,
                  const bandstack::spectral::WavenumberGrid& grid, std::span<double> out) const override {
    if (state.temperature_k < t_min_ || state.temperature_k > t_max_)
      throw bandstack::InputError("test source: temperature outside its range");
    const bool has = provides(a);
    for (std::size_t q = 0; q < grid.count; ++q)
      out[q] = has ? formula_(a, grid.at(q), state.pressure_pa, state.temperature_k) : 0.0;
  }

private:
  std::vector<Absorber> absorbers_;
  Formula formula_;
  double t_min_, t_max_;
};

} // namespace band_test
