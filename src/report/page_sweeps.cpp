// The main per-column results against the sweep axes: lines for one axis, heat maps for two.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "report/page.hpp"
#include "report/svg_frame.hpp"
#include "report/scalar_catalog.hpp"

namespace bandstack::report {

namespace {

constexpr std::size_t max_lines = 6;
// Points per line: a sweep of many values is drawn at this many evenly spread values (a line of
// 100,000 points would make the page tens of megabytes and show nothing more).
constexpr std::size_t max_line_points = 512;

// Position of the sampled grid: multiplier of each leading axis in the sampled, row-major order.
std::vector<std::size_t> sample_multipliers(const ResultData& data) {
  std::vector<std::size_t> m(data.axes.size(), 1);
  for (std::size_t d = data.axes.size(); d-- > 1;) m[d - 1] = m[d] * data.sample_count[d];
  return m;
}

// Sampled values of a leading axis.
std::vector<double> sampled_axis(const ResultData& data, std::size_t d) {
  std::vector<double> out;
  for (std::size_t i = 0; i < data.sample_count[d]; ++i) out.push_back(data.axes[d].values[i * data.sample_stride[d]]);
  return out;
}

AxisSpec axis_spec(const LeadingAxis& axis, const std::vector<double>& values) {
  AxisSpec spec{axis.name, axis.units};
  if (axis.units == "1e-6") spec.units = "ppmv";
  double lo = 0, hi = 0;
  data_range(values, Scale::log, lo, hi);
  const bool all_positive = std::all_of(values.begin(), values.end(), [](double v) { return v > 0.0; });
  if (all_positive && hi >= 8.0 * lo) spec.scale = Scale::log; // a range of near a decade or more: ratios matter
  return spec;
}

// Up to n indices evenly spread over 0..size-1 (all when size <= n).
std::vector<std::size_t> spread(std::size_t size, std::size_t n) {
  std::vector<std::size_t> out;
  if (size <= n) {
    for (std::size_t i = 0; i < size; ++i) out.push_back(i);
    return out;
  }
  for (std::size_t k = 0; k < n; ++k) out.push_back(static_cast<std::size_t>(std::llround(static_cast<double>(k) * static_cast<double>(size - 1) / static_cast<double>(n - 1))));
  return out;
}

std::string fixed_note(const ResultData& data, const std::vector<std::size_t>& varied) {
  std::string note;
  for (std::size_t d = 0; d < data.axes.size(); ++d) {
    if (std::find(varied.begin(), varied.end(), d) != varied.end() || data.axes[d].size < 2) continue;
    const LeadingAxis& a = data.axes[d];
    note += (note.empty() ? "" : ", ") + a.name + " = " +
            (!a.labels.empty() ? a.labels[0] : !a.values.empty() ? format_number(a.values[0], 6) : std::string("0"));
  }
  return note.empty() ? "" : "Other dimensions at their first value: " + note + ".";
}

std::string line_charts(const ResultData& data, std::size_t d) {
  const std::vector<std::size_t> m = sample_multipliers(data);
  const std::vector<double> xs = sampled_axis(data, d);
  // One line per value of the "column" dimension, if any.
  std::size_t line_axis = data.axes.size();
  for (std::size_t k = 0; k < data.axes.size(); ++k)
    if (k != d && data.axes[k].name == "column" && data.axes[k].size > 1) line_axis = k;
  const std::size_t n_lines = line_axis < data.axes.size() ? std::min(data.sample_count[line_axis], max_lines) : 1;
  std::string body;
  for (const ShownScalar& shown : shown_scalars(data)) {
    LineChart c;
    c.id = "sweep-" + shown.id;
    c.title = shown.title + " against " + data.axes[d].name;
    c.x = axis_spec(data.axes[d], xs);
    c.y = shown.axis;
    for (std::size_t l = 0; l < n_lines; ++l) {
      Series s;
      s.style = l;
      if (line_axis < data.axes.size()) {
        const LeadingAxis& a = data.axes[line_axis];
        const std::size_t full = l * data.sample_stride[line_axis];
        s.name = full < a.labels.size() ? a.labels[full] : fmt::format("{} {}", a.name, full);
      } else {
        s.name = shown.title;
      }
      for (std::size_t i : spread(xs.size(), max_line_points)) {
        const std::size_t idx = i * m[d] + (line_axis < data.axes.size() ? l * m[line_axis] : 0);
        s.x.push_back(xs[i]);
        s.y.push_back(shown.field->values[idx]);
      }
      c.series.push_back(std::move(s));
    }
    body += figure(render_line_chart(c), "");
  }
  std::vector<std::size_t> varied = {d};
  if (line_axis < data.axes.size()) varied.push_back(line_axis);
  return "<p class=\"note\">" + escape_xml(fixed_note(data, varied)) + "</p><div class=\"plots\">" + body + "</div>";
}

std::string heat_maps(const ResultData& data, std::size_t dx, std::size_t dy, const ReportOptions& options) {
  const std::vector<std::size_t> m = sample_multipliers(data);
  const std::vector<double> x_all = sampled_axis(data, dx);
  const std::vector<double> y_all = sampled_axis(data, dy);
  const std::vector<std::size_t> xi = spread(x_all.size(), std::max<std::size_t>(options.max_heat_map_cells, 2));
  const std::vector<std::size_t> yi = spread(y_all.size(), std::max<std::size_t>(options.max_heat_map_cells, 2));
  std::string body;
  for (const ShownScalar& shown : shown_scalars(data)) {
    HeatMap h;
    h.id = "sweep-map-" + shown.id;
    h.title = shown.title;
    for (const std::size_t i : xi) h.x_values.push_back(x_all[i]);
    for (const std::size_t j : yi) h.y_values.push_back(y_all[j]);
    h.x = axis_spec(data.axes[dx], h.x_values);
    h.y = axis_spec(data.axes[dy], h.y_values);
    h.value = shown.axis;
    for (const std::size_t j : yi)
      for (const std::size_t i : xi) h.values.push_back(shown.field->values[i * m[dx] + j * m[dy]]);
    body += figure(render_heat_map(h), "");
  }
  std::string note = fixed_note(data, {dx, dy});
  if (xi.size() < data.axes[dx].size || yi.size() < data.axes[dy].size)
    note += fmt::format(" Evenly spaced values are shown: {} of {} along {}, {} of {} along {}.", xi.size(), data.axes[dx].size,
                        data.axes[dx].name, yi.size(), data.axes[dy].size, data.axes[dy].name);
  return "<p class=\"note\">" + escape_xml(note) + "</p><div class=\"plots\">" + body + "</div>";
}

} // namespace

std::string section_sweeps(const ResultData& data, const ReportOptions& options) {
  std::vector<std::size_t> sweep_axes;
  for (std::size_t d = 0; d < data.axes.size(); ++d)
    if (data.axes[d].name != "column" && data.axes[d].values.size() == data.axes[d].size && data.axes[d].size > 1)
      sweep_axes.push_back(d);
  if (sweep_axes.empty() || data.sampled_count == 0) return "";
  const std::string body = sweep_axes.size() == 1 ? line_charts(data, sweep_axes[0])
                                                  : heat_maps(data, sweep_axes[0], sweep_axes[1], options);
  return section("sweeps", "Results across the sweep", "", body);
}

} // namespace bandstack::report
