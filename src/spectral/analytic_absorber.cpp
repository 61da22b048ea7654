// Evaluation of an analytic recipe on a uniform wavenumber grid.
//
// Every feature is cut into "segments" on which kappa = amplitude * state_factor * exp(slope * (nu - nu_ref))
// (slope 0: flat). On a uniform grid exp(slope * nu_i) is geometric, so each segment is added in
// blocks of 64 points: one exp() per block times a table of 64 powers, a multiply-add loop the
// compiler vectorises. The powers are exact exp() values, so the error stays within a few ulp and
// does not grow along the grid as a plain running product would.
#include "bandstack/spectral/analytic_absorber.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::spectral {

namespace {

constexpr double inf = std::numeric_limits<double>::infinity();
// Segments end where exp() of their slope falls below e^-650 (about 1e-282): beyond, kappa is
// zero. This keeps the loops free of subnormal numbers, which are slow on most processors.
constexpr double cutoff_exponent = 650.0;
constexpr std::size_t block = 64;

// First grid index i with nu_i >= x (inclusive) or nu_i > x (exclusive); in [0, count].
std::size_t first_index(const WavenumberGrid& grid, double x, bool inclusive) {
  if (x == -inf) return 0;
  if (x == inf) return grid.count;
  const double guess = std::ceil((x - grid.start_cm1) / grid.step_cm1 - 0.5);
  std::size_t i = guess <= 0.0 ? 0 : std::min<std::size_t>(grid.count, static_cast<std::size_t>(std::min(guess, 1e18)));
  const auto before = [&](std::size_t k) { return inclusive ? grid.at(k) < x : grid.at(k) <= x; };
  while (i > 0 && !before(i - 1)) --i; // rounding in `guess`: step back or forward by one or two
  while (i < grid.count && before(i)) ++i;
  return i;
}

} // namespace


double self_continuum_cm2_molecule_atm(const SelfContinuum& c, double nu_cm1, double t_k) noexcept {
  // Roberts, Selby & Biberman (1976, Appl. Opt. 15), C_s = a + b exp(-beta nu) at 296 K, with the
  // temperature factor exp(T0 (1/T - 1/296)).
  return (c.constant_cm2_molecule_atm + c.amplitude_cm2_molecule_atm * std::exp(-c.decay_cm * nu_cm1)) *
         std::exp(c.temperature_coefficient_k * (1.0 / t_k - 1.0 / c.reference_temperature_k));
}

double self_continuum_si_factor() noexcept {
  // cm2 -> m2 (1e-4), per molecule -> per kg of water (N_A / M_h2o), per atm -> per Pa (1/101325).
  return 1e-4 * constants::avogadro_per_mol / constants::molar_mass_h2o_kg_mol / 101325.0;
}

double cross_section_si_factor(Gas gas) noexcept {
  return 1e-4 * constants::avogadro_per_mol / gas_molar_mass_kg_mol(gas);
}

