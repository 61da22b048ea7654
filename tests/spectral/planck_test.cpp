// Planck function and band integrals: checks against published constants, a handbook table,
// analytic limits and the Boost.Math quadrature reference.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/planck.hpp"

#include <algorithm>
#include <boost/math/tools/minima.hpp>
#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace bs = bandstack::spectral;
namespace k = bandstack::constants;

namespace {

constexpr double inf = std::numeric_limits<double>::infinity();
constexpr double not_a_number = std::numeric_limits<double>::quiet_NaN();

// CODATA 2018 Stefan-Boltzmann constant (NIST SP 961), 5.670374419e-8 W m-2 K-4.
constexpr double sigma_codata_2018 = 5.670374419e-8;

double relative_difference(double a, double b) { return std::abs(a - b) / std::abs(b); }

double total_radiance(double t_k) { return sigma_codata_2018 * std::pow(t_k, 4) / k::pi; }

// Bands of every kind the library meets: very narrow to very wide, thin, starting at 0, and
// running to infinity, across 1..5000 cm-1.
std::vector<std::pair<double, double>> band_grid() {
  std::vector<std::pair<double, double>> bands;
  const double starts[] = {0.0, 1.0, 10.0, 50.0, 100.0, 300.0, 500.0, 667.5, 1000.0, 1500.0, 2500.0, 4000.0, 4999.99};
  const double widths[] = {0.01, 0.1, 0.37, 1.0, 3.0, 10.0, 50.0, 100.0, 1000.0, 5000.0, inf};
  for (const double a : starts) {
    for (const double w : widths)
      bands.emplace_back(a, a + w);
  }
  return bands;
}

const double grid_temperatures_k[] = {100.0, 150.0, 200.0, 250.0, 288.0, 500.0, 1000.0, 2000.0, 4000.0, 6000.0};

} // namespace

// 1. A partition of (0, inf) sums to the Stefan-Boltzmann total sigma T^4 / pi
//    (sigma: CODATA 2018; the total is the analytic integral of the Planck function).
TEST(PlanckTest, PartitionOfSpectrumSumsToStefanBoltzmannTotal) {
  std::vector<double> regular; // 0, 10, ..., 3000 cm-1, then infinity
  for (int i = 0; i <= 300; ++i)
    regular.push_back(10.0 * i);
  regular.push_back(inf);
  const std::vector<double> irregular = {0.0,   0.37,   3.1,    17.0,   55.5,   123.4,   400.0,
                                         667.5, 1001.0, 2222.2, 4321.0, 9876.5, 25000.0, inf};
  for (const double t_k : {150.0, 288.0, 1000.0, 5772.0}) {
    for (const std::vector<double>* edges : {&std::as_const(regular), &irregular}) {
      double sum = 0.0;
      for (std::size_t i = 0; i + 1 < edges->size(); ++i)
        sum += bs::planck_band_radiance((*edges)[i], (*edges)[i + 1], t_k);
      EXPECT_LT(relative_difference(sum, total_radiance(t_k)), 1e-10) << "T = " << t_k << " K";
    }
  }
}

// 2. Blackbody fractions F(0 -> lambda T) against the handbook table "Radiation Function
//    F0-lambdaT": Mechanical Engineers' Handbook, Vol. 4 (M. Kutz, ed., Wiley), heat-transfer
//    chapter, section 3 "Radiation Heat Transfer", Table 16, p. 183 (values read from the table,
//    4 significant digits; editor and publisher from memory).
//    The page does not print the second radiation constant behind it. F depends only on
//    lambda T / C2, so the table is evaluated at C2 = 14,388 um K, the value heat-transfer
//    handbooks of that generation use (from memory); it reproduces every entry to rounding,
//    while CODATA 2018's 14,387.77 um K misses lambda T <= 600 um K by up to 3 units.
TEST(PlanckTest, BlackbodyFractionsMatchHandbookTable) {
  struct Entry {
    double lambda_t_um_k;
    double fraction;
  };
  const Entry table[] = {
      {400.0, 0.1864e-11}, {600.0, 0.9290e-7}, {800.0, 0.1643e-4}, {1000.0, 0.3207e-3}, {1400.0, 0.7789e-2},
      {2200.0, 0.1009},    {2900.0, 0.2505},   {4000.0, 0.4809},   {5000.0, 0.6337},    {7000.0, 0.8081},
      {10000.0, 0.9142},   {20000.0, 0.9856},  {50000.0, 0.9989},
  };
  const double c2_table_um_k = 14388.0; // (from memory; calibrated to this table, see above)
  const double c2_codata_um_k = 1e6 * k::planck_j_s * k::speed_of_light_m_s / k::boltzmann_j_k; // CODATA 2018 exact
  for (const double t_k : {300.0, 1000.0, 5800.0}) {
    for (const Entry& e : table) {
      const double lambda_t = e.lambda_t_um_k * c2_codata_um_k / c2_table_um_k;
      const double nu_cm1 = 1e4 / (lambda_t / t_k); // lambda in um -> wavenumber in cm-1
      const double f = bs::blackbody_fraction(nu_cm1, inf, t_k);
      // Tolerance: half a unit in the 4th significant digit (the table's rounding) with 10 %
      // slack for the table's own arithmetic.
      const double unit = std::pow(10.0, std::floor(std::log10(e.fraction)) - 3.0);
      EXPECT_NEAR(f, e.fraction, 0.55 * unit) << "lambda T = " << e.lambda_t_um_k << " um K, T = " << t_k;
    }
  }
}

