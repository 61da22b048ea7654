#include "bandstack/atmosphere/profiles.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "bandstack/atmosphere/us_standard_1976.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/hydrostatics.hpp"
#include "bandstack/thermo/lapse_rate.hpp"

namespace {

using bandstack::Gas;
using bandstack::InputError;
using namespace bandstack::atmosphere;
namespace us = us_standard_1976;

constexpr Profile all_profiles[] = {Profile::us_standard_1976, Profile::tropical, Profile::midlatitude_summer,
                                    Profile::high_latitude_winter};

ProfileSettings settings_for(Profile p) {
  ProfileSettings s;
  s.profile = p;
  return s;
}

// Height (m above the surface) of a pressure inside a column, log-linear between levels.
double height_of_pressure_m(const Column& c, double p) {
  const auto z = bandstack::thermo::level_heights_m(c.pressure_level_pa, c.temperature_layer_k, c.gas(Gas::h2o),
                                                    c.gravity_m_s2);
  for (std::size_t k = 0; k + 1 < c.level_count(); ++k) {
    const double p0 = c.pressure_level_pa[k], p1 = c.pressure_level_pa[k + 1];
    if (p >= p0 && p <= p1) return z[k] + (z[k + 1] - z[k]) * std::log(p / p0) / std::log(p1 / p0);
  }
  return NAN;
}

TEST(Profiles, NamesRoundTrip) {
  for (Profile p : all_profiles) EXPECT_EQ(profile_from_name(profile_name(p)), p);
  EXPECT_EQ(profile_from_name("tropical"), Profile::tropical);
  EXPECT_EQ(profile_from_name("high_latitude_winter"), Profile::high_latitude_winter);
  EXPECT_FALSE(profile_from_name("Tropical").has_value());
  EXPECT_FALSE(profile_from_name("").has_value());
}

TEST(Profiles, EveryBuiltInColumnIsValidAndComplete) {
  for (Profile p : all_profiles) {
    for (Spacing spacing : {Spacing::log_pressure, Spacing::linear_pressure}) {
      const Column c = make_column(settings_for(p), {60, 10.0, 101325.0, spacing});
      EXPECT_NO_THROW(validate(c)) << profile_name(p);
      EXPECT_EQ(c.name, profile_name(p));
      ASSERT_EQ(c.layer_count(), 60u);
      for (std::size_t k = 1; k < c.level_count(); ++k) EXPECT_GT(c.pressure_level_pa[k], c.pressure_level_pa[k - 1]);
      for (std::size_t i = 0; i < c.layer_count(); ++i) {
        EXPECT_DOUBLE_EQ(c.pressure_layer_pa[i], 0.5 * (c.pressure_level_pa[i] + c.pressure_level_pa[i + 1]));
        EXPECT_EQ(c.gas(Gas::co2)[i], 400e-6);
        EXPECT_EQ(c.gas(Gas::ch4)[i], 1.8e-6);
        EXPECT_EQ(c.gas(Gas::n2o)[i], 0.32e-6);
        for (Gas g : bandstack::all_gases) EXPECT_GE(c.gas(g)[i], 0.0);
      }
      EXPECT_EQ(c.surface_temperature_k, c.temperature_level_k.back());
      EXPECT_EQ(c.surface_emissivity, 1.0);
      EXPECT_EQ(c.surface_albedo, 0.3);
    }
  }
}

TEST(Profiles, NameAndSurfacePropertiesAreCarried) {
  ProfileSettings s;
  s.surface_emissivity = 0.95;
  s.surface_albedo = 0.12;
  s.co2_mole_fraction = 800e-6;
  const Column c = make_column(s, {}, "column A");
  EXPECT_EQ(c.name, "column A");
  EXPECT_EQ(c.surface_emissivity, 0.95);
  EXPECT_EQ(c.surface_albedo, 0.12);
  EXPECT_EQ(c.gas(Gas::co2).front(), 800e-6);
}

TEST(Profiles, UsStandard1976ColumnReproducesTheStandard) {
  // Every level and layer temperature equals the 1976 standard's T at that pressure, including a
  // surface below sea-level pressure (an elevated surface) and one above it.
  for (double ps : {101325.0, 85000.0, 103000.0}) {
    const Column c = make_column({}, {50, 10.0, ps});
    for (std::size_t k = 0; k < c.level_count(); ++k)
      EXPECT_NEAR(c.temperature_level_k[k], us::temperature_at_pressure_k(c.pressure_level_pa[k]), 1e-9);
    for (std::size_t i = 0; i < c.layer_count(); ++i)
      EXPECT_NEAR(c.temperature_layer_k[i], us::temperature_at_pressure_k(c.pressure_layer_pa[i]), 1e-9);
  }
  // U.S. Standard Atmosphere 1976, Table 4 (from memory): tropopause 216.65 K at 22632.06 Pa.
  const TemperatureStructure t = temperature_structure({}, 101325.0);
  EXPECT_NEAR(t.tropopause_temperature_k, 216.65, 1e-6);
  EXPECT_NEAR(t.tropopause_pressure_pa, 22632.06, 0.05);
  EXPECT_EQ(t.surface_temperature_k, 288.15);
}

TEST(Profiles, TropopauseTemperaturesAsDesigned) {
  // Design values documented in profiles.hpp / profiles.cpp (not a measurement):
  // tropical 195 K, mid-latitude summer 217 K, high-latitude winter 220 K.
  EXPECT_NEAR(temperature_structure(settings_for(Profile::tropical), 101325.0).tropopause_temperature_k, 195.0, 1e-6);
  EXPECT_NEAR(temperature_structure(settings_for(Profile::midlatitude_summer), 101325.0).tropopause_temperature_k, 217.0, 1e-6);
  EXPECT_NEAR(temperature_structure(settings_for(Profile::high_latitude_winter), 101325.0).tropopause_temperature_k, 220.0, 1e-6);
}

TEST(Profiles, TropopauseHeightsInObservedRanges) {
  // Tropical cold-point tropopause near 16-18 km (Seidel et al. 2001, J. Geophys. Res. 106; from
  // memory); mid-latitude summer tropopause near 11-14 km (common practice). Heights from the
  // column's own hypsometric equation.
  const Column trop = make_column(settings_for(Profile::tropical), {});
  const double z_trop = height_of_pressure_m(trop, temperature_structure(settings_for(Profile::tropical), 101325.0).tropopause_pressure_pa);
  EXPECT_GT(z_trop, 15000.0);
  EXPECT_LT(z_trop, 18500.0);
  const Column mls = make_column(settings_for(Profile::midlatitude_summer), {});
  const double z_mls = height_of_pressure_m(mls, temperature_structure(settings_for(Profile::midlatitude_summer), 101325.0).tropopause_pressure_pa);
  EXPECT_GT(z_mls, 11000.0);
  EXPECT_LT(z_mls, 14000.0);
}

TEST(Profiles, TropicalTroposphereIsThePseudoAdiabat) {
  const ProfileSettings s = settings_for(Profile::tropical);
  const TemperatureStructure t = temperature_structure(s, 101325.0);
  EXPECT_EQ(t.surface_temperature_k, 300.0);
  for (double p : {90000.0, 70000.0, 50000.0, 30000.0, 15000.0})
    EXPECT_NEAR(temperature_at_pressure_k(t, p), bandstack::thermo::moist_pseudoadiabat_temperature_k(300.0, 101325.0, p), 1e-9);
  // Above the tropopause the cold point is isothermal, then it warms (design).
  EXPECT_NEAR(temperature_at_pressure_k(t, 0.9 * t.tropopause_pressure_pa), 195.0, 1e-9);
  EXPECT_GT(temperature_at_pressure_k(t, 1000.0), 215.0);
}

TEST(Profiles, BatchEvaluationAgreesWithPointwise) {
  // The chained integration must reproduce the pointwise pseudo-adiabat (thermo's RK4 is accurate
  // to < 1e-7 K per integration, so 1e-5 K leaves room for ~100 chained segments).
  for (Profile p : {Profile::tropical, Profile::high_latitude_winter}) {
    const Column c = make_column(settings_for(p), {80, 10.0, 101325.0});
    const TemperatureStructure t = temperature_structure(settings_for(p), 101325.0);
    for (std::size_t k = 0; k < c.level_count(); ++k)
      EXPECT_NEAR(c.temperature_level_k[k], temperature_at_pressure_k(t, c.pressure_level_pa[k]), 1e-5) << k;
    for (std::size_t i = 0; i < c.layer_count(); ++i)
      EXPECT_NEAR(c.temperature_layer_k[i], temperature_at_pressure_k(t, c.pressure_layer_pa[i]), 1e-5) << i;
  }
}

TEST(Profiles, MidlatitudeSummerLapseRate) {
  // Design: 6.0 K per geopotential km. For T = T_s (p/p_s)^(R Γ / g) the lapse rate follows
  // analytically as Γ = (g/R) ln(T1/T2) / ln(p1/p2) with the 1976 standard's R and g.
  const TemperatureStructure t = temperature_structure(settings_for(Profile::midlatitude_summer), 101325.0);
  const double p1 = 90000.0, p2 = 40000.0;
  const double t1 = temperature_at_pressure_k(t, p1), t2 = temperature_at_pressure_k(t, p2);
  const double r_over_g = us::gas_constant_j_mol_k / (us::gravity_m_s2 * us::molar_mass_air_kg_mol);
  EXPECT_NEAR(std::log(t1 / t2) / std::log(p1 / p2) / r_over_g, 0.0060, 1e-12);
}

TEST(Profiles, HighLatitudeWinterInversion) {
  // Design: +10 K over the lowest 10 % of the surface pressure, then 6.5 K/km.
  const TemperatureStructure t = temperature_structure(settings_for(Profile::high_latitude_winter), 100000.0);
  EXPECT_EQ(temperature_at_pressure_k(t, 100000.0), 250.0);
  EXPECT_NEAR(temperature_at_pressure_k(t, 95000.0), 255.0, 1e-9);
  EXPECT_NEAR(temperature_at_pressure_k(t, 90000.0), 260.0, 1e-9);
  EXPECT_LT(temperature_at_pressure_k(t, 60000.0), 260.0);
  // Cold stratosphere: colder at z_US = 25 km than at the tropopause.
  EXPECT_LT(temperature_at_pressure_k(t, us::pressure_pa(25000.0)), 215.0);
}

TEST(Profiles, SurfaceTemperatureOverrideMovesTroposphereNotStratosphere) {
  for (Profile p : all_profiles) {
    ProfileSettings base = settings_for(p);
    ProfileSettings warm = base;
    warm.surface_temperature_k = default_surface_temperature_k(p) + 4.0;
    const Column c0 = make_column(base, {});
    const Column c1 = make_column(warm, {});
    EXPECT_EQ(c1.surface_temperature_k, *warm.surface_temperature_k) << profile_name(p);
    EXPECT_EQ(c1.temperature_level_k.back(), *warm.surface_temperature_k) << profile_name(p);
    const TemperatureStructure t0 = temperature_structure(base, 101325.0);
    const TemperatureStructure t1 = temperature_structure(warm, 101325.0);
    EXPECT_LT(t1.tropopause_pressure_pa, t0.tropopause_pressure_pa) << "warmer surface, higher tropopause: " << profile_name(p);
    // Mid-troposphere warmer, stratosphere (1 hPa) unchanged.
    EXPECT_GT(temperature_at_pressure_k(t1, 60000.0), temperature_at_pressure_k(t0, 60000.0) + 3.0) << profile_name(p);
    EXPECT_EQ(temperature_at_pressure_k(t1, 100.0), temperature_at_pressure_k(t0, 100.0)) << profile_name(p);
    // More water with a warmer surface at fixed relative humidity.
    EXPECT_GT(c1.gas(Gas::h2o).back(), c0.gas(Gas::h2o).back()) << profile_name(p);
  }
}

TEST(Profiles, BadSettingsThrowInputError) {
  ProfileSettings cold;
  cold.surface_temperature_k = 210.0; // below the 216.65 K tropopause of the 1976 standard
  EXPECT_THROW((void)make_column(cold, {}), InputError);
  ProfileSettings nan_t;
  nan_t.surface_temperature_k = std::nan("");
  EXPECT_THROW((void)make_column(nan_t, {}), InputError);
  ProfileSettings rh;
  rh.surface_relative_humidity = 1.2;
  EXPECT_THROW((void)make_column(rh, {}), InputError);
  ProfileSettings co2;
  co2.co2_mole_fraction = -1e-6;
  EXPECT_THROW((void)make_column(co2, {}), InputError);
  ProfileSettings ozone;
  ozone.ozone_scale = -1.0;
  EXPECT_THROW((void)make_column(ozone, {}), InputError);
  ProfileSettings albedo;
  albedo.surface_albedo = 1.5;
  EXPECT_THROW((void)make_column(albedo, {}), InputError);
  try {
    (void)make_column(cold, {});
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().item, "surface_temperature");
  }
}

} // namespace
