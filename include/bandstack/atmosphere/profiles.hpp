#pragma once
// Built-in atmospheric columns from published formulas (no data files). These are idealised
// scenarios for exploring mechanisms, not reproductions of any published profile dataset:
//   us_standard_1976      U.S. Standard Atmosphere 1976 temperature (us_standard_1976.hpp)
//   tropical              saturated pseudo-adiabat from 300 K to a 195 K cold-point tropopause
//   midlatitude_summer    6.0 K/km from 294 K to a 217 K tropopause near 13 km
//   high_latitude_winter  250 K surface, +10 K inversion, 6.5 K/km to 220 K, cold stratosphere
// Every profile is a troposphere curve T_trop(p) from the surface up to the tropopause, where it
// first meets the profile's stratosphere curve T_strat(p), a fixed function of pressure. Changing
// the surface temperature moves the troposphere and the tropopause; the stratosphere stays.
// Water: Manabe & Wetherald (1967) relative humidity (humidity_profile.hpp). Ozone: Green (1964)
// form (ozone.hpp). CO2, CH4, N2O: well mixed.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/grid.hpp"

namespace bandstack::atmosphere {

enum class Profile { us_standard_1976, tropical, midlatitude_summer, high_latitude_winter };

// "us_standard_1976", "tropical", "midlatitude_summer", "high_latitude_winter"; nullopt otherwise.
[[nodiscard]] std::optional<Profile> profile_from_name(std::string_view name) noexcept;
[[nodiscard]] std::string_view profile_name(Profile profile) noexcept;
// The profile's own surface air temperature, K: 288.15, 300, 294, 250.
[[nodiscard]] double default_surface_temperature_k(Profile profile) noexcept;

struct ProfileSettings {
  Profile profile = Profile::us_standard_1976;
  // If set, replaces the profile's surface air temperature (K); the troposphere moves with it,
  // the stratosphere stays. Must exceed the profile's tropopause temperature.
  std::optional<double> surface_temperature_k;
  // RH_s of Manabe & Wetherald (1967), 0.77 (from memory).
  double surface_relative_humidity = 0.77;
  // Water-vapour mole fraction above the tropopause and lower bound below it: 4 ppmv, inside the
  // 3.5-4.5 ppmv of lower-stratospheric water observed by balloon and satellite (SPARC 2000
  // assessment of upper tropospheric and stratospheric water vapour, WCRP-113; from memory).
  double stratospheric_h2o_mole_fraction = 4e-6;
  // Well-mixed gases, mol/mol: invented round demonstration values typical of the present day
  // (common practice), near the NOAA global-mean surface records of the mid-2010s (CO2 ~400 ppm
  // in 2015, CH4 ~1.8 ppm, N2O ~0.32-0.33 ppm; from memory).
  double co2_mole_fraction = 400e-6;
  double ch4_mole_fraction = 1.8e-6;
  double n2o_mole_fraction = 0.32e-6;
  // Multiplies the analytic ozone profile (1 = 400 Dobson units for a sea-level surface).
  double ozone_scale = 1.0;
  double surface_emissivity = 1.0;
  double surface_albedo = 0.3;
};

// The temperature structure a profile takes for given settings and surface pressure.
struct TemperatureStructure {
  Profile profile = Profile::us_standard_1976;
  double surface_pressure_pa = 101325.0;
  double surface_temperature_k = 288.15;     // surface air temperature
  double tropopause_pressure_pa = 22632.06;  // where the troposphere curve meets the stratosphere curve
  double tropopause_temperature_k = 216.65;
};

// Solves for the tropopause. Throws InputError (item "surface_temperature") if the surface
// temperature is not finite, outside 150-330 K, or not above the stratosphere curve at the
// surface (the profile's tropopause temperature); item "surface_pressure" if p_s is not > 0.
[[nodiscard]] TemperatureStructure temperature_structure(const ProfileSettings& settings,
                                                         double surface_pressure_pa);

// Air temperature (K) at a pressure (Pa, > 0) for a solved structure: the troposphere curve at and
// below the tropopause (p >= p_tropopause), the stratosphere curve above.
[[nodiscard]] double temperature_at_pressure_k(const TemperatureStructure& structure, double pressure_pa);

// The same for many pressures (Pa, any order), evaluated together: the moist adiabat is integrated
// once from the surface through the sorted pressures instead of once per pressure. Agrees with
// temperature_at_pressure_k to ~1e-6 K. Throws InputError for a pressure that is not > 0.
[[nodiscard]] std::vector<double> temperatures_at_pressures_k(const TemperatureStructure& structure,
                                                              const std::vector<double>& pressure_pa);

// A complete column: levels from `grid`; temperatures at levels and layers (layer pressure = mean
// of its two levels) from the profile; water, ozone and well-mixed gases per layer; surface
// temperature = surface air temperature; emissivity and albedo from settings. `name` defaults to
// profile_name(). Calls validate(); throws InputError naming the offending setting.
[[nodiscard]] Column make_column(const ProfileSettings& settings, const GridSpec& grid, std::string name = "");

} // namespace bandstack::atmosphere
