#pragma once
// Typed, checked access to a parsed TOML table that collects every problem instead of stopping at
// the first: each problem carries file:line:column and the full key ("grid.layers").
#include <optional>
#include <set>
#include <string>
#include <vector>

#include <toml++/toml.h>

namespace bandstack::io::detail {

class TomlReader {
public:
  explicit TomlReader(std::string file) : file_(std::move(file)) {}

  // Reads table[key] as a number in [lo, hi]. Absent: nullopt (no problem). Wrong type or out of
  // range: a problem is recorded and nullopt returned.
  std::optional<double> number(const toml::table& table, const std::string& prefix, const std::string& key,
                               double lo, double hi);
  std::optional<long long> integer(const toml::table& table, const std::string& prefix, const std::string& key,
                                   long long lo, long long hi);
  std::optional<std::string> string(const toml::table& table, const std::string& prefix, const std::string& key);
  // An array of numbers, each in [lo, hi]; absent gives an empty vector.
  std::vector<double> number_array(const toml::table& table, const std::string& prefix, const std::string& key, double lo,
                                   double hi);
  // An array of strings; absent gives an empty vector.
  std::vector<std::string> string_array(const toml::table& table, const std::string& prefix, const std::string& key);
  // An array of integers, each in [lo, hi]; absent gives an empty vector.
  std::vector<long long> integer_array(const toml::table& table, const std::string& prefix, const std::string& key,
                                       long long lo, long long hi);
  // A boolean; absent: nullopt; wrong type: a problem.
  std::optional<bool> boolean(const toml::table& table, const std::string& prefix, const std::string& key);
  // A sub-table; absent gives nullptr; another type is a problem.
  const toml::table* table(const toml::table& table, const std::string& prefix, const std::string& key);
  // An array of tables ([[key]]); absent gives an empty vector.
  std::vector<const toml::table*> table_array(const toml::table& table, const std::string& prefix,
                                              const std::string& key);
  // Records a problem for every key of `table` not in `allowed` (catches typos).
  void reject_unknown_keys(const toml::table& table, const std::string& prefix, const std::set<std::string>& allowed);

  void problem(const toml::source_region& where, const std::string& key, const std::string& message);
  void problem(const std::string& message) { problems_.push_back(file_ + ": " + message); }
  [[nodiscard]] const std::vector<std::string>& problems() const { return problems_; }
  // Throws one InputError listing every problem, if there are any.
  void throw_if_problems() const;

private:
  static std::string full_key(const std::string& prefix, const std::string& key) {
    return prefix.empty() ? key : prefix + "." + key;
  }
  std::string file_;
  std::vector<std::string> problems_;
};

} // namespace bandstack::io::detail
