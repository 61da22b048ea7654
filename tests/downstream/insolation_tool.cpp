// Prints solar geometry and insolation for downstream checks, for a fixed table of latitudes and
// days of the year (17 significant digits; latitude in degrees, declination in radians, insolation
// in W m-2 for the default total solar irradiance, printed on the first line). Rows:
//   daily  latitude_deg day_of_year declination_rad distance_factor insolation_w_m2 cos_zenith daylight_fraction
//   annual latitude_deg - - distance_factor insolation_w_m2 cos_zenith daylight_fraction
// where cos_zenith, distance_factor and daylight_fraction are the fields of daily_mean_geometry and
// annual_mean_geometry. Exit code 0 ok, 2 bad input (message on standard error).
#include "bandstack/atmosphere/sun.hpp"
#include "bandstack/core/error.hpp"

#include <cstdio>
#include <fmt/format.h>

int main(int argc, char**) {
  if (argc != 1) {
    std::fprintf(stderr, "usage: insolation_tool\n");
    return 2;
  }
  namespace ba = bandstack::atmosphere;
  const double latitudes[] = {-90.0, -89.5, -80.0, -66.56, -60.0, -45.0, -30.0, -15.0, 0.0,
                              10.0,  23.44, 40.0,  55.0,   66.56, 70.0,  80.0,  89.9,  90.0};
  const double days[] = {1.0,   3.5,   32.0,  60.0,  79.56, 80.0,  105.0, 135.0, 172.0,
                         172.3, 200.0, 229.0, 266.0, 300.0, 330.0, 355.8, 365.0, 366.9};
  try {
    fmt::print("solar_constant_w_m2 {:.17g}\n", ba::total_solar_irradiance_w_m2);
    fmt::print("kind latitude_deg day_of_year declination_rad distance_factor insolation_w_m2 cos_zenith "
               "daylight_fraction\n");
    for (const double lat : latitudes) {
      for (const double day : days) {
        const ba::SolarPosition sun = ba::solar_position(day);
        const ba::SunGeometry g = ba::daily_mean_geometry(lat, day);
        fmt::print("daily {:.17g} {:.17g} {:.17g} {:.17g} {:.17g} {:.17g} {:.17g}\n", lat, day, sun.declination_rad,
                   g.distance_factor, ba::daily_mean_insolation_w_m2(lat, day), g.cos_zenith, g.daylight_fraction);
      }
    }
    for (const double lat : latitudes) {
      const ba::SunGeometry g = ba::annual_mean_geometry(lat);
      fmt::print("annual {:.17g} - - {:.17g} {:.17g} {:.17g} {:.17g}\n", lat, g.distance_factor,
                 ba::annual_mean_insolation_w_m2(lat), g.cos_zenith, g.daylight_fraction);
    }
  } catch (const bandstack::InputError& e) {
    std::fprintf(stderr, "insolation_tool: %s\n", e.what());
    return 2;
  }
  return 0;
}
