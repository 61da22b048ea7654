#pragma once
// The cross-section file: a researcher's own absorption coefficients kappa(nu, p, T) per absorber on a
// fine wavenumber grid, in netCDF (format: docs/cross-section-file.md), read as an AbsorberSource.
//
// Interpolation (absorption()): bilinear in temperature and ln(pressure) between the table's points,
// then linear in wavenumber from the file's points onto the requested grid. No extrapolation: a
// state outside the table's pressure or temperature range, or a grid point outside the file's
// wavenumber range, is an InputError giving the range. A coordinate with a single value means no
// dependence on it (any state is accepted along it).
//
// Memory: the whole table is held in memory as doubles, 8 * n_temperature * n_pressure * n_wavenumber
// bytes per absorber (e.g. 299,000 points at 0.01 cm-1 x 20 pressures x 8 temperatures = 383 MB).
#include <array>
#include <cstddef>
#include <filesystem>
#include <string>
#include <vector>

#include "bandstack/spectral/absorber.hpp"

namespace bandstack::spectral {

// The contents of a cross-section file, in SI-style units as used inside bandstack.
struct CrossSectionTable {
  std::string title;                 // global attribute `title`
  std::string source;                // global attribute `source` (how the numbers were made)
  std::vector<double> wavenumber_cm1; // n_nu >= 2, strictly increasing, uniform or not
  std::vector<double> pressure_pa;    // n_p >= 1, strictly increasing, > 0
  std::vector<double> temperature_k;  // n_t >= 1, strictly increasing, > 0
  // kappa[a][(t * n_p + p) * n_nu + nu]: m2 kg-1 for gases, m2 kg-1 Pa-1 for the self-continuum;
  // empty for an absorber the file does not have.
  std::array<std::vector<double>, absorber_count> kappa;

  [[nodiscard]] std::size_t values_per_absorber() const noexcept {
    return wavenumber_cm1.size() * pressure_pa.size() * temperature_k.size();
  }
};

// Checks sizes, ordering, finiteness and non-negative coefficients; InputError naming `file` and
// the variable (and index) otherwise.
void validate(const CrossSectionTable& table, const std::string& file = "");

// Reads and validates a cross-section file. Coefficients in cm2 molecule-1 (gases) or
// cm2 molecule-1 atm-1 (self-continuum) are converted; pressures in hPa are converted to Pa.
// FileError if the file cannot be opened as netCDF; InputError for any problem in its contents.
[[nodiscard]] CrossSectionTable read_cross_section_file(const std::filesystem::path& path);

// Writes `table` (validated first) atomically: the file appears complete or not at all.
// Coefficients are written in m2 kg-1 (m2 kg-1 Pa-1 for the self-continuum).
void write_cross_section_file(const std::filesystem::path& path, const CrossSectionTable& table);

// Tabulates every absorber that `source` provides on the points of `grid` (its interval midpoints)
// at every pressure (Pa) and temperature (K) given (both strictly increasing), and writes the file.
// The source's description() is recorded in the `source` attribute.
void write_cross_section_file(const std::filesystem::path& path, const AbsorberSource& source, const WavenumberGrid& grid,
                              std::vector<double> pressures_pa, std::vector<double> temperatures_k,
                              const std::string& title);

// A cross-section file as an absorber source. Thread-safe: absorption() is const and keeps no state.
class CrossSectionAbsorber : public AbsorberSource {
public:
  // Loads the whole file into memory (see the memory note above).
  explicit CrossSectionAbsorber(const std::filesystem::path& path);
  // From a table already in memory (validated); `name` stands for the file name in messages.
  CrossSectionAbsorber(CrossSectionTable table, std::string name);

  // "cross-section file PATH: TITLE (source: SOURCE)".
  [[nodiscard]] std::string description() const override;
  [[nodiscard]] bool provides(Absorber a) const override;
  // See the interpolation note above. Fills zeros for an absorber the file does not have (after the
  // same range checks).
  void absorption(Absorber a, const AbsorberState& state, const WavenumberGrid& grid, std::span<double> out) const override;

  [[nodiscard]] const CrossSectionTable& table() const noexcept { return table_; }
  // Bytes held by the coefficient tables.
  [[nodiscard]] std::size_t memory_bytes() const noexcept;

private:
  CrossSectionTable table_;
  std::string name_;
};

} // namespace bandstack::spectral
