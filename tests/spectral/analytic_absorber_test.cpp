// The analytic absorber recipe: the shipped file, the formulas, the fast evaluation and the parser.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"

#include <cfloat>
#include <cmath>
#include <fstream>
#include <gtest/gtest.h>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

namespace bs = bandstack::spectral;

namespace {

const std::string recipe_path = std::string(BANDSTACK_SOURCE_DIR) + "/bands/earth_idealised_absorbers.toml";

const bs::AnalyticRecipe& shipped() {
  static const bs::AnalyticRecipe recipe = bs::load_absorber_recipe(recipe_path);
  return recipe;
}

const bs::ExponentialBand& band_named(const bs::AnalyticRecipe& r, const std::string& name) {
  for (const auto& b : r.bands)
    if (b.name == name) return b;
  throw std::runtime_error("no band " + name);
}

// kappa at a single wavenumber: a one-point grid whose midpoint is nu.
double kappa_at(const bs::AbsorberSource& s, bs::Absorber a, double nu, double p_pa, double t_k) {
  const bs::WavenumberGrid g{nu - 0.5, 1.0, 1};
  double out = -1.0;
  s.absorption(a, bs::AbsorberState{p_pa, t_k}, g, std::span<double>(&out, 1));
  return out;
}

std::string recipe_text(const std::string& features) {
  return "[recipe]\nname = \"test\"\nversion = 3\n\n" + features;
}

std::string message_of(const std::string& text) {
  try {
    (void)bs::parse_absorber_recipe(text, "r.toml");
  } catch (const bandstack::InputError& e) {
    return e.what();
  }
  return "(no error)";
}

const std::string co2_band = R"([[feature]]
kind = "exponential_band"
name = "co2"
absorber = "co2"
center_cm1 = 667.5
kappa_m2_per_kg = 110.0
decay_lower_cm1 = 10.2
decay_upper_cm1 = 10.2
reference_pressure_pa = 10000.0
pressure_exponent = 1.0
)";

} // namespace

// --- the shipped recipe ---------------------------------------------------------------------------

TEST(ShippedRecipe, ParsesWithNameVersionAndDescription) {
  const auto& r = shipped();
  EXPECT_EQ(r.name, "earth_idealised_absorbers");
  EXPECT_EQ(r.version, 3);
  EXPECT_EQ(r.bands.size(), 7u);
  EXPECT_EQ(r.continua.size(), 1u);
  const bs::AnalyticAbsorber absorber(r);
  EXPECT_EQ(absorber.description(), "analytic recipe earth_idealised_absorbers v3 (" + recipe_path + ")");
  for (bs::Absorber a : bs::all_absorbers) EXPECT_TRUE(absorber.provides(a)) << bs::absorber_name(a);
}

TEST(ShippedRecipe, WaterAndCarbonDioxideParametersAreThePublishedOnes) {
  const auto& r = shipped();
  // Jeevanjee & Fueglistaler 2020, J. Atmos. Sci. 77 (from memory; physics.md section 3):
  // kappa_rot = 165 m2/kg, l_rot = 55 cm-1 from 150 cm-1; kappa_vr = 15 m2/kg, l_vr = 38 cm-1 at
  // 1500 cm-1; p_ref = 500 hPa.
  const auto& rot = band_named(r, "h2o_rotational");
  EXPECT_EQ(rot.kappa_m2_kg, 165.0);
  EXPECT_EQ(rot.decay_upper_cm1, 55.0);
  EXPECT_EQ(rot.center_cm1, 150.0);
  EXPECT_EQ(rot.reference_pressure_pa, 50000.0);
  const auto& vr = band_named(r, "h2o_vibration_rotation");
  EXPECT_EQ(vr.kappa_m2_kg, 15.0);
  EXPECT_EQ(vr.decay_lower_cm1, 38.0);
  EXPECT_EQ(vr.decay_upper_cm1, 38.0);
  EXPECT_EQ(vr.center_cm1, 1500.0);
  EXPECT_EQ(vr.reference_pressure_pa, 50000.0);
  // Jeevanjee et al. 2021, J. Climate 34 (from memory): kappa_0 = 110 m2/kg, l = 10.2 cm-1 at
  // 667.5 cm-1, p_ref = 100 hPa.
  const auto& co2 = band_named(r, "co2_15um");
  EXPECT_EQ(co2.kappa_m2_kg, 110.0);
  EXPECT_EQ(co2.decay_lower_cm1, 10.2);
  EXPECT_EQ(co2.center_cm1, 667.5);
  EXPECT_EQ(co2.reference_pressure_pa, 10000.0);
  // Roberts, Selby & Biberman 1976, Appl. Opt. 15 (from memory): a, b, beta, T0.
  const auto& c = r.continua.at(0);
  EXPECT_EQ(c.constant_cm2_molecule_atm, 1.25e-22);
  EXPECT_EQ(c.amplitude_cm2_molecule_atm, 1.67e-19);
  EXPECT_EQ(c.decay_cm, 7.87e-3);
  EXPECT_EQ(c.temperature_coefficient_k, 1800.0);
  EXPECT_EQ(c.reference_temperature_k, 296.0);
}

