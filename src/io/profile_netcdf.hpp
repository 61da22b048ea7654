#pragma once
// Private to io: the netCDF access the profile-file reader needs, over the netCDF C library. Every
// problem with the contents is an InputError naming the file and the variable; a file that cannot be
// opened as netCDF is a FileError.
#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace bandstack::io::detail {

class NetcdfFile {
public:
  // Opens `path` read-only (only the root group is used).
  explicit NetcdfFile(const std::string& path);
  ~NetcdfFile();
  NetcdfFile(const NetcdfFile&) = delete;
  NetcdfFile& operator=(const NetcdfFile&) = delete;

  [[nodiscard]] const std::string& path() const noexcept { return path_; }

  // Variable ids in file order; a variable's id by name (nullopt if absent); its name.
  [[nodiscard]] std::vector<int> variables() const;
  [[nodiscard]] std::optional<int> variable(const std::string& name) const;
  [[nodiscard]] std::string variable_name(int varid) const;
  // The variable's dimension ids in file order (empty for a scalar).
  [[nodiscard]] std::vector<int> dimensions(int varid) const;
  [[nodiscard]] bool numeric(int varid) const;

  [[nodiscard]] std::string dimension_name(int dimid) const;
  [[nodiscard]] std::size_t dimension_size(int dimid) const;
  [[nodiscard]] std::optional<int> dimension(const std::string& name) const;
  // "(time, lat, level)" for a list of dimension ids.
  [[nodiscard]] std::string describe_dimensions(const std::vector<int>& dimids) const;

  // A text attribute of the variable; nullopt if absent; InputError if present but not text.
  [[nodiscard]] std::optional<std::string> text_attribute(int varid, const char* name) const;
  // Every text attribute of the variable, in file order (numeric attributes are skipped).
  [[nodiscard]] std::vector<std::pair<std::string, std::string>> text_attributes(int varid) const;

  // The whole variable as doubles, row-major, unpacked (value * scale_factor + add_offset when those
  // attributes exist). InputError naming the variable and the index (per dimension) of the first NaN,
  // infinite or missing value (_FillValue, netCDF's default fill for float and double variables without
  // one, or any missing_value).
  [[nodiscard]] std::vector<double> read_values(int varid) const;
  // The box of the variable with `start` and `count` per dimension (file order), row-major, checked
  // and unpacked as read_values does; errors give the index in the whole variable.
  [[nodiscard]] std::vector<double> read_values(int varid, const std::vector<std::size_t>& start,
                                                const std::vector<std::size_t>& count) const;

  // "(time 1, lat 0, level 3)": the position of element `flat` (row-major) of the box with `start`
  // and `count` (empty: the whole variable).
  [[nodiscard]] std::string describe_index(int varid, std::size_t flat, const std::vector<std::size_t>& start = {},
                                           const std::vector<std::size_t>& count = {}) const;

private:
  [[noreturn]] void fail(int varid, const std::string& message) const;
  std::string path_;
  int ncid_ = -1;
};

} // namespace bandstack::io::detail