namespace {

using Segment = detail::SpectralSegment;

std::vector<Segment> band_segments(const ExponentialBand& b) {
  std::vector<Segment> out;
  Segment base;
  base.amplitude = b.kappa_m2_kg;
  base.nu_ref_cm1 = b.center_cm1;
  base.p_ref_pa = b.reference_pressure_pa;
  base.p_exponent = b.pressure_exponent;
  base.p_min_pa = b.minimum_pressure_pa;
  base.t_ref_k = b.reference_temperature_k;
  base.t_exponent = b.temperature_exponent;
  if (b.kappa_m2_kg <= 0.0) return out;
  if (b.decay_lower_cm1 > 0.0) {
    Segment s = base;
    s.slope_cm = std::isinf(b.decay_lower_cm1) ? 0.0 : 1.0 / b.decay_lower_cm1;
    const double reach = s.slope_cm > 0.0 ? b.center_cm1 - cutoff_exponent / s.slope_cm : -inf;
    s.lower_cm1 = std::max(b.lower_cm1, reach);
    s.upper_cm1 = std::min(b.center_cm1, b.upper_cm1);
    // With nothing above the centre, the centre itself belongs to the lower side.
    s.upper_inclusive = b.decay_upper_cm1 == 0.0 || b.upper_cm1 < b.center_cm1;
    out.push_back(s);
  }
  if (b.decay_upper_cm1 > 0.0) {
    Segment s = base;
    s.slope_cm = std::isinf(b.decay_upper_cm1) ? 0.0 : -1.0 / b.decay_upper_cm1;
    const double reach = s.slope_cm < 0.0 ? b.center_cm1 + cutoff_exponent / -s.slope_cm : inf;
    s.lower_cm1 = std::max(b.lower_cm1, b.center_cm1);
    s.upper_cm1 = std::min(b.upper_cm1, reach);
    s.upper_inclusive = true;
    out.push_back(s);
  }
  return out;
}

// Two half-Gaussians, each cut where its exponent reaches -cutoff_exponent (beyond, kappa is below
// 1e-282 of the peak). No pressure or temperature factor: p_exponent 0 gives F = 1.
std::vector<Segment> gaussian_segments(const GaussianBand& b) {
  std::vector<Segment> out;
  if (b.kappa_m2_kg <= 0.0) return out;
  Segment s;
  s.amplitude = b.kappa_m2_kg;
  s.nu_ref_cm1 = b.center_cm1;
  s.p_exponent = 0.0;
  const double reach_lower = std::sqrt(2.0 * cutoff_exponent) * b.width_lower_cm1;
  const double reach_upper = std::sqrt(2.0 * cutoff_exponent) * b.width_upper_cm1;
  Segment lower = s;
  lower.curvature_cm2 = -0.5 / (b.width_lower_cm1 * b.width_lower_cm1);
  lower.lower_cm1 = std::max(b.lower_cm1, b.center_cm1 - reach_lower);
  lower.upper_cm1 = std::min(b.center_cm1, b.upper_cm1);
  lower.upper_inclusive = b.upper_cm1 < b.center_cm1;
  out.push_back(lower);
  Segment upper = s;
  upper.curvature_cm2 = -0.5 / (b.width_upper_cm1 * b.width_upper_cm1);
  upper.lower_cm1 = std::max(b.lower_cm1, b.center_cm1);
  upper.upper_cm1 = std::min(b.upper_cm1, b.center_cm1 + reach_upper);
  upper.upper_inclusive = true;
  out.push_back(upper);
  return out;
}

std::vector<Segment> continuum_segments(const SelfContinuum& c) {
  std::vector<Segment> out;
  const double si = self_continuum_si_factor();
  Segment s;
  s.lower_cm1 = c.lower_cm1;
  s.upper_cm1 = c.upper_cm1;
  s.upper_inclusive = true;
  s.continuum = true;
  s.t_ref_k = c.reference_temperature_k;
  s.t0_k = c.temperature_coefficient_k;
  if (c.constant_cm2_molecule_atm > 0.0) {
    s.amplitude = c.constant_cm2_molecule_atm * si;
    out.push_back(s);
  }
  if (c.amplitude_cm2_molecule_atm > 0.0) {
    s.amplitude = c.amplitude_cm2_molecule_atm * si;
    s.slope_cm = -c.decay_cm;
    if (c.decay_cm > 0.0) s.upper_cm1 = std::min(s.upper_cm1, cutoff_exponent / c.decay_cm);
    out.push_back(s);
  }
  return out;
}

double state_factor(const Segment& s, const AbsorberState& state) {
  if (s.continuum) return std::exp(s.t0_k * (1.0 / state.temperature_k - 1.0 / s.t_ref_k));
  if (s.p_exponent == 0.0 && s.t_exponent == 0.0) return 1.0;
  // Below p_min the Doppler width exceeds the Lorentz width, so lines stop narrowing with pressure
  // (Goody & Yung 1989, Atmospheric Radiation, ch. 3; from memory).
  const double p = std::max(state.pressure_pa, s.p_min_pa);
  double f = s.p_exponent == 1.0 ? p / s.p_ref_pa : std::pow(p / s.p_ref_pa, s.p_exponent);
  if (s.t_exponent != 0.0) f *= std::pow(state.temperature_k / s.t_ref_k, s.t_exponent);
  return f;
}

// out[i] += coefficient * exp(curvature * (nu_i - nu_ref)^2) for i in [begin, end): one exp() per
// point; Gaussian features are few and broad, so this costs little next to the exponential bands.
void add_gaussian(double coefficient, double curvature, double nu_ref, const WavenumberGrid& grid, std::size_t begin,
                  std::size_t end, double* out) {
  for (std::size_t i = begin; i < end; ++i) {
    const double d = grid.at(i) - nu_ref;
    out[i] += coefficient * std::exp(curvature * d * d);
  }
}

// out[i] += coefficient * exp(slope * (nu_i - nu_ref)) for i in [begin, end).
void add_segment(double coefficient, double slope, double nu_ref, const WavenumberGrid& grid, std::size_t begin,
                 std::size_t end, double* out) {
  if (slope == 0.0) {
    for (std::size_t i = begin; i < end; ++i) out[i] += coefficient;
    return;
  }
  std::array<double, block> powers{};
  const std::size_t n_powers = std::min(block, end - begin);
  for (std::size_t k = 0; k < n_powers; ++k) powers[k] = std::exp(slope * grid.step_cm1 * static_cast<double>(k));
  for (std::size_t i0 = begin; i0 < end; i0 += block) {
    const std::size_t n = std::min(block, end - i0);
    const double c = coefficient * std::exp(slope * (grid.at(i0) - nu_ref));
    double* o = out + i0;
    for (std::size_t k = 0; k < n; ++k) o[k] += c * powers[k];
  }
}

// A recipe built in code has not been through the parser: check what would make the numbers wrong.
void check_recipe(const AnalyticRecipe& recipe) {
  const auto fail = [&](const std::string& feature, const std::string& message) {
    InputPlace place;
    place.file = recipe.file;
    place.item = feature;
    throw InputError(place, message);
  };
  for (const ExponentialBand& b : recipe.bands) {
    if (b.absorber == Absorber::h2o_self_continuum) fail(b.name, "the self-continuum cannot be an exponential band");
    if (!(b.kappa_m2_kg >= 0.0) || !std::isfinite(b.kappa_m2_kg)) fail(b.name, "kappa must be finite and >= 0");
    if (!(b.center_cm1 >= 0.0) || !std::isfinite(b.center_cm1)) fail(b.name, "centre must be finite and >= 0 cm-1");
    if (!(b.decay_lower_cm1 >= 0.0) || !(b.decay_upper_cm1 >= 0.0)) fail(b.name, "decay widths must be >= 0 (or inf)");
    if (!(b.reference_pressure_pa > 0.0) || !std::isfinite(b.reference_pressure_pa))
      fail(b.name, "reference pressure must be positive and finite");
    if (!(b.minimum_pressure_pa >= 0.0) || !std::isfinite(b.minimum_pressure_pa))
      fail(b.name, "minimum pressure must be finite and >= 0 (0: no floor)");
    if (!(b.reference_temperature_k > 0.0) || !std::isfinite(b.pressure_exponent) || !std::isfinite(b.temperature_exponent))
      fail(b.name, "reference temperature must be positive, exponents finite");
    if (!(b.upper_cm1 > b.lower_cm1) || !(b.lower_cm1 >= 0.0)) fail(b.name, "limits must satisfy 0 <= lower < upper");
  }
  for (const GaussianBand& b : recipe.gaussians) {
    if (b.absorber == Absorber::h2o_self_continuum) fail(b.name, "the self-continuum cannot be a Gaussian band");
    if (!(b.kappa_m2_kg >= 0.0) || !std::isfinite(b.kappa_m2_kg)) fail(b.name, "kappa must be finite and >= 0");
    if (!(b.center_cm1 >= 0.0) || !std::isfinite(b.center_cm1)) fail(b.name, "centre must be finite and >= 0 cm-1");
    if (!(b.width_lower_cm1 > 0.0) || !(b.width_upper_cm1 > 0.0) || !std::isfinite(b.width_lower_cm1) ||
        !std::isfinite(b.width_upper_cm1))
      fail(b.name, "widths must be positive and finite");
    if (!(b.upper_cm1 > b.lower_cm1) || !(b.lower_cm1 >= 0.0)) fail(b.name, "limits must satisfy 0 <= lower < upper");
  }
  for (const SelfContinuum& c : recipe.continua) {
    if (!(c.constant_cm2_molecule_atm >= 0.0) || !(c.amplitude_cm2_molecule_atm >= 0.0) || !(c.decay_cm >= 0.0) ||
        !std::isfinite(c.constant_cm2_molecule_atm + c.amplitude_cm2_molecule_atm + c.decay_cm))
      fail(c.name, "continuum coefficients must be finite and >= 0");
    if (!(c.reference_temperature_k > 0.0) || !std::isfinite(c.temperature_coefficient_k))
      fail(c.name, "reference temperature must be positive, the temperature coefficient finite");
    if (!(c.upper_cm1 > c.lower_cm1) || !(c.lower_cm1 >= 0.0)) fail(c.name, "limits must satisfy 0 <= lower < upper");
  }
}

} // namespace