TEST(ShippedRecipe, EveryParameterCarriesItsSourceOrMark) {
  // Project rule (physics.md, header): each number sits beside its source or its mark. Lines of
  // the O3, CH4 and N2O bands must say they are provisional or how they were calibrated.
  std::ifstream in(recipe_path);
  ASSERT_TRUE(in) << recipe_path;
  const std::regex numeric(R"(^\s*[a-z0-9_]+\s*=\s*([-+0-9.]|inf))");
  std::string line, feature_name;
  int line_number = 0, checked = 0;
  bool in_feature = false;
  while (std::getline(in, line)) {
    ++line_number;
    if (line.rfind("[[feature]]", 0) == 0) in_feature = true;
    if (line.rfind("name = ", 0) == 0) feature_name = line;
    if (!in_feature || !std::regex_search(line, numeric)) continue;
    ++checked;
    EXPECT_NE(line.find('#'), std::string::npos) << "line " << line_number << " has no source comment: " << line;
    const bool minor = feature_name.find("o3") != std::string::npos || feature_name.find("ch4") != std::string::npos ||
                       feature_name.find("n2o") != std::string::npos;
    if (minor && line.find("center_cm1") == std::string::npos) {
      const bool marked = line.find("(provisional, uncalibrated)") != std::string::npos ||
                          line.find("calibrated to ") != std::string::npos;
      EXPECT_TRUE(marked) << "line " << line_number << ": " << line;
    }
  }
  EXPECT_GT(checked, 40);
}

TEST(ShippedRecipe, Co2BandFollowsTheExponentialForm) {
  const bs::AnalyticAbsorber a(shipped());
  // kappa_0 = 110 m2/kg at the centre at 100 hPa; 110/e one width away; halved at 50 hPa
  // (Jeevanjee et al. 2021, from memory: kappa = kappa_0 (p/p_ref) exp(-|nu - 667.5|/l)).
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5, 1e4, 250.0), 110.0, 1e-12);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5 + 10.2, 1e4, 250.0), 110.0 / std::exp(1.0), 1e-12);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5 - 2 * 10.2, 1e4, 250.0), 110.0 / std::exp(2.0), 1e-12);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5, 5e3, 250.0), 55.0, 1e-12);
}

