// Grouped horizontal bars (attribution, experiments) and histograms (distributions over columns).
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "report/svg_frame.hpp"

namespace bandstack::report {

std::string render_bar_chart(const BarChart& c) {
  std::size_t longest = 4;
  for (const std::string& category : c.categories) longest = std::max(longest, category.size());
  const double left = std::clamp(12.0 + 6.4 * static_cast<double>(longest), 70.0, 250.0);
  const std::size_t n_series = std::max<std::size_t>(c.values.size(), 1);
  const double bar = n_series > 3 ? 9.0 : 13.0;
  const double group = bar * static_cast<double>(n_series) + 10.0;
  const Frame frame{left, 30.0, canvas_width - left - 56.0, group * static_cast<double>(std::max<std::size_t>(c.categories.size(), 1))};

  std::vector<double> all;
  for (const auto& series : c.values) all.insert(all.end(), series.begin(), series.end());
  double lo = 0, hi = 0;
  data_range(all, Scale::linear, lo, hi);
  AxisSpec spec = c.value_axis;
  spec.include_zero = true;
  const AxisMap x(spec, lo, hi, frame.left, frame.right());

  std::vector<LegendEntry> entries;
  if (c.series_names.size() > 1)
    for (std::size_t k = 0; k < c.series_names.size(); ++k) entries.push_back({c.series_names[k], k, true});
  double legend_height = 0.0;
  const std::string legend = draw_legend(entries, 12.0, frame.bottom() + 42.0, canvas_width - 24.0, legend_height);

  std::string s = open_svg(c.id, c.title, frame.bottom() + 44.0 + legend_height);
  s += draw_x_axis(x, frame);
  s += fmt::format("<rect class=\"frame\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/>", px(frame.left), px(frame.top),
                   px(frame.width), px(frame.height));
  const double zero = x(0.0);
  for (std::size_t i = 0; i < c.categories.size(); ++i) {
    const double top = frame.top + group * static_cast<double>(i) + 5.0;
    s += fmt::format("<text class=\"category\" x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>", px(frame.left - 6),
                     px(top + group / 2.0 - 1.0), escape_xml(c.categories[i]));
    for (std::size_t k = 0; k < c.values.size(); ++k) {
      const double v = i < c.values[k].size() ? c.values[k][i] : std::nan("");
      if (!std::isfinite(v)) continue;
      const double end = x(v);
      const double y = top + bar * static_cast<double>(k);
      const std::string name = k < c.series_names.size() ? c.series_names[k] : "";
      const std::string title = fmt::format("{}{}{}: {} {}", c.categories[i], name.empty() ? "" : ", ", name,
                                            format_number(v), c.value_axis.units);
      s += fmt::format("<g class=\"bar\"><title>{}</title><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>"
                       "<text class=\"value\" x=\"{}\" y=\"{}\" text-anchor=\"{}\">{}</text></g>",
                       escape_xml(title), px(std::min(zero, end)), px(y), px(std::max(std::abs(end - zero), 0.8)), px(bar - 1.5),
                       to_hex(category_colour(k)), px(v >= 0 ? end + 3 : end - 3), px(y + bar - 3.5), v >= 0 ? "start" : "end",
                       escape_xml(format_number(v, 3)));
    }
  }
  s += fmt::format("<line class=\"zero\" x1=\"{0}\" x2=\"{0}\" y1=\"{1}\" y2=\"{2}\"/>", px(zero), px(frame.top), px(frame.bottom()));
  return s + legend + close_svg();
}

std::string render_histogram(const Histogram& c) {
  const Frame frame{74.0, 30.0, canvas_width - 74.0 - 18.0, 220.0};
  double x_lo = 0, x_hi = 0;
  data_range(c.edges, Scale::linear, x_lo, x_hi);
  const AxisMap x(c.x, x_lo, x_hi, frame.left, frame.right());
  std::vector<double> counts(c.counts.begin(), c.counts.end());
  double y_lo = 0, y_hi = 0;
  data_range(counts, Scale::linear, y_lo, y_hi);
  const AxisMap y(AxisSpec{"columns", "count", Scale::linear, false, true}, 0.0, std::max(y_hi, 1.0), frame.bottom(), frame.top);

  std::string s = open_svg(c.id, c.title, frame.bottom() + 44.0);
  s += draw_x_axis(x, frame) + draw_y_axis(y, frame);
  s += fmt::format("<rect class=\"frame\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/>", px(frame.left), px(frame.top),
                   px(frame.width), px(frame.height));
  const std::string fill = to_hex(category_colour(1));
  for (std::size_t i = 0; i < c.counts.size() && i + 1 < c.edges.size(); ++i) {
    const double x0 = x(c.edges[i]);
    const double x1 = x(c.edges[i + 1]);
    const double top = y(static_cast<double>(c.counts[i]));
    const std::string title = fmt::format("{} to {} {}: {} columns", format_number(c.edges[i]), format_number(c.edges[i + 1]),
                                          c.x.units, c.counts[i]);
    s += fmt::format("<rect class=\"bin\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"><title>{}</title></rect>",
                     px(x0 + 0.5), px(top), px(std::max(x1 - x0 - 1.0, 0.5)), px(frame.bottom() - top), fill, escape_xml(title));
  }
  return s + close_svg();
}

} // namespace bandstack::report
