#include "bandstack/spectral/rayleigh.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <cmath>
#include <fmt/format.h>

namespace bandstack::spectral {

namespace {

// The rational function shared by eqs. 29 and 30 of Bodhaine et al. (1999), wavelength in um: their
// fit of the first-principles result (refractive index of Peck & Reeder 1972 scaled to 360 ppm CO2,
// King factor after Bates 1984). Its denominator vanishes near 0.108 um, hence the lower limit 0.2 um.
double bodhaine_ratio(double lambda_um) {
  const double l2 = lambda_um * lambda_um;
  return (1.0455996 - 341.29061 / l2 - 0.90230850 * l2) / (1.0 + 0.0027059889 / l2 - 85.968563 * l2);
}

// Above 1 um the fit's lambda^2 terms, tuned for 0.25-1 um, make it fall more slowly than lambda^-4
// (2.5 times too high at 5 um); the refractive index of air is nearly constant in the infrared, so
// the lambda^-4 law from 1 um is the better continuation (common practice).
constexpr double fit_max_wavelength_um = 1.0;

double ratio_extended(double lambda_um) {
  if (!(lambda_um >= rayleigh_min_wavelength_um) || !std::isfinite(lambda_um))
    throw InputError(InputPlace::of("wavelength"),
                     fmt::format("Rayleigh scattering: wavelength {} um is outside the fit's range (>= {} um)",
                                 lambda_um, rayleigh_min_wavelength_um));
  if (lambda_um <= fit_max_wavelength_um) return bodhaine_ratio(lambda_um);
  const double r = fit_max_wavelength_um / lambda_um;
  return bodhaine_ratio(fit_max_wavelength_um) * (r * r) * (r * r);
}

} // namespace

double rayleigh_cross_section_cm2(double wavelength_um) {
  return 1e-28 * ratio_extended(wavelength_um); // Bodhaine et al. (1999) eq. 29
}

double rayleigh_optical_depth_standard(double wavelength_um) {
  return 0.0021520 * ratio_extended(wavelength_um); // Bodhaine et al. (1999) eq. 30
}

double rayleigh_cross_section_m2_kg(double nu_cm1) {
  if (!(nu_cm1 > 0.0 && nu_cm1 <= rayleigh_max_wavenumber_cm1))
    throw InputError(InputPlace::of("wavenumber"),
                     fmt::format("Rayleigh scattering: wavenumber {} cm-1 is outside (0, {}] cm-1", nu_cm1,
                                 rayleigh_max_wavenumber_cm1));
  return rayleigh_cross_section_cm2(1e4 / nu_cm1) * 1e-4 * constants::avogadro_per_mol / rayleigh_air_molar_mass_kg_mol;
}

} // namespace bandstack::spectral