TEST(AnalyticAbsorber, MinimumPressureFloorsThePressureFactor) {
  // kappa = kappa_0 (max(p, p_min)/p_ref)^n (docs/absorber-recipe.md): with kappa_0 = 110 m2/kg,
  // p_ref = 100 hPa, n = 1 and p_min = 500 Pa, kappa at the centre is 110 * 500/1e4 = 5.5 m2/kg at
  // and below 500 Pa, and follows p above it (analytic).
  std::string floored = co2_band;
  floored += "minimum_pressure_pa = 500.0\n";
  const bs::AnalyticRecipe r = bs::parse_absorber_recipe(recipe_text(floored), "r.toml");
  ASSERT_EQ(r.bands.size(), 1u);
  EXPECT_EQ(r.bands[0].minimum_pressure_pa, 500.0);
  const bs::AnalyticAbsorber a(r);
  const double at_floor = kappa_at(a, bs::Absorber::co2, 667.5, 500.0, 220.0);
  EXPECT_NEAR(at_floor, 5.5, 1e-12);
  EXPECT_EQ(kappa_at(a, bs::Absorber::co2, 667.5, 100.0, 220.0), at_floor);
  EXPECT_EQ(kappa_at(a, bs::Absorber::co2, 667.5, 1.0, 220.0), at_floor);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5, 2000.0, 220.0), 22.0, 1e-12);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::co2, 667.5 + 10.2, 100.0, 220.0), 5.5 / std::exp(1.0), 1e-12);
  // With n = 2 the floor applies before the exponent: 110 (500/1e4)^2 = 0.275 m2/kg (analytic).
  std::string squared = floored;
  squared.replace(squared.find("pressure_exponent = 1.0"), 23, "pressure_exponent = 2.0");
  const bs::AnalyticAbsorber a2(bs::parse_absorber_recipe(recipe_text(squared), "r.toml"));
  EXPECT_NEAR(kappa_at(a2, bs::Absorber::co2, 667.5, 50.0, 220.0), 0.275, 1e-12);
  // Default 0: no floor, kappa = 110 * 10/1e4 = 0.11 m2/kg at 10 Pa (analytic).
  const bs::AnalyticAbsorber plain(bs::parse_absorber_recipe(recipe_text(co2_band), "r.toml"));
  EXPECT_NEAR(kappa_at(plain, bs::Absorber::co2, 667.5, 10.0, 220.0), 0.11, 1e-12);
  // A negative floor is an input error, in the file and in code.
  std::string negative = co2_band + "minimum_pressure_pa = -1.0\n";
  EXPECT_NE(message_of(recipe_text(negative)).find("'feature[0].minimum_pressure_pa'"), std::string::npos);
  bs::AnalyticRecipe coded = r;
  coded.bands[0].minimum_pressure_pa = -1.0;
  EXPECT_THROW(bs::AnalyticAbsorber{coded}, bandstack::InputError);
}

TEST(ShippedRecipe, StratosphericBandsHaveADopplerFloor) {
  // p_min = p0 alpha_D / gamma0 with alpha_D = (nu/c) sqrt(2 k T ln2 / m), gamma0 = 0.07 cm-1 atm-1
  // (common practice), T = 220 K (Goody & Yung 1989, from memory): 774 Pa for CO2 at 667.5 cm-1.
  // Checked to the 2-digit rounding of the recipe.
  constexpr double k_b = 1.380649e-23, c = 2.99792458e8, amu = 1.66053907e-27; // CODATA (from memory)
  const double alpha_d = 667.5 / c * std::sqrt(2.0 * k_b * 220.0 * std::log(2.0) / (44.01 * amu));
  const double p_min = 101325.0 * alpha_d / 0.07;
  EXPECT_NEAR(band_named(shipped(), "co2_15um").minimum_pressure_pa, p_min, 0.01 * p_min);
  const bs::AnalyticAbsorber a(shipped());
  const double floor_kappa = kappa_at(a, bs::Absorber::co2, 667.5, 770.0, 220.0);
  EXPECT_EQ(kappa_at(a, bs::Absorber::co2, 667.5, 10.0, 220.0), floor_kappa);
  EXPECT_GT(kappa_at(a, bs::Absorber::o3, 1042.0, 10.0, 220.0), 0.0);
  EXPECT_EQ(kappa_at(a, bs::Absorber::o3, 1042.0, 10.0, 220.0), kappa_at(a, bs::Absorber::o3, 1042.0, 1200.0, 220.0));
  EXPECT_EQ(band_named(shipped(), "ch4_7.7um").minimum_pressure_pa, 0.0);
}

