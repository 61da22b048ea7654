#include "bandstack/atmosphere/sun.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/ellint_2.hpp>
#include <cmath>
#include <gtest/gtest.h>
#include <string>
#include <vector>

namespace {

using namespace bandstack::atmosphere;
using bandstack::InputError;
namespace constants = bandstack::constants;

constexpr double pi = constants::pi;
constexpr double degree = pi / 180.0;
constexpr double s0 = total_solar_irradiance_w_m2;

// Orbital elements near J2000 (outside values for the analytic checks below):
// obliquity 23.4393 deg (IAU 2006 precession, 84381.406 arcsec; from memory) and eccentricity
// 0.0167086 (J2000 mean elements of the Earth's orbit, Simon et al. 1994; from memory).
constexpr double obliquity = 23.4393 * degree;
constexpr double eccentricity = 0.0167086;

template <class F> double integrate(F f, double a, double b) {
  return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(f, a, b, 15, 1e-13);
}

// Spencer (1971, "Fourier series representation of the position of the Sun", Search 2(5), 172;
// from memory): an independent published fit of a mean year, used as a cross-check.
double spencer_declination_rad(double day) {
  const double g = 2.0 * pi * (day - 1.0) / 365.0;
  return 0.006918 - 0.399912 * std::cos(g) + 0.070257 * std::sin(g) - 0.006758 * std::cos(2 * g) +
         0.000907 * std::sin(2 * g) - 0.002697 * std::cos(3 * g) + 0.00148 * std::sin(3 * g);
}
double spencer_distance_factor(double day) {
  const double g = 2.0 * pi * (day - 1.0) / 365.0;
  return 1.000110 + 0.034221 * std::cos(g) + 0.001280 * std::sin(g) + 0.000719 * std::cos(2 * g) +
         0.000077 * std::sin(2 * g);
}

// The definition of the daily mean, integrated numerically over the hour angle:
// Q = (1/2pi) integral_{-pi}^{pi} S0 (d0/d)^2 max(0, mu(h)) dh, and the insolation-weighted
// integral_{mu>0} mu^2 dh / integral_{mu>0} mu dh. The sunset (mu = 0) is found by bisection, not by
// the closed form, and the smooth sunlit part is integrated by adaptive Gauss-Kronrod.
struct Quadrature {
  double insolation, mu_weighted;
};
Quadrature by_quadrature(double latitude_deg, const SolarPosition& sun) {
  const double a = std::sin(latitude_deg * degree) * std::sin(sun.declination_rad);
  const double b = std::cos(latitude_deg * degree) * std::cos(sun.declination_rad);
  auto mu = [&](double h) { return a + b * std::cos(h); };
  auto mu2 = [&](double h) { return mu(h) * mu(h); };
  double sunset = 0.0;
  if (mu(pi) >= 0.0) {
    sunset = pi;
  } else if (mu(0.0) > 0.0) {
    double lo = 0.0, hi = pi; // mu(lo) > 0 >= mu(hi)
    for (int i = 0; i < 200 && hi - lo > 1e-16; ++i) {
      const double mid = 0.5 * (lo + hi);
      (mu(mid) > 0.0 ? lo : hi) = mid;
    }
    sunset = 0.5 * (lo + hi);
  }
  if (sunset == 0.0) return {0.0, 0.0};
  const double i1 = integrate(mu, 0.0, sunset);
  const double i2 = integrate(mu2, 0.0, sunset);
  return {s0 * sun.distance_factor * i1 / pi, i2 / i1};
}

TEST(Sun, SolarConstants) {
  // Kopp & Lean (2011, GRL 38, L01706): TSI 1360.8 +- 0.5 W m-2 (from memory).
  EXPECT_NEAR(total_solar_irradiance_w_m2, 1360.8, 0.5);
  // A blackbody at the IAU 2015 B3 nominal effective temperature 5772 K with the nominal solar
  // radius 6.957e8 m (IAU 2015 B3, from memory), seen from 1 AU = 149597870700 m (IAU 2012 B2,
  // exact), gives the nominal TSI 1361 W m-2 (IAU 2015 B3) to within the rounding of T_eff.
  const double ratio = 6.957e8 / 149597870700.0;
  const double flux = constants::stefan_boltzmann_w_m2_k4 * std::pow(solar_effective_temperature_k, 4) * ratio * ratio;
  EXPECT_NEAR(flux / total_solar_irradiance_w_m2, 1.0, 5e-4);
}

TEST(Sun, DeclinationSolsticesAndEquinoxes) {
  double max_dec = -1.0, min_dec = 1.0, max_day = 0.0, min_day = 0.0, march = 0.0, september = 0.0;
  double previous = solar_declination_rad(1.0);
  for (double day = 1.01; day < 366.0; day += 0.01) {
    const double d = solar_declination_rad(day);
    if (d > max_dec) max_dec = d, max_day = day;
    if (d < min_dec) min_dec = d, min_day = day;
    if (previous < 0.0 && d >= 0.0) march = day;
    if (previous > 0.0 && d <= 0.0) september = day;
    previous = d;
  }
  // Solstice declination = +-obliquity (23.4393 deg, see above), to 0.01 deg (the formula's accuracy
  // is about 1 arcminute, USNO).
  EXPECT_NEAR(max_dec / degree, 23.4393, 0.01);
  EXPECT_NEAR(min_dec / degree, -23.4393, 0.01);
  // Solstices on 20-22 June (days 171-173) and 20-22 December (days 354-356); equinoxes on 20-21
  // March (days 79-80) and 22-23 September (days 265-266) (common practice).
  EXPECT_GE(max_day, 171.0);
  EXPECT_LT(max_day, 174.0);
  EXPECT_GE(min_day, 354.0);
  EXPECT_LT(min_day, 357.0);
  EXPECT_GE(march, 79.0);
  EXPECT_LT(march, 81.0);
  EXPECT_GE(september, 265.0);
  EXPECT_LT(september, 267.0);
}

TEST(Sun, DeclinationAgreesWithSpencer1971) {
  // Spencer's mean-year series (see above) against the 2001 calendar: the leap-year cycle shifts
  // the seasons by up to ~0.75 day (~0.3 deg near the equinoxes); Spencer's own fit error is quoted
  // as 0.0006 rad (from memory). Accept 0.35 deg.
  double worst = 0.0;
  for (int day = 1; day <= 365; ++day)
    worst = std::max(worst, std::abs(solar_declination_rad(day) - spencer_declination_rad(day)));
  EXPECT_LT(worst / degree, 0.35);
}

TEST(Sun, DistanceFactorPerihelionAphelion) {
  double max_f = 0.0, min_f = 2.0, max_day = 0.0, min_day = 0.0, sum = 0.0;
  int count = 0;
  for (double day = 1.0; day < 1.0 + tropical_year_days; day += 0.05) {
    const double f = earth_sun_distance_factor(day);
    if (f > max_f) max_f = f, max_day = day;
    if (f < min_f) min_f = f, min_day = day;
    sum += f;
    ++count;
  }
  // Perihelion on 2-5 January, aphelion on 3-6 July (common practice).
  EXPECT_GE(max_day, 2.0);
  EXPECT_LT(max_day, 6.0);
  EXPECT_GE(min_day, 184.0);
  EXPECT_LT(min_day, 188.0);
  // (a/r)^2 at perihelion and aphelion of a Kepler orbit: (1 -+ e)^-2 = 1.0342 and 0.9674.
  EXPECT_NEAR(max_f, 1.0 / ((1.0 - eccentricity) * (1.0 - eccentricity)), 2e-4);
  EXPECT_NEAR(min_f, 1.0 / ((1.0 + eccentricity) * (1.0 + eccentricity)), 2e-4);
  // Time mean of (a/r)^2 over an orbit = 1/sqrt(1 - e^2) (Kepler's second law; analytic).
  EXPECT_NEAR(sum / count, 1.0 / std::sqrt(1.0 - eccentricity * eccentricity), 2e-5);
  // Spencer (1971) series, an independent fit (see above): agreement to 1.5e-3.
  for (int day = 1; day <= 365; ++day)
    EXPECT_NEAR(earth_sun_distance_factor(day), spencer_distance_factor(day), 1.5e-3) << "day " << day;
}

TEST(Sun, CosZenith) {
  // Spherical astronomy: at local noon the zenith angle is |phi - delta|; at the pole the Sun
  // circles at elevation delta; morning and afternoon are symmetric about noon.
  for (const double day : {1.0, 80.0, 172.0, 266.0, 355.0}) {
    const double dec = solar_declination_rad(day);
    for (const double lat : {-60.0, 0.0, 23.0, 45.0}) {
      EXPECT_NEAR(cos_zenith(lat, day, 12.0), std::cos(lat * degree - dec), 1e-14);
      EXPECT_NEAR(cos_zenith(lat, day, 7.5), cos_zenith(lat, day, 16.5), 1e-14);
    }
    for (const double hour : {0.0, 5.0, 13.0})
      EXPECT_NEAR(cos_zenith(90.0, day, hour), std::sin(dec), 1e-15);
    // The Sun is on the horizon at the sunset hour angle: cos z = 0 there.
    const double h0 = sunset_hour_angle_rad(45.0, dec);
    EXPECT_NEAR(cos_zenith(45.0, day, 12.0 + h0 * 12.0 / pi), 0.0, 1e-14);
  }
  const SunGeometry g = instantaneous_geometry(45.0, 172.0, 3.0);
  EXPECT_LT(g.cos_zenith, 0.0); // 03:00 local solar time at 45 N in June: before sunrise
  EXPECT_EQ(g.distance_factor, earth_sun_distance_factor(172.0));
  EXPECT_EQ(g.daylight_fraction, 1.0);
}

TEST(Sun, SunsetHourAngle) {
  // Equal day and night at the equinox and on the equator: h0 = pi/2 (analytic).
  EXPECT_NEAR(sunset_hour_angle_rad(50.0, 0.0), 0.5 * pi, 1e-15);
  EXPECT_NEAR(sunset_hour_angle_rad(0.0, 0.3), 0.5 * pi, 1e-15);
  // Polar day and polar night poleward of 90 - |delta|.
  EXPECT_EQ(sunset_hour_angle_rad(70.0, obliquity), pi);
  EXPECT_EQ(sunset_hour_angle_rad(70.0, -obliquity), 0.0);
  EXPECT_EQ(sunset_hour_angle_rad(-90.0, obliquity), 0.0);
}

TEST(Sun, DailyMeanTextbookValues) {
  // Equator at equinox with (d0/d)^2 = 1: Q = S0 / pi (Hartmann, Global Physical Climatology, ch. 2; analytic).
  EXPECT_NEAR(daily_mean_insolation_w_m2(0.0, SolarPosition{0.0, 1.0}), s0 / pi, 1e-12);
  // Pole in polar day: the Sun circles at elevation delta, Q = S0 (d0/d)^2 sin(delta) (analytic).
  EXPECT_NEAR(daily_mean_insolation_w_m2(90.0, SolarPosition{obliquity, 1.0}), s0 * std::sin(obliquity), 1e-12);
  const SolarPosition june = solar_position(172.0);
  const double pole = daily_mean_insolation_w_m2(90.0, 172.0);
  EXPECT_NEAR(pole, s0 * june.distance_factor * std::sin(june.declination_rad), 1e-12);
  // At the June solstice the North Pole gets more than the equator, about S0 sin(eps) / (1 + e)^2
  // = 0.385 S0 = 524 W m-2 (Hartmann, fig. 2.6, from memory; value from the orbital elements above).
  EXPECT_GT(pole, daily_mean_insolation_w_m2(0.0, 172.0));
  EXPECT_NEAR(pole / s0, std::sin(obliquity) / ((1.0 + eccentricity) * (1.0 + eccentricity)), 1e-3);
  // The South Pole at the December solstice gets ((1 + e)/(1 - e))^2 - 1 = 6.9 % more than the North
  // Pole in June: perihelion falls in early January (analytic, from the orbital elements).
  const double ratio = daily_mean_insolation_w_m2(-90.0, 356.0) / pole;
  EXPECT_NEAR(ratio, std::pow((1.0 + eccentricity) / (1.0 - eccentricity), 2), 2e-3);
  // Polar night: nothing.
  EXPECT_EQ(daily_mean_insolation_w_m2(80.0, 355.0), 0.0);
  EXPECT_EQ(daily_mean_insolation_w_m2(-75.0, 172.0), 0.0);
  // Proportional to the solar constant.
  EXPECT_NEAR(daily_mean_insolation_w_m2(30.0, 100.0, 2.0 * s0), 2.0 * daily_mean_insolation_w_m2(30.0, 100.0), 1e-12);
}

TEST(Sun, DailyMeanAgreesWithHourAngleQuadrature) {
  for (const double day : {1.0, 46.0, 80.0, 120.0, 172.0, 230.0, 266.0, 310.0, 355.0}) {
    const SolarPosition sun = solar_position(day);
    for (const double lat : {-90.0, -80.0, -66.0, -45.0, -10.0, 0.0, 20.0, 50.0, 65.0, 67.0, 75.0, 89.0, 90.0}) {
      const Quadrature q = by_quadrature(lat, sun);
      const SunGeometry g = daily_mean_geometry(lat, day);
      EXPECT_NEAR(daily_mean_insolation_w_m2(lat, day), q.insolation, 1e-9) << lat << " deg, day " << day;
      EXPECT_NEAR(g.cos_zenith, q.mu_weighted, 1e-11) << lat << " deg, day " << day;
      // Hemispheric mirror: Q(-phi, delta) = Q(phi, -delta) (geometry).
      EXPECT_NEAR(daily_mean_insolation_w_m2(-lat, SolarPosition{-sun.declination_rad, sun.distance_factor}),
                  daily_mean_insolation_w_m2(lat, sun), 1e-10);
    }
  }
}

TEST(Sun, GlobalMeanOfDailyMeanIsQuarterOfS0) {
  // Whatever the declination, the Earth intercepts pi R^2 S0 (d0/d)^2 spread over 4 pi R^2: the
  // area mean is S0 (d0/d)^2 / 4 (analytic). Integrate in x = sin(phi), split at the polar circles.
  for (const double dec_deg : {0.0, 5.0, 12.0, -23.44, 23.44}) {
    const SolarPosition sun{dec_deg * degree, 1.02};
    auto q = [&](double x) { return daily_mean_insolation_w_m2(std::asin(x) / degree, sun); };
    const double edge = std::cos(sun.declination_rad);
    const double mean = 0.5 * (integrate(q, -1.0, -edge) + integrate(q, -edge, edge) + integrate(q, edge, 1.0));
    EXPECT_NEAR(mean / (0.25 * s0 * 1.02), 1.0, 1e-10) << "declination " << dec_deg;
  }
}

TEST(Sun, DailyMeanGeometryConservesInsolation) {
  for (double day = 1.0; day < 366.0; day += 7.3) {
    for (double lat = -90.0; lat <= 90.0; lat += 7.5) {
      const SunGeometry g = daily_mean_geometry(lat, day);
      const double q = daily_mean_insolation_w_m2(lat, day);
      EXPECT_NEAR(s0 * g.distance_factor * g.daylight_fraction * g.cos_zenith, q, 1e-12 * s0) << lat << " " << day;
      EXPECT_EQ(g.distance_factor, earth_sun_distance_factor(day));
      // Cauchy-Schwarz: the insolation-weighted mu is at least the daytime mean of mu, and the
      // effective fraction at most the sunlit fraction h0/pi (Cronin 2014; analytic).
      const double dec = solar_declination_rad(day);
      const double h0 = sunset_hour_angle_rad(lat, dec);
      EXPECT_LE(g.daylight_fraction, h0 / pi + 1e-15);
      if (h0 > 0.0) {
        const double daytime_mu = q / (s0 * g.distance_factor) * pi / h0;
        EXPECT_GE(g.cos_zenith, daytime_mu - 1e-15);
        EXPECT_LE(g.cos_zenith, 1.0);
      } else {
        EXPECT_EQ(g.cos_zenith, 0.0);
        EXPECT_EQ(g.daylight_fraction, 0.0);
      }
    }
  }
}

TEST(Sun, DailyMeanGeometryClosedForms) {
  // Equator, delta = 0: mu = cos h over |h| < pi/2, so mu_bar = (pi/4)/1 and f = 1/(pi * pi/4) (analytic).
  const SunGeometry equator = daily_mean_geometry(0.0, SolarPosition{0.0, 1.0});
  EXPECT_NEAR(equator.cos_zenith, pi / 4.0, 1e-15);
  EXPECT_NEAR(equator.daylight_fraction, 4.0 / (pi * pi), 1e-15);
  // Pole in polar day: mu = sin(delta) all day, f = 1.
  const SunGeometry pole = daily_mean_geometry(90.0, SolarPosition{obliquity, 1.0});
  EXPECT_NEAR(pole.cos_zenith, std::sin(obliquity), 1e-15);
  EXPECT_NEAR(pole.daylight_fraction, 1.0, 1e-15);
  // Just short of polar night, h0 = 1e-3: mu = b (cos h - cos h0) gives to leading order
  // mu_bar = (2/5) b h0^2 and f = (5/(6 pi)) h0 (Taylor expansion of the closed forms; analytic).
  const double lat = 60.0, h0 = 1e-3;
  const double dec = std::atan(-std::cos(h0) / std::tan(lat * degree));
  EXPECT_NEAR(sunset_hour_angle_rad(lat, dec), h0, 1e-9);
  const SunGeometry edge = daily_mean_geometry(lat, SolarPosition{dec, 1.0});
  const double b = std::cos(lat * degree) * std::cos(dec);
  EXPECT_NEAR(edge.cos_zenith / (0.4 * b * h0 * h0), 1.0, 1e-5);
  EXPECT_NEAR(edge.daylight_fraction / (5.0 / (6.0 * pi) * h0), 1.0, 1e-5);
  // Polar night.
  const SunGeometry night = daily_mean_geometry(-80.0, 172.0);
  EXPECT_EQ(night.cos_zenith, 0.0);
  EXPECT_EQ(night.daylight_fraction, 0.0);
}

TEST(Sun, AnnualMeanAnalyticValues) {
  const double kepler = 1.0 / std::sqrt(1.0 - eccentricity * eccentricity);
  // Pole: for a circular orbit sin(delta) = sin(eps) sin(lambda), Q = S0 max(0, sin(delta)), whose
  // mean over lambda is S0 sin(eps) / pi; Kepler's second law multiplies every annual mean by
  // 1/sqrt(1 - e^2) (Berger 1978; analytic).
  EXPECT_NEAR(annual_mean_insolation_w_m2(90.0) / (s0 * std::sin(obliquity) / pi * kepler), 1.0, 1e-4);
  EXPECT_NEAR(annual_mean_insolation_w_m2(-90.0) / (s0 * std::sin(obliquity) / pi * kepler), 1.0, 1e-4);
  // Equator: Q = (S0/pi) cos(delta), and the mean over lambda of sqrt(1 - sin^2(eps) sin^2(lambda))
  // is (2/pi) E(sin eps), the complete elliptic integral of the second kind (analytic).
  const double equator = 2.0 * s0 / (pi * pi) * boost::math::ellint_2(std::sin(obliquity)) * kepler;
  EXPECT_NEAR(annual_mean_insolation_w_m2(0.0) / equator, 1.0, 1e-4);
  // Annual insolation is the same at phi and -phi (Kepler's second law; Berger 1978): the orbit's
  // eccentricity cancels over the year. The formulas keep terms to e^2: e^3 ~ 5e-6.
  for (const double lat : {15.0, 40.0, 66.0, 75.0, 89.0})
    EXPECT_NEAR(annual_mean_insolation_w_m2(-lat) / annual_mean_insolation_w_m2(lat), 1.0, 2e-5) << lat;
  // Proportional to the solar constant.
  EXPECT_NEAR(annual_mean_insolation_w_m2(45.0, 0.5 * s0), 0.5 * annual_mean_insolation_w_m2(45.0), 1e-12);
}

TEST(Sun, GlobalMeanOfAnnualMeanIsQuarterOfS0) {
  // S0/4 times the annual mean of (d0/d)^2, 1/sqrt(1 - e^2) (analytic); the issue asks for S0/4 to 0.1 %.
  // The annual mean is smooth in x = sin(phi) apart from the polar circles: split there.
  auto q = [](double x) { return annual_mean_insolation_w_m2(std::asin(x) / degree); };
  auto part = [&](double a, double b) {
    return boost::math::quadrature::gauss_kronrod<double, 31>::integrate(q, a, b, 3, 1e-9);
  };
  const double edge = std::cos(obliquity);
  const double mean = 0.5 * (part(-1.0, -edge) + part(-edge, edge) + part(edge, 1.0));
  EXPECT_NEAR(mean / (0.25 * s0), 1.0, 1e-3);
  EXPECT_NEAR(mean / (0.25 * s0 / std::sqrt(1.0 - eccentricity * eccentricity)), 1.0, 2e-5);
}

TEST(Sun, AnnualMeanGeometryConservesInsolation) {
  for (const double lat : {-90.0, -70.0, -30.0, 0.0, 45.0, 80.0, 90.0}) {
    const SunGeometry g = annual_mean_geometry(lat);
    EXPECT_NEAR(s0 * g.distance_factor * g.daylight_fraction * g.cos_zenith, annual_mean_insolation_w_m2(lat),
                1e-12 * s0)
        << lat;
    EXPECT_GT(g.cos_zenith, 0.0);
    EXPECT_LE(g.cos_zenith, 1.0);
    EXPECT_GT(g.daylight_fraction, 0.0);
    EXPECT_LE(g.daylight_fraction, 1.0);
    // Time mean of (d0/d)^2 over the year = 1/sqrt(1 - e^2) (analytic).
    EXPECT_NEAR(g.distance_factor, 1.0 / std::sqrt(1.0 - eccentricity * eccentricity), 2e-5);
  }
}

TEST(Sun, BadInputNamesTheItem) {
  auto message = [](auto&& call) -> std::string {
    try {
      call();
    } catch (const InputError& e) {
      return e.what();
    }
    return "no error";
  };
  const double nan = std::nan("");
  EXPECT_NE(message([] { (void)solar_position(0.5); }).find("day_of_year"), std::string::npos);
  EXPECT_NE(message([] { (void)solar_position(367.0); }).find("day_of_year"), std::string::npos);
  EXPECT_NE(message([&] { (void)solar_declination_rad(nan); }).find("day_of_year"), std::string::npos);
  EXPECT_NE(message([] { (void)cos_zenith(91.0, 10.0, 12.0); }).find("latitude_deg"), std::string::npos);
  EXPECT_NE(message([] { (void)cos_zenith(10.0, 10.0, 24.5); }).find("local_solar_time_h"), std::string::npos);
  EXPECT_NE(message([&] { (void)daily_mean_insolation_w_m2(nan, 10.0); }).find("latitude_deg"), std::string::npos);
  EXPECT_NE(message([] { (void)daily_mean_insolation_w_m2(10.0, 10.0, -1.0); }).find("solar_constant_w_m2"),
            std::string::npos);
  EXPECT_NE(message([] {
              (void)daily_mean_geometry(10.0, SolarPosition{2.0, 1.0});
            }).find("declination_rad"),
            std::string::npos);
  EXPECT_NE(message([] {
              (void)daily_mean_geometry(10.0, SolarPosition{0.1, 0.0});
            }).find("distance_factor"),
            std::string::npos);
  EXPECT_NE(message([] { (void)annual_mean_insolation_w_m2(-90.5); }).find("latitude_deg"), std::string::npos);
  EXPECT_NE(message([&] { (void)sunset_hour_angle_rad(0.0, nan); }).find("declination_rad"), std::string::npos);
}

} // namespace
