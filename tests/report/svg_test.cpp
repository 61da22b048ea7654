// The SVG plotting layer: ticks, colours, escaping, and well-formed charts.
#include <cmath>
#include <set>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "bandstack/report/svg.hpp"
#include "report/xml_check.hpp"

namespace br = bandstack::report;

TEST(LogTicks, OneTwoFiveWithinTwoDecades) {
  // 1-2-5 marks per decade on a log axis (common practice).
  const br::Ticks t = br::log_ticks(1.0, 100.0);
  const std::vector<double> expected = {1, 2, 5, 10, 20, 50, 100};
  ASSERT_EQ(t.values.size(), expected.size());
  for (std::size_t i = 0; i < expected.size(); ++i) EXPECT_NEAR(t.values[i], expected[i], 1e-12 * expected[i]);
  EXPECT_EQ(t.labels.front(), "1");
  EXPECT_EQ(t.labels.back(), "100");
}

TEST(LogTicks, PressureRangeUsesOneThreeMarks) {
  // 0.5 to 1000 hPa: 1, 3, 10, 30, 100, 300, 1000 (a log-pressure axis over 3.3 decades).
  const br::Ticks t = br::log_ticks(0.5, 1000.0);
  const std::vector<double> expected = {1, 3, 10, 30, 100, 300, 1000};
  ASSERT_EQ(t.values.size(), expected.size());
  for (std::size_t i = 0; i < expected.size(); ++i) EXPECT_NEAR(t.values[i], expected[i], 1e-12 * expected[i]);
  for (std::size_t i = 1; i < t.values.size(); ++i) EXPECT_GT(t.values[i], t.values[i - 1]);
}

TEST(LogTicks, WideRangeOnlyPowersOfTen) {
  const br::Ticks t = br::log_ticks(1e-3, 1e3);
  ASSERT_EQ(t.values.size(), 7u);
  for (std::size_t i = 0; i < t.values.size(); ++i)
    EXPECT_NEAR(std::log10(t.values[i]), -3.0 + static_cast<double>(i), 1e-12);
}

TEST(LogTicks, NarrowRangeStillHasTicksInside) {
  const br::Ticks t = br::log_ticks(300.0, 800.0);
  ASSERT_GE(t.values.size(), 2u);
  for (const double v : t.values) {
    EXPECT_GE(v, 300.0);
    EXPECT_LE(v, 800.0);
  }
}

TEST(LinearTicks, CoverRangeWithRoundSteps) {
  const br::Ticks t = br::linear_ticks(-0.3, 9.3, 6);
  ASSERT_GE(t.values.size(), 3u);
  EXPECT_LE(t.values.front(), -0.3);
  EXPECT_GE(t.values.back(), 9.3);
  const double step = t.values[1] - t.values[0];
  EXPECT_NEAR(step, 2.0, 1e-12); // 1-2-5 steps: 9.6/6 = 1.6 rounds up to 2
  EXPECT_EQ(t.labels[1], "0");
}

TEST(Colours, SequentialMapLightnessIncreases) {
  // cividis is designed with monotonically increasing lightness (Nuñez, Anderton & Renslow 2018,
  // PLoS ONE 13(7): e0199239), so ordering survives grey print and colour-vision deficiencies.
  double previous = -1.0;
  for (int i = 0; i <= 100; ++i) {
    const double y = br::relative_luminance(br::sequential_colour(i / 100.0));
    EXPECT_GT(y, previous) << "at t = " << i / 100.0;
    previous = y;
  }
  EXPECT_LT(br::relative_luminance(br::sequential_colour(0.0)), 0.05);
  EXPECT_GT(br::relative_luminance(br::sequential_colour(1.0)), 0.7);
}

TEST(Colours, WcagLuminanceOfBlackAndWhite) {
  // WCAG 2.1 relative luminance: 0 for black, 1 for white (definition).
  EXPECT_DOUBLE_EQ(br::relative_luminance({0, 0, 0}), 0.0);
  EXPECT_NEAR(br::relative_luminance({1, 1, 1}), 1.0, 1e-12);
}

