// validate(BandSet): every kind of inconsistency is caught and reported with the file and the
// variable name of the band-set file (docs/band-set-file.md). No physical values are checked here;
// the small set below is made up to be consistent.
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/band_set.hpp"
#include "bandstack/spectral/band_set_summary.hpp"

#include <cmath>
#include <functional>
#include <gtest/gtest.h>
#include <limits>
#include <string>

namespace bs = bandstack::spectral;
using bandstack::InputError;

namespace {

// 2 bands (2 + 1 g-points), 2 pressures, 3 temperatures, 2 Planck temperatures, h2o and co2 present.
bs::BandSet small_set() {
  bs::BandSet s;
  s.band_lower_cm1 = {10.0, 500.0};
  s.band_upper_cm1 = {500.0, 800.0};
  s.gpoint_band = {0, 0, 1};
  s.gpoint_weight = {0.75, 0.25, 1.0};
  s.ref_pressure_pa = {100.0, 10000.0};
  s.ref_temperature_k = {200.0, 250.0, 300.0};
  s.planck_temperature_k = {200.0, 300.0};
  s.absorber_present[index(bs::Absorber::h2o)] = true;
  s.absorber_present[index(bs::Absorber::co2)] = true;
  s.absorption_coefficient.assign(bs::absorber_count * 3 * 3 * 2, 0.0);
  for (std::size_t i = 0; i < 3 * 3 * 2; ++i) {
    s.absorption_coefficient[index(bs::Absorber::h2o) * 18 + i] = 0.5 + static_cast<double>(i);
    s.absorption_coefficient[index(bs::Absorber::co2) * 18 + i] = 2.0 * static_cast<double>(i);
  }
  s.planck_fraction = {0.6, 0.7, 0.4, 0.3, 1.0, 1.0};
  s.name = "small";
  return s;
}

// Expects validate() to throw an InputError naming `file` and `variable` whose message contains `text`.
void expect_rejected(const std::function<void(bs::BandSet&)>& spoil, const std::string& variable,
                     const std::string& text = "") {
  bs::BandSet s = small_set();
  spoil(s);
  try {
    bs::validate(s, "sets/small.nc");
    FAIL() << "validate accepted a set with a bad " << variable;
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().file, "sets/small.nc");
    EXPECT_EQ(e.place().item, variable) << e.what();
    EXPECT_NE(std::string(e.what()).find(text), std::string::npos) << e.what();
  }
}

constexpr double not_a_number = std::numeric_limits<double>::quiet_NaN();

} // namespace

TEST(BandSetValidate, AcceptsConsistentSet) { EXPECT_NO_THROW(bs::validate(small_set(), "x.nc")); }

TEST(BandSetValidate, KappaAccessorFollowsDocumentedLayout) {
  const bs::BandSet s = small_set();
  // absorption_coefficient[((a * n_g + g) * n_t + t) * n_p + p] (band_set.hpp)
  EXPECT_EQ(s.kappa(bs::Absorber::co2, 2, 1, 1), s.absorption_coefficient[((1 * 3 + 2) * 3 + 1) * 2 + 1]);
}

TEST(BandSetValidate, RejectsBadBands) {
  expect_rejected(
      [](bs::BandSet& s) {
        s.band_lower_cm1.clear();
        s.band_upper_cm1.clear();
      },
      "band_lower_wavenumber", "no bands");
  expect_rejected([](bs::BandSet& s) { s.band_upper_cm1.pop_back(); }, "band_upper_wavenumber", "expected 2");
  expect_rejected([](bs::BandSet& s) { s.band_upper_cm1[1] = 500.0; }, "band_upper_wavenumber", "band 1");
  expect_rejected([](bs::BandSet& s) { s.band_lower_cm1[1] = 510.0; }, "band_lower_wavenumber", "contiguous");
  expect_rejected([](bs::BandSet& s) { s.band_lower_cm1[0] = not_a_number; }, "band_lower_wavenumber", "index 0");
  expect_rejected([](bs::BandSet& s) { s.band_lower_cm1[0] = -1.0; }, "band_lower_wavenumber", ">= 0");
}

TEST(BandSetValidate, RejectsBadGpoints) {
  expect_rejected([](bs::BandSet& s) { s.gpoint_band[2] = 2; }, "gpoint_band", "g-point 2");
  expect_rejected([](bs::BandSet& s) { s.gpoint_band = {0, 1, 0}; }, "gpoint_band", "contiguous");
  expect_rejected([](bs::BandSet& s) { s.gpoint_band = {1, 1, 1}; }, "gpoint_band", "g-point 0");
  expect_rejected(
      [](bs::BandSet& s) {
        s.gpoint_band = {0, 0, 0};
        s.gpoint_weight = {0.5, 0.25, 0.25};
      },
      "gpoint_band", "band 1 has no g-point");
  expect_rejected([](bs::BandSet& s) { s.gpoint_weight.pop_back(); }, "gpoint_weight", "one per g-point");
  expect_rejected([](bs::BandSet& s) { s.gpoint_weight[0] = 0.7; }, "gpoint_weight", "band 0");
  expect_rejected([](bs::BandSet& s) { s.gpoint_weight[0] = 0.0; }, "gpoint_weight", "g-point 0");
  expect_rejected([](bs::BandSet& s) { s.gpoint_weight[1] = not_a_number; }, "gpoint_weight", "g-point 1");
}

