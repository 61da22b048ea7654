// GCC keeps floating-point selects out of vectorised loops while it assumes floating-point
// operations may trap (its default); bandstack never enables traps. See longwave_many.cpp.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/solvers/band_optics.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/spectral/planck.hpp"
#include "solvers/vector_math.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <fmt/format.h>
#include <optional>
#include <string>

namespace bandstack::solvers {

namespace {

using spectral::Absorber;

[[noreturn]] void fail_at(const char* item, std::optional<long> level, const std::string& message) {
  InputPlace place;
  place.item = item;
  place.level = level;
  throw InputError(place, message);
}

std::string set_label(const BandOpticsTables& tables) {
  return tables.name.empty() ? std::string("the band set") : fmt::format("band set '{}'", tables.name);
}

// Index j of the interval [nodes[j], nodes[j+1]] holding x (nodes increasing, x within them; 0 for
// a one-node table, where x equals the node).
std::size_t interval_of(const std::vector<double>& nodes, double x) {
  if (nodes.size() < 2) return 0;
  const auto above = std::upper_bound(nodes.begin(), nodes.end(), x);
  const auto j = static_cast<std::size_t>(std::max<std::ptrdiff_t>(above - nodes.begin() - 1, 0));
  return std::min(j, nodes.size() - 2);
}

struct Bracket {
  std::size_t lower;
  std::size_t upper;
  double upper_weight;
};

Bracket bracket_linear(const std::vector<double>& nodes, double x) {
  const std::size_t j = interval_of(nodes, x);
  if (nodes.size() < 2) return {0, 0, 0.0};
  return {j, j + 1, (x - nodes[j]) / (nodes[j + 1] - nodes[j])};
}

// Band radiances at t_k for every band from the cubic Hermite table (values and slopes at the two
// nodes around t_k, with the Hermite basis polynomials; common practice).
void hermite_band_radiances(const BandOpticsTables& tables, double t_k, double* out) {
  const std::size_t n_band = tables.band_count();
  const std::size_t nodes = tables.band_radiance.size() / n_band;
  const double u = (t_k - tables.planck_temperature_k.front()) / tables.band_radiance_step_k;
  const auto m = std::min(static_cast<std::size_t>(std::max(u, 0.0)), nodes - 2);
  const double s = u - static_cast<double>(m);
  const double s2 = s * s, s3 = s2 * s;
  const double h00 = 2.0 * s3 - 3.0 * s2 + 1.0, h10 = s3 - 2.0 * s2 + s, h01 = 3.0 * s2 - 2.0 * s3, h11 = s3 - s2;
  const double* y0 = tables.band_radiance.data() + m * n_band;
  const double* d0 = tables.band_radiance_slope.data() + m * n_band;
  for (std::size_t b = 0; b < n_band; ++b)
    out[b] = h00 * y0[b] + h10 * d0[b] + h01 * y0[b + n_band] + h11 * d0[b + n_band];
}

void check_planck_range(const BandOpticsTables& tables, double t_k, const char* item, std::optional<long> level) {
  const double lo = tables.planck_temperature_k.front(), hi = tables.planck_temperature_k.back();
  if (!(t_k >= lo && t_k <= hi))
    fail_at(item, level,
            fmt::format("temperature {} K is outside the Planck temperatures of {}, [{}, {}] K", t_k, set_label(tables),
                        lo, hi));
}

// out[g] = B_b * (w0 f0[g] + w1 f1[g]) for every g-point g of every band b: the band radiance times
// each g-point's Planck fraction interpolated linearly in T (band by band, so that the inner loop
// needs no gather).
BANDSTACK_VECTOR_CLONES
void weighted_fractions(std::size_t n_band, const std::size_t* __restrict first, const double* __restrict band_radiance,
                        const double* __restrict f0, const double* __restrict f1, double w0, double w1,
                        double* __restrict out) {
  for (std::size_t b = 0; b < n_band; ++b) {
    const double radiance = band_radiance[b];
    for (std::size_t g = first[b]; g < first[b + 1]; ++g)
      out[g] = radiance * (w0 * f0[g] + w1 * f1[g]);
  }
}

// Planck source of every g-point at t_k (already checked against the Planck range).
void gpoint_sources(const BandOpticsTables& tables, double t_k, double* band_source, double* out) {
  hermite_band_radiances(tables, t_k, band_source);
  const std::size_t n_g = tables.gpoint_count();
  const Bracket t = bracket_linear(tables.planck_temperature_k, t_k);
  const double* f0 = tables.planck_fraction.data() + t.lower * n_g;
  const double* f1 = tables.planck_fraction.data() + t.upper * n_g;
  weighted_fractions(tables.band_count(), tables.band_first_gpoint.data(), band_source, f0, f1, 1.0 - t.upper_weight,
                     t.upper_weight, out);
}

// The four table rows around one layer state of one absorber and their weights (amount included).
struct Corners {
  const double* row[4];
  double weight[4];
};

// tau_row[g] (+)= the weighted corner rows of two absorbers. Two at a time halves the passes over
// tau_row; the first call of a layer overwrites instead of adding (no separate zeroing).
BANDSTACK_VECTOR_CLONES
void bilinear_pair(std::size_t n_g, const Corners& a, const Corners& b, bool accumulate, double* __restrict tau_row) {
  const double* __restrict a0 = a.row[0];
  const double* __restrict a1 = a.row[1];
  const double* __restrict a2 = a.row[2];
  const double* __restrict a3 = a.row[3];
  const double* __restrict b0 = b.row[0];
  const double* __restrict b1 = b.row[1];
  const double* __restrict b2 = b.row[2];
  const double* __restrict b3 = b.row[3];
  const double ca0 = a.weight[0], ca1 = a.weight[1], ca2 = a.weight[2], ca3 = a.weight[3];
  const double cb0 = b.weight[0], cb1 = b.weight[1], cb2 = b.weight[2], cb3 = b.weight[3];
  if (accumulate) {
    for (std::size_t g = 0; g < n_g; ++g)
      tau_row[g] += ((ca0 * a0[g] + ca1 * a1[g]) + (ca2 * a2[g] + ca3 * a3[g])) +
                    ((cb0 * b0[g] + cb1 * b1[g]) + (cb2 * b2[g] + cb3 * b3[g]));
  } else {
    for (std::size_t g = 0; g < n_g; ++g)
      tau_row[g] = ((ca0 * a0[g] + ca1 * a1[g]) + (ca2 * a2[g] + ca3 * a3[g])) +
                   ((cb0 * b0[g] + cb1 * b1[g]) + (cb2 * b2[g] + cb3 * b3[g]));
  }
}

BANDSTACK_VECTOR_CLONES
void bilinear_single(std::size_t n_g, const Corners& a, bool accumulate, double* __restrict tau_row) {
  const double* __restrict a0 = a.row[0];
  const double* __restrict a1 = a.row[1];
  const double* __restrict a2 = a.row[2];
  const double* __restrict a3 = a.row[3];
  const double ca0 = a.weight[0], ca1 = a.weight[1], ca2 = a.weight[2], ca3 = a.weight[3];
  if (accumulate) {
    for (std::size_t g = 0; g < n_g; ++g) tau_row[g] += (ca0 * a0[g] + ca1 * a1[g]) + (ca2 * a2[g] + ca3 * a3[g]);
  } else {
    for (std::size_t g = 0; g < n_g; ++g) tau_row[g] = (ca0 * a0[g] + ca1 * a1[g]) + (ca2 * a2[g] + ca3 * a3[g]);
  }
}

// Sizes and indices only (cheap): tables edited by hand must not make the optics or the band sums
// read out of bounds.
void check_tables(const BandOpticsTables& t) {
  const std::size_t n_band = t.band_count(), n_g = t.gpoint_count();
  const std::size_t n_p = t.ref_pressure_pa.size(), n_t = t.ref_temperature_k.size();
  const std::size_t n_pt = t.planck_temperature_k.size();
  const bool consistent =
      n_band > 0 && n_g > 0 && n_p > 0 && n_t > 0 && n_pt > 0 && t.band_upper_cm1.size() == n_band &&
      t.band_first_gpoint.size() == n_band + 1 && t.kappa.size() == t.absorbers.size() * n_t * n_p * n_g &&
      t.planck_fraction.size() == n_pt * n_g && t.band_radiance_step_k > 0.0 &&
      t.band_radiance.size() == t.band_radiance_slope.size() && t.band_radiance.size() % n_band == 0 &&
      t.band_radiance.size() / n_band >= 2 &&
      t.planck_temperature_k.front() + static_cast<double>(t.band_radiance.size() / n_band - 1) * t.band_radiance_step_k >=
          t.planck_temperature_k.back() &&
      std::all_of(t.gpoint_band.begin(), t.gpoint_band.end(), [&](std::size_t b) { return b < n_band; }) &&
      std::is_sorted(t.band_first_gpoint.begin(), t.band_first_gpoint.end()) && t.band_first_gpoint.back() == n_g;
  if (!consistent)
    throw InputError("band optics tables are empty or inconsistent: build them with make_band_optics_tables");
}

} // namespace

BandOpticsTables make_band_optics_tables(const spectral::BandSet& set, PressureInterpolation pressure_interpolation) {
  spectral::validate(set);
  BandOpticsTables t;
  t.name = set.name;
  t.band_lower_cm1 = set.band_lower_cm1;
  t.band_upper_cm1 = set.band_upper_cm1;
  t.gpoint_band = set.gpoint_band;
  t.ref_pressure_pa = set.ref_pressure_pa;
  t.ref_temperature_k = set.ref_temperature_k;
  t.pressure_interpolation = pressure_interpolation;
  t.planck_temperature_k = set.planck_temperature_k;
  const std::size_t n_band = set.band_count(), n_g = set.gpoint_count();
  const std::size_t n_p = set.ref_pressure_pa.size(), n_t = set.ref_temperature_k.size();
  const std::size_t n_pt = set.planck_temperature_k.size();

  t.band_first_gpoint.assign(n_band + 1, n_g);
  for (std::size_t g = n_g; g-- > 0;)
    t.band_first_gpoint[set.gpoint_band[g]] = g;

  for (Absorber a : spectral::all_absorbers)
    if (set.absorber_present[spectral::index(a)]) t.absorbers.push_back(a);
  t.kappa.resize(t.absorbers.size() * n_t * n_p * n_g);
  for (std::size_t ai = 0; ai < t.absorbers.size(); ++ai)
    for (std::size_t it = 0; it < n_t; ++it)
      for (std::size_t ip = 0; ip < n_p; ++ip)
        for (std::size_t g = 0; g < n_g; ++g)
          t.kappa[((ai * n_t + it) * n_p + ip) * n_g + g] = set.kappa(t.absorbers[ai], g, it, ip);

  t.planck_fraction.resize(n_pt * n_g);
  for (std::size_t g = 0; g < n_g; ++g)
    for (std::size_t it = 0; it < n_pt; ++it)
      t.planck_fraction[it * n_g + g] = set.planck_fraction[g * n_pt + it];

  // Hermite nodes from the lowest to (at least) the highest Planck temperature; at least 2.
  const double t0 = t.planck_temperature_k.front();
  const double span = t.planck_temperature_k.back() - t0;
  const auto nodes = static_cast<std::size_t>(std::ceil(span / t.band_radiance_step_k)) + 2;
  t.band_radiance.resize(nodes * n_band);
  t.band_radiance_slope.resize(nodes * n_band);
  for (std::size_t m = 0; m < nodes; ++m) {
    const double temperature = t0 + static_cast<double>(m) * t.band_radiance_step_k;
    for (std::size_t b = 0; b < n_band; ++b) {
      t.band_radiance[m * n_band + b] = spectral::planck_band_radiance(t.band_lower_cm1[b], t.band_upper_cm1[b], temperature);
      t.band_radiance_slope[m * n_band + b] =
          t.band_radiance_step_k *
          spectral::planck_band_radiance_derivative(t.band_lower_cm1[b], t.band_upper_cm1[b], temperature);
    }
  }
  return t;
}

double tabulated_band_radiance(const BandOpticsTables& tables, std::size_t band, double t_k) {
  if (band >= tables.band_count())
    fail_at("band", std::nullopt, fmt::format("band index {} is not below the band count {}", band, tables.band_count()));
  check_planck_range(tables, t_k, "temperature", std::nullopt);
  std::vector<double> all(tables.band_count());
  hermite_band_radiances(tables, t_k, all.data());
  return all[band];
}

void compute_band_optics(const atmosphere::Column& column, const BandOpticsTables& tables, BandOptics& out,
                         BandOpticsWorkspace& ws) {
  atmosphere::validate(column);
  const std::size_t n = column.layer_count();
  const std::size_t n_g = tables.gpoint_count(), n_a = tables.absorbers.size();
  const std::size_t n_p = tables.ref_pressure_pa.size(), n_t = tables.ref_temperature_k.size();
  check_tables(tables);

  // Absorber amounts per layer, once per column.
  ws.amount.resize(n_a * n);
  for (std::size_t ai = 0; ai < n_a; ++ai) {
    const Absorber a = tables.absorbers[ai];
    ws.gas_mass = atmosphere::layer_gas_mass_kg_m2(column, spectral::absorber_gas(a));
    const bool vapour = spectral::scales_with_vapour_pressure(a);
    for (std::size_t i = 0; i < n; ++i) {
      const double e_h2o = column.gas(Gas::h2o)[i] * column.pressure_layer_pa[i];
      ws.amount[ai * n + i] = vapour ? ws.gas_mass[i] * e_h2o : ws.gas_mass[i];
    }
  }

  // Interpolation weights per layer, once per column, shared by all absorbers and g-points.
  ws.pressure_index.resize(n);
  ws.pressure_weight.resize(4 * n);
  ws.temperature_index.resize(n);
  ws.temperature_weight.resize(n);
  const auto& nodes_p = tables.ref_pressure_pa;
  const auto& nodes_t = tables.ref_temperature_k;
  for (std::size_t i = 0; i < n; ++i) {
    const double p = column.pressure_layer_pa[i];
    const double temperature = column.temperature_layer_k[i];
    if (p > nodes_p.back())
      fail_at("pressure_layer", static_cast<long>(i),
              fmt::format("pressure {} Pa is above the highest reference pressure of {}; its tables cover [{}, {}] Pa "
                          "(lower pressures are extrapolated)",
                          p, set_label(tables), nodes_p.front(), nodes_p.back()));
    if (!(temperature >= nodes_t.front() && temperature <= nodes_t.back()))
      fail_at("temperature_layer", static_cast<long>(i),
              fmt::format("temperature {} K is outside the reference temperatures of {}, [{}, {}] K", temperature,
                          set_label(tables), nodes_t.front(), nodes_t.back()));
    double* w = ws.pressure_weight.data() + 4 * i;
    if (p < nodes_p.front()) {
      // Extrapolation below the table (see the header): gases scale with p, the continuum holds.
      ws.pressure_index[i] = 0;
      w[0] = p / nodes_p.front();
      w[1] = 0.0;
      w[2] = 1.0;
      w[3] = 0.0;
    } else {
      const std::size_t j = interval_of(nodes_p, p);
      double f = 0.0;
      if (n_p > 1) {
        f = tables.pressure_interpolation == PressureInterpolation::linear_in_p
                ? (p - nodes_p[j]) / (nodes_p[j + 1] - nodes_p[j])
                : std::log(p / nodes_p[j]) / std::log(nodes_p[j + 1] / nodes_p[j]);
      }
      ws.pressure_index[i] = j;
      w[0] = w[2] = 1.0 - f;
      w[1] = w[3] = f;
    }
    const Bracket bt = bracket_linear(nodes_t, temperature);
    ws.temperature_index[i] = bt.lower;
    ws.temperature_weight[i] = bt.upper_weight;
  }

  out.layer_count = n;
  out.gpoint_count = n_g;
  out.optical_depth.resize(n * n_g);
  out.source_level.resize((n + 1) * n_g);
  out.source_layer.resize(n * n_g);
  out.source_surface.resize(n_g);

  const std::size_t dp = n_p > 1 ? n_g : 0;       // row step to the upper pressure node
  const std::size_t dt = n_t > 1 ? n_p * n_g : 0; // row step to the upper temperature node
  std::array<Corners, spectral::absorber_count> active{};
  for (std::size_t i = 0; i < n; ++i) {
    double* row = out.optical_depth.data() + i * n_g;
    const double wt1 = ws.temperature_weight[i], wt0 = 1.0 - wt1;
    std::size_t count = 0;
    for (std::size_t ai = 0; ai < n_a; ++ai) {
      const double m = ws.amount[ai * n + i];
      if (m == 0.0) continue;
      const double* w = ws.pressure_weight.data() + 4 * i +
                        (spectral::scales_with_vapour_pressure(tables.absorbers[ai]) ? 2 : 0);
      const double* r00 = tables.kappa.data() + ((ai * n_t + ws.temperature_index[i]) * n_p + ws.pressure_index[i]) * n_g;
      active[count++] = Corners{{r00, r00 + dp, r00 + dt, r00 + dt + dp},
                                {m * wt0 * w[0], m * wt0 * w[1], m * wt1 * w[0], m * wt1 * w[1]}};
    }
    if (count == 0) std::fill(row, row + n_g, 0.0);
    for (std::size_t a = 0; a < count; a += 2) {
      if (a + 1 < count)
        bilinear_pair(n_g, active[a], active[a + 1], a > 0, row);
      else
        bilinear_single(n_g, active[a], a > 0, row);
    }
  }

  ws.band_source.resize(tables.band_count());
  for (std::size_t k = 0; k <= n; ++k) {
    check_planck_range(tables, column.temperature_level_k[k], "temperature_level", static_cast<long>(k));
    gpoint_sources(tables, column.temperature_level_k[k], ws.band_source.data(), out.source_level.data() + k * n_g);
  }
  for (std::size_t i = 0; i < n; ++i) {
    check_planck_range(tables, column.temperature_layer_k[i], "temperature_layer", static_cast<long>(i));
    gpoint_sources(tables, column.temperature_layer_k[i], ws.band_source.data(), out.source_layer.data() + i * n_g);
  }
  check_planck_range(tables, column.surface_temperature_k, "surface_temperature", std::nullopt);
  gpoint_sources(tables, column.surface_temperature_k, ws.band_source.data(), out.source_surface.data());
}

BandOptics compute_band_optics(const atmosphere::Column& column, const spectral::BandSet& set) {
  const BandOpticsTables tables = make_band_optics_tables(set);
  BandOptics out;
  BandOpticsWorkspace ws;
  compute_band_optics(column, tables, out, ws);
  return out;
}

} // namespace bandstack::solvers
