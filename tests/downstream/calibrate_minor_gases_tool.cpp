// One-off calibration of the CH4 and N2O band strengths of an analytic absorber recipe against the
// simplified forcing expressions of Myhre et al. (1998, GRL 25, Table 3). Built with the tests, not
// run as one; its result is written by hand into bands/earth_idealised_absorbers.toml.
// Usage: calibrate_minor_gases_tool RECIPE.toml
//
// Procedure (the one recorded beside the calibrated numbers):
//  - columns: the built-in tropical, midlatitude_summer and high_latitude_winter profiles (default
//    60-layer grid, CO2 and water as the profiles' defaults), forcings averaged over the three;
//  - forcing: change of the net downward flux (down - up) at the level nearest the profile's
//    tropopause (atmosphere::temperature_structure), clear sky, instantaneous, from the
//    line-resolved reference (0.1 cm-1 over 10-3000 cm-1, 4 Gauss angles);
//  - perturbations: CH4 700 -> 1800 ppbv with N2O at 270 ppbv; N2O 270 -> 320 ppbv with CH4 at
//    700 ppbv (the backgrounds of the Myhre expressions);
//  - target: the Myhre value times a clear-to-all-sky factor of 1.25 (an assumption; see below);
//  - each gas's band strengths (all its exponential bands, by one common factor, so N2O keeps the
//    ratio of its 7.8 and 17 um bands) are found by bisection in ln(kappa), alternating between the
//    two gases (they overlap near 1300 cm-1) until both factors settle; then rounded to two digits.
#include "bandstack/atmosphere/atmosphere.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/reference_longwave.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"

#include <array>
#include <cmath>
#include <cstdio>
#include <fmt/format.h>
#include <string>
#include <vector>

