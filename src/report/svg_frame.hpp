#pragma once
// Private to report: the pieces every chart shares (mapping data to pixels, drawing axes, the
// legend, the <svg> element).
#include <string>
#include <vector>

#include "bandstack/report/svg.hpp"

namespace bandstack::report {

// Canvas width of every chart in px (the page scales it).
inline constexpr double canvas_width = 640.0;

// The plot area in px.
struct Frame {
  double left = 0.0, top = 0.0, width = 0.0, height = 0.0;
  [[nodiscard]] double right() const { return left + width; }
  [[nodiscard]] double bottom() const { return top + height; }
};

// One axis fitted to a data range and mapped onto [px_start, px_end].
class AxisMap {
public:
  // Fits the axis to [data_lo, data_hi] (NaN or empty ranges get a default span).
  AxisMap(const AxisSpec& spec, double data_lo, double data_hi, double px_start, double px_end);
  [[nodiscard]] double operator()(double value) const;   // px
  [[nodiscard]] const AxisSpec& spec() const { return spec_; }
  [[nodiscard]] const Ticks& ticks() const { return ticks_; }
  [[nodiscard]] double lo() const { return lo_; }
  [[nodiscard]] double hi() const { return hi_; }

private:
  AxisSpec spec_;
  double lo_ = 0.0, hi_ = 1.0, px_start_ = 0.0, px_end_ = 1.0;
  Ticks ticks_;
};

// Finite (and, for a log axis, positive) minimum and maximum of the values; NaN if none.
void data_range(const std::vector<double>& values, Scale scale, double& lo, double& hi);

// Grid lines, tick marks, tick labels and the axis title of a horizontal / vertical axis.
[[nodiscard]] std::string draw_x_axis(const AxisMap& axis, const Frame& frame);
[[nodiscard]] std::string draw_y_axis(const AxisMap& axis, const Frame& frame);

struct LegendEntry {
  std::string name;
  std::size_t style = 0;
  bool box = false;               // a filled square (bars) instead of a line sample
};
// Rows of entries starting at y (px), left to right; returns the markup and adds the height used.
[[nodiscard]] std::string draw_legend(const std::vector<LegendEntry>& entries, double x, double y, double width,
                                      double& height);

// Opens the <svg> element with its viewBox, data-plot id, accessible title and the chart title.
[[nodiscard]] std::string open_svg(const std::string& id, const std::string& title, double height);
[[nodiscard]] std::string close_svg();

// Stroke attributes of series style i: colour, dash pattern.
[[nodiscard]] std::string stroke_style(std::size_t style, double width);

// A px value as SVG text with one decimal.
[[nodiscard]] std::string px(double value);

} // namespace bandstack::report
