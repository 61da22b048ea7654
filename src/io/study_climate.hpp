#pragma once
// Private to io: the study-file sections about equilibrium, experiments and sweeps (docs/study-file.md).
#include <toml++/toml.h>

#include "bandstack/io/study.hpp"
#include "io/toml_reader.hpp"

namespace bandstack::io::detail {

// [equilibrium] -> study.equilibrium (left empty when the table is absent).
void read_equilibrium(TomlReader& r, const toml::table& root, Study& study);

// [[experiments]] -> study.experiments (names unique; band indices checked later against the band
// sets by batch).
void read_experiments(TomlReader& r, const toml::table& root, Study& study);

// [[sweeps]] -> study.sweeps (keys from io/sweep.hpp, values in their ranges, no key twice).
void read_sweeps(TomlReader& r, const toml::table& root, Study& study);

// The built-in columns times every sweep's values must stay within max_study_columns (a run of more
// columns cannot finish; an absurd sweep is refused at once instead of being counted through).
// Profile-file columns are counted when the file is read (io/sweep.hpp).
inline constexpr double max_study_columns = 1e8;
void check_column_count(TomlReader& r, const Study& study);

// [attribution] -> study.attribution.
void read_attribution(TomlReader& r, const toml::table& root, Study& study);

} // namespace bandstack::io::detail