// 3. Wien's displacement law. Per wavenumber (or frequency) the peak is at
//    nu_max = b' T / c with b' = 5.878925757e10 Hz K-1 (CODATA 2018, Wien frequency displacement
//    law constant; equivalently 2.821439372 k T / h); per wavelength at lambda_max = b / T with
//    b = 2.897771955e-3 m K (CODATA 2018).
TEST(PlanckTest, PeaksFollowWienDisplacementLaw) {
  const double b_prime_hz_k = 5.878925757e10; // CODATA 2018
  const double b_m_k = 2.897771955e-3;        // CODATA 2018
  // A maximum is flat: its place is known to about sqrt(epsilon), half the bits of a double.
  const int brent_bits = std::numeric_limits<double>::digits / 2;
  for (const double t_k : {200.0, 300.0, 1000.0, 5772.0}) {
    const auto per_wavenumber = boost::math::tools::brent_find_minima(
        [t_k](double nu) { return -bs::planck_radiance(nu, t_k); }, 0.5 * t_k, 5.0 * t_k, brent_bits);
    const double nu_expected_cm1 = b_prime_hz_k * t_k / k::speed_of_light_m_s / 100.0;
    EXPECT_LT(relative_difference(per_wavenumber.first, nu_expected_cm1), 1e-6) << "T = " << t_k;

    // B_lambda = B_nu~ * nu~^2 with nu~ = 1 / lambda; the constant factor does not move the peak.
    // Searched in micrometres: Brent's stopping test has an absolute part of ~1e-8.
    const auto per_wavelength = boost::math::tools::brent_find_minima(
        [t_k](double lambda_um) { return -bs::planck_radiance(1e4 / lambda_um, t_k) / (lambda_um * lambda_um); },
        0.2e6 * b_m_k / t_k, 5.0e6 * b_m_k / t_k, brent_bits);
    EXPECT_LT(relative_difference(per_wavelength.first, 1e6 * b_m_k / t_k), 1e-6) << "T = " << t_k;
  }
}

// 4. Stefan-Boltzmann constant: 2 pi^5 k^4 / (15 h^3 c^2) from the exact CODATA 2018 h, c, k
//    against the published CODATA 2018 sigma; the integral of pi B over all wavenumbers
//    (fast and reference paths) equals sigma T^4.
TEST(PlanckTest, StefanBoltzmannFromCodata2018) {
  const double h = k::planck_j_s, c = k::speed_of_light_m_s, kb = k::boltzmann_j_k;
  const double sigma = 2.0 * std::pow(k::pi, 5) * std::pow(kb, 4) / (15.0 * std::pow(h, 3) * c * c);
  EXPECT_LT(relative_difference(sigma, sigma_codata_2018), 1e-9);
  // c2 = h c / k against CODATA 2018 1.438776877e-2 m K.
  EXPECT_LT(relative_difference(h * c / kb, 1.438776877e-2), 1e-9);
  for (const double t_k : {100.0, 288.0, 1000.0, 5772.0}) {
    EXPECT_LT(relative_difference(k::pi * bs::planck_band_radiance(0.0, inf, t_k), sigma * std::pow(t_k, 4)), 1e-13);
    EXPECT_LT(relative_difference(k::pi * bs::planck_band_radiance_reference(0.0, inf, t_k), sigma * std::pow(t_k, 4)),
              1e-12);
    EXPECT_LT(std::abs(bs::blackbody_fraction(0.0, inf, t_k) - 1.0), 1e-14);
  }
}

