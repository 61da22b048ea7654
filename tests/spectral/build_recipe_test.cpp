// Build recipes: parsing, collected error messages with positions, the shipped recipes in bands/,
// and the default set built from the embedded analytic absorber recipe.
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

#include <cmath>
#include <filesystem>
#include <gtest/gtest.h>
#include <string>
#include <unistd.h>

namespace bs = bandstack::spectral;
namespace fs = std::filesystem;
using bandstack::Gas;
using bandstack::InputError;

namespace {

const fs::path bands_folder = fs::path(BANDSTACK_SOURCE_DIR) / "bands";

const char* const minimal = R"(
name = "tiny"
absorbers = "absorbers.toml"
wavenumber_step_cm1 = 0.5

[gpoints]
rule = "geometric"
ratio = 0.5

[reference_grid]
pressure_min_hpa = 0.01
pressure_max_hpa = 1000.0
pressure_count = 6
temperature_min_k = 160.0
temperature_max_k = 340.0
temperature_step_k = 20.0
planck_temperature_min_k = 100.0
planck_temperature_max_k = 400.0
planck_temperature_step_k = 5.0

[ordering_state]
pressure_hpa = 500.0
temperature_k = 260.0
h2o_ppmv = 2000.0
co2_ppmv = 400.0
o3_ppmv = 0.05
ch4_ppmv = 1.8
n2o_ppmv = 0.32

[[bands]]
lower_cm1 = 10.0
upper_cm1 = 500.0
gpoints = 3

[[bands]]
lower_cm1 = 500.0
upper_cm1 = 800.0
gpoints = 2
g_boundaries = [0, 0.9, 1]
ordering_state = { pressure_hpa = 30.0, o3_ppmv = 5.0 }
)";

std::string message_of(const std::string& text) {
  try {
    (void)bs::parse_build_recipe(text, "recipes/r.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  ADD_FAILURE() << "recipe accepted:\n" << text;
  return "";
}

std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  EXPECT_NE(at, std::string::npos) << from;
  return text.replace(at, from.size(), to);
}

} // namespace

TEST(BuildRecipe, ParsesEveryField) {
  const bs::BuildRecipe r = bs::parse_build_recipe(minimal, "recipes/tiny.toml");
  EXPECT_EQ(r.name, "tiny");
  EXPECT_EQ(r.text, minimal);
  ASSERT_TRUE(r.absorber_recipe);
  EXPECT_EQ(*r.absorber_recipe, fs::path("recipes/absorbers.toml")); // relative to the recipe's folder
  EXPECT_FALSE(r.cross_section_file);
  EXPECT_EQ(r.wavenumber_step_cm1, 0.5);
  EXPECT_EQ(r.gpoint_mean, bs::GpointMean::arithmetic);
  // Pressures equally spaced in ln p from 1 Pa to 100000 Pa: one decade per step.
  ASSERT_EQ(r.ref_pressure_pa.size(), 6u);
  EXPECT_EQ(r.ref_pressure_pa.front(), 1.0);
  EXPECT_EQ(r.ref_pressure_pa.back(), 100000.0);
  for (std::size_t k = 1; k < 6; ++k)
    EXPECT_NEAR(r.ref_pressure_pa[k] / r.ref_pressure_pa[k - 1], 10.0, 1e-12);
  EXPECT_EQ(r.ref_temperature_k, (std::vector<double>{160, 180, 200, 220, 240, 260, 280, 300, 320, 340}));
  EXPECT_EQ(r.planck_temperature_k.size(), 61u);
  ASSERT_EQ(r.bands.size(), 2u);
  EXPECT_EQ(r.gpoint_count(), 5u);
  EXPECT_EQ(r.bands[0].g_boundaries, bs::geometric_g_boundaries(3, 0.5));
  EXPECT_EQ(r.bands[1].g_boundaries, (std::vector<double>{0.0, 0.9, 1.0}));
  EXPECT_EQ(r.bands[0].ordering.pressure_pa, 50000.0);
  EXPECT_NEAR(r.bands[0].ordering.mole_fraction[index(Gas::co2)], 400e-6, 1e-18);
  // The band's override replaces only the keys it gives.
  EXPECT_EQ(r.bands[1].ordering.pressure_pa, 3000.0);
  EXPECT_EQ(r.bands[1].ordering.temperature_k, 260.0);
  EXPECT_NEAR(r.bands[1].ordering.mole_fraction[index(Gas::o3)], 5e-6, 1e-18);
  EXPECT_NEAR(r.bands[1].ordering.mole_fraction[index(Gas::h2o)], 2000e-6, 1e-18);
}

