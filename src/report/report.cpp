// The page: header with the caution line, contents, sections, footer; written atomically.
#include "bandstack/report/report.hpp"

#include <fstream>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "bandstack/report/result_data.hpp"
#include "bandstack/report/svg.hpp"
#include "report/page.hpp"

namespace bandstack::report {

namespace {

std::string contents(const std::vector<std::pair<std::string, std::string>>& sections) {
  std::string s = "<nav class=\"contents\">";
  for (const auto& [id, title] : sections) s += "<a href=\"#" + id + "\">" + escape_xml(title) + "</a>";
  return s + "</nav>";
}

} // namespace

std::filesystem::path default_report_path(const std::filesystem::path& result_nc) {
  std::filesystem::path out = result_nc;
  out.replace_extension(".html");
  return out;
}

std::string render_report(const std::filesystem::path& result_nc, const ReportOptions& options) {
  const ResultData data = read_result_data(result_nc, options);
  const std::vector<std::pair<std::string, std::string>> parts = {
      {"columns", section_overview(data, options)},     {"profiles", section_profiles(data)},
      {"heating", section_heating(data)},               {"spectrum", section_spectrum(data)},
      {"attribution", section_attribution(data)},       {"experiments", section_experiments(data)},
      {"sweeps", section_sweeps(data, options)},        {"distributions", section_distributions(data)},
      {"metadata", section_metadata(data, options)}};
  static const std::map<std::string, std::string> titles = {
      {"columns", "Columns"},        {"profiles", "Temperature"}, {"heating", "Heating"},
      {"spectrum", "Spectrum"},      {"attribution", "Greenhouse effect"}, {"experiments", "Experiments"},
      {"sweeps", "Sweep"},           {"distributions", "Distributions"},   {"metadata", "Run"}};
  std::vector<std::pair<std::string, std::string>> present;
  std::string body;
  for (const auto& [id, html] : parts)
    if (!html.empty()) {
      present.emplace_back(id, titles.at(id));
      body += html;
    }
  const auto title_it = data.attributes.find("title");
  const std::string title = title_it != data.attributes.end() && !title_it->second.empty() ? title_it->second
                                                                                          : data.path.filename().string();
  const std::string caution = escape_xml(caution_text());
  std::string page = "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"/>"
                     "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>"
                     "<meta name=\"generator\" content=\"bandstack " + escape_xml(version()) + "\"/>"
                     "<title>" + escape_xml(title) + " - bandstack report</title><style>" + page_style() + "</style></head>\n<body>";
  page += "<header class=\"top\"><h1>" + escape_xml(title) + "</h1><div class=\"file\">" + escape_xml(data.path.filename().string()) +
          "</div><p class=\"caution\" id=\"caution\">" + caution + "</p></header>";
  page += contents(present) + "<main>" + body + "</main>";
  page += "<footer>Made by bandstack " + escape_xml(version()) + " from " + escape_xml(data.path.filename().string()) +
          ". Hover over a point, bar or cell to read its value. " + caution + "</footer></body></html>\n";
  return page;
}

void write_report(const std::filesystem::path& result_nc, const std::filesystem::path& html_out, const ReportOptions& options) {
  const std::string html = render_report(result_nc, options);
  io::AtomicOutput output(html_out);
  {
    std::ofstream stream(output.temporary_path(), std::ios::binary);
    stream.write(html.data(), static_cast<std::streamsize>(html.size()));
    stream.close();
    if (!stream) throw FileError(html_out.string(), "cannot write the report");
  }
  output.commit();
}

} // namespace bandstack::report