AnalyticAbsorber::AnalyticAbsorber(AnalyticRecipe recipe) : recipe_(std::move(recipe)) {
  check_recipe(recipe_);
  for (const ExponentialBand& b : recipe_.bands)
    for (const Segment& s : band_segments(b)) segments_[index(b.absorber)].push_back(s);
  for (const GaussianBand& b : recipe_.gaussians)
    for (const Segment& s : gaussian_segments(b)) segments_[index(b.absorber)].push_back(s);
  for (const SelfContinuum& c : recipe_.continua)
    for (const Segment& s : continuum_segments(c)) segments_[index(Absorber::h2o_self_continuum)].push_back(s);
}

std::string AnalyticAbsorber::description() const {
  return fmt::format("analytic recipe {} v{} ({})", recipe_.name, recipe_.version, recipe_.file);
}

bool AnalyticAbsorber::provides(Absorber a) const { return !segments_[index(a)].empty(); }

void AnalyticAbsorber::absorption(Absorber a, const AbsorberState& state, const WavenumberGrid& grid,
                                  std::span<double> out) const {
  if (out.size() != grid.count)
    throw InputError(fmt::format("analytic absorber: output has {} values for a grid of {} points", out.size(), grid.count));
  if (!(state.pressure_pa > 0.0) || !std::isfinite(state.pressure_pa) || !(state.temperature_k > 0.0) ||
      !std::isfinite(state.temperature_k))
    throw InputError(fmt::format("analytic absorber ({}): pressure and temperature must be positive and finite, got "
                                 "p = {} Pa, T = {} K",
                                 description(), state.pressure_pa, state.temperature_k));
  if (!(grid.step_cm1 > 0.0) || !std::isfinite(grid.step_cm1) || !std::isfinite(grid.start_cm1))
    throw InputError(fmt::format("analytic absorber: invalid wavenumber grid (start {} cm-1, step {} cm-1)", grid.start_cm1,
                                 grid.step_cm1));
  std::fill(out.begin(), out.end(), 0.0);
  for (const Segment& s : segments_[index(a)]) {
    const std::size_t begin = first_index(grid, s.lower_cm1, true);
    const std::size_t end = first_index(grid, s.upper_cm1, !s.upper_inclusive);
    if (begin >= end) continue; // the feature does not reach this grid
    if (s.curvature_cm2 != 0.0)
      add_gaussian(s.amplitude * state_factor(s, state), s.curvature_cm2, s.nu_ref_cm1, grid, begin, end, out.data());
    else
      add_segment(s.amplitude * state_factor(s, state), s.slope_cm, s.nu_ref_cm1, grid, begin, end, out.data());
  }
}

} // namespace bandstack::spectral
