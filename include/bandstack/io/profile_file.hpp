#pragma once
// Columns read from a netCDF profile file (format: docs/profile-file.md): any number of leading
// dimensions (e.g. time, lat, lon) and one vertical dimension; variables found by CF standard_name
// or named in the study; units converted to SI; pressure in either order.
#include "bandstack/atmosphere/column.hpp"

#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace bandstack::io {

// One leading (non-vertical) dimension of the file, kept for the output.
struct LeadingAxis {
  std::string name; // the dimension's name in the file
  std::size_t size = 0;
  std::vector<double> values; // its coordinate variable (same name, numeric, 1-D), else empty
  // The coordinate's text attributes (units, calendar, standard_name, long_name, axis, positive, ...).
  std::vector<std::pair<std::string, std::string>> attributes;
};

// Which file variable holds what; an empty name means "find it by its CF standard_name".
// temperature and pressure are required; the others are optional.
struct ProfileVariables {
  std::string pressure;            // air_pressure: 1-D vertical coordinate or a full field
  std::string temperature;         // air_temperature, on the vertical dimension
  std::string surface_temperature; // surface_temperature (skin); default: the air temperature of the
                                   // surface level (extrapolated in ln p, see docs)
  std::string surface_pressure;    // surface_air_pressure; default: the lowest layer's pressure
                                   // extended by half a layer spacing in ln p (see docs)
  std::string h2o;                 // specific_humidity, humidity_mixing_ratio or
                                   // mole_fraction_of_water_vapor_in_air
  std::string co2, o3, ch4, n2o;   // mole_fraction_of_..._in_air or mass_fraction_of_..._in_air
  std::string vertical_dimension;  // name of the vertical dimension; needed only when pressure is a full
                                   // field and no coordinate is marked axis="Z" or positive (see docs)
};

// What the study supplies for everything the file does not hold (one value for all columns).
struct ProfileDefaults {
  double co2_mole_fraction = 400e-6;
  double ch4_mole_fraction = 1.8e-6;
  double n2o_mole_fraction = 0.32e-6;
  double o3_mole_fraction = 0.0;  // used only when the file has no ozone
  double h2o_mole_fraction = 0.0; // used only when the file has no water
  double surface_emissivity = 1.0;
  double surface_albedo = 0.3;
};

struct ProfileFile {
  std::vector<LeadingAxis> axes;           // leading dimensions in file order (may be empty: one column)
  std::vector<atmosphere::Column> columns; // one per point of the leading dimensions, row-major
  std::vector<std::string> used_variables; // "temperature <- ta (K)", ... for provenance
};

// A profile file opened for reading its columns block by block, so that memory does not grow with the
// file's column count. The constructor checks everything that does not need the values (variables,
// dimensions, units) and reads the leading coordinates; read() reads only the hyperslabs of the
// columns asked for. Errors as read_profile_file's. Not thread-safe (one read at a time).
class ProfileReader {
public:
  ProfileReader(const std::filesystem::path& path, const ProfileVariables& variables, const ProfileDefaults& defaults);
  ~ProfileReader();
  ProfileReader(ProfileReader&&) noexcept;
  ProfileReader& operator=(ProfileReader&&) noexcept;

  [[nodiscard]] const std::filesystem::path& path() const noexcept;
  // Number of columns: the product of the leading dimensions' sizes (1 without any).
  [[nodiscard]] std::size_t column_count() const noexcept;
  // Number of layers per column (the vertical dimension's size).
  [[nodiscard]] std::size_t layer_count() const noexcept;
  [[nodiscard]] const std::vector<LeadingAxis>& axes() const noexcept;
  [[nodiscard]] const std::vector<std::string>& used_variables() const noexcept;
  // Columns [first, first + count) in row-major order of the leading dimensions, validated
  // (atmosphere::validate). InternalError if the range leaves the file.
  [[nodiscard]] std::vector<atmosphere::Column> read(std::size_t first, std::size_t count) const;
  // FNV-1a hash of the file's bytes, read in pieces (identifies the data for resuming a run).
  [[nodiscard]] std::uint64_t content_hash() const;

  struct Impl; // the open file and what was found in it (profile_file.cpp)

private:
  std::unique_ptr<Impl> impl_;
};

// Reads every column of the file. Each column's layers are the file's vertical points (sorted to
// the top-first order bandstack uses); levels are placed between them (see docs/profile-file.md).
// Errors name the file, the variable and the place (InputError, exit 2): a missing required
// variable, unknown or unconvertible units, NaN or fill values, non-monotonic pressure, a surface
// pressure not greater than the lowest layer's, a column that fails atmosphere::validate. FileError
// for a missing or unreadable file.
[[nodiscard]] ProfileFile read_profile_file(const std::filesystem::path& path, const ProfileVariables& variables,
                                            const ProfileDefaults& defaults);

} // namespace bandstack::io
