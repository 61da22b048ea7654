#include "bandstack/atmosphere/humidity_profile.hpp"

#include <gtest/gtest.h>

#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/humidity.hpp"

namespace {

using bandstack::Gas;
using namespace bandstack::atmosphere;

ProfileSettings settings_for(Profile p) {
  ProfileSettings s;
  s.profile = p;
  return s;
}

TEST(ManabeWetherald, FormulaValues) {
  // Manabe & Wetherald (1967), RH = RH_s (p/p_s - 0.02) / 0.98 (from memory): RH_s at the surface,
  // 0 at p/p_s = 0.02, and RH_s/2 at p/p_s = 0.51 (analytic midpoint).
  EXPECT_DOUBLE_EQ(manabe_wetherald_relative_humidity(101325.0, 101325.0, 0.77), 0.77);
  EXPECT_NEAR(manabe_wetherald_relative_humidity(0.02 * 101325.0, 101325.0, 0.77), 0.0, 1e-15);
  EXPECT_NEAR(manabe_wetherald_relative_humidity(0.51 * 100000.0, 100000.0, 0.77), 0.385, 1e-14);
  EXPECT_EQ(manabe_wetherald_relative_humidity(1000.0, 100000.0, 0.77), 0.0); // clipped above p/p_s = 0.02
  EXPECT_THROW((void)manabe_wetherald_relative_humidity(5e4, 1e5, 1.5), bandstack::InputError);
  EXPECT_THROW((void)manabe_wetherald_relative_humidity(0.0, 1e5, 0.77), bandstack::InputError);
}

TEST(ManabeWetherald, ReproducedAtLayerMidpointsInTheTroposphere) {
  for (Profile p : {Profile::us_standard_1976, Profile::tropical, Profile::midlatitude_summer,
                    Profile::high_latitude_winter}) {
    const ProfileSettings s = settings_for(p);
    const Column c = make_column(s, {100, 10.0, 101325.0, Spacing::linear_pressure});
    const TemperatureStructure t = temperature_structure(s, c.pressure_level_pa.back());
    const double ps = c.pressure_level_pa.back();
    int checked = 0;
    for (std::size_t i = 0; i < c.layer_count(); ++i) {
      const double x = c.gas(Gas::h2o)[i];
      const double pl = c.pressure_layer_pa[i];
      if (pl < t.tropopause_pressure_pa) {
        // Above the tropopause: the fixed stratospheric mole fraction.
        EXPECT_EQ(x, s.stratospheric_h2o_mole_fraction) << profile_name(p) << " layer " << i;
        continue;
      }
      if (x <= s.stratospheric_h2o_mole_fraction) continue; // floored
      const double rh = bandstack::thermo::relative_humidity_from_mole_fraction(x, pl, c.temperature_layer_k[i]);
      EXPECT_NEAR(rh, manabe_wetherald_relative_humidity(pl, ps, 0.77), 1e-9) << profile_name(p) << " layer " << i;
      ++checked;
    }
    EXPECT_GT(checked, 30) << profile_name(p);
  }
}

TEST(ManabeWetherald, FloorAppliesBelowTheTropopauseToo) {
  ProfileSettings s = settings_for(Profile::tropical);
  s.surface_relative_humidity = 0.0;
  const Column c = make_column(s, {});
  for (double x : c.gas(Gas::h2o)) EXPECT_EQ(x, s.stratospheric_h2o_mole_fraction);
}

struct PwRange {
  Profile profile;
  double low, high;
};

TEST(PrecipitableWater, InObservedRanges) {
  // Observed column water vapour (kg m-2 = mm), from memory:
  // - tropics 40-60: tropical-ocean precipitable water (Trenberth, Fasullo & Smith 2005, Clim. Dyn. 24);
  //   the AFGL tropical reference column holds ~41 (Anderson et al. 1986, AFGL-TR-86-0110).
  // - mid-latitude summer 20-40: AFGL mid-latitude summer ~29 (Anderson et al. 1986).
  // - a U.S.-standard-like annual mid-latitude column 10-25: AFGL U.S. standard ~14, global mean ~25
  //   (Trenberth et al. 2005).
  // - high-latitude winter 1.5-8: Arctic January ~2-5 (Serreze, Barry & Walsh 1995, J. Climate 8);
  //   AFGL sub-arctic winter ~4.2 (Anderson et al. 1986).
  const PwRange ranges[] = {{Profile::tropical, 40.0, 60.0},
                            {Profile::midlatitude_summer, 20.0, 40.0},
                            {Profile::us_standard_1976, 10.0, 25.0},
                            {Profile::high_latitude_winter, 1.5, 8.0}};
  for (const PwRange& r : ranges) {
    const double w = precipitable_water_kg_m2(make_column(settings_for(r.profile), {}));
    EXPECT_GT(w, r.low) << profile_name(r.profile);
    EXPECT_LT(w, r.high) << profile_name(r.profile);
  }
}

TEST(PrecipitableWater, GrowsAboutSevenPercentPerKelvin) {
  // Clausius-Clapeyron scaling of column water at fixed relative humidity: ~6-7.5 % per K
  // (Held & Soden 2006, J. Climate 19; from memory).
  ProfileSettings s = settings_for(Profile::tropical);
  const double w0 = precipitable_water_kg_m2(make_column(s, {}));
  s.surface_temperature_k = 301.0;
  const double w1 = precipitable_water_kg_m2(make_column(s, {}));
  EXPECT_GT(w1 / w0 - 1.0, 0.05);
  EXPECT_LT(w1 / w0 - 1.0, 0.09);
}

} // namespace
