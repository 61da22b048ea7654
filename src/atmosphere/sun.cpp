#include "bandstack/atmosphere/sun.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <cmath>
#include <string>

namespace bandstack::atmosphere {

namespace {

constexpr double pi = constants::pi;
constexpr double degree = pi / 180.0;

[[noreturn]] void bad(const char* item, const std::string& message) { throw InputError(InputPlace::of(item), message); }

void check_day(double day_of_year) {
  if (!std::isfinite(day_of_year) || day_of_year < 1.0 || day_of_year >= 367.0)
    bad("day_of_year", "must be finite and in [1, 367), got " + std::to_string(day_of_year));
}

void check_latitude(double latitude_deg) {
  if (!std::isfinite(latitude_deg) || latitude_deg < -90.0 || latitude_deg > 90.0)
    bad("latitude_deg", "must be finite and in [-90, 90] degrees, got " + std::to_string(latitude_deg));
}

void check_sun(const SolarPosition& sun) {
  if (!std::isfinite(sun.declination_rad) || std::abs(sun.declination_rad) > 0.5 * pi)
    bad("declination_rad", "must be finite and in [-pi/2, pi/2], got " + std::to_string(sun.declination_rad));
  if (!std::isfinite(sun.distance_factor) || !(sun.distance_factor > 0.0))
    bad("distance_factor", "must be finite and > 0, got " + std::to_string(sun.distance_factor));
}

void check_solar_constant(double solar_constant_w_m2) {
  if (!std::isfinite(solar_constant_w_m2) || solar_constant_w_m2 < 0.0)
    bad("solar_constant_w_m2", "must be finite and >= 0 W m-2, got " + std::to_string(solar_constant_w_m2));
}

// sin and cos of the latitude, exact at the poles (std::cos(pi/2) is 6e-17, not 0).
struct Latitude {
  double sin, cos;
};
Latitude latitude_of(double latitude_deg) {
  if (std::abs(latitude_deg) == 90.0) return {std::copysign(1.0, latitude_deg), 0.0};
  return {std::sin(latitude_deg * degree), std::cos(latitude_deg * degree)};
}

// Integrals over the sunlit half-day of mu = a + b cos h, a = sin(phi) sin(delta), b = cos(phi) cos(delta):
// i1 = integral_0^h0 mu dh, i2 = integral_0^h0 mu^2 dh.
struct SunlitIntegrals {
  double h0, i1, i2;
};

// Between sunrise and sunset a = -b cos h0, so mu = b (cos h - cos h0) and
//   i1 = b (sin h0 - h0 cos h0),  i2 = b^2 (h0 (1/2 + cos^2 h0) - 3/2 sin h0 cos h0).
// Both brackets cancel to O(h0^3) and O(h0^5) near the edge of polar night, where the ratio i2/i1
// would be rounding noise; there the Taylor series are summed instead:
//   sin x - x cos x          = sum_{k>=1} (-1)^(k+1) 2k x^(2k+1) / (2k+1)!
//   x (1/2 + cos^2 x) - 3/4 sin 2x = 1/4 sum_{k>=2} (-1)^k (2k-2) (2x)^(2k+1) / (2k+1)!
double bracket1(double x) {
  if (x > 0.5) return std::sin(x) - x * std::cos(x);
  double sum = 0.0, power = x, factorial = 1.0, sign = 1.0;
  for (int k = 1; k <= 10; ++k) {
    power *= x * x;
    factorial *= (2.0 * k) * (2.0 * k + 1.0);
    sum += sign * 2.0 * k * power / factorial;
    sign = -sign;
  }
  return sum;
}
double bracket2(double x) {
  if (x > 0.5) return x * (0.5 + std::cos(x) * std::cos(x)) - 1.5 * std::sin(x) * std::cos(x);
  const double y = 2.0 * x;
  double sum = 0.0, power = y * y * y, factorial = 6.0, sign = 1.0;
  for (int k = 2; k <= 12; ++k) {
    power *= y * y;
    factorial *= (2.0 * k) * (2.0 * k + 1.0);
    sum += sign * (2.0 * k - 2.0) * power / factorial;
    sign = -sign;
  }
  return 0.25 * sum;
}

SunlitIntegrals sunlit_integrals(const Latitude& lat, double declination_rad) {
  const double a = lat.sin * std::sin(declination_rad);
  const double b = lat.cos * std::cos(declination_rad);
  if (a <= -b) return {0.0, 0.0, 0.0};                         // polar night
  if (a >= b) return {pi, pi * a, pi * (a * a + 0.5 * b * b)}; // polar day
  const double h0 = std::acos(-a / b);
  return {h0, b * bracket1(h0), b * b * bracket2(h0)};
}

double hour_angle_rad(double local_solar_time_h) {
  if (!std::isfinite(local_solar_time_h) || local_solar_time_h < 0.0 || local_solar_time_h > 24.0)
    bad("local_solar_time_h", "must be finite and in [0, 24] hours, got " + std::to_string(local_solar_time_h));
  return (local_solar_time_h - 12.0) * pi / 12.0;
}

// The midpoint nodes of the annual means: 4 per day over one tropical year from day 1.0.
constexpr int annual_nodes = 1461;
double annual_node_day(int i) { return 1.0 + (i + 0.5) * tropical_year_days / annual_nodes; }

} // namespace

SolarPosition solar_position(double day_of_year) {
  check_day(day_of_year);
  // The Astronomical Almanac, low-precision formulas for the Sun (from memory): n days from J2000.0
  // (2000 January 1, 12h); 2001 January 1, 0h UT is n = 365.5. Angles in degrees.
  const double n = 365.5 + (day_of_year - 1.0);
  const double mean_longitude = 280.460 + 0.9856474 * n;
  const double mean_anomaly = (357.528 + 0.9856003 * n) * degree;
  const double ecliptic_longitude =
      (mean_longitude + 1.915 * std::sin(mean_anomaly) + 0.020 * std::sin(2.0 * mean_anomaly)) * degree;
  const double obliquity = (23.439 - 0.0000004 * n) * degree;
  const double distance_au = 1.00014 - 0.01671 * std::cos(mean_anomaly) - 0.00014 * std::cos(2.0 * mean_anomaly);
  return {std::asin(std::sin(obliquity) * std::sin(ecliptic_longitude)), 1.0 / (distance_au * distance_au)};
}

double solar_declination_rad(double day_of_year) { return solar_position(day_of_year).declination_rad; }

double earth_sun_distance_factor(double day_of_year) { return solar_position(day_of_year).distance_factor; }

double cos_zenith(double latitude_deg, const SolarPosition& sun, double local_solar_time_h) {
  check_latitude(latitude_deg);
  check_sun(sun);
  const double h = hour_angle_rad(local_solar_time_h);
  const Latitude lat = latitude_of(latitude_deg);
  return lat.sin * std::sin(sun.declination_rad) + lat.cos * std::cos(sun.declination_rad) * std::cos(h);
}

double cos_zenith(double latitude_deg, double day_of_year, double local_solar_time_h) {
  return cos_zenith(latitude_deg, solar_position(day_of_year), local_solar_time_h);
}

SunGeometry instantaneous_geometry(double latitude_deg, double day_of_year, double local_solar_time_h) {
  const SolarPosition sun = solar_position(day_of_year);
  return {cos_zenith(latitude_deg, sun, local_solar_time_h), sun.distance_factor, 1.0};
}

double sunset_hour_angle_rad(double latitude_deg, double declination_rad) {
  check_latitude(latitude_deg);
  check_sun({declination_rad, 1.0});
  return sunlit_integrals(latitude_of(latitude_deg), declination_rad).h0;
}

double daily_mean_insolation_w_m2(double latitude_deg, const SolarPosition& sun, double solar_constant_w_m2) {
  check_latitude(latitude_deg);
  check_sun(sun);
  check_solar_constant(solar_constant_w_m2);
  // (1/2pi) integral over the day of S0 (d0/d)^2 max(0, mu) dh = (S0/pi) (d0/d)^2 i1.
  const SunlitIntegrals s = sunlit_integrals(latitude_of(latitude_deg), sun.declination_rad);
  return solar_constant_w_m2 / pi * sun.distance_factor * s.i1;
}

double daily_mean_insolation_w_m2(double latitude_deg, double day_of_year, double solar_constant_w_m2) {
  return daily_mean_insolation_w_m2(latitude_deg, solar_position(day_of_year), solar_constant_w_m2);
}

SunGeometry daily_mean_geometry(double latitude_deg, const SolarPosition& sun) {
  check_latitude(latitude_deg);
  check_sun(sun);
  const SunlitIntegrals s = sunlit_integrals(latitude_of(latitude_deg), sun.declination_rad);
  if (!(s.i1 > 0.0) || !(s.i2 > 0.0)) return {0.0, sun.distance_factor, 0.0};
  // mu_bar = i2/i1 and f = i1^2 / (pi i2), so that f mu_bar = i1 / pi: the insolation is conserved.
  return {s.i2 / s.i1, sun.distance_factor, s.i1 * s.i1 / (pi * s.i2)};
}

SunGeometry daily_mean_geometry(double latitude_deg, double day_of_year) {
  return daily_mean_geometry(latitude_deg, solar_position(day_of_year));
}

double annual_mean_insolation_w_m2(double latitude_deg, double solar_constant_w_m2) {
  check_latitude(latitude_deg);
  check_solar_constant(solar_constant_w_m2);
  const Latitude lat = latitude_of(latitude_deg);
  double sum = 0.0;
  for (int i = 0; i < annual_nodes; ++i) {
    const SolarPosition sun = solar_position(annual_node_day(i));
    sum += sun.distance_factor * sunlit_integrals(lat, sun.declination_rad).i1;
  }
  return solar_constant_w_m2 / pi * sum / annual_nodes;
}

SunGeometry annual_mean_geometry(double latitude_deg) {
  check_latitude(latitude_deg);
  const Latitude lat = latitude_of(latitude_deg);
  // Sums over the nodes of (d0/d)^2, (d0/d)^2 i1 and (d0/d)^2 i2: the weights of the instantaneous
  // insolation S0 (d0/d)^2 mu over the year.
  double factor_sum = 0.0, i1_sum = 0.0, i2_sum = 0.0;
  for (int i = 0; i < annual_nodes; ++i) {
    const SolarPosition sun = solar_position(annual_node_day(i));
    const SunlitIntegrals s = sunlit_integrals(lat, sun.declination_rad);
    factor_sum += sun.distance_factor;
    i1_sum += sun.distance_factor * s.i1;
    i2_sum += sun.distance_factor * s.i2;
  }
  const double mean_factor = factor_sum / annual_nodes;
  if (!(i1_sum > 0.0) || !(i2_sum > 0.0)) return {0.0, mean_factor, 0.0};
  const double mu_bar = i2_sum / i1_sum;
  const double mean_i1_over_pi = i1_sum / annual_nodes / pi; // annual mean insolation / S0
  return {mu_bar, mean_factor, mean_i1_over_pi / (mean_factor * mu_bar)};
}

} // namespace bandstack::atmosphere
