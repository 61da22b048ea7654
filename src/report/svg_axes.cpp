// Ticks, axes, legends and the <svg> frame shared by every chart.
#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "report/svg_frame.hpp"

namespace bandstack::report {

namespace {

constexpr double tiny = 1e-300;

std::string tick_label(double value, double step) {
  if (std::abs(value) < step * 1e-9) return "0";
  const int decimals = std::max(0, -static_cast<int>(std::floor(std::log10(step) + 1e-9)));
  if (std::abs(value) >= 1e6 || std::abs(value) < 1e-4) return format_number(value, 3);
  return fmt::format("{:.{}f}", value, decimals);
}

} // namespace

std::string px(double value) { return fmt::format("{:.1f}", value); }

std::string AxisSpec::title() const { return units.empty() ? label : label + " (" + units + ")"; }

Ticks linear_ticks(double lo, double hi, int target) {
  Ticks ticks;
  if (!(std::isfinite(lo) && std::isfinite(hi))) return ticks;
  if (hi < lo) std::swap(lo, hi);
  if (hi - lo < std::max(std::abs(hi), 1.0) * 1e-12) {
    const double pad = lo == 0.0 ? 1.0 : std::abs(lo) * 0.05;
    lo -= pad;
    hi += pad;
  }
  const double raw = (hi - lo) / std::max(target, 1);
  const double power = std::pow(10.0, std::floor(std::log10(raw)));
  double step = power;
  for (const double m : {1.0, 2.0, 5.0, 10.0})
    if (m * power >= raw) {
      step = m * power;
      break;
    }
  const double first = std::floor(lo / step + 1e-9) * step;
  const double last = std::ceil(hi / step - 1e-9) * step;
  for (double v = first; v <= last + step * 0.5; v += step) {
    const double rounded = std::round(v / step) * step;
    ticks.values.push_back(rounded);
    ticks.labels.push_back(tick_label(rounded, step));
  }
  return ticks;
}

Ticks log_ticks(double lo, double hi) {
  Ticks ticks;
  if (!(lo > 0.0 && hi > lo && std::isfinite(hi))) return ticks;
  const int first = static_cast<int>(std::floor(std::log10(lo) + 1e-12));
  const int last = static_cast<int>(std::ceil(std::log10(hi) - 1e-12));
  // 1-2-5 marks over up to two decades, 1-3 over up to four, powers of ten beyond.
  const int decades = last - first;
  for (int e = first; e <= last; ++e)
    for (const double m : {1.0, 2.0, 3.0, 5.0}) {
      if (decades > 4 && m != 1.0) continue;
      if (decades > 2 && (m == 2.0 || m == 5.0)) continue;
      if (decades <= 2 && m == 3.0) continue;
      const double v = m * std::pow(10.0, e);
      if (v < lo * (1 - 1e-9) || v > hi * (1 + 1e-9)) continue;
      ticks.values.push_back(v);
      ticks.labels.push_back(fmt::format("{:g}", v));
    }
  if (ticks.values.size() < 2) {
    // Less than a decade without a 1-2-5 mark inside: plain linear ticks within the range.
    Ticks linear = linear_ticks(lo, hi, 4);
    ticks = {};
    for (std::size_t i = 0; i < linear.values.size(); ++i)
      if (linear.values[i] >= lo && linear.values[i] <= hi && linear.values[i] > 0.0) {
        ticks.values.push_back(linear.values[i]);
        ticks.labels.push_back(linear.labels[i]);
      }
  }
  return ticks;
}

void data_range(const std::vector<double>& values, Scale scale, double& lo, double& hi) {
  lo = std::numeric_limits<double>::infinity();
  hi = -lo;
  for (const double v : values)
    if (std::isfinite(v) && (scale == Scale::linear || v > 0.0)) {
      lo = std::min(lo, v);
      hi = std::max(hi, v);
    }
  if (lo > hi) lo = hi = std::nan("");
}

AxisMap::AxisMap(const AxisSpec& spec, double data_lo, double data_hi, double px_start, double px_end)
    : spec_(spec), px_start_(px_start), px_end_(px_end) {
  if (spec.scale == Scale::log) {
    if (!(data_lo > 0.0 && data_hi > 0.0)) data_lo = 1.0, data_hi = 10.0;
    if (data_hi <= data_lo * (1 + 1e-9)) data_lo /= 2.0, data_hi *= 2.0;
    // Extend to a round value (1, 2 or 5 times a power of ten) just outside the data, if one is
    // near, so both ends carry a label (e.g. 990 hPa -> 1000 hPa).
    const auto round_below = [](double v) {
      const double p = std::pow(10.0, std::floor(std::log10(v)));
      for (const double m : {5.0, 2.0, 1.0})
        if (m * p <= v) return m * p;
      return p;
    };
    const auto round_above = [](double v) {
      const double p = std::pow(10.0, std::floor(std::log10(v)));
      for (const double m : {1.0, 2.0, 5.0, 10.0})
        if (m * p >= v) return m * p;
      return 10.0 * p;
    };
    lo_ = round_below(data_lo) >= data_lo / 1.5 ? round_below(data_lo) : data_lo;
    hi_ = round_above(data_hi) <= data_hi * 1.5 ? round_above(data_hi) : data_hi;
    ticks_ = log_ticks(lo_, hi_);
  } else {
    if (!(std::isfinite(data_lo) && std::isfinite(data_hi))) data_lo = 0.0, data_hi = 1.0;
    if (spec.include_zero) data_lo = std::min(data_lo, 0.0), data_hi = std::max(data_hi, 0.0);
    ticks_ = linear_ticks(data_lo, data_hi);
    lo_ = ticks_.values.front();
    hi_ = ticks_.values.back();
  }
  if (spec.reversed) std::swap(px_start_, px_end_);
}

double AxisMap::operator()(double value) const {
  double f = 0.0;
  if (spec_.scale == Scale::log) f = (std::log(std::max(value, tiny)) - std::log(lo_)) / (std::log(hi_) - std::log(lo_));
  else f = (value - lo_) / (hi_ - lo_);
  return px_start_ + f * (px_end_ - px_start_);
}

std::string draw_x_axis(const AxisMap& axis, const Frame& frame) {
  std::string s = "<g class=\"axis x\">";
  for (std::size_t i = 0; i < axis.ticks().values.size(); ++i) {
    const double x = axis(axis.ticks().values[i]);
    if (x < frame.left - 0.5 || x > frame.right() + 0.5) continue;
    s += fmt::format("<line class=\"grid\" x1=\"{0}\" x2=\"{0}\" y1=\"{1}\" y2=\"{2}\"/>", px(x), px(frame.top), px(frame.bottom()));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text>", px(x), px(frame.bottom() + 15),
                     escape_xml(axis.ticks().labels[i]));
  }
  s += fmt::format("<text class=\"axis-title\" x=\"{}\" y=\"{}\" text-anchor=\"middle\">{}</text></g>",
                   px(frame.left + frame.width / 2), px(frame.bottom() + 33), escape_xml(axis.spec().title()));
  return s;
}

