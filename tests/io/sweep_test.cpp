// [[sweeps]] in study files and their expansion into columns (io/sweep.hpp).
#include "bandstack/io/sweep.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {
namespace {

const std::string columns = R"(
[[columns]]
name = "a"
profile = "us_standard_1976"
[[columns]]
name = "b"
profile = "tropical"
cos_zenith = 0.7
)";

TEST(Sweep, ListsAndRangesExpandRowMajor) {
  const Study s = parse_study(R"(
[[sweeps]]
key = "co2_ppmv"
values = [280, 560]
[[sweeps]]
key = "surface_albedo"
from = 0.1
to = 0.5
count = 3
[[sweeps]]
key = "ozone_scale"
from = 0.25
to = 4
count = 3
spacing = "log"
)" + columns, "s.toml");
  ASSERT_EQ(s.sweeps.size(), 3u);
  EXPECT_EQ(s.sweeps[1].values, (std::vector<double>{0.1, 0.3, 0.5})); // (1-f) a + f b: the midpoint exactly
  EXPECT_EQ(s.sweeps[2].values[1], 1.0);                                // geometric midpoint of 0.25 and 4, exactly
  EXPECT_EQ(s.sweeps[2].values[2], 4.0);                                // the end point as written
  const ExpandedStudy e = expand_sweeps(s);
  ASSERT_EQ(e.study.columns.size(), 2u * 2 * 3 * 3);
  EXPECT_TRUE(e.study.sweeps.empty());
  ASSERT_EQ(e.axes.size(), 4u);
  EXPECT_EQ(e.axes[0].name, "column");
  EXPECT_EQ(e.axes[0].labels, (std::vector<std::string>{"a", "b"}));
  EXPECT_EQ(e.axes[1].name, "co2_ppmv");
  EXPECT_EQ(e.axes[1].values, (std::vector<double>{280, 560}));
  // Row-major: column outermost, then the sweeps in study order, the last fastest.
  const ColumnSpec& c = e.study.columns[1 * 18 + 1 * 9 + 2 * 3 + 1]; // b, 560 ppmv, albedo 0.5, ozone x1
  EXPECT_EQ(c.name, "b");
  EXPECT_DOUBLE_EQ(c.settings.co2_mole_fraction, 560e-6);
  EXPECT_DOUBLE_EQ(c.settings.surface_albedo, 0.5);
  EXPECT_DOUBLE_EQ(c.settings.ozone_scale, 1.0);
  EXPECT_DOUBLE_EQ(*c.sun.cos_zenith, 0.7);
}

// Doublings of CO2 on a log range come out exact, so that users can select them by value.
TEST(Sweep, LogRangeOfDoublingsIsExact) {
  const Study s = parse_study("[[sweeps]]\nkey = \"co2_ppmv\"\nfrom = 140\nto = 2240\ncount = 5\nspacing = \"log\"\n" + columns, "s.toml");
  EXPECT_EQ(s.sweeps[0].values, (std::vector<double>{140, 280, 560, 1120, 2240}));
}

TEST(Sweep, SunKeysReplaceEachOther) {
  ColumnSpec spec;
  spec.sun.cos_zenith = 0.7;
  set_column_value(spec, "latitude_deg", 45.0);
  EXPECT_FALSE(spec.sun.cos_zenith.has_value());
  EXPECT_DOUBLE_EQ(*spec.sun.latitude_deg, 45.0);
  set_column_value(spec, "cos_zenith", 0.3);
  EXPECT_FALSE(spec.sun.latitude_deg.has_value());
  // Latitude swept on a column without a day of year: the Sun's position is incomplete.
  const Study s = parse_study("[[sweeps]]\nkey = \"latitude_deg\"\nvalues = [0, 30]\n" + columns, "s.toml");
  try {
    (void)expand_sweeps(s);
    FAIL() << "expected an InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("needs both latitude_deg and day_of_year"), std::string::npos) << e.what();
  }
}

std::string problems_of(const std::string& text) {
  try {
    (void)parse_study(text + columns, "s.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

TEST(Sweep, EveryProblemIsReported) {
  const std::string m = problems_of(R"(
[[sweeps]]
key = "layers"
values = [10]
[[sweeps]]
key = "co2_ppmv"
values = [280, -5]
[[sweeps]]
key = "co2_ppmv"
values = [1]
[[sweeps]]
key = "surface_albedo"
values = [0.1]
from = 0.1
[[sweeps]]
key = "ozone_scale"
from = 0
to = 2
count = 3
spacing = "log"
[[sweeps]]
values = [1]
)");
  for (const char* expected :
       {"s.toml:3:7: 'sweeps[0].key': \"layers\" cannot be swept (sweepable: surface_temperature_k",
        "'sweeps[1].values[1]': value -5 is outside the allowed range [0, 100000]", "'sweeps[2].key': \"co2_ppmv\" is swept twice",
        "'sweeps[3]': give either values = [...] or from, to and count", "'sweeps[4]': a log range needs from and to > 0",
        "'sweeps[5].key': missing"})
    EXPECT_NE(m.find(expected), std::string::npos) << "missing: " << expected << "\nin:\n" << m;
}

} // namespace
} // namespace bandstack::io