TEST(ShippedRecipe, WaterRotationalBandAndItsFlatLowerSide) {
  const bs::AnalyticAbsorber a(shipped());
  // 165/e at 150 + 55 cm-1 and 500 hPa (Jeevanjee & Fueglistaler 2020, from memory); the
  // vibration-rotation band adds 15 exp(-1295/38) ~ 2e-14 there, below the tolerance.
  EXPECT_NEAR(kappa_at(a, bs::Absorber::h2o, 205.0, 5e4, 280.0), 165.0 / std::exp(1.0), 1e-10);
  // Flat at kappa_rot below 150 cm-1 (the recipe's stated choice).
  EXPECT_NEAR(kappa_at(a, bs::Absorber::h2o, 100.0, 5e4, 280.0), 165.0, 1e-10);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::h2o, 10.5, 1e5, 280.0), 330.0, 1e-10);
  // Vibration-rotation centre: 15 m2/kg plus the rotational tail 165 exp(-1350/55) ~ 4e-9.
  EXPECT_NEAR(kappa_at(a, bs::Absorber::h2o, 1500.0, 5e4, 280.0), 15.0, 1e-7);
}

TEST(ShippedRecipe, SelfContinuumAt1000InverseCentimetres) {
  const auto& c = shipped().continua.at(0);
  // By hand: exp(-7.87e-3 * 1000) = exp(-7.87) = 3.8184e-4; 1.67e-19 * 3.8184e-4 = 6.377e-23;
  // plus 1.25e-22 gives 1.888e-22 cm2 molecule-1 atm-1, the "about 1.9e-22 at 1000 cm-1" of
  // Roberts, Selby & Biberman (1976, Appl. Opt. 15) (from memory).
  EXPECT_NEAR(bs::self_continuum_cm2_molecule_atm(c, 1000.0, 296.0), 1.888e-22, 0.001e-22);
  // Temperature factor by hand: exp(1800 (1/260 - 1/296)) = exp(0.84199) = 2.3210.
  EXPECT_NEAR(bs::self_continuum_cm2_molecule_atm(c, 1000.0, 260.0) / bs::self_continuum_cm2_molecule_atm(c, 1000.0, 296.0),
              2.3210, 1e-4);
  // SI factor by hand: 1e-4 m2/cm2 * 6.02214076e23 / 0.01801528 kg/mol / 101325 Pa = 3.29908e16
  // (CODATA 2018 N_A; IUPAC molar mass of water; standard atmosphere).
  EXPECT_NEAR(bs::self_continuum_si_factor() / 3.29908e16, 1.0, 1e-5);
  const bs::AnalyticAbsorber a(shipped());
  const double kappa = kappa_at(a, bs::Absorber::h2o_self_continuum, 1000.0, 9e4, 296.0);
  EXPECT_NEAR(kappa, 1.888e-22 * 3.29908e16, 0.001e-22 * 3.29908e16);
  // The recipe stops the continuum at 1500 cm-1 (its stated choice).
  EXPECT_EQ(kappa_at(a, bs::Absorber::h2o_self_continuum, 1600.0, 9e4, 296.0), 0.0);
  // Independent of total pressure: the vapour pressure enters the optical depth instead.
  EXPECT_EQ(kappa_at(a, bs::Absorber::h2o_self_continuum, 1000.0, 1e3, 296.0), kappa);
}

// --- evaluation on fine grids ---------------------------------------------------------------------

