// The run at a glance: a table of the columns (small runs) or distributions over the columns.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "report/page.hpp"
#include "report/scalar_catalog.hpp"

namespace bandstack::report {

namespace {

constexpr std::size_t max_table_columns = 40;   // per-column table up to this many columns
constexpr std::size_t min_histogram_columns = 12; // distributions from this many columns
constexpr std::size_t histogram_bins = 30;

std::vector<double> finite_sorted(const std::vector<double>& values) {
  std::vector<double> out;
  for (const double v : values)
    if (std::isfinite(v)) out.push_back(v);
  std::sort(out.begin(), out.end());
  return out;
}

// Quantile q of sorted values, linear between order statistics (Hyndman & Fan 1996, definition 7).
double quantile(const std::vector<double>& sorted, double q) {
  if (sorted.empty()) return std::nan("");
  const double h = q * static_cast<double>(sorted.size() - 1);
  const auto lo = static_cast<std::size_t>(std::floor(h));
  const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
  return sorted[lo] + (h - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

} // namespace

std::string section_overview(const ResultData& data, const ReportOptions& /*options*/) {
  const std::vector<ShownScalar> shown = shown_scalars(data, 1);
  if (data.column_count > max_table_columns || data.sampled_count != data.column_count || shown.empty()) return "";
  std::vector<std::string> header = {"column"};
  for (const ShownScalar& s : shown) header.push_back(s.title + (s.axis.units.empty() ? "" : " (" + s.axis.units + ")"));
  std::vector<std::vector<std::string>> rows;
  for (std::size_t i = 0; i < data.column_count; ++i) {
    std::vector<std::string> row = {data.column_label(i)};
    for (const ShownScalar& s : shown) row.push_back(std::isfinite(s.field->values[i]) ? format_number(s.field->values[i], 5) : "-");
    rows.push_back(std::move(row));
  }
  return section("columns", "Columns at a glance", "", table(header, rows));
}

std::string section_distributions(const ResultData& data) {
  if (data.column_count < min_histogram_columns) return "";
  std::string body;
  std::vector<std::vector<std::string>> rows;
  for (const ShownScalar& s : shown_scalars(data)) {
    const std::vector<double> v = finite_sorted(s.field->values);
    if (v.empty()) continue;
    double sum = 0.0;
    for (const double x : v) sum += x;
    rows.push_back({s.title, s.axis.units, format_number(v.front(), 5), format_number(quantile(v, 0.05), 5),
                    format_number(quantile(v, 0.5), 5), format_number(quantile(v, 0.95), 5), format_number(v.back(), 5),
                    format_number(sum / static_cast<double>(v.size()), 5), std::to_string(v.size())});
    Histogram h;
    h.id = "distribution-" + s.id;
    h.title = "Distribution of " + s.title;
    h.x = s.axis;
    const double lo = v.front();
    const double hi = v.back() > lo ? v.back() : lo + 1.0;
    for (std::size_t b = 0; b <= histogram_bins; ++b) h.edges.push_back(lo + (hi - lo) * static_cast<double>(b) / histogram_bins);
    h.counts.assign(histogram_bins, 0);
    for (const double x : v)
      ++h.counts[std::min(histogram_bins - 1, static_cast<std::size_t>((x - lo) / (hi - lo) * histogram_bins))];
    body += figure(render_histogram(h), "");
  }
  if (rows.empty()) return "";
  const std::string note =
      data.sampled_count < data.column_count
          ? fmt::format("From an even sample of {} of the {} columns (every n-th value along each dimension).", data.sampled_count,
                        data.column_count)
          : fmt::format("Over all {} columns.", data.column_count);
  return section("distributions", "Distributions over the columns", note,
                 table({"result", "units", "min", "5 %", "median", "95 %", "max", "mean", "columns"}, rows, 2) +
                     "<div class=\"plots\">" + body + "</div>");
}

} // namespace bandstack::report
