#pragma once
// Private to spectral: checks shared by the readers of user netCDF files (cross-section files, solar
// spectrum files). Every failure is an InputError naming the file and the variable.
#include <initializer_list>
#include <optional>
#include <string>

#include <netcdf>

namespace bandstack::spectral::detail {

[[noreturn]] void fail(const std::string& file, const std::string& item, const std::string& message);

// Whitespace collapsed to single blanks, trimmed: "m2  kg-1 " -> "m2 kg-1".
[[nodiscard]] std::string normalise_units(const std::string& units);

[[nodiscard]] bool one_of(const std::string& s, std::initializer_list<const char*> options);

// A text attribute (NC_CHAR or NC_STRING) of variable `varid` (NC_GLOBAL for the file); nullopt if absent.
[[nodiscard]] std::optional<std::string> text_attribute(int ncid, int varid, const char* name, const std::string& file,
                                                        const std::string& item);

[[nodiscard]] bool has_attribute(int ncid, int varid, const char* name);

// The value that marks a missing datum: the variable's _FillValue, else netCDF's default for its type.
[[nodiscard]] std::optional<double> fill_value(int ncid, int varid);

// Whether the variable has a numeric type.
[[nodiscard]] bool numeric(int ncid, int varid);

// Packed data (scale_factor/add_offset) is refused.
void reject_packing(int ncid, const netCDF::NcVar& var, const std::string& file);

} // namespace bandstack::spectral::detail
