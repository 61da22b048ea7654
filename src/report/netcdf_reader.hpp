#pragma once
// Private to report: a small read-only view of a netCDF file over the C API (partial reads only).
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace bandstack::report {

class NetcdfReader {
public:
  // Opens the file read-only; FileError (naming the path) if it is not a readable netCDF file.
  explicit NetcdfReader(std::string path);
  ~NetcdfReader();
  NetcdfReader(const NetcdfReader&) = delete;
  NetcdfReader& operator=(const NetcdfReader&) = delete;

  [[nodiscard]] const std::string& path() const noexcept { return path_; }
  [[nodiscard]] bool has_variable(const std::string& name) const;
  // Throws InputError (file, variable) "not a bandstack result file" if the variable is missing.
  void require(const std::string& name) const;
  // Dimension names and sizes of a variable.
  [[nodiscard]] std::vector<std::string> dimension_names(const std::string& variable) const;
  [[nodiscard]] std::vector<std::size_t> dimension_sizes(const std::string& variable) const;
  [[nodiscard]] std::optional<std::size_t> dimension_size(const std::string& dimension) const;
  // A text attribute of a variable ("" for the global ones), or empty.
  [[nodiscard]] std::string text_attribute(const std::string& variable, const std::string& name) const;
  // Names of every global text attribute with its value.
  [[nodiscard]] std::vector<std::pair<std::string, std::string>> global_text_attributes() const;
  // A hyperslab as doubles (fill values stay as stored; NaN is this format's fill).
  [[nodiscard]] std::vector<double> read(const std::string& variable, const std::vector<std::size_t>& start,
                                         const std::vector<std::size_t>& count,
                                         const std::vector<std::ptrdiff_t>& stride = {}) const;
  // The whole variable as doubles.
  [[nodiscard]] std::vector<double> read_all(const std::string& variable) const;
  // A 2-D char variable (n, length) as n trimmed strings.
  [[nodiscard]] std::vector<std::string> read_strings(const std::string& variable) const;

private:
  [[nodiscard]] int variable_id(const std::string& name) const;
  std::string path_;
  int ncid_ = -1;
};

} // namespace bandstack::report