TEST(BandSetValidate, RejectsBadGrids) {
  expect_rejected([](bs::BandSet& s) { s.ref_pressure_pa = {10000.0, 100.0}; }, "ref_pressure", "strictly increasing");
  expect_rejected([](bs::BandSet& s) { s.ref_pressure_pa[0] = 0.0; }, "ref_pressure", "> 0");
  expect_rejected([](bs::BandSet& s) { s.ref_pressure_pa[1] = not_a_number; }, "ref_pressure", "index 1");
  expect_rejected([](bs::BandSet& s) { s.ref_temperature_k[2] = 250.0; }, "ref_temperature", "index 2");
  expect_rejected([](bs::BandSet& s) { s.planck_temperature_k.clear(); }, "planck_temperature", "empty");
}

TEST(BandSetValidate, RejectsBadAbsorptionCoefficients) {
  expect_rejected([](bs::BandSet& s) { s.absorption_coefficient.pop_back(); }, "absorption_coefficient", "expected");
  expect_rejected([](bs::BandSet& s) { s.absorption_coefficient[((0 * 3 + 1) * 3 + 2) * 2 + 0] = not_a_number; },
                  "absorption_coefficient", "h2o at g-point 1, ref_temperature 2, ref_pressure 0");
  expect_rejected([](bs::BandSet& s) { s.absorption_coefficient[((1 * 3 + 2) * 3 + 0) * 2 + 1] = -1e-30; },
                  "absorption_coefficient", "co2 at g-point 2, ref_temperature 0, ref_pressure 1");
  expect_rejected([](bs::BandSet& s) { s.absorption_coefficient[index(bs::Absorber::o3) * 18] = 1.0; },
                  "absorption_coefficient", "does not include");
  expect_rejected([](bs::BandSet& s) { s.absorption_coefficient[5] = std::numeric_limits<double>::infinity(); },
                  "absorption_coefficient", "not finite");
}

TEST(BandSetValidate, RejectsBadPlanckFractions) {
  expect_rejected([](bs::BandSet& s) { s.planck_fraction.pop_back(); }, "planck_fraction", "expected");
  expect_rejected([](bs::BandSet& s) { s.planck_fraction[0] = 0.61; }, "planck_fraction",
                  "band 0, planck_temperature 0");
  expect_rejected(
      [](bs::BandSet& s) {
        s.planck_fraction[0] = 1.1;
        s.planck_fraction[2] = -0.1;
      },
      "planck_fraction", "g-point 0");
  expect_rejected([](bs::BandSet& s) { s.planck_fraction[5] = not_a_number; }, "planck_fraction",
                  "g-point 2, planck_temperature 1");
}

TEST(BandSetValidate, ToleratesRoundingInSums) {
  bs::BandSet s = small_set();
  s.gpoint_weight = {0.1 + 0.2, 0.7, 1.0}; // 0.30000000000000004 + 0.7 != 1 exactly
  s.planck_fraction[0] += 1e-13;
  EXPECT_NO_THROW(bs::validate(s));
}

TEST(BandSetSummary, NamesBandsGridsAndAbsorbers) {
  bs::BandSet s = small_set();
  s.source_description = "made-up source";
  s.builder_version = "9.9.9";
  const std::string text = bs::describe_band_set(s);
  for (const char* expected : {"band set       small", "source         made-up source", "bandstack 9.9.9",
                               "10 - 800 cm-1 in 2 bands, 3 g-points in total", "pressure 100 - 10000 Pa (2 values)",
                               "temperature 200 - 300 K (3 values)", "200 - 300 K (2 values)",
                               "h2o (m2 kg-1), co2 (m2 kg-1)\n", "10 - 500", "500 - 800"})
    EXPECT_NE(text.find(expected), std::string::npos) << expected << " not in\n" << text;
  // Kappa range at the node nearest 500 hPa and 260 K: p = 10000 Pa (index 1), T = 250 K (index 1).
  // co2 of band 0 (g-points 0, 1): values 2 * ((g * 3 + 1) * 2 + 1) = 6 and 18 in small_set().
  EXPECT_NE(text.find("10000 Pa, 250 K"), std::string::npos) << text;
  EXPECT_NE(text.find("co2                  6.000e+00 ..  1.800e+01"), std::string::npos) << text;
  EXPECT_EQ(text.find("o3"), std::string::npos);
}
