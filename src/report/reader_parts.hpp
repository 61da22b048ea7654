#pragma once
// Private to report: the pieces of read_result_data, one file each.
#include <cstddef>
#include <string>
#include <vector>

#include "bandstack/report/result_data.hpp"
#include "report/netcdf_reader.hpp"

namespace bandstack::report {

// Reads the columns `flat_indices` whole into data.profiles (result_profiles.cpp).
void read_profiles(const NetcdfReader& file, ResultData& data, const std::vector<std::size_t>& flat_indices,
                   const std::vector<std::string>& why);

// The columns to draw: all when there are at most max_profiles, else those of lowest, median and
// highest OLR (or surface temperature) in the sample, with the reason for each.
void choose_profiles(const ResultData& data, std::size_t max_profiles, std::vector<std::size_t>& flat_indices,
                     std::vector<std::string>& why);

// Fills initial_*_layer of each profile from the study text stored in the file, when the study has
// [equilibrium] and its columns are built-in profiles (result_initial_state.cpp). Never throws for
// a study that cannot be rebuilt: the profiles then stay without an initial state.
void add_initial_states(ResultData& data);

// Sets the lapse-rate tropopause of profiles whose file has none (result_profiles.cpp).
void add_lapse_rate_tropopause(ColumnProfile& profile);

} // namespace bandstack::report