TEST(AnalyticAbsorber, FastLoopMatchesTheFormulaOnTheFineGrid) {
  const auto& r = shipped();
  const bs::AnalyticAbsorber a(r);
  const bs::WavenumberGrid g = bs::make_wavenumber_grid(10.0, 3000.0, 0.01);
  std::vector<double> out(g.count);
  const bs::AbsorberState state{31000.0, 241.0};
  for (bs::Absorber ab : {bs::Absorber::h2o, bs::Absorber::co2, bs::Absorber::n2o, bs::Absorber::h2o_self_continuum}) {
    a.absorption(ab, state, g, out);
    double worst = 0.0;
    for (std::size_t i = 0; i < g.count; i += 7) {
      const double nu = g.at(i);
      double expected = 0.0;
      for (const auto& b : r.bands) {
        if (b.absorber != ab || nu < b.lower_cm1 || nu > b.upper_cm1) continue;
        const double l = nu >= b.center_cm1 ? b.decay_upper_cm1 : b.decay_lower_cm1;
        const double shape = std::isinf(l) ? 1.0 : l == 0.0 ? 0.0 : std::exp(-std::abs(nu - b.center_cm1) / l);
        expected += b.kappa_m2_kg * state.pressure_pa / b.reference_pressure_pa * shape;
      }
      if (ab == bs::Absorber::h2o_self_continuum && nu <= r.continua[0].upper_cm1)
        expected = bs::self_continuum_cm2_molecule_atm(r.continua[0], nu, state.temperature_k) * bs::self_continuum_si_factor();
      // Far wings, exp() of large arguments: the rounding of the argument alone (|arg| * 1e-16)
      // would exceed the tolerance, in the formula here as much as in the library.
      if (expected < 1e-12) continue;
      worst = std::max(worst, std::abs(out[i] - expected) / expected);
    }
    EXPECT_LT(worst, 1e-13) << bs::absorber_name(ab);
  }
}

TEST(AnalyticAbsorber, NoSubnormalsFarFromTheBands) {
  // Cut-off at exp(-650) (documented): far wings are exactly zero, never subnormal.
  const bs::AnalyticAbsorber a(bs::parse_absorber_recipe(recipe_text(co2_band), "co2.toml"));
  const bs::WavenumberGrid g = bs::make_wavenumber_grid(0.0, 20000.0, 1.0);
  std::vector<double> out(g.count);
  a.absorption(bs::Absorber::co2, {1.0, 200.0}, g, out);
  for (std::size_t i = 0; i < g.count; ++i) {
    EXPECT_TRUE(out[i] == 0.0 || out[i] >= DBL_MIN) << "nu " << g.at(i) << ": " << out[i];
    if (out[i] != 0.0 && out[i] < DBL_MIN) break;
  }
  EXPECT_EQ(out.back(), 0.0);
  EXPECT_GT(out[667], 0.0);
}

TEST(AnalyticAbsorber, OneSidedBandsLimitsAndExponents) {
  const std::string text = recipe_text(R"([[feature]]
kind = "exponential_band"
name = "upper_only"
absorber = "ch4"
center_cm1 = 1000.0
kappa_m2_per_kg = 2.0
decay_lower_cm1 = 0.0
decay_upper_cm1 = 20.0
upper_cm1 = 1030.0
reference_pressure_pa = 10000.0
pressure_exponent = 0.5
reference_temperature_k = 250.0
temperature_exponent = -2.0

[[feature]]
kind = "exponential_band"
name = "lower_only"
absorber = "o3"
center_cm1 = 1000.0
kappa_m2_per_kg = 3.0
decay_lower_cm1 = 5.0
decay_upper_cm1 = 0.0
lower_cm1 = 990.0
reference_pressure_pa = 10000.0
pressure_exponent = 1.0
)");
  const bs::AnalyticAbsorber a(bs::parse_absorber_recipe(text, "t.toml"));
  EXPECT_TRUE(a.provides(bs::Absorber::ch4));
  EXPECT_FALSE(a.provides(bs::Absorber::h2o));
  // kappa = 2 (p/1e4)^0.5 (T/250)^-2 exp(-(nu - 1000)/20): at p = 4e4, T = 500, nu = 1020 that is
  // 2 * 2 * 0.25 * exp(-1) (arithmetic).
  EXPECT_NEAR(kappa_at(a, bs::Absorber::ch4, 1020.0, 4e4, 500.0), std::exp(-1.0), 1e-14);
  EXPECT_EQ(kappa_at(a, bs::Absorber::ch4, 999.5, 4e4, 500.0), 0.0);  // nothing below the centre
  EXPECT_EQ(kappa_at(a, bs::Absorber::ch4, 1030.5, 4e4, 500.0), 0.0); // above upper_cm1
  EXPECT_GT(kappa_at(a, bs::Absorber::ch4, 1029.5, 4e4, 500.0), 0.0);
  EXPECT_NEAR(kappa_at(a, bs::Absorber::o3, 995.0, 1e4, 300.0), 3.0 / std::exp(1.0), 1e-14);
  EXPECT_EQ(kappa_at(a, bs::Absorber::o3, 1000.5, 1e4, 300.0), 0.0);
  EXPECT_EQ(kappa_at(a, bs::Absorber::o3, 989.5, 1e4, 300.0), 0.0);
  EXPECT_EQ(kappa_at(a, bs::Absorber::h2o, 1000.0, 1e4, 300.0), 0.0);
}

