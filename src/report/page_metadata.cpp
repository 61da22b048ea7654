// Run metadata: study, band sets, version, time taken, the stored study text.
#include <fmt/format.h>

#include "bandstack/core/version.hpp"
#include "report/page.hpp"

namespace bandstack::report {

namespace {

std::string attribute(const ResultData& data, const std::string& name) {
  const auto it = data.attributes.find(name);
  return it == data.attributes.end() ? std::string() : it->second;
}

std::string format_seconds(double s) {
  if (s < 120.0) return fmt::format("{:.1f} s", s);
  if (s < 7200.0) return fmt::format("{:.1f} min", s / 60.0);
  return fmt::format("{:.2f} h", s / 3600.0);
}

} // namespace

std::string section_metadata(const ResultData& data, const ReportOptions& options) {
  std::vector<std::pair<std::string, std::string>> items = {
      {"result file", data.path.filename().string()},
      {"study", attribute(data, "title")},
      {"study file", attribute(data, "study_file")},
      {"written by", attribute(data, "source")},
      {"history", attribute(data, "history")},
      {"longwave", attribute(data, "longwave_method")},
      {"shortwave", attribute(data, "shortwave_method")},
      {"equilibrium", attribute(data, "equilibrium_method")},
  };
  std::string shape;
  for (const LeadingAxis& a : data.axes) shape += (shape.empty() ? "" : " x ") + fmt::format("{} {}", a.size, a.name);
  items.emplace_back("columns", fmt::format("{} ({}), {} layers each", data.column_count, shape, data.layer_count));
  if (!data.experiments.empty()) {
    std::string names;
    for (const std::string& e : data.experiments) names += (names.empty() ? "" : ", ") + e;
    items.emplace_back("experiments", names);
  }
  if (options.run_seconds) items.emplace_back("time taken", format_seconds(*options.run_seconds));
  items.emplace_back("report made by", "bandstack " + std::string(version()));
  std::string body = "<dl class=\"meta\">";
  for (const auto& [key, value] : items)
    if (!value.empty()) body += "<dt>" + escape_xml(key) + "</dt><dd>" + escape_xml(value) + "</dd>";
  body += "</dl>";
  if (const std::string text = attribute(data, "study_text"); !text.empty())
    body += "<details><summary>Study text</summary><pre class=\"study\">" + escape_xml(text) + "</pre></details>";
  return section("metadata", "Run", "", body);
}

} // namespace bandstack::report
