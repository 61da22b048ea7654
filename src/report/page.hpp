#pragma once
// Private to report: the sections of the page, one function each (page_*.cpp), and small HTML
// helpers. Each section returns "" when the file has nothing for it.
#include <string>
#include <vector>

#include "bandstack/report/report.hpp"
#include "bandstack/report/result_data.hpp"
#include "bandstack/report/svg.hpp"

namespace bandstack::report {

// <figure class="plot" data-plot="id"> around a chart with a caption.
[[nodiscard]] std::string figure(const std::string& svg, const std::string& caption);
// A <section id=...> with a heading, an optional note (escaped) and the body (markup).
[[nodiscard]] std::string section(const std::string& id, const std::string& heading, const std::string& note,
                                  const std::string& body);
// A table: header cells and rows of cells (all escaped); numbers right-aligned by the caller's
// choice of class "num" for every column but the first `text_columns`.
[[nodiscard]] std::string table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                                std::size_t text_columns = 1);
// Short name of a column for legends: its label, cut to about 40 characters.
[[nodiscard]] std::string short_label(const ColumnProfile& profile);
// "250-400 cm-1" for band b.
[[nodiscard]] std::string band_label(const BandEdges& bands, std::size_t b);

[[nodiscard]] std::string page_style();
[[nodiscard]] std::string section_overview(const ResultData& data, const ReportOptions& options);
[[nodiscard]] std::string section_profiles(const ResultData& data);
[[nodiscard]] std::string section_heating(const ResultData& data);
[[nodiscard]] std::string section_spectrum(const ResultData& data);
[[nodiscard]] std::string section_attribution(const ResultData& data);
[[nodiscard]] std::string section_experiments(const ResultData& data);
[[nodiscard]] std::string section_sweeps(const ResultData& data, const ReportOptions& options);
[[nodiscard]] std::string section_distributions(const ResultData& data);
[[nodiscard]] std::string section_metadata(const ResultData& data, const ReportOptions& options);

} // namespace bandstack::report
