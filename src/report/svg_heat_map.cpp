// Heat maps of a result over two sweep axes, with a colour bar.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "report/svg_frame.hpp"

namespace bandstack::report {

namespace {

// Labels at most about `room` of the cell centres (every k-th), so they do not overlap.
std::size_t label_step(std::size_t n, std::size_t room) { return std::max<std::size_t>(1, (n + room - 1) / room); }

} // namespace

std::string render_heat_map(const HeatMap& c) {
  const std::size_t nx = c.x_values.size();
  const std::size_t ny = c.y_values.size();
  const Frame frame{84.0, 30.0, canvas_width - 84.0 - 110.0, 300.0};
  double v_lo = 0, v_hi = 0;
  data_range(c.values, Scale::linear, v_lo, v_hi);
  if (!std::isfinite(v_lo)) v_lo = 0.0, v_hi = 1.0;
  const bool constant = !(v_hi > v_lo);
  const double span = constant ? 1.0 : v_hi - v_lo;
  const auto colour_of = [&](double v) {
    if (!std::isfinite(v)) return sequential_colour(std::nan(""));
    return sequential_colour(constant ? 0.5 : (v - v_lo) / span);
  };

  std::string s = open_svg(c.id, c.title, frame.bottom() + 50.0);
  const double cw = frame.width / static_cast<double>(std::max<std::size_t>(nx, 1));
  const double ch = frame.height / static_cast<double>(std::max<std::size_t>(ny, 1));
  const bool numbers = nx <= 8 && ny <= 8;
  s += "<g class=\"cells\">";
  for (std::size_t j = 0; j < ny; ++j)
    for (std::size_t i = 0; i < nx; ++i) {
      const double v = j * nx + i < c.values.size() ? c.values[j * nx + i] : std::nan("");
      const Rgb colour = colour_of(v);
      const double x0 = frame.left + cw * static_cast<double>(i);
      const double y0 = frame.bottom() - ch * static_cast<double>(j + 1); // first y value at the bottom
      const std::string title = fmt::format("{} {} {}, {} {} {}: {} {} {}", c.x.label, format_number(c.x_values[i]), c.x.units,
                                            c.y.label, format_number(c.y_values[j]), c.y.units, c.value.label,
                                            format_number(v), c.value.units);
      s += fmt::format("<rect class=\"cell\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"><title>{}</title></rect>",
                       px(x0), px(y0), px(cw + 0.3), px(ch + 0.3), to_hex(colour), escape_xml(title));
      if (numbers && std::isfinite(v))
        s += fmt::format("<text class=\"cell-value\" x=\"{}\" y=\"{}\" text-anchor=\"middle\" style=\"fill:{}\">{}</text>",
                         px(x0 + cw / 2), px(y0 + ch / 2 + 4), relative_luminance(colour) > 0.3 ? "#000000" : "#ffffff",
                         escape_xml(format_number(v, 4)));
    }
  s += "</g>";
  s += fmt::format("<rect class=\"frame\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/>", px(frame.left), px(frame.top),
                   px(frame.width), px(frame.height));
  for (std::size_t i = 0; i < nx; i += label_step(nx, 10))
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>", px(frame.left + cw * (static_cast<double>(i) + 0.5)),
                     px(frame.bottom() + 15), escape_xml(format_number(c.x_values[i])));
  for (std::size_t j = 0; j < ny; j += label_step(ny, 14))
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>", px(frame.left - 6),
                     px(frame.bottom() - ch * (static_cast<double>(j) + 0.5) + 4), escape_xml(format_number(c.y_values[j])));
  s += fmt::format("<text class=\"axis-title\" x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>", px(frame.left + frame.width / 2),
                   px(frame.bottom() + 33), escape_xml(c.x.title()));
  s += fmt::format("<text class=\"axis-title\" x=\"{0}\" y=\"{1}\" text-anchor=\"middle\" transform=\"rotate(-90 {0} {1})\">{2}</text>",
                   px(frame.left - 58), px(frame.top + frame.height / 2), escape_xml(c.y.title()));

  // Colour bar: 40 steps from the lowest value (bottom) to the highest (top), with ticks.
  const double bar_x = frame.right() + 16.0;
  s += "<g class=\"colour-bar\">";
  const int steps = 40;
  for (int k = 0; k < steps; ++k) {
    const double t = (k + 0.5) / steps;
    s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"16\" height=\"{}\" fill=\"{}\"/>", px(bar_x),
                     px(frame.bottom() - frame.height * (k + 1) / steps), px(frame.height / steps + 0.3), to_hex(sequential_colour(t)));
  }
  Ticks ticks = linear_ticks(v_lo, v_hi, 5);
  if (constant) ticks = {{v_lo}, {format_number(v_lo, 5) + " (all cells)"}};
  for (std::size_t k = 0; k < ticks.values.size(); ++k) {
    if (ticks.values[k] < v_lo - span * 1e-9 || ticks.values[k] > v_hi + span * 1e-9) continue;
    const double y = constant ? frame.top + frame.height / 2 : frame.bottom() - frame.height * (ticks.values[k] - v_lo) / span;
    s += fmt::format("<line class=\"tick\" x1=\"{0}\" x2=\"{1}\" y1=\"{2}\" y2=\"{2}\"/><text x=\"{3}\" y=\"{4}\">{5}</text>",
                     px(bar_x + 16), px(bar_x + 20), px(y), px(bar_x + 22), px(y + 4), escape_xml(ticks.labels[k]));
  }
  s += fmt::format("<text class=\"axis-title\" x=\"{0}\" y=\"{1}\" text-anchor=\"middle\" transform=\"rotate(-90 {0} {1})\">{2}</text></g>",
                   px(bar_x + 80), px(frame.top + frame.height / 2), escape_xml(c.value.title()));
  return s + close_svg();
}

} // namespace bandstack::report
