// HTML helpers and the page's style sheet.
#include <fmt/format.h>

#include "bandstack/report/svg.hpp"
#include "report/page.hpp"

namespace bandstack::report {

std::string figure(const std::string& svg, const std::string& caption) {
  return "<figure class=\"plot\">" + svg + (caption.empty() ? "" : "<figcaption>" + escape_xml(caption) + "</figcaption>") +
         "</figure>";
}

std::string section(const std::string& id, const std::string& heading, const std::string& note, const std::string& body) {
  return fmt::format("<section id=\"{}\"><h2>{}</h2>{}{}</section>\n", escape_xml(id), escape_xml(heading),
                     note.empty() ? "" : "<p class=\"note\">" + escape_xml(note) + "</p>", body);
}

std::string table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                  std::size_t text_columns) {
  std::string s = "<div class=\"table-wrap\"><table><thead><tr>";
  for (const std::string& h : header) s += "<th scope=\"col\">" + escape_xml(h) + "</th>";
  s += "</tr></thead><tbody>";
  for (const auto& row : rows) {
    s += "<tr>";
    for (std::size_t i = 0; i < row.size(); ++i)
      s += (i < text_columns ? "<td>" : "<td class=\"num\">") + escape_xml(row[i]) + "</td>";
    s += "</tr>";
  }
  return s + "</tbody></table></div>";
}

std::string short_label(const ColumnProfile& profile) {
  std::string label = profile.label;
  if (label.size() > 72) label = label.substr(0, 70) + "...";
  return label;
}

std::string band_label(const BandEdges& bands, std::size_t b) {
  return fmt::format("{}-{} cm-1", format_number(bands.lower_cm1[b], 6), format_number(bands.upper_cm1[b], 6));
}

std::string page_style() {
  // Our own look: warm paper, slate ink, one teal accent; the system's sans-serif fonts only.
  return R"css(
:root { --ink: #1f2933; --muted: #52606d; --paper: #fdfcf9; --rule: #d9d4c7; --accent: #0b6e69; --warn: #8a4b08; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
  font-family: system-ui, -apple-system, "Segoe UI", Roboto, "Noto Sans", "Liberation Sans", Arial, sans-serif;
  font-size: 15px; line-height: 1.45; }
header.top { padding: 20px 28px 12px; border-bottom: 3px solid var(--accent); background: #f4f1ea; }
header.top h1 { margin: 0 0 4px; font-size: 22px; font-weight: 650; }
header.top .file { color: var(--muted); font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 13px; }
.caution { margin: 10px 0 0; padding: 6px 10px; border-left: 4px solid var(--warn); background: #fbf3e6; color: #4a2c05; font-size: 13.5px; }
nav.contents { padding: 8px 28px; font-size: 13.5px; border-bottom: 1px solid var(--rule); }
nav.contents a { color: var(--accent); margin-right: 14px; text-decoration: none; }
main { padding: 4px 28px 28px; }
section { margin-top: 22px; padding-top: 6px; border-top: 1px solid var(--rule); }
h2 { font-size: 18px; margin: 6px 0 6px; color: var(--accent); }
p.note { margin: 2px 0 10px; color: var(--muted); font-size: 13.5px; max-width: 70em; }
.plots { display: grid; grid-template-columns: repeat(auto-fill, minmax(470px, 1fr)); gap: 14px 22px; }
figure.plot { margin: 0; padding: 8px; background: #ffffff; border: 1px solid var(--rule); border-radius: 3px; break-inside: avoid; }
figure.plot svg { width: 100%; height: auto; display: block; }
figcaption { font-size: 12.5px; color: var(--muted); margin-top: 4px; }
.chart text { font-size: 11px; fill: #1f2933; }
.chart .chart-title { font-size: 13px; font-weight: 600; }
.chart .axis-title { font-size: 11.5px; fill: #3e4c59; }
.chart .grid { stroke: #e6e2d8; stroke-width: 1; }
.chart .frame { fill: none; stroke: #7b8794; stroke-width: 1; }
.chart .zero { stroke: #3e4c59; stroke-width: 1; stroke-dasharray: 3 3; }
.chart .tick { stroke: #3e4c59; }
.chart .value { font-size: 9.5px; fill: #3e4c59; }
.chart .cell-value { font-size: 10px; }
.chart .bar:hover rect, .chart .bin:hover, .chart .cell:hover { stroke: #000000; stroke-width: 1.5; }
.chart circle:hover { r: 4.5; }
.table-wrap { overflow-x: auto; }
table { border-collapse: collapse; font-size: 13px; margin: 6px 0 10px; }
th, td { padding: 3px 9px; border-bottom: 1px solid var(--rule); text-align: left; vertical-align: top; }
th { background: #f4f1ea; font-weight: 600; }
td.num { text-align: right; font-variant-numeric: tabular-nums; font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 12.5px; }
dl.meta { display: grid; grid-template-columns: max-content 1fr; gap: 3px 16px; font-size: 13.5px; margin: 4px 0; }
dl.meta dt { color: var(--muted); }
dl.meta dd { margin: 0; }
pre.study { background: #f4f1ea; padding: 8px 10px; font-size: 12px; overflow-x: auto; white-space: pre-wrap; }
footer { padding: 12px 28px 24px; color: var(--muted); font-size: 12.5px; border-top: 1px solid var(--rule); }
@media print {
  body { background: #ffffff; font-size: 11pt; }
  header.top, th, pre.study { background: #ffffff; }
  nav.contents { display: none; }
  .plots { grid-template-columns: 1fr 1fr; }
  section { break-inside: auto; }
  figure.plot { border-color: #999999; }
}
)css";
}

} // namespace bandstack::report