TEST(AnalyticAbsorber, FeatureLimitsFallBetweenTheRightGridPoints) {
  const std::string text = recipe_text(R"([[feature]]
kind = "exponential_band"
name = "flat"
absorber = "co2"
center_cm1 = 100.0
kappa_m2_per_kg = 1.0
decay_lower_cm1 = inf
decay_upper_cm1 = inf
lower_cm1 = 0.75
upper_cm1 = 1.25
reference_pressure_pa = 1.0
pressure_exponent = 0.0
)");
  const bs::AnalyticAbsorber a(bs::parse_absorber_recipe(text, "t.toml"));
  const bs::WavenumberGrid g = bs::make_wavenumber_grid(0.0, 2.5, 0.5); // points 0.25 ... 2.25, exact in binary
  std::vector<double> out(g.count);
  a.absorption(bs::Absorber::co2, {5e4, 250.0}, g, out);
  const std::vector<double> expected{0.0, 1.0, 1.0, 0.0, 0.0}; // 0.75 and 1.25 lie inside (closed limits)
  for (std::size_t i = 0; i < g.count; ++i) EXPECT_EQ(out[i], expected[i]) << "nu " << g.at(i);
}

TEST(AnalyticAbsorber, BadStatesAndSizesAreInputErrors) {
  const bs::AnalyticAbsorber a(shipped());
  const bs::WavenumberGrid g{500.0, 1.0, 4};
  std::vector<double> out(4);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {0.0, 250.0}, g, out), bandstack::InputError);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {-1.0, 250.0}, g, out), bandstack::InputError);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {1e4, std::nan("")}, g, out), bandstack::InputError);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {1e4, 0.0}, g, out), bandstack::InputError);
  std::vector<double> wrong(3);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {1e4, 250.0}, g, wrong), bandstack::InputError);
  EXPECT_THROW(a.absorption(bs::Absorber::co2, {1e4, 250.0}, bs::WavenumberGrid{500.0, 0.0, 4}, out), bandstack::InputError);
}

TEST(AnalyticAbsorber, RecipeBuiltInCodeIsChecked) {
  bs::AnalyticRecipe r;
  bs::ExponentialBand b;
  b.name = "broken";
  b.absorber = bs::Absorber::co2;
  b.kappa_m2_kg = 1.0;
  b.decay_lower_cm1 = b.decay_upper_cm1 = 1.0;
  b.reference_pressure_pa = 0.0;
  r.bands.push_back(b);
  EXPECT_THROW(bs::AnalyticAbsorber{r}, bandstack::InputError);
}

// --- the parser -----------------------------------------------------------------------------------

TEST(RecipeParser, TypoIsReportedWithFileLineColumnAndKey) {
  std::string text = recipe_text(co2_band);
  text.replace(text.find("center_cm1"), 10, "centre_cm1");
  const std::string m = message_of(text);
  EXPECT_NE(m.find("r.toml:9:1: 'feature[0].centre_cm1': unknown key"), std::string::npos) << m;
  EXPECT_NE(m.find("'feature[0].center_cm1': missing"), std::string::npos) << m;
  EXPECT_NE(m.find("2 problems in the absorber recipe"), std::string::npos) << m;
}

