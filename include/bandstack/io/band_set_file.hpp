#pragma once
// The band-set file: a BandSet in netCDF-4 (format in docs/band-set-file.md).
#include "bandstack/spectral/band_set.hpp"

#include <filesystem>

namespace bandstack::io {

// Writes `set` to `path` atomically (temporary file + rename, io::AtomicOutput): an interrupted write
// leaves the old file or nothing. Only absorbers with absorber_present are stored. Validates the set
// first (InputError); FileError if the file cannot be written.
void write_band_set(const std::filesystem::path& path, const spectral::BandSet& set);

// Reads and validates a band-set file. FileError if it is missing, unreadable or not netCDF;
// InputError naming the file, the variable (and the index) for a missing or misshapen variable or
// dimension, wrong units, an unknown absorber, NaN, a negative absorption coefficient, a grid that is
// not strictly increasing, or weights and Planck fractions that do not sum to 1 per band.
[[nodiscard]] spectral::BandSet read_band_set(const std::filesystem::path& path);

} // namespace bandstack::io
