#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/rayleigh.hpp"

#include <cmath>
#include <gtest/gtest.h>

namespace {

using namespace bandstack::spectral;

// Rayleigh cross-section per molecule from first principles (Bodhaine et al. 1999, JAOT 16, eqs. 2-3,
// 4-5, 23; all constants from memory):
//   sigma = 24 pi^3 (n^2 - 1)^2 / (lambda^4 N_s^2 (n^2 + 2)^2) * F_air
// with the refractive index of standard air (15 C, 1013.25 hPa, 300 ppm CO2) of Peck & Reeder (1972, JOSA 62)
//   (n_300 - 1) 1e8 = 8060.51 + 2480990 / (132.274 - lambda^-2) + 17455.7 / (39.32957 - lambda^-2),
// scaled to 360 ppm CO2 by (n - 1) = (n_300 - 1) (1 + 0.54 (x_CO2 - 0.0003)), N_s = 2.546899e19 cm-3,
// and the King factor of Bates (1984): F_N2 = 1.034 + 3.17e-4 lambda^-2,
// F_O2 = 1.096 + 1.385e-3 lambda^-2 + 1.448e-4 lambda^-4, F_Ar = 1, F_CO2 = 1.15, weighted by the
// volume percentages 78.084, 20.946, 0.934, 0.036.
double first_principles_cm2(double lambda_um) {
  const double s2 = 1.0 / (lambda_um * lambda_um);
  const double n300 = 1.0 + 1e-8 * (8060.51 + 2480990.0 / (132.274 - s2) + 17455.7 / (39.32957 - s2));
  const double n = 1.0 + (n300 - 1.0) * (1.0 + 0.54 * (360e-6 - 300e-6));
  const double ns = 2.546899e19;
  const double f_n2 = 1.034 + 3.17e-4 * s2;
  const double f_o2 = 1.096 + 1.385e-3 * s2 + 1.448e-4 * s2 * s2;
  const double f_air = (78.084 * f_n2 + 20.946 * f_o2 + 0.934 * 1.0 + 0.036 * 1.15) / (78.084 + 20.946 + 0.934 + 0.036);
  const double lambda_cm = lambda_um * 1e-4;
  const double pi = bandstack::constants::pi;
  const double m = (n * n - 1.0) / (n * n + 2.0);
  return 24.0 * pi * pi * pi * m * m / (std::pow(lambda_cm, 4) * ns * ns) * f_air;
}

// Hansen & Travis (1974, Space Sci. Rev. 16, 527), the Rayleigh optical depth at 1013.25 hPa:
// 0.008569 lambda^-4 (1 + 0.0113 lambda^-2 + 0.00013 lambda^-4), lambda in um (from memory).
double hansen_travis(double lambda_um) {
  const double s2 = 1.0 / (lambda_um * lambda_um);
  return 0.008569 * s2 * s2 * (1.0 + 0.0113 * s2 + 0.00013 * s2 * s2);
}

TEST(Rayleigh, OpticalDepthAt550nm) {
  // About 0.097 for a 1013.25 hPa column at 550 nm (Bodhaine et al. 1999; docs/physics.md, from memory).
  EXPECT_NEAR(rayleigh_optical_depth_standard(0.55), 0.097, 0.0005);
}

TEST(Rayleigh, CrossSectionMatchesFirstPrinciples) {
  // The fit reproduces the first-principles cross-section within 0.01 % over 0.25-1 um (Bodhaine
  // et al. 1999 quote the fit as better than 0.01 %, from memory); we allow 0.1 %.
  for (double lambda : {0.25, 0.3, 0.4, 0.55, 0.7, 0.85, 1.0})
    EXPECT_NEAR(rayleigh_cross_section_cm2(lambda) / first_principles_cm2(lambda), 1.0, 1e-3) << lambda << " um";
}

TEST(Rayleigh, AgreesWithHansenTravis) {
  // Hansen & Travis (1974) and Bodhaine et al. (1999) differ by well under 1 % in 0.3-1 um
  // (Bodhaine et al. discuss differences of this size, from memory); beyond 1 um our lambda^-4
  // continuation stays within 1 % of Hansen & Travis up to 1.5 um.
  for (double lambda : {0.3, 0.35, 0.4, 0.5, 0.55, 0.6, 0.8, 1.0, 1.2, 1.5})
    EXPECT_NEAR(rayleigh_optical_depth_standard(lambda) / hansen_travis(lambda), 1.0, 0.01) << lambda << " um";
}

TEST(Rayleigh, ContinuousAtOneMicron) {
  // The lambda^-4 continuation joins the fit without a step (our construction; a check on it).
  EXPECT_NEAR(rayleigh_optical_depth_standard(1.0 - 1e-9) / rayleigh_optical_depth_standard(1.0 + 1e-9), 1.0, 1e-7);
  // lambda^-4 beyond 1 um (Rayleigh's law, common practice).
  EXPECT_NEAR(rayleigh_optical_depth_standard(4.0) / rayleigh_optical_depth_standard(2.0), 1.0 / 16.0, 1e-12);
}

TEST(Rayleigh, PerUnitMassGivesTheColumnOpticalDepth) {
  // A 1013.25 hPa column of mass p / g (g = 9.80616 m s-2 at sea level and 45 degrees, Bodhaine et
  // al. 1999 eq. 11, from memory) has the optical depth of eq. 30 within 0.3 % (eq. 30 rests on a
  // slightly different column mass; the per-molecule cross-section times the number of molecules
  // is the physical quantity).
  for (double lambda : {0.3, 0.55, 0.9}) {
    const double tau = rayleigh_cross_section_m2_kg(1e4 / lambda) * 101325.0 / 9.80616;
    EXPECT_NEAR(tau / rayleigh_optical_depth_standard(lambda), 1.0, 3e-3) << lambda << " um";
  }
}

TEST(Rayleigh, RejectsOutOfRange) {
  EXPECT_THROW((void)rayleigh_cross_section_cm2(0.19), bandstack::InputError);
  EXPECT_THROW((void)rayleigh_optical_depth_standard(std::nan("")), bandstack::InputError);
  EXPECT_THROW((void)rayleigh_cross_section_m2_kg(50001.0), bandstack::InputError);
  EXPECT_THROW((void)rayleigh_cross_section_m2_kg(0.0), bandstack::InputError);
  EXPECT_NO_THROW((void)rayleigh_cross_section_m2_kg(50000.0));
  EXPECT_NO_THROW((void)rayleigh_cross_section_m2_kg(100.0));
}

} // namespace
