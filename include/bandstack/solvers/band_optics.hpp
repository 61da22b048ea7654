#pragma once
// Band optics: the optical depth of every layer and g-point of a column from a band set's
// absorption tables, and the Planck source of every g-point at the levels, the layers and the
// surface.
//
// Optical depth of layer i at g-point g (absorber units in spectral/absorber.hpp):
//   tau_g,i = sum over absorbers a of kappa_a,g(p_i, T_i) * m_a,i      (x e_h2o,i for the self-continuum)
// with p_i, T_i = column.pressure_layer_pa[i], column.temperature_layer_k[i], m_a,i the layer mass of
// the absorber's gas (atmosphere::layer_gas_mass_kg_m2) and e_h2o,i = x_h2o,i * p_i.
//
// Interpolation of kappa between table nodes, bilinear in pressure and temperature:
//  * temperature: kappa linear in T;
//  * pressure (PressureInterpolation): by default kappa linear in p between the two neighbouring
//    nodes. This is exact for kappa = c0 + c1 p, i.e. for pressure-independent absorption and for
//    pressure-broadened line wings (kappa proportional to p), which is how the embedded recipe and
//    most of real spectroscopy scale; linear in ln p instead overestimates kappa proportional to p
//    by up to (ln r)^2 / 8 between nodes a factor r apart (4.6 % for r = 1.84, i.e. 20 nodes over
//    1 Pa..1100 hPa). linear_in_ln_p is available (exact for kappa = c0 + c1 ln p).
//    Kappa is interpolated itself, not its logarithm: tables hold zeros, and the result stays
//    between the node values.
//  * below the lowest reference pressure p_min (an explicit extrapolation): gases take
//    kappa(p_min, T) * p / p_min, i.e. pressure broadening continues down to p = 0; the
//    self-continuum keeps kappa(p_min, T) (its pressure dependence is in e_h2o).
//  * above the highest reference pressure, or at a layer temperature outside the reference
//    temperatures: InputError naming the layer and the table's range.
//
// Planck source of g-point g in band b at temperature T (levels, layers and surface), W m-2 sr-1:
//   B_g(T) = B_b(T) * f_g(T),
// B_b the band integral of the Planck function over the band's edges, f_g the set's Planck fraction
// interpolated linearly in T between the set's Planck temperatures (InputError outside them). B_b
// comes from a cubic Hermite table of spectral::planck_band_radiance and its derivative at 0.25 K
// steps (error below 1e-9 of B_b or 1e-12 of sigma T^4 / pi, whichever is larger; tested),
// because evaluating the band integral for every band and level would cost more than the solve.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace bandstack::solvers {

enum class PressureInterpolation { linear_in_p, linear_in_ln_p };

// A band set rearranged for fast optics. Build once per band set (make_band_optics_tables) and share
// read-only between threads. Fields are filled by make_band_optics_tables; treat them as read-only.
struct BandOpticsTables {
  std::string name;                            // the band set's name, for messages
  std::vector<double> band_lower_cm1;          // n_band
  std::vector<double> band_upper_cm1;          // n_band
  std::vector<std::size_t> band_first_gpoint;  // n_band + 1: g-points of band b are [first[b], first[b+1])
  std::vector<std::size_t> gpoint_band;        // n_g
  std::vector<double> ref_pressure_pa;         // n_p, increasing
  std::vector<double> ref_temperature_k;       // n_t, increasing
  PressureInterpolation pressure_interpolation = PressureInterpolation::linear_in_p;
  std::vector<spectral::Absorber> absorbers;   // the absorbers present in the set (n_a)
  std::vector<double> kappa;                   // [((a * n_t + t) * n_p + p) * n_g + g], a indexes `absorbers`
  std::vector<double> planck_temperature_k;    // n_pt, increasing
  std::vector<double> planck_fraction;         // [t * n_g + g]
  // Cubic Hermite table of the band radiances: node m at planck_temperature_k.front() + m * step.
  double band_radiance_step_k = 0.25;
  std::vector<double> band_radiance;           // [m * n_band + b], W m-2 sr-1
  std::vector<double> band_radiance_slope;     // [m * n_band + b], step * dB_b/dT, W m-2 sr-1

  [[nodiscard]] std::size_t band_count() const noexcept { return band_lower_cm1.size(); }
  [[nodiscard]] std::size_t gpoint_count() const noexcept { return gpoint_band.size(); }
};

// Checks the set (spectral::validate) and rearranges it. Throws InputError for an invalid set.
// Costs a few milliseconds (the Planck table); reuse the result for every column.
[[nodiscard]] BandOpticsTables make_band_optics_tables(const spectral::BandSet& set,
                                                       PressureInterpolation pressure_interpolation =
                                                           PressureInterpolation::linear_in_p);

// Optical depths and Planck sources of one column, stored g-point-fastest so that the longwave
// kernel (longwave_many.hpp) reads them directly and vectorises over g-points.
struct BandOptics {
  std::size_t layer_count = 0;         // N
  std::size_t gpoint_count = 0;        // n_g
  std::vector<double> optical_depth;   // [i * n_g + g], N x n_g, vertical
  std::vector<double> source_level;    // [k * n_g + g], (N+1) x n_g, W m-2 sr-1
  std::vector<double> source_layer;    // [i * n_g + g], N x n_g, W m-2 sr-1 at column.temperature_layer_k
  std::vector<double> source_surface;  // [g], W m-2 sr-1 at column.surface_temperature_k
};

// Per-column scratch (interpolation weights and absorber amounts per layer). One per thread.
struct BandOpticsWorkspace {
  std::vector<double> amount;          // [a * N + i]: m (kg m-2), or m * e_h2o for the self-continuum
  std::vector<std::size_t> pressure_index;
  std::vector<double> pressure_weight; // [i * 4 + c]: lower/upper node weight, gases then self-continuum
  std::vector<std::size_t> temperature_index;
  std::vector<double> temperature_weight; // upper-node weight
  std::vector<double> band_source;     // n_band radiances at one temperature
  std::vector<double> gas_mass;        // scratch
};

// Optics of `column` from `tables`, written to `out` (resized; no allocation once grown). Validates
// the column. Throws InputError for a layer state or temperature outside the tables (see above),
// including a level, layer or surface temperature outside the Planck temperatures, naming the
// column level or layer.
void compute_band_optics(const atmosphere::Column& column, const BandOpticsTables& tables, BandOptics& out,
                         BandOpticsWorkspace& workspace);

// Convenience: tables built from `set` for this one call (slow for many columns).
[[nodiscard]] BandOptics compute_band_optics(const atmosphere::Column& column, const spectral::BandSet& set);

// The band radiance B_b(T) (W m-2 sr-1) of band `band` from the Hermite table, as used for the
// sources. Throws InputError for T outside the set's Planck temperatures or a bad band index.
[[nodiscard]] double tabulated_band_radiance(const BandOpticsTables& tables, std::size_t band, double t_k);

} // namespace bandstack::solvers