TEST(Colours, CategoriesAreDistinctAndHex) {
  std::set<std::string> seen;
  for (std::size_t i = 0; i < 8; ++i) seen.insert(br::to_hex(br::category_colour(i)));
  EXPECT_EQ(seen.size(), 8u);
  EXPECT_EQ(br::to_hex(br::category_colour(1)), "#0072b2"); // Okabe & Ito (2008) blue (from memory)
  EXPECT_TRUE(br::dash_pattern(0).empty());
  EXPECT_FALSE(br::dash_pattern(1).empty());
}

TEST(Text, EscapingAndNumbers) {
  EXPECT_EQ(br::escape_xml("a<b & \"c\" 'd'>"), "a&lt;b &amp; &quot;c&quot; &#39;d&#39;&gt;");
  EXPECT_EQ(br::format_number(1234.5678, 4), "1235");
  EXPECT_EQ(br::format_number(-0.0), "0");
  EXPECT_EQ(br::format_number(std::nan("")), "NaN");
  EXPECT_EQ(br::format_number(0.5, 3), "0.5"); // '.' whatever the locale
}

namespace {

void expect_well_formed_svg(const std::string& svg, const std::string& plot, const std::string& drawn, int at_least) {
  const xml_check::Result r = xml_check::check(svg);
  ASSERT_EQ(r.error, "") << svg.substr(0, 400);
  EXPECT_EQ(r.element_count.at("svg"), 1);
  EXPECT_NE(svg.find("data-plot=\"" + plot + "\""), std::string::npos);
  ASSERT_TRUE(r.element_count.count(drawn)) << drawn;
  EXPECT_GE(r.element_count.at(drawn), at_least);
}

} // namespace

TEST(Charts, LineChartOnLogPressureAxisIsWellFormed) {
  br::LineChart c;
  c.id = "t<1>";
  c.title = "Temperature & pressure";
  c.x = {"temperature", "K"};
  c.y = {"pressure", "hPa", br::Scale::log, true};
  br::Series s;
  s.name = "column \"a\"";
  s.x = {220, 230, std::nan(""), 260, 288};
  s.y = {1, 10, 100, 500, 1000};
  c.series.push_back(s);
  c.references.push_back({true, 200.0, "tropopause", 2});
  const std::string svg = br::render_line_chart(c);
  expect_well_formed_svg(svg, "t&lt;1&gt;", "circle", 4); // the NaN point is left out
  EXPECT_NE(svg.find("pressure (hPa)"), std::string::npos);
  EXPECT_NE(svg.find("temperature (K)"), std::string::npos);
  EXPECT_NE(svg.find(">1000<"), std::string::npos); // a labelled tick at the surface end
}

TEST(Charts, BarsHistogramAndHeatMapAreWellFormed) {
  br::BarChart b;
  b.id = "bars";
  b.title = "Forcing";
  b.value_axis = {"forcing", "W m-2"};
  b.categories = {"doubled_co2", "drier"};
  b.series_names = {"a", "b"};
  b.values = {{4.3, -0.6}, {4.4, std::nan("")}};
  const std::string bars = br::render_bar_chart(b);
  expect_well_formed_svg(bars, "bars", "rect", 3);
  EXPECT_NE(bars.find("doubled_co2, a: 4.3 W m-2"), std::string::npos); // hover text

  br::Histogram h;
  h.id = "hist";
  h.title = "OLR";
  h.x = {"OLR", "W m-2"};
  h.edges = {200, 220, 240, 260};
  h.counts = {3, 0, 7};
  expect_well_formed_svg(br::render_histogram(h), "hist", "rect", 3);

  br::HeatMap m;
  m.id = "map";
  m.title = "OLR";
  m.x = {"co2_ppmv", "ppmv", br::Scale::log};
  m.y = {"surface_albedo", "1"};
  m.value = {"OLR", "W m-2"};
  m.x_values = {140, 280, 560};
  m.y_values = {0.1, 0.3};
  m.values = {290, 285, 280, 289, 284, std::nan("")};
  const std::string map = br::render_heat_map(m);
  expect_well_formed_svg(map, "map", "rect", 6 + 40); // cells and the colour bar
  EXPECT_NE(map.find("co2_ppmv 280 ppmv, surface_albedo 0.3 1: OLR 284 W m-2"), std::string::npos);
}
