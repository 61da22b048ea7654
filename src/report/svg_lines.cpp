// Line and step charts (profiles, heating rates, spectra, sweep results).
#include <cmath>

#include <fmt/format.h>

#include "report/svg_frame.hpp"

namespace bandstack::report {

namespace {

bool usable(double v, Scale scale) { return std::isfinite(v) && (scale == Scale::linear || v > 0.0); }

// The path of one series: lines between points, broken at missing values; or steps over edges.
std::string series_path(const Series& s, const AxisMap& x, const AxisMap& y) {
  std::string d;
  bool pen_down = false;
  if (s.steps && s.x_edges.size() == s.y.size() + 1) {
    for (std::size_t i = 0; i < s.y.size(); ++i) {
      if (!usable(s.y[i], y.spec().scale)) {
        pen_down = false;
        continue;
      }
      const double y_px = y(s.y[i]);
      d += fmt::format("{}{} {}H{}", pen_down ? "V" : "M", pen_down ? "" : px(x(s.x_edges[i])) + " ",
                       pen_down ? px(y_px) : px(y_px), px(x(s.x_edges[i + 1])));
      pen_down = true;
    }
    return d;
  }
  for (std::size_t i = 0; i < s.x.size() && i < s.y.size(); ++i) {
    if (!usable(s.x[i], x.spec().scale) || !usable(s.y[i], y.spec().scale)) {
      pen_down = false;
      continue;
    }
    d += fmt::format("{}{} {}", pen_down ? "L" : "M", px(x(s.x[i])), px(y(s.y[i])));
    pen_down = true;
  }
  return d;
}

std::string point_title(const Series& s, const LineChart& c, double x, double y) {
  return fmt::format("{}: {} {} {}, {} {} {}", s.name, c.x.label, format_number(x), c.x.units, c.y.label,
                     format_number(y), c.y.units);
}

} // namespace

std::string render_line_chart(const LineChart& c) {
  std::vector<double> xs, ys;
  for (const Series& s : c.series) {
    xs.insert(xs.end(), s.x.begin(), s.x.end());
    if (s.steps) xs.insert(xs.end(), s.x_edges.begin(), s.x_edges.end());
    ys.insert(ys.end(), s.y.begin(), s.y.end());
  }
  for (const Reference& r : c.references) (r.horizontal ? ys : xs).push_back(r.value);
  double x_lo = 0, x_hi = 0, y_lo = 0, y_hi = 0;
  data_range(xs, c.x.scale, x_lo, x_hi);
  data_range(ys, c.y.scale, y_lo, y_hi);

  std::vector<LegendEntry> entries;
  for (const Series& s : c.series) entries.push_back({s.name, s.style, false});
  double legend_height = 0.0;
  const Frame frame{74.0, 30.0, canvas_width - 74.0 - 18.0, 300.0};
  const std::string legend = draw_legend(entries, 12.0, frame.bottom() + 42.0, canvas_width - 24.0, legend_height);
  const AxisMap x(c.x, x_lo, x_hi, frame.left, frame.right());
  const AxisMap y(c.y, y_lo, y_hi, frame.bottom(), frame.top);

  std::string s = open_svg(c.id, c.title, frame.bottom() + 44.0 + legend_height);
  s += fmt::format("<defs><clipPath id=\"{}-clip\"><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/></clipPath></defs>",
                   escape_xml(c.id), px(frame.left), px(frame.top), px(frame.width), px(frame.height));
  s += draw_x_axis(x, frame) + draw_y_axis(y, frame);
  s += fmt::format("<rect class=\"frame\" x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/>", px(frame.left), px(frame.top),
                   px(frame.width), px(frame.height));
  s += fmt::format("<g clip-path=\"url(#{}-clip)\">", escape_xml(c.id));
  if (c.x.scale == Scale::linear && x.lo() < 0.0 && x.hi() > 0.0)
    s += fmt::format("<line class=\"zero\" x1=\"{0}\" x2=\"{0}\" y1=\"{1}\" y2=\"{2}\"/>", px(x(0.0)), px(frame.top), px(frame.bottom()));
  for (std::size_t k = 0; k < c.references.size(); ++k) {
    const Reference& r = c.references[k];
    // Labels of successive horizontal references alternate between the right and the left end, so
    // references at the same height (tropopause and top of the convective region) stay readable.
    const bool at_right = k % 2 == 0;
    const std::string title = escape_xml(fmt::format("{}: {} {}", r.label, format_number(r.value),
                                                     r.horizontal ? c.y.units : c.x.units));
    if (r.horizontal)
      s += fmt::format("<g class=\"reference\"><title>{0}</title><line x1=\"{1}\" x2=\"{2}\" y1=\"{3}\" y2=\"{3}\" {4}/>"
                       "<text x=\"{5}\" y=\"{6}\" text-anchor=\"{8}\">{7}</text></g>",
                       title, px(frame.left), px(frame.right()), px(y(r.value)), stroke_style(r.style, 1.2),
                       px(at_right ? frame.right() - 4 : frame.left + 4), px(y(r.value) - 4), escape_xml(r.label),
                       at_right ? "end" : "start");
    else
      s += fmt::format("<g class=\"reference\"><title>{0}</title><line x1=\"{2}\" x2=\"{2}\" y1=\"{3}\" y2=\"{4}\" {5}/>"
                       "<text x=\"{6}\" y=\"{7}\">{8}</text></g>",
                       title, "", px(x(r.value)), px(frame.top), px(frame.bottom()), stroke_style(r.style, 1.2),
                       px(x(r.value) + 4), px(frame.top + 12), escape_xml(r.label));
  }
  for (const Series& series : c.series) {
    s += fmt::format("<g class=\"series\" data-series=\"{}\"><title>{}</title>", escape_xml(series.name), escape_xml(series.name));
    s += fmt::format("<path d=\"{}\" fill=\"none\" {} stroke-linejoin=\"round\"/>", series_path(series, x, y),
                     stroke_style(series.style, series.width));
    if (series.points) {
      const std::string colour = to_hex(category_colour(series.style));
      for (std::size_t i = 0; i < series.x.size() && i < series.y.size(); ++i) {
        if (!usable(series.x[i], c.x.scale) || !usable(series.y[i], c.y.scale)) continue;
        s += fmt::format("<circle cx=\"{}\" cy=\"{}\" r=\"2.6\" fill=\"{}\"><title>{}</title></circle>", px(x(series.x[i])),
                         px(y(series.y[i])), colour, escape_xml(point_title(series, c, series.x[i], series.y[i])));
      }
    }
    s += "</g>";
  }
  s += "</g>" + legend + close_svg();
  return s;
}

} // namespace bandstack::report