// Spectral radiance in its analytic limits. Rayleigh-Jeans (x = c2 nu / T << 1):
// B = 2 c k T nu^2 (1 - x/2 + x^2/12 + ...); Wien (x >> 1): B = 2 h c^2 nu^3 e^{-x}. Both from the
// series of 1/(e^x - 1) (analytic); nu in m-1 and B per m-1, times 100 for per cm-1.
TEST(PlanckTest, RadianceMatchesRayleighJeansAndWienLimits) {
  const double h = k::planck_j_s, c = k::speed_of_light_m_s, kb = k::boltzmann_j_k;
  const double t_k = 300.0, nu_cm1 = 0.01, nu_m = 100.0 * nu_cm1;
  const double x = h * c * nu_m / (kb * t_k);
  const double rayleigh_jeans = 2.0 * c * kb * t_k * nu_m * nu_m * (1.0 - x / 2.0 + x * x / 12.0) * 100.0;
  EXPECT_LT(relative_difference(bs::planck_radiance(nu_cm1, t_k), rayleigh_jeans), 1e-12);

  const double nu_w_cm1 = 5000.0, t_w_k = 100.0, nu_w_m = 100.0 * nu_w_cm1;
  const double x_w = h * c * nu_w_m / (kb * t_w_k);
  const double wien = 2.0 * h * c * c * std::pow(nu_w_m, 3) * std::exp(-x_w) * 100.0;
  EXPECT_LT(relative_difference(bs::planck_radiance(nu_w_cm1, t_w_k), wien), 1e-13);
  EXPECT_EQ(bs::planck_radiance(0.0, t_k), 0.0);
  EXPECT_EQ(bs::planck_radiance(1e6, 1.0), 0.0); // e^{-1.4e6} underflows
}

// 5. Fast series against the Boost.Math quadrature reference over the band grid.
TEST(PlanckTest, FastSeriesMatchesQuadratureReference) {
  double worst = 0.0;
  double worst_nu1 = 0, worst_nu2 = 0, worst_t = 0;
  for (const double t_k : grid_temperatures_k) {
    for (const auto& [nu1, nu2] : band_grid()) {
      const double fast = bs::planck_band_radiance(nu1, nu2, t_k);
      const double reference = bs::planck_band_radiance_reference(nu1, nu2, t_k);
      ASSERT_GT(reference, 0.0) << nu1 << ".." << nu2 << " cm-1, " << t_k << " K";
      const double error = relative_difference(fast, reference);
      if (error > worst) {
        worst = error;
        worst_nu1 = nu1, worst_nu2 = nu2, worst_t = t_k;
      }
    }
  }
  std::printf("planck band radiance: max relative error fast vs reference %.3g (band %g..%g cm-1, %g K)\n", worst,
              worst_nu1, worst_nu2, worst_t);
  EXPECT_LE(worst, 1e-12);
}

// A narrow band tends to B(mid) * width, with the midpoint-rule error width^2 B'' / 24 (analytic).
// For width 1e-4 cm-1, nu >= 100 cm-1 and T >= 150 K, |B''/B| < 1e-3 cm2, so that error is
// below 1e-12 relative (at lower nu the nu^2 curvature of B would dominate).
TEST(PlanckTest, VeryNarrowBandTendsToMidpointValue) {
  for (const double t_k : {150.0, 288.0, 3000.0}) {
    for (const double nu : {100.0, 667.5, 2500.0, 4999.0}) {
      const double nu1 = nu - 5e-5, nu2 = nu + 5e-5;
      const double band = bs::planck_band_radiance(nu1, nu2, t_k);
      // The rounded limits, not the nominal 1e-4, make the width (1e-9 apart at 2500 cm-1).
      const double midpoint = bs::planck_radiance(0.5 * (nu1 + nu2), t_k) * (nu2 - nu1);
      EXPECT_LT(relative_difference(band, midpoint), 1e-12) << nu << " cm-1, " << t_k;
    }
  }
}