namespace {

namespace at = bandstack::atmosphere;
namespace sp = bandstack::spectral;
namespace so = bandstack::solvers;
using bandstack::Gas;

// Myhre et al. 1998, GRL 25, Table 3 (from memory): overlap term with M (CH4) and N (N2O) in ppbv.
double overlap(double m_ppbv, double n_ppbv) {
  const double mn = m_ppbv * n_ppbv;
  return 0.47 * std::log(1.0 + 2.01e-5 * std::pow(mn, 0.75) + 5.31e-15 * m_ppbv * std::pow(mn, 1.52));
}
constexpr double m0_ppbv = 700.0, n0_ppbv = 270.0, m1_ppbv = 1800.0, n1_ppbv = 320.0;
// Clear-sky over all-sky forcing ratio: ~1.2-1.3 is commonly quoted for CO2 (from memory); we assume
// 1.25 for CH4 and N2O too (assumption).
constexpr double clear_to_all_sky = 1.25;

double myhre_ch4() {
  return 0.036 * (std::sqrt(m1_ppbv) - std::sqrt(m0_ppbv)) - (overlap(m1_ppbv, n0_ppbv) - overlap(m0_ppbv, n0_ppbv));
}
double myhre_n2o() {
  return 0.12 * (std::sqrt(n1_ppbv) - std::sqrt(n0_ppbv)) - (overlap(m0_ppbv, n1_ppbv) - overlap(m0_ppbv, n0_ppbv));
}

struct Case {
  at::Profile profile;
  std::size_t tropopause_level = 0;
};

at::Column make(at::Profile p, double ch4_ppbv, double n2o_ppbv) {
  at::ProfileSettings s;
  s.profile = p;
  s.ch4_mole_fraction = ch4_ppbv * 1e-9;
  s.n2o_mole_fraction = n2o_ppbv * 1e-9;
  return at::make_column(s, at::GridSpec{});
}

std::size_t tropopause_level(at::Profile p) {
  at::ProfileSettings s;
  s.profile = p;
  const at::GridSpec grid;
  const double p_trop = at::temperature_structure(s, grid.surface_pressure_pa).tropopause_pressure_pa;
  const std::vector<double> levels = at::level_pressures_pa(grid);
  std::size_t best = 0;
  for (std::size_t k = 1; k < levels.size(); ++k)
    if (std::abs(std::log(levels[k] / p_trop)) < std::abs(std::log(levels[best] / p_trop))) best = k;
  return best;
}

struct Forcing {
  double tropopause = 0.0, toa = 0.0; // W m-2, means over the cases
};

Forcing forcing(const sp::AnalyticRecipe& recipe, const std::vector<Case>& cases, Gas gas) {
  const sp::AnalyticAbsorber source(recipe);
  const sp::WavenumberGrid grid = sp::make_wavenumber_grid(10.0, 3000.0, 0.1);
  const std::array<double, 2> edges{10.0, 3000.0};
  const so::AngularQuadrature angles = so::gauss_quadrature(4);
  Forcing f;
  const double n = static_cast<double>(cases.size());
  for (const Case& c : cases) {
    const bool ch4 = gas == Gas::ch4;
    const at::Column before = make(c.profile, m0_ppbv, n0_ppbv);
    const at::Column after = make(c.profile, ch4 ? m1_ppbv : m0_ppbv, ch4 ? n0_ppbv : n1_ppbv);
    const so::LongwaveResult r0 = so::solve_reference_longwave(before, source, grid, edges, angles);
    const so::LongwaveResult r1 = so::solve_reference_longwave(after, source, grid, edges, angles);
    const std::size_t k = c.tropopause_level;
    f.tropopause += ((r1.flux_down[k] - r1.flux_up[k]) - (r0.flux_down[k] - r0.flux_up[k])) / n;
    f.toa += (r0.olr() - r1.olr()) / n;
  }
  return f;
}

sp::AnalyticRecipe scaled(sp::AnalyticRecipe recipe, sp::Absorber a, double factor) {
  for (sp::ExponentialBand& b : recipe.bands)
    if (b.absorber == a) b.kappa_m2_kg *= factor;
  return recipe;
}

void report(const char* label, const sp::AnalyticRecipe& recipe, sp::Absorber a, const Forcing& f, double target) {
  std::string kappas;
  for (const sp::ExponentialBand& b : recipe.bands)
    if (b.absorber == a) kappas += fmt::format(" {}={:.4g}", b.name, b.kappa_m2_kg);
  fmt::print("  {:<10}{}: tropopause {:.4f} W m-2 (target {:.4f}, {:+.1f} %), TOA {:.4f} W m-2\n", label, kappas,
             f.tropopause, target, 100.0 * (f.tropopause / target - 1.0), f.toa);
}

// Rounds to two significant digits (the precision the recipe keeps).
double round2(double x) {
  const double scale = std::pow(10.0, std::floor(std::log10(x)) - 1.0);
  return std::round(x / scale) * scale;
}

sp::Absorber absorber_of(Gas gas) { return gas == Gas::ch4 ? sp::Absorber::ch4 : sp::Absorber::n2o; }
const char* label_of(Gas gas) { return gas == Gas::ch4 ? "CH4" : "N2O"; }

// The factor on the gas's kappas that puts its mean tropopause forcing on `target`, the other gas
// as in `recipe`.
double fit_factor(const sp::AnalyticRecipe& recipe, const std::vector<Case>& cases, Gas gas, double target) {
  double lo = std::log(1e-2), hi = std::log(1e2);
  while (hi - lo > 1e-4) {
    const double mid = 0.5 * (lo + hi);
    const double f = forcing(scaled(recipe, absorber_of(gas), std::exp(mid)), cases, gas).tropopause;
    (f < target ? lo : hi) = mid;
  }
  return std::exp(0.5 * (lo + hi));
}

void report_all(const char* stage, const sp::AnalyticRecipe& recipe, const std::vector<Case>& cases,
                const std::array<double, 2>& targets, bool per_column) {
  fmt::print("{}:\n", stage);
  for (Gas gas : {Gas::ch4, Gas::n2o}) {
    const double target = targets[gas == Gas::ch4 ? 0 : 1];
    report(label_of(gas), recipe, absorber_of(gas), forcing(recipe, cases, gas), target);
    if (!per_column) continue;
    for (const Case& c : cases) {
      const Forcing one = forcing(recipe, std::vector<Case>{c}, gas);
      fmt::print("    {:<22} tropopause level {:2d}: {:.4f} W m-2 (TOA {:.4f})\n", at::profile_name(c.profile),
                 c.tropopause_level, one.tropopause, one.toa);
    }
  }
}

// CH4 and N2O overlap near 1300 cm-1, so each fit depends on the other gas's strength: the two fits
// are alternated until neither factor moves by more than 0.1 %.
void calibrate(const sp::AnalyticRecipe& recipe, const std::vector<Case>& cases) {
  const std::array<double, 2> targets{clear_to_all_sky * myhre_ch4(), clear_to_all_sky * myhre_n2o()};
  fmt::print("targets (Myhre all-sky x {}): CH4 {:.4f} x = {:.4f}, N2O {:.4f} x = {:.4f} W m-2\n", clear_to_all_sky,
             myhre_ch4(), targets[0], myhre_n2o(), targets[1]);
  report_all("recipe as given", recipe, cases, targets, false);
  sp::AnalyticRecipe fitted = recipe;
  for (int sweep = 1; sweep <= 10; ++sweep) {
    const double f_ch4 = fit_factor(fitted, cases, Gas::ch4, targets[0]);
    fitted = scaled(fitted, sp::Absorber::ch4, f_ch4);
    const double f_n2o = fit_factor(fitted, cases, Gas::n2o, targets[1]);
    fitted = scaled(fitted, sp::Absorber::n2o, f_n2o);
    fmt::print("sweep {}: CH4 x {:.5f}, N2O x {:.5f}\n", sweep, f_ch4, f_n2o);
    if (std::abs(std::log(f_ch4)) < 1e-3 && std::abs(std::log(f_n2o)) < 1e-3) break;
  }
  report_all("fitted", fitted, cases, targets, false);
  sp::AnalyticRecipe rounded = fitted;
  for (sp::ExponentialBand& b : rounded.bands)
    if (b.absorber == sp::Absorber::ch4 || b.absorber == sp::Absorber::n2o) b.kappa_m2_kg = round2(b.kappa_m2_kg);
  report_all("rounded to two digits", rounded, cases, targets, true);
}

} // namespace

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: calibrate_minor_gases_tool RECIPE.toml\n");
    return 2;
  }
  try {
    const sp::AnalyticRecipe recipe = sp::load_absorber_recipe(argv[1]);
    std::vector<Case> cases;
    for (at::Profile p : {at::Profile::tropical, at::Profile::midlatitude_summer, at::Profile::high_latitude_winter})
      cases.push_back(Case{p, tropopause_level(p)});
    calibrate(recipe, cases);
  } catch (const bandstack::Error& e) {
    std::fprintf(stderr, "calibrate_minor_gases_tool: %s\n", e.what());
    return 2;
  }
  return 0;
}