TEST(BuildRecipe, CrossSectionSourceAndTransmissionMean) {
  std::string text = replaced(minimal, "absorbers = \"absorbers.toml\"", "cross_section_file = \"/data/kappa.nc\"");
  text = replaced(text, "wavenumber_step_cm1 = 0.5", "wavenumber_step_cm1 = 0.5\ngpoint_mean = \"transmission\"");
  const bs::BuildRecipe r = bs::parse_build_recipe(text, "recipes/tiny.toml");
  ASSERT_TRUE(r.cross_section_file);
  EXPECT_EQ(*r.cross_section_file, fs::path("/data/kappa.nc"));
  EXPECT_EQ(r.gpoint_mean, bs::GpointMean::transmission);
}

TEST(BuildRecipe, CollectsEveryProblemWithPlaceAndKey) {
  std::string text = replaced(minimal, "lower_cm1 = 500.0", "lower_cm1 = 520.0");
  text = replaced(text, "pressure_count = 6", "pressure_count = 6\npresure_count = 7");
  text = replaced(text, "gpoints = 3", "gpoints = 0");
  const std::string m = message_of(text);
  EXPECT_NE(m.find("3 problems in the build recipe"), std::string::npos) << m;
  // file:line:column: 'key': message (line numbers of `text`, counted from the raw string above).
  EXPECT_NE(m.find("recipes/r.toml:14:1: 'reference_grid.presure_count': unknown key"), std::string::npos) << m;
  EXPECT_NE(m.find("'bands[0].gpoints'"), std::string::npos) << m;
  EXPECT_NE(m.find("'bands[1].lower_cm1'"), std::string::npos) << m; // a gap between the bands
}

TEST(BuildRecipe, RefusesInconsistentInput) {
  EXPECT_NE(message_of(replaced(minimal, "name = \"tiny\"", "name = \"tiny\"\ncross_section_file = \"k.nc\""))
                .find("not both"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "absorbers = \"absorbers.toml\"", "")).find("'absorbers': missing"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "[0, 0.9, 1]", "[0, 0.9]")).find("needs gpoints + 1 = 3 values"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "[0, 0.9, 1]", "[0, 1.0, 0.9]")).find("strictly increasing"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "[0, 0.9, 1]", "[0.1, 0.9, 1]")).find("start at 0 and end at 1"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "upper_cm1 = 800.0", "upper_cm1 = 800.2")).find("not on the fine grid"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "wavenumber_step_cm1 = 0.5", "wavenumber_step_cm1 = 0.001"))
                .find("wavenumber_step_cm1"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "temperature_step_k = 20.0", "temperature_step_k = 7.0")).find("whole number"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "n2o_ppmv = 0.32\n", "")).find("'ordering_state.n2o_ppmv': missing"),
            std::string::npos);
  EXPECT_NE(message_of(replaced(minimal, "rule = \"geometric\"", "rule = \"gauss\"")).find("gpoints.rule"),
            std::string::npos);
  const std::string syntax = message_of(replaced(minimal, "ratio = 0.5", "ratio = = 0.5"));
  EXPECT_NE(syntax.find("recipes/r.toml:8:"), std::string::npos) << syntax;
  EXPECT_THROW((void)bs::load_build_recipe("/no/such/recipe.toml"), bandstack::FileError);
}

TEST(BuildRecipe, ShippedRecipesParse) {
  const bs::BuildRecipe standard = bs::load_build_recipe(bands_folder / "default_lw.toml");
  const bs::BuildRecipe fine = bs::load_build_recipe(bands_folder / "fine_lw.toml");
  // The issue: a default longwave set of at most 128 g-points in total, and a finer one.
  EXPECT_LE(standard.gpoint_count(), 128u);
  EXPECT_GT(fine.gpoint_count(), standard.gpoint_count());
  EXPECT_GT(fine.bands.size(), standard.bands.size());
  for (const bs::BuildRecipe* r : {&standard, &fine}) {
    EXPECT_EQ(r->bands.front().lower_cm1, 10.0);
    EXPECT_EQ(r->bands.back().upper_cm1, 3000.0);
    ASSERT_TRUE(r->absorber_recipe);
    EXPECT_TRUE(fs::exists(*r->absorber_recipe)) << *r->absorber_recipe;
  }
}