TEST(RecipeParser, EveryKindOfMistakeIsCollected) {
  std::string text = recipe_text(co2_band + "\n" + co2_band);      // duplicate name
  text.replace(text.find("\"co2\"\ncenter"), 5, "\"h20\"");         // unknown absorber
  text.replace(text.find("110.0"), 5, "-1.0");                       // negative kappa
  text += "\n[[feature]]\nkind = \"line_list\"\nname = \"x\"\n";  // unknown kind
  const std::string m = message_of(text);
  EXPECT_NE(m.find("unknown absorber \"h20\""), std::string::npos) << m;
  EXPECT_NE(m.find("'feature[0].kappa_m2_per_kg': value -1 is outside"), std::string::npos) << m;
  EXPECT_NE(m.find("duplicate feature name \"co2\""), std::string::npos) << m;
  EXPECT_NE(m.find("unknown feature kind \"line_list\""), std::string::npos) << m;
}

TEST(RecipeParser, KindAndAbsorberMustAgree) {
  std::string band = co2_band;
  band.replace(band.find("absorber = \"co2\""), 16, "absorber = \"h2o_self_continuum\"");
  EXPECT_NE(message_of(recipe_text(band)).find("use kind = \"self_continuum\""), std::string::npos);
  const std::string continuum = R"([[feature]]
kind = "self_continuum"
name = "c"
absorber = "h2o"
constant_cm2_per_molecule_atm = 1e-22
amplitude_cm2_per_molecule_atm = 1e-19
decay_cm = 0.01
reference_temperature_k = 296.0
temperature_coefficient_k = 1800.0
)";
  EXPECT_NE(message_of(recipe_text(continuum)).find("must have absorber = \"h2o_self_continuum\""), std::string::npos);
}

TEST(RecipeParser, HeaderWidthsAndLimitsAreChecked) {
  EXPECT_NE(message_of(co2_band).find("missing [recipe] table"), std::string::npos);
  EXPECT_NE(message_of("[recipe]\nname = \"x\"\nversion = 1\n").find("no features"), std::string::npos);
  EXPECT_NE(message_of("[recipe]\nname = \"x\"\n" + co2_band).find("'recipe.version': missing"), std::string::npos);
  std::string zero = co2_band;
  zero.replace(zero.find("decay_lower_cm1 = 10.2"), 22, "decay_lower_cm1 = 0.0");
  zero.replace(zero.find("decay_upper_cm1 = 10.2"), 22, "decay_upper_cm1 = 0.0");
  EXPECT_NE(message_of(recipe_text(zero)).find("no width"), std::string::npos);
  EXPECT_NE(message_of(recipe_text(co2_band + "lower_cm1 = 700.0\nupper_cm1 = 600.0\n")).find("must exceed lower_cm1"),
            std::string::npos);
  EXPECT_NE(message_of(recipe_text(co2_band + "temperature_exponent = 1.0\n")).find("reference_temperature_k': missing"),
            std::string::npos);
}

TEST(RecipeParser, SyntaxErrorsAndMissingFiles) {
  const std::string m = message_of("[recipe]\nname = \"x\nversion = 1\n");
  EXPECT_NE(m.find("r.toml:2:"), std::string::npos) << m;
  EXPECT_NE(m.find("TOML syntax error"), std::string::npos) << m;
  EXPECT_THROW((void)bs::load_absorber_recipe("/nonexistent/recipe.toml"), bandstack::FileError);
}

TEST(RecipeParser, RecipeTextIsKeptForProvenance) {
  const auto r = bs::parse_absorber_recipe(recipe_text(co2_band), "kept.toml");
  EXPECT_EQ(r.source_text, recipe_text(co2_band));
  EXPECT_EQ(r.file, "kept.toml");
  EXPECT_EQ(r.version, 3);
}
