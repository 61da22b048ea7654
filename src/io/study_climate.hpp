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

// [attribution] -> study.attribution.
void read_attribution(TomlReader& r, const toml::table& root, Study& study);

} // namespace bandstack::io::detail
