// Temperature structure of the built-in profiles. Design (bandstack's own, documented in
// profiles.hpp): a troposphere curve from the surface meets a fixed stratosphere curve; the
// tropopause is their first crossing above the surface. The stratosphere curves are piecewise
// linear in the U.S. Standard Atmosphere 1976 geopotential height of the pressure, z_US(p), a
// monotone relabelling of pressure, so that every profile joins the 1976 standard aloft (from
// 32 km, or 71 km for high_latitude_winter).
#include "bandstack/atmosphere/profiles.hpp"

#include <algorithm>
#include <array>
#include <numeric>
#include <cmath>
#include <span>
#include <string>

#include "bandstack/atmosphere/us_standard_1976.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/lapse_rate.hpp"

namespace bandstack::atmosphere {

namespace us = us_standard_1976;

namespace {

struct Node {
  double z_us_km;
  double temperature_k;
};

// U.S. Standard Atmosphere 1976, Table 4 (from memory): exact T_M at its base heights, held
// constant below 11 km (the tropopause temperature) and above 84.852 km.
constexpr std::array<Node, 7> us1976_nodes{{{11.0, 216.65},
                                            {20.0, 216.65},
                                            {32.0, 228.65},
                                            {47.0, 270.65},
                                            {51.0, 270.65},
                                            {71.0, 214.65},
                                            {84.852, 186.946}}};

// Tropical: 195 K cold point. The observed tropical cold-point tropopause is near 190 K at about
// 17 km / 90 hPa (Seidel et al. 2001, J. Geophys. Res. 106, 7857; from memory); 195 K is a round,
// slightly warmer choice that the 300 K pseudo-adiabat meets near 110 hPa. Isothermal up to
// z_US = 18 km (~73 hPa) so a warmer surface still meets it, then warming linearly to the 1976
// standard at 32 km (~2.4 K/km), then the standard.
constexpr std::array<Node, 6> tropical_nodes{{{18.0, 195.0},
                                              {32.0, 228.65},
                                              {47.0, 270.65},
                                              {51.0, 270.65},
                                              {71.0, 214.65},
                                              {84.852, 186.946}}};

// Mid-latitude summer: 217 K tropopause (near 13 km with the 6.0 K/km troposphere from 294 K),
// isothermal to z_US = 20 km, then linear to the standard at 32 km, then the standard.
constexpr std::array<Node, 6> midlatitude_summer_nodes{{{20.0, 217.0},
                                                        {32.0, 228.65},
                                                        {47.0, 270.65},
                                                        {51.0, 270.65},
                                                        {71.0, 214.65},
                                                        {84.852, 186.946}}};

// High-latitude winter: 220 K tropopause, a stratosphere cooling to 208 K at z_US = 25 km (the
// cold polar-night lower stratosphere), warming to 250 K at 50 km, then the 1976 mesosphere.
// Invented idealised shape (bandstack's own choice), not fitted to any dataset.
constexpr std::array<Node, 6> high_latitude_winter_nodes{{{12.0, 220.0},
                                                          {25.0, 208.0},
                                                          {35.0, 212.0},
                                                          {50.0, 250.0},
                                                          {71.0, 214.65},
                                                          {84.852, 186.946}}};

std::span<const Node> stratosphere_nodes(Profile profile) {
  switch (profile) {
  case Profile::us_standard_1976: return us1976_nodes;
  case Profile::tropical: return tropical_nodes;
  case Profile::midlatitude_summer: return midlatitude_summer_nodes;
  case Profile::high_latitude_winter: return high_latitude_winter_nodes;
  }
  throw InternalError("stratosphere_nodes: unknown profile");
}

double stratosphere_temperature_k(Profile profile, double pressure_pa) {
  const std::span<const Node> nodes = stratosphere_nodes(profile);
  const double z_km = us::geopotential_height_m(pressure_pa) / 1000.0;
  if (z_km <= nodes.front().z_us_km) return nodes.front().temperature_k;
  for (std::size_t i = 1; i < nodes.size(); ++i) {
    if (z_km <= nodes[i].z_us_km) {
      const Node& a = nodes[i - 1];
      const Node& b = nodes[i];
      return a.temperature_k + (b.temperature_k - a.temperature_k) * (z_km - a.z_us_km) / (b.z_us_km - a.z_us_km);
    }
  }
  return nodes.back().temperature_k;
}

// A constant lapse rate (K per geopotential metre, positive = cooling with height) through
// (t0, p0) is a power law in pressure: T = t0 (p/p0)^(R* Γ / (g0 M0)), with the 1976 constants.
double constant_lapse_temperature_k(double t0_k, double p0_pa, double lapse_k_m, double p_pa) {
  const double exponent = us::gas_constant_j_mol_k * lapse_k_m / (us::gravity_m_s2 * us::molar_mass_air_kg_mol);
  return t0_k * std::pow(p_pa / p0_pa, exponent);
}

// Mid-latitude summer lapse rate: 6.0 K/km, a bandstack choice that puts the 217 K tropopause
// near 13 km above a 294 K surface, as in common mid-latitude summer climatology (from memory).
constexpr double midlatitude_summer_lapse_k_m = 0.0060;
// High-latitude winter: surface-based inversion of +10 K over the lowest 10 % of the surface
// pressure (about 100 hPa at sea level), then 6.5 K/km. Invented idealised shape: Arctic winter
// soundings show inversions of ~10 K over the lowest 1-1.5 km (e.g. Serreze et al. 1992,
// J. Climate 5; from memory).
constexpr double inversion_strength_k = 10.0;
constexpr double inversion_depth_fraction = 0.10;

double troposphere_temperature_k(Profile profile, double ts_k, double ps_pa, double p_pa) {
  switch (profile) {
  case Profile::us_standard_1976:
    return constant_lapse_temperature_k(ts_k, ps_pa, us::tropospheric_lapse_rate_k_m, p_pa);
  case Profile::tropical: return thermo::moist_pseudoadiabat_temperature_k(ts_k, ps_pa, p_pa);
  case Profile::midlatitude_summer:
    return constant_lapse_temperature_k(ts_k, ps_pa, midlatitude_summer_lapse_k_m, p_pa);
  case Profile::high_latitude_winter: {
    const double p_top = ps_pa * (1.0 - inversion_depth_fraction);
    const double t_top = ts_k + inversion_strength_k;
    if (p_pa >= p_top) return ts_k + inversion_strength_k * (ps_pa - p_pa) / (ps_pa - p_top);
    return constant_lapse_temperature_k(t_top, p_top, us::tropospheric_lapse_rate_k_m, p_pa);
  }
  }
  throw InternalError("troposphere_temperature_k: unknown profile");
}

// The troposphere curve at p_to, knowing it passes through (t_from, p_from): for the moist
// adiabat a short integration from there; the other curves are closed forms from the surface.
double troposphere_step_k(Profile profile, double ts_k, double ps_pa, double t_from_k, double p_from_pa, double p_to_pa) {
  if (profile == Profile::tropical) return thermo::moist_pseudoadiabat_temperature_k(t_from_k, p_from_pa, p_to_pa);
  return troposphere_temperature_k(profile, ts_k, ps_pa, p_to_pa);
}

[[noreturn]] void bad(const char* item, const std::string& message) {
  InputPlace place;
  place.item = item;
  throw InputError(place, message);
}

} // namespace

std::optional<Profile> profile_from_name(std::string_view name) noexcept {
  for (Profile p : {Profile::us_standard_1976, Profile::tropical, Profile::midlatitude_summer,
                    Profile::high_latitude_winter})
    if (profile_name(p) == name) return p;
  return std::nullopt;
}

std::string_view profile_name(Profile profile) noexcept {
  switch (profile) {
  case Profile::us_standard_1976: return "us_standard_1976";
  case Profile::tropical: return "tropical";
  case Profile::midlatitude_summer: return "midlatitude_summer";
  case Profile::high_latitude_winter: return "high_latitude_winter";
  }
  return "unknown";
}

double default_surface_temperature_k(Profile profile) noexcept {
  switch (profile) {
  case Profile::us_standard_1976: return us::sea_level_temperature_k;
  case Profile::tropical: return 300.0;
  case Profile::midlatitude_summer: return 294.0;
  case Profile::high_latitude_winter: return 250.0;
  }
  return us::sea_level_temperature_k;
}

TemperatureStructure temperature_structure(const ProfileSettings& settings, double surface_pressure_pa) {
  if (!std::isfinite(surface_pressure_pa) || !(surface_pressure_pa > 0.0))
    bad("surface_pressure", "must be finite and > 0 Pa, got " + std::to_string(surface_pressure_pa));
  const Profile profile = settings.profile;
  const double ps = surface_pressure_pa;
  double ts = settings.surface_temperature_k.value_or(default_surface_temperature_k(profile));
  // Without an override, the 1976 standard keeps its own surface temperature at any surface
  // pressure (the standard is defined in height; -5 km to 86 km).
  if (!settings.surface_temperature_k && profile == Profile::us_standard_1976) ts = us::temperature_at_pressure_k(ps);
  // 330 K: just inside the 332 K upper limit of the Murphy & Koop (2005) liquid formula.
  if (!std::isfinite(ts) || ts < 150.0 || ts > 330.0)
    bad("surface_temperature", "must be finite and within 150-330 K, got " + std::to_string(ts));
  const double strat_at_surface = stratosphere_temperature_k(profile, ps);
  if (!(ts > strat_at_surface))
    bad("surface_temperature", std::to_string(ts) + " K is not above the " + std::string(profile_name(profile)) +
                                   " tropopause temperature " + std::to_string(strat_at_surface) + " K");

  // March up in 250 m steps of z_US until the troposphere is no longer warmer, then bisect in ln p.
  // The moist adiabat is carried from step to step (a short integration each) instead of being
  // integrated from the surface every time.
  const double z_surface = us::geopotential_height_m(ps);
  double p_warm = ps;
  double t_warm = ts;
  double p_cold = 0.0;
  for (double z = z_surface + 250.0; z < z_surface + 100000.0; z += 250.0) {
    const double p = us::pressure_pa(z);
    const double t = troposphere_step_k(profile, ts, ps, t_warm, p_warm, p);
    if (t <= stratosphere_temperature_k(profile, p)) {
      p_cold = p;
      break;
    }
    p_warm = p;
    t_warm = t;
  }
  if (!(p_cold > 0.0)) throw InternalError("temperature_structure: no tropopause within 100 km of the surface");
  for (int iteration = 0; iteration < 200 && std::log(p_warm / p_cold) > 1e-12; ++iteration) {
    const double p_mid = std::sqrt(p_warm * p_cold);
    const double t_mid = troposphere_step_k(profile, ts, ps, t_warm, p_warm, p_mid);
    if (t_mid > stratosphere_temperature_k(profile, p_mid)) {
      p_warm = p_mid;
      t_warm = t_mid;
    } else {
      p_cold = p_mid;
    }
  }

  TemperatureStructure s;
  s.profile = profile;
  s.surface_pressure_pa = ps;
  s.surface_temperature_k = ts;
  s.tropopause_pressure_pa = p_warm;
  s.tropopause_temperature_k = t_warm;
  return s;
}

double temperature_at_pressure_k(const TemperatureStructure& s, double pressure_pa) {
  if (!std::isfinite(pressure_pa) || !(pressure_pa > 0.0))
    bad("pressure", "must be finite and > 0 Pa, got " + std::to_string(pressure_pa));
  if (pressure_pa >= s.tropopause_pressure_pa)
    return troposphere_temperature_k(s.profile, s.surface_temperature_k, s.surface_pressure_pa, pressure_pa);
  return stratosphere_temperature_k(s.profile, pressure_pa);
}

std::vector<double> temperatures_at_pressures_k(const TemperatureStructure& s, const std::vector<double>& pressure_pa) {
  for (double p : pressure_pa)
    if (!std::isfinite(p) || !(p > 0.0)) bad("pressure", "must be finite and > 0 Pa, got " + std::to_string(p));
  // Visit tropospheric pressures from the surface upward, carrying the curve from one to the next.
  std::vector<std::size_t> order(pressure_pa.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return pressure_pa[a] > pressure_pa[b]; });
  std::vector<double> t(pressure_pa.size());
  double p_from = s.surface_pressure_pa;
  double t_from = s.surface_temperature_k;
  for (std::size_t j : order) {
    const double p = pressure_pa[j];
    if (p >= s.tropopause_pressure_pa) {
      t[j] = troposphere_step_k(s.profile, s.surface_temperature_k, s.surface_pressure_pa, t_from, p_from, p);
      p_from = p;
      t_from = t[j];
    } else {
      t[j] = stratosphere_temperature_k(s.profile, p);
    }
  }
  return t;
}

} // namespace bandstack::atmosphere
