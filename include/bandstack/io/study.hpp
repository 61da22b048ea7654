#pragma once
// A study: everything one run needs, read from a TOML study file (format: docs/study-file.md).
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/perturbation.hpp"
#include "bandstack/io/demo_study.hpp"
#include "bandstack/io/profile_file.hpp"
#include "bandstack/io/profile_sun.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/solvers/grey.hpp"

namespace bandstack::io {

// Where the Sun is for one column. Exactly one way is used: a fixed cosine of the zenith angle;
// latitude + day of year + local solar time (instantaneous); latitude + day of year (daily mean,
// insolation-weighted zenith angle); or, with nothing given, the global mean (cos zenith 0.5 for
// half of the time: S0/4 at the top).
struct SunSpec {
  std::optional<double> cos_zenith;
  std::optional<double> latitude_deg;
  std::optional<double> day_of_year;
  std::optional<double> local_solar_time_h;
  // A profile-file column may take the Sun's position from the file's coordinates instead
  // (io/profile_sun.hpp); then the four values above are empty.
  std::optional<SunFromFile> from_file;
};

// One column of the study: a built-in profile with its settings, or a profile file.
struct ColumnSpec {
  std::string name;
  atmosphere::ProfileSettings settings;
  // [[columns]] profile_file: the file (relative paths resolved against the study's folder) and the
  // variable names given under [columns.variables]; io::expand_sweeps reads it.
  std::filesystem::path profile_file;
  ProfileVariables profile_variables;
  // Set by io::prepare_columns on a profile-file column: the number of columns in the file. The
  // columns io::column_spec then gives are the file's, each with its index in the file.
  std::size_t profile_column_count = 0;
  std::optional<std::size_t> profile_column;
  // A column read from a profile file (set by io::expand_sweeps, or by the batch layer from the
  // block it read): used instead of `settings`' built-in profile (the sun and the per-band surface
  // keys still come from this spec).
  std::shared_ptr<const atmosphere::Column> given_column;
  // Per-column values of study-level settings, set only by [[sweeps]] (io/sweep.hpp): the total solar
  // irradiance at 1 au (W m-2; replaces [shortwave] solar_constant_w_m2 for this column) and the
  // critical lapse rate of [equilibrium] (K/km).
  std::optional<double> solar_constant_w_m2;
  std::optional<double> critical_lapse_rate_k_km;
  // The (key, value) pairs sweeps set on this spec, in order; applied to a given_column too.
  std::vector<std::pair<std::string, double>> swept_values;
  SunSpec sun;
  // Optional per-band surface properties; empty = the broadband value in every band. When given,
  // one value per band of the longwave (emissivity) or shortwave (albedo) band set.
  std::vector<double> surface_emissivity_by_band;
  std::vector<double> surface_albedo_by_band;
};

enum class AngleMethod { gauss, diffusivity };

// How longwave optics are computed: one grey absorber per gas, a band set (correlated-k), or the
// line-resolved reference on the absorber source's fine wavenumber grid.
enum class LongwaveMethod { grey, bands, reference };

struct LongwaveSettings {
  LongwaveMethod method = LongwaveMethod::bands;
  std::string band_set = "default_lw";      // built-in band-set name or a band-set file path
  std::string absorbers = "earth_idealised_absorbers"; // reference: built-in recipe name, recipe .toml or cross-section .nc
  double reference_step_cm1 = 0.1;          // reference: fine-grid spacing (0.01 .. 1 cm-1)
  solvers::GreyOptics grey;                 // constant mass absorption coefficient per gas (m2 kg-1)
  AngleMethod angle_method = AngleMethod::gauss;
  std::size_t gauss_angles = 3;             // 1..8 when angle_method is gauss
  double diffusivity_factor = 1.66;         // when angle_method is diffusivity
};

enum class ShortwaveMethod { none, bands };

struct ShortwaveSettings {
  ShortwaveMethod method = ShortwaveMethod::bands;
  std::string band_set = "default_sw";      // built-in shortwave band-set name or a file path
  double solar_constant_w_m2 = 1361.0;      // total solar irradiance at 1 au (Kopp & Lean 2011)
};

// [attribution]: each gas's (and, with bands, each longwave band's) share of the greenhouse effect.
struct AttributionSpec {
  bool enabled = false; // the table is present
  bool bands = false;   // also by longwave band; needs the longwave method "bands"
};

// [[sweeps]]: one numeric column key over a list of values. Several sweeps are crossed with each
// other and with the columns: the run computes every column for every combination, and the result
// file keeps each sweep as a dimension with the values as its coordinate.
struct SweepAxis {
  std::string key;              // a numeric [[columns]] key, e.g. "co2_ppmv" (also the dimension name)
  std::vector<double> values;   // in the key's own units, as the study file gives them
};

struct Study {
  std::string title;
  std::string source_file;                  // path the study was read from ("" for built-in)
  std::string source_text;                  // full TOML text, stored in the output for provenance
  atmosphere::GridSpec grid;
  std::vector<ColumnSpec> columns;
  std::vector<SweepAxis> sweeps;            // crossed with columns, in this order (outermost first)
  LongwaveSettings longwave;
  ShortwaveSettings shortwave;
  std::filesystem::path output_file;        // absolute, or relative to the working directory
  // [equilibrium]: every column is first driven to equilibrium (its profile is the first guess).
  // With water at fixed relative humidity, each column's surface_relative_humidity and
  // stratospheric_h2o_ppmv set the humidity (climate::WaterSettings).
  std::optional<climate::EquilibriumSettings> equilibrium;
  std::vector<climate::Perturbation> experiments;  // [[experiments]], run on every column's base state
  AttributionSpec attribution;
};

// Parses a study from TOML text. file_name is used in messages and to resolve a relative output
// path against the study file's folder. Every problem found (syntax, unknown keys, wrong types,
// values out of range) is collected and reported at once in one InputError, each with
// file:line:column and the key.
[[nodiscard]] Study parse_study(std::string_view text, const std::string& file_name);

// Reads and parses a study file; a missing or unreadable file is a FileError.
[[nodiscard]] Study load_study(const std::filesystem::path& path);

} // namespace bandstack::io