std::string draw_y_axis(const AxisMap& axis, const Frame& frame) {
  std::string s = "<g class=\"axis y\">";
  for (std::size_t i = 0; i < axis.ticks().values.size(); ++i) {
    const double y = axis(axis.ticks().values[i]);
    if (y < frame.top - 0.5 || y > frame.bottom() + 0.5) continue;
    s += fmt::format("<line class=\"grid\" x1=\"{0}\" x2=\"{1}\" y1=\"{2}\" y2=\"{2}\"/>", px(frame.left), px(frame.right()), px(y));
    s += fmt::format("<text x=\"{}\" y=\"{}\" text-anchor=\"end\">{}</text>", px(frame.left - 6), px(y + 4),
                     escape_xml(axis.ticks().labels[i]));
  }
  const double cy = frame.top + frame.height / 2;
  s += fmt::format("<text class=\"axis-title\" x=\"{0}\" y=\"{1}\" text-anchor=\"middle\" transform=\"rotate(-90 {0} {1})\">{2}</text></g>",
                   px(frame.left - 50), px(cy), escape_xml(axis.spec().title()));
  return s;
}

std::string stroke_style(std::size_t style, double width) {
  std::string s = fmt::format("stroke=\"{}\" stroke-width=\"{}\"", to_hex(category_colour(style)), px(width));
  if (const std::string_view dash = dash_pattern(style); !dash.empty()) s += fmt::format(" stroke-dasharray=\"{}\"", dash);
  return s;
}

std::string draw_legend(const std::vector<LegendEntry>& entries, double x, double y, double width, double& height) {
  std::string s = "<g class=\"legend\">";
  double cx = x;
  double cy = y + 12;
  const double row = 18.0;
  double used = entries.empty() ? 0.0 : row;
  for (const LegendEntry& e : entries) {
    const double w = 34.0 + 6.6 * static_cast<double>(e.name.size()) + 14.0;
    if (cx > x && cx + w > x + width) {
      cx = x;
      cy += row;
      used += row;
    }
    if (e.box)
      s += fmt::format("<rect x=\"{}\" y=\"{}\" width=\"12\" height=\"12\" fill=\"{}\"/>", px(cx + 10), px(cy - 9),
                       to_hex(category_colour(e.style)));
    else
      s += fmt::format("<line x1=\"{0}\" x2=\"{1}\" y1=\"{2}\" y2=\"{2}\" {3}/>", px(cx), px(cx + 28), px(cy - 4), stroke_style(e.style, 2.5));
    s += fmt::format("<text x=\"{}\" y=\"{}\">{}</text>", px(cx + 34), px(cy), escape_xml(e.name));
    cx += w;
  }
  height += used + (entries.empty() ? 0.0 : 6.0);
  return s + "</g>";
}

std::string open_svg(const std::string& id, const std::string& title, double height) {
  return fmt::format("<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"chart\" data-plot=\"{0}\" viewBox=\"0 0 {1} {2}\" "
                     "width=\"{1}\" height=\"{2}\" role=\"img\" aria-label=\"{3}\"><title>{3}</title>"
                     "<text class=\"chart-title\" x=\"8\" y=\"18\">{3}</text>",
                     escape_xml(id), px(canvas_width), px(height), escape_xml(title));
}

std::string close_svg() { return "</svg>"; }

} // namespace bandstack::report
