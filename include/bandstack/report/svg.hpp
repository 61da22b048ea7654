#pragma once
// A small SVG plotting layer for the report: axes with units (linear or logarithmic, optionally
// reversed), line and step charts, grouped horizontal bars, histograms and heat maps. Every drawn
// value carries a <title> so it can be read on hover; every chart returns one well-formed <svg>
// element with a data-plot attribute naming it. Numbers are written independent of the locale.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace bandstack::report {

// ---- text -------------------------------------------------------------------------------------

// Escapes &, <, >, " and ' for XML text and attribute values.
[[nodiscard]] std::string escape_xml(std::string_view text);
// A number with `significant` significant digits, "−" never used (ASCII minus), "NaN" for NaN.
[[nodiscard]] std::string format_number(double value, int significant = 4);

// ---- colours ----------------------------------------------------------------------------------

struct Rgb {
  double r = 0.0, g = 0.0, b = 0.0; // sRGB components in [0, 1]
};
// "#rrggbb".
[[nodiscard]] std::string to_hex(const Rgb& colour);
// Relative luminance of an sRGB colour (WCAG 2.x definition), in [0, 1].
[[nodiscard]] double relative_luminance(const Rgb& colour);
// Series colour i (cycles): the eight colours of Okabe & Ito (2008), "Color Universal Design",
// distinguishable with the common colour-vision deficiencies; black first for print.
[[nodiscard]] Rgb category_colour(std::size_t i);
// Stroke dash pattern of series i (cycles; "" = solid), so lines stay apart in grey print.
[[nodiscard]] std::string_view dash_pattern(std::size_t i);
// Sequential colour map for t in [0, 1] (clamped; NaN gives light grey): dark blue to yellow,
// lightness increasing monotonically, after the cividis map of Nuñez, Anderton & Renslow (2018,
// PLoS ONE 13(7): e0199239), which reads the same for the common colour-vision deficiencies.
[[nodiscard]] Rgb sequential_colour(double t);

// ---- axes -------------------------------------------------------------------------------------

enum class Scale { linear, log };

// Tick positions and labels covering [lo, hi] (data units).
struct Ticks {
  std::vector<double> values;
  std::vector<std::string> labels;
};
// About `target` ticks at 1, 2 or 5 times a power of ten, covering [lo, hi]; the first and last
// tick lie at or outside the range (the axis is then extended to them).
[[nodiscard]] Ticks linear_ticks(double lo, double hi, int target = 6);
// Ticks at 1, 2 and 5 times each power of ten within [lo, hi] (0 < lo < hi), or only at the powers
// of ten when the range spans more than three decades; labels in plain notation (0.5, 10, 1000).
[[nodiscard]] Ticks log_ticks(double lo, double hi);

struct AxisSpec {
  std::string label;              // quantity, e.g. "temperature"
  std::string units;              // shown in parentheses, e.g. "K"
  Scale scale = Scale::linear;
  bool reversed = false;          // values decreasing along the axis (pressure upward)
  bool include_zero = false;      // linear axes: always show 0
  [[nodiscard]] std::string title() const; // "label (units)"
};

// ---- charts -----------------------------------------------------------------------------------

struct Series {
  std::string name;               // legend text
  std::vector<double> x, y;       // points; NaN breaks the line
  bool steps = false;             // draw as horizontal steps between x_edges (spectra)
  std::vector<double> x_edges;    // with steps: x.size()+1 edges; x holds the centres
  bool points = true;             // draw hoverable markers at the points
  std::size_t style = 0;          // colour and dash index
  double width = 2.0;             // stroke width in px
};

// A straight reference line across the plot (e.g. the tropopause) with a label.
struct Reference {
  bool horizontal = true;         // at y = value (else x = value)
  double value = 0.0;
  std::string label;
  std::size_t style = 0;
};

struct LineChart {
  std::string id;                 // data-plot attribute
  std::string title;              // drawn above the plot
  AxisSpec x, y;
  std::vector<Series> series;
  std::vector<Reference> references;
};
[[nodiscard]] std::string render_line_chart(const LineChart& chart);

// Grouped horizontal bars: one row per category, one bar per series within it.
struct BarChart {
  std::string id;
  std::string title;
  AxisSpec value_axis;            // the horizontal axis
  std::vector<std::string> categories;
  std::vector<std::string> series_names;      // legend; one bar per category each
  std::vector<std::vector<double>> values;    // [series][category]; NaN = no bar
};
[[nodiscard]] std::string render_bar_chart(const BarChart& chart);

// Counts per bin over [edges[i], edges[i+1]).
struct Histogram {
  std::string id;
  std::string title;
  AxisSpec x;
  std::vector<double> edges;
  std::vector<std::size_t> counts;
};
[[nodiscard]] std::string render_histogram(const Histogram& chart);

// Cells on a grid of x and y values (each axis drawn as evenly spaced cells labelled with its values)
// coloured by the sequential map, with a colour bar.
struct HeatMap {
  std::string id;
  std::string title;
  AxisSpec x, y, value;
  std::vector<double> x_values, y_values;
  std::vector<double> values;     // row-major [y][x]; NaN = grey cell
};
[[nodiscard]] std::string render_heat_map(const HeatMap& chart);

} // namespace bandstack::report
