#include "io/toml_reader.hpp"

#include <cmath>
#include <sstream>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io::detail {

void TomlReader::problem(const toml::source_region& where, const std::string& key, const std::string& message) {
  problems_.push_back(fmt::format("{}:{}:{}: '{}': {}", file_, where.begin.line, where.begin.column, key, message));
}

std::optional<double> TomlReader::number(const toml::table& table, const std::string& prefix, const std::string& key,
                                         double lo, double hi) {
  const toml::node* node = table.get(key);
  if (!node) return std::nullopt;
  const std::string name = full_key(prefix, key);
  if (!node->is_number()) {
    problem(node->source(), name, "expected a number");
    return std::nullopt;
  }
  const double value = node->is_integer() ? static_cast<double>(node->as_integer()->get()) : node->as_floating_point()->get();
  if (!std::isfinite(value) || value < lo || value > hi) {
    problem(node->source(), name, fmt::format("value {} is outside the allowed range [{}, {}]", value, lo, hi));
    return std::nullopt;
  }
  return value;
}

std::optional<long long> TomlReader::integer(const toml::table& table, const std::string& prefix, const std::string& key,
                                             long long lo, long long hi) {
  const toml::node* node = table.get(key);
  if (!node) return std::nullopt;
  const std::string name = full_key(prefix, key);
  if (!node->is_integer()) {
    problem(node->source(), name, "expected a whole number");
    return std::nullopt;
  }
  const long long value = node->as_integer()->get();
  if (value < lo || value > hi) {
    problem(node->source(), name, fmt::format("value {} is outside the allowed range [{}, {}]", value, lo, hi));
    return std::nullopt;
  }
  return value;
}

std::optional<std::string> TomlReader::string(const toml::table& table, const std::string& prefix, const std::string& key) {
  const toml::node* node = table.get(key);
  if (!node) return std::nullopt;
  if (!node->is_string()) {
    problem(node->source(), full_key(prefix, key), "expected a string in quotes");
    return std::nullopt;
  }
  return node->as_string()->get();
}

std::vector<double> TomlReader::number_array(const toml::table& table, const std::string& prefix, const std::string& key,
                                            double lo, double hi) {
  std::vector<double> values;
  const toml::node* node = table.get(key);
  if (!node) return values;
  const std::string name = full_key(prefix, key);
  if (!node->is_array()) {
    problem(node->source(), name, "expected an array of numbers, e.g. [0.98, 0.95]");
    return values;
  }
  std::size_t i = 0;
  for (const toml::node& element : *node->as_array()) {
    const std::string item = fmt::format("{}[{}]", name, i++);
    if (!element.is_number()) {
      problem(element.source(), item, "expected a number");
      continue;
    }
    const double value = element.is_integer() ? static_cast<double>(element.as_integer()->get()) : element.as_floating_point()->get();
    if (!std::isfinite(value) || value < lo || value > hi)
      problem(element.source(), item, fmt::format("value {} is outside the allowed range [{}, {}]", value, lo, hi));
    else
      values.push_back(value);
  }
  return values;
}

std::vector<std::string> TomlReader::string_array(const toml::table& table, const std::string& prefix,
                                                 const std::string& key) {
  std::vector<std::string> values;
  const toml::node* node = table.get(key);
  if (!node) return values;
  const std::string name = full_key(prefix, key);
  if (!node->is_array()) {
    problem(node->source(), name, "expected an array of strings, e.g. [\"o3\", \"ch4\"]");
    return values;
  }
  std::size_t i = 0;
  for (const toml::node& element : *node->as_array()) {
    if (element.is_string()) values.push_back(element.as_string()->get());
    else problem(element.source(), fmt::format("{}[{}]", name, i), "expected a string in quotes");
    ++i;
  }
  return values;
}

std::vector<long long> TomlReader::integer_array(const toml::table& table, const std::string& prefix,
                                                 const std::string& key, long long lo, long long hi) {
  std::vector<long long> values;
  const toml::node* node = table.get(key);
  if (!node) return values;
  const std::string name = full_key(prefix, key);
  if (!node->is_array()) {
    problem(node->source(), name, "expected an array of whole numbers, e.g. [2, 3]");
    return values;
  }
  std::size_t i = 0;
  for (const toml::node& element : *node->as_array()) {
    const std::string item = fmt::format("{}[{}]", name, i++);
    if (!element.is_integer()) {
      problem(element.source(), item, "expected a whole number");
      continue;
    }
    const long long value = element.as_integer()->get();
    if (value < lo || value > hi)
      problem(element.source(), item, fmt::format("value {} is outside the allowed range [{}, {}]", value, lo, hi));
    else
      values.push_back(value);
  }
  return values;
}

std::optional<bool> TomlReader::boolean(const toml::table& table, const std::string& prefix, const std::string& key) {
  const toml::node* node = table.get(key);
  if (!node) return std::nullopt;
  if (!node->is_boolean()) {
    problem(node->source(), full_key(prefix, key), "expected true or false");
    return std::nullopt;
  }
  return node->as_boolean()->get();
}

const toml::table* TomlReader::table(const toml::table& parent, const std::string& prefix, const std::string& key) {
  const toml::node* node = parent.get(key);
  if (!node) return nullptr;
  if (!node->is_table()) {
    problem(node->source(), full_key(prefix, key), "expected a table ([" + full_key(prefix, key) + "])");
    return nullptr;
  }
  return node->as_table();
}

std::vector<const toml::table*> TomlReader::table_array(const toml::table& parent, const std::string& prefix,
                                                        const std::string& key) {
  std::vector<const toml::table*> tables;
  const toml::node* node = parent.get(key);
  if (!node) return tables;
  const std::string name = full_key(prefix, key);
  if (!node->is_array_of_tables()) {
    problem(node->source(), name, "expected an array of tables ([[" + name + "]])");
    return tables;
  }
  for (const toml::node& element : *node->as_array()) tables.push_back(element.as_table());
  return tables;
}

void TomlReader::reject_unknown_keys(const toml::table& table, const std::string& prefix,
                                     const std::set<std::string>& allowed) {
  for (auto&& [key, node] : table) {
    const std::string name(key.str());
    if (allowed.count(name) == 0) {
      std::string list;
      for (const std::string& a : allowed) list += (list.empty() ? "" : ", ") + a;
      problem(key.source(), full_key(prefix, name), "unknown key (allowed here: " + list + ")");
    }
  }
}

void TomlReader::throw_if_problems() const {
  if (problems_.empty()) return;
  std::ostringstream out;
  out << problems_.size() << (problems_.size() == 1 ? " problem" : " problems") << " in the study:";
  for (const std::string& p : problems_) out << "\n  " << p;
  throw InputError(out.str());
}

} // namespace bandstack::io::detail