// 6. Temperature derivatives: against the quadrature of dB/dT and against central differences.
//    The central difference has truncation error h^2 f''' / 6 (analytic); in the Wien tail each
//    T-derivative brings a factor x / T, so the step is h = 1e-5 T / (1 + x1), which keeps
//    truncation below 2e-11 and rounding below 1e-9 relative.
TEST(PlanckTest, BandDerivativeMatchesQuadratureAndFiniteDifference) {
  double worst = 0.0;
  for (const double t_k : grid_temperatures_k) {
    for (const auto& [nu1, nu2] : band_grid()) {
      const double fast = bs::planck_band_radiance_derivative(nu1, nu2, t_k);
      const double reference = bs::planck_band_radiance_derivative_reference(nu1, nu2, t_k);
      worst = std::max(worst, relative_difference(fast, reference));

      const double x1 = k::planck_j_s * k::speed_of_light_m_s * 100.0 * nu1 / (k::boltzmann_j_k * t_k);
      const double h = 1e-5 * t_k / (1.0 + x1);
      const double difference =
          (bs::planck_band_radiance(nu1, nu2, t_k + h) - bs::planck_band_radiance(nu1, nu2, t_k - h)) / (2.0 * h);
      EXPECT_LT(relative_difference(fast, difference), 1e-8) << nu1 << ".." << nu2 << " cm-1, " << t_k << " K";
    }
  }
  std::printf("planck band radiance derivative: max relative error fast vs reference %.3g\n", worst);
  EXPECT_LE(worst, 1e-12);
}

TEST(PlanckTest, SpectralDerivativeMatchesFiniteDifference) {
  for (const double t_k : {150.0, 288.0, 1000.0}) {
    for (const double nu : {0.5, 100.0, 667.5, 2000.0, 4000.0}) {
      const double x = k::planck_j_s * k::speed_of_light_m_s * 100.0 * nu / (k::boltzmann_j_k * t_k);
      const double h = 1e-5 * t_k / (1.0 + x); // as above
      const double difference = (bs::planck_radiance(nu, t_k + h) - bs::planck_radiance(nu, t_k - h)) / (2.0 * h);
      EXPECT_LT(relative_difference(bs::planck_radiance_derivative(nu, t_k), difference), 1e-8);
    }
  }
  // d/dT of the total sigma T^4 / pi is 4 sigma T^3 / pi (analytic).
  EXPECT_LT(relative_difference(bs::planck_band_radiance_derivative(0.0, inf, 288.0),
                                4.0 * sigma_codata_2018 * std::pow(288.0, 3) / k::pi),
            1e-10);
}

// 7. Bad arguments throw InputError from every entry point.
TEST(PlanckTest, BadArgumentsThrowInputError) {
  using bandstack::InputError;
  for (const double bad_t : {0.0, -10.0, not_a_number, inf}) {
    EXPECT_THROW((void)bs::planck_radiance(500.0, bad_t), InputError);
    EXPECT_THROW((void)bs::planck_radiance_derivative(500.0, bad_t), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance(500.0, 600.0, bad_t), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_reference(500.0, 600.0, bad_t), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_derivative(500.0, 600.0, bad_t), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_derivative_reference(500.0, 600.0, bad_t), InputError);
    EXPECT_THROW((void)bs::blackbody_fraction(500.0, 600.0, bad_t), InputError);
  }
  for (const double bad_nu : {-1.0, not_a_number, inf}) {
    EXPECT_THROW((void)bs::planck_radiance(bad_nu, 288.0), InputError);
    EXPECT_THROW((void)bs::planck_radiance_derivative(bad_nu, 288.0), InputError);
  }
  const std::pair<double, double> bad_bands[] = {{600.0, 500.0},        {500.0, 500.0},        {-1.0, 500.0},
                                                 {not_a_number, 500.0}, {500.0, not_a_number}, {inf, inf}};
  for (const auto& [nu1, nu2] : bad_bands) {
    EXPECT_THROW((void)bs::planck_band_radiance(nu1, nu2, 288.0), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_reference(nu1, nu2, 288.0), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_derivative(nu1, nu2, 288.0), InputError);
    EXPECT_THROW((void)bs::planck_band_radiance_derivative_reference(nu1, nu2, 288.0), InputError);
    EXPECT_THROW((void)bs::blackbody_fraction(nu1, nu2, 288.0), InputError);
  }
  try {
    (void)bs::planck_band_radiance(600.0, 500.0, 288.0);
    FAIL() << "no exception";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("planck_band_radiance"), std::string::npos) << e.what();
  }
}
