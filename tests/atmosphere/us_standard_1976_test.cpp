#include "bandstack/atmosphere/us_standard_1976.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace {

namespace us = bandstack::atmosphere::us_standard_1976;

struct TableRow {
  double geopotential_height_m;
  double temperature_k;
  double pressure_pa;
};

// U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF), Table 4: defining layer bases in GEOPOTENTIAL
// height with their molecular-scale temperature and pressure (from memory; the pressures agree
// with secondary tabulations of the standard to the digits given).
constexpr TableRow table4[] = {
    {0.0, 288.15, 101325.0},     {11000.0, 216.65, 22632.06}, {20000.0, 216.65, 5474.889},
    {32000.0, 228.65, 868.0187}, {47000.0, 270.65, 110.9063}, {51000.0, 270.65, 66.93887},
    {71000.0, 214.65, 3.956420}, {84852.0, 186.946, 0.37338},
};

TEST(UsStandard1976, LayerBasesMatchTable4) {
  for (const TableRow& row : table4) {
    EXPECT_NEAR(us::temperature_k(row.geopotential_height_m), row.temperature_k, 1e-3) << row.geopotential_height_m;
    // 2e-6 relative: the table prints 7 significant digits (5 at 84.852 km).
    const double tol = row.geopotential_height_m > 80000.0 ? 2e-5 : 2e-6;
    EXPECT_NEAR(us::pressure_pa(row.geopotential_height_m) / row.pressure_pa, 1.0, tol) << row.geopotential_height_m;
  }
}

TEST(UsStandard1976, GeopotentialFiveKilometres) {
  // Same layer formula at H = 5 km geopotential: T = 288.15 - 6.5*5 = 255.65 K (Table 4 gradient),
  // p = 54019.9 Pa (U.S. Standard Atmosphere 1976 geopotential tabulation, from memory).
  EXPECT_NEAR(us::temperature_k(5000.0), 255.65, 1e-9);
  EXPECT_NEAR(us::pressure_pa(5000.0), 54019.9, 0.1);
}

TEST(UsStandard1976, GeometricAltitudesMatchTableI) {
  // Table I (GEOMETRIC altitude, metric units), from memory: 1 km: 281.651 K, 8.9876e4 Pa;
  // 5 km: 255.676 K, 5.4048e4 Pa; 10 km: 223.252 K, 2.6500e4 Pa.
  const struct { double z_m, t_k, p_pa; } rows[] = {{1000.0, 281.651, 8.9876e4}, {5000.0, 255.676, 5.4048e4},
                                                    {10000.0, 223.252, 2.6500e4}};
  for (const auto& r : rows) {
    const double h = us::geopotential_from_geometric_m(r.z_m);
    EXPECT_NEAR(us::temperature_k(h), r.t_k, 1e-3) << r.z_m;
    EXPECT_NEAR(us::pressure_pa(h) / r.p_pa, 1.0, 1e-4) << r.z_m;
  }
}

TEST(UsStandard1976, GeometricHeightsOfLayerBases) {
  // Table 4 lists the geometric heights of the geopotential bases (from memory):
  // 11 km -> 11.019 km, 20 -> 20.063, 32 -> 32.162, 47 -> 47.350, 71 -> 71.802, 84.852 -> 86.000.
  const struct { double h_m, z_m; } rows[] = {{11000.0, 11019.0}, {20000.0, 20063.0}, {32000.0, 32162.0},
                                              {47000.0, 47350.0}, {71000.0, 71802.0}, {84852.0, 86000.0}};
  for (const auto& r : rows) {
    EXPECT_NEAR(us::geometric_from_geopotential_m(r.h_m), r.z_m, 1.0) << r.h_m;
    EXPECT_NEAR(us::geopotential_from_geometric_m(r.z_m), r.h_m, 1.0) << r.z_m;
  }
}

TEST(UsStandard1976, InverseHeightOfPressureIsExact) {
  // Analytic identity: the inverse of the layer formulas, in every layer and beyond both ends.
  for (double h = -5000.0; h <= 95000.0; h += 1250.0) {
    const double p = us::pressure_pa(h);
    EXPECT_NEAR(us::geopotential_height_m(p), h, 1e-6) << h;
    EXPECT_NEAR(us::temperature_at_pressure_k(p), us::temperature_k(h), 1e-9) << h;
  }
}

TEST(UsStandard1976, PressureFallsMonotonically) {
  double previous = us::pressure_pa(-5000.0);
  for (double h = -4900.0; h <= 95000.0; h += 100.0) {
    const double p = us::pressure_pa(h);
    EXPECT_LT(p, previous) << h;
    previous = p;
  }
}

TEST(UsStandard1976, BadInputThrows) {
  EXPECT_THROW((void)us::geopotential_height_m(0.0), bandstack::InputError);
  EXPECT_THROW((void)us::geopotential_height_m(-1.0), bandstack::InputError);
  EXPECT_THROW((void)us::temperature_k(std::nan("")), bandstack::InputError);
  EXPECT_THROW((void)us::pressure_pa(INFINITY), bandstack::InputError);
}

} // namespace