TEST(BuildRecipe, DefaultSetMatchesAnalyticCo2KDistribution) {
  // End to end with the embedded analytic recipe. In the default set's band 620-715 cm-1, which is
  // symmetric about the CO2 band centre 667.5 cm-1 and ordered where CO2 dominates the key, the CO2
  // g-points follow the k-distribution of kappa0 (p/p_ref)^n exp(-|nu - nu_c|/l) derived in
  // band_builder_test: mean over [g1, g2] = kappa0 (p/p_ref)^n (2l/W)[e^{-(1-g2)W/2l} - e^{-(1-g1)W/2l}]/(g2-g1).
  // kappa0, p_ref, n, l are read from the recipe (Jeevanjee et al. 2021 values, from memory, there).
  const bs::BuildRecipe recipe = bs::load_build_recipe(bands_folder / "default_lw.toml");
  const auto source = bs::open_absorber_source(recipe);
  const bs::BandSet set = bs::build_band_set(recipe, *source);
  EXPECT_EQ(set.gpoint_count(), recipe.gpoint_count());

  const bs::AnalyticRecipe absorbers = bs::load_absorber_recipe(*recipe.absorber_recipe);
  const bs::ExponentialBand* co2 = nullptr;
  for (const bs::ExponentialBand& f : absorbers.bands)
    if (f.absorber == bs::Absorber::co2) co2 = &f;
  ASSERT_NE(co2, nullptr);
  ASSERT_EQ(co2->decay_lower_cm1, co2->decay_upper_cm1);
  std::size_t band = 0;
  while (band < set.band_count() && set.band_lower_cm1[band] != 620.0)
    ++band;
  ASSERT_LT(band, set.band_count());
  ASSERT_EQ(set.band_upper_cm1[band] - co2->center_cm1, co2->center_cm1 - set.band_lower_cm1[band]);
  const double w = set.band_upper_cm1[band] - set.band_lower_cm1[band], c = w / (2.0 * co2->decay_lower_cm1);
  const std::size_t p = set.ref_pressure_pa.size() - 5, t = 10;
  const double scale = co2->kappa_m2_kg *
                       std::pow(set.ref_pressure_pa[p] / co2->reference_pressure_pa, co2->pressure_exponent) *
                       std::pow(set.ref_temperature_k[t] / co2->reference_temperature_k, co2->temperature_exponent);
  double g1 = 0.0;
  for (std::size_t g = 0; g < set.gpoint_count(); ++g) {
    if (set.gpoint_band[g] != band) continue;
    const double g2 = g1 + set.gpoint_weight[g];
    const double expected = scale / c * (std::exp(-(1.0 - g2) * c) - std::exp(-(1.0 - g1) * c)) / (g2 - g1);
    // 1e-3: water vapour, also in the key, shifts the order of mirror wavenumbers by well under one
    // 0.05 cm-1 grid step; plus the midpoint-rule error, (h/l)^2/24 = 1e-6.
    EXPECT_NEAR(set.kappa(bs::Absorber::co2, g, t, p) / expected, 1.0, 1e-3) << "g-point " << g;
    g1 = g2;
  }
}

TEST(BuildRecipe, CrossSectionFileGivesTheSameSetAsItsSource) {
  // The builder treats every absorber source alike: tabulating a source into a cross-section file on
  // the recipe's own fine grid and reference states, then building from that file through the
  // recipe, reproduces the set built from the source directly.
  std::string text = replaced(minimal, "absorbers = \"absorbers.toml\"", "cross_section_file = \"kappa.nc\"");
  text = replaced(text, "pressure_count = 6", "pressure_count = 3");
  text = replaced(text, "temperature_step_k = 20.0", "temperature_step_k = 90.0");
  // Ordering at a table node (1000 hPa, 250 K), where the file's interpolation is exact, so both
  // builds sort the same keys.
  text = replaced(text, "pressure_hpa = 500.0", "pressure_hpa = 1000.0");
  text = replaced(text, "temperature_k = 260.0", "temperature_k = 250.0");
  text = replaced(text, "pressure_hpa = 30.0, ", "");
  const fs::path dir = fs::temp_directory_path() / ("bandstack_build_recipe_" + std::to_string(::getpid()));
  fs::create_directories(dir);
  const bs::BuildRecipe recipe = bs::parse_build_recipe(text, (dir / "recipe.toml").string());
  const bs::AnalyticAbsorber analytic(bs::load_absorber_recipe(bands_folder / "earth_idealised_absorbers.toml"));
  const bs::WavenumberGrid grid = bs::make_wavenumber_grid(10.0, 800.0, recipe.wavenumber_step_cm1);
  bs::write_cross_section_file(dir / "kappa.nc", analytic, grid, recipe.ref_pressure_pa, recipe.ref_temperature_k,
                               "test table");
  const auto from_file = bs::open_absorber_source(recipe);
  const bs::BandSet a = bs::build_band_set(recipe, *from_file);
  const bs::BandSet b = bs::build_band_set(recipe, analytic);
  fs::remove_all(dir);
  EXPECT_NE(a.source_description.find("kappa.nc"), std::string::npos) << a.source_description;
  EXPECT_EQ(a.absorber_present, b.absorber_present);
  EXPECT_EQ(a.gpoint_weight, b.gpoint_weight);
  ASSERT_EQ(a.absorption_coefficient.size(), b.absorption_coefficient.size());
  for (std::size_t i = 0; i < a.absorption_coefficient.size(); ++i)
    EXPECT_NEAR(a.absorption_coefficient[i], b.absorption_coefficient[i], 1e-12 * b.absorption_coefficient[i] + 1e-300)
        << i;
  for (std::size_t i = 0; i < a.planck_fraction.size(); ++i)
    EXPECT_NEAR(a.planck_fraction[i], b.planck_fraction[i], 1e-14);
}
