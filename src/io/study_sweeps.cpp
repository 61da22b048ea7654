#include <algorithm>
#include <cmath>
#include <set>
#include <string>

#include <fmt/format.h>

#include "bandstack/io/sweep.hpp"
#include "io/study_climate.hpp"

namespace bandstack::io::detail {

namespace {

std::string known_keys() {
  std::string list;
  for (const SweepKey& k : sweep_keys()) list += (list.empty() ? "" : ", ") + std::string(k.key);
  return list;
}

} // namespace

void read_sweeps(TomlReader& r, const toml::table& root, Study& study) {
  const auto tables = r.table_array(root, "", "sweeps");
  std::set<std::string> seen;
  for (std::size_t i = 0; i < tables.size(); ++i) {
    const toml::table& t = *tables[i];
    const std::string prefix = fmt::format("sweeps[{}]", i);
    r.reject_unknown_keys(t, prefix, {"key", "values", "from", "to", "count", "spacing"});
    SweepAxis axis;
    const auto key = r.string(t, prefix, "key");
    const SweepKey* info = key ? find_sweep_key(*key) : nullptr;
    if (!key) {
      r.problem(t.source(), prefix + ".key", "missing: the [[columns]] key to sweep, one of " + known_keys());
      continue;
    }
    if (!info) {
      r.problem(t.get("key")->source(), prefix + ".key", "\"" + *key + "\" cannot be swept (sweepable: " + known_keys() + ")");
      continue;
    }
    if (!seen.insert(*key).second) r.problem(t.get("key")->source(), prefix + ".key", "\"" + *key + "\" is swept twice");
    if (*key == "critical_lapse_rate_k_per_km" && !study.equilibrium)
      r.problem(t.get("key")->source(), prefix + ".key", "critical_lapse_rate_k_per_km is swept, but the study has no [equilibrium]");
    if (*key == "solar_constant_w_m2" && study.shortwave.method == ShortwaveMethod::none)
      r.problem(t.get("key")->source(), prefix + ".key", "solar_constant_w_m2 is swept, but the shortwave method is \"none\"");
    axis.key = *key;
    const bool listed = t.contains("values");
    const bool ranged = t.contains("from") || t.contains("to") || t.contains("count");
    if (listed == ranged) {
      r.problem(t.source(), prefix, "give either values = [...] or from, to and count");
      continue;
    }
    if (listed) {
      axis.values = r.number_array(t, prefix, "values", info->lowest, info->highest);
      if (axis.values.empty() && t.get("values")->is_array() && t.get("values")->as_array()->empty())
        r.problem(t.get("values")->source(), prefix + ".values", "needs at least one value");
    } else {
      const auto from = r.number(t, prefix, "from", info->lowest, info->highest);
      const auto to = r.number(t, prefix, "to", info->lowest, info->highest);
      const auto count = r.integer(t, prefix, "count", 1, 1000000);
      std::string spacing = r.string(t, prefix, "spacing").value_or("linear");
      if (spacing != "linear" && spacing != "log") {
        r.problem(t.get("spacing")->source(), prefix + ".spacing", "must be \"linear\" or \"log\", not \"" + spacing + "\"");
        continue;
      }
      if (!from || !to || !count) {
        if (!t.contains("from") || !t.contains("to") || !t.contains("count"))
          r.problem(t.source(), prefix, "a range needs from, to and count");
        continue;
      }
      if (spacing == "log" && !(*from > 0.0 && *to > 0.0)) {
        r.problem(t.source(), prefix, "a log range needs from and to > 0");
        continue;
      }
      const auto n = static_cast<std::size_t>(*count);
      for (std::size_t k = 0; k < n; ++k) {
        const double f = n == 1 ? 0.0 : static_cast<double>(k) / static_cast<double>(n - 1);
        axis.values.push_back(spacing == "log" ? *from * std::pow(*to / *from, f)
                                               : (1.0 - f) * *from + f * *to);
      }
      axis.values.back() = n == 1 ? *from : *to; // the end point exactly as written
    }
    study.sweeps.push_back(std::move(axis));
  }
}

void check_column_count(TomlReader& r, const Study& study) {
  double count = static_cast<double>(std::max<std::size_t>(study.columns.size(), 1));
  std::string product = std::to_string(study.columns.size()) + " columns";
  for (const SweepAxis& sweep : study.sweeps) {
    count *= static_cast<double>(sweep.values.size());
    product += fmt::format(" x {} values of {}", sweep.values.size(), sweep.key);
  }
  if (count > max_study_columns)
    r.problem(fmt::format("[[sweeps]]: {} make {:.0f} columns to compute, more than the {:.0f} one run may have", product,
                          count, max_study_columns));
}

} // namespace bandstack::io::detail
