#pragma once
// A solar spectrum file: the Sun's spectral irradiance from the user (a measured or modelled
// extraterrestrial spectrum), in netCDF (format: docs/solar-spectrum-file.md). A shortwave build
// recipe names it with `[solar] spectrum_file`; the builder then takes the solar weights from its
// shape instead of a blackbody. The file's absolute level does not matter: the weights are
// normalised over the band set, and the study's solar constant sets the flux.
#include <filesystem>
#include <string>
#include <vector>

namespace bandstack::spectral {

// A solar spectrum in bandstack's units, on increasing wavenumber.
struct SolarSpectrum {
  std::string title;                       // global attribute `title`
  std::string source;                      // global attribute `source` (where the numbers come from)
  std::vector<double> wavenumber_cm1;      // n >= 2, strictly increasing, finite, >= 0
  std::vector<double> irradiance_w_m2_cm1; // spectral irradiance, W m-2 (cm-1)-1, finite, >= 0; n values

  // Spectral irradiance at nu_cm1 (W m-2 (cm-1)-1), linear in wavenumber between the points; 0 outside
  // [first, last] wavenumber (check covers() first where that matters).
  [[nodiscard]] double irradiance(double nu_cm1) const noexcept;
  // True if [lower_cm1, upper_cm1] lies within the spectrum's wavenumber range (to 1e-9 relative, so a
  // range converted from wavelengths still counts as covered).
  [[nodiscard]] bool covers(double lower_cm1, double upper_cm1) const noexcept;
  // Trapezoidal integral of the irradiance over the whole spectrum, W m-2.
  [[nodiscard]] double total_w_m2() const noexcept;
};

// Checks sizes, ordering, finiteness and non-negative values; InputError naming `file`, the variable
// (`wavenumber` or `spectral_irradiance`) and the index otherwise.
void validate(const SolarSpectrum& spectrum, const std::string& file = "");

// Reads and validates a solar spectrum file, in either form of docs/solar-spectrum-file.md:
//   wavenumber(wavenumber) in cm-1 with spectral_irradiance(wavenumber) in W m-2 (cm-1)-1, or
//   wavelength(wavelength) in nm or um with spectral_irradiance(wavelength) in W m-2 nm-1 or W m-2 um-1,
// the latter converted to wavenumber (nu = 1e7 / lambda_nm, E_nu = E_lambda,nm * lambda_nm^2 / 1e7)
// and reordered to increasing wavenumber. FileError if the file cannot be opened as netCDF; InputError
// naming the file, the variable and the index for any problem in its contents.
[[nodiscard]] SolarSpectrum read_solar_spectrum_file(const std::filesystem::path& path);

// Writes `spectrum` (validated first) in the wavenumber form, atomically: the file appears complete or
// not at all. FileError if it cannot be written.
void write_solar_spectrum_file(const std::filesystem::path& path, const SolarSpectrum& spectrum);

} // namespace bandstack::spectral
