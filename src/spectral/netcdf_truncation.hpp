#pragma once
// Private to the readers of user netCDF files (spectral, io): checks the header of a classic-format
// netCDF file (CDF-1, CDF-2, CDF-5) before the netCDF library opens it. The library reads the missing
// bytes of a file shorter than its header says as zeros without an error (a file cut short by an
// interrupted copy would be read as valid data), and it allocates whatever a damaged header claims
// (counts and name lengths of gigabytes) before noticing that the file cannot hold it.
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>

namespace bandstack::spectral::detail {

// What the header of a classic-format file says.
struct ClassicHeader {
  bool damaged = false;        // it describes more than the whole file holds, or an unknown type
  std::uint64_t data_end = 0;  // bytes the file needs for all its data (when not damaged)
};

// nullopt for another format (netCDF-4/HDF5, whose library checks itself) or a header longer than
// the part read (64 MiB), which the netCDF library then reads itself.
[[nodiscard]] std::optional<ClassicHeader> read_classic_header(const std::filesystem::path& path);

// InputError naming `file` if the file is a classic-format file with a damaged header or shorter
// than its header says. Nothing for other formats.
void check_classic_file(const std::filesystem::path& path, const std::string& file);

} // namespace bandstack::spectral::detail
