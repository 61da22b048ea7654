#pragma once
// Where the Sun is and how much sunlight reaches the top of the atmosphere: solar declination and
// Earth-Sun distance by day of the year, the solar zenith angle, and daily- and annual-mean
// insolation with the insolation-weighted zenith angle.
//
// Day of the year: 1.0 is 1 January 00:00 UT, fractional values allowed, of the calendar year 2001
// (a common year; in other years the seasons fall up to about 0.75 day earlier or later, i.e. up
// to 0.3 degree of declination near the equinoxes). Accepted range [1, 367).
// Solar position: the low-precision formulas for the Sun of The Astronomical Almanac (U.S. Naval
// Observatory, "Approximate solar coordinates": about 1 arcminute within two centuries of 2000).
// Distances are in units of the astronomical unit, the mean Earth-Sun distance to which the total
// solar irradiance refers.
#include "bandstack/atmosphere/column.hpp"

namespace bandstack::atmosphere {

// Total solar irradiance at 1 AU, W m-2: Kopp & Lean (2011, Geophys. Res. Lett. 38, L01706) give
// 1360.8 +- 0.5 W m-2 near solar minimum (from memory); 1361 W m-2 is also the IAU 2015
// Resolution B3 nominal value (from memory).
inline constexpr double total_solar_irradiance_w_m2 = 1361.0;

// Effective temperature of the Sun, K: IAU 2015 Resolution B3 nominal value (from memory).
inline constexpr double solar_effective_temperature_k = 5772.0;

// Length of the tropical year in days (common practice; 365.2422 d): the period over which
// annual means are taken, starting at day 1.0.
inline constexpr double tropical_year_days = 365.2422;

// Declination of the Sun and the Earth-Sun distance factor at one moment.
struct SolarPosition {
  double declination_rad = 0.0; // angle of the Sun north of the equatorial plane, radians
  double distance_factor = 1.0; // (d0 / d)^2, d0 = 1 AU (mean distance), d = actual distance
};

// Solar declination (radians) and distance factor (d0/d)^2 for a day of the year (see above).
// Throws InputError (item "day_of_year") unless day_of_year is finite and in [1, 367).
// Example: solar_position(172.0) gives a declination near +0.409 rad (23.44 deg) and a distance
// factor near 0.968 (the Earth is near aphelion in early July).
[[nodiscard]] SolarPosition solar_position(double day_of_year);
[[nodiscard]] double solar_declination_rad(double day_of_year);
[[nodiscard]] double earth_sun_distance_factor(double day_of_year);

// Cosine of the solar zenith angle, cos z = sin(phi) sin(delta) + cos(phi) cos(delta) cos(h), with
// the hour angle h = (local_solar_time_h - 12) * pi / 12. Negative values mean the Sun is below
// the horizon; they are returned as they are. latitude_deg in [-90, 90] (north positive),
// local_solar_time_h in [0, 24]. Throws InputError naming the item out of range.
[[nodiscard]] double cos_zenith(double latitude_deg, double day_of_year, double local_solar_time_h);
[[nodiscard]] double cos_zenith(double latitude_deg, const SolarPosition& sun, double local_solar_time_h);

// The Sun at one moment as a column sees it: cos_zenith from cos_zenith() (may be <= 0: night),
// the distance factor of the day and daylight_fraction = 1.
[[nodiscard]] SunGeometry instantaneous_geometry(double latitude_deg, double day_of_year, double local_solar_time_h);

// Sunset hour angle h0 in [0, pi] radians: cos h0 = -tan(phi) tan(delta), 0 in polar night and pi
// in polar day. The Sun is up for the fraction h0 / pi of the day.
[[nodiscard]] double sunset_hour_angle_rad(double latitude_deg, double declination_rad);

// Daily-mean insolation on a horizontal surface at the top of the atmosphere, W m-2:
//   Q = (S0 / pi) (d0/d)^2 (h0 sin(phi) sin(delta) + cos(phi) cos(delta) sin(h0))
// (Berger 1978, J. Atmos. Sci. 35, 2362-2367; Hartmann, Global Physical Climatology, ch. 2; from
// memory), with h0 the sunset hour angle: 0 in polar night, Q = S0 (d0/d)^2 sin(phi) sin(delta) in
// polar day. solar_constant_w_m2 >= 0 is the irradiance at 1 AU. Throws InputError naming the item.
// Example: at the equator with delta = 0 and (d0/d)^2 = 1, Q = S0 / pi = 433.2 W m-2.
[[nodiscard]] double daily_mean_insolation_w_m2(double latitude_deg, double day_of_year,
                                                double solar_constant_w_m2 = total_solar_irradiance_w_m2);
[[nodiscard]] double daily_mean_insolation_w_m2(double latitude_deg, const SolarPosition& sun,
                                                double solar_constant_w_m2 = total_solar_irradiance_w_m2);

// The Sun of a daily mean as a column sees it (Cronin 2014, J. Atmos. Sci. 71, 2994-3003, from
// memory): cos_zenith is the insolation-weighted mean mu = integral(mu^2 dh) / integral(mu dh) over
// the sunlit hours; daylight_fraction is the effective fraction that conserves the daily-mean
// insolation, so that S0 * distance_factor * daylight_fraction * cos_zenith equals
// daily_mean_insolation_w_m2(latitude, day, S0). It is at most the sunlit fraction h0 / pi
// (equal only in polar day). Polar night gives cos_zenith = 0 and daylight_fraction = 0.
// Example: equator, delta = 0: cos_zenith = pi / 4, daylight_fraction = 4 / pi^2.
[[nodiscard]] SunGeometry daily_mean_geometry(double latitude_deg, double day_of_year);
[[nodiscard]] SunGeometry daily_mean_geometry(double latitude_deg, const SolarPosition& sun);

// Annual-mean insolation at the top of the atmosphere, W m-2: the mean of the daily means over one
// tropical year from day 1.0, by the midpoint rule with 4 nodes per day (1461 nodes; periodic
// integrand, error below 1e-6 relative at any latitude).
[[nodiscard]] double annual_mean_insolation_w_m2(double latitude_deg,
                                                 double solar_constant_w_m2 = total_solar_irradiance_w_m2);

// The Sun of an annual mean as a column sees it, on the same nodes: cos_zenith is insolation-weighted
// over the year, distance_factor the time mean of (d0/d)^2, and daylight_fraction conserves the
// annual-mean insolation: S0 * distance_factor * daylight_fraction * cos_zenith equals
// annual_mean_insolation_w_m2(latitude, S0).
[[nodiscard]] SunGeometry annual_mean_geometry(double latitude_deg);

} // namespace bandstack::atmosphere
